import { NavLink, Outlet, ScrollRestoration, useNavigate } from 'react-router-dom';
import { toast } from 'sonner';
import type { Me } from '@shared/schemas/auth';
import { useSignOut } from '@client/features/auth/api/auth-mutations';
import { useMe } from '@client/features/auth/api/use-me';
import { cn } from '@client/lib/cn';

interface NavItem {
  to: string;
  label: string;
}

/** What each role sees in the navigation. Later features add their pages here. */
export const navigationByRole: Record<Me['role'] | 'anonymous', NavItem[]> = {
  anonymous: [
    { to: '/', label: 'How it works' },
    { to: '/shops', label: 'Shops' },
    { to: '/calculator', label: 'Calculator' },
  ],
  builder: [
    { to: '/dashboard', label: 'Workbench' },
    { to: '/jobs', label: 'My jobs' },
    { to: '/jobs/new', label: 'Post a job' },
    { to: '/shops', label: 'Shops' },
    { to: '/calculator', label: 'Calculator' },
  ],
  shop: [
    { to: '/dashboard', label: 'Shop floor' },
    { to: '/board', label: 'Job board' },
    { to: '/bids', label: 'My bids' },
    { to: '/shop/profile', label: 'Shop profile' },
    { to: '/calculator', label: 'Calculator' },
  ],
  admin: [
    { to: '/dashboard', label: 'Operations' },
    { to: '/admin/people', label: 'People' },
    { to: '/shops', label: 'Shops' },
    { to: '/calculator', label: 'Calculator' },
  ],
};

function navClass({ isActive }: { isActive: boolean }) {
  return cn(
    'rounded-md px-3 py-2 text-sm font-semibold',
    isActive ? 'bg-slate-700 text-white' : 'text-slate-800 hover:bg-slate-100',
  );
}

function Account({ me }: { me: Me }) {
  const navigate = useNavigate();
  const signOut = useSignOut({
    mutationConfig: {
      onSuccess: () => {
        toast.success('You are signed out.');
        navigate('/', { replace: true });
      },
      onError: (error) => toast.error(error.message),
    },
  });
  return (
    <div className="flex items-center gap-3">
      <span className="hidden text-sm text-ink-soft sm:inline" data-testid="signed-in-as">
        {me.displayName} · <span className="capitalize">{me.role}</span>
      </span>
      <button
        type="button"
        onClick={() => signOut.mutate()}
        className="rounded-md px-3 py-2 text-sm font-semibold text-slate-800 ring-1 ring-slate-300 hover:bg-slate-100"
      >
        Sign out
      </button>
    </div>
  );
}

export function Layout() {
  const { data: me } = useMe();
  const items = navigationByRole[me?.role ?? 'anonymous'];
  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-white focus:p-2">
        Skip to the content
      </a>
      <header className="border-b-4 border-brass-500 bg-paper-raised">
        <div className="mx-auto flex max-w-page flex-wrap items-center justify-between gap-3 px-4 py-3">
          <div className="flex items-center gap-6">
            <NavLink to={me ? '/dashboard' : '/'} className="text-xl font-extrabold tracking-tight text-slate-700">
              Tenth<span className="text-brass-700">mark</span>
            </NavLink>
            <nav aria-label="Main" className="flex gap-1">
              {items.map((item) => (
                <NavLink key={item.to} to={item.to} end className={navClass}>
                  {item.label}
                </NavLink>
              ))}
            </nav>
          </div>
          {me ? (
            <Account me={me} />
          ) : (
            <div className="flex gap-2">
              <NavLink to="/signin" className={navClass}>
                Sign in
              </NavLink>
              <NavLink to="/signup" className={navClass}>
                Create an account
              </NavLink>
            </div>
          )}
        </div>
      </header>
      <ScrollRestoration />
      <main id="main" className="mx-auto w-full max-w-page flex-1 px-4 py-8">
        <Outlet />
      </main>
      <footer className="border-t border-slate-200 bg-paper-sunk">
        <p className="mx-auto max-w-page px-4 py-4 text-sm text-ink-soft">
          Tenthmark · figures shown are guidance; engine and piston makers' specifications, calibrated instruments, local codes and
          licensed practice govern machine work.
        </p>
      </footer>
    </div>
  );
}
