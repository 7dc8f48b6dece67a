import { sql } from 'drizzle-orm';
import type { NeedsYouItem } from '../../../shared/schemas/notifications';
import type { Executor } from '../../db/client';
import type { User } from '../../db/schema';
import { daysUntil, dueDayEnd } from '../../../shared/due-day';
import { dueDaysOf } from '../jobs/due-days';

/** Days before a shop's agreed finish that a job shows as coming due. */
export const COMING_DUE_DAYS = 3;

const HOUR = 60 * 60_000;

/** "2 days 5 hours left", "40 minutes left", or how long ago it passed. */
export function timeLeftText(dueAt: Date, now: Date): string {
  const ms = dueAt.getTime() - now.getTime();
  const abs = Math.abs(ms);
  const days = Math.floor(abs / (24 * HOUR));
  const hours = Math.floor((abs % (24 * HOUR)) / HOUR);
  const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
  const span =
    days > 0 ? [plural(days, 'day'), hours > 0 ? plural(hours, 'hour') : ''].filter(Boolean).join(' ') : hours > 0 ? plural(hours, 'hour') : plural(Math.max(1, Math.floor(abs / 60_000)), 'minute');
  return ms >= 0 ? `${span} left` : `${span} overdue`;
}

const jobHref = (jobId: string) => `/jobs/${jobId}`;

interface JobTitleRow extends Record<string, unknown> {
  job_id: string;
  title: string;
}

/** One thing that waits, about the job of `row`, leading to the job's page unless `href` says otherwise. */
const item = (kind: NeedsYouItem['kind'], row: JobTitleRow, text: string, options: { dueAt?: Date; href?: string } = {}): NeedsYouItem => ({
  kind,
  jobId: row.job_id,
  title: row.title,
  text,
  dueAt: options.dueAt?.toISOString() ?? null,
  href: options.href ?? jobHref(row.job_id),
});

/** Open jobs of this builder with active bids. */
async function bidsToCompare(db: Executor, user: User): Promise<NeedsYouItem[]> {
  const { rows } = await db.execute<JobTitleRow & { bids: number }>(sql`
    SELECT j.id AS job_id, j.title, count(b.id)::int AS bids
    FROM jobs j JOIN bids b ON b.job_id = j.id AND b.status = 'active'
    WHERE j.builder_id = ${user.id} AND j.status = 'open'
    GROUP BY j.id ORDER BY min(b.created_at)`);
  return rows.map((r) => item('bids-to-compare', r, `${r.bids} ${r.bids === 1 ? 'bid' : 'bids'} to compare.`));
}

/** Jobs this builder awarded and has not paid for yet. */
async function paymentDue(db: Executor, user: User): Promise<NeedsYouItem[]> {
  const { rows } = await db.execute<JobTitleRow>(sql`
    SELECT j.id AS job_id, j.title FROM jobs j
    WHERE j.builder_id = ${user.id} AND j.status = 'awarded' ORDER BY j.updated_at`);
  return rows.map((r) => item('payment-due', r, 'You accepted a bid: pay it so the shop can start. The money is held until you accept the results.'));
}

/** Inspection records waiting for this builder's answer, with the review window's end. */
async function resultsToReview(db: Executor, user: User, now: Date): Promise<NeedsYouItem[]> {
  const { rows } = await db.execute<JobTitleRow & { version: number; review_due_at: string }>(sql`
    SELECT j.id AS job_id, j.title, r.version, r.review_due_at
    FROM jobs j JOIN inspection_records r ON r.job_id = j.id AND r.status = 'submitted'
    WHERE j.builder_id = ${user.id} AND j.status = 'inspection_submitted'
    ORDER BY r.review_due_at`);
  return rows.map((r) => {
    const dueAt = new Date(r.review_due_at);
    return item('results-to-review', r, `Inspection results (version ${r.version}) wait for your review: ${timeLeftText(dueAt, now)} in the review window.`, { dueAt });
  });
}

/** Open disputes on this person's jobs where the next word is theirs, or the other side answered theirs. */
async function disputesWaiting(db: Executor, user: User): Promise<NeedsYouItem[]> {
  const { rows } = await db.execute<JobTitleRow & { opened_side: 'builder' | 'shop'; answered: boolean; my_side: 'builder' | 'shop' }>(sql`
    SELECT j.id AS job_id, j.title, d.opened_side, d.response IS NOT NULL AS answered,
      CASE WHEN j.builder_id = ${user.id} THEN 'builder' ELSE 'shop' END AS my_side
    FROM disputes d JOIN jobs j ON j.id = d.job_id
    LEFT JOIN bids b ON b.id = j.awarded_bid_id LEFT JOIN shops s ON s.id = b.shop_id
    WHERE d.status = 'open' AND (j.builder_id = ${user.id} OR s.user_id = ${user.id})
    ORDER BY d.opened_at`);
  return rows.flatMap((r): NeedsYouItem[] => {
    const other = r.my_side === 'builder' ? 'shop' : 'builder';
    const text =
      r.opened_side !== r.my_side && !r.answered
        ? `The ${other} opened a dispute: give your side so an administrator can decide.`
        : r.opened_side === r.my_side && r.answered
          ? `The ${other} answered your dispute: read it; an administrator decides next.`
          : null;
    return text ? [item('dispute-waiting', r, text)] : [];
  });
}

