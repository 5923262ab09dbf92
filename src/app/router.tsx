/**
 * Every route of the client, in one place. Sections of /app get their page from `SECTION_PAGES`;
 * a feature replaces its placeholder there (navigation labels and roles live in ./navigation).
 *
 * The landing page, the layouts and the error and not-found pages are in the entry chunk; every
 * other page is loaded when it is first opened, through React Router's lazy route object (`lazy.Component`),
 * so its module and what only it uses (the budget editor with the engine and the charts, the
 * template editor, the review with its certificate preview…) come in a chunk of their own. The
 * router resolves it before it renders the page, and the root's hydrateFallbackElement stands in
 * while the first page of a visit loads. Chunks are served by this app like the entry: nothing
 * is fetched from elsewhere.
 */
import type { QueryClient } from '@tanstack/react-query';
import type { ComponentType } from 'react';
import { createBrowserRouter, redirect, type LoaderFunctionArgs, type RouteObject } from 'react-router';
import { getMe, meQueryOptions } from '../features/session/api/get-me';
import { ApiError } from '../lib/api-client';
import { homePathFor, SECTIONS, type SectionId } from './navigation';
import { AppLayout } from './routes/app-layout';
import { LandingPage } from './routes/landing';
import { NoRolePage } from './routes/no-role';
import { NotFoundPage, StandaloneNotFound } from './routes/not-found';
import { PublicLayout } from './routes/public-layout';
import { RouteErrorPage } from './routes/route-error';

/** A page's component, imported when the route is first matched. */
type PageLoader = () => Promise<ComponentType>;

/** A route whose page comes from `load` on demand (React Router 7 lazy route object). */
const lazyPage = (load: PageLoader): Pick<RouteObject, 'lazy'> => ({ lazy: { Component: load } });

/** The page of each /app section. Replace an entry when its feature is built. */
const SECTION_PAGES: Record<SectionId, PageLoader> = {
  users: async () => (await import('./routes/users-page')).UsersPage,
  lab: async () => (await import('./routes/section-page')).LabSectionPage,
  mail: async () => (await import('./routes/certificate-pages')).MailSectionPage,
  audit: async () => (await import('./routes/audit-page')).AuditPage,
  templates: async () => (await import('./routes/templates-page')).TemplatesPage,
  standards: async () => (await import('./routes/standards-page')).StandardsPage,
  customers: async () => (await import('./routes/customers-page')).CustomersPage,
  jobs: async () => (await import('./routes/jobs-page')).JobsPage,
  review: async () => (await import('./routes/certificate-pages')).ReviewSectionPage,
  certificates: async () => (await import('./routes/certificate-pages')).CertificatesSectionPage,
  'my-certificates': async () => (await import('./routes/certificate-pages')).MyCertificatesPage,
};

/** Guard of /app: the signed-in user, or a redirect to /sign-in that comes back here. */
export function requireSession(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    try {
      return await queryClient.ensureQueryData(meQueryOptions());
    } catch (error) {
      if (error instanceof ApiError && error.status === 401) {
        const url = new URL(request.url);
        throw redirect(`/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`);
      }
      throw error;
    }
  };
}

/** Whether the browser holds a valid session (GET /api/auth/get-session: the session or null). */
async function hasSession(): Promise<boolean> {
  try {
    const res = await fetch('/api/auth/get-session', { credentials: 'same-origin', headers: { accept: 'application/json' } });
    return res.ok && (await res.json()) !== null;
  } catch {
    return false;
  }
}

/** /sign-in while already signed in goes straight to the role's start page. */
function redirectIfSignedIn(queryClient: QueryClient) {
  return async () => {
    // better-auth's public session check answers 200 with null when signed out, so a visitor who
    // is not signed in causes no refused request (and no console error); /api/me is asked only
    // when there is a session. Asked directly, not through the query cache: a 401 there would be
    // taken for an ended session and send the visitor round in a circle.
    const me = queryClient.getQueryData(meQueryOptions().queryKey) ?? ((await hasSession()) ? await getMe().catch(() => null) : null);
    if (me?.user.role) throw redirect(homePathFor(me.user.role));
    return null;
  };
}

export function createRoutes(queryClient: QueryClient): RouteObject[] {
  const guard = requireSession(queryClient);
  return [
    {
      id: 'root',
      errorElement: <RouteErrorPage />,
      // Shown while the first page's loaders run (the session check); without it React Router
      // renders nothing and warns in the console on every page load.
      hydrateFallbackElement: <p role="status" className="p-6 text-sm text-ink-muted">Loading Emberline…</p>,
      children: [
        {
          element: <PublicLayout />,
          children: [
            { index: true, element: <LandingPage /> },
            // The loader is not lazy: it runs while the page's module loads.
            { path: 'sign-in', loader: redirectIfSignedIn(queryClient), ...lazyPage(async () => (await import('./routes/sign-in')).SignInPage) },
            { path: 'verify', ...lazyPage(async () => (await import('./routes/verify')).VerifyPage) },
            { path: 'set-password', ...lazyPage(async () => (await import('./routes/set-password')).SetPasswordPage) },
            { path: '*', element: <StandaloneNotFound /> },
          ],
        },
        {
          id: 'app',
          path: 'app',
          loader: guard,
          element: <AppLayout />,
          children: [
            {
              index: true,
              loader: async (args) => {
                const me = await guard(args);
                if (me.user.role) throw redirect(homePathFor(me.user.role));
                return null;
              },
              element: <NoRolePage />,
            },
            ...Object.values(SECTIONS).map((section): RouteObject => ({ path: section.path, ...lazyPage(SECTION_PAGES[section.id]) })),
            { path: 'templates/versions/:versionId', ...lazyPage(async () => (await import('./routes/template-version-page')).TemplateVersionPage) },
            { path: 'jobs/new', ...lazyPage(async () => (await import('./routes/jobs-page')).NewJobPage) },
            { path: 'jobs/:jobId', ...lazyPage(async () => (await import('./routes/job-detail-page')).JobDetailPage) },
            { path: 'standards/:id', ...lazyPage(async () => (await import('./routes/standards-page')).StandardDetailPage) },
            { path: 'customers/:id', ...lazyPage(async () => (await import('./routes/customers-page')).CustomerPage) },
            { path: 'review/:jobId', ...lazyPage(async () => (await import('./routes/review-job-page')).ReviewJobRoute) },
            { path: 'mail/mailbox', ...lazyPage(async () => (await import('./routes/certificate-pages')).MailboxPage) },
            { path: '*', element: <NotFoundPage home="/app" /> },
          ],
        },
      ],
    },
  ];
}

export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter(createRoutes(queryClient));
}
