import { sql } from 'drizzle-orm';
import type { MoneyHistory } from '../../../shared/schemas/payments';
import type { Executor } from '../../db/client';
import type { User } from '../../db/schema';

/**
 * A builder's or shop's money across their jobs, newest first: the ledger
 * entries of the jobs they posted (builder) or were awarded (shop).
 */
export async function moneyHistory(db: Executor, user: User, page: { limit: number; offset: number }): Promise<MoneyHistory> {
  const mine =
    user.role === 'builder'
      ? sql`j.builder_id = ${user.id}`
      : sql`j.awarded_bid_id IN (SELECT b.id FROM bids b JOIN shops s ON s.id = b.shop_id WHERE s.user_id = ${user.id})`;
  const [rows, total] = await Promise.all([
    db.execute<{ id: string; created_at: Date; job_id: string; job_title: string; kind: MoneyHistory['rows'][number]['kind']; amount_cents: number }>(sql`
      SELECT l.id, l.created_at, l.job_id, j.title AS job_title, l.kind, l.amount_cents
      FROM ledger_entries l JOIN jobs j ON j.id = l.job_id
      WHERE ${mine}
      ORDER BY l.id DESC LIMIT ${page.limit} OFFSET ${page.offset}`),
    db.execute<{ total: number }>(sql`SELECT count(*)::int AS total FROM ledger_entries l JOIN jobs j ON j.id = l.job_id WHERE ${mine}`),
  ]);
  return {
    rows: rows.rows.map((r) => ({ id: Number(r.id), createdAt: new Date(r.created_at).toISOString(), jobId: r.job_id, jobTitle: r.job_title, kind: r.kind, amountCents: r.amount_cents })),
    total: total.rows[0].total,
  };
}
