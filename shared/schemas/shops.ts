import { z } from 'zod';
import { centsSchema, operationCodeSchema, queryInt, regionSchema } from './common';

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
  page: queryInt('Page', 1, 10_000).default(1),
  pageSize: queryInt('Page size', 1, 100).default(20),
});
export type ShopDirectoryQuery = z.infer<typeof shopDirectoryQuerySchema>;

/** A shop as anyone may see it. */
export interface PublicShop {
  id: string;
  name: string;
  country: string;
  region: string;
  city: string;
  takesShipped: boolean;
  capabilities: string[];
  equipmentNotes: string;
  turnaroundDays: number;
  rateCard: Array<{ operation: string; priceCents: number }>;
  verified: boolean;
  rating: { average: number; count: number } | null;
}
