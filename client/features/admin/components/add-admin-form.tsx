import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { toast } from '@client/lib/toast';
import type { CreateAdminInput } from '@shared/schemas/admin';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { useCreateAdmin } from '../api/admin-users';
import { lazyResolver } from '@client/lib/lazy-resolver';

const createAdminResolver = lazyResolver(() => import('@shared/schemas/admin').then((m) => m.createAdminSchema));

/** Admins exist only from the seed or by another admin; the newcomer chooses a password from an e-mailed link. */
export function AddAdminForm() {
  const [formError, setFormError] = useState<string>();
  const form = useForm<CreateAdminInput>({ resolver: createAdminResolver, defaultValues: { displayName: '', email: '' } });
  const create = useCreateAdmin({
    mutationConfig: {
      onSuccess: (user) => {
        toast.success(`${user.displayName} is an administrator now; a link to choose a password is on its way.`);
        form.reset();
      },
    },
  });
  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    create.mutate(values, { onError: (error) => setFormError(applyServerErrors(error, form.setError, ['displayName', 'email'])) });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Add an administrator">
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextField label="Name" autoComplete="off" error={form.formState.errors.displayName?.message} {...form.register('displayName')} />
      <TextField label="E-mail" type="email" autoComplete="off" error={form.formState.errors.email?.message} {...form.register('email')} />
      <Button type="submit" busy={create.isPending}>
        Add administrator
      </Button>
    </form>
  );
}
