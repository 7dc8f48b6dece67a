/**
 * Money as people type it (dollars) and as the API keeps it (integer cents).
 *
 * Typed amounts are read digit by digit, never through floating point:
 * "12.3" is 12 dollars and 30 cents, 1230, exactly. More than two decimals is
 * refused with a message rather than rounded, so nobody's price changes
 * behind their back.
 *
 * Forms that hold dollars text still validate with the shared zod schema (the
 * one the server uses): `dollarsFormResolver` turns the text into cents first,
 * then lets the schema speak, and puts every message beside the input that
 * holds the amount.
 */
import { toNestErrors } from '@hookform/resolvers';
import type { FieldError, FieldValues, Resolver } from 'react-hook-form';
import type { z } from 'zod';
import { ApiError } from './api-client';

export type DollarsResult = { ok: true; cents: number } | { ok: false; message: string };

/** Plain dollars: 1250, 1250.5, 1,250.50, $45, .75 (a leading $ and thousands commas are fine). */
const DOLLARS = /^(\d{1,3}(?:,\d{3})+|\d+)?(?:\.(\d*))?$/;
/** Beyond this many whole dollars the sum could lose exactness; the schemas' limits are far lower. */
const MAX_DOLLAR_DIGITS = 12;

export const MONEY_MESSAGES = {
  empty: 'Enter an amount in dollars, like 45 or 45.50.',
  notANumber: 'Enter dollars and cents as digits, like 45 or 45.50.',
  negative: 'The amount cannot be negative.',
  tooManyDecimals: 'Use at most 2 decimal places (whole cents), like 12.35.',
  tooLarge: 'That amount is too large.',
} as const;

/** Reads a typed dollar amount into whole cents, exactly, or says what is wrong with it. */
export function parseDollars(text: string): DollarsResult {
  const trimmed = text.trim().replace(/^\$\s*/, '');
  if (trimmed === '') return { ok: false, message: MONEY_MESSAGES.empty };
  if (/^[-−]/.test(trimmed)) return { ok: false, message: MONEY_MESSAGES.negative };
  const match = DOLLARS.exec(trimmed);
  if (!match || trimmed === '.' || (match[1] === undefined && !match[2])) return { ok: false, message: MONEY_MESSAGES.notANumber };
  const whole = (match[1] ?? '0').replace(/,/g, '').replace(/^0+(?=\d)/, '');
  const fraction = match[2] ?? '';
  if (fraction.length > 2) return { ok: false, message: MONEY_MESSAGES.tooManyDecimals };
  if (whole.length > MAX_DOLLAR_DIGITS) return { ok: false, message: MONEY_MESSAGES.tooLarge };
  return { ok: true, cents: Number(whole) * 100 + Number(fraction.padEnd(2, '0')) };
}

/** Cents as the text a dollars input holds: 123450 → "1234.50", 0 → "0.00". */
export function centsToDollars(cents: number): string {
  if (!Number.isSafeInteger(cents)) throw new Error('cents must be a whole number');
  const sign = cents < 0 ? '-' : '';
  const abs = Math.abs(cents);
  return `${sign}${Math.floor(abs / 100)}.${String(abs % 100).padStart(2, '0')}`;
}

/**
 * On leaving a dollars input, writes a readable amount back in one form
 * ("$1,250" → "1250.00", "12.3" → "12.30"); anything unreadable stays as typed
 * so its message can point at it.
 */
export function tidyDollars(event: { target: { value: string } }, write: (text: string) => void) {
  const text = event.target.value;
  if (text.trim() === '') return;
  const parsed = parseDollars(text);
  if (parsed.ok && centsToDollars(parsed.cents) !== text) write(centsToDollars(parsed.cents));
}

/** The form's values turned into the schema's input, with messages for amounts that could not be read. */
export interface PreparedInput {
  input: unknown;
  /** Messages keyed by form field path, e.g. { "lineItems.2.unitPrice": "Use at most 2 decimal places…" }. */
  moneyErrors: Record<string, string>;
  /** The form field for a schema path, e.g. "lineItems.2.unitPriceCents" → "lineItems.2.unitPrice". */
  formPath: (schemaPath: string) => string;
}

/**
 * A react-hook-form resolver for a form that holds money as dollars text.
 * `prepare` converts the values to the schema's input; the shared schema then
 * checks everything, and its parsed output is what the form submits.
 * A money message wins over the schema's message for the same field.
 * `loadSchema` is the schema's dynamic import: the schema, and zod with it,
 * load at the first check rather than with the page (as in lazy-resolver.ts);
 * a failed load is tried again at the next check. Making one has no side effects.
 */
/*#__NO_SIDE_EFFECTS__*/
export function dollarsFormResolver<TForm extends FieldValues, TOutput>(
  loadSchema: () => Promise<z.ZodType<TOutput>>,
  prepare: (values: TForm) => PreparedInput,
): Resolver<TForm, unknown, TOutput> {
  let loading: Promise<z.ZodType<TOutput>> | undefined;
  return async (values, _context, options) => {
    const { input, moneyErrors, formPath } = prepare(values);
    loading ??= loadSchema().catch((error: unknown) => {
      loading = undefined;
      throw error;
    });
    const result = await (await loading).safeParseAsync(input);
    const flat: Record<string, FieldError> = {};
    for (const [path, message] of Object.entries(moneyErrors)) flat[path] = { type: 'money', message };
    if (!result.success) {
      for (const issue of result.error.issues) {
        const path = formPath(issue.path.map(String).join('.'));
        flat[path] ??= { type: issue.code, message: issue.message };
      }
    }
    if (result.success && Object.keys(flat).length === 0) return { values: result.data, errors: {} };
    return { values: {}, errors: toNestErrors(flat, options) };
  };
}

/** The server's per-field messages renamed to the form's fields, so applyServerErrors can place them. */
export function withFormPaths(error: unknown, formPath: (schemaPath: string) => string): unknown {
  if (!(error instanceof ApiError)) return error;
  const fields = Object.fromEntries(Object.entries(error.fields).map(([path, message]) => [formPath(path), message]));
  return new ApiError(error.status, error.code, error.message, fields);
}
