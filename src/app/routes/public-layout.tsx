import { Link, NavLink, Outlet } from 'react-router';
import { Logo } from '../../components/ui/logo';
import { cn } from '../../lib/cn';

const navClass = ({ isActive }: { isActive: boolean }) =>
  cn('rounded-field px-3 py-1.5 text-sm font-semibold no-underline', isActive ? 'bg-sunken text-ink underline decoration-2 decoration-focus underline-offset-4' : 'text-ink hover:bg-sunken');

/** Header and footer for the pages anyone may open. */
export function PublicLayout() {
  return (
    <div className="flex min-h-screen flex-col bg-canvas">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-4 focus:top-3 focus:z-10 focus:bg-surface focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="border-b border-line bg-surface">
        <div className="mx-auto flex max-w-5xl items-center justify-between px-6 py-3">
          <Link to="/" className="text-ink no-underline" aria-label="Emberline, start page">
            <Logo />
          </Link>
          <nav aria-label="Public pages" className="flex items-center gap-1">
            <NavLink to="/verify" className={navClass}>
              Check a certificate
            </NavLink>
            <NavLink to="/sign-in" className={navClass}>
              Sign in
            </NavLink>
          </nav>
        </div>
      </header>
      <main id="main" tabIndex={-1} className="focus:outline-none flex-1">
        <Outlet />
      </main>
      <footer className="border-t border-line bg-surface">
        <div className="mx-auto max-w-5xl px-6 py-4 text-xs text-ink-muted">
          Emberline: uncertainty evaluation and calibration certificates for radiometry laboratories.
          The demonstration data on this installation is invented.
        </div>
      </footer>
    </div>
  );
}
