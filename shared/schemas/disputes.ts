import { z } from 'zod';
import { centsSchema } from './common';
import { inspectionVersionSchema } from './inspection';
import { messageSchema } from './messages';
import { milestoneSchema } from './milestones';
import { changeOrderSchema, ledgerEntryKindSchema, moneyViewSchema } from './payments';
import { storedPhotoSchema } from './photos';
import { disputeReasons } from './values';

export { builderDisputeReasons, disputeReasonWords, disputeReasons, shopDisputeReasons, type DisputeReason } from './values';

/** Days the builder must have been silent before the shop may open a dispute for silence. */
export const BUILDER_SILENCE_DAYS = 3;

const statementSchema = (what: string) =>
  z
    .string({ error: `Write ${what}.` })
    .trim()
    .min(20, `Write ${what} in at least 20 characters.`)
    .max(4000, 'Use at most 4,000 characters.');

export const openDisputeSchema = z.object({
  reason: z.enum(disputeReasons, { error: 'Choose a reason from the list.' }),
  statement: statementSchema('what went wrong'),
});
export type OpenDisputeInput = z.infer<typeof openDisputeSchema>;

export const disputeResponseSchema = z.object({ statement: statementSchema('your side') });
export type DisputeResponseInput = z.infer<typeof disputeResponseSchema>;

export const disputeOutcomes = ['release', 'refund', 'split'] as const;
export type DisputeOutcome = (typeof disputeOutcomes)[number];

export const resolveDisputeSchema = z
  .object({
    outcome: z.enum(disputeOutcomes, { error: 'Choose release, refund or split.' }),
    /** The shop's share of what is held, for a split only. */
    shopCents: centsSchema('The shop’s share').optional(),
    decision: z.string({ error: 'Write the decision.' }).trim().min(20, 'Write the decision in at least 20 characters.').max(8000, 'Use at most 8,000 characters.'),
  })
  .refine((v) => v.outcome !== 'split' || v.shopCents !== undefined, { path: ['shopCents'], message: 'Give the shop’s share for a split.' });
export type ResolveDisputeInput = z.infer<typeof resolveDisputeSchema>;

export const disputeQueueSchema = z.object({
  status: z.enum(['open', 'resolved', 'all'], { error: 'Choose open, resolved or all.' }).default('open'),
});

const sideSchema = z.enum(['builder', 'shop']);

/** A dispute as both sides and administrators see it. */
export const disputeSchema = z.object({
  id: z.uuid(),
  jobId: z.uuid(),
  status: z.enum(['open', 'resolved']),
  openedBy: sideSchema,
  reason: z.enum(disputeReasons),
  statement: z.string(),
  openedAt: z.iso.datetime(),
  response: z.object({ by: sideSchema, statement: z.string(), at: z.iso.datetime() }).nullable(),
  resolution: z
    .object({ outcome: z.enum(disputeOutcomes), shopCents: z.number().int(), refundCents: z.number().int(), decision: z.string(), at: z.iso.datetime() })
    .nullable(),
});
export type Dispute = z.infer<typeof disputeSchema>;

export const disputeAnswerSchema = z.object({ dispute: disputeSchema });
export type DisputeAnswer = z.infer<typeof disputeAnswerSchema>;

/** What a party sees on the job page: the dispute (if any) and what they may do. */
export const disputeViewSchema = z.object({
  dispute: disputeSchema.nullable(),
  /** Reasons the viewer may open a dispute with now; empty when they may not. */
  canOpenWith: z.array(z.enum(disputeReasons)),
  canRespond: z.boolean(),
});
export type DisputeView = z.infer<typeof disputeViewSchema>;

/** A line of the administrators' dispute queue. */
export const disputeQueueRowSchema = disputeSchema.pick({ id: true, jobId: true, openedBy: true, reason: true, status: true, openedAt: true }).extend({
  jobTitle: z.string(),
  builderName: z.string(),
  shopName: z.string(),
  /** Paid in and not yet paid out or refunded, in cents. */
  heldCents: z.number().int(),
  answered: z.boolean(),
});
export type DisputeQueueRow = z.infer<typeof disputeQueueRowSchema>;

export const disputeQueueAnswerSchema = z.object({ disputes: z.array(disputeQueueRowSchema) });
export type DisputeQueueAnswer = z.infer<typeof disputeQueueAnswerSchema>;

/** What an administrator's decision answers: the resolved dispute and the job's money after it. */
export const disputeDecisionSchema = z.object({ dispute: disputeSchema, money: moneyViewSchema });
export type DisputeDecision = z.infer<typeof disputeDecisionSchema>;

// --- the evidence an administrator decides on -----------------------------------
//
// Each item is a thing another domain owns (a message, a milestone, an
// inspection version, a change order, a ledger entry, photos), taken from that
// domain's answer schema and stamped with its kind and moment.

const happened = <K extends string>(kind: K) => ({ kind: z.literal(kind), at: z.iso.datetime() });

/** One thing that happened on a disputed job, by its kind. */
export const evidenceItemSchema = z.discriminatedUnion('kind', [
  z.object({ ...happened('dispute_opened'), by: sideSchema, reason: z.enum(disputeReasons), statement: z.string() }),
  z.object({ ...happened('dispute_answered'), by: sideSchema, statement: z.string() }),
  /** A message between the builder and the shop doing the work. */
  messageSchema.pick({ body: true, photos: true }).extend({ ...happened('message'), by: sideSchema, authorName: z.string() }),
  /** A progress entry of the shop's; `milestone` is its kind. */
  milestoneSchema
    .pick({ operation: true, note: true, carrier: true, trackingNumber: true, photos: true })
    .extend({ ...happened('milestone'), milestone: milestoneSchema.shape.kind }),
  /** One inspection record version, without its input; `pass` is its results' `pass`. */
  inspectionVersionSchema
    .pick({ version: true, status: true, results: true, decidedAt: true, rejectReasons: true })
    .extend({ ...happened('inspection'), pass: z.boolean() }),
  /** Extra work proposed. */
  changeOrderSchema.pick({ description: true, amountCents: true, status: true }).extend(happened('change_order')),
  /** A ledger entry on the job. */
  z.object({ ...happened('money'), entry: ledgerEntryKindSchema, amountCents: z.number().int(), reference: z.string() }),
  z.object({ ...happened('job_photo'), photos: z.array(storedPhotoSchema) }),
]);
export type EvidenceItem = z.infer<typeof evidenceItemSchema>;

/** A dispute with everything that happened on its job, for the administrator who decides it. */
export const disputeCaseSchema = z.object({
  dispute: disputeSchema,
  job: z.object({
    id: z.uuid(),
    title: z.string(),
    status: z.string(),
    engineFamily: z.string(),
    cylinders: z.number().int(),
    acceptedTotalCents: z.number().int().nullable(),
    feeBps: z.number().int().nullable(),
  }),
  builder: z.object({ id: z.uuid(), name: z.string(), email: z.string() }),
  shop: z.object({ id: z.uuid(), userId: z.uuid(), name: z.string(), email: z.string() }).nullable(),
  money: moneyViewSchema,
  /** Everything that happened on the job, oldest first. */
  timeline: z.array(evidenceItemSchema),
});
export type DisputeCase = z.infer<typeof disputeCaseSchema>;
