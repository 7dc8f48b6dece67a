import { sql } from 'drizzle-orm';
import { bigserial, check, index, integer, jsonb, pgEnum, pgSequence, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { mustReference, stampedNow, timestamps, uuidPrimaryKey } from './columns';
import { bids, jobIdColumn, jobs } from './jobs';
import { shops } from './shops';

// Money on a job: checkouts (payments), change orders, transfers and refunds, the ledger and provider events.

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
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
    shopId: mustReference(() => shops.id),
    description: text().notNull(),
    amountCents: integer().notNull(),
    status: changeOrderStatus().notNull().default('proposed'),
    decidedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [index('change_orders_job_idx').on(t.jobId), check('change_orders_amount_check', sql`${t.amountCents} > 0`)],
);

/** Receipt and invoice numbers: sequential, never reused (a number taken by a transaction that rolled back leaves a gap). */
export const receiptNumbers = pgSequence('receipt_numbers');
export const invoiceNumbers = pgSequence('invoice_numbers');

/** One Checkout Session: the bid total, or a change order. */
export const payments = pgTable(
  'payments',
  {
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
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
    /** The receipt's number (R-2026-000123), given once, in the transaction that records the payment as paid. */
    receiptNumber: text(),
    ...timestamps,
  },
  (t) => [
    index('payments_job_idx').on(t.jobId),
    uniqueIndex('payments_receipt_number_idx').on(t.receiptNumber),
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
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
    paymentId: mustReference(() => payments.id),
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
    nextAttemptAt: stampedNow(),
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
    jobId: mustReference(() => jobs.id),
    paymentId: uuid().references(() => payments.id),
    kind: ledgerKind().notNull(),
    amountCents: integer().notNull(),
    /** The provider's id for the movement (charge, transfer, refund), so the same movement is never entered twice. */
    reference: text().notNull(),
    createdAt: stampedNow(),
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
  receivedAt: stampedNow(),
  appliedAt: timestamp({ withTimezone: true }),
});

/** The shop's invoice to the builder for a finished job: its number, given once, the first time it is asked for. */
export const invoices = pgTable('invoices', {
  jobId: uuid()
    .primaryKey()
    .references(() => jobs.id),
  number: text().notNull().unique('invoices_number_key'),
  issuedAt: stampedNow(),
});
