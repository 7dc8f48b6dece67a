import { useQueryClient } from '@tanstack/react-query';
import { forwardRef, lazy, Suspense, useEffect, useRef, useState } from 'react';
import { NavLink, Outlet, ScrollRestoration, useLocation, useNavigate } from 'react-router-dom';
import type { Me } from '@shared/schemas/auth';
import { PageProgress } from '@client/components/page-progress';
import { HOME_PAGE_NAMES, NAMES } from '@shared/glossary';
import { CountBadge } from '@client/components/ui/count-badge';
import { authKeys, useSignOut, useMe } from '@client/features/auth';
import { useUnreadTotal } from '@client/features/messages';
import { NotificationBell } from '@client/features/notifications';
import { cn } from '@client/lib/cn';
import { RealtimeProvider, useConnectionStatus } from '@client/lib/realtime';

// Live conversations matter only once someone is signed in; loaded then, beside the socket itself.
// Should the chunk fail to load, the page still works (without live updates) rather than failing whole.
const MessagesLive = lazy(() =>
  import('@client/features/messages/components/messages-live').then((m) => ({ default: m.MessagesLive }), () => ({ default: () => null })),
);

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
    { to: '/help', label: 'Help' },
  ],
  builder: [
    { to: '/dashboard', label: HOME_PAGE_NAMES.builder },
    { to: '/jobs', label: 'My jobs' },
    { to: '/messages', label: 'Messages' },
    { to: '/money', label: 'Money' },
    { to: '/jobs/new', label: 'Post a job' },
    { to: '/shops', label: 'Shops' },
    { to: '/calculator', label: 'Calculator' },
  ],
  shop: [
    { to: '/dashboard', label: HOME_PAGE_NAMES.shop },
    { to: '/queue', label: 'Work queue' },
    { to: '/board', label: 'Job board' },
    { to: '/bids', label: 'My bids' },
    { to: '/messages', label: 'Messages' },
    { to: '/money', label: 'Money' },
    { to: '/shop/profile', label: 'Shop profile' },
    { to: '/calculator', label: 'Calculator' },
  ],
  admin: [
    { to: '/dashboard', label: HOME_PAGE_NAMES.admin },
    { to: '/admin/disputes', label: 'Disputes' },
    { to: '/admin/people', label: 'People' },
    { to: '/admin/shops', label: 'Shops' },
    { to: '/admin/ledger', label: 'Ledger' },
    { to: '/admin/settings', label: NAMES.fee },
    { to: '/admin/audit', label: 'Audit log' },
  ],
};

function navClass({ isActive }: { isActive: boolean }) {
  return cn(
    'rounded-md px-3 py-2 text-sm font-semibold',
    isActive ? 'bg-slate-700 text-white' : 'text-slate-800 hover:bg-slate-100',
  );
}

/**
 * The live connection's state, said quietly and only when it matters: at
 * once when the browser is offline, after a short grace while reconnecting
 * (a blip should not flash a warning). It hangs below the header's edge, over
 * the page, so coming and going it moves nothing.
 */
function ConnectionIndicator() {
  const status = useConnectionStatus();
  const [show, setShow] = useState(false);
  useEffect(() => {
    if (status === 'connected' || status === 'offline') {
      setShow(status === 'offline');
      return;
    }
    const timer = setTimeout(() => setShow(true), 2_500);
    return () => clearTimeout(timer);
  }, [status]);
  const visible = show && status !== 'connected';
  return (
    <p
      role="status"
      className={cn(
        'pointer-events-none absolute right-4 top-full z-20 mt-2 text-sm',
        visible && 'flex items-center gap-2 rounded-full bg-caution-soft px-3 py-1 font-semibold text-caution shadow-sm',
      )}
      data-testid="connection-status"
    >
      {visible && (
        <>
          <span aria-hidden className="size-2 rounded-full bg-caution" />
          {status === 'offline' ? 'Offline: messages wait and go when you are back' : 'Reconnecting …'}
        </>
      )}
    </p>
  );
}

