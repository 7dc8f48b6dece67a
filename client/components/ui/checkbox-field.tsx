import { forwardRef, type InputHTMLAttributes, type ReactNode } from 'react';
import { cn } from '@client/lib/cn';
import { FieldError, useFieldIds } from './field-frame';

export interface CheckboxFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'type'> {
  label: ReactNode;
  hint?: ReactNode;
  /** A message saying what is wrong (a box that must be ticked), shown under the label. */
  error?: string;
}

/** A checkbox with its label (the whole row is the click target), an optional hint and an error tied to it. */
export const CheckboxField = forwardRef<HTMLInputElement, CheckboxFieldProps>(function CheckboxField(
  { label, hint, error, className, id, ...rest },
  ref,
) {
  // The hint stays beside an error here: it may hold links the person needs to act on the error.
  const { inputId, errorId } = useFieldIds({ id, error });
  const hintId = hint ? `${inputId}-hint` : undefined;
  return (
    <div className={cn('flex gap-3', className)}>
      <input
        ref={ref}
        id={inputId}
        type="checkbox"
        aria-describedby={[hintId, errorId].filter(Boolean).join(' ') || undefined}
        aria-invalid={error ? true : undefined}
        className="mt-1 size-5 shrink-0 cursor-pointer accent-slate-700"
        {...rest}
      />
      <div className="flex flex-col">
        <label htmlFor={inputId} className="cursor-pointer text-base font-semibold text-ink">
          {label}
        </label>
        {hint && (
          <p id={hintId} className="text-sm text-ink-soft">
            {hint}
          </p>
        )}
        <FieldError id={errorId} error={error} />
      </div>
    </div>
  );
});
