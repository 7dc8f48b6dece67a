import { eq, sql } from 'drizzle-orm';
import type { Executor } from '../../db/client';
import { users, type User } from '../../db/schema';

export type NewUser = typeof users.$inferInsert;

export async function findUserById(db: Executor, id: string): Promise<User | undefined> {
  const [row] = await db.select().from(users).where(eq(users.id, id));
  return row;
}

export async function findUserByEmail(db: Executor, email: string): Promise<User | undefined> {
  const [row] = await db.select().from(users).where(sql`lower(${users.email}) = lower(${email})`);
  return row;
}

export async function findUserByGithubId(db: Executor, githubId: string): Promise<User | undefined> {
  const [row] = await db.select().from(users).where(eq(users.githubId, githubId));
  return row;
}

/** Inserts a user; resolves to undefined when the e-mail (or GitHub id) is already taken. */
export async function insertUser(db: Executor, values: NewUser): Promise<User | undefined> {
  const [row] = await db.insert(users).values(values).onConflictDoNothing().returning();
  return row;
}

export async function updateUser(db: Executor, id: string, values: Partial<NewUser>): Promise<User | undefined> {
  const [row] = await db
    .update(users)
    .set(values)
    .where(eq(users.id, id))
    .returning();
  return row;
}

/** Ends every stored session of a user except, optionally, one. */
export async function deleteSessionsOfUser(db: Executor, userId: string, exceptSid?: string): Promise<void> {
  await db.execute(sql`
    DELETE FROM sessions
    WHERE sess -> 'passport' ->> 'user' = ${userId}
      AND (${exceptSid ?? null}::text IS NULL OR sid <> ${exceptSid ?? null})`);
}

/** Whether this signed-in session still exists: not signed out, ended by a password change or reset, suspended or expired. */
export async function sessionIsLive(db: Executor, sid: string, userId: string): Promise<boolean> {
  const result = await db.execute(sql`
    SELECT 1 FROM sessions
    WHERE sid = ${sid} AND expire > now() AND sess -> 'passport' ->> 'user' = ${userId}`);
  return result.rows.length > 0;
}

/** What a person sees of their own account. */
export function toMe(user: User) {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    emailVerified: user.emailVerifiedAt !== null,
    hasPassword: user.passwordHash !== null,
    githubLinked: user.githubId !== null,
    pendingEmail: user.pendingEmail,
  };
}
