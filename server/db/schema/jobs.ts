import { sql } from 'drizzle-orm';
import { check, date, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { mustReference, placeColumns, stampedNow, timestamps, uuidPrimaryKey } from './columns';
import type { PostalAddress } from '../../../shared/schemas/shipping';
import { shops } from './shops';
import { users } from './users-and-sessions';

// Jobs as builders post them, their photos, and the bids shops make on them.

export const jobStatus = pgEnum('job_status', [
  'draft',
  'open',
  'awarded',
  'funded',
  'in_work',
  'inspection_submitted',
  'completed',
  'disputed',
  'resolved',
  'cancelled',
]);

export const bidStatus = pgEnum('bid_status', ['active', 'withdrawn', 'accepted', 'declined']);

/**
 * A machining job. Columns the board filters and sorts on are real columns;
 * the full specification as the builder entered it is kept in `spec`.
 */
export const jobs = pgTable(
  'jobs',
  {
    id: uuidPrimaryKey(),
    builderId: mustReference(() => users.id),
    status: jobStatus().notNull().default('draft'),
    title: text().notNull(),
    engineFamily: text().notNull(),
    cylinders: integer().notNull(),
    /** Null when the job sends neither a block nor heads (a crank grind, a balance). */
    blockMaterial: text(),
    operations: text().array().notNull(),
    logistics: text().notNull(),
    country: text().notNull(),
    region: text().notNull(),
    city: text().notNull(),
    /** The pick-up or drop-off place of the parts. */
    ...placeColumns(),
    neededBy: date({ mode: 'string' }).notNull(),
    spec: jsonb().notNull(),
    /** Bids received and not withdrawn (declined ones still count). */
    bidCount: integer().notNull().default(0),
    awardedBidId: uuid(),
    /** Goes up with every edit, so a bid can say which version of the job it answered. */
    revision: integer().notNull().default(1),
    /** The platform's fee in basis points, fixed when a bid is accepted. */
    feeBps: integer(),
    publishedAt: timestamp({ withTimezone: true }),
    cancelledAt: timestamp({ withTimezone: true }),
    /** Where the shop sends a `ship` job's parts back; the builder gives it once the job is paid for. */
    returnAddress: jsonb().$type<PostalAddress>(),
    ...timestamps,
  },
  (t) => [
    index('jobs_builder_idx').on(t.builderId, t.createdAt),
    index('jobs_open_published_idx').on(t.publishedAt.desc().nullsFirst(), t.id.desc().nullsFirst()).where(sql`${t.status} = 'open'`),
    index('jobs_open_needed_idx').on(t.neededBy, t.id).where(sql`${t.status} = 'open'`),
    index('jobs_open_bids_idx').on(t.bidCount, t.publishedAt.desc().nullsFirst(), t.id.desc().nullsFirst()).where(sql`${t.status} = 'open'`),
    index('jobs_open_spec_idx').on(t.blockMaterial, t.cylinders, t.country, t.region).where(sql`${t.status} = 'open'`),
    index('jobs_operations_idx').using('gin', t.operations),
    // "Within N miles of my shop": earth_box(...) @> ll_to_earth(latitude, longitude) reads this (cube and earthdistance extensions).
    index('jobs_open_earth_idx').using('gist', sql`ll_to_earth(${t.latitude}, ${t.longitude})`).where(sql`${t.status} = 'open'`),
    // The region fallback of the same filter, for open jobs whose postal code gave no place.
    index('jobs_open_unplaced_region_idx').on(sql`lower(${t.country})`, sql`lower(${t.region})`).where(sql`${t.status} = 'open' AND ${t.latitude} IS NULL`),
    // A builder's awarded jobs, for their standing (server/modules/standing), without reading every job they posted.
    index('jobs_builder_awarded_idx').on(t.builderId).where(sql`${t.awardedBidId} IS NOT NULL`),
    check('jobs_cylinders_check', sql`${t.cylinders} BETWEEN 1 AND 16`),
    check('jobs_bid_count_check', sql`${t.bidCount} >= 0`),
  ],
);

/** The job a row belongs to, deleted with it (photos, bids, threads, the work record, money, disputes, reviews). */
export const jobIdColumn = () => mustReference(() => jobs.id, { onDelete: 'cascade' });

/** An uploaded photo's file, the same in the job, message and milestone photo tables: who sent it, where it is kept, its size. */
export const photoFileColumns = () => ({
  uploadedBy: mustReference(() => users.id),
  storageKey: text().notNull(),
  width: integer().notNull(),
  height: integer().notNull(),
  bytes: integer().notNull(),
});

export const jobPhotos = pgTable(
  'job_photos',
  {
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
    ...photoFileColumns(),
    position: integer().notNull(),
    createdAt: stampedNow(),
  },
  (t) => [index('job_photos_job_idx').on(t.jobId, t.position)],
);

export const bids = pgTable(
  'bids',
  {
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
    shopId: mustReference(() => shops.id),
    status: bidStatus().notNull().default('active'),
    version: integer().notNull().default(1),
    totalCents: integer().notNull(),
    turnaroundDays: integer().notNull(),
    validUntil: date({ mode: 'string' }).notNull(),
    note: text().notNull().default(''),
    /** The job revision this bid last answered. */
    jobRevision: integer().notNull(),
    decidedAt: timestamp({ withTimezone: true }),
    declineReason: text(),
    ...timestamps,
  },
  (t) => [
    index('bids_job_idx').on(t.jobId, t.status),
    index('bids_shop_idx').on(t.shopId, t.createdAt),
    uniqueIndex('bids_one_active_per_shop_idx').on(t.jobId, t.shopId).where(sql`${t.status} = 'active'`),
    // Exactly one bid can ever be accepted on a job, whatever races happen above.
    uniqueIndex('bids_one_accepted_per_job_idx').on(t.jobId).where(sql`${t.status} = 'accepted'`),
    // A shop's won jobs, latest first, for its standing (server/modules/standing).
    index('bids_accepted_shop_idx').on(t.shopId, t.decidedAt).where(sql`${t.status} = 'accepted'`),
    check('bids_total_check', sql`${t.totalCents} >= 0`),
  ],
);

export const bidLineItems = pgTable(
  'bid_line_items',
  {
    id: uuidPrimaryKey(),
    bidId: mustReference(() => bids.id, { onDelete: 'cascade' }),
    position: integer().notNull(),
    operation: text(),
    description: text().notNull(),
    quantity: integer().notNull(),
    unitPriceCents: integer().notNull(),
    amountCents: integer().notNull(),
  },
  (t) => [
    index('bid_line_items_bid_idx').on(t.bidId, t.position),
    check('bid_line_items_amount_check', sql`${t.amountCents} = ${t.quantity} * ${t.unitPriceCents}`),
  ],
);

/** Earlier versions of a bid, kept when the shop revises it. */
export const bidRevisions = pgTable(
  'bid_revisions',
  {
    id: uuidPrimaryKey(),
    bidId: mustReference(() => bids.id, { onDelete: 'cascade' }),
    version: integer().notNull(),
    totalCents: integer().notNull(),
    turnaroundDays: integer().notNull(),
    validUntil: date({ mode: 'string' }).notNull(),
    note: text().notNull(),
    lineItems: jsonb().notNull(),
    createdAt: stampedNow(),
  },
  (t) => [uniqueIndex('bid_revisions_version_idx').on(t.bidId, t.version)],
);
