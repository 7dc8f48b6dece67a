import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { lazyResolver } from '@client/lib/lazy-resolver';
import { toast } from '@client/lib/toast';
import { useProposeChangeOrder } from '../api/payments';
import type { ChangeOrderFormValues } from './change-order-form-schema';

const changeOrderResolver = lazyResolver(() => import('./change-order-form-schema').then((m) => m.changeOrderFormSchema));

/** The shop proposes extra work with its price; `description` prefills what needs doing (a crack test's findings, say). */
export function ProposeChangeOrder({ jobId, description = '', intro }: { jobId: string; description?: string; intro?: string }) {
  const [formError, setFormError] = useState<string>();
  const form = useForm<ChangeOrderFormValues>({ resolver: changeOrderResolver, defaultValues: { description, dollars: '' } });
  // A prefill that changes (findings still being typed) follows into the field until the shop edits it there.
  const edited = form.formState.dirtyFields.description;
  useEffect(() => {
    if (!edited) form.resetField('description', { defaultValue: description });
  }, [description, edited, form]);
  const propose = useProposeChangeOrder(jobId, {
    mutationConfig: {
      onSuccess: () => {
        toast.success('Sent to the builder.');
        form.reset();
      },
    },
  });
  const onSubmit = form.handleSubmit(({ description, dollars }) => {
    setFormError(undefined);
    const [whole, fraction = ''] = dollars.split('.');
    const amountCents = Number(whole) * 100 + Number(fraction.padEnd(2, '0'));
    propose.mutate({ description, amountCents }, { onError: (error) => setFormError(applyServerErrors(error, form.setError, ['description'])) });
  });
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Propose extra work" className="mt-4 flex flex-col gap-3">
      <p className="text-sm text-ink-soft">{intro ?? 'Found something on teardown? Propose the extra work with its price; the builder agrees and pays before you do it.'}</p>
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextAreaField label="What needs doing, and why" rows={3} error={form.formState.errors.description?.message} {...form.register('description')} />
      <TextField label="Price in dollars" inputMode="decimal" error={form.formState.errors.dollars?.message} {...form.register('dollars')} />
      <div>
        <Button type="submit" busy={propose.isPending}>
          Send to the builder
        </Button>
      </div>
    </form>
  );
}
