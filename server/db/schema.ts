import { sql } from 'drizzle-orm';
import {
  bigserial,
  boolean,
  customType,
  check,
  date,
  index,
  integer,
  json,
  jsonb,
  primaryKey,
  pgEnum,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
  varchar,
} from 'drizzle-orm/pg-core';

const customBytea = customType<{ data: Buffer }>({ dataType: () => 'bytea' });

export const userRole = pgEnum('user_role', ['builder', 'shop', 'admin']);
export const userStatus = pgEnum('user_status', ['active', 'suspended']);
export const tokenPurpose = pgEnum('token_purpose', ['verify_email', 'reset_password']);
export const mailStatus = pgEnum('mail_status', ['pending', 'sent', 'failed']);

const timestamps = {
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
};

export const users = pgTable(
  'users',
  {
    id: uuid().primaryKey().defaultRandom(),
    email: text().notNull(),
    displayName: text().notNull(),
    role: userRole().notNull(),
    status: userStatus().notNull().default('active'),
    passwordHash: text(),
    githubId: text(),
    emailVerifiedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('users_email_lower_idx').on(sql`lower(${t.email})`),
    uniqueIndex('users_github_id_idx').on(t.githubId),
  ],
);

/** Single-use links sent by e-mail; only a SHA-256 of the token is stored. */
export const userTokens = pgTable(
  'user_tokens',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    purpose: tokenPurpose().notNull(),
    tokenHash: text().notNull(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    usedAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('user_tokens_hash_idx').on(t.tokenHash), index('user_tokens_user_idx').on(t.userId)],
);

/** Outgoing mail, written in the same transaction as the change that causes it. */
export const mailOutbox = pgTable(
  'mail_outbox',
  {
    id: uuid().primaryKey().defaultRandom(),
    toAddress: text().notNull(),
    subject: text().notNull(),
    textBody: text().notNull(),
    htmlBody: text().notNull(),
    template: text().notNull(),
    status: mailStatus().notNull().default('pending'),
    attempts: integer().notNull().default(0),
    nextAttemptAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    lastError: text(),
    sentAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('mail_outbox_due_idx').on(t.nextAttemptAt).where(sql`${t.status} = 'pending'`),
    check('mail_outbox_attempts_check', sql`${t.attempts} >= 0`),
  ],
);

/** express-session store (connect-pg-simple's layout). */
export const sessions = pgTable(
  'sessions',
  {
    sid: varchar().primaryKey(),
    sess: json().notNull(),
    expire: timestamp({ precision: 6 }).notNull(),
  },
  (t) => [index('sessions_expire_idx').on(t.expire)],
);

/** Hit counters for rate limits, shared by every app instance. */
export const rateLimits = pgTable('rate_limits', {
  key: text().primaryKey(),
  hits: integer().notNull(),
  resetAt: timestamp({ withTimezone: true }).notNull(),
});

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

/** A machine shop's public profile; one per shop account. */
export const shops = pgTable(
  'shops',
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    country: text().notNull(),
    region: text().notNull(),
    city: text().notNull(),
    takesShipped: boolean().notNull(),
    capabilities: text().array().notNull(),
    equipmentNotes: text().notNull().default(''),
    turnaroundDays: integer().notNull(),
    notifyMatchingJobs: boolean().notNull().default(false),
    verifiedAt: timestamp({ withTimezone: true }),
    /** The shop's connected account at the payment provider, and when it became able to receive transfers. */
    payoutAccountId: text(),
    payoutsReadyAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('shops_user_idx').on(t.userId),
    index('shops_capabilities_idx').using('gin', t.capabilities),
    index('shops_region_idx').on(t.country, t.region),
  ],
);

/** A shop's price per operation, integer cents. */
export const shopRates = pgTable(
  'shop_rates',
  {
    shopId: uuid()
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    operation: text().notNull(),
    priceCents: integer().notNull(),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.operation] }), check('shop_rates_price_check', sql`${t.priceCents} >= 0`)],
);

/**
 * A machining job. Columns the board filters and sorts on are real columns;
 * the full specification as the builder entered it is kept in `spec`.
 */
export const jobs = pgTable(
  'jobs',
  {
    id: uuid().primaryKey().defaultRandom(),
    builderId: uuid()
      .notNull()
      .references(() => users.id),
    status: jobStatus().notNull().default('draft'),
    title: text().notNull(),
    engineFamily: text().notNull(),
    cylinders: integer().notNull(),
    blockMaterial: text().notNull(),
    operations: text().array().notNull(),
    logistics: text().notNull(),
    country: text().notNull(),
    region: text().notNull(),
    city: text().notNull(),
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
    ...timestamps,
  },
  (t) => [
    index('jobs_builder_idx').on(t.builderId, t.createdAt),
    index('jobs_open_published_idx').on(t.publishedAt.desc().nullsFirst(), t.id.desc().nullsFirst()).where(sql`${t.status} = 'open'`),
    index('jobs_open_needed_idx').on(t.neededBy, t.id).where(sql`${t.status} = 'open'`),
    index('jobs_open_bids_idx').on(t.bidCount, t.publishedAt.desc().nullsFirst(), t.id.desc().nullsFirst()).where(sql`${t.status} = 'open'`),
    index('jobs_open_spec_idx').on(t.blockMaterial, t.cylinders, t.country, t.region).where(sql`${t.status} = 'open'`),
    index('jobs_operations_idx').using('gin', t.operations),
    check('jobs_cylinders_check', sql`${t.cylinders} BETWEEN 1 AND 16`),
    check('jobs_bid_count_check', sql`${t.bidCount} >= 0`),
  ],
);

