/**
 * The job's bore limits in the record's unit, on their own (without the rest of the inspection record's
 * working, shared/calc/inspection-record.ts, which re-exports them) so that a page showing a record's
 * words does not load the whole calculation.
 */
import type { JobInput } from '../schemas/jobs';
import type { BoreSpec } from './bore';
import { convertLength, type LengthUnit } from './units';

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
