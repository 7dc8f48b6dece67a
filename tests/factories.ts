import { randomBytes } from 'node:crypto';
import type { Database } from '../server/db/client';
import { users, type User } from '../server/db/schema';
import { hashPassword } from '../server/lib/auth/passwords';

export const TEST_PASSWORD = 'correct horse battery';

let passwordHash: Promise<string> | undefined;

/** A unique e-mail address, so tests never collide on each other's rows. */
export const uniqueEmail = (label = 'person') => `${label}-${randomBytes(5).toString('hex')}@example.test`;

export async function createUser(
  db: Database,
  overrides: Partial<typeof users.$inferInsert> & { password?: string } = {},
): Promise<User & { password: string }> {
  const { password = TEST_PASSWORD, ...rest } = overrides;
  const hash = password === TEST_PASSWORD ? await (passwordHash ??= hashPassword(TEST_PASSWORD)) : await hashPassword(password);
  const [user] = await db
    .insert(users)
    .values({
      email: uniqueEmail(rest.role ?? 'builder'),
      displayName: 'Test Person',
      role: 'builder',
      passwordHash: hash,
      emailVerifiedAt: new Date(),
      ...rest,
    })
    .returning();
  return { ...user, password };
}
