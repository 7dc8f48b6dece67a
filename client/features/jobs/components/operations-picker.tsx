import { useEffect, useId, useRef, useState } from 'react';
import { defaultQuantity, operations, partsAllow, partsNeededWords, type Operation, type PartKind, type PartSent } from '@shared/catalogue';
import type { JobFormValues } from '@shared/schemas/jobs';
import { cn } from '@client/lib/cn';

type Picked = JobFormValues['operations'];

const groups: Array<{ part: PartKind; title: string }> = [
  { part: 'block', title: 'Block' },
  { part: 'head', title: 'Cylinder heads' },
  { part: 'crank', title: 'Crankshaft' },
  { part: 'rotating', title: 'Rotating assembly' },
];

const countWord: Record<PartKind, string> = { block: 'Blocks', head: 'Heads', crank: 'Cranks', rotating: 'Assemblies' };

/** What the quantity counts, as its visible label. */
function quantityWord(op: Operation): string {
  if (op.pricedPer === 'cylinder') return 'Cylinders';
  if (op.pricedPer === 'job') return 'Times';
  return countWord[op.part];
}

const catalogueOrder = new Map(operations.map((op, index) => [op.code, index]));

export interface OperationsPickerProps {
  value: Picked;
  onChange: (next: Picked) => void;
  /** The job's cylinder count, for quantities of per-cylinder work. */
  cylinders: number | undefined;
  /** What the builder sends: work on a part not sent cannot be ticked, and says which part to add. */
  parts: readonly PartSent[];
  /** A message for the whole list ("choose at least one"). */
  error?: string;
  /** Messages for a quantity, by operation code. */
  quantityErrors: Record<string, string | undefined>;
  /** Lets the form move focus here when the list has an error. */
  focusRef: (element: HTMLInputElement | null) => void;
}

/**
 * The work wanted, from the shared catalogue, as checkboxes grouped by part.
 * Ticking one adds it with a quantity prefilled from the catalogue (the
 * cylinder count for per-cylinder work); the quantity stays editable, and
 * follows the cylinder count until the builder changes it by hand.
 */
