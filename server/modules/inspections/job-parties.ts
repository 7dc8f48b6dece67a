import { eq } from 'drizzle-orm';
import type { Executor } from '../../db/client';
import { bids, shops, users, type User } from '../../db/schema';
import { forbidden, notFound } from '../../lib/errors';
import { findJob, type JobRow } from '../jobs/jobs.repository';

export interface JobParties {
  job: JobRow;
  builder: { id: string; email: string; displayName: string };
  shop: { id: string; userId: string; email: string; name: string } | null;
}

/** A job with its builder and (once a bid is accepted) the shop doing the work. */
export async function jobParties(db: Executor, jobId: string, options: { forUpdate?: boolean } = {}): Promise<JobParties> {
  const job = await findJob(db, jobId, options);
  if (!job) throw notFound('No job with that id.');
  const [builder] = await db.select({ id: users.id, email: users.email, displayName: users.displayName }).from(users).where(eq(users.id, job.builderId));
  let shop: JobParties['shop'] = null;
  if (job.awardedBidId) {
    const [row] = await db
      .select({ id: shops.id, userId: shops.userId, email: users.email, name: shops.name })
      .from(bids)
      .innerJoin(shops, eq(shops.id, bids.shopId))
      .innerJoin(users, eq(users.id, shops.userId))
      .where(eq(bids.id, job.awardedBidId));
    shop = row ?? null;
  }
  return { job, builder, shop };
}

/** Only the builder, the shop doing the work and admins see a job's work record; others get 404 for drafts and 403 otherwise. */
export function assertCanSeeWork(parties: JobParties, user: User) {
  if (user.role === 'admin' || parties.builder.id === user.id || parties.shop?.userId === user.id) return;
  if (parties.job.status === 'draft') throw notFound('No job with that id.');
  throw forbidden('Only the builder and the shop doing the work see this.');
}

export function assertWorkingShop(parties: JobParties, user: User) {
  if (parties.shop?.userId !== user.id) {
    if (parties.builder.id === user.id || user.role === 'admin') throw forbidden('Only the shop doing the work can do this.');
    throw notFound('No job with that id.');
  }
}

/** Which side of the job this person is on: its builder, the shop doing the work, or neither. */
export function sideOf(parties: JobParties, user: User): 'builder' | 'shop' | null {
  if (parties.builder.id === user.id) return 'builder';
  return parties.shop?.userId === user.id ? 'shop' : null;
}
