import { useId, useMemo, useState } from 'react';
import { useForm, useWatch, type Control } from 'react-hook-form';
import { toast } from '@client/lib/toast';
import { formatCents } from '@shared/catalogue';
import { type DisputeCase, type DisputeOutcome, type ResolveDisputeInput } from '@shared/schemas/disputes';
import { Button } from '@client/components/ui/button';
import { ConfirmDialog } from '@client/components/ui/modal-dialog';
import { MoneyField } from '@client/components/ui/money-field';
import { Notice } from '@client/components/ui/notice';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { dollarsFormResolver, parseDollars, tidyDollars, withFormPaths, type PreparedInput } from '@client/lib/money';
import { useResolveDispute } from '../api/admin-disputes';
import { Split } from './dispute-decision';

interface ResolveFields {
  outcome: DisputeOutcome | '';
  /** The shop's share as typed, in dollars; read only for a split. */
  shopShare: string;
  decision: string;
}

const FIELDS = ['outcome', 'shopShare', 'decision'] as const;
const formPath = (path: string) => (path === 'shopCents' ? 'shopShare' : path);

/** The form's values as the shared schema's input; a split's share must be readable and at most what is held. */
function prepareFor(heldCents: number) {
  return (values: ResolveFields): PreparedInput => {
    const moneyErrors: Record<string, string> = {};
    let shopCents: number | undefined;
    if (values.outcome === 'split') {
      const parsed = parseDollars(values.shopShare ?? '');
      if (!parsed.ok) moneyErrors.shopShare = parsed.message;
      else if (parsed.cents > heldCents) moneyErrors.shopShare = `The shop’s share can be at most ${formatCents(heldCents)}, the amount held.`;
      shopCents = parsed.ok ? parsed.cents : Number.NaN;
    }
    return {
      input: { outcome: values.outcome || undefined, decision: values.decision, ...(shopCents === undefined ? {} : { shopCents }) },
      moneyErrors,
      formPath,
    };
  };
}

/** Where the held money goes under an outcome, or null while a split's share is missing or too large. */
function amountsFor(outcome: DisputeOutcome | '' | undefined, shopCents: number | null, heldCents: number): { toShop: number; toBuilder: number } | null {
  if (outcome === 'release') return { toShop: heldCents, toBuilder: 0 };
  if (outcome === 'refund') return { toShop: 0, toBuilder: heldCents };
  if (outcome === 'split' && shopCents !== null && shopCents <= heldCents) return { toShop: shopCents, toBuilder: heldCents - shopCents };
  return null;
}

function typedCents(text: string | undefined): number | null {
  const parsed = parseDollars(text ?? '');
  return parsed.ok ? parsed.cents : null;
}

/** The live split under the form: what goes to each side as the outcome and the share change. */
function LiveAmounts({ control, heldCents, ...names }: { control: Control<ResolveFields, unknown, ResolveDisputeInput>; heldCents: number; feeBps: number | null; shopName: string; builderName: string }) {
  const [outcome, shopShare] = useWatch({ control, name: ['outcome', 'shopShare'] });
  const amounts = amountsFor(outcome, typedCents(shopShare), heldCents);
  return (
    <div className="rounded-lg bg-slate-50 px-4 py-3 ring-1 ring-slate-200" aria-live="polite">
      {amounts ? (
        <Split {...amounts} {...names} />
      ) : (
        <p className="text-sm text-ink-soft">
          {outcome === 'split' ? `Enter the shop’s share, from $0.00 to ${formatCents(heldCents)}, to see the rest for the builder.` : 'Choose an outcome to see where the money goes.'}
        </p>
      )}
    </div>
  );
}

/**
 * The administrator's decision on an open dispute: release, refund or split
 * what is held, with a written decision that both sides receive by e-mail.
 * A confirm step shows the amounts before anything moves.
 */