export function OperationsPicker({ value, onChange, cylinders, parts, error, quantityErrors, focusRef }: OperationsPickerProps) {
  const baseId = useId();
  const errorId = `${baseId}-error`;
  const edited = useRef(new Set<string>());
  const [texts, setTexts] = useState<Record<string, string>>(() =>
    Object.fromEntries(value.map((op) => [op.code, Number.isFinite(op.quantity) ? String(op.quantity) : ''])),
  );
  const cylinderCount = typeof cylinders === 'number' && Number.isInteger(cylinders) && cylinders >= 1 && cylinders <= 16 ? cylinders : undefined;
  const picked = new Map(value.map((op) => [op.code as string, op]));

  // Per-cylinder quantities follow the cylinder count until edited by hand.
  useEffect(() => {
    if (!cylinderCount) return;
    let changed = false;
    const next = value.map((op) => {
      const known = operations.find((o) => o.code === op.code);
      if (!known || known.pricedPer !== 'cylinder' || edited.current.has(op.code) || op.quantity === cylinderCount) return op;
      changed = true;
      return { ...op, quantity: cylinderCount };
    });
    if (changed) {
      onChange(next);
      setTexts((t) => ({ ...t, ...Object.fromEntries(next.map((op) => [op.code, String(op.quantity)])) }));
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps -- only a change of cylinder count should move the quantities.
  }, [cylinderCount]);

  const toggle = (op: Operation, checked: boolean) => {
    if (checked) {
      const quantity = defaultQuantity(op.code, { cylinders: cylinderCount ?? 1 });
      edited.current.delete(op.code);
      setTexts((t) => ({ ...t, [op.code]: String(quantity) }));
      const next = [...value, { code: op.code, quantity }] as Picked;
      next.sort((a, b) => (catalogueOrder.get(a.code) ?? 0) - (catalogueOrder.get(b.code) ?? 0));
      onChange(next);
    } else {
      onChange(value.filter((o) => o.code !== op.code));
    }
  };

  const setQuantity = (code: string, text: string) => {
    edited.current.add(code);
    setTexts((t) => ({ ...t, [code]: text }));
    const trimmed = text.trim();
    const quantity = trimmed === '' ? undefined : /^\d+$/.test(trimmed) ? Number(trimmed) : Number.NaN;
    onChange(value.map((op) => (op.code === code ? { ...op, quantity: quantity as number } : op)));
  };

  let first = true;
  return (
    <fieldset aria-describedby={error ? errorId : undefined} className="flex flex-col gap-5">
      <legend className="sr-only">Work wanted</legend>
      {error && (
        <p id={errorId} className="text-sm font-semibold text-fail">
          {error}
        </p>
      )}
      {groups.map((group) => (
        <div key={group.part}>
          <h3 className="mb-2 text-base font-bold text-ink">{group.title}</h3>
          <ul className="grid gap-3 sm:grid-cols-2">
            {operations
              .filter((op) => op.part === group.part)
              .map((op) => {
                const id = `${baseId}-${op.code}`;
                const chosen = picked.get(op.code);
                const quantityError = quantityErrors[op.code];
                // Work already ticked stays tickable, so it can be taken off after a part is; the schema says why it cannot stay.
                const unavailable = !chosen && !partsAllow(op.code, parts);
                const isFirst = first;
                first = false;
                return (
                  <li
                    key={op.code}
                    className={cn(
                      'flex items-start gap-3 rounded-lg p-3 ring-1',
                      chosen ? 'bg-white ring-slate-500' : 'bg-paper-raised ring-slate-200',
                      // Unavailable work keeps its text at full contrast; the dashed edge and the note say it cannot be ticked.
                      unavailable && 'ring-0 outline-1 outline-dashed outline-slate-400',
                    )}
                  >
                    <input
                      ref={isFirst ? focusRef : undefined}
                      id={id}
                      type="checkbox"
                      checked={Boolean(chosen)}
                      disabled={unavailable}
                      onChange={(event) => toggle(op, event.target.checked)}
                      aria-describedby={[`${id}-about`, unavailable ? `${id}-needs` : '', error ? errorId : ''].filter(Boolean).join(' ')}
                      aria-invalid={error ? true : undefined}
                      className="mt-1 size-5 shrink-0 accent-slate-700"
                    />
                    <div className="min-w-0 flex-1">
                      <label htmlFor={id} className="font-semibold text-ink">
                        {op.name}
                      </label>
                      <p id={`${id}-about`} className="text-sm text-ink-soft">
                        {op.description}
                      </p>
                      {unavailable && (
                        <p id={`${id}-needs`} className="text-sm font-semibold text-ink">
                          Add {partsNeededWords(op.code)} to what you send to choose this.
                        </p>
                      )}
                      {chosen && (
                        <div className="mt-2 flex flex-col gap-1">
                          <div className="flex items-center gap-2">
                            <label htmlFor={`${id}-qty`} className="text-sm font-semibold text-ink">
                              {quantityWord(op)}
                              <span className="sr-only"> for {op.name}</span>
                            </label>
                            <input
                              id={`${id}-qty`}
                              type="text"
                              inputMode="numeric"
                              autoComplete="off"
                              value={texts[op.code] ?? ''}
                              onChange={(event) => setQuantity(op.code, event.target.value)}
                              aria-invalid={quantityError ? true : undefined}
                              aria-describedby={quantityError ? `${id}-qty-error` : undefined}
                              className={cn(
                                'min-h-10 w-20 rounded-lg border bg-white px-3 py-1.5 text-base text-ink',
                                quantityError ? 'border-fail' : 'border-slate-300 focus:border-slate-600',
                              )}
                            />
                          </div>
                          {quantityError && (
                            <p id={`${id}-qty-error`} className="text-sm font-semibold text-fail">
                              {quantityError}
                            </p>
                          )}
                        </div>
                      )}
                    </div>
                  </li>
                );
              })}
          </ul>
        </div>
      ))}
    </fieldset>
  );
}
