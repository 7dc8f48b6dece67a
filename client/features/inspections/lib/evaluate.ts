/**
 * Live results while the record is typed, with the same function the server
 * uses (`evaluateInspection`), and the checks put into words for the screen.
 *
 * While the record is incomplete, only the parts that are complete and valid
 * are judged: each finished cylinder, the deck, the finish and the crosshatch
 * as soon as each is whole. The overall verdict waits for the full record.
 */
import { type BoreSpec, type CylinderInspection, type LengthUnit, CalculationError, boreSpecFor, checkFigures, evaluateInspection, lengthAgainstLimit } from '@shared/calc';
import type { InspectionInput, InspectionResults, LimitCheck } from '@shared/schemas/inspection';
import type { JobInput } from '@shared/schemas/jobs';
import { formatLength, formatNumber } from '@client/lib/numbers';
import { type RecordCheck, type RecordForm, toRawInput } from './record-form';

export interface LiveEvaluation {
  /** Results for the complete parts; undefined until one cylinder is complete. */
  results?: InspectionResults;
  /** Which cylinders (zero-based) `results.bores.cylinders` holds, in order. */
  cylinderIndexes: number[];
  /** True when the whole record is valid and the results are what the server will find. */
  complete: boolean;
  /** A message from the calculation when the figures cannot be worked out. */
  error?: string;
}

export function evaluateLive(form: RecordForm, cylinderCount: number, spec: JobInput, check: RecordCheck): LiveEvaluation {
  const all = Array.from({ length: cylinderCount }, (_, i) => i);
  try {
    if (check.input) return { results: evaluateInspection(check.input, spec), cylinderIndexes: all, complete: true };
    const raw = toRawInput(form, cylinderCount) as Record<string, unknown> & { cylinders?: unknown[]; sections?: Record<string, unknown> };
    const wrong = (prefix: string) => check.order.some((path) => path === prefix || path.startsWith(`${prefix}.`));
    const indexes = all.filter((i) => !wrong(`cylinders.${i}`));
    const part = (name: 'deck' | 'finish' | 'crosshatch') => (raw[name] !== undefined && !wrong(name) ? { [name]: raw[name] } : {});
    // Each section judged as soon as it is whole and right.
    const sections = Object.fromEntries(Object.entries(raw.sections ?? {}).filter(([key]) => !wrong(`sections.${key}`)));
    const parts = { ...part('deck'), ...part('finish'), ...part('crosshatch') };
    if (indexes.length === 0 && Object.keys(sections).length === 0 && !parts.deck) return { cylinderIndexes: [], complete: false };
    const partial = {
      conditions: { unit: form.unit, gaugeResolution: 0.0001, temperatureC: 20, torquePlate: false },
      ...(indexes.length > 0 ? { cylinders: indexes.map((i) => raw.cylinders![i]) } : {}),
      ...parts,
      ...(Object.keys(sections).length > 0 ? { sections } : {}),
      signedOffBy: '',
      notes: '',
    } as InspectionInput;
    return { results: evaluateInspection(partial, spec), cylinderIndexes: indexes, complete: false };
  } catch (error) {
    if (error instanceof CalculationError) return { cylinderIndexes: [], complete: false, error: error.message };
    throw error;
  }
}

// --- checks in words -------------------------------------------------------------

export interface CheckRow {
  key: string;
  /** "Cylinder 3 taper", "Deck out-of-flat". */
  what: string;
  /** null: reported, not judged. */
  pass: boolean | null;
  reason: string;
}

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/** The bore limits of the job, in the record's unit. */
export const boreLimits = (spec: JobInput, unit: LengthUnit): BoreSpec => boreSpecFor(spec, unit);

