import { z } from 'zod';

/**
 * Shipping both ways on a `ship` job: the shop's receiving address (shown to
 * the builder once the job is paid for), the builder's return address, and
 * the two legs as logged on the progress timeline.
 */

const line = (label: string, max: number) => z.string({ error: `Enter ${label}.` }).trim().min(1, `Enter ${label}.`).max(max, `Use at most ${max} characters.`);

/** A postal address: one to three street lines, town, region, postal code, country. */
export const postalAddressSchema = z.object({
  lines: z
    .array(z.string().trim().max(100, 'Use at most 100 characters.'), { error: 'Enter the street address.' })
    .max(3, 'Use at most three street lines.')
    .transform((lines) => lines.filter((l) => l.length > 0))
    .refine((lines) => lines.length > 0, 'Enter the street address.'),
  city: line('a town or city', 80),
  region: line('a state, province or county', 60),
  postalCode: line('a postal code', 20),
  country: line('a country', 60),
});
export type PostalAddress = z.infer<typeof postalAddressSchema>;

/** What the builder sends when the parts leave for the shop. */
export const sentToShopInputSchema = z.object({
  carrier: z.string({ error: 'Enter the carrier.' }).trim().min(1, 'Enter the carrier.').max(60, 'Use at most 60 characters.'),
  trackingNumber: z.string({ error: 'Enter the tracking number.' }).trim().min(1, 'Enter the tracking number.').max(60, 'Use at most 60 characters.'),
  note: z.string().trim().max(2000, 'Use at most 2,000 characters.').default(''),
});
export type SentToShopInput = z.infer<typeof sentToShopInputSchema>;

export const shippingLegSchema = z.object({
  direction: z.enum(['to_shop', 'to_builder']),
  carrier: z.string().nullable(),
  trackingNumber: z.string().nullable(),
  at: z.iso.datetime(),
});
export type ShippingLeg = z.infer<typeof shippingLegSchema>;

/** GET /api/jobs/:jobId/shipping: for the job's builder, its shop and admins. */
export const shippingViewSchema = z.object({
  logistics: z.enum(['ship', 'drop-off']),
  /** The shop's receiving address: null until the job is paid for and held, on a drop-off job, or when the shop has not given one. */
  shopAddress: postalAddressSchema.nullable(),
  /** Where the shop sends the parts back; null until the builder gives it. */
  returnAddress: postalAddressSchema.nullable(),
  /** Both directions, oldest first. */
  legs: z.array(shippingLegSchema),
});
export type ShippingView = z.infer<typeof shippingViewSchema>;
export const shippingAnswerSchema = z.object({ shipping: shippingViewSchema });
export type ShippingAnswer = z.infer<typeof shippingAnswerSchema>;
