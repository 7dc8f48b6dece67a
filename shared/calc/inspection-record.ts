/**
 * Judges a shop's inspection record against the job's specification: the
 * one function both the entry form (live) and the server (authoritative) use.
 * Lengths in the job's spec are converted to the record's unit exactly.
 */
import type { InspectionInput, InspectionResults, LimitCheck } from '../schemas/inspection';
import type { JobInput } from '../schemas/jobs';
import { inspectBores, type BoreSpec } from './bore';
import { crosshatchAngle } from './crosshatch';
import { deckFlatness } from './deck';
import { roughness } from './roughness';
import { convertLength, type LengthUnit } from './units';

type JobSpecPart = Pick<
  JobInput,
  | 'unit'
  | 'blockMaterial'
  | 'targetBore'
  | 'pistonDiameter'
  | 'clearanceMin'
  | 'clearanceMax'
  | 'maxTaper'
  | 'maxOutOfRound'
  | 'deckFlatnessMax'
  | 'deckRaMaxUm'
  | 'finishRaMaxUm'
  | 'finishRkMaxUm'
  | 'finishRpkMaxUm'
  | 'finishRvkMaxUm'
  | 'crosshatchMinDeg'
  | 'crosshatchMaxDeg'
>;

const SLACK = 1e-9;

/** The job's bore limits, in the record's unit. Without a target bore, the piston plus the middle of the clearance range is the target. */
export function boreSpecFor(spec: JobSpecPart, unit: LengthUnit): BoreSpec {
  const to = (value: number | undefined) => (value === undefined ? undefined : convertLength(value, spec.unit, unit));
  const target =
    spec.targetBore ??
    (spec.pistonDiameter !== undefined && spec.clearanceMin !== undefined && spec.clearanceMax !== undefined
      ? spec.pistonDiameter + (spec.clearanceMin + spec.clearanceMax) / 2
      : undefined);
  return {
    targetBore: to(target),
    clearanceMin: to(spec.clearanceMin),
    clearanceMax: to(spec.clearanceMax),
    maxTaper: to(spec.maxTaper),
    maxOutOfRound: to(spec.maxOutOfRound),
  };
}

const fmt = (value: number, unit: LengthUnit) => `${value.toFixed(unit === 'in' ? 4 : 3)} ${unit}`;

export function evaluateInspection(input: InspectionInput, spec: JobSpecPart): InspectionResults {
  const unit = input.conditions.unit;
  const checks: LimitCheck[] = [];
  const bores = inspectBores({ cylinders: input.cylinders, spec: boreSpecFor(spec, unit) });
  bores.cylinders.forEach((cylinder, index) => {
    for (const failure of cylinder.failures) {
      const words: Record<string, string> = {
        targetBore: 'size off target',
        clearanceMin: 'piston clearance below the minimum',
        clearanceMax: 'piston clearance above the maximum',
        maxTaper: 'taper',
        maxOutOfRound: 'out-of-round',
      };
      checks.push({ what: `cylinder ${index + 1} ${words[failure.limit] ?? failure.limit}`, value: failure.value, allowed: fmt(failure.allowed, unit), pass: false });
    }
  });

  let deck: InspectionResults['deck'];
  if (input.deck) {
    deck = deckFlatness({
      unit,
      readings: input.deck.readings,
      material: spec.blockMaterial,
      // Without the builder's own limit, the stricter multi-layer steel figure from the common-practice table applies.
      gasket: 'mls',
      shopLimit: spec.deckFlatnessMax !== undefined ? convertLength(spec.deckFlatnessMax, spec.unit, unit) : undefined,
    });
    checks.push({ what: 'deck out-of-flat', value: deck.outOfFlat, allowed: `≤ ${fmt(deck.limit, unit)}`, pass: deck.pass });
    if (spec.deckRaMaxUm !== undefined && input.deck.raUm !== undefined) {
      checks.push({ what: 'deck Ra', value: input.deck.raUm, allowed: `≤ ${spec.deckRaMaxUm} µm`, pass: input.deck.raUm <= spec.deckRaMaxUm + SLACK });
    }
  }

  let finish: InspectionResults['finish'];
  if (input.finish?.mode === 'values') {
    const f = input.finish;
    finish = { raUm: f.raUm, rkUm: f.rkUm, rpkUm: f.rpkUm, rvkUm: f.rvkUm, mr1: f.mr1, mr2: f.mr2 };
  } else if (input.finish?.mode === 'profile') {
    const r = roughness(input.finish.heightsUm, input.finish.spacingUm);
    finish = { raUm: r.ra, rqUm: r.rq, rzUm: r.rz, rkUm: r.rk, rpkUm: r.rpk, rvkUm: r.rvk, mr1: r.mr1, mr2: r.mr2 };
  }
  if (finish) {
    const limits: Array<[string, number | undefined, number | undefined]> = [
      ['bore Ra', finish.raUm, spec.finishRaMaxUm],
      ['bore Rk', finish.rkUm, spec.finishRkMaxUm],
      ['bore Rpk', finish.rpkUm, spec.finishRpkMaxUm],
      ['bore Rvk', finish.rvkUm, spec.finishRvkMaxUm],
    ];
    for (const [what, value, max] of limits) {
      if (value !== undefined && max !== undefined) checks.push({ what, value, allowed: `≤ ${max} µm`, pass: value <= max + SLACK });
    }
  }

  let crosshatch: InspectionResults['crosshatch'];
  if (input.crosshatch?.mode === 'measured') {
    crosshatch = { includedAngleDeg: input.crosshatch.includedAngleDeg };
  } else if (input.crosshatch?.mode === 'settings') {
    const bore = bores.cylinders.reduce((sum, c) => sum + c.mean, 0) / bores.cylinders.length;
    crosshatch = { includedAngleDeg: crosshatchAngle({ bore, spindleRpm: input.crosshatch.spindleRpm, strokeLength: input.crosshatch.strokeLength, cyclesPerMinute: input.crosshatch.cyclesPerMinute }).includedAngleDeg };
  }
  if (crosshatch && (spec.crosshatchMinDeg !== undefined || spec.crosshatchMaxDeg !== undefined)) {
    const min = spec.crosshatchMinDeg ?? 0;
    const max = spec.crosshatchMaxDeg ?? 180;
    checks.push({ what: 'crosshatch included angle', value: crosshatch.includedAngleDeg, allowed: `${min}° – ${max}°`, pass: crosshatch.includedAngleDeg >= min - SLACK && crosshatch.includedAngleDeg <= max + SLACK });
  }

  const pass = bores.pass && checks.every((c) => c.pass);
  return { bores, deck, finish, crosshatch, checks, pass };
}
