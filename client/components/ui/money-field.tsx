import { forwardRef, useId, type InputHTMLAttributes, type ReactNode } from 'react';
import { cn } from '@client/lib/cn';
import { FieldFrame, useFieldIds } from './field-frame';

export interface MoneyFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'type'> {
  label: string;
  /** Keep the label for screen readers only, where a column heading already says what the input is. */
  hideLabel?: boolean;
  error?: string;
  hint?: ReactNode;
  /** Words after the amount, such as "per cylinder". */
  suffix?: ReactNode;
}

/**
 * A labelled dollars input: a "$" before the amount, the decimal keypad on
 * tablets, and the hint and error message tied to the input. It holds text;
 * client/lib/money.ts reads the text into whole cents.
 */
export const MoneyField = forwardRef<HTMLInputElement, MoneyFieldProps>(function MoneyField(
  { label, hideLabel = false, error, hint, suffix, className, id, ...rest },
  ref,
) {
  const suffixId = `${useId()}-suffix`;
  const ids = useFieldIds({ id, hint, error, extra: suffix ? suffixId : undefined });
  return (
    <FieldFrame label={label} hint={hint} error={error} hideLabel={hideLabel} className={className} {...ids}>
      <div className="flex items-center gap-2">
        <div
          className={cn(
            'flex min-h-11 min-w-0 flex-1 items-center rounded-lg border bg-white focus-within:border-slate-600',
            error ? 'border-fail' : 'border-slate-300',
          )}
        >
          <span aria-hidden className="pl-3 text-base text-ink-soft">
            $
          </span>
          <input
            ref={ref}
            id={ids.inputId}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            aria-invalid={error ? true : undefined}
            aria-describedby={ids.describedBy}
            className="w-full min-w-0 rounded-lg bg-transparent py-2 pl-1 pr-3 text-right text-base tabular-nums text-ink placeholder:text-ink-faint"
            {...rest}
          />
        </div>
        {suffix && (
          <span id={suffixId} className="shrink-0 text-sm text-ink-soft">
            {suffix}
          </span>
        )}
      </div>
    </FieldFrame>
  );
});
