import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { toast } from '@client/lib/toast';
import { Button } from '@client/components/ui/button';
import { Card, PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { NewPasswordFields, resetPasswordResolver, useConfirmPasswordReset, type ResetPasswordFormValues } from '@client/features/auth';
import { applyServerErrors, fieldProps } from '@client/lib/form-errors';


export function ResetPasswordRoute() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const navigate = useNavigate();
  const [formError, setFormError] = useState<string>();
  const form = useForm<ResetPasswordFormValues>({ resolver: resetPasswordResolver, defaultValues: { password: '', repeat: '' } });
  const confirm = useConfirmPasswordReset({
    mutationConfig: {
      onSuccess: () => {
        toast.success('Password changed. Sign in with your new password.');
        navigate('/signin', { replace: true });
      },
    },
  });
  const onSubmit = form.handleSubmit(({ password }) => {
    setFormError(undefined);
    confirm.mutate({ token, password }, { onError: (error) => setFormError(applyServerErrors(error, form.setError, ['password'])) });
  });
  const field = fieldProps(form);
  return (
    <div className="mx-auto max-w-md">
      <PageTitle title="Choose a new password" />
      <Card>
        {!token ? (
          <Notice tone="error">
            This page needs the link from your e-mail. <Link to="/forgot-password" className="underline">Ask for a new link</Link>.
          </Notice>
        ) : (
          <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Choose a new password">
            {formError && (
              <Notice tone="error">
                {formError} <Link to="/forgot-password" className="underline">Ask for a new link</Link>.
              </Notice>
            )}
            <NewPasswordFields password={field('password')} repeat={field('repeat')} />
            <Button type="submit" busy={confirm.isPending}>
              Save the new password
            </Button>
          </form>
        )}
      </Card>
    </div>
  );
}
