import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { toast } from '@client/lib/toast';
import type { ChangeEmailInput } from '@shared/schemas/account';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors, fieldProps } from '@client/lib/form-errors';
import { useChangeEmail } from '../api/account-mutations';
import { lazyResolver } from '@client/lib/lazy-resolver';

const changeEmailResolver = lazyResolver(() => import('@shared/schemas/account').then((m) => m.changeEmailSchema));

const empty: ChangeEmailInput = { newEmail: '', currentPassword: '' };

/** Moves the account to a new address: a link goes there, and the address changes only once it is followed. */
export function ChangeEmailForm({ email, pendingEmail }: { email: string; pendingEmail: string | null }) {
  const [formError, setFormError] = useState<string>();
  const form = useForm<ChangeEmailInput>({ resolver: changeEmailResolver, defaultValues: empty });
  const change = useChangeEmail({
    mutationConfig: {
      onSuccess: ({ pendingEmail: sentTo }) => {
        form.reset(empty);
        toast.success(`We sent a link to ${sentTo}. Your address changes when you follow it.`);
      },
    },
  });
  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    change.mutate(values, { onError: (error) => setFormError(applyServerErrors(error, form.setError, ['newEmail', 'currentPassword'])) });
  });
  const field = fieldProps(form);
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Change e-mail address">
      <p className="text-ink-soft">
        You use <strong className="text-ink">{email}</strong>. We send a link to the new address; it changes once you follow that link, and we tell the
        old address.
      </p>
      {pendingEmail && (
        <Notice>
          A link is waiting at <strong>{pendingEmail}</strong>. Asking again sends a new one and the old link stops working.
        </Notice>
      )}
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextField label="New e-mail address" type="email" autoComplete="email" {...field('newEmail')} />
      <TextField label="Current password" type="password" autoComplete="current-password" {...field('currentPassword')} />
      <Button type="submit" busy={change.isPending}>
        Send the link
      </Button>
    </form>
  );
}
