import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { toast } from '@client/lib/toast';
import { type PlatformFee } from '@shared/schemas/admin';
import { Button } from '@client/components/ui/button';
import { ConfirmDialog } from '@client/components/ui/modal-dialog';
import { Notice } from '@client/components/ui/notice';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { dollarsFormResolver, withFormPaths, type PreparedInput } from '@client/lib/money';
import { useSetPlatformFee } from '../api/admin-settings';
import { formatFee } from './admin-words';

interface FeeFields {
  /** The fee as typed, in percent: "7.5". */
  percent: string;
}

type FeeInput = { feeBps: number };

const PERCENT = /^(\d{0,6})(?:\.(\d{0,2}))?$/;

/** A typed percentage read digit by digit into whole basis points: "7.5" → 750, exactly. */
function percentToBps(text: string): { ok: true; bps: number } | { ok: false; message: string } {
  const trimmed = text.trim().replace(/\s*%$/, '');
  if (trimmed === '') return { ok: false, message: 'Enter the fee as a percentage, like 7.5.' };
  if (/^[-−]/.test(trimmed)) return { ok: false, message: 'The fee cannot be negative.' };
  if (/^\d*\.\d{3,}$/.test(trimmed)) return { ok: false, message: 'Use at most 2 decimal places, like 7.25.' };
  const match = PERCENT.exec(trimmed);
  if (!match || (!match[1] && !match[2])) return { ok: false, message: 'Enter the fee as a percentage in digits, like 7.5.' };
  return { ok: true, bps: Number(match[1]) * 100 + Number((match[2] ?? '').padEnd(2, '0')) };
}

const formPath = (path: string) => (path === 'feeBps' ? 'percent' : path);

function prepare(values: FeeFields): PreparedInput {
  const parsed = percentToBps(values.percent ?? '');
  return {
    input: { feeBps: parsed.ok ? parsed.bps : Number.NaN },
    moneyErrors: parsed.ok ? {} : { percent: parsed.message },
    formPath,
  };
}

// The shared schema checks the basis points; the percentage text is read first, like dollars are.
const resolver = dollarsFormResolver<FeeFields, FeeInput>(() => import('@shared/schemas/admin').then((m) => m.platformFeeSchema), prepare);

/** A new Tenthmark fee, confirmed before it is saved; it applies to bids accepted from then on. */
export function PlatformFeeForm({ current }: { current: PlatformFee }) {
  const form = useForm<FeeFields, unknown, FeeInput>({ resolver, defaultValues: { percent: (current.feeBps / 100).toFixed(2) } });
  const [pending, setPending] = useState<FeeInput>();
  const [formError, setFormError] = useState<string>();
  const save = useSetPlatformFee({
    mutationConfig: {
      onSuccess: (fee) => {
        setPending(undefined);
        form.reset({ percent: (fee.feeBps / 100).toFixed(2) });
        toast.success(`The fee is ${formatFee(fee.feeBps)} for bids accepted from now on.`);
      },
      onError: (error) => {
        setPending(undefined);
        setFormError(applyServerErrors(withFormPaths(error, formPath), form.setError, ['percent']));
      },
    },
  });
  const onSubmit = form.handleSubmit((input) => {
    setFormError(undefined);
    if (input.feeBps === current.feeBps) {
      form.setError('percent', { type: 'same', message: `The fee is already ${formatFee(current.feeBps)}.` });
      return;
    }
    setPending(input);
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Change the Tenthmark fee">
      {formError && <Notice tone="error">{formError}</Notice>}
      <TextField
        label="New fee (percent)"
        inputMode="decimal"
        autoComplete="off"
        className="max-w-xs"
        hint="From 0 to 30, with up to two decimals, like 7.5."
        error={form.formState.errors.percent?.message}
        {...form.register('percent')}
      />
      <p className="text-sm text-ink-soft">
        The new fee applies only to bids accepted from now on. Jobs whose bid is already accepted keep the fee they were accepted with.
      </p>
      <Button type="submit" className="self-start">
        Save the new fee
      </Button>
      <ConfirmDialog
        open={pending !== undefined}
        onClose={() => !save.isPending && setPending(undefined)}
        onConfirm={() => pending && save.mutate(pending)}
        title="Change the Tenthmark fee?"
        description={
          pending && (
            <p>
              From {formatFee(current.feeBps)} to <strong className="text-ink">{formatFee(pending.feeBps)}</strong>, for every bid accepted from now on. Jobs
              already accepted keep their fee.
            </p>
          )
        }
        confirmLabel="Change the fee"
        busy={save.isPending}
      />
    </form>
  );
}
