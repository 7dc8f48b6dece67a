import { sql } from 'drizzle-orm';
import type { Database } from '../db/client';
import { users } from '../db/schema';
import { hashPassword } from '../lib/auth/passwords';

/**
 * The demo scenario: invented people and shops only. Every demo account uses
 * the same password so a visitor can try each role.
 */
export const DEMO_PASSWORD = 'tenthmark-demo';

export const demoAccounts = [
  { role: 'admin', email: 'admin@tenthmark.test', displayName: 'Perrin Oakhollow (Tenthmark staff)' },
  { role: 'builder', email: 'juno@builders.test', displayName: 'Juno Brackenridge' },
  { role: 'builder', email: 'teodor@builders.test', displayName: 'Teodor Halvecka' },
  { role: 'shop', email: 'bench@lanternhill.test', displayName: 'Lantern Hill Machine Works' },
  { role: 'shop', email: 'desk@kessrow.test', displayName: 'Kessrow Bore & Deck' },
] as const;

/** Seeds the demo scenario when the database has no users; resolves to whether it seeded. */
export async function seedIfEmpty(db: Database): Promise<boolean> {
  const [{ count }] = await db.select({ count: sql<number>`count(*)::int` }).from(users);
  if (count > 0) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    await tx.insert(users).values(
      demoAccounts.map((account) => ({
        email: account.email,
        displayName: account.displayName,
        role: account.role,
        passwordHash,
        emailVerifiedAt: new Date(),
      })),
    );
  });
  return true;
}
