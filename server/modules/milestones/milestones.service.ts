import { asc, eq } from 'drizzle-orm';
import type { MilestoneInput } from '../../../shared/schemas/inspection';
import type { SentToShopInput } from '../../../shared/schemas/shipping';
import type { Milestone } from '../../../shared/schemas/milestones';
import type { Database } from '../../db/client';
import { jobs, milestones, users, type User } from '../../db/schema';
import { AppError, conflict } from '../../lib/errors';
import type { RealtimeHub } from '../../realtime/hub';
import { mustBeJobsBuilder, mustSeeWork, mustBeWorkingShop, partiesOf } from '../jobs/job-access';
import { attachMilestonePhotos, photosOfMilestones } from './milestone-photos';

export interface MilestoneDeps {
  db: Database;
  /** Open pages of the job hear of new progress (absent in scripts without live clients). */
  hub?: RealtimeHub;
}

const WORKING = new Set(['funded', 'in_work', 'inspection_submitted', 'completed']);

export async function listMilestones(db: Database, user: User, jobId: string): Promise<Milestone[]> {
  mustSeeWork(await partiesOf(db, jobId), user);
  const rows = await db
    .select({ m: milestones, authorName: users.displayName })
    .from(milestones)
    .innerJoin(users, eq(users.id, milestones.authorId))
    .where(eq(milestones.jobId, jobId))
    .orderBy(asc(milestones.createdAt), asc(milestones.id));
  const photos = await photosOfMilestones(
    db,
    rows.map(({ m }) => m.id),
  );
  return rows.map(({ m, authorName }) => ({
    id: m.id,
    kind: m.kind,
    operation: m.operation,
    note: m.note,
    carrier: m.carrier,
    trackingNumber: m.trackingNumber,
    author: { id: m.authorId, displayName: authorName },
    photos: photos.get(m.id) ?? [],
    createdAt: m.createdAt.toISOString(),
  }));
}

/** The working shop logs progress; "parts received" (kind block_received) starts the work (funded → in work). */
export async function logMilestone(deps: MilestoneDeps, user: User, jobId: string, input: MilestoneInput): Promise<Milestone> {
  await deps.db.transaction(async (tx) => {
    const parties = await partiesOf(tx, jobId, { forUpdate: true });
    mustBeWorkingShop(parties, user);
    const { job } = parties;
    if (!WORKING.has(job.status)) throw conflict('Progress can be logged once the job is paid for.', 'job_not_funded');
    if (input.kind === 'block_received') {
      if (job.status !== 'funded') throw conflict('The parts were already logged as received.', 'already_received');
      await tx.update(jobs).set({ status: 'in_work' }).where(eq(jobs.id, job.id));
    } else if (job.status === 'funded') {
      throw conflict('Log “parts received” first.', 'not_received');
    }
    if (input.kind === 'shipped' && job.logistics === 'ship' && !job.returnAddress) {
      throw conflict('The builder has not given a return address yet; ship the parts back once they have.', 'no_return_address');
    }
    if (input.operation && !job.operations.includes(input.operation)) {
      throw new AppError('invalid_input', 'That operation is not part of this job.', 400, { operation: 'Choose one of the job’s operations.' });
    }
    const [row] = await tx
      .insert(milestones)
      .values({ jobId, authorId: user.id, kind: input.kind, operation: input.operation ?? null, note: input.note, carrier: input.carrier ?? null, trackingNumber: input.trackingNumber ?? null })
      .returning();
    if (input.photoIds?.length) await attachMilestonePhotos(tx, { jobId, userId: user.id, milestoneId: row.id, photoIds: input.photoIds });
  });
  return afterLogged(deps, user, jobId);
}

/** Tells the job's open pages and answers the entry just logged. */
async function afterLogged(deps: MilestoneDeps, user: User, jobId: string): Promise<Milestone> {
  deps.hub?.jobChanged(jobId, 'job_updated');
  const all = await listMilestones(deps.db, user, jobId);
  return all[all.length - 1];
}

/** The builder of a `ship` job logs the parts leaving for the shop, with carrier and tracking number, once the job is paid for. */
export async function logSentToShop(deps: MilestoneDeps, user: User, jobId: string, input: SentToShopInput): Promise<Milestone> {
  await deps.db.transaction(async (tx) => {
    const parties = await partiesOf(tx, jobId, { forUpdate: true });
    mustBeJobsBuilder(parties, user, 'Only the job’s builder logs sending the parts.');
    const { job } = parties;
    if (job.logistics !== 'ship') throw conflict('This job’s parts are dropped off at the shop, not shipped.', 'not_shipped_job');
    if (job.status !== 'funded' && job.status !== 'in_work') throw conflict('Log sending the parts once the job is paid for, before the shop finishes the work.', 'not_funded');
    await tx.insert(milestones).values({ jobId, authorId: user.id, kind: 'sent_to_shop', note: input.note, carrier: input.carrier, trackingNumber: input.trackingNumber });
  });
  return afterLogged(deps, user, jobId);
}
