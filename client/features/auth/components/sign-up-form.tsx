import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { signUpSchema, type SignUpInput } from '@shared/schemas/auth';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { useSignUp } from '../api/auth-mutations';
import { RolePicker } from './role-picker';

export function SignUpForm({ onSignedUp }: { onSignedUp: () => void }) {
  const [formError, setFormError] = useState<string>();
  const form = useForm<SignUpInput>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { displayName: '', email: '', password: '', role: undefined },
  });
  const signUp = useSignUp({ mutationConfig: { onSuccess: onSignedUp } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    signUp.mutate(values, {
      onError: (error) => setFormError(applyServerErrors(error, form.setError, ['displayName', 'email', 'password', 'role'])),
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Create an account">
      {formError && <Notice tone="error">{formError}</Notice>}
      <RolePicker error={errors.role?.message} {...form.register('role')} />
      <TextField
        label="Your name or business name"
        autoComplete="name"
        error={errors.displayName?.message}
        {...form.register('displayName')}
      />
      <TextField label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters. A short sentence works well."
        error={errors.password?.message}
        {...form.register('password')}
      />
      <Button type="submit" busy={signUp.isPending}>
        Create my account
      </Button>
    </form>
  );
}
