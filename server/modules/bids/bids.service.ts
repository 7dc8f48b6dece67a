import { and, asc, desc, eq, inArray, ne, or, sql } from 'drizzle-orm';
import { lineAmountCents } from '../../../shared/catalogue';
import { netOf } from '../../../shared/money';
import { daysUntil } from '../../../shared/due-day';
import type { Bid, BidInput, BidLine, BidRevision, QueueJob, QueueStage, ShopBid } from '../../../shared/schemas/bids';
import type { JobStatus } from '../../../shared/schemas/jobs';
import type { Database, Executor } from '../../db/client';
import { bidLineItems, bidRevisions, bids, inspectionRecords, jobs, milestones, shops, users, type User } from '../../db/schema';
import { assertEmailConfirmed } from '../../lib/auth/guards';
import { AppError, conflict, notFound } from '../../lib/errors';
import { enqueueMail } from '../../lib/mail/outbox';
import { bidAcceptedMail, bidDeclinedMail, bidRevisedMail, newBidMail } from '../../lib/mail/templates';
import type { RealtimeHub } from '../../realtime/hub';
import { currentFee } from '../admin/platform-fee';
import { dueDaysOf } from '../jobs/due-days';
import { findJob, type JobRow } from '../jobs/jobs.repository';
import { jobForViewer, mustBeBidsShop, mustBeBuilder, mustListBids, mustSeeBid, partyUserIdsById } from '../jobs/job-access';
import { findShopByUser, shopIsListed, shopSuspended, type ShopRow } from '../shops/shops.repository';
import { shopRatings } from '../reviews/ratings';
import { shopStandings } from '../standing/standing.repository';
import { Notices } from '../notifications/notify';
import { formatCents } from '../../../shared/catalogue';
import { distanceUnitFor, METRES_PER } from '../../../shared/distance';
import { earthOf, metresBetween } from '../../db/earth';

export interface BidDeps {
  db: Database;
  appUrl: string;
  /** The platform's fee, fixed on the job when a bid is accepted. */
  platformFeeBps?: number;
  /** Open pages of the job hear of each bid change (absent in scripts without live clients). */
  hub?: RealtimeHub;
}

type BidRow = typeof bids.$inferSelect;
type MilestoneKind = (typeof milestones.$inferSelect)['kind'];

const today = () => new Date().toISOString().slice(0, 10);

/** Lines with their amounts, and the total, all in integer cents, worked out here and nowhere else. */
export function priceLines(input: BidInput): { lines: BidLine[]; totalCents: number } {
  const lines = input.lineItems.map((item) => ({
    operation: item.operation ?? null,
    description: item.description,
    quantity: item.quantity,
    unitPriceCents: item.unitPriceCents,
    amountCents: lineAmountCents(item.quantity, item.unitPriceCents),
  }));
  const totalCents = lines.reduce((sum, line) => sum + line.amountCents, 0);
  if (!Number.isSafeInteger(totalCents) || totalCents > 2_000_000_000) {
    throw new AppError('invalid_input', 'The total is too large.', 400, { lineItems: 'The total is too large.' });
  }
  return { lines, totalCents };
}

async function requireShop(db: Executor, user: User): Promise<ShopRow> {
  const shop = await findShopByUser(db, user.id);
  if (!shop) throw conflict('Set up your shop profile before you bid.', 'no_shop_profile');
  return shop;
}

async function writeLines(tx: Executor, bidId: string, lines: BidLine[]) {
  await tx.delete(bidLineItems).where(eq(bidLineItems.bidId, bidId));
  await tx.insert(bidLineItems).values(lines.map((line, position) => ({ bidId, position, ...line })));
}

const jobUrl = (deps: BidDeps, jobId: string) => `${deps.appUrl}/jobs/${jobId}`;

async function builderOf(tx: Executor, job: JobRow) {
  const [builder] = await tx.select({ email: users.email, displayName: users.displayName }).from(users).where(eq(users.id, job.builderId));
  return builder;
}

async function shopContact(tx: Executor, shopId: string) {
  const [row] = await tx
    .select({ name: shops.name, email: users.email, userId: shops.userId })
    .from(shops)
    .innerJoin(users, eq(users.id, shops.userId))
    .where(eq(shops.id, shopId));
  return row;
}

