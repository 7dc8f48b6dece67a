import { stringify, type Options, type Stringifier } from 'csv-stringify';

/**
 * What a spreadsheet reads as the start of a formula (OWASP's CSV injection
 * list): `=`, `+`, `-`, `@`, a tab or a carriage return.
 */
const FORMULA_START = /^[=+\-@\t\r]/;

/** Text from people or providers, made inert for spreadsheets: a formula-like start is put behind a single quote. */
export const guardCell = (text: string): string => (FORMULA_START.test(text) ? `'${text}` : text);

/** A number the app worked out, written with a fixed number of decimals (dollars beside cents) and never guarded. */
export class CsvDecimal {
  constructor(
    readonly value: number,
    readonly digits: number,
  ) {}
}
export const csvDecimal = (value: number, digits: number) => new CsvDecimal(value, digits);

/**
 * The one way the app writes CSV. The column's type decides: every string
 * cell is text that may come from a person or a provider and goes through
 * `guardCell`; numbers (and `csvDecimal`s) are the app's own and are written
 * as they are, so a negative amount stays `-1500`. Put app-computed figures
 * in as numbers, never as preformatted strings.
 */
export function csvStringifier(options: Options = {}): Stringifier {
  return stringify({
    ...options,
    cast: {
      ...options.cast,
      // Header names are the app's own words.
      string: (value, context) => (context.header ? value : guardCell(value)),
      object: (value) => (value instanceof CsvDecimal ? value.value.toFixed(value.digits) : guardCell(JSON.stringify(value))),
    },
  });
}
