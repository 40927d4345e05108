import { Link, Navigate, NavLink, Outlet, useLocation, useNavigate } from 'react-router-dom';
import { useMe } from '../../api/me';
import { useSignOut } from '../../features/auth/api/sign-in';
import { Caution } from '../../components/caution';
import { Logo } from '../../components/logo';
import { ThemeToggle } from '../../components/theme-toggle';
import { PageZoneProvider, PageZoneStatement } from '../../components/page-zone';
import { APP_SECTIONS } from '../sections';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-11 items-center rounded-lg px-3 text-sm font-semibold ${isActive ? 'bg-white/15 text-white' : 'text-white/80 hover:bg-white/10'}`;

export function AppLayout() {
  const me = useMe();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const location = useLocation();
  const user = me.data;
  // A temporary password must be changed before anything else (the API refuses the rest meanwhile).
  if (user?.mustChangePassword && location.pathname !== '/account') return <Navigate to="/account" replace />;
  const sections = APP_SECTIONS.filter((s) => !s.adminOnly || user?.globalRole === 'admin');

  // A project's pages show their zone statement under the project's name (ProjectLayout).
  const inProject = /^\/projects\/[^/]+/.test(location.pathname);

  return (
    <PageZoneProvider>
      <div className="flex min-h-screen flex-col">
        <header className="no-print bg-deep text-white">
          <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-2 px-3 py-2 sm:px-5">
            <Link to="/" className="mr-2 flex min-h-11 items-center gap-2 font-bold tracking-tight">
              <Logo className="size-8" />
              <span className="text-lg">Lullwatch</span>
            </Link>
            <nav className="flex flex-wrap gap-1" aria-label="Main">
              {sections.map((s) => (
                <NavLink key={s.path} to={s.path} className={navClass} end={s.path === '/'}>
                  {s.label}
                </NavLink>
              ))}
            </nav>
            <div className="ml-auto flex items-center gap-1">
              <NavLink to="/account" className={navClass} data-testid="signed-in-as" title="Your account: change your password">
                {user?.name ?? 'Account'}
              </NavLink>
              <ThemeToggle />
              <button
                type="button"
                className="inline-flex min-h-11 items-center rounded-lg px-3 text-sm font-semibold text-white/90 hover:bg-white/10"
                onClick={() => signOut.mutate(undefined, { onSuccess: () => void navigate('/sign-in', { replace: true }) })}
              >
                Sign out
              </button>
            </div>
          </div>
        </header>
        <main className="mx-auto w-full max-w-7xl flex-1 px-3 py-5 sm:px-5">
          {inProject ? null : <PageZoneStatement className="mb-3" />}
          <Outlet />
        </main>
        <footer className="border-t border-line px-4 py-4">
          <Caution />
        </footer>
      </div>
    </PageZoneProvider>
  );
}
