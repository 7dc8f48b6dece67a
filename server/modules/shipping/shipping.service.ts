import { and, asc, eq, inArray } from 'drizzle-orm';
import type { PostalAddress, ShippingView } from '../../../shared/schemas/shipping';
import type { Database } from '../../db/client';
import { jobs, milestones, shops, type User } from '../../db/schema';
import { conflict } from '../../lib/errors';
import type { RealtimeHub } from '../../realtime/hub';
import { mustBeJobsBuilder, partiesOf, workPartiesFor, type JobParties } from '../jobs/job-access';

export interface ShippingDeps {
  db: Database;
  hub?: RealtimeHub;
}

/** Paid for and held, or past it: the builder may now learn where to send the parts. */
const PAID = new Set(['funded', 'in_work', 'inspection_submitted', 'completed', 'disputed', 'resolved']);
/** From payment until the builder accepts the record: the return address may be given or changed. */
const RETURN_ADDRESS_OPEN = new Set(['funded', 'in_work', 'inspection_submitted', 'completed']);

async function viewOf(db: Database, { job, shop }: JobParties): Promise<ShippingView> {
  const ship = job.logistics === 'ship';
  let shopAddress: PostalAddress | null = null;
  if (ship && shop && PAID.has(job.status)) {
    const [row] = await db.select({ address: shops.receivingAddress }).from(shops).where(eq(shops.id, shop.id));
    shopAddress = row?.address ?? null;
  }
  const legs = await db
    .select({ kind: milestones.kind, carrier: milestones.carrier, trackingNumber: milestones.trackingNumber, at: milestones.createdAt })
    .from(milestones)
    .where(and(eq(milestones.jobId, job.id), inArray(milestones.kind, ['sent_to_shop', 'shipped'])))
    .orderBy(asc(milestones.createdAt), asc(milestones.id));
  return {
    logistics: ship ? 'ship' : 'drop-off',
    shopAddress,
    returnAddress: ship ? (job.returnAddress ?? null) : null,
    legs: legs.map((l) => ({ direction: l.kind === 'sent_to_shop' ? 'to_shop' : 'to_builder', carrier: l.carrier, trackingNumber: l.trackingNumber, at: l.at.toISOString() })),
  };
}

/** Where the parts go and how they travelled: the job's builder, the shop doing the work and admins. */
export async function shippingOf(db: Database, user: User, jobId: string): Promise<ShippingView> {
  return viewOf(db, await workPartiesFor(db, jobId, user));
}

/** The builder gives (or corrects) where the shop sends the parts back, from payment until the shop ships them. */
export async function setReturnAddress(deps: ShippingDeps, user: User, jobId: string, address: PostalAddress): Promise<ShippingView> {
  await deps.db.transaction(async (tx) => {
    const parties = await partiesOf(tx, jobId, { forUpdate: true });
    mustBeJobsBuilder(parties, user, 'Only the job’s builder gives the return address.');
    if (parties.job.logistics !== 'ship') throw conflict('This job’s parts are dropped off and collected, not shipped.', 'not_shipped_job');
    if (!RETURN_ADDRESS_OPEN.has(parties.job.status)) throw conflict('A return address can be given once the job is paid for, until the work is accepted.', 'wrong_status');
    const [shipped] = await tx
      .select({ id: milestones.id })
      .from(milestones)
      .where(and(eq(milestones.jobId, jobId), eq(milestones.kind, 'shipped')))
      .limit(1);
    if (shipped) {
      throw conflict('The shop has already shipped the parts to the address given. To redirect the parcel, write to the shop and contact the carrier.', 'already_shipped');
    }
    await tx.update(jobs).set({ returnAddress: address }).where(eq(jobs.id, jobId));
  });
  deps.hub?.jobChanged(jobId, 'job_updated');
  return shippingOf(deps.db, user, jobId);
}