/** The shop's input for a bid placed or revised: its sender may bid, its lines priced, its date not past. */
function checkedBid(user: User, input: BidInput) {
  assertEmailConfirmed(user, 'bid');
  const priced = priceLines(input);
  if (input.validUntil < today()) throw new AppError('invalid_input', 'A bid must be valid until today or later.', 400, { validUntil: 'Pick today or a later date.' });
  return priced;
}

/** What a bid row takes from the shop's input: the priced total, the terms, and the job revision it answers. */
const bidTerms = (input: BidInput, totalCents: number, job: JobRow) => ({
  totalCents,
  turnaroundDays: input.turnaroundDays,
  validUntil: input.validUntil,
  note: input.note,
  jobRevision: job.revision,
});

/** Tells the job's builder, in the bid's transaction, of a bid placed or revised: a mail and a notice. */
async function tellBuilder(
  tx: Executor,
  deps: BidDeps,
  job: JobRow,
  mail: typeof newBidMail,
  bid: { shopName: string; totalCents: number; turnaroundDays: number },
  notices: Notices,
) {
  const builder = await builderOf(tx, job);
  await enqueueMail(tx, builder.email, mail({ builderName: builder.displayName, jobTitle: job.title, url: jobUrl(deps, job.id), ...bid }));
  const verb = mail === newBidMail ? 'bid' : 'revised its bid to';
  await notices.add(tx, job.builderId, 'bid_received', {
    jobId: job.id,
    text: `${bid.shopName} ${verb} ${formatCents(bid.totalCents)} on “${job.title}”, ready in ${bid.turnaroundDays} days.`,
    href: `/jobs/${job.id}`,
  });
}

export async function createBid(deps: BidDeps, user: User, jobId: string, input: BidInput): Promise<string> {
  const { lines, totalCents } = checkedBid(user, input);
  const notices = new Notices();
  const bidId = await deps.db.transaction(async (tx) => {
    const shop = await requireShop(tx, user);
    const job = await findJob(tx, jobId, { forUpdate: true });
    if (!job || job.status === 'draft') throw notFound('No job with that id.');
    if (job.status !== 'open') throw conflict('This job is no longer taking bids.', 'job_not_open');
    const [existing] = await tx
      .select({ id: bids.id })
      .from(bids)
      .where(and(eq(bids.jobId, job.id), eq(bids.shopId, shop.id), eq(bids.status, 'active')));
    if (existing) throw conflict('Your shop already has a bid on this job; revise it instead.', 'bid_exists');
    const [bid] = await tx
      .insert(bids)
      .values({ jobId: job.id, shopId: shop.id, ...bidTerms(input, totalCents, job) })
      .returning();
    await writeLines(tx, bid.id, lines);
    await tx.update(jobs).set({ bidCount: sql`${jobs.bidCount} + 1` }).where(eq(jobs.id, job.id));
    await tellBuilder(tx, deps, job, newBidMail, { shopName: shop.name, totalCents, turnaroundDays: input.turnaroundDays }, notices);
    return bid.id;
  });
  notices.announce(deps.hub);
  deps.hub?.jobChanged(jobId, 'bid_placed');
  return bidId;
}

/** Locks the bid's job, then the bid, always in that order, so bid changes never deadlock each other. */
async function lockBidAndJob(tx: Executor, bidId: string): Promise<{ bid: BidRow; job: JobRow }> {
  const [peek] = await tx.select({ jobId: bids.jobId }).from(bids).where(eq(bids.id, bidId));
  if (!peek) throw notFound('No bid with that id.');
  const job = await findJob(tx, peek.jobId, { forUpdate: true });
  const [bid] = await tx.select().from(bids).where(eq(bids.id, bidId)).for('update');
  if (!job || !bid) throw notFound('No bid with that id.');
  return { bid, job };
}

async function ownBid(tx: Executor, user: User, bidId: string) {
  const shop = await requireShop(tx, user);
  const locked = await lockBidAndJob(tx, bidId);
  mustBeBidsShop(locked.bid, shop.id);
  return { ...locked, shop };
}