/** Jobs awarded to this shop that wait for the builder's payment. */
async function awaitingPayment(db: Executor, user: User): Promise<NeedsYouItem[]> {
  const { rows } = await db.execute<JobTitleRow>(sql`
    SELECT j.id AS job_id, j.title FROM jobs j
    JOIN bids b ON b.id = j.awarded_bid_id JOIN shops s ON s.id = b.shop_id
    WHERE s.user_id = ${user.id} AND j.status = 'awarded' ORDER BY b.decided_at`);
  return rows.map((r) => item('bid-accepted-awaiting-payment', r, 'Your bid was accepted. Work starts once the builder pays; you will be told.'));
}

/** Jobs in this shop whose due day (shared/due-day.ts) is within COMING_DUE_DAYS days or has passed. */
async function jobsComingDue(db: Executor, user: User, now: Date): Promise<NeedsYouItem[]> {
  const { rows } = await db.execute<JobTitleRow>(sql`
    SELECT j.id AS job_id, j.title
    FROM jobs j JOIN bids b ON b.id = j.awarded_bid_id JOIN shops s ON s.id = b.shop_id
    WHERE s.user_id = ${user.id} AND j.status IN ('funded', 'in_work')`);
  const dueDays = await dueDaysOf(db, rows.map((r) => r.job_id));
  return rows
    .flatMap((r) => {
      const day = dueDays.get(r.job_id);
      return day && daysUntil(day, now) <= COMING_DUE_DAYS ? [{ r, dueAt: dueDayEnd(day) }] : [];
    })
    .sort((a, b) => a.dueAt.getTime() - b.dueAt.getTime())
    .map(({ r, dueAt }) => item('jobs-coming-due', r, `Agreed finish: ${timeLeftText(dueAt, now)}.`, { dueAt }));
}

/** Jobs in this shop whose newest inspection record the builder sent back. */
async function recordsRejected(db: Executor, user: User): Promise<NeedsYouItem[]> {
  const { rows } = await db.execute<JobTitleRow & { version: number; reject_reasons: string | null }>(sql`
    SELECT j.id AS job_id, j.title, r.version, r.reject_reasons
    FROM jobs j JOIN bids b ON b.id = j.awarded_bid_id JOIN shops s ON s.id = b.shop_id
    JOIN LATERAL (SELECT version, status, reject_reasons FROM inspection_records WHERE job_id = j.id ORDER BY version DESC LIMIT 1) r ON r.status = 'rejected'
    WHERE s.user_id = ${user.id} AND j.status = 'in_work'`);
  return rows.map((r) =>
    item('record-rejected', r, `The builder asked for changes to version ${r.version} of the inspection record${r.reject_reasons ? `: “${r.reject_reasons}”` : '.'}`),
  );
}

/** Every open dispute, for an administrator to decide. */
async function disputesToDecide(db: Executor): Promise<NeedsYouItem[]> {
  const { rows } = await db.execute<JobTitleRow & { id: string; opened_side: string; answered: boolean }>(sql`
    SELECT d.id, j.id AS job_id, j.title, d.opened_side, d.response IS NOT NULL AS answered
    FROM disputes d JOIN jobs j ON j.id = d.job_id WHERE d.status = 'open' ORDER BY d.opened_at`);
  return rows.map((r) =>
    item('dispute-to-decide', r, `Opened by the ${r.opened_side}; ${r.answered ? 'the other side has answered' : 'the other side has not answered yet'}. Waiting for a decision.`, {
      href: `/admin/disputes/${r.id}`,
    }),
  );
}

/** What waits on this person, soonest due first, then in the order of the kinds. */
export async function needsYou(db: Executor, user: User, now = new Date()): Promise<{ items: NeedsYouItem[] }> {
  const lists =
    user.role === 'builder'
      ? [resultsToReview(db, user, now), paymentDue(db, user), bidsToCompare(db, user), disputesWaiting(db, user)]
      : user.role === 'shop'
        ? [recordsRejected(db, user), jobsComingDue(db, user, now), disputesWaiting(db, user), awaitingPayment(db, user)]
        : [disputesToDecide(db)];
  const items = (await Promise.all(lists)).flat();
  const due = (item: NeedsYouItem) => (item.dueAt ? Date.parse(item.dueAt) : Infinity);
  return { items: items.map((item, order) => ({ item, order })).sort((a, b) => due(a.item) - due(b.item) || a.order - b.order).map(({ item }) => item) };
}
