import { and, desc, eq, gt, inArray, sql } from 'drizzle-orm';
import {
  BUILDER_SILENCE_DAYS,
  builderDisputeReasons,
  disputeReasonWords,
  type Dispute,
  type DisputeQueueRow,
  type DisputeReason,
  type DisputeView,
  type OpenDisputeInput,
  type ResolveDisputeInput,
} from '../../../shared/schemas/disputes';
import type { Database, Executor } from '../../db/client';
import { changeOrders, disputes, jobs, messages, threads, users, type User } from '../../db/schema';
import { AppError, conflict, forbidden, notFound } from '../../lib/errors';
import { enqueueMail } from '../../lib/mail/outbox';
import { disputeAnsweredMail, disputeDecidedMail, disputeOpenedMail } from '../../lib/mail/templates';
import { recordAdminAction } from '../admin/audit';
import { Notices } from '../notifications/notify';
import { mustSeeWork, partiesOf, sideOf, type JobParties } from '../jobs/job-access';
import { dueDaysOf } from '../jobs/due-days';
import { dueDayEnd } from '../../../shared/due-day';
import { jobBalance } from '../payments/ledger';
import { carryOut, planMoves, type PaymentDeps } from '../payments/payments.service';

type DisputeRow = typeof disputes.$inferSelect;
type Side = 'builder' | 'shop';

const DAY_MS = 24 * 60 * 60_000;
/** Statuses in which the held payment can be disputed (money paid in, nothing decided yet). */
const SHOP_DISPUTABLE = new Set(['funded', 'in_work', 'inspection_submitted']);

export function toDispute(row: DisputeRow): Dispute {
  return {
    id: row.id,
    jobId: row.jobId,
    status: row.status,
    openedBy: row.openedSide,
    reason: row.reason as DisputeReason,
    statement: row.statement,
    openedAt: row.openedAt.toISOString(),
    response: row.response && row.respondedAt ? { by: row.openedSide === 'builder' ? 'shop' : 'builder', statement: row.response, at: row.respondedAt.toISOString() } : null,
    resolution:
      row.status === 'resolved' && row.outcome && row.resolvedAt
        ? { outcome: row.outcome, shopCents: row.shopCents ?? 0, refundCents: row.refundCents ?? 0, decision: row.decision ?? '', at: row.resolvedAt.toISOString() }
        : null,
  };
}

const jobUrl = (deps: { appUrl: string }, jobId: string) => `${deps.appUrl}/jobs/${jobId}`;

/**
 * The reasons this side may open a dispute with now, and if none, why not.
 * The builder disputes instead of accepting an inspection record. The shop
 * disputes when the builder has been silent for BUILDER_SILENCE_DAYS past the
 * agreed finish date (the job's due day, shared/due-day.ts), or over a change
 * order the builder has not paid.
 */
async function openingRules(db: Executor, parties: JobParties, side: Side, now: Date): Promise<{ reasons: DisputeReason[]; why: string }> {
  const { job } = parties;
  if (side === 'builder') {
    if (job.status === 'inspection_submitted') return { reasons: [...builderDisputeReasons], why: '' };
    return { reasons: [], why: 'The builder can open a dispute while an inspection record waits for an answer.' };
  }
  if (!SHOP_DISPUTABLE.has(job.status)) return { reasons: [], why: 'A dispute can be opened only while the payment is held for work in progress.' };
  const reasons: DisputeReason[] = [];
  const dueDay = (await dueDaysOf(db, [job.id])).get(job.id) ?? job.createdAt.toISOString().slice(0, 10);
  const agreed = dueDayEnd(dueDay);
  const silentSince = new Date(now.getTime() - BUILDER_SILENCE_DAYS * DAY_MS);
  if (agreed < now) {
    const [spoke] = await db
      .select({ id: messages.id })
      .from(messages)
      .innerJoin(threads, eq(threads.id, messages.threadId))
      .where(and(eq(threads.jobId, job.id), eq(messages.authorId, parties.builder.id), gt(messages.createdAt, silentSince)))
      .limit(1);
    if (!spoke) reasons.push('builder_silent');
  }
  const [order] = await db
    .select({ id: changeOrders.id })
    .from(changeOrders)
    .where(and(eq(changeOrders.jobId, job.id), inArray(changeOrders.status, ['proposed', 'approved', 'declined'])))
    .limit(1);
  if (order) reasons.push('change_order');
  return {
    reasons,
    why: `The shop can open a dispute when the builder has not written for ${BUILDER_SILENCE_DAYS} days after the agreed finish date (${dueDay}), or over extra work that is not paid.`,
  };
}

