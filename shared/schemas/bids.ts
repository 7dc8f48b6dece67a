import { z } from 'zod';
import { centsSchema, isoDateSchema, operationCodeSchema, uuidSchema } from './common';
import { publicShopSchema } from './shops';
import { jobStatuses } from './jobs';
import { distanceUnits } from '../distance';

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

/** The path parameter of every route about one bid: /api/bids/:bidId/... */
export const bidParamsSchema = z.object({ bidId: uuidSchema });

export const declineBidSchema = z.object({
  reason: z.string().trim().max(500, 'Use at most 500 characters.').default(''),
});

// ---------------------------------------------------------------------------
// Answers: what the API sends about bids. Other modules' answers that carry a
// bid or its lines reuse these.

/** A line of a bid, with its amount worked out by the server. */
export const bidLineSchema = z.object({
  operation: z.string().nullable(),
  description: z.string(),
  quantity: z.number().int(),
  unitPriceCents: z.number().int(),
  amountCents: z.number().int(),
});
export type BidLine = z.infer<typeof bidLineSchema>;

/** A bid as its job's builder, its shop and admins see it. */
export const bidSchema = z.object({
  id: z.uuid(),
  jobId: z.uuid(),
  status: z.enum(bidStatuses),
  version: z.number().int(),
  totalCents: z.number().int(),
  turnaroundDays: z.number().int(),
  validUntil: z.iso.date(),
  note: z.string(),
  lineItems: z.array(bidLineSchema),
  /** The bidding shop as its public page shows it. */
  shop: publicShopSchema.pick({ id: true, name: true, country: true, region: true, city: true, verified: true, rating: true, standing: true }),
  /** Share of the job's operations the shop lists as capabilities, 0 to 1. */
  capabilityMatch: z.number().min(0).max(1),
  /** From the shop to the job's place, in the unit of the job's country; null when either postal code gave no place. */
  distance: z.object({ value: z.number(), unit: z.enum(distanceUnits) }).nullable(),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
});
export type Bid = z.infer<typeof bidSchema>;

/** An earlier version of a bid, kept when the shop revised it. */
export const bidRevisionSchema = bidSchema.pick({ version: true, totalCents: true, turnaroundDays: true, validUntil: true, note: true, lineItems: true, createdAt: true });
export type BidRevision = z.infer<typeof bidRevisionSchema>;

/** A bid with its earlier versions, newest first: the answer to reading or changing one bid. */
export const bidWithHistorySchema = z.object({ bid: bidSchema, revisions: z.array(bidRevisionSchema) });
export type BidWithHistory = z.infer<typeof bidWithHistorySchema>;

/**
 * A bid in its shop's own list, with the title and status of the job it is
 * for, what Tenthmark's fee takes from its total and what the shop keeps (at
 * the rate fixed on the job once accepted, the current rate before), and for
 * an accepted bid the day it is due: the day the parts arrived (or the award,
 * before they do) plus the turnaround.
 */
export const shopBidSchema = bidSchema.extend({
  jobTitle: z.string(),
  jobStatus: z.string(),
  feeBps: z.number().int(),
  feeCents: z.number().int(),
  netCents: z.number().int(),
  dueOn: z.iso.date().nullable(),
});
export type ShopBid = z.infer<typeof shopBidSchema>;

export const bidListAnswerSchema = z.object({ bids: z.array(bidSchema) });
export const shopBidListAnswerSchema = z.object({ bids: z.array(shopBidSchema) });
export type BidListAnswer = z.infer<typeof bidListAnswerSchema>;
export type ShopBidListAnswer = z.infer<typeof shopBidListAnswerSchema>;

/**
 * Where a won job stands in its shop's work queue: waiting for the builder's
 * payment, paid and waiting for the parts, in the shop, the builder asked for
 * changes to the record, the record waiting for the builder, the parts
 * shipped back or ready to be picked up.
 */
export const queueStages = ['payment_due', 'waiting_for_parts', 'in_shop', 'changes_asked', 'record_submitted', 'shipped_back', 'ready_for_pickup'] as const;
export type QueueStage = (typeof queueStages)[number];

/**
 * A job the shop won and has not finished, with the day it is due (as in My
 * bids: the parts' arrival, or the award before they arrive, plus the
 * turnaround) and the whole days from today (UTC) to it, negative once overdue.
 */
export const queueJobSchema = z.object({
  jobId: z.uuid(),
  title: z.string(),
  status: z.enum(jobStatuses),
  stage: z.enum(queueStages),
  dueOn: z.iso.date(),
  daysLeft: z.number().int(),
  turnaroundDays: z.number().int(),
  builderName: z.string(),
});
export type QueueJob = z.infer<typeof queueJobSchema>;

/** The signed-in shop's work queue, soonest due first. */
export const workQueueAnswerSchema = z.object({ jobs: z.array(queueJobSchema) });
export type WorkQueueAnswer = z.infer<typeof workQueueAnswerSchema>;

/** The platform's fee rate now, in basis points: what a bid accepted today pays (a shop sees it while pricing). */
export const feeRateSchema = z.object({ feeBps: z.number().int() });
export type FeeRate = z.infer<typeof feeRateSchema>;
