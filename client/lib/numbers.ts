/**
 * Numbers as people type them and as the screen shows them, for any feature
 * that takes measured figures (the inspection record and the calculators).
 *
 * Inputs hold the text exactly as typed: an empty or half-typed field ("",
 * "-", ".") reads as `undefined` (still to enter, not a mistake); anything
 * else that is not a plain decimal reads as NaN, so a zod schema gives its
 * "must be a number" message.
 */
import { type LengthUnit, convertLength } from '@shared/calc';

const DECIMAL = /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$/;
const HALF_TYPED = /^(?:[-+]?\.?|[-+]?(?:\d+\.?\d*|\.\d+)[eE][-+]?)$/;
/** A number inside free text, for lists of readings. */
const NUMBER_IN_TEXT = /[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?/g;

/** The typed text as a number: undefined when empty or half-typed, NaN when not a number. */
export function toNumber(text: string | undefined): number | undefined {
  const trimmed = (text ?? '').trim();
  if (trimmed === '' || HALF_TYPED.test(trimmed)) return undefined;
  return DECIMAL.test(trimmed) ? Number(trimmed) : Number.NaN;
}

/** True when the text holds nothing yet (empty or only a sign or a point). */
export function isBlank(text: string | undefined): boolean {
  return toNumber(text) === undefined;
}

/** True when the text is one plain decimal number. */
export const isDecimal = (token: string) => DECIMAL.test(token.trim());

/**
 * A list of numbers typed or pasted into one box, separated by spaces, tabs,
 * commas, semicolons or new lines. Empty text gives undefined; a word in the
 * list becomes NaN so a schema can name its position.
 */
export function toNumberList(text: string | undefined): number[] | undefined {
  const tokens = (text ?? '').split(/[\s,;]+/).filter(Boolean);
  if (tokens.length === 0) return undefined;
  return tokens.map((token) => (DECIMAL.test(token) ? Number(token) : Number.NaN));
}

/**
 * A block of text copied from a spreadsheet: rows on lines, cells separated
 * by tabs, commas, semicolons or spaces. Blank lines are dropped; cells are
 * kept as text, so a caller decides what a non-number means.
 */
export function splitRows(text: string): string[][] {
  return text
    .replace(/^\uFEFF/, '')
    .split(/\r\n|\n|\r/)
    .map((line) => line.trim())
    .filter((line) => line !== '')
    .map((line) => line.split(/[\s,;]+/).map((cell) => cell.trim()).filter((cell) => cell !== ''));
}

/** Fewest decimals shown for a length: a tenth (0.0001 in) in inches, a micrometre in millimetres. */
export const LENGTH_DECIMALS: Readonly<Record<LengthUnit, number>> = { in: 4, mm: 3 };

export const UNIT_WORDS: Readonly<Record<LengthUnit, { short: string; long: string }>> = {
  in: { short: 'in', long: 'inches' },
  mm: { short: 'mm', long: 'millimetres' },
};

/** A number with thousands separators and a fixed count of decimals; never "-0". */
export function formatNumber(value: number, decimals: number): string {
  return new Intl.NumberFormat('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals, signDisplay: 'negative' }).format(value);
}

/** A signed change, e.g. "+0.0003" or "−0.0010"; zero shows without a sign. */
export function formatChange(value: number, decimals: number): string {
  return new Intl.NumberFormat('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals, signDisplay: 'exceptZero' }).format(value);
}

/** A length in its unit: 4 decimals in inches, 3 in millimetres. */
export function formatLength(value: number, unit: LengthUnit): string {
  return `${formatNumber(value, LENGTH_DECIMALS[unit])} ${unit}`;
}

/** A figure as it was typed back into an input: plain, no exponent, no floating-point noise. */
export function numberToText(value: number | undefined): string {
  if (value === undefined || !Number.isFinite(value)) return '';
  return String(Number(value.toPrecision(12)));
}

/**
 * A length written back into an input: exact (12 significant figures, which
 * drops only floating-point noise such as 3.9999999999999996), never in
 * exponent form, and with at least the unit's usual decimals, so
 * 4.031 in → "4.0310" and 101.6 mm → "101.600".
 */
export function formatTyped(value: number, unit: LengthUnit): string {
  const tidy = Number(value.toPrecision(12));
  let text = tidy.toFixed(12).replace(/0+$/, '').replace(/\.$/, '');
  if (text === '-0') text = '0';
  const [whole, fraction = ''] = text.split('.');
  return `${whole}.${fraction.padEnd(LENGTH_DECIMALS[unit], '0')}`;
}

/** A length written back into an input (see formatTyped); empty when there is none. */
export function lengthToText(value: number | undefined, unit: LengthUnit): string {
  if (value === undefined || !Number.isFinite(value)) return '';
  return formatTyped(value, unit);
}

/** The typed length converted to the other unit; text that is not a number is left as it is. */
export function convertTypedLength(text: string, from: LengthUnit, to: LengthUnit): string {
  if (from === to) return text;
  const value = toNumber(text);
  if (value === undefined || Number.isNaN(value)) return text;
  return formatTyped(convertLength(value, from, to), to);
}

/** Every number inside a free-text list converted, separators and anything else kept as typed. */
export function convertTypedLengthList(text: string, from: LengthUnit, to: LengthUnit): string {
  if (from === to) return text;
  return text.replace(NUMBER_IN_TEXT, (token) => formatTyped(convertLength(Number(token), from, to), to));
}

/**
 * Round axis ticks for a chart: steps of 1, 2, 2.5 or 5 times a power of
 * ten, never finer than `minStep`, and a domain that starts and ends on a tick.
 */
export function niceTicks(low: number, high: number, target = 5, minStep = 0): { domain: [number, number]; ticks: number[] } {
  const span = high - low || Math.abs(high) || 1;
  const base = 10 ** Math.floor(Math.log10(span / target));
  let step = base * 10;
  for (const multiple of [1, 2, 2.5, 5, 10]) {
    if (span / (base * multiple) <= target) {
      step = base * multiple;
      break;
    }
  }
  step = Math.max(step, minStep);
  const start = Math.floor(low / step + 1e-9) * step;
  const end = Math.ceil(high / step - 1e-9) * step;
  const ticks: number[] = [];
  for (let k = 0; start + k * step <= end + step * 1e-6; k++) ticks.push(Number((start + k * step).toPrecision(12)));
  return { domain: [ticks[0], ticks[ticks.length - 1]], ticks };
}
