import { useId, type ReactNode } from 'react';
import { cn } from '@client/lib/cn';

/** Ids that tie an input to its hint and its error message, for aria-describedby. */
export function useFieldIds(options: { id?: string; hint?: ReactNode; error?: string; extra?: string }) {
  const autoId = useId();
  const inputId = options.id ?? autoId;
  const hintId = options.hint && !options.error ? `${inputId}-hint` : undefined;
  const errorId = options.error ? `${inputId}-error` : undefined;
  const describedBy = [options.extra, hintId, errorId].filter(Boolean).join(' ') || undefined;
  return { inputId, hintId, errorId, describedBy };
}

/** The border of an input: red while it has an error. */
export const inputBorder = (error?: string) => (error ? 'border-fail' : 'border-slate-300 focus:border-slate-600');

/**
 * What every form field shares: the label above, then the control, then its
 * hint or (instead) its error message, each with the id the control points at.
 */
export function FieldFrame(props: {
  label: string;
  inputId: string;
  hintId?: string;
  errorId?: string;
  hint?: ReactNode;
  error?: string;
  hideLabel?: boolean;
  className?: string;
  children: ReactNode;
}) {
  return (
    <div className={cn('flex flex-col gap-1', props.className)}>
      <label htmlFor={props.inputId} className={cn('text-sm font-semibold text-ink', props.hideLabel && 'sr-only')}>
        {props.label}
      </label>
      {props.children}
      {props.hintId && (
        <p id={props.hintId} className="text-sm text-ink-faint">
          {props.hint}
        </p>
      )}
      <FieldError id={props.errorId} error={props.error} />
    </div>
  );
}

/** A field's error message, with the id its control's aria-describedby points at; nothing without an error. */
export function FieldError({ id, error }: { id?: string; error?: string }) {
  if (!id || !error) return null;
  return (
    <p id={id} className="text-sm font-semibold text-fail">
      {error}
    </p>
  );
}
