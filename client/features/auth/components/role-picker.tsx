import { forwardRef, useId, type InputHTMLAttributes } from 'react';
import { FieldError } from '@client/components/ui/field-frame';

const choices = [
  { value: 'builder', title: 'I build engines', text: 'Post machining jobs, compare bids, pay when the measurements check out.' },
  { value: 'shop', title: 'I run a machine shop', text: 'Find jobs near you, bid, log the work and hand over measured results.' },
] as const;

/** Two large radio cards: easy to hit on a tablet, plain radios underneath for keyboards and screen readers. */
export const RolePicker = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement> & { error?: string }>(function RolePicker(
  { error, ...rest },
  ref,
) {
  const id = useId();
  return (
    <fieldset aria-describedby={error ? `${id}-error` : undefined} className="flex flex-col gap-2">
      <legend className="mb-1 text-sm font-semibold text-ink">How will you use Tenthmark?</legend>
      <div className="grid gap-3 sm:grid-cols-2">
        {choices.map((choice) => (
          <label
            key={choice.value}
            className="flex cursor-pointer gap-3 rounded-lg border border-slate-300 bg-white p-4 has-[:checked]:border-slate-700 has-[:checked]:ring-2 has-[:checked]:ring-slate-700"
          >
            <input ref={ref} type="radio" value={choice.value} className="mt-1 size-4 accent-slate-700" {...rest} />
            <span>
              <span className="block font-bold">{choice.title}</span>
              <span className="block text-sm text-ink-soft">{choice.text}</span>
            </span>
          </label>
        ))}
      </div>
      <FieldError id={`${id}-error`} error={error} />
    </fieldset>
  );
});
