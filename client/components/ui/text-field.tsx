import { forwardRef, type InputHTMLAttributes, type ReactNode } from 'react';
import { cn } from '@client/lib/cn';
import { FieldFrame, inputBorder, useFieldIds } from './field-frame';

export interface TextFieldProps extends InputHTMLAttributes<HTMLInputElement> {
  label: string;
  error?: string;
  hint?: ReactNode;
}

/** A labelled input with its hint and its error message beside it. */
export const TextField = forwardRef<HTMLInputElement, TextFieldProps>(function TextField({ label, error, hint, className, id, ...rest }, ref) {
  const ids = useFieldIds({ id, hint, error });
  return (
    <FieldFrame label={label} hint={hint} error={error} className={className} {...ids}>
      <input
        ref={ref}
        id={ids.inputId}
        aria-invalid={error ? true : undefined}
        aria-describedby={ids.describedBy}
        className={cn('min-h-11 rounded-lg border bg-white px-3 py-2 text-base text-ink placeholder:text-ink-faint', inputBorder(error))}
        {...rest}
      />
    </FieldFrame>
  );
});
