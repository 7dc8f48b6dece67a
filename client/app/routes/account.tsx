import { Link } from 'react-router-dom';
import { Card, PageTitle } from '@client/components/ui/card';
import { useMe, ChangePasswordForm } from '@client/features/auth';

/** The signed-in person's own account: who they are signed in as, and their password. */
export function AccountRoute() {
  const { data: me } = useMe();
  if (!me) return null;
  return (
    <div className="max-w-xl">
      <PageTitle title="Your account" lead={`Signed in as ${me.displayName} (${me.email}).`} />
      <Card>
        <h2 className="mb-4 text-xl font-bold">Change password</h2>
        {me.hasPassword ? (
          <ChangePasswordForm />
        ) : (
          <p className="text-ink-soft">
            You sign in with GitHub and have no Tenthmark password. To set one, <Link to="/forgot-password" className="underline">ask for a link by e-mail</Link>.
          </p>
        )}
      </Card>
    </div>
  );
}
