/**
 * How the calculation library reports input it cannot work with.
 *
 * Every function in shared/calc throws a CalculationError (never returns NaN
 * or Infinity) when its input is physically impossible: a bore of zero, a
 * non-finite number, a profile too short to evaluate, or a set of volumes
 * that leaves no room above the piston. `field` names the input at fault,
 * using the same key as the request schemas in shared/schemas/calculations.ts,
 * so the server can answer 400 with that field's message and a form can show
 * it beside the input. The request schemas run the same checks first, so in
 * normal use the API never reaches a throw; mapping CalculationError to 400 is
 * the safety net that keeps bad input from ever becoming a 500.
 */
export class CalculationError extends Error {
  readonly field: string | undefined;

  constructor(message: string, field?: string) {
    super(message);
    this.name = 'CalculationError';
    this.field = field;
  }
}

/** Throws unless `value` is a finite number. */
export function requireFinite(value: unknown, field: string, label: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new CalculationError(`${label} must be a finite number.`, field);
  }
  return value;
}

/** Throws unless `value` is a finite number greater than zero. */
export function requirePositive(value: unknown, field: string, label: string): number {
  const number = requireFinite(value, field, label);
  if (number <= 0) throw new CalculationError(`${label} must be greater than zero.`, field);
  return number;
}

/** Throws unless `value` is a finite number of zero or more. */
export function requireNonNegative(value: unknown, field: string, label: string): number {
  const number = requireFinite(value, field, label);
  if (number < 0) throw new CalculationError(`${label} cannot be negative.`, field);
  return number;
}
