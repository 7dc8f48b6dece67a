import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import type { PasswordResetRequestInput } from '@shared/schemas/auth';
import { Button } from '@client/components/ui/button';
import { Card, PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { TextField } from '@client/components/ui/text-field';
import { useRequestPasswordReset } from '@client/features/auth';
import { applyServerErrors } from '@client/lib/form-errors';
import { lazyResolver } from '@client/lib/lazy-resolver';

const passwordResetRequestResolver = lazyResolver(() => import('@shared/schemas/auth').then((m) => m.passwordResetRequestSchema));

export function ForgotPasswordRoute() {
  const [formError, setFormError] = useState<string>();
  const form = useForm<PasswordResetRequestInput>({ resolver: passwordResetRequestResolver, defaultValues: { email: '' } });
  const request = useRequestPasswordReset();
  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    request.mutate(values, { onError: (error) => setFormError(applyServerErrors(error, form.setError, ['email'])) });
  });
  return (
    <div className="mx-auto max-w-md">
      <PageTitle title="Reset your password" lead="We will e-mail you a link to choose a new one." />
      <Card>
        {request.isSuccess ? (
          <Notice tone="success" title="Check your inbox">
            If an account uses {form.getValues('email')}, a reset link is on its way. It works once and expires in an hour.
          </Notice>
        ) : (
          <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Reset your password">
            {formError && <Notice tone="error">{formError}</Notice>}
            <TextField label="E-mail" type="email" autoComplete="email" error={form.formState.errors.email?.message} {...form.register('email')} />
            <Button type="submit" busy={request.isPending}>
              Send the link
            </Button>
          </form>
        )}
      </Card>
      <p className="mt-4 text-center text-sm">
        <Link to="/signin" className="font-semibold text-slate-700 underline underline-offset-4">
          Back to sign in
        </Link>
      </p>
    </div>
  );
}
