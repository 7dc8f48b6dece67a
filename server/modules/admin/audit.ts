import { and, count, desc, eq } from 'drizzle-orm';
import type { AuditRow } from '../../../shared/schemas/admin';
import type { Executor } from '../../db/client';
import { adminActions, users } from '../../db/schema';

/** Writes one administrator action; called inside the transaction that makes the change, so the log never misses one. */
export async function recordAdminAction(
  tx: Executor,
  entry: { adminId: string; action: string; targetType: string; targetId: string; details?: Record<string, unknown> },
): Promise<void> {
  await tx.insert(adminActions).values({ ...entry, details: entry.details ?? {} });
}

export async function listAdminActions(db: Executor, input: { action?: string; limit: number; offset: number }): Promise<{ entries: AuditRow[]; total: number }> {
  const where = input.action ? and(eq(adminActions.action, input.action)) : undefined;
  const [rows, [{ total }]] = await Promise.all([
    db
      .select({ row: adminActions, adminName: users.displayName })
      .from(adminActions)
      .innerJoin(users, eq(users.id, adminActions.adminId))
      .where(where)
      .orderBy(desc(adminActions.createdAt), desc(adminActions.id))
      .limit(input.limit)
      .offset(input.offset),
    db.select({ total: count() }).from(adminActions).where(where),
  ]);
  return {
    entries: rows.map(({ row, adminName }) => ({
      id: row.id,
      at: row.createdAt.toISOString(),
      admin: { id: row.adminId, displayName: adminName },
      action: row.action,
      targetType: row.targetType,
      targetId: row.targetId,
      details: row.details as Record<string, unknown>,
    })),
    total,
  };
}
