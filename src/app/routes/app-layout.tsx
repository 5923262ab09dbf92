import { useQueryClient } from '@tanstack/react-query';
import { Link, NavLink, Outlet, useNavigate } from 'react-router';
import { Logo } from '../../components/ui/logo';
import { useMe } from '../../features/session/api/get-me';
import { signOut } from '../../features/session/api/sign-out';
import { UserMenu } from '../../features/session/components/user-menu';
import { cn } from '../../lib/cn';
import { homePathFor, isViewOnly, navigationFor } from '../navigation';

/** The signed-in frame: lab and user across the top, the role's sections down the side. */
export function AppLayout() {
  const { user, lab } = useMe();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const sections = user.role ? navigationFor(user.role) : [];

  async function handleSignOut() {
    await signOut();
    queryClient.clear();
    navigate('/sign-in', { replace: true });
  }

  return (
    <div className="flex min-h-screen flex-col bg-canvas">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-4 focus:top-3 focus:z-30 focus:bg-surface focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="border-b border-line bg-surface">
        <div className="flex items-center justify-between gap-4 px-5 py-2">
          <div className="flex min-w-0 items-center gap-5">
            <Link to={user.role ? homePathFor(user.role) : '/app'} className="text-ink no-underline" aria-label="Emberline, your start page">
              <Logo />
            </Link>
            <p className="hidden truncate border-l border-line pl-5 text-sm text-ink-muted sm:block">
              <span className="font-semibold text-ink">{lab.name}</span>
              {lab.accreditationNumber && <span> · Accreditation {lab.accreditationNumber}</span>}
            </p>
          </div>
          <UserMenu user={user} onSignOut={handleSignOut} />
        </div>
      </header>
      <div className="flex flex-1 flex-col md:flex-row">
        {sections.length > 0 && (
          <nav aria-label="Sections" className="bg-night md:w-64 md:shrink-0">
            <ul className="flex flex-wrap gap-1 p-3 md:flex-col">
              {sections.map((section) => (
                <li key={section.id}>
                  <NavLink
                    to={`/app/${section.path}`}
                    className={({ isActive }) =>
                      cn(
                        'flex items-center justify-between gap-2 rounded-field border-l-4 px-3 py-2 text-sm no-underline',
                        isActive
                          ? 'border-focus bg-night-raised font-semibold text-white'
                          : 'border-transparent text-night-ink hover:bg-night-raised',
                      )
                    }
                  >
                    <span>{section.label}</span>
                    {isViewOnly(section, user.role!) && (
                      <span className="shrink-0 whitespace-nowrap text-xs font-normal text-night-ink-muted">
                        <span className="sr-only">, </span>view only
                      </span>
                    )}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
        )}
        <main id="main" tabIndex={-1} className="focus:outline-none min-w-0 flex-1 px-6 py-8 md:px-10">
          <Outlet />
        </main>
      </div>
    </div>
  );
}
