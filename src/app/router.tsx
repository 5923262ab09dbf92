/**
 * Every route of the client, in one place. Sections of /app get their page from `SECTION_PAGES`;
 * a feature replaces its placeholder there (navigation labels and roles live in ./navigation).
 */
import type { QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';
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
import { SectionPage } from './routes/section-page';
import { SignInPage } from './routes/sign-in';
import { TemplatesPage, TemplateVersionPage } from './routes/templates-page';
import { VerifyPage } from './routes/verify';
import { CertificatesSectionPage, MailboxPage, MailSectionPage, MyCertificatesPage, ReviewJobRoute, ReviewSectionPage } from './routes/certificate-pages';
import { JobDetailPage, JobsPage, NewJobPage } from './routes/jobs-page';
import { StandardDetailPage, StandardsPage } from './routes/standards-page';
import { CustomerPage, CustomersPage } from './routes/customers-page';
import { UsersPage } from './routes/users-page';
import { AuditPage } from './routes/audit-page';
import { SetPasswordPage } from './routes/set-password';

/** The page of each /app section. Replace an entry when its feature is built. */
const SECTION_PAGES: Record<SectionId, ReactNode> = {
  users: <UsersPage />,
  lab: <SectionPage id="lab" />,
  mail: <MailSectionPage />,
  audit: <AuditPage />,
  templates: <TemplatesPage />,
  standards: <StandardsPage />,
  customers: <CustomersPage />,
  jobs: <JobsPage />,
  review: <ReviewSectionPage />,
  certificates: <CertificatesSectionPage />,
  'my-certificates': <MyCertificatesPage />,
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
            { path: 'sign-in', loader: redirectIfSignedIn(queryClient), element: <SignInPage /> },
            { path: 'verify', element: <VerifyPage /> },
            { path: 'set-password', element: <SetPasswordPage /> },
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
            ...Object.values(SECTIONS).map((section) => ({ path: section.path, element: SECTION_PAGES[section.id] })),
            { path: 'templates/versions/:versionId', element: <TemplateVersionPage /> },
            { path: 'jobs/new', element: <NewJobPage /> },
            { path: 'jobs/:jobId', element: <JobDetailPage /> },
            { path: 'standards/:id', element: <StandardDetailPage /> },
            { path: 'customers/:id', element: <CustomerPage /> },
            { path: 'review/:jobId', element: <ReviewJobRoute /> },
            { path: 'mail/mailbox', element: <MailboxPage /> },
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
