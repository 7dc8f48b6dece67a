import { z } from 'zod';
import { centsSchema, nearSchema, operationCodeSchema, queryInt, regionSchema, withinSchema } from './common';
import { distanceUnits } from '../distance';
import { ratingSummarySchema } from './reviews';
import { postalAddressSchema } from './shipping';
import { shopStandingSchema } from './standing';

export const rateCardEntrySchema = z.object({
  operation: operationCodeSchema,
  priceCents: centsSchema('Price'),
});

export const shopProfileSchema = z
  .object({
    name: z.string({ error: 'Enter the shop’s name.' }).trim().min(2, 'Enter the shop’s name.').max(80, 'Use at most 80 characters.'),
    ...regionSchema.shape,
    takesShipped: z.boolean({ error: 'Say whether you take shipped parts.' }),
    capabilities: z
      .array(operationCodeSchema, { error: 'Choose the work you do.' })
      .min(1, 'Choose at least one kind of work you do.')
      .max(50)
      .refine((list) => new Set(list).size === list.length, 'Each kind of work once, please.'),
    equipmentNotes: z.string().trim().max(2000, 'Use at most 2,000 characters.').default(''),
    turnaroundDays: z
      .number({ error: 'Enter a typical turnaround in working days.' })
      .int('Use whole working days.')
      .min(1, 'At least one working day.')
      .max(365, 'At most 365 working days.'),
    rateCard: z.array(rateCardEntrySchema).max(50).default([]),
    notifyMatchingJobs: z.boolean().default(false),
    /** Where builders send parts; shown only to the builder of a paid-for `ship` job. */
    receivingAddress: postalAddressSchema.nullable().default(null),
  })
  .superRefine((shop, ctx) => {
    const seen = new Set<string>();
    shop.rateCard.forEach((entry, index) => {
      if (seen.has(entry.operation)) {
        ctx.addIssue({ code: 'custom', path: ['rateCard', index, 'operation'], message: 'This work already has a price.' });
      }
      seen.add(entry.operation);
      if (!shop.capabilities.includes(entry.operation)) {
        ctx.addIssue({ code: 'custom', path: ['rateCard', index, 'operation'], message: 'Price only work you list as a capability.' });
      }
    });
  });
export type ShopProfileInput = z.infer<typeof shopProfileSchema>;

export const shopDirectoryQuerySchema = z.object({
  q: z.string().trim().max(80, 'Use at most 80 characters.').optional(),
  operation: operationCodeSchema.optional(),
  country: z.string().trim().max(60).optional(),
  region: z.string().trim().max(60).optional(),
  takesShipped: z.enum(['true', 'false'], { error: 'Use true or false.' }).transform((v) => v === 'true').optional(),
  /** A postal code (United States or Canada): the nearest shops first, each with its distance. */
  near: nearSchema.optional(),
  /** With `near`: only shops within this distance. */
  within: withinSchema.optional(),
  unit: z.enum(distanceUnits, { error: 'Use mi or km.' }).optional(),
  page: queryInt('Page', 1, 10_000).default(1),
  pageSize: queryInt('Page size', 1, 100).default(20),
}).refine((q) => q.within === undefined || q.near !== undefined, { path: ['near'], message: 'Give a postal code to measure the distance from.' });
export type ShopDirectoryQuery = z.infer<typeof shopDirectoryQuerySchema>;

/** A shop as anyone may see it. */
export const publicShopSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  country: z.string(),
  region: z.string(),
  city: z.string(),
  takesShipped: z.boolean(),
  capabilities: z.array(z.string()),
  equipmentNotes: z.string(),
  turnaroundDays: z.number().int(),
  rateCard: z.array(z.object({ operation: z.string(), priceCents: z.number().int() })),
  verified: z.boolean(),
  rating: ratingSummarySchema.nullable(),
  /** Figures from the shop's own history on Tenthmark (shared/schemas/standing.ts). */
  standing: shopStandingSchema,
});
export type PublicShop = z.infer<typeof publicShopSchema>;

/** What a shop sees of itself: the public profile, its e-mail choice and its payout account's state. */
export const ownShopSchema = publicShopSchema.extend({
  postalCode: z.string().nullable(),
  /** Whether the postal code gave a place; false means distances from the shop fall back to region. */
  placeFound: z.boolean(),
  notifyMatchingJobs: z.boolean(),
  receivingAddress: postalAddressSchema.nullable(),
  payouts: z.enum(['none', 'pending', 'ready']),
});
export type OwnShop = z.infer<typeof ownShopSchema>;

/** Where the directory measures from: a postal code typed in, or the signed-in builder's latest job. */
export const directoryOrigins = ['near', 'latest-job'] as const;

export const shopDirectoryPageSchema = z.object({
  /** `distance` from `near` in `distanceFrom.unit`; null without `near` or when the shop's place is unknown. */
  shops: z.array(publicShopSchema.extend({ distance: z.number().nullable() })),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
  /**
   * What the order and distances are measured from: the `near` postal code, or for a signed-in builder without one,
   * their latest job with a known place (`from: 'latest-job'`). `found` false: none of their jobs' postal codes gave a
   * place, so the shops of `region` (their latest job's) come first and no distance is given. Null: nothing to measure from.
   */
  distanceFrom: z
    .object({
      unit: z.enum(distanceUnits),
      postalCode: z.string().nullable(),
      from: z.enum(directoryOrigins),
      found: z.boolean(),
      region: z.string().nullable(),
    })
    .nullable(),
});
export type ShopDirectoryPage = z.infer<typeof shopDirectoryPageSchema>;

export const shopAnswerSchema = z.object({ shop: publicShopSchema });
export const ownShopAnswerSchema = z.object({ shop: ownShopSchema });
export type ShopAnswer = z.infer<typeof shopAnswerSchema>;
export type OwnShopAnswer = z.infer<typeof ownShopAnswerSchema>;
