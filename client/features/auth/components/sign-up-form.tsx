import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { SignUpInput } from '@shared/schemas/auth';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors, fieldProps } from '@client/lib/form-errors';
import { useSignUp } from '../api/auth-mutations';
import { ConsentField } from './consent-field';
import { RolePicker } from './role-picker';
import { lazyResolver } from '@client/lib/lazy-resolver';

const signUpResolver = lazyResolver(() => import('@shared/schemas/auth').then((m) => m.signUpSchema));

export function SignUpForm({ onSignedUp }: { onSignedUp: () => void }) {
  const [formError, setFormError] = useState<string>();
  const form = useForm<SignUpInput>({
    resolver: signUpResolver,
    defaultValues: { displayName: '', email: '', password: '', role: undefined, acceptTerms: undefined },
  });
  const signUp = useSignUp({ mutationConfig: { onSuccess: onSignedUp } });
  const field = fieldProps(form);

  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    signUp.mutate(values, {
      onError: (error) => setFormError(applyServerErrors(error, form.setError, ['displayName', 'email', 'password', 'role', 'acceptTerms'])),
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Create an account">
      {formError && <Notice tone="error">{formError}</Notice>}
      <RolePicker {...field('role')} />
      <TextField label="Your name or business name" autoComplete="name" {...field('displayName')} />
      <TextField label="E-mail" type="email" autoComplete="email" {...field('email')} />
      <TextField label="Password" type="password" autoComplete="new-password" hint="At least 10 characters. A short sentence works well." {...field('password')} />
      <ConsentField {...field('acceptTerms')} />
      <Button type="submit" busy={signUp.isPending}>
        Create my account
      </Button>
    </form>
  );
}
