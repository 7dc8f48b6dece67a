import { NAMES } from '@shared/glossary';
import { useId, useState } from 'react';
import { useFieldArray, useForm, useWatch, type Control, type Path } from 'react-hook-form';
import { findOperation, formatCents, lineAmountCents, prefillBidLines, type OperationCode, type PricedPer } from '@shared/catalogue';
import { type Bid, type BidInput } from '@shared/schemas/bids';
import type { JobDetail } from '@shared/schemas/jobs';
import { feeRateWords, netOf } from '@shared/money';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { centsToDollars, dollarsFormResolver, parseDollars, tidyDollars, withFormPaths, type PreparedInput } from '@client/lib/money';
import { cn } from '@client/lib/cn';
import { useFeeRate } from '../api/bids';

export interface BidLineFields {
  operation?: OperationCode;
  description: string;
  quantity: number;
  /** Dollars as typed. */
  unitPrice: string;
}

export interface BidFormFields {
  lineItems: BidLineFields[];
  turnaroundDays: number;
  validUntil: string;
  note: string;
}

const pricedPerWords: Record<PricedPer, string> = { cylinder: 'per cylinder', part: 'per part', job: 'per job' };

/** A local calendar date as YYYY-MM-DD, `days` from today. */
export function localDate(days = 0): string {
  const date = new Date();
  date.setDate(date.getDate() + days);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`;
}

/** A first bid: a line per operation the job asks for, priced from the shop's rate card; the shop's usual turnaround; valid two weeks. */
export function newBidValues(job: JobDetail, shop: { rateCard: Array<{ operation: string; priceCents: number }>; turnaroundDays: number }): BidFormFields {
  return {
    lineItems: prefillBidLines(job.spec.operations, shop.rateCard).map((line) => ({
      operation: line.operation,
      description: line.description,
      quantity: line.quantity,
      unitPrice: centsToDollars(line.unitPriceCents),
    })),
    turnaroundDays: shop.turnaroundDays,
    validUntil: localDate(14),
    note: '',
  };
}

/** A revision starts from the bid as it stands; an expired valid-until date moves to two weeks from today. */
export function revisedBidValues(bid: Bid): BidFormFields {
  return {
    lineItems: bid.lineItems.map((line) => ({
      operation: (findOperation(line.operation ?? '')?.code as OperationCode | undefined) ?? undefined,
      description: line.description,
      quantity: line.quantity,
      unitPrice: centsToDollars(line.unitPriceCents),
    })),
    turnaroundDays: bid.turnaroundDays,
    validUntil: bid.validUntil < localDate() ? localDate(14) : bid.validUntil,
    note: bid.note,
  };
}

function prepare(values: BidFormFields): PreparedInput {
  const moneyErrors: Record<string, string> = {};
  const lineItems = (values.lineItems ?? []).map((line, index) => {
    const parsed = parseDollars(line.unitPrice ?? '');
    if (!parsed.ok) moneyErrors[`lineItems.${index}.unitPrice`] = parsed.message;
    return {
      ...(line.operation ? { operation: line.operation } : {}),
      description: line.description,
      quantity: line.quantity,
      unitPriceCents: parsed.ok ? parsed.cents : Number.NaN,
    };
  });
  return {
    input: { ...values, lineItems },
    moneyErrors,
    formPath: (path) => path.replace(/^lineItems\.(\d+)\.unitPriceCents$/, 'lineItems.$1.unitPrice'),
  };
}

const resolver = dollarsFormResolver<BidFormFields, BidInput>(() => import('@shared/schemas/bids').then((m) => m.bidInputSchema), prepare);

/** A line's amount while typing, or null while its quantity or price cannot be read yet. */
function lineCents(line: Partial<BidLineFields> | undefined): number | null {
  if (!line) return null;
  const price = parseDollars(line.unitPrice ?? '');
  const quantity = line.quantity;
  if (!price.ok || typeof quantity !== 'number' || !Number.isInteger(quantity) || quantity < 1) return null;
  return lineAmountCents(quantity, price.cents);
}

function LineAmount({ control, index }: { control: Control<BidFormFields, unknown, BidInput>; index: number }) {
  const line = useWatch({ control, name: `lineItems.${index}` });
  const cents = lineCents(line);
  return <span className="tabular-nums">{cents === null ? '—' : formatCents(cents)}</span>;
}

/** What Tenthmark's fee takes from the total at today's rate and what the shop keeps, by the rule the payout uses. */
function FeeAndNet({ totalCents }: { totalCents: number }) {
  const rate = useFeeRate();
  if (rate.data === undefined) return null;
  const { feeCents, netCents } = netOf(totalCents, rate.data);
  return (
    <dl className="flex flex-col items-end text-sm" aria-live="polite">
      <div className="flex gap-2">
        <dt className="text-ink-soft">{NAMES.fee} ({feeRateWords(rate.data)})</dt>
        <dd className="tabular-nums" data-testid="bid-fee">
          {formatCents(feeCents)}
        </dd>
      </div>
      <div className="flex gap-2">
        <dt className="font-semibold">You receive</dt>
        <dd className="font-semibold tabular-nums" data-testid="bid-net">
          {formatCents(netCents)}
        </dd>
      </div>
    </dl>
  );
}

function RunningTotal({ control }: { control: Control<BidFormFields, unknown, BidInput> }) {
  const lines = useWatch({ control, name: 'lineItems' }) ?? [];
  const amounts = lines.map(lineCents);
  const total = amounts.reduce<number>((sum, cents) => sum + (cents ?? 0), 0);
  const unread = amounts.filter((cents) => cents === null).length;
  return (
    <div className="flex flex-col items-end gap-1 rounded-lg bg-slate-50 px-4 py-3 ring-1 ring-slate-200">
      <p className="text-lg">
        <span className="font-semibold">{unread ? 'Total so far' : 'Total'}</span>{' '}
        <output data-testid="bid-running-total" aria-live="polite" className="text-2xl font-extrabold tabular-nums">
          {formatCents(total)}
        </output>
      </p>
      {unread > 0 && (
        <p className="text-sm text-caution">
          {unread === 1 ? 'One line is' : `${unread} lines are`} not counted until its quantity and price can be read.
        </p>
      )}
      <FeeAndNet totalCents={total} />
      <p className="text-right text-sm text-ink-soft">
        Worked out here as you type. Tenthmark adds up the lines again in whole cents when you send the bid; that total is the one the
        builder sees and pays. The fee comes out of it at today’s rate, which is fixed on the job when the builder accepts.
      </p>
    </div>
  );
}

export interface BidFormProps {
  defaultValues: BidFormFields;
  /** Sends the checked bid; a rejection's field messages are put beside the inputs. */
  submit: (input: BidInput) => Promise<unknown>;
  submitLabel: string;
  onCancel?: () => void;
  /** The form's accessible name. */
  label: string;
}

/** A bid's lines, turnaround, validity and note, checked with the same schema the server uses. */
export function BidForm({ defaultValues, submit, submitLabel, onCancel, label }: BidFormProps) {
  const [formError, setFormError] = useState<string>();
  const form = useForm<BidFormFields, unknown, BidInput>({ resolver, defaultValues });
  const lines = useFieldArray({ control: form.control, name: 'lineItems' });
  const { errors, isSubmitting } = form.formState;
  const linesErrorId = useId();
  const uid = useId();
  const linesError = errors.lineItems?.root?.message ?? errors.lineItems?.message;

  const onSubmit = form.handleSubmit(async (input) => {
    setFormError(undefined);
    try {
      await submit(input);
    } catch (error) {
      const values = form.getValues();
      const fields: Array<Path<BidFormFields>> = ['lineItems', 'turnaroundDays', 'validUntil', 'note'];
      values.lineItems.forEach((_, index) => fields.push(`lineItems.${index}.description`, `lineItems.${index}.quantity`, `lineItems.${index}.unitPrice`));
      setFormError(applyServerErrors(withFormPaths(error, prepare(values).formPath), form.setError, fields));
    }
  });

  const describedBy = (...ids: Array<string | false | undefined>) => ids.filter(Boolean).join(' ') || undefined;
  const inputClass = (invalid: boolean) =>
    cn('min-h-11 w-full rounded-lg border bg-white px-3 py-2 text-base text-ink', invalid ? 'border-fail' : 'border-slate-300 focus:border-slate-600');

  return (
    <form onSubmit={onSubmit} noValidate aria-label={label} className="@container flex flex-col gap-5">
      {formError && <Notice tone="error">{formError}</Notice>}

      <fieldset aria-describedby={linesError ? linesErrorId : undefined} className="flex flex-col gap-3">
        <legend className="mb-1 text-lg font-bold">Your price, line by line</legend>
        {linesError && (
          <p id={linesErrorId} className="text-sm font-semibold text-fail">
            {linesError}
          </p>
        )}
        <div
          aria-hidden
          className="hidden grid-cols-[minmax(0,1fr)_5.5rem_8.5rem_7rem_5.5rem] gap-3 border-b border-slate-200 pb-1 text-sm font-semibold text-ink-soft @2xl:grid"
        >
          <span>Description</span>
          <span>Quantity</span>
          <span className="text-right">Unit price</span>
          <span className="text-right">Amount</span>
          <span />
        </div>
        <ol className="flex flex-col gap-3">
          {lines.fields.map((field, index) => {
            const lineErrors = errors.lineItems?.[index];
            const op = field.operation ? findOperation(field.operation) : undefined;
            const id = `${uid}-line-${index}`;
            const number = index + 1;
            return (
              <li
                key={field.id}
                className="grid grid-cols-2 gap-3 rounded-lg bg-white p-3 ring-1 ring-slate-200 @2xl:grid-cols-[minmax(0,1fr)_5.5rem_8.5rem_7rem_5.5rem] @2xl:items-start @2xl:bg-transparent @2xl:p-0 @2xl:ring-0"
              >
                <div className="col-span-2 flex flex-col gap-1 @2xl:col-span-1">
                  <label htmlFor={`${id}-description`} className="text-sm font-semibold @2xl:sr-only">
                    Line {number}: description
                  </label>
                  <input
                    id={`${id}-description`}
                    aria-invalid={lineErrors?.description ? true : undefined}
                    aria-describedby={describedBy(op && `${id}-per`, lineErrors?.description && `${id}-description-error`)}
                    className={inputClass(Boolean(lineErrors?.description))}
                    {...form.register(`lineItems.${index}.description`)}
                  />
                  {op && (
                    <p id={`${id}-per`} className="text-sm text-ink-soft">
                      Charged {pricedPerWords[op.pricedPer]}
                    </p>
                  )}
                  {lineErrors?.description && (
                    <p id={`${id}-description-error`} className="text-sm font-semibold text-fail">
                      {lineErrors.description.message}
                    </p>
                  )}
                </div>
                <div className="flex flex-col gap-1">
                  <label htmlFor={`${id}-quantity`} className="text-sm font-semibold @2xl:sr-only">
                    Line {number}: quantity
                  </label>
                  <input
                    id={`${id}-quantity`}
                    type="number"
                    inputMode="numeric"
                    min={1}
                    max={1000}
                    step={1}
                    aria-invalid={lineErrors?.quantity ? true : undefined}
                    aria-describedby={describedBy(lineErrors?.quantity && `${id}-quantity-error`)}
                    className={cn(inputClass(Boolean(lineErrors?.quantity)), 'tabular-nums')}
                    {...form.register(`lineItems.${index}.quantity`, { valueAsNumber: true })}
                  />
                  {lineErrors?.quantity && (
                    <p id={`${id}-quantity-error`} className="text-sm font-semibold text-fail">
                      {lineErrors.quantity.message}
                    </p>
                  )}
                </div>
                <div className="flex flex-col gap-1">
                  <label htmlFor={`${id}-price`} className="text-sm font-semibold @2xl:sr-only">
                    Line {number}: unit price in dollars
                  </label>
                  <div
                    className={cn(
                      'flex min-h-11 items-center rounded-lg border bg-white focus-within:border-slate-600',
                      lineErrors?.unitPrice ? 'border-fail' : 'border-slate-300',
                    )}
                  >
                    <span aria-hidden className="pl-3 text-ink-soft">
                      $
                    </span>
                    <input
                      id={`${id}-price`}
                      type="text"
                      inputMode="decimal"
                      autoComplete="off"
                      aria-invalid={lineErrors?.unitPrice ? true : undefined}
                      aria-describedby={describedBy(lineErrors?.unitPrice && `${id}-price-error`)}
                      className="w-full min-w-0 rounded-lg bg-transparent py-2 pl-1 pr-3 text-right text-base tabular-nums text-ink"
                      {...form.register(`lineItems.${index}.unitPrice`, { onBlur: (event) => tidyDollars(event, (text) => form.setValue(`lineItems.${index}.unitPrice`, text)) })}
                    />
                  </div>
                  {lineErrors?.unitPrice && (
                    <p id={`${id}-price-error`} className="text-sm font-semibold text-fail">
                      {lineErrors.unitPrice.message}
                    </p>
                  )}
                </div>
                <p className="flex min-h-11 items-center justify-end gap-2 text-base @2xl:justify-end">
                  <span className="text-sm text-ink-soft @2xl:sr-only">Amount</span>
                  <LineAmount control={form.control} index={index} />
                </p>
                <div className="flex min-h-11 items-center justify-end">
                  <button
                    type="button"
                    onClick={() => lines.remove(index)}
                    disabled={lines.fields.length === 1}
                    aria-label={`Remove line ${number}${field.description ? ` (${field.description})` : ''}`}
                    className="min-h-11 rounded-lg px-3 text-sm font-semibold text-fail hover:bg-fail-soft disabled:cursor-not-allowed disabled:text-ink-faint disabled:hover:bg-transparent"
                  >
                    Remove
                  </button>
                </div>
              </li>
            );
          })}
        </ol>
        <div>
          <Button variant="secondary" onClick={() => lines.append({ description: '', quantity: 1, unitPrice: '' })} disabled={lines.fields.length >= 40}>
            Add a line
          </Button>
        </div>
        <RunningTotal control={form.control} />
      </fieldset>

      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Turnaround (working days)"
          type="number"
          inputMode="numeric"
          min={1}
          max={365}
          step={1}
          hint="From the day the part arrives to the day it is ready."
          error={errors.turnaroundDays?.message}
          {...form.register('turnaroundDays', { valueAsNumber: true })}
        />
        <TextField
          label="Price valid until"
          type="date"
          min={localDate()}
          hint="After this date the builder cannot accept the bid until you revise it."
          error={errors.validUntil?.message}
          {...form.register('validUntil')}
        />
      </div>
      <TextAreaField
        label="Note to the builder (optional)"
        rows={3}
        hint="What the price assumes, what you need to see first, when you could start."
        error={errors.note?.message}
        className="[&_textarea]:font-sans [&_textarea]:text-base"
        {...form.register('note')}
      />
      <div className="flex flex-wrap gap-3">
        <Button type="submit" busy={isSubmitting}>
          {submitLabel}
        </Button>
        {onCancel && (
          <Button variant="secondary" onClick={onCancel} disabled={isSubmitting}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
