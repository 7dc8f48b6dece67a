/**
 * Printing a measured figure beside the limit it is judged against.
 *
 * A verdict must never contradict what is printed: 0.0127 mm over a
 * 0.0127 mm limit… shown as "0.013 mm is over the 0.013 mm limit" reads as
 * nonsense. So a value and its limit are printed with the same number of
 * decimals, at least the gauge resolution's (or the unit's usual count), and
 * more whenever rounding to that many would make two different figures look
 * the same. Figures closer than the judging slack (1e-9 in the unit) are
 * judged equal and may print equal.
 */
import type { LengthUnit } from './units';

/** Differences smaller than this are judged equal (the slack the limit checks use). */
export const FIGURE_SLACK = 1e-9;

/** The most decimals ever printed; beyond it the figures are equal within the slack. */
const MAX_DECIMALS = 10;

/** The usual decimals of a length: a tenth (0.0001 in) in inches, a micrometre (0.001 mm) in millimetres. */
export const LENGTH_DECIMALS: Readonly<Record<LengthUnit, number>> = { in: 4, mm: 3 };

/** Decimals a step of `resolution` needs: 0.0001 → 4, 0.002 → 3, 0.5 → 1, 5 → 0. */
export function decimalsOf(resolution: number): number {
  if (!Number.isFinite(resolution) || resolution <= 0) return 0;
  for (let d = 0; d <= MAX_DECIMALS; d += 1) {
    if (Math.abs(Math.round(resolution * 10 ** d) - resolution * 10 ** d) < 1e-6) return d;
  }
  return MAX_DECIMALS;
}

/** A number with a fixed count of decimals, plain digits, never "-0". */
export function fixed(value: number, decimals: number): string {
  const text = value.toFixed(decimals);
  return /^-0(?:\.0*)?$/.test(text) ? text.slice(1) : text;
}

export interface FigureAgainstLimit {
  value: string;
  limit: string;
  /** The decimals both were printed with. */
  decimals: number;
}

/**
 * A value and its limit with the same decimals: at least `minDecimals`, and
 * more until the two strings differ whenever the figures differ by more than
 * the slack. Rounding is monotonic, so the printed order then always agrees
 * with the real one.
 */
export function figureAgainstLimit(value: number, limit: number, minDecimals: number): FigureAgainstLimit {
  const start = Math.max(0, Math.min(MAX_DECIMALS, Math.floor(minDecimals)));
  const differ = Math.abs(value - limit) > FIGURE_SLACK;
  let decimals = start;
  while (differ && decimals < MAX_DECIMALS && fixed(value, decimals) === fixed(limit, decimals)) decimals += 1;
  return { value: fixed(value, decimals), limit: fixed(limit, decimals), decimals };
}

/** The decimals for a length in `unit`: the unit's usual count, or the gauge resolution's when that is finer. */
export function lengthDecimals(unit: LengthUnit, resolution?: number): number {
  return Math.max(LENGTH_DECIMALS[unit], resolution === undefined ? 0 : decimalsOf(resolution));
}

/** A length and its limit with their unit, e.g. { value: "0.0127 mm", limit: "0.0127 mm" } only when equal within the slack. */
export function lengthAgainstLimit(value: number, limit: number, unit: LengthUnit, resolution?: number): { value: string; limit: string } {
  const pair = figureAgainstLimit(value, limit, lengthDecimals(unit, resolution));
  return { value: `${pair.value} ${unit}`, limit: `${pair.limit} ${unit}` };
}
