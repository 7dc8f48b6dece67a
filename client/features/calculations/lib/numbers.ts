/**
 * Reading numbers as people type them, and writing them back for the screen.
 *
 * Inputs hold the text exactly as typed; these helpers turn it into what the
 * zod schemas expect: an empty or half-typed field ("", "-", ".") becomes
 * `undefined` (the schema reports it as still to enter, not as a mistake),
 * anything else that is not a plain decimal becomes NaN (the schema's "must be
 * a number" message).
 */
import { type LengthUnit, convertLength } from '@shared/calc';

const DECIMAL = /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$/;
const HALF_TYPED = /^(?:[-+]?\.?|[-+]?(?:\d+\.?\d*|\.\d+)[eE][-+]?)$/;
/** A number inside free text, for lists of readings. */
const NUMBER_IN_TEXT = /[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?/g;

/** The typed text as a number for a schema: undefined when empty or half-typed, NaN when not a number. */
export function toNumber(text: string | undefined): number | undefined {
  const trimmed = (text ?? '').trim();
  if (trimmed === '' || HALF_TYPED.test(trimmed)) return undefined;
  return DECIMAL.test(trimmed) ? Number(trimmed) : Number.NaN;
}

/** True when the text holds nothing yet (empty or only a sign or a point). */
export function isBlank(text: string | undefined): boolean {
  return toNumber(text) === undefined;
}

/** Fewest decimals shown for a length: a tenth (0.0001 in) in inches, a micrometre in millimetres. */
export const LENGTH_DECIMALS: Readonly<Record<LengthUnit, number>> = { in: 4, mm: 3 };

export const UNIT_WORDS: Readonly<Record<LengthUnit, { short: string; long: string }>> = {
  in: { short: 'in', long: 'inches' },
  mm: { short: 'mm', long: 'millimetres' },
};

/** A number with thousands separators and a fixed count of decimals; never "-0". */
export function formatNumber(value: number, decimals: number): string {
  return new Intl.NumberFormat('en-US', {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
    signDisplay: 'negative',
  }).format(value);
}

/** A signed change, e.g. "+0.52" or "−12.3"; zero shows without a sign. */
export function formatChange(value: number, decimals: number): string {
  return new Intl.NumberFormat('en-US', {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
    signDisplay: 'exceptZero',
  }).format(value);
}

/** A length in its unit: 4 decimals in inches, 3 in millimetres. */
export function formatLength(value: number, unit: LengthUnit): string {
  return `${formatNumber(value, LENGTH_DECIMALS[unit])} ${unit}`;
}

/**
 * A converted value written back into an input: exact (12 significant
 * figures, which drops only floating-point noise such as 3.9999999999999996),
 * never in exponent form, and with at least the unit's usual decimals, so
 * 4 in becomes "101.600" mm and 101.6 mm becomes "4.0000" in.
 */
export function formatTyped(value: number, unit: LengthUnit): string {
  const tidy = Number(value.toPrecision(12));
  let text = tidy.toFixed(12).replace(/0+$/, '').replace(/\.$/, '');
  if (text === '-0') text = '0';
  const [whole, fraction = ''] = text.split('.');
  const decimals = Math.max(fraction.length, LENGTH_DECIMALS[unit]);
  return `${whole}.${fraction.padEnd(decimals, '0')}`;
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
 * A list of numbers typed or pasted into a text box, separated by spaces,
 * commas, semicolons or new lines. Empty text gives undefined; a word in the
 * list becomes NaN so the schema can name its position.
 */
export function toNumberList(text: string): number[] | undefined {
  const tokens = text.split(/[\s,;]+/).filter(Boolean);
  if (tokens.length === 0) return undefined;
  return tokens.map((token) => (DECIMAL.test(token) ? Number(token) : Number.NaN));
}
