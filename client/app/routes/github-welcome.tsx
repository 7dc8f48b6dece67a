import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate } from 'react-router-dom';
import type { GithubCompleteInput } from '@shared/schemas/auth';
import { Button } from '@client/components/ui/button';
import { Card, PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { authQueries, ConsentField, useCompleteGithub, RolePicker } from '@client/features/auth';
import { applyServerErrors } from '@client/lib/form-errors';
import { lazyResolver } from '@client/lib/lazy-resolver';

const githubCompleteResolver = lazyResolver(() => import('@shared/schemas/auth').then((m) => m.githubCompleteSchema));

/** A first GitHub sign-in: the person chooses builder or shop before the account exists. */
export function GithubWelcomeRoute() {
  const navigate = useNavigate();
  const pending = useQuery(authQueries.pendingGithub());
  const [formError, setFormError] = useState<string>();
  const form = useForm<GithubCompleteInput>({ resolver: githubCompleteResolver });
  const complete = useCompleteGithub({ mutationConfig: { onSuccess: () => navigate('/dashboard', { replace: true }) } });
  const onSubmit = form.handleSubmit((values) => {
    setFormError(undefined);
    complete.mutate(values, { onError: (error) => setFormError(applyServerErrors(error, form.setError, ['role', 'acceptTerms'])) });
  });

  return (
    <div className="mx-auto max-w-xl">
      <PageTitle title="One more step" />
      <Card>
        {pending.isPending && <Notice>Loading …</Notice>}
        {pending.isError && (
          <Notice tone="error">
            {pending.error.message} <Link to="/signin" className="underline">Back to sign in</Link>
          </Notice>
        )}
        {pending.data && (
          <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Choose your role">
            <p>
              Welcome, <strong>{pending.data.displayName}</strong> ({pending.data.email}). Tell us how you will use Tenthmark; an
              account has one role.
            </p>
            {formError && <Notice tone="error">{formError}</Notice>}
            <RolePicker error={form.formState.errors.role?.message} {...form.register('role')} />
            <ConsentField error={form.formState.errors.acceptTerms?.message} {...form.register('acceptTerms')} />
            <Button type="submit" busy={complete.isPending}>
              Create my account
            </Button>
          </form>
        )}
      </Card>
    </div>
  );
}
