import { sql } from 'drizzle-orm';
import { check, index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { mustReference, stampedNow, uuidPrimaryKey } from './columns';
import { jobIdColumn } from './jobs';
import { users } from './users-and-sessions';

// Disputes over a job and the reviews the two sides leave each other.

export const disputeStatus = pgEnum('dispute_status', ['open', 'resolved']);
export const disputeOutcome = pgEnum('dispute_outcome', ['release', 'refund', 'split']);
export const partySide = pgEnum('party_side', ['builder', 'shop']);

export const disputes = pgTable(
  'disputes',
  {
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
    status: disputeStatus().notNull().default('open'),
    openedBy: mustReference(() => users.id),
    openedSide: partySide().notNull(),
    reason: text().notNull(),
    statement: text().notNull(),
    /** The job's status when the dispute was opened. */
    jobStatusBefore: text().notNull(),
    responseBy: uuid().references(() => users.id),
    response: text(),
    respondedAt: timestamp({ withTimezone: true }),
    outcome: disputeOutcome(),
    /** What the decision gave the shop (before the platform fee) and the builder, in cents. */
    shopCents: integer(),
    refundCents: integer(),
    decision: text(),
    resolvedBy: uuid().references(() => users.id),
    resolvedAt: timestamp({ withTimezone: true }),
    openedAt: stampedNow(),
  },
  (t) => [
    // One dispute at a time per job.
    uniqueIndex('disputes_one_open_per_job_idx').on(t.jobId).where(sql`${t.status} = 'open'`),
    index('disputes_queue_idx').on(t.status, t.openedAt),
    // A job's disputes, closed ones too, for the shop's and the builder's standing.
    index('disputes_job_idx').on(t.jobId),
    check('disputes_amounts_check', sql`coalesce(${t.shopCents}, 0) >= 0 AND coalesce(${t.refundCents}, 0) >= 0`),
  ],
);

/** One review per person per job: the builder rates the shop, the shop rates the builder. */
export const reviews = pgTable(
  'reviews',
  {
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
    authorId: mustReference(() => users.id),
    authorSide: partySide().notNull(),
    /** The user the review is about (for a shop, the shop's account). */
    subjectId: mustReference(() => users.id),
    rating: integer().notNull(),
    comment: text().notNull(),
    createdAt: stampedNow(),
  },
  (t) => [
    uniqueIndex('reviews_job_author_idx').on(t.jobId, t.authorId),
    index('reviews_subject_idx').on(t.subjectId),
    check('reviews_rating_check', sql`${t.rating} BETWEEN 1 AND 5`),
  ],
);