export async function reviseBid(deps: BidDeps, user: User, bidId: string, input: BidInput): Promise<void> {
  const { lines, totalCents } = checkedBid(user, input);
  const notices = new Notices();
  const jobId = await deps.db.transaction(async (tx) => {
    const { bid, job, shop } = await ownBid(tx, user, bidId);
    if (bid.status !== 'active') throw conflict('Only an active bid can be revised.', 'bid_not_active');
    if (job.status !== 'open') throw conflict('This job is no longer taking bids.', 'job_not_open');
    const previous = await tx.select().from(bidLineItems).where(eq(bidLineItems.bidId, bid.id)).orderBy(asc(bidLineItems.position));
    await tx.insert(bidRevisions).values({
      bidId: bid.id,
      version: bid.version,
      totalCents: bid.totalCents,
      turnaroundDays: bid.turnaroundDays,
      validUntil: bid.validUntil,
      note: bid.note,
      lineItems: previous.map(({ operation, description, quantity, unitPriceCents, amountCents }) => ({ operation, description, quantity, unitPriceCents, amountCents })),
      createdAt: bid.updatedAt,
    });
    await tx
      .update(bids)
      .set({ version: bid.version + 1, ...bidTerms(input, totalCents, job) })
      .where(eq(bids.id, bid.id));
    await writeLines(tx, bid.id, lines);
    await tellBuilder(tx, deps, job, bidRevisedMail, { shopName: shop.name, totalCents, turnaroundDays: input.turnaroundDays }, notices);
    return job.id;
  });
  notices.announce(deps.hub);
  deps.hub?.jobChanged(jobId, 'bid_revised');
}

export async function withdrawBid(deps: BidDeps, user: User, bidId: string): Promise<void> {
  const jobId = await deps.db.transaction(async (tx) => {
    const { bid, job } = await ownBid(tx, user, bidId);
    if (bid.status !== 'active') throw conflict('Only an active bid can be withdrawn.', 'bid_not_active');
    await tx.update(bids).set({ status: 'withdrawn', decidedAt: new Date() }).where(eq(bids.id, bid.id));
    await tx.update(jobs).set({ bidCount: sql`greatest(${jobs.bidCount} - 1, 0)` }).where(eq(jobs.id, job.id));
    return job.id;
  });
  deps.hub?.jobChanged(jobId, 'bid_withdrawn');
}

async function builderBid(tx: Executor, user: User, bidId: string) {
  const locked = await lockBidAndJob(tx, bidId);
  mustBeBuilder(locked.job, user, 'No bid with that id.');
  return locked;
}

/**
 * Accepts one bid: in one transaction the job becomes awarded, this bid
 * accepted and every other active bid declined. The job's row lock makes
 * racing accepts wait; the first wins and the rest find the job awarded (409).
 */
export async function acceptBid(deps: BidDeps, user: User, bidId: string): Promise<void> {
  const notices = new Notices();
  const jobId = await deps.db.transaction(async (tx) => {
    const { bid, job } = await builderBid(tx, user, bidId);
    if (job.status !== 'open') throw conflict('This job already has an accepted bid, or is closed.', 'job_not_open');
    if (bid.status !== 'active') throw conflict('This bid is no longer active.', 'bid_not_active');
    if (bid.validUntil < today()) throw conflict('This bid has expired; ask the shop to revise it.', 'bid_expired');
    const [shop] = await tx.select({ ready: shops.payoutsReadyAt }).from(shops).where(eq(shops.id, bid.shopId));
    if (await shopSuspended(tx, bid.shopId)) throw conflict('This shop’s account is suspended, so its bid cannot be accepted.', 'shop_suspended');
    if (!shop?.ready) throw conflict('This shop has not finished setting up its payout account, so its bid cannot be accepted yet.', 'shop_payouts_not_ready');
    const now = new Date();
    await tx.update(bids).set({ status: 'accepted', decidedAt: now }).where(eq(bids.id, bid.id));
    const declined = await tx
      .update(bids)
      .set({ status: 'declined', decidedAt: now, declineReason: 'Another bid was accepted.' })
      .where(and(eq(bids.jobId, job.id), ne(bids.id, bid.id), eq(bids.status, 'active')))
      .returning({ shopId: bids.shopId });
    // The fee in force now is fixed on the job: a later change by an administrator applies to new awards only.
    const { feeBps } = await currentFee(tx, deps.platformFeeBps ?? 0);
    await tx.update(jobs).set({ status: 'awarded', awardedBidId: bid.id, feeBps }).where(eq(jobs.id, job.id));

    const winner = await shopContact(tx, bid.shopId);
    await enqueueMail(tx, winner.email, bidAcceptedMail({ shopName: winner.name, jobTitle: job.title, totalCents: bid.totalCents, url: jobUrl(deps, job.id) }));
    await notices.add(tx, winner.userId, 'bid_accepted', {
      jobId: job.id,
      text: `Your bid of ${formatCents(bid.totalCents)} on “${job.title}” was accepted. Work starts once the builder pays.`,
      href: `/jobs/${job.id}`,
    });
    for (const { shopId } of declined) {
      const loser = await shopContact(tx, shopId);
      await enqueueMail(tx, loser.email, bidDeclinedMail({ shopName: loser.name, jobTitle: job.title, url: `${deps.appUrl}/board` }));
    }
    return job.id;
  });
  notices.announce(deps.hub);
  deps.hub?.jobChanged(jobId, 'bid_accepted');
  // The losing shops heard of the award; the work that follows is for the two sides only.
  deps.hub?.keepOnlyParties(jobId, await partyUserIdsById(deps.db, jobId));
}

