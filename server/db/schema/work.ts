import { sql } from 'drizzle-orm';
import { boolean, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { mustReference, stampedNow, uuidPrimaryKey } from './columns';
import { jobIdColumn, jobs, photoFileColumns } from './jobs';
import { users } from './users-and-sessions';

// The shop's proof of work: progress milestones and their photos, inspection record versions and drafts.

export const milestoneKind = pgEnum('milestone_kind', [
  'block_received',
  'teardown',
  'operation_started',
  'operation_finished',
  'inspection_submitted',
  'ready_for_pickup',
  'shipped',
  'delivered',
  'note',
  /** Logged by the builder: the parts left for the shop. */
  'sent_to_shop',
]);

export const inspectionStatus = pgEnum('inspection_status', ['submitted', 'accepted', 'rejected']);

export const milestones = pgTable(
  'milestones',
  {
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
    authorId: mustReference(() => users.id),
    kind: milestoneKind().notNull(),
    operation: text(),
    note: text().notNull().default(''),
    carrier: text(),
    trackingNumber: text(),
    createdAt: stampedNow(),
  },
  (t) => [index('milestones_job_idx').on(t.jobId, t.createdAt)],
);

/**
 * Photos on the shop's progress log. Uploaded first (milestoneId null, seen
 * only by the uploader), then attached when the milestone is logged.
 */
export const milestonePhotos = pgTable(
  'milestone_photos',
  {
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
    /** Null until the photo goes out with a milestone. */
    milestoneId: uuid().references(() => milestones.id, { onDelete: 'cascade' }),
    ...photoFileColumns(),
    /** Its place among the milestone's photos, set when attached. */
    position: integer(),
    createdAt: stampedNow(),
  },
  (t) => [
    index('milestone_photos_milestone_idx').on(t.milestoneId, t.position),
    index('milestone_photos_unattached_idx').on(t.jobId, t.uploadedBy).where(sql`${t.milestoneId} IS NULL`),
  ],
);

/** Each submission is a new version; raw readings and the server's own results are both kept. */
export const inspectionRecords = pgTable(
  'inspection_records',
  {
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
    version: integer().notNull(),
    status: inspectionStatus().notNull().default('submitted'),
    input: jsonb().notNull(),
    results: jsonb().notNull(),
    pass: boolean().notNull(),
    submittedBy: mustReference(() => users.id),
    submittedAt: stampedNow(),
    reviewDueAt: timestamp({ withTimezone: true }).notNull(),
    decidedAt: timestamp({ withTimezone: true }),
    decidedBy: uuid().references(() => users.id),
    /** Who or what decided: the builder, or the review window running out. */
    decidedHow: text(),
    rejectReasons: text(),
  },
  (t) => [uniqueIndex('inspection_records_version_idx').on(t.jobId, t.version)],
);

export const inspectionDrafts = pgTable('inspection_drafts', {
  jobId: uuid()
    .primaryKey()
    .references(() => jobs.id, { onDelete: 'cascade' }),
  draft: jsonb().notNull(),
  savedAt: stampedNow(),
});
