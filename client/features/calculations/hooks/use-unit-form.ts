import { useCallback, useState } from 'react';
import type { LengthUnit } from '@shared/calc';
import { convertTypedLength, convertTypedLengthList } from '@client/lib/numbers';

/** How a field follows the page's unit switch: a single length, a list of lengths, or not at all. */
export type FieldKind = 'length' | 'length-list' | 'other';

interface FormState {
  unit: LengthUnit;
  values: Record<string, string>;
}

function convertValues(
  values: Record<string, string>,
  from: LengthUnit,
  to: LengthUnit,
  kindOf: (key: string) => FieldKind,
): Record<string, string> {
  const next: Record<string, string> = {};
  for (const [key, text] of Object.entries(values)) {
    const kind = kindOf(key);
    next[key] =
      kind === 'length' ? convertTypedLength(text, from, to) : kind === 'length-list' ? convertTypedLengthList(text, from, to) : text;
  }
  return next;
}

/**
 * The typed text of a calculator's fields, following the page's unit switch:
 * when `unit` changes, every length already typed is converted exactly
 * (1 in = 25.4 mm) in place; other fields keep their text. `initial` is given
 * in inches and converted at once if the page starts in millimetres.
 */
export function useUnitForm<K extends string>(unit: LengthUnit, initial: Record<K, string>, kindOf: (key: string) => FieldKind) {
  const [state, setState] = useState<FormState>({ unit: 'in', values: initial });
  let current = state;
  if (state.unit !== unit) {
    // Adjusting state to a changed prop during render, as React documents it.
    current = { unit, values: convertValues(state.values, state.unit, unit, kindOf) };
    setState(current);
  }

  const setValue = useCallback((key: K | string, text: string) => {
    setState((previous) => ({ ...previous, values: { ...previous.values, [key]: text } }));
  }, []);

  /** Replace several fields at once; lengths given in `given` are converted to the current unit first. */
  const setValues = useCallback(
    (values: Record<string, string>, given: LengthUnit) => {
      setState((previous) => ({
        ...previous,
        values: { ...previous.values, ...convertValues(values, given, previous.unit, kindOf) },
      }));
    },
    [kindOf],
  );

  return { values: current.values as Record<K, string> & Record<string, string>, setValue, setValues };
}