async function latestDispute(db: Executor, jobId: string): Promise<DisputeRow | undefined> {
  const [row] = await db.select().from(disputes).where(eq(disputes.jobId, jobId)).orderBy(desc(disputes.openedAt)).limit(1);
  return row;
}

/** The job's dispute as its builder, its shop or an admin sees it, with what the viewer may do. */
export async function disputeViewFor(db: Database, user: User, jobId: string, now = new Date()): Promise<DisputeView> {
  const parties = await partiesOf(db, jobId);
  mustSeeWork(parties, user);
  const row = await latestDispute(db, jobId);
  const side = sideOf(parties, user);
  const open = row?.status === 'open';
  const canOpenWith = side && !open ? (await openingRules(db, parties, side, now)).reasons : [];
  return {
    dispute: row ? toDispute(row) : null,
    canOpenWith,
    canRespond: Boolean(side && open && row.openedSide !== side && !row.response),
  };
}

async function adminEmails(db: Executor) {
  return db.select({ id: users.id, email: users.email, name: users.displayName }).from(users).where(and(eq(users.role, 'admin'), eq(users.status, 'active')));
}

/** A decision in a notice's words (the mail says the amounts). */
const outcomeWords = { release: 'the held payment goes to the shop', refund: 'the held payment goes back to the builder', split: 'the held payment is split between the two sides' } as const;

/** A party opens a dispute: the job becomes disputed, the held payment stays held, both sides and the admins are told. */
export async function openDispute(deps: PaymentDeps, user: User, jobId: string, input: OpenDisputeInput, now = new Date()): Promise<Dispute> {
  const notices = new Notices();
  const dispute = await deps.db.transaction(async (tx) => {
    const parties = await partiesOf(tx, jobId, { forUpdate: true });
    const side = sideOf(parties, user);
    if (!side) {
      mustSeeWork(parties, user);
      throw forbidden('Only the builder and the shop doing the work can open a dispute.');
    }
    const [open] = await tx.select({ id: disputes.id }).from(disputes).where(and(eq(disputes.jobId, jobId), eq(disputes.status, 'open')));
    if (open) throw conflict('A dispute is already open on this job.', 'dispute_open');
    const rules = await openingRules(tx, parties, side, now);
    if (rules.reasons.length === 0) throw conflict(rules.why, 'dispute_not_allowed');
    if (!rules.reasons.includes(input.reason)) {
      throw new AppError('invalid_input', 'That reason is not one you can open a dispute with now.', 400, { reason: `Choose one of: ${rules.reasons.map((r) => disputeReasonWords[r]).join('; ')}.` });
    }
    const [row] = await tx
      .insert(disputes)
      .values({ jobId, openedBy: user.id, openedSide: side, reason: input.reason, statement: input.statement, jobStatusBefore: parties.job.status })
      .returning();
    await tx.update(jobs).set({ status: 'disputed' }).where(eq(jobs.id, jobId));
    const url = jobUrl(deps, jobId);
    const reason = disputeReasonWords[input.reason].toLowerCase();
    const mail = (name: string, isOpener: boolean) => disputeOpenedMail({ name, openedBy: side, isOpener, jobTitle: parties.job.title, reason, url });
    await enqueueMail(tx, parties.builder.email, mail(parties.builder.displayName, side === 'builder'));
    if (parties.shop) await enqueueMail(tx, parties.shop.email, mail(parties.shop.name, side === 'shop'));
    for (const admin of await adminEmails(tx)) {
      await enqueueMail(tx, admin.email, mail(admin.name, false));
      await notices.add(tx, admin.id, 'dispute_opened', { jobId, text: `The ${side} opened a dispute on “${parties.job.title}” (${reason}).`, href: `/admin/disputes/${row.id}` });
    }
    const otherSide = side === 'builder' ? parties.shop?.userId : parties.builder.id;
    if (otherSide) {
      await notices.add(tx, otherSide, 'dispute_opened', { jobId, text: `The ${side} opened a dispute on “${parties.job.title}” (${reason}): give your side.`, href: `/jobs/${jobId}` });
    }
    return row;
  });
  notices.announce(deps.hub);
  deps.hub?.jobChanged(jobId, 'job_updated');
  return toDispute(dispute);
}

