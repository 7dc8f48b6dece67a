import { and, eq, gt, isNull } from 'drizzle-orm';
import { createHash, randomBytes } from 'node:crypto';
import type { Executor } from '../../db/client';
import { userTokens } from '../../db/schema';

type Purpose = (typeof userTokens.$inferInsert)['purpose'];

const digest = (token: string) => createHash('sha256').update(token).digest('hex');

/** Makes a single-use token; only its hash is stored, the raw value goes into the e-mailed link. */
export async function issueToken(db: Executor, userId: string, purpose: Purpose, ttlMs: number): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  await db.insert(userTokens).values({ userId, purpose, tokenHash: digest(token), expiresAt: new Date(Date.now() + ttlMs) });
  return token;
}

/**
 * Uses a token up. One UPDATE both checks and spends it, so two clicks at the
 * same moment cannot both succeed. Resolves to the user id, or undefined when the
 * token is unknown, used or expired.
 */
export async function consumeToken(db: Executor, token: string, purpose: Purpose): Promise<string | undefined> {
  const [row] = await db
    .update(userTokens)
    .set({ usedAt: new Date() })
    .where(
      and(
        eq(userTokens.tokenHash, digest(token)),
        eq(userTokens.purpose, purpose),
        isNull(userTokens.usedAt),
        gt(userTokens.expiresAt, new Date()),
      ),
    )
    .returning({ userId: userTokens.userId });
  return row?.userId;
}

/** Spends every unused token of one purpose a person still has, e.g. all reset links once the password has changed. */
export async function spendAllTokens(db: Executor, userId: string, purpose: Purpose): Promise<void> {
  await db
    .update(userTokens)
    .set({ usedAt: new Date() })
    .where(and(eq(userTokens.userId, userId), eq(userTokens.purpose, purpose), isNull(userTokens.usedAt)));
}
