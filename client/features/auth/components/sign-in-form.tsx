import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import type { SignInInput } from '@shared/schemas/auth';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { TextField } from '@client/components/ui/text-field';
import { ContactLine } from '@client/features/help';
import { ApiError } from '@client/lib/api-client';
import { applyServerErrors, fieldProps } from '@client/lib/form-errors';
import { useSignIn } from '../api/auth-mutations';
import { lazyResolver } from '@client/lib/lazy-resolver';

const signInResolver = lazyResolver(() => import('@shared/schemas/auth').then((m) => m.signInSchema));

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const [formError, setFormError] = useState<string>();
  const [suspended, setSuspended] = useState(false);
  const form = useForm<SignInInput>({ resolver: signInResolver, defaultValues: { email: '', password: '' } });
  const signIn = useSignIn({ mutationConfig: { onSuccess: onSignedIn } });
  const field = fieldProps(form);

  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    setSuspended(false);
    signIn.mutate(values, {
      onError: (error) => {
        setFormError(applyServerErrors(error, form.setError, ['email', 'password']));
        setSuspended(error instanceof ApiError && error.code === 'suspended');
      },
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Sign in">
      {formError && (
        <Notice tone="error">
          {formError}
          {suspended && <ContactLine />}
        </Notice>
      )}
      <TextField label="E-mail" type="email" autoComplete="email" {...field('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" {...field('password')} />
      <Button type="submit" busy={signIn.isPending}>
        Sign in
      </Button>
      <p className="text-sm">
        <Link to="/forgot-password" className="font-semibold text-slate-700 underline underline-offset-4">
          Forgot your password?
        </Link>
      </p>
    </form>
  );
}
