import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { bids, jobs } from '../../server/db/schema';
import { bidInput, createJob, createShop, createUser, uniformRecordInput } from '../factories';
import { connected, next, post, session, twoInstances } from '../setup/realtime';

const live = twoInstances();

/** A job in work between a new builder and a new shop: the bid goes in over HTTP, the award and the held money straight into the database. */
async function jobInWork() {
  const builder = await createUser(live.db);
  const job = await createJob(live.db, builder.id);
  const { user: shopUser } = await createShop(live.db);
  const builderAuth = await session(live.instanceA, builder);
  const shopAuth = await session(live.instanceB, shopUser);
  const placed = await post(live.instanceB, shopAuth, `/api/jobs/${job.id}/bids`, bidInput());
  expect(placed.status).toBe(201);
  const bidId = placed.body.bid.id as string;
  await live.db.update(bids).set({ status: 'accepted', decidedAt: new Date() }).where(eq(bids.id, bidId));
  await live.db.update(jobs).set({ status: 'in_work', awardedBidId: bidId, feeBps: 800 }).where(eq(jobs.id, job.id));
  return { job, builderAuth, shopAuth };
}

describe('live notices', () => {
  it('when the shop submits a record through instance B, then the builder’s socket on instance A hears the notice, after it is stored', async () => {
    const { job, builderAuth, shopAuth } = await jobInWork();
    const builderSocket = live.socketFor(live.instanceA, builderAuth.cookie);
    const shopSocket = live.socketFor(live.instanceB, shopAuth.cookie);
    await Promise.all([connected(builderSocket), connected(shopSocket)]);
    const shopHeard: unknown[] = [];
    shopSocket.on('notification:new', (notice) => shopHeard.push(notice));

    const heard = next<{ id: string; kind: string; jobId: string; readAt: string | null }>(builderSocket, 'notification:new');
    expect((await post(live.instanceB, shopAuth, `/api/jobs/${job.id}/inspection`, uniformRecordInput())).status).toBe(201);
    const notice = await heard;
    expect(notice).toMatchObject({ kind: 'results_submitted', jobId: job.id, readAt: null });

    // Told after the commit: the notice it names is already there to fetch.
    const listed = await fetch(`${live.instanceA.url}/api/notifications`, { headers: { Cookie: builderAuth.cookie } }).then((r) => r.json());
    expect(listed.notifications[0].id).toBe(notice.id);
    expect(listed.unread).toBe(2); // the bid that came in, and the results
    expect(shopHeard).toEqual([]);
  });

  it('when the person reads everything on one page, then their other pages hear that the count moved', async () => {
    const { builderAuth } = await jobInWork();
    const other = live.socketFor(live.instanceB, builderAuth.cookie);
    await connected(other);
    const heard = next(other, 'notifications:read');
    expect((await post(live.instanceA, builderAuth, '/api/notifications/read-all')).body).toEqual({ unread: 0 });
    await heard;
  });
});