function Account({ me }: { me: Me }) {
  const navigate = useNavigate();
  const signOut = useSignOut({
    mutationConfig: {
      onSuccess: () => {
        // Unsent messages stay with the account, not on a computer someone else may use next.
        // (The outbox module came with the live conversations at sign-in, so this import is already loaded.)
        void import('@client/features/messages/outbox').then(({ outboxStorageKey }) => window.localStorage.removeItem(outboxStorageKey(me.id)));
        void import('sonner').then(({ toast }) => toast.success('You are signed out.'));
        navigate('/', { replace: true });
      },
      onError: (error) => void import('sonner').then(({ toast }) => toast.error(error.message)),
    },
  });
  return (
    <div className="flex min-w-0 items-center gap-3">
      <span className="hidden max-w-64 truncate text-sm text-ink-soft sm:inline-block" data-testid="signed-in-as" title={`${me.displayName} · ${me.role}`}>
        {me.displayName} · <span className="capitalize">{me.role}</span>
      </span>
      <NavLink to="/settings" className={navClass}>
        Settings
      </NavLink>
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

const MENU_ID = 'site-menu';

/**
 * The main navigation's links; the wide header shows them in a row, the phone's menu in a column.
 * In the row the unread count sits over the link's corner (`badgeOver`), so its coming moves no link.
 */
function MainNav({ items, unread, className, badgeOver = false }: { items: NavItem[]; unread: number; className: string; badgeOver?: boolean }) {
  return (
    <nav aria-label="Main" className={className}>
      {items.map((item) => (
        <NavLink key={item.to} to={item.to} end className={(state) => cn(navClass(state), badgeOver && 'relative shrink-0')}>
          {item.label}
          {item.to === '/messages' && <CountBadge count={unread} meaning="unread" className={badgeOver ? 'absolute -right-1.5 -top-1 ml-0' : undefined} />}
        </NavLink>
      ))}
    </nav>
  );
}

/** The phone bar's way to the conversations: an icon in a box of fixed size, its unread count over the corner (as the bell's). */
function MessagesIconLink({ unread }: { unread: number }) {
  const label = unread > 0 ? `Messages, ${unread} unread` : 'Messages';
  return (
    <NavLink
      to="/messages"
      end
      aria-label={label}
      title={label}
      className={({ isActive }) =>
        cn('relative inline-flex size-10 shrink-0 items-center justify-center rounded-md md:hidden', isActive ? 'bg-slate-700 text-white' : 'text-slate-800 hover:bg-slate-100')
      }
    >
      <svg aria-hidden viewBox="0 0 24 24" className="size-6 fill-none stroke-current" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round">
        <path d="M21 12a8 8 0 0 1-11.6 7.1L4 20.5l1.4-4.9A8 8 0 1 1 21 12z" />
      </svg>
      <CountBadge count={unread} meaning="unread" className="absolute -right-1 -top-1 ml-0 px-1" />
    </NavLink>
  );
}

function SignInLinks() {
  return (
    <div className="flex gap-2 whitespace-nowrap">
      <NavLink to="/signin" className={navClass}>
        Sign in
      </NavLink>
      <NavLink to="/signup" className={navClass}>
        Create an account
      </NavLink>
    </div>
  );
}

/**
 * The phone's menu state: closed again on a page change, and by Escape,
 * which gives the focus back to the button that opened it.
 */
function useCompactMenu() {
  const [open, setOpen] = useState(false);
  const buttonRef = useRef<HTMLButtonElement>(null);
  const { pathname } = useLocation();
  useEffect(() => setOpen(false), [pathname]);
  useEffect(() => {
    if (!open) return;
    const onKeyDown = (event: KeyboardEvent) => {
      if (event.key !== 'Escape') return;
      setOpen(false);
      buttonRef.current?.focus();
    };
    document.addEventListener('keydown', onKeyDown);
    return () => document.removeEventListener('keydown', onKeyDown);
  }, [open]);
  return { open, setOpen, buttonRef };
}

const MenuButton = forwardRef<HTMLButtonElement, { open: boolean; onToggle: () => void }>(function MenuButton({ open, onToggle }, ref) {
  return (
    <button
      ref={ref}
      type="button"
      aria-expanded={open}
      aria-controls={MENU_ID}
      onClick={onToggle}
      className="inline-flex h-10 shrink-0 items-center gap-2 rounded-md px-3 text-sm font-semibold text-slate-800 ring-1 ring-slate-300 hover:bg-slate-100 md:hidden"
    >
      <svg aria-hidden viewBox="0 0 24 24" className="size-5 fill-none stroke-current" strokeWidth={2} strokeLinecap="round">
        {open ? <path d="M6 6l12 12M18 6L6 18" /> : <path d="M4 7h16M4 12h16M4 17h16" />}
      </svg>
      Menu
    </button>
  );
});

/**
 * The header keeps one size whatever arrives after the first paint (who is signed in, unread counts,
 * the connection's state): a bar of fixed height (logo; bell, account or sign-in links, the phone's
 * Menu), and on wider screens a row of fixed height for the main navigation that scrolls sideways
 * rather than wrapping. Until the session is known both stay empty, so no visitor's links are shown
 * and then moved.
 */
export function Layout() {
  const { data: me, isPending: sessionPending } = useMe();
  const queryClient = useQueryClient();
  const items = navigationByRole[me?.role ?? 'anonymous'];
  const talks = me?.role === 'builder' || me?.role === 'shop';
  const unread = useUnreadTotal({ enabled: talks });
  const { open: menuOpen, setOpen: setMenuOpen, buttonRef: menuButton } = useCompactMenu();
  return (
    <RealtimeProvider userId={me?.id} onUnauthenticated={() => void queryClient.invalidateQueries({ queryKey: authKeys.me() })}>
      {me && (
        <Suspense fallback={null}>
          <MessagesLive />
        </Suspense>
      )}
      <PageProgress />
      <div className="flex min-h-screen flex-col">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-white focus:p-2">
          Skip to the content
        </a>
        <header className="relative border-b-4 border-brass-500 bg-paper-raised print:hidden">
          <div className="mx-auto max-w-page px-4">
            <div className="flex h-14 items-center justify-between gap-3 md:h-16">
              <NavLink to={me ? '/dashboard' : '/'} className="shrink-0 text-xl font-extrabold tracking-tight text-slate-700">
                Tenth<span className="text-brass-700">mark</span>
              </NavLink>
              <div className="flex min-w-0 items-center justify-end gap-2 md:gap-3">
                {talks && <MessagesIconLink unread={unread} />}
                {me && <NotificationBell />}
                <div className="hidden min-w-0 md:flex">{sessionPending ? null : me ? <Account me={me} /> : <SignInLinks />}</div>
                <MenuButton open={menuOpen} onToggle={() => setMenuOpen((open) => !open)} ref={menuButton} />
              </div>
            </div>
            <div className="-mx-1 hidden h-12 items-center overflow-x-auto px-1 md:flex" data-testid="main-nav-row">
              {!sessionPending && <MainNav key={me?.role ?? 'anonymous'} items={items} unread={talks ? unread : 0} badgeOver className="flex items-center gap-1 whitespace-nowrap py-1" />}
            </div>
            {menuOpen && (
              <div id={MENU_ID} className="flex flex-col gap-3 border-t border-slate-200 pb-2 pt-3 md:hidden">
                <MainNav items={items} unread={talks ? unread : 0} className="flex flex-col gap-1" />
                <div className="border-t border-slate-200 pt-3">{me ? <Account me={me} /> : <SignInLinks />}</div>
              </div>
            )}
          </div>
          {me && <ConnectionIndicator />}
        </header>
        <ScrollRestoration />
        {/* At least a screen tall, so the footer starts below the fold: a page growing as its data arrives never pushes it. */}
        <main id="main" className="mx-auto min-h-screen w-full max-w-page flex-1 px-4 py-8">
          <Outlet />
        </main>
        <footer className="border-t border-slate-200 bg-paper-sunk print:hidden">
          <div className="mx-auto flex max-w-page flex-col gap-2 px-4 py-4 text-sm text-ink-soft">
            <nav aria-label="About Tenthmark" className="flex flex-wrap gap-4">
              <NavLink to="/help" className="font-semibold text-slate-800 underline">
                Help
              </NavLink>
              <NavLink to="/terms" className="font-semibold text-slate-800 underline">
                Terms of use
              </NavLink>
              <NavLink to="/privacy" className="font-semibold text-slate-800 underline">
                Privacy
              </NavLink>
            </nav>
            <p>
              Tenthmark · figures shown are guidance; engine and piston makers' specifications, calibrated instruments, local codes and
              licensed practice govern machine work.
            </p>
          </div>
        </footer>
      </div>
    </RealtimeProvider>
  );
}
