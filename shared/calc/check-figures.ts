/**
 * A judged check's figure and limit as printed text, with enough decimals
 * that the print never contradicts the verdict (see figures.ts). One place
 * for the record view, the entry form's live results and the certificate.
 *
 * The limit's number is looked up again from the job's spec (and the deck
 * result, whose limit may come from the common-practice table), since a
 * stored check carries its limit only as text. A check this file does not
 * know keeps its own `allowed` text.
 */
import type { InspectionResults, LimitCheck } from '../schemas/inspection';
import type { JobInput } from '../schemas/jobs';
import { figureAgainstLimit, lengthDecimals } from './figures';
import { boreSpecFor } from './inspection-record';
import type { LengthUnit } from './units';

export interface CheckFigures {
  /** The measured figure with its unit, e.g. "0.0009 in". */
  value: string;
  /** The limit as a condition, e.g. "≤ 0.0005 in", "≥ 0.0025 in", "40.0° – 50.0°". */
  allowed: string;
  /** False when the limit's number could not be found and `allowed` is the check's own text. */
  matched: boolean;
}

type Bound = { kind: 'max' | 'min'; limit: number } | { kind: 'range'; min: number; max: number };
type Scale = { suffix: string; decimals: number };

/** The job's limits; only the unit is required (a spec with fewer limits simply finds fewer). */
type SpecPart = Partial<Pick<JobInput, 'deckRaMaxUm' | 'finishRaMaxUm' | 'finishRkMaxUm' | 'finishRpkMaxUm' | 'finishRvkMaxUm' | 'crosshatchMinDeg' | 'crosshatchMaxDeg'>> &
  Partial<Parameters<typeof boreSpecFor>[0]> & { unit: LengthUnit };

export interface CheckContext {
  spec: SpecPart;
  results: Pick<InspectionResults, 'deck'>;
  unit: LengthUnit;
  /** The gauge resolution of the record, when known: lengths then show at least its decimals. */
  resolution?: number;
}

const FINISH_LIMITS: Record<string, keyof SpecPart> = {
  'bore Ra': 'finishRaMaxUm',
  'bore Rk': 'finishRkMaxUm',
  'bore Rpk': 'finishRpkMaxUm',
  'bore Rvk': 'finishRvkMaxUm',
};

/** Which limit a check is judged against, and in what scale. */
function boundOf(check: LimitCheck & { limit?: string }, ctx: CheckContext): { bound: Bound; scale: Scale } | undefined {
  const length: Scale = { suffix: ` ${ctx.unit}`, decimals: lengthDecimals(ctx.unit, ctx.resolution) };
  const micro: Scale = { suffix: ' µm', decimals: 2 };
  // boreSpecFor reads only the length limits and the unit, all of which may be absent here but the unit.
  const bore = boreSpecFor(ctx.spec as Parameters<typeof boreSpecFor>[0], ctx.unit);
  const what = check.what;
  const key = check.limit ?? '';
  const max = (limit: number | undefined, scale: Scale) => (limit === undefined ? undefined : { bound: { kind: 'max' as const, limit }, scale });
  const min = (limit: number | undefined, scale: Scale) => (limit === undefined ? undefined : { bound: { kind: 'min' as const, limit }, scale });

  if (key === 'maxTaper' || / taper$/.test(what)) return max(bore.maxTaper, length);
  if (key === 'maxOutOfRound' || / out-of-round$/.test(what)) return max(bore.maxOutOfRound, length);
  if (key === 'clearanceMin' || /clearance below the minimum$/.test(what)) return min(bore.clearanceMin, length);
  if (key === 'clearanceMax' || /clearance above the maximum$/.test(what)) return max(bore.clearanceMax, length);
  if (key === 'deck' || what === 'deck out-of-flat') return max(ctx.results.deck?.limit, length);
  if (key === 'deckRa' || what === 'deck Ra') return max(ctx.spec.deckRaMaxUm, micro);
  if (what in FINISH_LIMITS) return max(ctx.spec[FINISH_LIMITS[what]] as number | undefined, micro);
  if (key === 'crosshatch' || what === 'crosshatch included angle') {
    if (ctx.spec.crosshatchMinDeg === undefined && ctx.spec.crosshatchMaxDeg === undefined) return undefined;
    return { bound: { kind: 'range', min: ctx.spec.crosshatchMinDeg ?? 0, max: ctx.spec.crosshatchMaxDeg ?? 180 }, scale: { suffix: '°', decimals: 1 } };
  }
  return undefined;
}

/** The check's figure and limit, printed so that the two differ whenever the verdict depends on their difference. */
export function checkFigures(check: LimitCheck, ctx: CheckContext): CheckFigures {
  const found = boundOf(check, ctx);
  if (!found) {
    // The size check: the mean against "target ± tolerance" (its limit is only in the text); show enough decimals to tell it from both ends.
    const size = /^\s*(-?[\d.]+)\s*(?:in|mm)?\s*±\s*([\d.]+)/.exec(check.allowed);
    if ((check as { limit?: string }).limit === 'size' || / size$/.test(check.what)) {
      const decimals = lengthDecimals(ctx.unit, ctx.resolution);
      const ends = size ? [Number(size[1]) - Number(size[2]), Number(size[1]) + Number(size[2])] : [];
      const needed = Math.max(decimals, ...ends.map((end) => figureAgainstLimit(check.value, end, decimals).decimals));
      return { value: `${figureAgainstLimit(check.value, check.value, needed).value} ${ctx.unit}`, allowed: check.allowed, matched: size !== null };
    }
    return { value: String(Number(check.value.toFixed(6))), allowed: check.allowed, matched: false };
  }
  const { bound, scale } = found;
  const withUnit = (text: string) => `${text}${scale.suffix}`;
  if (bound.kind === 'range') {
    const low = figureAgainstLimit(check.value, bound.min, scale.decimals);
    const high = figureAgainstLimit(check.value, bound.max, scale.decimals);
    const decimals = Math.max(low.decimals, high.decimals);
    const at = (n: number) => figureAgainstLimit(n, n, decimals).value;
    return { value: withUnit(at(check.value)), allowed: `${withUnit(at(bound.min))} – ${withUnit(at(bound.max))}`, matched: true };
  }
  const pair = figureAgainstLimit(check.value, bound.limit, scale.decimals);
  return { value: withUnit(pair.value), allowed: `${bound.kind === 'max' ? '≤' : '≥'} ${withUnit(pair.limit)}`, matched: true };
}
