import { z } from 'zod';
import { centsSchema } from './common';
import { moneyViewSchema, type ChangeOrder, type LedgerEntryKind, type MoneyView } from './payments';
import type { InspectionResults } from './inspection';

/**
 * Why a dispute is opened. The builder disputes instead of accepting an
 * inspection record; the shop disputes when the builder has gone silent past
 * the agreed date, or over a change order.
 */
export const builderDisputeReasons = ['record_outside_limits', 'work_not_as_agreed', 'parts_damaged_or_missing', 'other'] as const;
export const shopDisputeReasons = ['builder_silent', 'change_order'] as const;
export const disputeReasons = [...builderDisputeReasons, ...shopDisputeReasons] as const;
export type DisputeReason = (typeof disputeReasons)[number];

export const disputeReasonWords: Record<DisputeReason, string> = {
  record_outside_limits: 'The inspection record shows sizes outside the agreed limits',
  work_not_as_agreed: 'The work done is not what was agreed',
  parts_damaged_or_missing: 'Parts came back damaged or missing',
  other: 'Something else (explain below)',
  builder_silent: 'The builder has not answered past the agreed date',
  change_order: 'A change order is not being paid or answered',
};

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
export const disputeQueueRowSchema = z.object({
  id: z.uuid(),
  jobId: z.uuid(),
  jobTitle: z.string(),
  builderName: z.string(),
  shopName: z.string(),
  openedBy: sideSchema,
  reason: z.enum(disputeReasons),
  status: z.enum(['open', 'resolved']),
  openedAt: z.iso.datetime(),
  /** Paid in and not yet paid out or refunded, in cents. */
  heldCents: z.number().int(),
  answered: z.boolean(),
});
export type DisputeQueueRow = z.infer<typeof disputeQueueRowSchema>;

export const disputeQueueAnswerSchema = z.object({ disputes: z.array(disputeQueueRowSchema) });

/** What an administrator's decision answers: the resolved dispute and the job's money after it. */
export const disputeDecisionSchema = z.object({ dispute: disputeSchema, money: moneyViewSchema });
export type DisputeDecision = z.infer<typeof disputeDecisionSchema>;

export type EvidenceItem =
  | { kind: 'dispute_opened'; at: string; by: 'builder' | 'shop'; reason: DisputeReason; statement: string }
  | { kind: 'dispute_answered'; at: string; by: 'builder' | 'shop'; statement: string }
  | { kind: 'message'; at: string; by: 'builder' | 'shop'; authorName: string; body: string; photos: EvidencePhoto[] }
  | { kind: 'milestone'; at: string; milestone: string; operation: string | null; note: string; carrier: string | null; trackingNumber: string | null; photos: EvidencePhoto[] }
  | { kind: 'inspection'; at: string; version: number; status: string; pass: boolean; results: InspectionResults; decidedAt: string | null; rejectReasons: string | null }
  | { kind: 'change_order'; at: string; description: string; amountCents: number; status: ChangeOrder['status'] }
  | { kind: 'money'; at: string; entry: LedgerEntryKind; amountCents: number; reference: string }
  | { kind: 'job_photo'; at: string; photos: EvidencePhoto[] };

export interface EvidencePhoto {
  id: string;
  width: number;
  height: number;
  thumbUrl: string;
  largeUrl: string;
}

export interface DisputeCase {
  dispute: Dispute;
  job: { id: string; title: string; status: string; engineFamily: string; cylinders: number; acceptedTotalCents: number | null; feeBps: number | null };
  builder: { id: string; name: string; email: string };
  shop: { id: string; userId: string; name: string; email: string } | null;
  money: MoneyView;
  /** Everything that happened on the job, oldest first. */
  timeline: EvidenceItem[];
}
