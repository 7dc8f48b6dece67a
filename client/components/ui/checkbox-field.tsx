import { forwardRef, useId, type InputHTMLAttributes, type ReactNode } from 'react';
import { cn } from '@client/lib/cn';

export interface CheckboxFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'type'> {
  label: ReactNode;
  hint?: ReactNode;
}

/** A checkbox with its label (the whole row is the click target) and an optional hint tied to it. */
export const CheckboxField = forwardRef<HTMLInputElement, CheckboxFieldProps>(function CheckboxField(
  { label, hint, className, id, ...rest },
  ref,
) {
  const autoId = useId();
  const inputId = id ?? autoId;
  const hintId = hint ? `${inputId}-hint` : undefined;
  return (
    <div className={cn('flex gap-3', className)}>
      <input
        ref={ref}
        id={inputId}
        type="checkbox"
        aria-describedby={hintId}
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
      </div>
    </div>
  );
});
