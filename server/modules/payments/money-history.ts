import { sql, type SQL } from 'drizzle-orm';
import type { MoneyHistory, MoneyPeriod, MoneyTotals } from '../../../shared/schemas/payments';
import type { Executor } from '../../db/client';
import type { User } from '../../db/schema';
import { csvDecimal, csvStringifier } from '../../lib/csv';

/** The ledger entries of the jobs a builder posted or a shop was awarded. */
function mine(user: User): SQL {
  return user.role === 'builder'
    ? sql`j.builder_id = ${user.id}`
    : sql`j.awarded_bid_id IN (SELECT b.id FROM bids b JOIN shops s ON s.id = b.shop_id WHERE s.user_id = ${user.id})`;
}

const DAY_MS = 24 * 60 * 60_000;
/** The period as whole days in UTC: from the start of `from` to the end of `to`. */
const startOf = (day: string) => new Date(`${day}T00:00:00Z`);
const endOf = (day: string) => new Date(startOf(day).getTime() + DAY_MS);

function inPeriod(period: MoneyPeriod): SQL {
  const parts = [sql`TRUE`];
  if (period.from) parts.push(sql`l.created_at >= ${startOf(period.from)}`);
  if (period.to) parts.push(sql`l.created_at < ${endOf(period.to)}`);
  return sql.join(parts, sql` AND `);
}

/**
 * Totals over the period: what came in, went to the shop, was kept as the
 * fee or refunded; held is everything paid in and not yet paid out by the
 * period's end (whenever it came in); net is what reached the shop.
 */
async function totalsOf(db: Executor, user: User, period: MoneyPeriod): Promise<MoneyTotals> {
  const before = period.to ? sql`l.created_at < ${endOf(period.to)}` : sql`TRUE`;
  const { rows } = await db.execute<Omit<MoneyTotals, 'net'>>(sql`
    SELECT
      coalesce(sum(l.amount_cents) FILTER (WHERE l.kind = 'paid_in' AND ${inPeriod(period)}), 0)::int AS "paidIn",
      coalesce(sum(l.amount_cents) FILTER (WHERE l.kind = 'released' AND ${inPeriod(period)}), 0)::int AS released,
      coalesce(sum(l.amount_cents) FILTER (WHERE l.kind = 'fee' AND ${inPeriod(period)}), 0)::int AS fee,
      coalesce(sum(l.amount_cents) FILTER (WHERE l.kind = 'refunded' AND ${inPeriod(period)}), 0)::int AS refunded,
      coalesce(sum(CASE WHEN l.kind = 'paid_in' THEN l.amount_cents ELSE -l.amount_cents END) FILTER (WHERE ${before}), 0)::int AS held
    FROM ledger_entries l JOIN jobs j ON j.id = l.job_id
    WHERE ${mine(user)}`);
  const t = rows[0];
  return { ...t, net: t.released };
}

/** A builder's or shop's money across their jobs over a period, newest first, a page at a time, with the period's totals. */
export async function moneyHistory(db: Executor, user: User, query: MoneyPeriod & { limit: number; offset: number }): Promise<MoneyHistory> {
  const where = sql`${mine(user)} AND ${inPeriod(query)}`;
  const [rows, total, totals] = await Promise.all([
    db.execute<{ id: string; created_at: Date; job_id: string; job_title: string; kind: MoneyHistory['rows'][number]['kind']; amount_cents: number; payment_id: string | null; receipt_number: string | null }>(sql`
      SELECT l.id, l.created_at, l.job_id, j.title AS job_title, l.kind, l.amount_cents, p.id AS payment_id, p.receipt_number
      FROM ledger_entries l JOIN jobs j ON j.id = l.job_id
      LEFT JOIN payments p ON p.id = l.payment_id AND l.kind = 'paid_in' AND p.status = 'paid' AND p.receipt_number IS NOT NULL
      WHERE ${where}
      ORDER BY l.id DESC LIMIT ${query.limit} OFFSET ${query.offset}`),
    db.execute<{ total: number }>(sql`SELECT count(*)::int AS total FROM ledger_entries l JOIN jobs j ON j.id = l.job_id WHERE ${where}`),
    totalsOf(db, user, query),
  ]);
  return {
    rows: rows.rows.map((r) => ({
      id: Number(r.id),
      createdAt: new Date(r.created_at).toISOString(),
      jobId: r.job_id,
      jobTitle: r.job_title,
      kind: r.kind,
      amountCents: r.amount_cents,
      // Receipts are the payer's: a shop's page lists the same payments without them.
      receipt: user.role === 'builder' && r.payment_id && r.receipt_number ? { paymentId: r.payment_id, number: r.receipt_number } : null,
    })),
    total: total.rows[0].total,
    totals,
  };
}

const TOTAL_LINES: Array<[keyof MoneyTotals, string]> = [
  ['paidIn', 'Total paid in'],
  ['released', 'Total released to the shop'],
  ['fee', 'Total Tenthmark fee'],
  ['refunded', 'Total refunded'],
  ['held', 'Held at the end of the period'],
  ['net', 'Net to the shop'],
];

/**
 * The same rows as the money page over the same period, oldest first, then
 * one line per total. Text cells go through the project's CSV guard (a job
 * title starting with = is written behind a quote); amounts are numbers.
 */
export async function moneyCsv(db: Executor, user: User, period: MoneyPeriod): Promise<string> {
  const [{ rows }, totals] = await Promise.all([
    db.execute<{ id: string; created_at: Date; job_id: string; job_title: string; kind: string; amount_cents: number }>(sql`
      SELECT l.id, l.created_at, l.job_id, j.title AS job_title, l.kind, l.amount_cents
      FROM ledger_entries l JOIN jobs j ON j.id = l.job_id
      WHERE ${mine(user)} AND ${inPeriod(period)}
      ORDER BY l.id`),
    totalsOf(db, user, period),
  ]);
  const csv = csvStringifier({ header: true, columns: ['date', 'job_id', 'job_title', 'kind', 'amount_cents', 'amount'] });
  const chunks: string[] = [];
  csv.on('data', (chunk: Buffer | string) => chunks.push(chunk.toString()));
  for (const r of rows) csv.write([new Date(r.created_at).toISOString(), r.job_id, r.job_title, r.kind, r.amount_cents, csvDecimal(r.amount_cents / 100, 2)]);
  const lines = user.role === 'shop' ? TOTAL_LINES : TOTAL_LINES.filter(([key]) => key !== 'net');
  for (const [key, label] of lines) csv.write(['', '', label, 'total', totals[key], csvDecimal(totals[key] / 100, 2)]);
  await new Promise<void>((resolve) => csv.end(resolve));
  return chunks.join('');
}
