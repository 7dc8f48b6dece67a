/**
 * Rotating-assembly balance (placeholder until the calculations branch lands).
 * ISO 21940-11: e_per = 9549 · G / n g·mm/kg; U_per = e_per · m; half per plane.
 */
import { requirePositive } from './errors';

export const BALANCE_GRADES = [0.4, 1, 2.5, 6.3, 16, 40] as const;

export function balanceTolerance(input: { rotorMassKg: number; serviceRpm: number; grade: number }) {
  requirePositive(input.rotorMassKg, 'rotorMassKg', 'Rotor mass');
  requirePositive(input.serviceRpm, 'serviceRpm', 'Service speed');
  requirePositive(input.grade, 'grade', 'Grade');
  const specificUnbalanceGmmPerKg = (9549 * input.grade) / input.serviceRpm;
  const permissibleUnbalanceGmm = specificUnbalanceGmmPerKg * input.rotorMassKg;
  return { specificUnbalanceGmmPerKg, permissibleUnbalanceGmm, perPlaneGmm: permissibleUnbalanceGmm / 2 };
}

export function bobWeight(input: { rotatingGrams: number; reciprocatingGrams: number; reciprocatingFactor?: number; oilGrams?: number }) {
  const reciprocatingFactor = input.reciprocatingFactor ?? 0.5;
  return { bobWeightGrams: input.rotatingGrams + reciprocatingFactor * input.reciprocatingGrams + (input.oilGrams ?? 0), reciprocatingFactor };
}
