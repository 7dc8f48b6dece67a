import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { useResendVerification } from '../api/auth-mutations';
import { authKeys } from '../api/auth-keys';
import { useMe } from '../api/use-me';

/**
 * Whether the signed-in person still has to confirm their e-mail address.
 * Publishing a job, bidding and paying wait for it (the server says
 * `email_unconfirmed` otherwise); GitHub sign-ups arrive confirmed.
 */
export function useNeedsEmailConfirmation(): boolean {
  const { data: me } = useMe();
  return me ? !me.emailVerified : false;
}

/**
 * Why an action waits for a confirmed e-mail address, with a button that
 * mails the link again and says so once it is on its way.
 */
export function ConfirmEmailNotice({ title, reason, className }: { title: string; reason: string; className?: string }) {
  const { data: me } = useMe();
  const queryClient = useQueryClient();
  const [sent, setSent] = useState(false);
  const resend = useResendVerification({
    mutationConfig: {
      onSuccess: () => setSent(true),
      onError: (error) => {
        // Confirmed meanwhile, in another tab: the notice goes away with fresh account details.
        if (error.code === 'already_verified') void queryClient.invalidateQueries({ queryKey: authKeys.me() });
      },
    },
  });
  return (
    <Notice tone="caution" title={title} className={className}>
      <p>
        {reason} Follow the link we e-mailed to <strong>{me?.email ?? 'your address'}</strong>; it is good for 48 hours.
      </p>
      <div className="mt-2 flex flex-wrap items-center gap-3">
        <Button variant="secondary" busy={resend.isPending} onClick={() => resend.mutate()}>
          Send the link again
        </Button>
        {sent && !resend.isPending && <span className="font-semibold text-pass">A new link is on its way. Check your inbox.</span>}
        {resend.isError && <span className="font-semibold text-fail">{resend.error.message}</span>}
      </div>
    </Notice>
  );
}
