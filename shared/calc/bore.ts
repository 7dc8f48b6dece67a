/**
 * Bore inspection: size, taper, out-of-round and piston-to-wall clearance per
 * cylinder, judged against an optional spec.
 *
 * Readings are bore diameters at three depths (top, middle and bottom of ring
 * travel) in two directions 90° apart: thrust, and axial (along the crank).
 * All lengths are in one unit, whichever the caller uses; nothing here
 * converts, so the results come back in that unit.
 *
 * Definitions used (and what a screen should say):
 * - mean: the average of the six readings;
 * - taper per direction: largest − smallest reading over the three depths;
 *   taper: the larger of the two directions;
 * - out-of-round per depth: |thrust − axial|, a two-point figure (a pure oval
 *   has an ISO 1101 roundness zone of half this); outOfRound: the largest;
 * - clearance: mean bore − measured piston diameter (the piston measured at
 *   its gauge point, 90° to the pin), shown as the typical figure.
 *   tightestClearance uses the smallest of the six readings instead, for a
 *   screen that wants the worst spot. The clearance limits are judged on the
 *   thrust axis, where the skirt bears (common practice): the smallest thrust
 *   reading minus the piston against the minimum, the largest against the
 *   maximum (thrustClearance), never on the mean, which axial readings move;
 * - deviation: mean − target bore (positive when the bore is over size).
 *
 * Limits are compared with a slack of 1e-9 in the caller's unit so that
 * floating-point noise (about 1e-15) never turns an exact limit into a fail;
 * the slack is far below any bore gauge's resolution.
 */
import { CalculationError, requireNonNegative, requirePositive } from './errors';

export interface DirectionPair {
  thrust: number;
  axial: number;
}

export interface CylinderReadings {
  top: DirectionPair;
  middle: DirectionPair;
  bottom: DirectionPair;
  /** Measured piston diameter, if the piston was measured. */
  piston?: number;
}

export interface BoreSpec {
  targetBore?: number;
  /** ± allowed on the mean diameter; without it the deviation is reported but not judged. */
  targetTolerance?: number;
  clearanceMin?: number;
  clearanceMax?: number;
  maxTaper?: number;
  maxOutOfRound?: number;
}

/** Spec keys that can fail. */
export type BoreLimit = 'targetBore' | 'clearanceMin' | 'clearanceMax' | 'maxTaper' | 'maxOutOfRound';

/**
 * One failed limit. For `targetBore`, value is the signed deviation of the mean
 * from the target and allowed is the ± tolerance; for the others, value is the
 * measured figure and allowed the limit it crossed.
 */
export interface LimitFailure {
  limit: BoreLimit;
  value: number;
  allowed: number;
}

export type Depth = 'top' | 'middle' | 'bottom';
export const DEPTHS: readonly Depth[] = ['top', 'middle', 'bottom'];

export interface CylinderInspection {
  mean: number;
  smallest: number;
  largest: number;
  taper: number;
  taperThrust: number;
  taperAxial: number;
  outOfRound: number;
  outOfRoundByDepth: Record<Depth, number>;
  /** Thrust-axis clearance at its tightest and loosest depth: what the clearance limits are judged on. */
  thrustClearance?: { smallest: number; largest: number };
  clearance?: number;
  tightestClearance?: number;
  deviation?: number;
  pass: boolean;
  failures: LimitFailure[];
  /** Limits in the spec that could not be judged (clearance without a piston reading, size without a tolerance). */
  notChecked: BoreLimit[];
}

export interface BoreInspection {
  cylinders: CylinderInspection[];
  worst: {
    taper: number;
    outOfRound: number;
    /** Zero-based index of the cylinder with the largest taper (first on a tie). */
    taperCylinder: number;
    /** Zero-based index of the cylinder with the largest out-of-round (first on a tie). */
    outOfRoundCylinder: number;
  };
  pass: boolean;
}

const LIMIT_SLACK = 1e-9;

function exceeds(value: number, allowed: number): boolean {
  return value - allowed > LIMIT_SLACK;
}

function checkReadings(readings: CylinderReadings, index: number): void {
  for (const depth of DEPTHS) {
    const pair = readings[depth];
    if (!pair) throw new CalculationError(`Cylinder ${index + 1} is missing its ${depth} readings.`, `cylinders.${index}.${depth}`);
    requirePositive(pair.thrust, `cylinders.${index}.${depth}.thrust`, `Cylinder ${index + 1} ${depth} thrust reading`);
    requirePositive(pair.axial, `cylinders.${index}.${depth}.axial`, `Cylinder ${index + 1} ${depth} axial reading`);
  }
  if (readings.piston !== undefined) {
    requirePositive(readings.piston, `cylinders.${index}.piston`, `Cylinder ${index + 1} piston diameter`);
  }
}

function checkSpec(spec: BoreSpec): void {
  if (spec.targetBore !== undefined) requirePositive(spec.targetBore, 'spec.targetBore', 'Target bore');
  if (spec.targetTolerance !== undefined) requireNonNegative(spec.targetTolerance, 'spec.targetTolerance', 'Target tolerance');
  if (spec.clearanceMin !== undefined) requireNonNegative(spec.clearanceMin, 'spec.clearanceMin', 'Minimum clearance');
  if (spec.clearanceMax !== undefined) requireNonNegative(spec.clearanceMax, 'spec.clearanceMax', 'Maximum clearance');
  if (spec.clearanceMin !== undefined && spec.clearanceMax !== undefined && spec.clearanceMin > spec.clearanceMax) {
    throw new CalculationError('Minimum clearance cannot be larger than maximum clearance.', 'spec.clearanceMax');
  }
  if (spec.maxTaper !== undefined) requireNonNegative(spec.maxTaper, 'spec.maxTaper', 'Maximum taper');
  if (spec.maxOutOfRound !== undefined) requireNonNegative(spec.maxOutOfRound, 'spec.maxOutOfRound', 'Maximum out-of-round');
}

