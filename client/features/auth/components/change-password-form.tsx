import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors, fieldProps } from '@client/lib/form-errors';
import { useChangePassword } from '../api/auth-mutations';
import { NewPasswordFields } from './new-password-fields';
import { changePasswordResolver } from './password-form-resolvers';
import type { ChangePasswordFormValues as FormValues } from './password-form-schemas';


const empty: FormValues = { currentPassword: '', newPassword: '', repeat: '' };

/** Change the password with the current one; every other signed-in device is signed out. */
export function ChangePasswordForm() {
  const [formError, setFormError] = useState<string>();
  const form = useForm<FormValues>({ resolver: changePasswordResolver, defaultValues: empty });
  const change = useChangePassword({
    mutationConfig: {
      onSuccess: () => {
        form.reset(empty);
        toast.success('Password changed. Your other devices are signed out.');
      },
    },
  });
  const onSubmit = form.handleSubmit(({ currentPassword, newPassword }) => {
    setFormError(undefined);
    change.mutate({ currentPassword, newPassword }, { onError: (error) => setFormError(applyServerErrors(error, form.setError, ['currentPassword', 'newPassword'])) });
  });
  const field = fieldProps(form);
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Change password">
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextField label="Current password" type="password" autoComplete="current-password" {...field('currentPassword')} />
      <NewPasswordFields password={field('newPassword')} repeat={field('repeat')} />
      <p className="text-sm text-ink-soft">
        Forgot the current one? <Link to="/forgot-password" className="underline">Reset it by e-mail</Link>.
      </p>
      <Button type="submit" busy={change.isPending}>
        Change password
      </Button>
    </form>
  );
}