/** The other side answers, once. */
export async function answerDispute(deps: PaymentDeps, user: User, jobId: string, statement: string): Promise<Dispute> {
  const notices = new Notices();
  const row = await deps.db.transaction(async (tx) => {
    const parties = await partiesOf(tx, jobId, { forUpdate: true });
    const side = sideOf(parties, user);
    if (!side) {
      mustSeeWork(parties, user);
      throw forbidden('Only the builder and the shop doing the work can answer a dispute.');
    }
    const [open] = await tx.select().from(disputes).where(and(eq(disputes.jobId, jobId), eq(disputes.status, 'open'))).for('update');
    if (!open) throw conflict('There is no open dispute on this job.', 'no_open_dispute');
    if (open.openedSide === side) throw forbidden('The side that opened the dispute cannot answer it; add to it in the job’s messages.');
    if (open.response) throw conflict('This dispute already has your answer.', 'already_answered');
    const [updated] = await tx.update(disputes).set({ response: statement, responseBy: user.id, respondedAt: new Date() }).where(eq(disputes.id, open.id)).returning();
    const opener =
      open.openedSide === 'builder'
        ? { id: parties.builder.id, email: parties.builder.email, name: parties.builder.displayName }
        : { id: parties.shop!.userId, email: parties.shop!.email, name: parties.shop!.name };
    await enqueueMail(tx, opener.email, disputeAnsweredMail({ name: opener.name, jobTitle: parties.job.title, url: jobUrl(deps, jobId) }));
    await notices.add(tx, opener.id, 'dispute_answered', { jobId, text: `The ${side} answered your dispute on “${parties.job.title}”. An administrator decides next.`, href: `/jobs/${jobId}` });
    return updated;
  });
  notices.announce(deps.hub);
  deps.hub?.jobChanged(jobId, 'job_updated');
  return toDispute(row);
}

/**
 * An admin decides: release in full, refund in full, or a split. The
 * dispute's row lock makes a second decision wait and then find it decided
 * (409); the money is planned in the same transaction with keys derived from
 * the payments, so whatever happens the held money moves once.
 */
