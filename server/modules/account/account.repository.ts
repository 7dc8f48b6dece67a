import { and, desc, eq, inArray, or, sql } from 'drizzle-orm';
import type { AnyPgColumn } from 'drizzle-orm/pg-core';
import type { Executor } from '../../db/client';
import {
  bidLineItems,
  bids,
  changeOrders,
  disputes,
  inspectionRecords,
  jobs,
  ledgerEntries,
  messages,
  milestones,
  moneyMoves,
  payments,
  reviews,
  shops,
  threads,
  users,
  type User,
} from '../../db/schema';

/** The shop of a shop account, if it has made one. */
export async function shopOfUser(db: Executor, userId: string) {
  const [shop] = await db.select().from(shops).where(eq(shops.userId, userId));
  return shop;
}

/**
 * The jobs a person took part in: a builder's own jobs; for a shop, the jobs
 * whose accepted bid is (or was) the shop's.
 */
export async function partyJobIds(db: Executor, user: User, shopId: string | undefined): Promise<string[]> {
  if (user.role === 'builder') {
    return (await db.select({ id: jobs.id }).from(jobs).where(eq(jobs.builderId, user.id))).map((r) => r.id);
  }
  if (!shopId) return [];
  const rows = await db
    .selectDistinct({ id: bids.jobId })
    .from(bids)
    .where(and(eq(bids.shopId, shopId), eq(bids.status, 'accepted')));
  return rows.map((r) => r.id);
}

/** Jobs of a person still in progress, with the words the page shows for each. */
const jobInProgressReason: Record<string, string> = {
  open: 'It is open on the board. Cancel it first; its bids close and the shops are told.',
  awarded: 'A bid is accepted and the payment is due. Pay or cancel it first.',
  funded: 'It is paid and the money is held until the work is accepted.',
  in_work: 'The shop is working on it.',
  inspection_submitted: 'Results wait for the builder’s review.',
  disputed: 'A dispute about it is open.',
};

/** What stands in the way of closing this account: jobs in progress and money still on its way. */
export async function deletionBlockers(db: Executor, user: User, shopId: string | undefined) {
  const busy = Object.keys(jobInProgressReason).filter((s) => user.role === 'builder' || s !== 'open') as Array<(typeof jobs.$inferSelect)['status']>;
  const mine =
    user.role === 'builder'
      ? eq(jobs.builderId, user.id)
      : shopId
        ? sql`EXISTS (SELECT 1 FROM ${bids} WHERE ${bids.jobId} = ${jobs.id} AND ${bids.shopId} = ${shopId} AND ${bids.status} = 'accepted')`
        : sql`false`;
  const inProgress = await db
    .select({ jobId: jobs.id, jobTitle: jobs.title, status: jobs.status })
    .from(jobs)
    .where(and(mine, inArray(jobs.status, busy)))
    .orderBy(jobs.createdAt);
  const moneyOnItsWay = await db
    .selectDistinct({ jobId: jobs.id, jobTitle: jobs.title })
    .from(moneyMoves)
    .innerJoin(jobs, eq(jobs.id, moneyMoves.jobId))
    .where(and(mine, eq(moneyMoves.status, 'pending')));
  return [
    ...inProgress.map((j) => ({ jobId: j.jobId, jobTitle: j.jobTitle, reason: jobInProgressReason[j.status] })),
    ...moneyOnItsWay.map((j) => ({ jobId: j.jobId, jobTitle: j.jobTitle, reason: 'Money for this job is still on its way (a payout or a refund). Wait until it has arrived.' })),
  ];
}

/** A shop's bids still open on the board, which closing the account withdraws. */
export async function activeBidsOfShop(db: Executor, shopId: string) {
  return db
    .select({ id: bids.id, jobId: bids.jobId, jobTitle: jobs.title })
    .from(bids)
    .innerJoin(jobs, eq(jobs.id, bids.jobId))
    .where(and(eq(bids.shopId, shopId), eq(bids.status, 'active')));
}

type JobRow = typeof jobs.$inferSelect;

/** A job row without where its builder is (postal code, coordinates, the postal code in the specification); the town and region stay. */
function withoutBuildersPlace({ postalCode: _postalCode, latitude: _latitude, longitude: _longitude, ...job }: JobRow): Omit<JobRow, 'postalCode' | 'latitude' | 'longitude'> {
  const { postalCode: _specPostalCode, ...spec } = job.spec as Record<string, unknown>;
  return { ...job, spec };
}