/** Taper of one direction: largest − smallest over the three depths. */
export function directionTaper(readings: CylinderReadings, direction: keyof DirectionPair): number {
  const values = DEPTHS.map((depth) => readings[depth][direction]);
  return Math.max(...values) - Math.min(...values);
}

/** Statistics and pass/fail for one cylinder. `index` only labels error messages. */
export function inspectCylinder(readings: CylinderReadings, spec: BoreSpec = {}, index = 0): CylinderInspection {
  checkReadings(readings, index);
  checkSpec(spec);

  const all = DEPTHS.flatMap((depth) => [readings[depth].thrust, readings[depth].axial]);
  const mean = all.reduce((sum, value) => sum + value, 0) / all.length;
  const smallest = Math.min(...all);
  const largest = Math.max(...all);
  const taperThrust = directionTaper(readings, 'thrust');
  const taperAxial = directionTaper(readings, 'axial');
  const outOfRoundByDepth = {
    top: Math.abs(readings.top.thrust - readings.top.axial),
    middle: Math.abs(readings.middle.thrust - readings.middle.axial),
    bottom: Math.abs(readings.bottom.thrust - readings.bottom.axial),
  };
  const taper = Math.max(taperThrust, taperAxial);
  const outOfRound = Math.max(outOfRoundByDepth.top, outOfRoundByDepth.middle, outOfRoundByDepth.bottom);

  const clearance = readings.piston === undefined ? undefined : mean - readings.piston;
  const tightestClearance = readings.piston === undefined ? undefined : smallest - readings.piston;
  const thrust = [readings.top.thrust, readings.middle.thrust, readings.bottom.thrust];
  const thrustClearance =
    readings.piston === undefined ? undefined : { smallest: Math.min(...thrust) - readings.piston, largest: Math.max(...thrust) - readings.piston };
  const deviation = spec.targetBore === undefined ? undefined : mean - spec.targetBore;

  const failures: LimitFailure[] = [];
  const notChecked: BoreLimit[] = [];

  if (spec.targetBore !== undefined && deviation !== undefined) {
    if (spec.targetTolerance === undefined) notChecked.push('targetBore');
    else if (exceeds(Math.abs(deviation), spec.targetTolerance)) {
      failures.push({ limit: 'targetBore', value: deviation, allowed: spec.targetTolerance });
    }
  }
  for (const limit of ['clearanceMin', 'clearanceMax'] as const) {
    const allowed = spec[limit];
    if (allowed === undefined) continue;
    if (thrustClearance === undefined) {
      notChecked.push(limit);
      continue;
    }
    const value = limit === 'clearanceMin' ? thrustClearance.smallest : thrustClearance.largest;
    const crossed = limit === 'clearanceMin' ? exceeds(allowed, value) : exceeds(value, allowed);
    if (crossed) failures.push({ limit, value, allowed });
  }
  if (spec.maxTaper !== undefined && exceeds(taper, spec.maxTaper)) {
    failures.push({ limit: 'maxTaper', value: taper, allowed: spec.maxTaper });
  }
  if (spec.maxOutOfRound !== undefined && exceeds(outOfRound, spec.maxOutOfRound)) {
    failures.push({ limit: 'maxOutOfRound', value: outOfRound, allowed: spec.maxOutOfRound });
  }

  return {
    mean,
    smallest,
    largest,
    taper,
    taperThrust,
    taperAxial,
    outOfRound,
    outOfRoundByDepth,
    ...(clearance === undefined ? {} : { clearance, tightestClearance, thrustClearance }),
    ...(deviation === undefined ? {} : { deviation }),
    pass: failures.length === 0,
    failures,
    notChecked,
  };
}

/**
 * Inspect every cylinder against one spec. `pass` is true when no cylinder
 * crossed a stated limit; limits that could not be judged are listed per
 * cylinder in `notChecked` and do not fail the block.
 */
export function inspectBores(input: { cylinders: CylinderReadings[]; spec?: BoreSpec }): BoreInspection {
  if (!Array.isArray(input.cylinders) || input.cylinders.length === 0) {
    throw new CalculationError('Enter the readings for at least one cylinder.', 'cylinders');
  }
  const cylinders = input.cylinders.map((readings, index) => inspectCylinder(readings, input.spec ?? {}, index));
  let taperCylinder = 0;
  let outOfRoundCylinder = 0;
  cylinders.forEach((cylinder, index) => {
    if (cylinder.taper > cylinders[taperCylinder].taper) taperCylinder = index;
    if (cylinder.outOfRound > cylinders[outOfRoundCylinder].outOfRound) outOfRoundCylinder = index;
  });
  return {
    cylinders,
    worst: {
      taper: cylinders[taperCylinder].taper,
      outOfRound: cylinders[outOfRoundCylinder].outOfRound,
      taperCylinder,
      outOfRoundCylinder,
    },
    pass: cylinders.every((cylinder) => cylinder.pass),
  };
}
