/**
 * The job's bore limits in the record's unit, on their own (without the rest of the inspection record's
 * working, shared/calc/inspection-record.ts, which re-exports them) so that a page showing a record's
 * words does not load the whole calculation.
 */
import type { JobInput } from '../schemas/jobs';
import type { BoreSpec } from './bore';
import { convertLength, type LengthUnit } from './units';

/** How far apart two lengths may be and still count as equal (floating-point rounding). */
export const SLACK = 1e-9;

type BoreSpecPart = Pick<JobInput, 'unit' | 'targetBore' | 'boreSizeTolerance' | 'pistonDiameter' | 'clearanceMin' | 'clearanceMax' | 'maxTaper' | 'maxOutOfRound'>;

/**
 * Finished-size tolerance when the job gives none: ± 0.0005 in on every
 * reading, common practice (no published source) — the same figure a freshly
 * machined bore holds for taper and out-of-round, and half of a typical
 * 0.001 in clearance band, so a bore at the edge of it still leaves the
 * clearance in range when the target is the band's middle.
 */
export const DEFAULT_SIZE_TOLERANCE_IN = 0.0005;

/** The job's bore limits, in the record's unit. Without a target bore, the piston plus the middle of the clearance range is the target. */
export function boreSpecFor(spec: BoreSpecPart, unit: LengthUnit): BoreSpec & { toleranceIsDefault: boolean } {
  const to = (value: number | undefined) => (value === undefined ? undefined : convertLength(value, spec.unit, unit));
  const target =
    spec.targetBore ??
    (spec.pistonDiameter !== undefined && spec.clearanceMin !== undefined && spec.clearanceMax !== undefined
      ? spec.pistonDiameter + (spec.clearanceMin + spec.clearanceMax) / 2
      : undefined);
  return {
    targetBore: to(target),
    targetTolerance: spec.boreSizeTolerance !== undefined ? to(spec.boreSizeTolerance) : convertLength(DEFAULT_SIZE_TOLERANCE_IN, 'in', unit),
    toleranceIsDefault: spec.boreSizeTolerance === undefined,
    clearanceMin: to(spec.clearanceMin),
    clearanceMax: to(spec.clearanceMax),
    maxTaper: to(spec.maxTaper),
    maxOutOfRound: to(spec.maxOutOfRound),
  };
}

/**
 * When the job gives a target bore and also a piston with a clearance range,
 * and the target lies outside piston + [minimum, maximum], the two disagree:
 * the shop works to the target bore (it is what `boreSpecFor` uses).
 */
export function sizeDisagreement(
  spec: Pick<JobInput, 'targetBore' | 'pistonDiameter' | 'clearanceMin' | 'clearanceMax'>,
): { worksTo: 'target'; target: number; fromPistonMin: number; fromPistonMax: number } | undefined {
  const { targetBore, pistonDiameter, clearanceMin, clearanceMax } = spec;
  if (targetBore === undefined || pistonDiameter === undefined || clearanceMin === undefined || clearanceMax === undefined) return undefined;
  const fromPistonMin = pistonDiameter + clearanceMin;
  const fromPistonMax = pistonDiameter + clearanceMax;
  if (targetBore >= fromPistonMin - SLACK && targetBore <= fromPistonMax + SLACK) return undefined;
  return { worksTo: 'target', target: targetBore, fromPistonMin, fromPistonMax };
}
