import { Link } from 'react-router-dom';
import { PageTitle } from '@client/components/ui/card';
import { NotificationList } from '@client/features/notifications';

export function NotificationsRoute() {
  return (
    <div>
      <PageTitle
        title="Notifications"
        lead={
          <>
            What happened on your jobs, newest first. Choose which of these also come by e-mail in{' '}
            <Link to="/settings/notifications" className="font-semibold text-slate-700 underline underline-offset-4">
              your e-mail choices
            </Link>
            .
          </>
        }
      />
      <NotificationList />
    </div>
  );
}
