import { forwardRef, type ReactNode, type SelectHTMLAttributes } from 'react';
import { cn } from '@client/lib/cn';
import { FieldFrame, inputBorder, useFieldIds } from './field-frame';

export interface SelectOption {
  value: string;
  label: string;
}

export interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  label: string;
  options: readonly SelectOption[];
  error?: string;
  hint?: ReactNode;
}

/** A labelled drop-down list with its hint and its error message beside it, styled like TextField. */
export const SelectField = forwardRef<HTMLSelectElement, SelectFieldProps>(function SelectField(
  { label, options, error, hint, className, id, ...rest },
  ref,
) {
  const ids = useFieldIds({ id, hint, error });
  return (
    <FieldFrame label={label} hint={hint} error={error} className={className} {...ids}>
      <select
        ref={ref}
        id={ids.inputId}
        aria-invalid={error ? true : undefined}
        aria-describedby={ids.describedBy}
        className={cn('min-h-11 rounded-lg border bg-white px-3 py-2 text-base text-ink', inputBorder(error))}
        {...rest}
      >
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
    </FieldFrame>
  );
});
