/**
 * Bore sizing: the finished size, the size to bore to before honing, and the
 * oversize step to choose from the worst cylinder.
 *
 * - finished bore = measured piston diameter + mean of the clearance range;
 * - bore to = finished bore − honing allowance (the hone removes the rest);
 * - oversize: the smallest standard step whose bore (standard bore + step)
 *   reaches the largest reading of the worst cylinder plus a minimum clean-up
 *   stock (on the diameter); every cylinder is then finished to that size.
 * These are common practice (no published source); the piston maker's
 * clearance governs. All lengths are in the caller's unit.
 */
import { type CylinderReadings, DEPTHS } from './bore';
import { CalculationError, requireNonNegative, requirePositive } from './errors';
import type { LengthUnit } from './units';

export interface BoreSizeInput {
  pistonDiameter: number;
  clearanceMin: number;
  clearanceMax: number;
  /** Diameter left for the hone after boring. */
  honeAllowance: number;
}

export interface BoreSize {
  finishedBore: number;
  boreTo: number;
  /** The clearance the finished bore aims at: mean of the range. */
  targetClearance: number;
}

export function boreSize(input: BoreSizeInput): BoreSize {
  requirePositive(input.pistonDiameter, 'pistonDiameter', 'Piston diameter');
  requireNonNegative(input.clearanceMin, 'clearanceMin', 'Minimum clearance');
  requireNonNegative(input.clearanceMax, 'clearanceMax', 'Maximum clearance');
  requireNonNegative(input.honeAllowance, 'honeAllowance', 'Hone allowance');
  if (input.clearanceMin > input.clearanceMax) {
    throw new CalculationError('Minimum clearance cannot be larger than maximum clearance.', 'clearanceMax');
  }
  const targetClearance = (input.clearanceMin + input.clearanceMax) / 2;
  const finishedBore = input.pistonDiameter + targetClearance;
  if (input.honeAllowance >= finishedBore) {
    throw new CalculationError('Hone allowance must be smaller than the finished bore.', 'honeAllowance');
  }
  return { finishedBore, boreTo: finishedBore - input.honeAllowance, targetClearance };
}

/**
 * Oversize steps offered by default, on the diameter: common practice (no
 * published source). Note +0.010 in is 0.254 mm, not 0.25 mm: the two lists
 * are separate series, not conversions of each other.
 */
export const OVERSIZE_STEPS: Readonly<Record<LengthUnit, readonly number[]>> = {
  in: [0.01, 0.02, 0.03, 0.04, 0.06],
  mm: [0.25, 0.5, 0.75, 1.0],
};

export interface OversizeInput {
  unit: LengthUnit;
  /** The engine's standard (original) bore. */
  standardBore: number;
  /** Rough readings of every cylinder, before machining. */
  cylinders: CylinderReadings[];
  /** Least diameter to remove beyond the largest reading so the bore cleans up. */
  minCleanup: number;
  /** Override the default steps for the unit. */
  steps?: readonly number[];
}

export interface CylinderStock {
  /** finished − largest reading: the least the cylinder will lose, on the diameter. */
  least: number;
  /** finished − smallest reading: the most it will lose, on the diameter. */
  most: number;
}

export interface OversizeChoice {
  /** The step chosen; 0 when the standard bore still cleans up; null when no step is large enough. */
  step: number | null;
  /** standardBore + step, or null when no step is large enough. */
  finishedBore: number | null;
  /** Largest reading found, and the zero-based cylinder it came from. */
  largestReading: number;
  worstCylinder: number;
  /** largestReading + minCleanup: the least finished bore that cleans up. */
  required: number;
  /** Stock to remove per cylinder at the chosen size, or null when none was chosen. */
  stock: CylinderStock[] | null;
}

const SIZE_SLACK = 1e-9;

export function chooseOversize(input: OversizeInput): OversizeChoice {
  requirePositive(input.standardBore, 'standardBore', 'Standard bore');
  requireNonNegative(input.minCleanup, 'minCleanup', 'Minimum clean-up');
  if (!Array.isArray(input.cylinders) || input.cylinders.length === 0) {
    throw new CalculationError('Enter the readings for at least one cylinder.', 'cylinders');
  }
  const readingsOf = (cylinder: CylinderReadings, index: number): number[] =>
    DEPTHS.flatMap((depth) => {
      const pair = cylinder[depth];
      const label = `Cylinder ${index + 1} ${depth}`;
      requirePositive(pair?.thrust, `cylinders.${index}.${depth}.thrust`, `${label} thrust reading`);
      requirePositive(pair?.axial, `cylinders.${index}.${depth}.axial`, `${label} axial reading`);
      return [pair.thrust, pair.axial];
    });
  const perCylinder = input.cylinders.map(readingsOf);

  let worstCylinder = 0;
  let largestReading = -Infinity;
  perCylinder.forEach((values, index) => {
    const largest = Math.max(...values);
    if (largest > largestReading) {
      largestReading = largest;
      worstCylinder = index;
    }
  });
  const required = largestReading + input.minCleanup;

  const steps = [...(input.steps ?? OVERSIZE_STEPS[input.unit])];
  steps.forEach((step, index) => requireNonNegative(step, `steps.${index}`, 'Oversize step'));
  const candidates = [0, ...steps].sort((a, b) => a - b);
  const step = candidates.find((candidate) => input.standardBore + candidate >= required - SIZE_SLACK) ?? null;
  if (step === null) {
    return { step: null, finishedBore: null, largestReading, worstCylinder, required, stock: null };
  }
  const finishedBore = input.standardBore + step;
  const stock = perCylinder.map((values) => ({
    least: finishedBore - Math.max(...values),
    most: finishedBore - Math.min(...values),
  }));
  return { step, finishedBore, largestReading, worstCylinder, required, stock };
}
