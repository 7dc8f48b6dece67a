import { z } from 'zod';
import { STANDING_MIN_COUNT } from '../standing';

// A shop's and a builder's standing, worked out from what happened on Tenthmark (never typed in).
// Each figure carries its count; a figure whose count is below STANDING_MIN_COUNT is null, and the
// screen says there is not enough history yet instead of a figure.

export { STANDING_MIN_COUNT };

/** `count` of `of` (e.g. 9 records accepted first time of 10 decided), and the share count/of, 0 to 1. */
export const standingShareSchema = z.object({
  count: z.number().int().nonnegative(),
  of: z.number().int().positive(),
  share: z.number().min(0).max(1),
});
export type StandingShare = z.infer<typeof standingShareSchema>;

/** Disputes opened over the shop's jobs, beside the jobs it completed, and how they ended. */
export const standingDisputesSchema = z.object({
  opened: z.number().int().nonnegative(),
  /** Jobs completed (record accepted) or whose dispute was decided: the count the minimum applies to. */
  completed: z.number().int().positive(),
  outcomes: z.object({
    release: z.number().int().nonnegative(),
    refund: z.number().int().nonnegative(),
    split: z.number().int().nonnegative(),
    /** Not decided yet. */
    open: z.number().int().nonnegative(),
  }),
});
export type StandingDisputes = z.infer<typeof standingDisputesSchema>;

/** The median of `of` answers, in whole minutes; `waiting` builder messages have no answer yet and are not in it. */
export const standingMedianSchema = z.object({
  minutes: z.number().int().nonnegative(),
  of: z.number().int().positive(),
  waiting: z.number().int().nonnegative(),
});
export type StandingMedian = z.infer<typeof standingMedianSchema>;

/** A shop's standing: each figure null while its count is below STANDING_MIN_COUNT. */
export const shopStandingSchema = z.object({
  /** Inspection records accepted at version 1, of jobs whose first record was decided (or disputed). */
  firstTimeAcceptance: standingShareSchema.nullable(),
  /** Jobs ready or shipped by the due day (the bid's working days from the parts' arrival, or the award), of jobs finished or past due. */
  onTime: standingShareSchema.nullable(),
  disputes: standingDisputesSchema.nullable(),
  /** Time from a builder's message to the shop's next message in that conversation. */
  answerTime: standingMedianSchema.nullable(),
});
export type ShopStanding = z.infer<typeof shopStandingSchema>;

/** A builder's standing, as shops see it before bidding. */
export const builderStandingSchema = z.object({
  /** Awards paid for within PAY_WITHIN_DAYS of the award, of awards paid or left unpaid that long. */
  paysOnTime: standingShareSchema.nullable(),
  /** Inspection records accepted, sent back or disputed by the builder within the review window, of records decided or whose window ended. */
  answersRecords: standingShareSchema.nullable(),
});
export type BuilderStanding = z.infer<typeof builderStandingSchema>;
