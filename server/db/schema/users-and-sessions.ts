import { sql } from 'drizzle-orm';
import { index, json, pgEnum, pgTable, text, timestamp, uniqueIndex, varchar } from 'drizzle-orm/pg-core';
import { mustReference, stampedNow, timestamps, uuidPrimaryKey } from './columns';

// People and their ways in: accounts, single-use e-mail links and signed-in sessions.

export const userRole = pgEnum('user_role', ['builder', 'shop', 'admin']);
/** closed: the person deleted their account; what identified them is gone and it can never sign in again. */
export const userStatus = pgEnum('user_status', ['active', 'suspended', 'closed']);
export const tokenPurpose = pgEnum('token_purpose', ['verify_email', 'reset_password', 'change_email']);

export const users = pgTable(
  'users',
  {
    id: uuidPrimaryKey(),
    email: text().notNull(),
    displayName: text().notNull(),
    role: userRole().notNull(),
    status: userStatus().notNull().default('active'),
    passwordHash: text(),
    githubId: text(),
    emailVerifiedAt: timestamp({ withTimezone: true }),
    /** The address a change of e-mail waits to move to until the link mailed there is followed. */
    pendingEmail: text(),
    /** When the person accepted the terms and privacy notice, and which version (shared/legal.ts); null for accounts made before consent was asked, or by an admin. */
    termsAcceptedAt: timestamp({ withTimezone: true }),
    termsVersion: text(),
    /** When the person deleted the account (status closed). */
    closedAt: timestamp({ withTimezone: true }),
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
    id: uuidPrimaryKey(),
    userId: mustReference(() => users.id, { onDelete: 'cascade' }),
    purpose: tokenPurpose().notNull(),
    tokenHash: text().notNull(),
    expiresAt: timestamp({ withTimezone: true }).notNull(),
    usedAt: timestamp({ withTimezone: true }),
    createdAt: stampedNow(),
  },
  (t) => [uniqueIndex('user_tokens_hash_idx').on(t.tokenHash), index('user_tokens_user_idx').on(t.userId)],
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

export type User = typeof users.$inferSelect;

export type Role = (typeof userRole.enumValues)[number];