export async function declineBid(deps: BidDeps, user: User, bidId: string, reason: string): Promise<void> {
  const jobId = await deps.db.transaction(async (tx) => {
    const { bid, job } = await builderBid(tx, user, bidId);
    if (bid.status !== 'active') throw conflict('This bid is no longer active.', 'bid_not_active');
    // The bid count is bids received and not withdrawn: a declined bid still counts.
    await tx.update(bids).set({ status: 'declined', decidedAt: new Date(), declineReason: reason || null }).where(eq(bids.id, bid.id));
    const shop = await shopContact(tx, bid.shopId);
    await enqueueMail(tx, shop.email, bidDeclinedMail({ shopName: shop.name, jobTitle: job.title, reason, url: `${deps.appUrl}/board` }));
    return job.id;
  });
  deps.hub?.jobChanged(jobId, 'bid_declined');
}

/** Bids as their readers see them, with lines, shop and how well the shop's capabilities cover the job. */
async function present(db: Executor, rows: BidRow[]): Promise<Bid[]> {
  if (rows.length === 0) return [];
  const ids = rows.map((r) => r.id);
  const [lines, shopRows, jobRows, distanceRows] = await Promise.all([
    db.select().from(bidLineItems).where(inArray(bidLineItems.bidId, ids)).orderBy(asc(bidLineItems.position)),
    db.select().from(shops).where(inArray(shops.id, [...new Set(rows.map((r) => r.shopId))])),
    db.select({ id: jobs.id, operations: jobs.operations }).from(jobs).where(inArray(jobs.id, [...new Set(rows.map((r) => r.jobId))])),
    // Metres from each bidding shop to the job's place (null when either postal code gave no place).
    db
      .select({ id: bids.id, metres: metresBetween(earthOf(jobs.latitude, jobs.longitude), earthOf(shops.latitude, shops.longitude)), country: jobs.country })
      .from(bids)
      .innerJoin(jobs, eq(jobs.id, bids.jobId))
      .innerJoin(shops, eq(shops.id, bids.shopId))
      .where(inArray(bids.id, ids)),
  ]);
  const distanceOf = new Map(
    distanceRows.map(({ id, metres, country }) => {
      const unit = distanceUnitFor(country);
      return [id, metres === null ? null : { value: metres / METRES_PER[unit], unit }];
    }),
  );
  const shopById = new Map(shopRows.map((s) => [s.id, s]));
  const [ratings, standings] = await Promise.all([shopRatings(db, [...shopById.keys()]), shopStandings(db, [...shopById.keys()])]);
  const opsByJob = new Map(jobRows.map((j) => [j.id, j.operations]));
  return rows.map((row) => {
    const shop = shopById.get(row.shopId)!;
    const ops = opsByJob.get(row.jobId) ?? [];
    const covered = ops.filter((op) => shop.capabilities.includes(op)).length;
    return {
      id: row.id,
      jobId: row.jobId,
      status: row.status,
      version: row.version,
      totalCents: row.totalCents,
      turnaroundDays: row.turnaroundDays,
      validUntil: row.validUntil,
      note: row.note,
      lineItems: lines
        .filter((l) => l.bidId === row.id)
        .map(({ operation, description, quantity, unitPriceCents, amountCents }) => ({ operation, description, quantity, unitPriceCents, amountCents })),
      shop: { id: shop.id, name: shop.name, country: shop.country, region: shop.region, city: shop.city, verified: shop.verifiedAt !== null, rating: ratings.get(shop.id) ?? null, standing: standings.get(shop.id)! },
      capabilityMatch: ops.length ? covered / ops.length : 1,
      distance: distanceOf.get(row.id) ?? null,
      createdAt: row.createdAt.toISOString(),
      updatedAt: row.updatedAt.toISOString(),
    };
  });
}

