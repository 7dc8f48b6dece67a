import { NavLink } from 'react-router-dom';
import { cn } from '@client/lib/cn';
import { useNotificationsLive, useUnreadNotifications } from '../api/notifications';

/**
 * The bell in the header: a link to /notifications with the live count of
 * unread notices. Its box has a fixed size and the count sits over its
 * corner, so a count coming or going never moves the header.
 */
export function NotificationBell() {
  useNotificationsLive();
  const { data: unread = 0 } = useUnreadNotifications();
  const label = unread > 0 ? `Notifications, ${unread} unread` : 'Notifications';
  return (
    <NavLink
      to="/notifications"
      aria-label={label}
      title={label}
      data-testid="notification-bell"
      className={({ isActive }) =>
        cn('relative inline-flex size-10 shrink-0 items-center justify-center rounded-md', isActive ? 'bg-slate-700 text-white' : 'text-slate-800 hover:bg-slate-100')
      }
    >
      <svg aria-hidden viewBox="0 0 24 24" className="size-6 fill-none stroke-current" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round">
        <path d="M6 8a6 6 0 1 1 12 0c0 7 3 9 3 9H3s3-2 3-9" />
        <path d="M10.3 21a1.94 1.94 0 0 0 3.4 0" />
      </svg>
      {unread > 0 && (
        <span
          aria-hidden
          data-testid="notification-count"
          className="absolute -right-1 -top-1 inline-flex h-5 min-w-5 items-center justify-center rounded-full bg-brass-700 px-1 text-xs font-bold tabular-nums text-white"
        >
          {unread > 99 ? '99+' : unread}
        </span>
      )}
    </NavLink>
  );
}
