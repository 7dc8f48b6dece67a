import { and, eq } from 'drizzle-orm';
import type { Executor } from '../../db/client';
import { bids, changeOrders, payments, shops, users, type User } from '../../db/schema';
import { forbidden, notFound } from '../../lib/errors';
import { findShopByUser } from '../shops/shops.repository';
import { findJob, type JobRow } from './jobs.repository';

/**
 * Who may see or change a job and its parts (bids, conversations, milestones,
 * the inspection record, money, change orders, the dispute, reviews, photos,
 * the live room). Every service asks here; routes only guard by role.
 *
 * The answers keep one pattern: to someone with no business on a job, a draft
 * (or the thing asked for) does not exist (404); someone who may know the job
 * exists but may not do this gets 403.
 */

const noJob = () => notFound('No job with that id.');

// ---------------------------------------------------------------------------
// The people on a job

export interface JobParties {
  job: JobRow;
  builder: { id: string; email: string; displayName: string };
  shop: { id: string; userId: string; email: string; name: string } | null;
}

/** The shop the job's accepted bid came from, if any. */
export async function awardedShopId(db: Executor, job: Pick<JobRow, 'awardedBidId'>): Promise<string | undefined> {
  if (!job.awardedBidId) return undefined;
  const [awarded] = await db.select({ shopId: bids.shopId }).from(bids).where(eq(bids.id, job.awardedBidId));
  return awarded?.shopId;
}

/**
 * A job with its builder and (once a bid is accepted) the shop doing the work.
 * With a payment, the shop is the one that payment was for (its bid or change
 * order), which a cancelled job no longer names as awarded.
 */
export async function partiesOf(
  db: Executor,
  jobId: string,
  options: { forUpdate?: boolean; payment?: Pick<typeof payments.$inferSelect, 'bidId' | 'changeOrderId'> } = {},
): Promise<JobParties> {
  const job = await findJob(db, jobId, { forUpdate: options.forUpdate });
  if (!job) throw noJob();
  const [builder] = await db.select({ id: users.id, email: users.email, displayName: users.displayName }).from(users).where(eq(users.id, job.builderId));
  const { payment } = options;
  const bidId = payment?.bidId ?? job.awardedBidId;
  const [owner] = payment?.changeOrderId
    ? await db.select({ shopId: changeOrders.shopId }).from(changeOrders).where(eq(changeOrders.id, payment.changeOrderId))
    : bidId
      ? await db.select({ shopId: bids.shopId }).from(bids).where(eq(bids.id, bidId))
      : [];
  const [shop] = owner
    ? await db.select({ id: shops.id, userId: shops.userId, email: users.email, name: shops.name }).from(shops).innerJoin(users, eq(users.id, shops.userId)).where(eq(shops.id, owner.shopId))
    : [];
  return { job, builder, shop: shop ?? null };
}

/** The user ids on a job's two sides: its builder and, once a bid is accepted, the user of the shop doing the work. */
export async function partyUserIds(db: Executor, job: Pick<JobRow, 'builderId' | 'awardedBidId'>): Promise<string[]> {
  const parties = [job.builderId];
  if (job.awardedBidId) {
    const [shop] = await db.select({ userId: shops.userId }).from(bids).innerJoin(shops, eq(shops.id, bids.shopId)).where(eq(bids.id, job.awardedBidId));
    if (shop) parties.push(shop.userId);
  }
  return parties;
}

export async function partyUserIdsById(db: Executor, jobId: string): Promise<string[]> {
  const job = await findJob(db, jobId);
  if (!job) throw noJob();
  return partyUserIds(db, job);
}

/** Which side of the job this person is on: its builder, the shop doing the work, or neither. */
export function sideOf(parties: JobParties, user: User): 'builder' | 'shop' | null {
  if (parties.builder.id === user.id) return 'builder';
  return parties.shop?.userId === user.id ? 'shop' : null;
}

// ---------------------------------------------------------------------------
// The job itself

/**
 * Who may see a job: its builder and admins always; shops while it is open,
 * and afterwards only shops that bid on it. A draft is nobody else's business,
 * so to others it does not exist (404).
 */
export async function jobForViewer(db: Executor, jobId: string, user: User): Promise<JobRow> {
  const job = await findJob(db, jobId);
  if (!job) throw noJob();
  if (user.role === 'admin' || job.builderId === user.id) return job;
  if (job.status === 'draft') throw noJob();
  if (user.role === 'shop') {
    if (job.status === 'open') return job;
    const shop = await findShopByUser(db, user.id);
    if (shop) {
      const [bid] = await db.select({ id: bids.id }).from(bids).where(and(eq(bids.jobId, job.id), eq(bids.shopId, shop.id))).limit(1);
      if (bid) return job;
    }
  }
  throw forbidden('This job is not yours to see.');
}

/** A change by the job's builder: 404 for a missing job or someone else's draft, 403 for someone else's job. */
export function mustOwnJob(job: JobRow | undefined, user: User, message = 'Only the builder who posted this job can change it.'): JobRow {
  if (!job || (job.builderId !== user.id && job.status === 'draft')) throw noJob();
  if (job.builderId !== user.id) throw forbidden(message);
  return job;
}

