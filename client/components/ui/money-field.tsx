import { forwardRef, useId, type InputHTMLAttributes, type ReactNode } from 'react';
import { cn } from '@client/lib/cn';

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
  const autoId = useId();
  const inputId = id ?? autoId;
  const hintId = hint ? `${inputId}-hint` : undefined;
  const suffixId = suffix ? `${inputId}-suffix` : undefined;
  const errorId = error ? `${inputId}-error` : undefined;
  return (
    <div className={cn('flex flex-col gap-1', className)}>
      <label htmlFor={inputId} className={cn('text-sm font-semibold text-ink', hideLabel && 'sr-only')}>
        {label}
      </label>
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
            id={inputId}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            aria-invalid={error ? true : undefined}
            aria-describedby={[suffixId, hintId, errorId].filter(Boolean).join(' ') || undefined}
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
      {hint && !error && (
        <p id={hintId} className="text-sm text-ink-faint">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} className="text-sm font-semibold text-fail">
          {error}
        </p>
      )}
    </div>
  );
});
