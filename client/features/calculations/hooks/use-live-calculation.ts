import { useMemo } from 'react';
import type { z } from 'zod';
import { CalculationError } from '@shared/calc';

export interface LiveCalculation<R> {
  /** The computed figures; undefined while anything is missing or wrong. */
  result: R | undefined;
  /** The schema's message per field path ("bore", "cylinders.0.top.thrust"), first message only. */
  errors: Record<string, string>;
  /** Field paths with nothing typed yet, in the schema's order. */
  missing: string[];
  /** A message that belongs to no single field. */
  formError?: string;
}

/**
 * Validate `input` with a request schema and, when it passes, compute.
 *
 * Fields left empty (undefined in `input`) are listed in `missing`, not in
 * `errors`: an empty form is not a mistake, it is a form still to fill, and
 * the card says what is left instead of painting every field red. A value the
 * library still rejects (CalculationError) lands on its field like a schema
 * message, so a bad input never throws during render.
 */
export function runLiveCalculation<S extends z.ZodType, R>(
  schema: S,
  input: unknown,
  compute: (data: z.output<S>) => R,
): LiveCalculation<R> {
  const parsed = schema.safeParse(input, { reportInput: true });
  if (!parsed.success) {
    const errors: Record<string, string> = {};
    const missing: string[] = [];
    let formError: string | undefined;
    for (const issue of parsed.error.issues) {
      const key = issue.path.map(String).join('.');
      if (issue.code === 'invalid_type' && issue.input === undefined) {
        if (!missing.includes(key)) missing.push(key);
      } else if (key === '') {
        formError ??= issue.message;
      } else {
        errors[key] ??= issue.message;
      }
    }
    return { result: undefined, errors, missing, formError };
  }
  try {
    return { result: compute(parsed.data), errors: {}, missing: [] };
  } catch (error) {
    if (!(error instanceof CalculationError)) throw error;
    return error.field
      ? { result: undefined, errors: { [error.field]: error.message }, missing: [] }
      : { result: undefined, errors: {}, missing: [], formError: error.message };
  }
}

/**
 * Live results for a form: re-validates and recomputes whenever `input`
 * changes. Pass a memoised `input` and a stable `compute` (module level or
 * useCallback) so heavy work runs only when the values do.
 */
export function useLiveCalculation<S extends z.ZodType, R>(
  schema: S,
  input: unknown,
  compute: (data: z.output<S>) => R,
): LiveCalculation<R> {
  return useMemo(() => runLiveCalculation(schema, input, compute), [schema, input, compute]);
}
