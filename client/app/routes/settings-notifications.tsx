import { PageTitle } from '@client/components/ui/card';
import { NotificationSettings } from '@client/features/notifications';

export function NotificationSettingsRoute() {
  return (
    <div>
      <PageTitle title="E-mail choices" lead="Turn off the e-mails you do not need. Money receipts, dispute decisions and mail about your account always go." />
      <NotificationSettings />
    </div>
  );
}
