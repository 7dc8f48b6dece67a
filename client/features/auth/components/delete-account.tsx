import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import type { DeleteAccountInput } from '@shared/schemas/account';
import { Button } from '@client/components/ui/button';
import { ModalDialog } from '@client/components/ui/modal-dialog';
import { Notice } from '@client/components/ui/notice';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors, fieldProps } from '@client/lib/form-errors';
import { useDeleteAccount } from '../api/account-mutations';
import { authQueries } from '../api/auth-keys';
import { lazyResolver } from '@client/lib/lazy-resolver';

const deleteAccountResolver = lazyResolver(() => import('@shared/schemas/account').then((m) => m.deleteAccountSchema));

/**
 * Deleting the account: first what stands in the way (jobs and money in
 * progress) and what stays, then the current password and a last question.
 */
export function DeleteAccount({ hasPassword }: { hasPassword: boolean }) {
  const check = useQuery(authQueries.deletion());
  const [asking, setAsking] = useState(false);
  const [formError, setFormError] = useState<string>();
  const navigate = useNavigate();
  const form = useForm<DeleteAccountInput>({ resolver: deleteAccountResolver, defaultValues: { currentPassword: '' } });
  const remove = useDeleteAccount({
    mutationConfig: {
      onSuccess: () => {
        toast.success('Your account is deleted. Thank you for using Tenthmark.');
        navigate('/', { replace: true });
      },
    },
  });
  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    remove.mutate(values, {
      onError: (error) => {
        setAsking(false);
        setFormError(applyServerErrors(error, form.setError, ['currentPassword']));
      },
    });
  });
  const field = fieldProps(form);

  return (
    <div className="flex flex-col gap-3">
      <p className="text-ink-soft">
        Deleting removes your name, e-mail address, password and sign-in links, signs out every device, and takes your shop out of the directory. The
        jobs, inspection records, reviews and money records you took part in stay, shown as “Deleted account”, because the other party and the books
        still need them. This cannot be undone.
      </p>
      {check.isPending && <Notice>Checking your jobs …</Notice>}
      {check.isError && (
        <Notice tone="error">
          {check.error.message}{' '}
          <button type="button" className="underline" onClick={() => void check.refetch()}>
            Retry
          </button>
        </Notice>
      )}
      {check.data && !check.data.allowed && (
        <Notice tone="error" title="Settle these first">
          {check.data.blockers.length === 0 ? (
            <p>A staff account is closed by another admin.</p>
          ) : (
            <ul className="list-disc pl-5" data-testid="deletion-blockers">
              {check.data.blockers.map((b) => (
                <li key={`${b.jobId}-${b.reason}`}>
                  <Link to={`/jobs/${b.jobId}`} className="font-semibold underline">
                    {b.jobTitle}
                  </Link>
                  : {b.reason}
                </li>
              ))}
            </ul>
          )}
        </Notice>
      )}
      {check.data?.allowed && !hasPassword && (
        <Notice>
          You sign in with GitHub and have no Tenthmark password. <Link to="/forgot-password" className="underline">Set one by e-mail</Link> first, then
          come back to delete the account.
        </Notice>
      )}
      {check.data?.allowed && hasPassword && (
        <form
          onSubmit={(event) => {
            event.preventDefault();
            void form.trigger().then((ok) => ok && setAsking(true));
          }}
          noValidate
          className="flex flex-col gap-4"
          aria-label="Delete my account"
        >
          {check.data.alsoHappens.length > 0 && (
            <ul className="list-disc pl-5 text-ink-soft">
              {check.data.alsoHappens.map((line) => (
                <li key={line}>{line}</li>
              ))}
            </ul>
          )}
          {formError && <Notice tone="error">{formError}</Notice>}
          <TextField label="Current password" type="password" autoComplete="current-password" {...field('currentPassword')} />
          <Button type="submit" variant="danger">
            Delete my account
          </Button>
        </form>
      )}
      <ModalDialog
        open={asking}
        onClose={() => setAsking(false)}
        title="Delete your account?"
        description="Your name, address and password are removed and every device is signed out. This cannot be undone."
        size="sm"
      >
        <div className="flex flex-wrap justify-end gap-3">
          <Button variant="secondary" onClick={() => setAsking(false)} data-autofocus>
            Keep my account
          </Button>
          <Button variant="danger" busy={remove.isPending} onClick={() => void onSubmit()}>
            Yes, delete it
          </Button>
        </div>
      </ModalDialog>
    </div>
  );
}
