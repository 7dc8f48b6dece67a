import { useEffect, useRef } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { Card, PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { useConfirmEmailChange } from '@client/features/auth';

/** The link mailed to a new address: following it moves the account there. */
export function ConfirmNewEmailRoute() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const confirm = useConfirmEmailChange();
  const sent = useRef(false);
  useEffect(() => {
    // Once per visit, even under React's double effects in development.
    if (token && !sent.current) {
      sent.current = true;
      confirm.mutate({ token });
    }
  }, [token, confirm]);
  return (
    <div className="mx-auto max-w-md">
      <PageTitle title="Confirm your new e-mail address" />
      <Card>
        {!token && <Notice tone="error">This page needs the link from your e-mail.</Notice>}
        {confirm.isPending && <Notice>Confirming …</Notice>}
        {confirm.isSuccess && (
          <Notice tone="success" title="Changed">
            Your account now uses {confirm.data.email}; sign in with it from now on. <Link to="/settings" className="underline">Back to settings</Link>.
          </Notice>
        )}
        {confirm.isError && (
          <Notice tone="error" title="That link did not work">
            {confirm.error.message} You can ask for a new one in <Link to="/settings" className="underline">settings</Link>.
          </Notice>
        )}
      </Card>
    </div>
  );
}
