/**
 * Live results while the record is typed, with the same function the server
 * uses (`evaluateInspection`), and the checks put into words for the screen.
 *
 * While the record is incomplete, only the parts that are complete and valid
 * are judged: each finished cylinder, the deck, the finish and the crosshatch
 * as soon as each is whole. The overall verdict waits for the full record.
 */
import { type BoreSpec, type CylinderInspection, type LengthUnit, CalculationError, boreSpecFor, evaluateInspection } from '@shared/calc';
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
    const raw = toRawInput(form, cylinderCount) as Record<string, unknown> & { cylinders: unknown[] };
    const wrong = (prefix: string) => check.order.some((path) => path === prefix || path.startsWith(`${prefix}.`));
    const indexes = all.filter((i) => !wrong(`cylinders.${i}`));
    if (indexes.length === 0) return { cylinderIndexes: [], complete: false };
    const part = (name: 'deck' | 'finish' | 'crosshatch') => (raw[name] !== undefined && !wrong(name) ? { [name]: raw[name] } : {});
    const partial = {
      conditions: { unit: form.unit, gaugeResolution: 0.0001, temperatureC: 20, torquePlate: false },
      cylinders: indexes.map((i) => raw.cylinders[i]),
      ...part('deck'),
      ...part('finish'),
      ...part('crosshatch'),
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
  const failed = (limit: string) => cylinder.failures.some((f) => f.limit === limit);
  const rows: CheckRow[] = [];
  const name = `Cylinder ${index + 1}`;
  if (limits.maxTaper !== undefined) {
    const pass = !failed('maxTaper');
    rows.push({
      key: `${index}-taper`,
      what: `${name} taper`,
      pass,
      reason: pass ? `Taper ${L(cylinder.taper)}, within the ${L(limits.maxTaper)} limit.` : `Taper ${L(cylinder.taper)} is over the ${L(limits.maxTaper)} limit.`,
    });
  }
  if (limits.maxOutOfRound !== undefined) {
    const pass = !failed('maxOutOfRound');
    rows.push({
      key: `${index}-oor`,
      what: `${name} out-of-round`,
      pass,
      reason: pass
        ? `Out-of-round ${L(cylinder.outOfRound)}, within the ${L(limits.maxOutOfRound)} limit.`
        : `Out-of-round ${L(cylinder.outOfRound)} is over the ${L(limits.maxOutOfRound)} limit.`,
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
      rows.push({ key: `${index}-clearance`, what: `${name} piston clearance`, pass: false, reason: `Clearance ${L(cylinder.clearance)} is under the ${L(limits.clearanceMin!)} minimum.` });
    } else if (failed('clearanceMax')) {
      rows.push({ key: `${index}-clearance`, what: `${name} piston clearance`, pass: false, reason: `Clearance ${L(cylinder.clearance)} is over the ${L(limits.clearanceMax!)} maximum.` });
    } else {
      rows.push({ key: `${index}-clearance`, what: `${name} piston clearance`, pass: true, reason: `Clearance ${L(cylinder.clearance)}, within ${range}.` });
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

/** A figure of a non-bore check in its own unit. */
function checkFigure(check: LimitCheck, unit: LengthUnit): string {
  if (check.what === 'deck out-of-flat') return formatLength(check.value, unit);
  if (check.what.includes('angle')) return `${formatNumber(check.value, 1)}°`;
  return `${formatNumber(check.value, 2)} µm`;
}

/** The deck, finish and crosshatch checks, from the results' own list. */
export function otherChecks(results: InspectionResults, unit: LengthUnit): CheckRow[] {
  return results.checks
    .filter((check) => !/^cylinder \d+ /.test(check.what))
    .map((check) => ({
      key: check.what,
      what: capitalise(check.what),
      pass: check.pass,
      reason: `${checkFigure(check, unit)}; allowed ${check.allowed}.${check.pass ? '' : ' Outside the limit.'}`,
    }));
}
