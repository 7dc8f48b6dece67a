import { useEffect, useRef } from 'react';
import { useSearchParams } from 'react-router-dom';
import { Card, PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { HomePageLink, useHomePageName, useVerifyEmail } from '@client/features/auth';

export function VerifyEmailRoute() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const verify = useVerifyEmail();
  const home = useHomePageName();
  const sent = useRef(false);
  useEffect(() => {
    // Once per visit, even under React's double effects in development.
    if (token && !sent.current) {
      sent.current = true;
      verify.mutate({ token });
    }
  }, [token, verify]);
  return (
    <div className="mx-auto max-w-md">
      <PageTitle title="Confirm your e-mail address" />
      <Card>
        {!token && <Notice tone="error">This page needs the link from your e-mail.</Notice>}
        {verify.isPending && <Notice>Confirming …</Notice>}
        {verify.isSuccess && (
          <Notice tone="success" title="Confirmed">
            Thank you. <HomePageLink before="Go to" className="underline" />.
          </Notice>
        )}
        {verify.isError && (
          <Notice tone="error" title="That link did not work">
            {verify.error.message} You can send a new one from {home}.
          </Notice>
        )}
      </Card>
    </div>
  );
}