/** Each limit of the job judged for one cylinder, with the figure and the limit in the reason. */
export function cylinderChecks(cylinder: CylinderInspection, index: number, limits: BoreSpec, unit: LengthUnit): CheckRow[] {
  const L = (value: number) => formatLength(value, unit);
  // A figure beside its limit: enough decimals that the two print differently whenever the verdict depends on it.
  const pair = (value: number, limit: number) => lengthAgainstLimit(value, limit, unit);
  const failed = (limit: string) => cylinder.failures.some((f) => f.limit === limit);
  const rows: CheckRow[] = [];
  const name = `Cylinder ${index + 1}`;
  if (limits.maxTaper !== undefined) {
    const pass = !failed('maxTaper');
    const f = pair(cylinder.taper, limits.maxTaper);
    rows.push({
      key: `${index}-taper`,
      what: `${name} taper`,
      pass,
      reason: pass ? `Taper ${f.value}, within the ${f.limit} limit.` : `Taper ${f.value} is over the ${f.limit} limit.`,
    });
  }
  if (limits.maxOutOfRound !== undefined) {
    const pass = !failed('maxOutOfRound');
    const f = pair(cylinder.outOfRound, limits.maxOutOfRound);
    rows.push({
      key: `${index}-oor`,
      what: `${name} out-of-round`,
      pass,
      reason: pass ? `Out-of-round ${f.value}, within the ${f.limit} limit.` : `Out-of-round ${f.value} is over the ${f.limit} limit.`,
    });
  }
  if (limits.clearanceMin !== undefined || limits.clearanceMax !== undefined) {
    const range =
      limits.clearanceMin !== undefined && limits.clearanceMax !== undefined
        ? `${L(limits.clearanceMin)} – ${L(limits.clearanceMax)}`
        : limits.clearanceMin !== undefined
          ? `at least ${L(limits.clearanceMin)}`
          : `at most ${L(limits.clearanceMax!)}`;
    if (cylinder.clearance === undefined) {
      rows.push({ key: `${index}-clearance`, what: `${name} piston clearance`, pass: null, reason: 'Not judged: no piston diameter entered.' });
    } else if (failed('clearanceMin')) {
      const f = pair(cylinder.clearance, limits.clearanceMin!);
      rows.push({ key: `${index}-clearance`, what: `${name} piston clearance`, pass: false, reason: `Clearance ${f.value} is under the ${f.limit} minimum.` });
    } else if (failed('clearanceMax')) {
      const f = pair(cylinder.clearance, limits.clearanceMax!);
      rows.push({ key: `${index}-clearance`, what: `${name} piston clearance`, pass: false, reason: `Clearance ${f.value} is over the ${f.limit} maximum.` });
    } else {
      // Within the range: as many decimals as the nearer end needs to show the figure is not on it.
      const ends = [limits.clearanceMin, limits.clearanceMax].filter((v): v is number => v !== undefined).map((end) => pair(cylinder.clearance!, end));
      const shown = ends.reduce((longest, f) => (f.value.length > longest.length ? f.value : longest), L(cylinder.clearance));
      rows.push({ key: `${index}-clearance`, what: `${name} piston clearance`, pass: true, reason: `Clearance ${shown}, within ${range}.` });
    }
  }
  const size = cylinder.failures.find((f) => f.limit === 'targetBore');
  if (size) {
    rows.push({
      key: `${index}-size`,
      what: `${name} size`,
      pass: false,
      reason: `Mean size is ${L(Math.abs(size.value))} ${size.value > 0 ? 'over' : 'under'} the target; ± ${L(size.allowed)} allowed.`,
    });
  }
  return rows;
}

/** A figure of a non-bore check in its own unit, when its limit cannot be found. */
function checkFigure(check: LimitCheck, unit: LengthUnit): string {
  if (check.what === 'deck out-of-flat') return formatLength(check.value, unit);
  if (check.what.includes('angle')) return `${formatNumber(check.value, 1)}°`;
  return `${formatNumber(check.value, 2)} µm`;
}

/** The first number in a check's limit text ("≤ 0.6 µm" → 0.6, "40° – 50°" → [40, 50]); finish and angle limits are written there in full. */
const numbersIn = (text: string) => Array.from(text.matchAll(/-?\d+(?:\.\d+)?/g), (m) => Number(m[0]));

/**
 * The deck, finish and crosshatch checks, from the results' own list, each
 * figure printed beside its limit with enough decimals to show the verdict
 * (shared/calc/check-figures.ts). Without the job's spec, the finish and angle
 * limits are read back from the check's own text, where they are exact.
 */
export function otherChecks(results: InspectionResults, unit: LengthUnit, spec?: JobInput): CheckRow[] {
  return results.checks
    .filter((check) => !/^cylinder \d+ /.test(check.what))
    .map((check) => {
      const [first, second] = numbersIn(check.allowed);
      const fromText = {
        unit,
        ...(check.what === 'deck Ra' ? { deckRaMaxUm: first } : {}),
        ...(check.what === 'bore Ra' ? { finishRaMaxUm: first } : {}),
        ...(check.what === 'bore Rk' ? { finishRkMaxUm: first } : {}),
        ...(check.what === 'bore Rpk' ? { finishRpkMaxUm: first } : {}),
        ...(check.what === 'bore Rvk' ? { finishRvkMaxUm: first } : {}),
        ...(check.what === 'crosshatch included angle' && second !== undefined ? { crosshatchMinDeg: first, crosshatchMaxDeg: second } : {}),
      };
      const figures = checkFigures(check, { spec: spec ?? fromText, results, unit });
      return {
        key: check.what,
        what: capitalise(check.what),
        pass: check.pass,
        reason: `${figures.matched ? figures.value : checkFigure(check, unit)}; allowed ${figures.allowed}.${check.pass ? '' : ' Outside the limit.'}`,
      };
    });
}
