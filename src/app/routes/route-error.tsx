import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { ApiError } from '../../lib/api-client';
import { Logo } from '../../components/ui/logo';
import { NotFoundPage } from './not-found';

function describe(error: unknown): { title: string; detail: string } {
  if (isRouteErrorResponse(error)) {
    if (error.status === 403) return { title: 'Not allowed', detail: 'Your account may not open this page.' };
    return { title: `The page could not be shown (${error.status})`, detail: error.statusText || 'The server refused the request.' };
  }
  if (error instanceof ApiError) {
    if (error.status === 0) return { title: 'The server could not be reached', detail: error.message };
    return { title: 'The server reported a problem', detail: `${error.message} (${error.code})` };
  }
  if (error instanceof Error) return { title: 'Something went wrong in this page', detail: error.message };
  return { title: 'Something went wrong in this page', detail: 'An unexpected error occurred.' };
}

/** errorElement of the root route: any loader or render error ends here, with a way out. */
export function RouteErrorPage() {
  const error = useRouteError();
  const is404 = isRouteErrorResponse(error) && error.status === 404;
  const { title, detail } = describe(error);
  return (
    <div className="min-h-screen bg-canvas">
      <header className="border-b border-line bg-surface px-6 py-3">
        <Link to="/" className="text-ink no-underline">
          <Logo />
        </Link>
      </header>
      <main id="main" tabIndex={-1} className="focus:outline-none mx-auto max-w-3xl px-6 py-16">
        {is404 ? (
          <NotFoundPage />
        ) : (
          <div role="alert" className="max-w-prose">
            <title>Error · Emberline</title>
            <h1 className="text-2xl font-semibold">{title}</h1>
            <p className="mt-2 text-ink-muted">{detail}</p>
            <p className="mt-2 text-ink-muted">Reload the page to try again; if it keeps happening, tell your administrator what you were doing.</p>
            <p className="mt-4 flex gap-4">
              <button type="button" className="font-semibold text-ember-strong underline" onClick={() => window.location.reload()}>
                Reload the page
              </button>
              <Link to="/">Go to the start page</Link>
            </p>
          </div>
        )}
      </main>
    </div>
  );
}
