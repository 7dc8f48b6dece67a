import { z } from 'zod';
import { centsSchema, isoDateSchema, operationCodeSchema } from './common';

export const bidStatuses = ['active', 'withdrawn', 'accepted', 'declined'] as const;
export type BidStatus = (typeof bidStatuses)[number];

export const bidLineItemSchema = z.object({
  operation: operationCodeSchema.optional(),
  description: z.string({ error: 'Describe the line.' }).trim().min(1, 'Describe the line.').max(200, 'Use at most 200 characters.'),
  quantity: z.number({ error: 'Enter a quantity.' }).int('Use a whole number.').min(1, 'At least one.').max(1000, 'At most 1,000.'),
  unitPriceCents: centsSchema('Unit price'),
});

/** A bid as the shop sends it. The total is never sent: the server adds up the lines in cents. */
export const bidInputSchema = z.object({
  lineItems: z.array(bidLineItemSchema, { error: 'Add the lines of your price.' }).min(1, 'Add at least one line.').max(40, 'At most 40 lines.'),
  turnaroundDays: z.number({ error: 'Enter the turnaround in working days.' }).int('Use whole working days.').min(1, 'At least one working day.').max(365, 'At most 365 working days.'),
  validUntil: isoDateSchema('Valid until'),
  note: z.string().trim().max(2000, 'Use at most 2,000 characters.').default(''),
});
export type BidInput = z.infer<typeof bidInputSchema>;
export type BidFormValues = z.input<typeof bidInputSchema>;

export const declineBidSchema = z.object({
  reason: z.string().trim().max(500, 'Use at most 500 characters.').default(''),
});

export interface BidLine {
  operation: string | null;
  description: string;
  quantity: number;
  unitPriceCents: number;
  amountCents: number;
}

export interface Bid {
  id: string;
  jobId: string;
  status: BidStatus;
  version: number;
  totalCents: number;
  turnaroundDays: number;
  validUntil: string;
  note: string;
  lineItems: BidLine[];
  shop: { id: string; name: string; country: string; region: string; city: string; verified: boolean; rating: { average: number; count: number } | null };
  /** Share of the job's operations the shop lists as capabilities, 0 to 1. */
  capabilityMatch: number;
  createdAt: string;
  updatedAt: string;
}

export interface BidRevision {
  version: number;
  totalCents: number;
  turnaroundDays: number;
  validUntil: string;
  note: string;
  lineItems: BidLine[];
  createdAt: string;
}
