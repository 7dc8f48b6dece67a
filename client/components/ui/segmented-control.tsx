import { useRef, type KeyboardEvent } from 'react';
import { cn } from '@client/lib/cn';

export interface SegmentedOption<T extends string> {
  value: T;
  label: string;
}

export interface SegmentedControlProps<T extends string> {
  /** The accessible name of the group, e.g. "Length unit". */
  label: string;
  options: readonly SegmentedOption<T>[];
  value: T;
  onChange: (value: T) => void;
  className?: string;
}

/**
 * A row of mutually exclusive buttons that behaves as a radio group: one tab
 * stop, arrow keys (and Home/End) move the choice, as WAI-ARIA describes for
 * radio groups.
 */
export function SegmentedControl<T extends string>({ label, options, value, onChange, className }: SegmentedControlProps<T>) {
  const buttons = useRef<Array<HTMLButtonElement | null>>([]);

  const choose = (index: number) => {
    const option = options[(index + options.length) % options.length];
    onChange(option.value);
    buttons.current[(index + options.length) % options.length]?.focus();
  };

  const onKeyDown = (event: KeyboardEvent<HTMLButtonElement>, index: number) => {
    const moves: Record<string, number> = {
      ArrowRight: index + 1,
      ArrowDown: index + 1,
      ArrowLeft: index - 1,
      ArrowUp: index - 1,
      Home: 0,
      End: options.length - 1,
    };
    if (event.key in moves) {
      event.preventDefault();
      choose(moves[event.key]);
    }
  };

  return (
    <div role="radiogroup" aria-label={label} className={cn('inline-flex rounded-lg bg-white p-1 ring-1 ring-slate-300', className)}>
      {options.map((option, index) => {
        const checked = option.value === value;
        return (
          <button
            key={option.value}
            ref={(element) => {
              buttons.current[index] = element;
            }}
            type="button"
            role="radio"
            aria-checked={checked}
            tabIndex={checked ? 0 : -1}
            onClick={() => onChange(option.value)}
            onKeyDown={(event) => onKeyDown(event, index)}
            className={cn(
              'min-h-9 rounded-md px-3 text-sm font-semibold transition-colors',
              checked ? 'bg-slate-700 text-white' : 'text-slate-800 hover:bg-slate-50',
            )}
          >
            {option.label}
          </button>
        );
      })}
    </div>
  );
}
