import { and, eq, isNull, sql, type SQL } from 'drizzle-orm';
import type { Executor } from '../../db/client';
import { invoiceNumbers, invoices, payments, receiptNumbers } from '../../db/schema';

/**
 * A document number as the database gives it: the prefix, the year (UTC) and
 * the next value of the sequence, six digits wide: R-2026-000123. Sequential
 * and never reused; a transaction that rolls back leaves a gap, which is fine.
 */
function nextNumber(prefix: 'R' | 'I', sequence: typeof receiptNumbers): SQL<string> {
  return sql<string>`${prefix} || '-' || to_char(now() AT TIME ZONE 'UTC', 'YYYY') || '-' || lpad(nextval(${sequence.seqName})::text, 6, '0')`;
}

/** A payment's receipt number, for the update that records it as paid: set once, kept after. */
export const receiptNumberOnPaid = () => sql<string>`coalesce(${payments.receiptNumber}, ${nextNumber('R', receiptNumbers)})`;

/**
 * The receipt number of a paid payment, given now if it has none (a payment
 * recorded before receipts were numbered). Only the first caller's update
 * finds the number empty, so every download shows the same number.
 */
export async function receiptNumberOf(db: Executor, paymentId: string): Promise<string> {
  await db
    .update(payments)
    .set({ receiptNumber: nextNumber('R', receiptNumbers) })
    .where(and(eq(payments.id, paymentId), isNull(payments.receiptNumber)));
  const [row] = await db.select({ number: payments.receiptNumber }).from(payments).where(eq(payments.id, paymentId));
  return row.number!;
}

/** The job's invoice number, given the first time the invoice is asked for and the same on every later download. */
export async function invoiceNumberOf(db: Executor, jobId: string): Promise<{ number: string; issuedAt: Date }> {
  const given = () => db.select().from(invoices).where(eq(invoices.jobId, jobId));
  let [row] = await given();
  if (!row) {
    await db.insert(invoices).values({ jobId, number: nextNumber('I', invoiceNumbers) }).onConflictDoNothing({ target: invoices.jobId });
    [row] = await given();
  }
  return { number: row.number, issuedAt: row.issuedAt };
}
