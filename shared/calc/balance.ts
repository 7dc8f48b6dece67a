/**
 * Rotating-assembly balance: the residual unbalance a balance quality grade
 * permits, and the bob weight a crank is spun with on the balancing machine.
 *
 * - Permissible residual unbalance, ISO 21940-11 (formerly ISO 1940-1):
 *   e_per [g·mm/kg] = 9549 · G / n, with G the grade in mm/s and n the service
 *   speed in rev/min (9549 ≈ 1000 · 60 / 2π); U_per [g·mm] = e_per · rotor
 *   mass [kg]; a rotor symmetric between two correction planes takes half in
 *   each plane.
 * - Bob weight, per crank throw: 100 % of the rotating mass plus a share of
 *   the reciprocating mass plus any oil allowance. 50 % is the common-practice
 *   share for a 90° V8; other layouts use other shares.
 *
 * Impossible input throws CalculationError (see ./errors).
 */
import { CalculationError, requireNonNegative, requirePositive } from './errors';

/** ISO 21940-11 balance quality grades, G in mm/s. */
export const BALANCE_GRADES = [0.4, 1, 2.5, 6.3, 16, 40, 100, 250, 630, 1600, 4000] as const;
export type BalanceGrade = (typeof BALANCE_GRADES)[number];

/** The constant in e_per = 9549 · G / n (1000 · 60 / 2π, rounded as the standard quotes it). */
export const ISO_21940_CONSTANT = 9549;

/** The share of the reciprocating mass in a bob weight when none is given: 50 %, common practice for a 90° V8. */
export const DEFAULT_RECIPROCATING_FACTOR = 0.5;

export interface BalanceToleranceInput {
  rotorMassKg: number;
  serviceRpm: number;
  grade: number;
}

export interface BalanceToleranceResult {
  /** e_per, g·mm per kg of rotor. */
  specificUnbalanceGmmPerKg: number;
  /** U_per for the whole rotor, g·mm. */
  permissibleUnbalanceGmm: number;
  /** Half of U_per, for each of two correction planes of a symmetric rotor, g·mm. */
  perPlaneGmm: number;
}

export function isBalanceGrade(value: unknown): value is BalanceGrade {
  return (BALANCE_GRADES as readonly unknown[]).includes(value);
}

/** Permissible residual unbalance by ISO 21940-11 for a grade, a rotor mass and a service speed. */
export function balanceTolerance(input: BalanceToleranceInput): BalanceToleranceResult {
  const mass = requirePositive(input.rotorMassKg, 'rotorMassKg', 'Rotor mass');
  const rpm = requirePositive(input.serviceRpm, 'serviceRpm', 'Service speed');
  if (!isBalanceGrade(input.grade)) {
    throw new CalculationError(`Balance grade must be one of the ISO 21940-11 grades: G ${BALANCE_GRADES.join(', G ')}.`, 'grade');
  }
  const specificUnbalanceGmmPerKg = (ISO_21940_CONSTANT * input.grade) / rpm;
  // A speed so small that the figure overflows is no speed a rotor runs at.
  if (!Number.isFinite(specificUnbalanceGmmPerKg)) throw new CalculationError('The service speed is too small to work out a tolerance.', 'serviceRpm');
  const permissibleUnbalanceGmm = specificUnbalanceGmmPerKg * mass;
  if (!Number.isFinite(permissibleUnbalanceGmm)) throw new CalculationError('The rotor mass is too large for that speed and grade.', 'rotorMassKg');
  return { specificUnbalanceGmmPerKg, permissibleUnbalanceGmm, perPlaneGmm: permissibleUnbalanceGmm / 2 };
}

export interface BobWeightInput {
  /** Rotating mass on one crank throw (big ends, bearings), grams. */
  rotatingGrams: number;
  /** Reciprocating mass on one crank throw (pistons, pins, locks, rings, small ends), grams. */
  reciprocatingGrams: number;
  /** Share of the reciprocating mass, 0 to 1; 0.5 when left out. */
  reciprocatingFactor?: number;
  /** Oil allowance, grams; 0 when left out. */
  oilGrams?: number;
}

export interface BobWeightResult {
  bobWeightGrams: number;
  /** The share used (the default when none was given). */
  reciprocatingFactor: number;
}

/** Bob weight for one crank throw: rotating + factor · reciprocating + oil. */
export function bobWeight(input: BobWeightInput): BobWeightResult {
  const rotating = requireNonNegative(input.rotatingGrams, 'rotatingGrams', 'Rotating mass');
  const reciprocating = requireNonNegative(input.reciprocatingGrams, 'reciprocatingGrams', 'Reciprocating mass');
  const factor = requireNonNegative(input.reciprocatingFactor ?? DEFAULT_RECIPROCATING_FACTOR, 'reciprocatingFactor', 'Reciprocating factor');
  if (factor > 1) throw new CalculationError('Reciprocating factor must be between 0 and 1.', 'reciprocatingFactor');
  const oil = requireNonNegative(input.oilGrams ?? 0, 'oilGrams', 'Oil allowance');
  return { bobWeightGrams: rotating + factor * reciprocating + oil, reciprocatingFactor: factor };
}
