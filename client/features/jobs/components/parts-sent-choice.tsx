import { useId } from 'react';
import { PART_SENT_WORDS, partsSent, type PartSent } from '@shared/catalogue';
import { FieldError } from '@client/components/ui/field-frame';
import { cn } from '@client/lib/cn';

export interface PartsSentChoiceProps {
  value: readonly (PartSent | undefined)[];
  onChange: (next: PartSent[]) => void;
  error?: string;
  /** Lets the form move focus here when the choice has an error. */
  focusRef: (element: HTMLInputElement | null) => void;
}

/** "What you send": a checkbox per kind of part, in the catalogue's order; the work and the specification asked for follow from it. */
export function PartsSentChoice({ value, onChange, error, focusRef }: PartsSentChoiceProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const chosen = new Set(value);
  const describedBy = [hintId, error ? errorId : ''].filter(Boolean).join(' ');
  const toggle = (part: PartSent, checked: boolean) => {
    const next = new Set(chosen);
    if (checked) next.add(part);
    else next.delete(part);
    onChange(partsSent.filter((p) => next.has(p)));
  };
  return (
    <fieldset className="flex flex-col gap-2" aria-describedby={describedBy}>
      <legend className="mb-1 text-sm font-semibold text-ink">What you send</legend>
      <p id={hintId} className="text-sm text-ink-faint">
        Tick every part you send the shop; the work you can choose and the sizes asked for follow from it.
      </p>
      <div className="flex flex-wrap gap-3">
        {partsSent.map((part, index) => (
          <label
            key={part}
            className={cn(
              'flex min-h-11 cursor-pointer items-center gap-2 rounded-lg bg-white px-3 py-2 ring-1 has-[:checked]:ring-2 has-[:checked]:ring-slate-700',
              error ? 'ring-fail' : 'ring-slate-300',
            )}
          >
            <input
              ref={index === 0 ? focusRef : undefined}
              type="checkbox"
              checked={chosen.has(part)}
              onChange={(event) => toggle(part, event.target.checked)}
              aria-invalid={error ? true : undefined}
              aria-describedby={error ? errorId : undefined}
              className="size-4 accent-slate-700"
            />
            <span className="text-base text-ink">{PART_SENT_WORDS[part]}</span>
          </label>
        ))}
      </div>
      <FieldError id={errorId} error={error} />
    </fieldset>
  );
}
