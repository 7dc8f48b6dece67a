// Plain values the schemas check against (lists, limits and their words), kept free of zod so that a page
// can show them without loading zod (about 25 KB gzipped) with its first load. Each schema module re-exports
// its own, so the server and the tests import them from there as before.

export const MAX_MESSAGE_LENGTH = 4000;

export const MAX_PHOTOS_PER_MESSAGE = 4;

export const jobStatuses = ['draft', 'open', 'awarded', 'funded', 'in_work', 'inspection_submitted', 'completed', 'disputed', 'resolved', 'cancelled'] as const;
export type JobStatus = (typeof jobStatuses)[number];

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
  change_order: 'Extra work is not being paid or answered',
};

/** The kinds of ledger entry: money paid in, released to the shop, the platform's fee, refunded to the builder. */
export const ledgerKinds = ['paid_in', 'released', 'fee', 'refunded'] as const;
