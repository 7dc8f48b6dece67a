import { eq, sql } from 'drizzle-orm';
import { addWorkingDays, daysUntil } from '../../shared/due-day';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bids } from '../../server/db/schema';
import type { QueueJob } from '../../shared/schemas/bids';
import { createShop, createUser } from '../factories';
import { apiOf, jobInState, type JobState } from '../setup/job-states';
import { startMoneyApp } from '../setup/money-app';
import { signedIn } from '../setup/test-env';

let m: Awaited<ReturnType<typeof startMoneyApp>>;
beforeAll(async () => {
  m = await startMoneyApp();
});
afterAll(async () => {
  await m?.close();
});

const DAY_MS = 24 * 60 * 60_000;
/** The due day by the one rule (working days, shared/due-day.ts, unit-tested there) from a start this many days ago. */
const dueFrom = (daysAgo: number, turnaroundDays: number) => addWorkingDays(new Date(Date.now() - daysAgo * DAY_MS), turnaroundDays);
const left = (dueOn: string) => daysUntil(dueOn, new Date());
const returnAddress = { lines: ['42 Camshaft Lane', ''], city: 'Fort Wayne', region: 'Indiana', postalCode: '46802', country: 'United States' };

describe('the shop’s work queue', () => {
  it('when one shop has won jobs at every stage, then its queue lists the unfinished ones, soonest due first, with stage, due day and days left', { timeout: 120_000 }, async () => {
    const builderUser = await createUser(m.db, { displayName: 'Dana Okafor' });
    const { user: shopUser } = await createShop(m.db, {}, {}, { payouts: false });
    const [builderClient, shopClient] = await Promise.all([signedIn(m.server.app, builderUser), signedIn(m.server.app, shopUser)]);
    const people = { builder: apiOf(builderClient), shop: apiOf(shopClient) };
    // One job after another: the shop's payout account is set up by the first award and reused.
    const make = async (state: JobState, title: string, turnaroundDays: number) =>
      (await jobInState(state, people, { input: { title }, bid: { turnaroundDays } })).job.id;
    const onlyBid = await make('bid', 'Only a bid', 3);
    const awarded = await make('awarded', 'Awarded, not paid', 30);
    const funded = await make('funded', 'Paid, parts on the way', 12);
    const inShop = await make('inWork', 'On the boring bar', 9);
    const submitted = await make('submitted', 'Record sent', 14);
    const redo = await make('submitted', 'Record to redo', 20);
    const shipped = await make('inWork', 'Shipped back', 25);
    const completed = await make('completed', 'Done and paid', 2);

    await people.builder('POST', `/api/jobs/${redo}/inspection/reject`, { version: 1, reasons: 'Cylinder three is over the taper limit.' });
    await people.builder('PUT', `/api/jobs/${shipped}/return-address`, returnAddress);
    await people.shop('POST', `/api/jobs/${shipped}/milestones`, { kind: 'shipped', carrier: 'Ridgeline Freight', trackingNumber: 'RF 77' });
    // The awarded job was accepted 60 days ago on a 30-working-day turnaround: long overdue.
    await m.db.update(bids).set({ decidedAt: sql`now() - interval '60 days'` }).where(eq(bids.jobId, awarded));

    const res = await shopClient.get('/api/shop/queue');
    expect(res.status).toBe(200);
    const queue: QueueJob[] = res.body.jobs;
    const ids = queue.map((j) => j.jobId);
    expect(ids).not.toContain(onlyBid);
    expect(ids).not.toContain(completed);
    // Soonest due first: the turnarounds from the award or the parts' arrival, all today.
    expect(ids).toEqual([awarded, inShop, funded, submitted, redo, shipped]);
    const byId = new Map(queue.map((j) => [j.jobId, j]));
    const overdue = dueFrom(60, 30);
    expect(left(overdue)).toBeLessThan(-10);
    expect(byId.get(awarded)).toMatchObject({ title: 'Awarded, not paid', status: 'awarded', stage: 'payment_due', dueOn: overdue, daysLeft: left(overdue), turnaroundDays: 30, builderName: 'Dana Okafor' });
    expect(byId.get(funded)).toMatchObject({ status: 'funded', stage: 'waiting_for_parts', dueOn: dueFrom(0, 12), daysLeft: left(dueFrom(0, 12)) });
    // Twelve working days are at least sixteen calendar days: weekends are not counted.
    expect(byId.get(funded)!.daysLeft).toBeGreaterThanOrEqual(16);
    expect(byId.get(inShop)).toMatchObject({ status: 'in_work', stage: 'in_shop', dueOn: dueFrom(0, 9), daysLeft: left(dueFrom(0, 9)) });
    expect(byId.get(submitted)).toMatchObject({ status: 'inspection_submitted', stage: 'record_submitted', dueOn: dueFrom(0, 14) });
    expect(byId.get(redo)).toMatchObject({ status: 'in_work', stage: 'changes_asked', dueOn: dueFrom(0, 20) });
    expect(byId.get(shipped)).toMatchObject({ status: 'in_work', stage: 'shipped_back', dueOn: dueFrom(0, 25) });

    // The due day is the one My bids shows for the same accepted bid.
    const mine = (await shopClient.get('/api/bids/mine')).body.bids as Array<{ jobId: string; dueOn: string | null }>;
    for (const job of queue) expect(mine.find((b) => b.jobId === job.jobId)?.dueOn).toBe(job.dueOn);
  });

  it('when another shop or a shop without a profile asks, then its queue is its own (empty), and builders are refused', async () => {
    const { job } = await m.jobIn('funded');
    const { user: otherShop } = await createShop(m.db);
    const other = await signedIn(m.server.app, otherShop);
    const res = await other.get('/api/shop/queue');
    expect(res.status).toBe(200);
    expect(res.body.jobs).toEqual([]);
    expect(JSON.stringify(res.body)).not.toContain(job.id);

    const noProfile = await signedIn(m.server.app, await createUser(m.db, { role: 'shop' }));
    expect((await noProfile.get('/api/shop/queue')).body).toEqual({ jobs: [] });

    const builder = await signedIn(m.server.app, await createUser(m.db));
    expect((await builder.get('/api/shop/queue')).status).toBe(403);
  });
});
