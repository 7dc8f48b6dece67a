import { z } from 'zod';
import { operationCodes } from '../catalogue';

/** Lower-cased, so an id typed in capitals names the same row, storage key and live-update room as the stored one. */
export const uuidSchema = z.uuid({ error: 'That id is not valid.' }).toLowerCase();

export const operationCodeSchema = z.enum(operationCodes, { error: 'Choose an operation from the list.' });

export const regionSchema = z.object({
  country: z.string({ error: 'Enter a country.' }).trim().min(2, 'Enter a country.').max(60, 'Use at most 60 characters.'),
  region: z.string({ error: 'Enter a state, province or county.' }).trim().min(1, 'Enter a state, province or county.').max(60, 'Use at most 60 characters.'),
  city: z.string({ error: 'Enter a town or city.' }).trim().min(1, 'Enter a town or city.').max(80, 'Use at most 80 characters.'),
  /** Where distances are measured from; optional, and without it (or when it is not found) distances fall back to region. */
  postalCode: z.string({ error: 'Enter a postal code.' }).trim().max(12, 'Use at most 12 characters.').regex(/^[A-Za-z0-9 -]*$/, 'Use letters, digits, spaces and dashes.').optional(),
});
export type Region = z.infer<typeof regionSchema>;

/** Whole cents, never fractions: money is integer cents throughout. */
export const centsSchema = (label: string) =>
  z
    .number({ error: `${label} must be a number of cents.` })
    .int(`${label} must be whole cents.`)
    .min(0, `${label} cannot be negative.`)
    .max(100_000_000, `${label} must be at most $1,000,000.`);

/** A calendar date as YYYY-MM-DD. */
export const isoDateSchema = (label: string) =>
  z.iso.date({ error: `${label} must be a date like 2027-03-31.` });

/** Query-string numbers arrive as text. */
export const queryInt = (label: string, min: number, max: number) =>
  z.coerce
    .number({ error: `${label} must be a whole number.` })
    .int(`${label} must be a whole number.`)
    .min(min, `${label} must be at least ${min}.`)
    .max(max, `${label} must be at most ${max}.`);

/** A radius in the query string: "within 50" (miles or km as `unit` says). */
export const withinSchema = z.coerce
  .number({ error: 'Within must be a number.' })
  .positive('Within must be more than 0.')
  .max(5000, 'Within must be at most 5,000.');

/** A postal code to measure from, in the query string. */
export const nearSchema = z.string().trim().min(3, 'Enter a postal code.').max(12, 'Use at most 12 characters.').regex(/^[A-Za-z0-9 -]+$/, 'Use letters, digits, spaces and dashes.');
