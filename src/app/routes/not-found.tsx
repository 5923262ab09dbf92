import { Link, useLocation } from 'react-router';

/** No route matches. Inside /app it renders within the shell, elsewhere on its own. */
export function NotFoundPage({ home = '/' }: { home?: string }) {
  const location = useLocation();
  return (
    <div className="max-w-prose">
      <title>Page not found · Emberline</title>
      <p className="text-sm font-semibold text-ink-muted">Error 404</p>
      <h1 className="mt-1 text-2xl font-semibold">Page not found</h1>
      <p className="mt-2 text-ink-muted">
        There is no page at <code className="font-mono text-ink">{location.pathname}</code>. The address may be
        mistyped, or the page may have moved.
      </p>
      <p className="mt-4">
        <Link to={home}>{home === '/' ? 'Go to the start page' : 'Go to your start page'}</Link>
      </p>
    </div>
  );
}

export function StandaloneNotFound() {
  return (
    <main id="main" tabIndex={-1} className="focus:outline-none mx-auto max-w-5xl px-6 py-16">
      <NotFoundPage />
    </main>
  );
}