export async function resolveDispute(deps: PaymentDeps, admin: User, disputeId: string, input: ResolveDisputeInput) {
  const notices = new Notices();
  const row = await deps.db.transaction(async (tx) => {
    const [dispute] = await tx.select().from(disputes).where(eq(disputes.id, disputeId)).for('update');
    if (!dispute) throw notFound('No dispute with that id.');
    if (dispute.status !== 'open') throw conflict('This dispute has already been decided.', 'already_resolved');
    const parties = await partiesOf(tx, dispute.jobId, { forUpdate: true });
    const { held } = await jobBalance(tx, dispute.jobId);
    if (held <= 0) throw conflict('Nothing is held for this job.', 'nothing_held');
    const shopCents = input.outcome === 'release' ? held : input.outcome === 'refund' ? 0 : input.shopCents!;
    if (shopCents < 0 || shopCents > held) {
      throw new AppError('invalid_input', `The shop’s share must be between $0 and the $${(held / 100).toFixed(2)} held.`, 400, {
        shopCents: `Must be between 0 and ${held} cents.`,
      });
    }
    await planMoves(tx, dispute.jobId, shopCents);
    const [updated] = await tx
      .update(disputes)
      .set({ status: 'resolved', outcome: input.outcome, shopCents, refundCents: held - shopCents, decision: input.decision, resolvedBy: admin.id, resolvedAt: new Date() })
      .where(eq(disputes.id, dispute.id))
      .returning();
    await recordAdminAction(tx, {
      adminId: admin.id,
      action: 'dispute.resolve',
      targetType: 'dispute',
      targetId: dispute.id,
      details: { jobId: dispute.jobId, outcome: input.outcome, shopCents, refundCents: held - shopCents },
    });
    const mail = (name: string) =>
      disputeDecidedMail({ name, jobTitle: parties.job.title, outcome: input.outcome, shopCents, refundCents: held - shopCents, decision: input.decision, url: jobUrl(deps, dispute.jobId) });
    await enqueueMail(tx, parties.builder.email, mail(parties.builder.displayName));
    if (parties.shop) await enqueueMail(tx, parties.shop.email, mail(parties.shop.name));
    const decided = { jobId: dispute.jobId, text: `The dispute on “${parties.job.title}” is decided: ${outcomeWords[input.outcome]}.`, href: `/jobs/${dispute.jobId}` };
    await notices.add(tx, parties.builder.id, 'dispute_decided', decided);
    if (parties.shop) await notices.add(tx, parties.shop.userId, 'dispute_decided', decided);
    return updated;
  });
  notices.announce(deps.hub);
  const money = await carryOut(deps, row.jobId);
  return { dispute: toDispute(row), money };
}

/** The admin's queue: open disputes oldest first (or decided ones newest first), with what is held. */
export async function disputeQueue(db: Database, status: 'open' | 'resolved' | 'all'): Promise<DisputeQueueRow[]> {
  const result = await db.execute<{
    id: string;
    job_id: string;
    job_title: string;
    builder_name: string;
    shop_name: string | null;
    opened_side: Side;
    reason: DisputeReason;
    status: 'open' | 'resolved';
    opened_at: Date;
    held: number;
    answered: boolean;
  }>(sql`
    SELECT d.id, d.job_id, j.title AS job_title, b.display_name AS builder_name, s.name AS shop_name,
           d.opened_side, d.reason, d.status, d.opened_at, d.response IS NOT NULL AS answered,
           coalesce((SELECT sum(CASE WHEN l.kind = 'paid_in' THEN l.amount_cents ELSE -l.amount_cents END)
                     FROM ledger_entries l WHERE l.job_id = d.job_id), 0)::int AS held
    FROM disputes d
    JOIN jobs j ON j.id = d.job_id
    JOIN users b ON b.id = j.builder_id
    LEFT JOIN bids ab ON ab.id = j.awarded_bid_id
    LEFT JOIN shops s ON s.id = ab.shop_id
    ${status === 'all' ? sql`` : sql`WHERE d.status = ${status}`}
    ORDER BY ${status === 'open' ? sql`d.opened_at ASC` : sql`d.opened_at DESC`}
    LIMIT 500`);
  return result.rows.map((r) => ({
    id: r.id,
    jobId: r.job_id,
    jobTitle: r.job_title,
    builderName: r.builder_name,
    shopName: r.shop_name ?? '',
    openedBy: r.opened_side,
    reason: r.reason,
    status: r.status,
    openedAt: new Date(r.opened_at).toISOString(),
    heldCents: Number(r.held),
    answered: r.answered,
  }));
}

export async function findDispute(db: Executor, disputeId: string) {
  const [row] = await db.select().from(disputes).where(eq(disputes.id, disputeId));
  if (!row) throw notFound('No dispute with that id.');
  return row;
}