/**
 * A job's bids: its own for a shop; for its builder every bid except those of
 * suspended shops, which disappear, though the bid the builder accepted stays
 * (they need to know who has their block); everything for admins.
 */
export async function bidsForJob(deps: BidDeps, user: User, jobId: string): Promise<Bid[]> {
  const job = await jobForViewer(deps.db, jobId, user);
  let where = eq(bids.jobId, job.id);
  mustListBids(job, user);
  if (user.role === 'shop') {
    const shop = await findShopByUser(deps.db, user.id);
    if (!shop) return [];
    where = and(where, eq(bids.shopId, shop.id))!;
  } else if (user.role === 'builder') {
    const listedShops = deps.db.select({ id: shops.id }).from(shops).where(shopIsListed);
    where = and(where, or(eq(bids.status, 'accepted'), inArray(bids.shopId, listedShops)))!;
  }
  const rows = await deps.db.select().from(bids).where(where).orderBy(asc(bids.totalCents), asc(bids.createdAt));
  return present(deps.db, rows);
}

export async function bidWithHistory(deps: BidDeps, user: User, bidId: string): Promise<{ bid: Bid; revisions: BidRevision[] }> {
  const [row] = await deps.db.select().from(bids).where(eq(bids.id, bidId));
  if (!row) throw notFound('No bid with that id.');
  await mustSeeBid(deps.db, user, row);
  const [bid] = await present(deps.db, [row]);
  const revisions = await deps.db.select().from(bidRevisions).where(eq(bidRevisions.bidId, row.id)).orderBy(desc(bidRevisions.version));
  return {
    bid,
    revisions: revisions.map((r) => ({
      version: r.version,
      totalCents: r.totalCents,
      turnaroundDays: r.turnaroundDays,
      validUntil: r.validUntil,
      note: r.note,
      lineItems: r.lineItems as BidLine[],
      createdAt: r.createdAt.toISOString(),
    })),
  };
}

/** The platform's fee rate a bid accepted now would be charged. */
export async function feeRateNow(deps: BidDeps): Promise<{ feeBps: number }> {
  const { feeBps } = await currentFee(deps.db, deps.platformFeeBps ?? 0);
  return { feeBps };
}

/** When each of these jobs first had a milestone of this kind logged ("parts received", "shipped"). */
async function firstLogged(db: Executor, jobIds: string[], kind: MilestoneKind): Promise<Map<string, Date>> {
  if (jobIds.length === 0) return new Map();
  const rows = await db
    .select({ jobId: milestones.jobId, at: sql<Date>`min(${milestones.createdAt})`.mapWith(milestones.createdAt) })
    .from(milestones)
    .where(and(inArray(milestones.jobId, jobIds), eq(milestones.kind, kind)))
    .groupBy(milestones.jobId);
  return new Map(rows.map((r) => [r.jobId, r.at]));
}