export function ResolveDisputeForm({ data }: { data: DisputeCase }) {
  const heldCents = data.money.balance.held;
  const shopName = data.shop?.name ?? 'the shop';
  const builderName = data.builder.name;
  const resolver = useMemo(() => dollarsFormResolver<ResolveFields, ResolveDisputeInput>(() => import('@shared/schemas/disputes').then((m) => m.resolveDisputeSchema), prepareFor(heldCents)), [heldCents]);
  const form = useForm<ResolveFields, unknown, ResolveDisputeInput>({ resolver, defaultValues: { outcome: '', shopShare: '', decision: '' } });
  const [formError, setFormError] = useState<string>();
  const [pending, setPending] = useState<ResolveDisputeInput>();
  const outcome = useWatch({ control: form.control, name: 'outcome' });
  const idPrefix = useId();
  const outcomeErrorId = `${idPrefix}-outcome-error`;
  const errors = form.formState.errors;

  const resolve = useResolveDispute(data.dispute.id, {
    mutationConfig: {
      onSuccess: () => {
        setPending(undefined);
        toast.success('The decision is carried out and on its way to both sides by e-mail.');
      },
      onError: (error) => {
        setPending(undefined);
        setFormError(applyServerErrors(withFormPaths(error, formPath), form.setError, [...FIELDS]));
      },
    },
  });

  const onSubmit = form.handleSubmit((input) => {
    setFormError(undefined);
    setPending(input);
  });

  const outcomes: Array<{ value: DisputeOutcome; label: string; explain: string }> = [
    { value: 'release', label: 'Release in full', explain: `All ${formatCents(heldCents)} held goes to ${shopName}, less the Tenthmark fee.` },
    { value: 'refund', label: 'Refund in full', explain: `All ${formatCents(heldCents)} held goes back to ${builderName}.` },
    { value: 'split', label: 'Split', explain: 'You choose the shop’s share; the rest goes back to the builder.' },
  ];
  const confirmAmounts = pending ? amountsFor(pending.outcome, pending.shopCents ?? null, heldCents) : null;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5" aria-label="Decide the dispute">
      <Notice tone="caution" title="This decision moves real money">
        Carrying it out pays the shop, refunds the builder, or both, from what is held. It cannot be undone here, so read the evidence first.
      </Notice>
      {heldCents === 0 && <Notice tone="info">Nothing is held for this job at the moment.</Notice>}
      {formError && <Notice tone="error">{formError}</Notice>}

      <fieldset className="flex flex-col gap-3" aria-describedby={errors.outcome ? outcomeErrorId : undefined}>
        <legend className="mb-2 text-sm font-semibold text-ink">Outcome</legend>
        {outcomes.map((option) => (
          <div key={option.value} className="flex gap-3">
            <input
              id={`${idPrefix}-outcome-${option.value}`}
              type="radio"
              value={option.value}
              aria-describedby={`${idPrefix}-outcome-${option.value}-explain`}
              className="mt-1 size-5 shrink-0 cursor-pointer accent-slate-700"
              {...form.register('outcome')}
            />
            <div className="flex flex-col">
              <label htmlFor={`${idPrefix}-outcome-${option.value}`} className="cursor-pointer font-semibold">
                {option.label}
              </label>
              <p id={`${idPrefix}-outcome-${option.value}-explain`} className="text-sm text-ink-soft">
                {option.explain}
              </p>
            </div>
          </div>
        ))}
        {errors.outcome && (
          <p id={outcomeErrorId} className="text-sm font-semibold text-fail">
            {errors.outcome.message}
          </p>
        )}
      </fieldset>

      {outcome === 'split' && (
        <MoneyField
          label="Amount to the shop"
          hint={`From $0.00 to ${formatCents(heldCents)}. The Tenthmark fee comes out of it; the rest of what is held goes back to the builder.`}
          error={errors.shopShare?.message}
          {...form.register('shopShare', { onBlur: (event) => tidyDollars(event, (text) => form.setValue('shopShare', text)) })}
        />
      )}

      <LiveAmounts control={form.control} heldCents={heldCents} feeBps={data.job.feeBps} shopName={shopName} builderName={builderName} />

      <TextAreaField
        label="Written decision"
        rows={7}
        hint="At least 20 characters. It is e-mailed to both the builder and the shop, so write it for them: what you found and why you decided so."
        error={errors.decision?.message}
        {...form.register('decision')}
      />

      <Button type="submit" className="self-start">
        Review the decision
      </Button>

      <ConfirmDialog
        open={pending !== undefined}
        onClose={() => !resolve.isPending && setPending(undefined)}
        onConfirm={() => pending && resolve.mutate(pending)}
        title="Carry out this decision?"
        description={
          <div className="flex flex-col gap-3 text-ink">
            {pending && <p className="font-semibold">{outcomes.find((o) => o.value === pending.outcome)?.label}</p>}
            {confirmAmounts && <Split {...confirmAmounts} feeBps={data.job.feeBps} shopName={shopName} builderName={builderName} />}
            <p className="text-ink-soft">The money moves as shown and the written decision is e-mailed to both sides. This cannot be undone here.</p>
          </div>
        }
        confirmLabel="Carry out the decision"
        busy={resolve.isPending}
      />
    </form>
  );
}

/** What was decided, once it is: the outcome, the amounts and the written decision. */
