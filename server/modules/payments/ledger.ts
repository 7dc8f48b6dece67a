import { eq, sql } from 'drizzle-orm';
import type { Executor } from '../../db/client';
import { ledgerEntries } from '../../db/schema';

export type LedgerKind = (typeof ledgerEntries.$inferInsert)['kind'];

/** Appends one movement; the same provider reference is never entered twice. Resolves to whether it was new. */
export async function appendLedger(
  tx: Executor,
  entry: { jobId: string; paymentId?: string | null; kind: LedgerKind; amountCents: number; reference: string },
): Promise<boolean> {
  if (!Number.isSafeInteger(entry.amountCents) || entry.amountCents <= 0) throw new Error(`ledger amounts are positive whole cents, not ${entry.amountCents}`);
  const rows = await tx.insert(ledgerEntries).values(entry).onConflictDoNothing().returning({ id: ledgerEntries.id });
  return rows.length === 1;
}

export interface JobBalance {
  paidIn: number;
  released: number;
  fee: number;
  refunded: number;
  /** Paid in and not yet released, kept as fee or refunded. Never negative. */
  held: number;
}

/** The job's money from its ledger: paid = released + fee + refunded + held. */
export async function jobBalance(db: Executor, jobId: string): Promise<JobBalance> {
  const [row] = await db
    .select({
      paidIn: sql<number>`coalesce(sum(${ledgerEntries.amountCents}) FILTER (WHERE ${ledgerEntries.kind} = 'paid_in'), 0)::int`,
      released: sql<number>`coalesce(sum(${ledgerEntries.amountCents}) FILTER (WHERE ${ledgerEntries.kind} = 'released'), 0)::int`,
      fee: sql<number>`coalesce(sum(${ledgerEntries.amountCents}) FILTER (WHERE ${ledgerEntries.kind} = 'fee'), 0)::int`,
      refunded: sql<number>`coalesce(sum(${ledgerEntries.amountCents}) FILTER (WHERE ${ledgerEntries.kind} = 'refunded'), 0)::int`,
    })
    .from(ledgerEntries)
    .where(eq(ledgerEntries.jobId, jobId));
  const held = row.paidIn - row.released - row.fee - row.refunded;
  return { ...row, held };
}

/** The fee rule lives in shared/money.ts, so the shop's pages show the same fee the release takes. */
export { feeFor } from '../../../shared/money';
