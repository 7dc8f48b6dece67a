/**
 * Small schemas for the calculator's extra inputs that have no API request of
 * their own (the overbore and deck cut on the compression card, the oversize
 * choice on the bore size card). Same message style as
 * shared/schemas/calculations.ts; the API-backed inputs use those schemas.
 */
import { z } from 'zod';
import { MAX_LENGTH, displacementRequestSchema, lengthUnitSchema } from '@shared/schemas/calculations';

function numberField(label: string) {
  return z.number({
    error: (issue) => (issue.input === undefined ? `${label} is required.` : `${label} must be a number.`),
  });
}

function nonNegative(label: string) {
  return numberField(label)
    .min(0, `${label} cannot be negative.`)
    .max(MAX_LENGTH, `${label} must be at most ${MAX_LENGTH.toLocaleString('en-US')}.`);
}

function positive(label: string) {
  return numberField(label)
    .positive(`${label} must be greater than zero.`)
    .max(MAX_LENGTH, `${label} must be at most ${MAX_LENGTH.toLocaleString('en-US')}.`);
}

/** Overbore and deck cut, both optional, with the cylinder count the displacement needs. */
export const machiningChangeSchema = z.object({
  cylinders: displacementRequestSchema.shape.cylinders,
  overbore: nonNegative('Overbore').optional(),
  deckCut: nonNegative('Deck cut').optional(),
});

/** The oversize choice: the standard bore, the worst reading found, and the clean-up wanted beyond it. */
export const oversizeSchema = z.object({
  unit: lengthUnitSchema,
  standardBore: positive('Standard bore'),
  largestReading: positive('Largest reading'),
  minCleanup: nonNegative('Clean-up beyond the worst reading'),
});
