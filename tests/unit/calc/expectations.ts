import { expect } from 'vitest';
import type { CompressionInput } from '../../../shared/calc/engine';
import { CalculationError } from '../../../shared/calc/errors';

/**
 * The expectations the calculation tests share. Each checks that the value is a number
 * first, so a missing answer (null, undefined) fails by name instead of as NaN.
 */

/** |actual − expected| within `abs`. */
export function expectWithin(actual: number | null | undefined, expected: number, abs: number) {
  expect(actual).toBeTypeOf('number');
  expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(abs);
}

/** |actual − expected| within `rel` of expected (or of 1 for values below 1). */
export function expectRelativelyNear(actual: number | null | undefined, expected: number, rel = 1e-12) {
  expect(actual).toBeTypeOf('number');
  expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(rel * Math.max(1, Math.abs(expected)));
}

/** Runs `run` and checks it throws a CalculationError naming `field`. */
export function expectCalculationError(run: () => unknown, field: string) {
  let caught: unknown;
  try {
    run();
  } catch (error) {
    caught = error;
  }
  expect(caught).toBeInstanceOf(CalculationError);
  expect((caught as CalculationError).field).toBe(field);
}

/** The Circle Track worked example: 4.000 in bore, 3.48 in stroke, 70 cc chamber, 5 cc dish, 0.050 in deck, 0.020 in gasket at 4.000 in. */
export const circleTrack: CompressionInput = {
  unit: 'in',
  bore: 4,
  stroke: 3.48,
  chamberCc: 70,
  pistonCc: 5,
  deckClearance: 0.05,
  gasketBore: 4,
  gasketThickness: 0.02,
};