/** Something only the job's builder may ask for, and to anyone else it does not exist (404 with the caller's words). */
export function mustBeBuilder<T extends Pick<JobRow, 'builderId'>>(job: T | undefined, user: User, missing = 'No job with that id.'): T {
  if (!job || job.builderId !== user.id) throw notFound(missing);
  return job;
}

/** A job anyone may see whose status keeps drafts to their builder (threads): 404 for a missing job or someone else's draft. */
export function mustSeeDraft(job: JobRow | undefined, user: User): JobRow {
  if (!job || (job.status === 'draft' && job.builderId !== user.id)) throw noJob();
  return job;
}

/**
 * Who may follow a job's live changes (`job:watch`): while it is open, whoever
 * may see it; after that only its builder, the shop doing the work and admins.
 * A losing bidder may still read the job and its own bid, but not follow the
 * work as it happens.
 */
export async function jobForLiveWatcher(db: Executor, jobId: string, user: User): Promise<JobRow> {
  const job = await jobForViewer(db, jobId, user);
  if (job.status === 'open' || user.role === 'admin') return job;
  if ((await partyUserIds(db, job)).includes(user.id)) return job;
  throw forbidden('Only the builder and the shop doing the work follow this job live.');
}

// ---------------------------------------------------------------------------
// The work: milestones, inspection record, change orders, dispute, reviews

/** Only the builder, the shop doing the work and admins see a job's work record; others get 404 for drafts and 403 otherwise. */
export function mustSeeWork(parties: JobParties, user: User): void {
  if (user.role === 'admin' || parties.builder.id === user.id || parties.shop?.userId === user.id) return;
  if (parties.job.status === 'draft') throw noJob();
  throw forbidden('Only the builder and the shop doing the work see this.');
}

/** The job's work record, if this person may see it. */
export async function workPartiesFor(db: Executor, jobId: string, user: User): Promise<JobParties> {
  const parties = await partiesOf(db, jobId);
  mustSeeWork(parties, user);
  return parties;
}

/** Only the job's builder: others who see the work get 403 with the caller's words; everyone else as mustSeeWork says. */
export function mustBeJobsBuilder(parties: JobParties, user: User, message: string): void {
  if (parties.builder.id === user.id) return;
  mustSeeWork(parties, user);
  throw forbidden(message);
}

/** Only the shop doing the work: 403 for the job's other side and admins, 404 for everyone else. */
export function mustBeWorkingShop(parties: JobParties, user: User): void {
  if (parties.shop?.userId !== user.id) {
    if (parties.builder.id === user.id || user.role === 'admin') throw forbidden('Only the shop doing the work can do this.');
    throw noJob();
  }
}

/** The shop doing the work on a job, by the shop's row: 403 with the caller's words otherwise. */
export async function mustBeAwardedShop(db: Executor, job: Pick<JobRow, 'awardedBidId'>, shopId: string, message: string): Promise<void> {
  if ((await awardedShopId(db, job)) !== shopId) throw forbidden(message);
}

/** Who may see a job's money: its builder, the awarded shop, admins; a draft is the builder's alone. */
export async function mustSeeMoney(db: Executor, jobId: string, user: User): Promise<JobRow> {
  const job = await findJob(db, jobId);
  if (!job) throw noJob();
  if (user.role !== 'admin' && job.builderId !== user.id) {
    if (job.status === 'draft') throw noJob();
    const shop = user.role === 'shop' ? await findShopByUser(db, user.id) : undefined;
    const awarded = await awardedShopId(db, job);
    if (!shop || awarded !== shop.id) throw forbidden('This job’s money is not yours to see.');
  }
  return job;
}

// ---------------------------------------------------------------------------
// Bids and conversations

/** A bid is seen by the shop that made it, the job's builder and admins; to anyone else it does not exist. */
export async function mustSeeBid(db: Executor, user: User, bid: { shopId: string; jobId: string }): Promise<void> {
  if (user.role === 'admin') return;
  const shop = user.role === 'shop' ? await findShopByUser(db, user.id) : undefined;
  const job = await findJob(db, bid.jobId);
  if (shop?.id !== bid.shopId && job?.builderId !== user.id) throw notFound('No bid with that id.');
}

/** A job's bid list: a shop sees its own, the builder all, admins all; another builder is refused (403). */
export function mustListBids(job: JobRow, user: User): void {
  if (user.role === 'builder' && job.builderId !== user.id) throw forbidden('Only the builder who posted this job sees its bids.');
}

/** A change to a bid by the shop that made it (404 otherwise). */
export function mustBeBidsShop(bid: { shopId: string }, shopId: string): void {
  if (bid.shopId !== shopId) throw notFound('No bid with that id.');
}

/**
 * A conversation is between a job's builder and one shop; they read and write
 * it, admins read it, to anyone else it does not exist. Returns whether the
 * person is one of the two.
 */
export function mustReadThread(job: Pick<JobRow, 'builderId'>, shopUserId: string, user: User): boolean {
  const isParty = user.id === job.builderId || user.id === shopUserId;
  if (!isParty && user.role !== 'admin') throw notFound('No conversation with that id.');
  return isParty;
}
