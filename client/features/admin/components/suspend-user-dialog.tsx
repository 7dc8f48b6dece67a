import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { suspendUserSchema } from '@shared/schemas/admin';
import { toast } from '@client/lib/toast';
import type { z } from 'zod';
import { ConfirmDialog } from '@client/components/ui/modal-dialog';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { useSuspendUser, type AdminUserRow } from '../api/admin-users';
import { lazyResolver } from '@client/lib/lazy-resolver';

const suspendUserResolver = lazyResolver(() => import('@shared/schemas/admin').then((m) => m.suspendUserSchema));

type SuspendFields = z.infer<typeof suspendUserSchema>;

/** Asks why before suspending an account; the reason goes into the audit log. */
export function SuspendUserDialog({ user, onClose }: { user: AdminUserRow | null; onClose: () => void }) {
  const form = useForm<SuspendFields>({ resolver: suspendUserResolver, defaultValues: { reason: '' } });
  const [formError, setFormError] = useState<string>();
  const suspend = useSuspendUser({
    mutationConfig: {
      onSuccess: (updated) => {
        toast.success(`${updated.displayName}’s account is suspended.`);
        close();
      },
      onError: (error) => setFormError(applyServerErrors(error, form.setError, ['reason'])),
    },
  });
  function close() {
    form.reset({ reason: '' });
    setFormError(undefined);
    onClose();
  }
  const confirm = form.handleSubmit(({ reason }) => {
    if (!user) return;
    setFormError(undefined);
    suspend.mutate({ userId: user.id, reason });
  });

  return (
    <ConfirmDialog
      open={user !== null}
      onClose={() => !suspend.isPending && close()}
      onConfirm={() => void confirm()}
      title={user ? `Suspend ${user.displayName}?` : 'Suspend this account?'}
      description={
        <p>
          They are signed out on their next request and cannot sign in until an administrator reinstates the account. Their jobs, bids and messages stay as
          they are.
        </p>
      }
      confirmLabel="Suspend account"
      tone="danger"
      busy={suspend.isPending}
      error={formError}
    >
      <TextAreaField
        label="Reason"
        hint="At least 5 characters. Kept in the audit log."
        rows={3}
        data-autofocus
        error={form.formState.errors.reason?.message}
        {...form.register('reason')}
      />
    </ConfirmDialog>
  );
}