/** Everything stored about the jobs a person took part in, for their export. */
export async function exportRows(db: Executor, user: User, shopId: string | undefined, jobIds: string[]) {
  const inJobs = (column: AnyPgColumn) => (jobIds.length > 0 ? inArray(column, jobIds) : sql`false`);
  // Other people appear by name: the other party's display name, never their address.
  const theirBids =
    user.role === 'builder'
      ? inJobs(bids.jobId)
      : shopId
        ? eq(bids.shopId, shopId)
        : sql`false`;
  const myThreads =
    user.role === 'builder'
      ? inArray(threads.jobId, db.select({ id: jobs.id }).from(jobs).where(eq(jobs.builderId, user.id)))
      : shopId
        ? eq(threads.shopId, shopId)
        : sql`false`;
  const [jobRows, bidRows, lineRows, messageRows, milestoneRows, recordRows, changeOrderRows, disputeRows, reviewRows, paymentRows, ledgerRows] =
    await Promise.all([
      db.select().from(jobs).where(inJobs(jobs.id)).orderBy(jobs.createdAt),
      db
        .select({ bid: bids, shopName: shops.name, jobTitle: jobs.title })
        .from(bids)
        .innerJoin(shops, eq(shops.id, bids.shopId))
        .innerJoin(jobs, eq(jobs.id, bids.jobId))
        .where(theirBids)
        .orderBy(bids.createdAt),
      db.select().from(bidLineItems).innerJoin(bids, eq(bids.id, bidLineItems.bidId)).where(theirBids).orderBy(bidLineItems.position),
      db
        .select({
          id: messages.id,
          threadId: messages.threadId,
          jobId: threads.jobId,
          jobTitle: jobs.title,
          from: users.displayName,
          sentByYou: sql<boolean>`${messages.authorId} = ${user.id}`,
          body: messages.body,
          createdAt: messages.createdAt,
        })
        .from(messages)
        .innerJoin(threads, eq(threads.id, messages.threadId))
        .innerJoin(jobs, eq(jobs.id, threads.jobId))
        .innerJoin(users, eq(users.id, messages.authorId))
        .where(myThreads)
        .orderBy(messages.createdAt),
      db.select().from(milestones).where(inJobs(milestones.jobId)).orderBy(milestones.createdAt),
      db.select().from(inspectionRecords).where(inJobs(inspectionRecords.jobId)).orderBy(inspectionRecords.submittedAt),
      db.select().from(changeOrders).where(inJobs(changeOrders.jobId)).orderBy(changeOrders.createdAt),
      db.select().from(disputes).where(inJobs(disputes.jobId)).orderBy(disputes.openedAt),
      db
        .select({ review: reviews, authorName: users.displayName })
        .from(reviews)
        .innerJoin(users, eq(users.id, reviews.authorId))
        .where(or(eq(reviews.authorId, user.id), eq(reviews.subjectId, user.id)))
        .orderBy(desc(reviews.createdAt)),
      db.select().from(payments).where(inJobs(payments.jobId)).orderBy(payments.createdAt),
      db
        .select({ line: ledgerEntries, jobTitle: jobs.title })
        .from(ledgerEntries)
        .innerJoin(jobs, eq(jobs.id, ledgerEntries.jobId))
        .where(inJobs(ledgerEntries.jobId))
        .orderBy(ledgerEntries.id),
    ]);
  return {
    // The job's postal code and the coordinates looked up from it are the builder's own: a shop's export leaves them out, as the job page does.
    jobs: user.role === 'builder' ? jobRows : jobRows.map(withoutBuildersPlace),
    bids: bidRows.map((r) => ({
      ...r.bid,
      shopName: r.shopName,
      jobTitle: r.jobTitle,
      lineItems: lineRows.filter((l) => l.bid_line_items.bidId === r.bid.id).map((l) => l.bid_line_items),
    })),
    messages: messageRows,
    milestones: milestoneRows,
    inspectionRecords: recordRows,
    changeOrders: changeOrderRows,
    disputes: disputeRows,
    reviews: reviewRows.map((r) => ({ ...r.review, authorName: r.authorName })),
    payments: paymentRows,
    ledger: ledgerRows.map((r) => ({ ...r.line, jobTitle: r.jobTitle })),
  };
}
