import { sql } from 'drizzle-orm';
import {
  check,
  index,
  integer,
  json,
  pgEnum,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
  varchar,
} from 'drizzle-orm/pg-core';

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

export type User = typeof users.$inferSelect;
export type Role = (typeof userRole.enumValues)[number];
