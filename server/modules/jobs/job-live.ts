import { eq } from 'drizzle-orm';
import type { Executor } from '../../db/client';
import { bids, shops, type User } from '../../db/schema';
import { forbidden, notFound } from '../../lib/errors';
import { findJob, type JobRow } from './jobs.repository';
import { jobForViewer } from './jobs.service';

/** The people on a job's two sides: its builder and, once a bid is accepted, the user of the shop doing the work. */
export async function jobParties(db: Executor, job: Pick<JobRow, 'builderId' | 'awardedBidId'>): Promise<string[]> {
  const parties = [job.builderId];
  if (job.awardedBidId) {
    const [shop] = await db.select({ userId: shops.userId }).from(bids).innerJoin(shops, eq(shops.id, bids.shopId)).where(eq(bids.id, job.awardedBidId));
    if (shop) parties.push(shop.userId);
  }
  return parties;
}

export async function jobPartiesById(db: Executor, jobId: string): Promise<string[]> {
  const job = await findJob(db, jobId);
  if (!job) throw notFound('No job with that id.');
  return jobParties(db, job);
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
  if ((await jobParties(db, job)).includes(user.id)) return job;
  throw forbidden('Only the builder and the shop doing the work follow this job live.');
}
