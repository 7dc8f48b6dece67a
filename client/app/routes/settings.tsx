import { Link } from 'react-router-dom';
import type { ReactNode } from 'react';
import { Card, PageTitle } from '@client/components/ui/card';
import { ChangeEmailForm, ChangePasswordForm, DeleteAccount, ExportData, useMe } from '@client/features/auth';

function Section({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <Card>
      <section aria-labelledby={id}>
        <h2 id={id} className="mb-4 text-xl font-bold">
          {title}
        </h2>
        {children}
      </section>
    </Card>
  );
}

/** The signed-in person's settings: password, e-mail address, notices, their data, deleting the account. */
export function SettingsRoute() {
  const { data: me } = useMe();
  if (!me) return null;
  return (
    <div className="flex max-w-2xl flex-col gap-6">
      <PageTitle title="Settings" lead={`Signed in as ${me.displayName} (${me.email}).`} />
      <Section id="settings-password" title="Change password">
        {me.hasPassword ? (
          <ChangePasswordForm />
        ) : (
          <p className="text-ink-soft">
            You sign in with GitHub and have no Tenthmark password. To set one, <Link to="/forgot-password" className="underline">ask for a link by e-mail</Link>.
          </p>
        )}
      </Section>
      <Section id="settings-email" title="Change e-mail address">
        {me.hasPassword ? (
          <ChangeEmailForm email={me.email} pendingEmail={me.pendingEmail} />
        ) : (
          <p className="text-ink-soft">Changing the address needs your password; set one first (see above).</p>
        )}
      </Section>
      {/* Notification choices live on their own page, /settings/notifications (the notifications feature). */}
      <Section id="settings-notifications" title="Notifications">
        <p className="text-ink-soft">
          Choose which notices also come by e-mail: <Link to="/settings/notifications" className="font-semibold underline">notification choices</Link>.
        </p>
      </Section>
      <Section id="settings-export" title="Export my data">
        <ExportData />
      </Section>
      <Section id="settings-delete" title="Delete my account">
        <DeleteAccount hasPassword={me.hasPassword} />
      </Section>
    </div>
  );
}
