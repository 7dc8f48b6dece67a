import { sql } from 'drizzle-orm';
import { bigserial, check, customType, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { mustReference, stampedNow, updatedNow, uuidPrimaryKey } from './columns';
import { users } from './users-and-sessions';

// The platform's own machinery: run-time settings, the administrators' audit log, the mail outbox, timed tasks, rate limits and the socket.io adapter's attachments.

/** Settings an administrator changes at run time (the platform fee). */
export const platformSettings = pgTable('platform_settings', {
  key: text().primaryKey(),
  value: jsonb().notNull(),
  updatedBy: uuid().references(() => users.id),
  updatedAt: updatedNow(),
});

/** Every administrator action, append-only. */
export const adminActions = pgTable(
  'admin_actions',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    adminId: mustReference(() => users.id),
    action: text().notNull(),
    targetType: text().notNull(),
    targetId: text().notNull(),
    details: jsonb().notNull().default({}),
    createdAt: stampedNow(),
  },
  (t) => [index('admin_actions_created_idx').on(t.createdAt.desc()), index('admin_actions_action_idx').on(t.action, t.createdAt.desc())],
);

/** `skipped`: an optional mail the person turned off (shared/notifications.ts); kept, never sent. */
export const mailStatus = pgEnum('mail_status', ['pending', 'sent', 'failed', 'skipped']);

/** Outgoing mail, written in the same transaction as the change that causes it. */
export const mailOutbox = pgTable(
  'mail_outbox',
  {
    id: uuidPrimaryKey(),
    toAddress: text().notNull(),
    subject: text().notNull(),
    textBody: text().notNull(),
    htmlBody: text().notNull(),
    template: text().notNull(),
    status: mailStatus().notNull().default('pending'),
    attempts: integer().notNull().default(0),
    nextAttemptAt: stampedNow(),
    lastError: text(),
    sentAt: timestamp({ withTimezone: true }),
    createdAt: stampedNow(),
  },
  (t) => [
    index('mail_outbox_due_idx').on(t.nextAttemptAt).where(sql`${t.status} = 'pending'`),
    check('mail_outbox_attempts_check', sql`${t.attempts} >= 0`),
  ],
);

/**
 * Work to do at a time (review reminders, acceptance when the window ends).
 * A worker leases a due task with FOR UPDATE SKIP LOCKED, so two app instances
 * never run the same task, and a task whose worker died is leased again.
 */
export const scheduledTasks = pgTable(
  'scheduled_tasks',
  {
    id: uuidPrimaryKey(),
    kind: text().notNull(),
    /** Makes scheduling idempotent: the same key is scheduled once. */
    key: text().notNull(),
    payload: jsonb().notNull(),
    runAt: timestamp({ withTimezone: true }).notNull(),
    leasedUntil: timestamp({ withTimezone: true }),
    attempts: integer().notNull().default(0),
    lastError: text(),
    doneAt: timestamp({ withTimezone: true }),
    createdAt: stampedNow(),
  },
  (t) => [uniqueIndex('scheduled_tasks_key_idx').on(t.key), index('scheduled_tasks_due_idx').on(t.runAt).where(sql`${t.doneAt} IS NULL`)],
);

/** Hit counters for rate limits, shared by every app instance. */
export const rateLimits = pgTable('rate_limits', {
  key: text().primaryKey(),
  hits: integer().notNull(),
  resetAt: timestamp({ withTimezone: true }).notNull(),
});

const customBytea = customType<{ data: Buffer }>({ dataType: () => 'bytea' });

/** Payloads the socket.io PostgreSQL adapter cannot fit in a NOTIFY (over 8 kB, or binary). */
export const socketIoAttachments = pgTable('socket_io_attachments', {
  id: bigserial({ mode: 'number' }).unique(),
  createdAt: timestamp({ withTimezone: true }).defaultNow(),
  payload: customBytea(),
});
