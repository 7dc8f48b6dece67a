import { eq } from 'drizzle-orm';
import type { PlatformFee } from '../../../shared/schemas/admin';
import type { Executor } from '../../db/client';
import { platformSettings, users } from '../../db/schema';

const FEE_KEY = 'platform_fee_bps';

/**
 * The platform fee in basis points: what an administrator last set, or the
 * configured default. Read when a bid is accepted and fixed on the job then,
 * so a change applies to new awards only.
 */
export async function currentFee(db: Executor, fallbackBps: number): Promise<PlatformFee> {
  const [row] = await db
    .select({ value: platformSettings.value, updatedAt: platformSettings.updatedAt, updatedBy: users.displayName })
    .from(platformSettings)
    .leftJoin(users, eq(users.id, platformSettings.updatedBy))
    .where(eq(platformSettings.key, FEE_KEY));
  if (!row) return { feeBps: fallbackBps, updatedAt: null, updatedBy: null };
  return { feeBps: Number(row.value), updatedAt: row.updatedAt.toISOString(), updatedBy: row.updatedBy };
}

export async function setFee(tx: Executor, feeBps: number, adminId: string): Promise<void> {
  await tx
    .insert(platformSettings)
    .values({ key: FEE_KEY, value: feeBps, updatedBy: adminId })
    .onConflictDoUpdate({ target: platformSettings.key, set: { value: feeBps, updatedBy: adminId } });
}