export const jobPhotos = pgTable(
  'job_photos',
  {
    id: uuid().primaryKey().defaultRandom(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    uploadedBy: uuid()
      .notNull()
      .references(() => users.id),
    storageKey: text().notNull(),
    width: integer().notNull(),
    height: integer().notNull(),
    bytes: integer().notNull(),
    position: integer().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('job_photos_job_idx').on(t.jobId, t.position)],
);

export const bids = pgTable(
  'bids',
  {
    id: uuid().primaryKey().defaultRandom(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    shopId: uuid()
      .notNull()
      .references(() => shops.id),
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
    check('bids_total_check', sql`${t.totalCents} >= 0`),
  ],
);

export const bidLineItems = pgTable(
  'bid_line_items',
  {
    id: uuid().primaryKey().defaultRandom(),
    bidId: uuid()
      .notNull()
      .references(() => bids.id, { onDelete: 'cascade' }),
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
    id: uuid().primaryKey().defaultRandom(),
    bidId: uuid()
      .notNull()
      .references(() => bids.id, { onDelete: 'cascade' }),
    version: integer().notNull(),
    totalCents: integer().notNull(),
    turnaroundDays: integer().notNull(),
    validUntil: date({ mode: 'string' }).notNull(),
    note: text().notNull(),
    lineItems: jsonb().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('bid_revisions_version_idx').on(t.bidId, t.version)],
);

/** One conversation per job and shop, between the job's builder and that shop. */
export const threads = pgTable(
  'threads',
  {
    id: uuid().primaryKey().defaultRandom(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    shopId: uuid()
      .notNull()
      .references(() => shops.id),
    lastMessageAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('threads_job_shop_idx').on(t.jobId, t.shopId), index('threads_shop_idx').on(t.shopId, t.lastMessageAt)],
);

export const messages = pgTable(
  'messages',
  {
    id: uuid().primaryKey().defaultRandom(),
    threadId: uuid()
      .notNull()
      .references(() => threads.id, { onDelete: 'cascade' }),
    authorId: uuid()
      .notNull()
      .references(() => users.id),
    /** The id the sender's browser made up, so a resend after a reconnect is stored once. */
    clientId: text().notNull(),
    body: text().notNull(),
    /** Millisecond precision, like JavaScript dates, so cursors and read marks compare exactly. */
    createdAt: timestamp({ withTimezone: true, precision: 3 }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('messages_author_client_idx').on(t.authorId, t.clientId),
    index('messages_thread_idx').on(t.threadId, t.createdAt.desc(), t.id.desc()),
    // May be empty when the message carries photos; the service checks that it has words or photos.
    check('messages_body_check', sql`char_length(${t.body}) <= 4000`),
  ],
);

/**
 * A photo in a conversation. Uploaded first (no message yet), then attached
 * to the sender's message in the same transaction that stores it.
 */
export const messagePhotos = pgTable(
  'message_photos',
  {
    id: uuid().primaryKey().defaultRandom(),
    threadId: uuid()
      .notNull()
      .references(() => threads.id, { onDelete: 'cascade' }),
    uploadedBy: uuid()
      .notNull()
      .references(() => users.id),
    storageKey: text().notNull(),
    width: integer().notNull(),
    height: integer().notNull(),
    bytes: integer().notNull(),
    /** Null until the photo goes out with a message. */
    messageId: uuid().references(() => messages.id, { onDelete: 'cascade' }),
    /** Its place among the message's photos, set when attached. */
    position: integer(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('message_photos_message_idx').on(t.messageId, t.position),
    index('message_photos_unsent_idx').on(t.threadId, t.uploadedBy).where(sql`${t.messageId} IS NULL`),
  ],
);

/** Where each person has read up to in a thread, and up to where they were sent a digest. */
export const threadReads = pgTable(
  'thread_reads',
  {
    threadId: uuid()
      .notNull()
      .references(() => threads.id, { onDelete: 'cascade' }),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    lastReadAt: timestamp({ withTimezone: true }),
    lastReadMessageId: uuid(),
    digestedThrough: timestamp({ withTimezone: true }),
  },
  (t) => [primaryKey({ columns: [t.threadId, t.userId] })],
);

/** Payloads the socket.io PostgreSQL adapter cannot fit in a NOTIFY (over 8 kB, or binary). */
export const socketIoAttachments = pgTable('socket_io_attachments', {
  id: bigserial({ mode: 'number' }).unique(),
  createdAt: timestamp({ withTimezone: true }).defaultNow(),
  payload: customBytea(),
});

export const paymentKind = pgEnum('payment_kind', ['bid', 'change_order']);
/** refunded: money that arrived when the job could no longer take it (cancelled, already paid, change order declined) and was sent back. */
export const paymentStatus = pgEnum('payment_status', ['pending', 'paid', 'failed', 'expired', 'refunded']);
export const changeOrderStatus = pgEnum('change_order_status', ['proposed', 'approved', 'paid', 'declined']);
export const ledgerKind = pgEnum('ledger_kind', ['paid_in', 'released', 'fee', 'refunded']);
/** late_refund: sends back a payment that arrived after the job stopped waiting for it; it is not part of the job's own decision. */
export const moneyMoveKind = pgEnum('money_move_kind', ['release', 'refund', 'late_refund']);
export const moneyMoveStatus = pgEnum('money_move_status', ['pending', 'done']);

/** Extra work found on teardown, priced by the shop and paid by the builder through a second checkout. */
export const changeOrders = pgTable(
  'change_orders',
  {
    id: uuid().primaryKey().defaultRandom(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    shopId: uuid()
      .notNull()
      .references(() => shops.id),
    description: text().notNull(),
    amountCents: integer().notNull(),
    status: changeOrderStatus().notNull().default('proposed'),
    decidedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [index('change_orders_job_idx').on(t.jobId), check('change_orders_amount_check', sql`${t.amountCents} > 0`)],
);

/** One Checkout Session: the bid total, or a change order. */
export const payments = pgTable(
  'payments',
  {
    id: uuid().primaryKey().defaultRandom(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    kind: paymentKind().notNull(),
    /** The accepted bid a bid payment is for, so its shop is known even after the job is cancelled. */
    bidId: uuid().references(() => bids.id),
    changeOrderId: uuid().references(() => changeOrders.id),
    amountCents: integer().notNull(),
    currency: text().notNull().default('usd'),
    status: paymentStatus().notNull().default('pending'),
    checkoutSessionId: text(),
    paymentIntentId: text(),
    chargeId: text(),
    failureMessage: text(),
    paidAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index('payments_job_idx').on(t.jobId),
    uniqueIndex('payments_session_idx').on(t.checkoutSessionId),
    check('payments_amount_check', sql`${t.amountCents} > 0`),
  ],
);

/**
 * A transfer to the shop or a refund to the builder, for one payment. The row
 * is written before the provider is called and carries the idempotency key,
 * so a retry (or a second caller) repeats the same request instead of making
 * a second movement of money.
 */
export const moneyMoves = pgTable(
  'money_moves',
  {
    id: uuid().primaryKey().defaultRandom(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    paymentId: uuid()
      .notNull()
      .references(() => payments.id),
    kind: moneyMoveKind().notNull(),
    /** What goes to the shop (release) or back to the builder (refund). */
    amountCents: integer().notNull(),
    /** The platform's fee kept on a release; 0 on a refund. */
    feeCents: integer().notNull().default(0),
    idempotencyKey: text().notNull(),
    status: moneyMoveStatus().notNull().default('pending'),
    providerId: text(),
    attempts: integer().notNull().default(0),
    lastError: text(),
    nextAttemptAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    doneAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('money_moves_key_idx').on(t.idempotencyKey),
    index('money_moves_due_idx').on(t.nextAttemptAt).where(sql`${t.status} = 'pending'`),
    check('money_moves_amounts_check', sql`${t.amountCents} >= 0 AND ${t.feeCents} >= 0`),
  ],
);

/** Append-only record of every movement of money, per job. Amounts are positive cents; the kind gives the direction. */
export const ledgerEntries = pgTable(
  'ledger_entries',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    jobId: uuid()
      .notNull()
      .references(() => jobs.id),
    paymentId: uuid().references(() => payments.id),
    kind: ledgerKind().notNull(),
    amountCents: integer().notNull(),
    /** The provider's id for the movement (charge, transfer, refund), so the same movement is never entered twice. */
    reference: text().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('ledger_job_idx').on(t.jobId, t.id),
    uniqueIndex('ledger_reference_idx').on(t.kind, t.reference),
    check('ledger_amount_check', sql`${t.amountCents} > 0`),
  ],
);

/** Provider events, stored by id and applied once. */
export const paymentEvents = pgTable('payment_events', {
  id: text().primaryKey(),
  type: text().notNull(),
  payload: jsonb().notNull(),
  receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  appliedAt: timestamp({ withTimezone: true }),
});

export type User = typeof users.$inferSelect;
export type Role = (typeof userRole.enumValues)[number];
