import { forwardRef, type ReactNode, type TextareaHTMLAttributes } from 'react';
import { cn } from '@client/lib/cn';
import { FieldFrame, inputBorder, useFieldIds } from './field-frame';

export interface TextAreaFieldProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  label: string;
  error?: string;
  hint?: ReactNode;
}

/** A labelled multi-line input with its hint and its error message beside it, styled like TextField. */
export const TextAreaField = forwardRef<HTMLTextAreaElement, TextAreaFieldProps>(function TextAreaField(
  { label, error, hint, className, id, rows = 4, ...rest },
  ref,
) {
  const ids = useFieldIds({ id, hint, error });
  return (
    <FieldFrame label={label} hint={hint} error={error} className={className} {...ids}>
      <textarea
        ref={ref}
        id={ids.inputId}
        rows={rows}
        aria-invalid={error ? true : undefined}
        aria-describedby={ids.describedBy}
        className={cn('rounded-lg border bg-white px-3 py-2 font-mono text-sm text-ink placeholder:text-ink-faint', inputBorder(error))}
        {...rest}
      />
    </FieldFrame>
  );
});
