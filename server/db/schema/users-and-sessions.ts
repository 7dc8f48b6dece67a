import { sql } from 'drizzle-orm';
import { index, json, pgEnum, pgTable, text, timestamp, uniqueIndex, varchar } from 'drizzle-orm/pg-core';
import { mustReference, stampedNow, timestamps, uuidPrimaryKey } from './columns';

// People and their ways in: accounts, single-use e-mail links and signed-in sessions.

export const userRole = pgEnum('user_role', ['builder', 'shop', 'admin']);
export const userStatus = pgEnum('user_status', ['active', 'suspended']);
export const tokenPurpose = pgEnum('token_purpose', ['verify_email', 'reset_password']);

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