export async function bidsOfShop(deps: BidDeps, user: User): Promise<ShopBid[]> {
  const shop = await findShopByUser(deps.db, user.id);
  if (!shop) return [];
  const rows = await deps.db.select().from(bids).where(eq(bids.shopId, shop.id)).orderBy(desc(bids.updatedAt));
  const presented = await present(deps.db, rows);
  const jobIds = rows.map((r) => r.jobId);
  const acceptedJobIds = rows.filter((r) => r.status === 'accepted').map((r) => r.jobId);
  const [jobRows, dueDays, { feeBps: rateNow }] = await Promise.all([
    jobIds.length ? deps.db.select({ id: jobs.id, title: jobs.title, status: jobs.status, feeBps: jobs.feeBps }).from(jobs).where(inArray(jobs.id, jobIds)) : [],
    dueDaysOf(deps.db, acceptedJobIds),
    feeRateNow(deps),
  ]);
  const byId = new Map(jobRows.map((t) => [t.id, t]));
  return presented.map((b) => {
    const job = byId.get(b.jobId);
    const accepted = b.status === 'accepted';
    // An accepted bid pays the rate fixed on its job; any other would pay today's.
    const feeBps = accepted ? (job?.feeBps ?? rateNow) : rateNow;
    const dueOn = accepted ? (dueDays.get(b.jobId) ?? null) : null;
    return { ...b, jobTitle: job?.title ?? '', jobStatus: job?.status ?? '', feeBps, ...netOf(b.totalCents, feeBps), dueOn };
  });
}

/** A won job's statuses while the shop still has work or a handover to do. */
const QUEUED: JobStatus[] = ['awarded', 'funded', 'in_work', 'inspection_submitted'];

/** Where a queued job stands: the parts on their way back count from the moment they are logged, a record asked to change while it is being redone. */
function stageOf(status: JobStatus, facts: { shipped: boolean; readyForPickup: boolean; changesAsked: boolean }): QueueStage {
  if (status === 'awarded') return 'payment_due';
  if (status === 'funded') return 'waiting_for_parts';
  if (status === 'in_work' && facts.changesAsked) return 'changes_asked';
  if (facts.shipped) return 'shipped_back';
  if (facts.readyForPickup) return 'ready_for_pickup';
  return status === 'inspection_submitted' ? 'record_submitted' : 'in_shop';
}

/** The shop's won jobs not finished yet, soonest due first, each with its stage and the whole days left (negative once overdue). */
export async function workQueue(deps: BidDeps, user: User, now = new Date()): Promise<QueueJob[]> {
  const shop = await findShopByUser(deps.db, user.id);
  if (!shop) return [];
  const rows = await deps.db
    .select({ job: { id: jobs.id, title: jobs.title, status: jobs.status }, bid: { turnaroundDays: bids.turnaroundDays }, builderName: users.displayName })
    .from(jobs)
    .innerJoin(bids, eq(bids.id, jobs.awardedBidId))
    .innerJoin(users, eq(users.id, jobs.builderId))
    .where(and(eq(bids.shopId, shop.id), inArray(jobs.status, QUEUED)));
  const jobIds = rows.map((r) => r.job.id);
  const [dueDays, shippedOn, readyOn, latestRecords] = await Promise.all([
    dueDaysOf(deps.db, jobIds),
    firstLogged(deps.db, jobIds, 'shipped'),
    firstLogged(deps.db, jobIds, 'ready_for_pickup'),
    jobIds.length
      ? deps.db
          .selectDistinctOn([inspectionRecords.jobId], { jobId: inspectionRecords.jobId, status: inspectionRecords.status })
          .from(inspectionRecords)
          .where(inArray(inspectionRecords.jobId, jobIds))
          .orderBy(inspectionRecords.jobId, desc(inspectionRecords.version))
      : [],
  ]);
  const rejected = new Set(latestRecords.filter((r) => r.status === 'rejected').map((r) => r.jobId));
  return rows
    .map(({ job, bid, builderName }) => {
      const dueOn = dueDays.get(job.id) ?? now.toISOString().slice(0, 10);
      const facts = { shipped: shippedOn.has(job.id), readyForPickup: readyOn.has(job.id), changesAsked: rejected.has(job.id) };
      return {
        jobId: job.id,
        title: job.title,
        status: job.status,
        stage: stageOf(job.status, facts),
        dueOn,
        daysLeft: daysUntil(dueOn, now),
        turnaroundDays: bid.turnaroundDays,
        builderName,
      };
    })
    .sort((a, b) => a.dueOn.localeCompare(b.dueOn) || a.title.localeCompare(b.title));
}
