import { Link } from 'react-router-dom';
import type { Notification } from '@shared/schemas/notifications';
import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { cn } from '@client/lib/cn';
import { useMarkAllNotificationsRead, useMarkNotificationRead, useNotifications } from '../api/notifications';
import { formatWhen } from './notification-words';

function NotificationRow({ notification, onOpen }: { notification: Notification; onOpen: (id: string) => void }) {
  const unread = notification.readAt === null;
  return (
    <li className={cn('flex gap-3 border-b border-slate-100 py-3 last:border-0', unread && 'font-semibold')} data-testid="notification" data-unread={unread}>
      <span aria-hidden className={cn('mt-2 size-2.5 shrink-0 rounded-full', unread ? 'bg-brass-700' : 'bg-transparent')} />
      <div className="min-w-0 flex-1">
        <Link to={notification.href} onClick={() => unread && onOpen(notification.id)} className="break-words text-ink underline-offset-4 hover:underline">
          {notification.text}
        </Link>
        <p className="mt-1 text-sm font-normal text-ink-soft">
          {unread && <span className="mr-2 font-semibold text-brass-700">New</span>}
          <time dateTime={notification.createdAt}>{formatWhen(notification.createdAt)}</time>
        </p>
      </div>
    </li>
  );
}

/** The person's notices, newest first, with unread ones marked; opening one marks it read. */
export function NotificationList() {
  const notices = useNotifications();
  const markRead = useMarkNotificationRead();
  const markAll = useMarkAllNotificationsRead();
  if (notices.isPending) return <p className="text-ink-soft">Loading notifications …</p>;
  if (notices.isError)
    return (
      <Notice tone="error" title="Your notifications could not be loaded.">
        <Button variant="secondary" className="mt-2" onClick={() => void notices.refetch()}>
          Retry
        </Button>
      </Notice>
    );
  const all = notices.data.pages.flatMap((page) => page.notifications);
  const unread = notices.data.pages[0]?.unread ?? 0;
  return (
    <Card>
      <div className="mb-2 flex flex-wrap items-center justify-between gap-3">
        <h2 className="text-xl font-bold">{unread > 0 ? `${unread} unread` : 'All read'}</h2>
        <Button variant="secondary" disabled={unread === 0} busy={markAll.isPending} onClick={() => markAll.mutate()}>
          Mark all as read
        </Button>
      </div>
      {all.length === 0 ? (
        <p className="text-ink-soft">No notifications yet. Bids, payments, inspection results and disputes on your jobs will show here.</p>
      ) : (
        <ul aria-label="Notifications">
          {all.map((notification) => (
            <NotificationRow key={notification.id} notification={notification} onOpen={(id) => markRead.mutate(id)} />
          ))}
        </ul>
      )}
      {notices.hasNextPage && (
        <Button variant="secondary" className="mt-4" busy={notices.isFetchingNextPage} onClick={() => void notices.fetchNextPage()}>
          Show older
        </Button>
      )}
    </Card>
  );
}
