import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bids, disputes, inspectionRecords, jobs, messages, milestones, payments, threads } from '../../server/db/schema';
import { findShopByUser } from '../../server/modules/shops/shops.repository';
import { builderStanding, shopStandings } from '../../server/modules/standing/standing.repository';
import { acceptAsRead } from '../../shared/calc/conformance';
import type { ShopStanding } from '../../shared/schemas/standing';
import { PAY_WITHIN_DAYS, STANDING_MIN_COUNT, STANDING_RECENT } from '../../shared/standing';
import { createJob, createShop, createUser, inDays } from '../factories';
import { startMoneyApp } from '../setup/money-app';
import { payOnPage } from '../setup/payments';
import { signedIn } from '../setup/test-env';

// Each standing figure on a history built for it. The history's rows are put straight into the database, as the
// flows write them (an award, "parts received", "ready", a record version and its decision, a dispute, a payment,
// messages), because walking dozens of jobs through checkout would take minutes; each figure's last event then
// goes through the app's own API to show the figure is right the moment that event is answered.

let m: Awaited<ReturnType<typeof startMoneyApp>>;
beforeAll(async () => {
  m = await startMoneyApp();
});
afterAll(async () => {
  await m?.close();
});

const MINUTE = 60_000;
const DAY = 86_400_000;
const at = (iso: string) => new Date(iso);

interface PastJob {
  awardedAt: Date;
  turnaroundDays?: number;
  partsAt?: Date;
  finishedAt?: Date;
  finishKind?: 'ready_for_pickup' | 'shipped';
  status?: 'awarded' | 'funded' | 'in_work' | 'inspection_submitted' | 'completed' | 'disputed' | 'resolved' | 'cancelled';
  /** Version 1 of the record: its status, and who decided it when (default: the builder, a day after it was sent). */
  firstRecord?: 'accepted' | 'rejected' | 'submitted';
  decidedHow?: 'builder' | 'review window';
  decidedLate?: boolean;
  dispute?: { side?: 'builder' | 'shop'; outcome?: 'release' | 'refund' | 'split' };
  paidAt?: Date;
  cancelledAt?: Date;
}

/** One past job of this builder won by this shop, with the rows its events leave behind. */
async function pastJob(people: { builderId: string; shopId: string; shopUserId: string }, past: PastJob) {
  const job = await createJob(m.db, people.builderId);
  const [bid] = await m.db
    .insert(bids)
    .values({ jobId: job.id, shopId: people.shopId, status: 'accepted', totalCents: 50_000, turnaroundDays: past.turnaroundDays ?? 5, validUntil: inDays(14), jobRevision: 1, decidedAt: past.awardedAt })
    .returning();
  await m.db
    .update(jobs)
    .set({ status: past.status ?? 'completed', awardedBidId: bid.id, cancelledAt: past.cancelledAt ?? null })
    .where(eq(jobs.id, job.id));
  if (past.paidAt) {
    await m.db.insert(payments).values({ jobId: job.id, kind: 'bid', bidId: bid.id, amountCents: 50_000, status: 'paid', paidAt: past.paidAt, checkoutSessionId: `cs_history_${randomBytes(6).toString('hex')}` });
  }
  if (past.partsAt) await m.db.insert(milestones).values({ jobId: job.id, authorId: people.shopUserId, kind: 'block_received', createdAt: past.partsAt });
  if (past.finishedAt) await m.db.insert(milestones).values({ jobId: job.id, authorId: people.shopUserId, kind: past.finishKind ?? 'ready_for_pickup', createdAt: past.finishedAt });
  const sentAt = new Date(past.awardedAt.getTime() + 3 * DAY);
  const reviewDueAt = new Date(sentAt.getTime() + 5 * DAY);
  if (past.firstRecord) {
    const decided = past.firstRecord !== 'submitted';
    const decidedHow = past.decidedHow ?? 'builder';
    await m.db.insert(inspectionRecords).values({
      jobId: job.id,
      version: 1,
      status: past.firstRecord,
      input: {},
      results: {},
      pass: true,
      submittedBy: people.shopUserId,
      submittedAt: sentAt,
      reviewDueAt,
      decidedAt: decided ? new Date((past.decidedLate || decidedHow === 'review window' ? reviewDueAt.getTime() + MINUTE : sentAt.getTime() + DAY)) : null,
      decidedBy: decided && decidedHow === 'builder' ? people.builderId : null,
      decidedHow: decided ? decidedHow : null,
      rejectReasons: past.firstRecord === 'rejected' ? 'Cylinder two is out of round.' : null,
    });
  }
  if (past.dispute) {
    const side = past.dispute.side ?? 'builder';
    await m.db.insert(disputes).values({
      jobId: job.id,
      status: past.dispute.outcome ? 'resolved' : 'open',
      openedBy: side === 'builder' ? people.builderId : people.shopUserId,
      openedSide: side,
      reason: side === 'builder' ? 'record_outside_limits' : 'builder_silent',
      statement: 'The bores measure outside the agreed limits on my gauge.',
      jobStatusBefore: 'inspection_submitted',
      outcome: past.dispute.outcome ?? null,
      resolvedAt: past.dispute.outcome ? new Date(sentAt.getTime() + 2 * DAY) : null,
      openedAt: new Date(sentAt.getTime() + DAY),
    });
  }
  return job;
}

/** A message as sending one stores it: the row, and the conversation's last message time. */
async function said(threadId: string, authorId: string, createdAt: Date, label: string) {
  await m.db.insert(messages).values({ threadId, authorId, clientId: `${label}-${randomBytes(4).toString('hex')}`, body: 'About the block', createdAt });
  await m.db.update(threads).set({ lastMessageAt: createdAt }).where(eq(threads.id, threadId));
}

/** A builder and a shop with nothing behind them yet. */
async function newPair() {
  const builder = await createUser(m.db);
  const { user: shopUser, shop } = await createShop(m.db);
  return { builder, shopUser, shop, people: { builderId: builder.id, shopId: shop.id, shopUserId: shopUser.id } };
}

/** The shop's standing as anyone reads it on its public page. */
async function publicStanding(shopId: string): Promise<ShopStanding> {
  const res = await supertest(m.server.app).get(`/api/shops/${shopId}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.shop.standing;
}

/** The people of a job made through the app, with their shop's id. */
async function liveJob(state: 'awarded' | 'submitted') {
  const made = await m.jobIn(state);
  const shop = (await findShopByUser(m.db, made.shopUser.id))!;
  return { ...made, shopId: shop.id, people: { builderId: made.builderUser.id, shopId: shop.id, shopUserId: made.shopUser.id } };
}

describe('a shop’s standing', () => {
  it('when the minimum count is read, then it is five', () => {
    expect(STANDING_MIN_COUNT).toBe(5);
  });

  it('when records are decided at version 1, then the share accepted first time shows from the fifth decided record, not the fourth', async () => {
    const { shop, people } = await newPair();
    const awardedAt = at('2026-09-01T09:00:00Z');
    for (const firstRecord of ['accepted', 'accepted', 'rejected'] as const) await pastJob(people, { awardedAt, firstRecord });
    // Accepted when the review window ended: still accepted at the first version.
    await pastJob(people, { awardedAt, firstRecord: 'accepted', decidedHow: 'review window' });
    // Still waiting: not counted. Disputed while waiting: counted, and not accepted first time.
    await pastJob(people, { awardedAt, firstRecord: 'submitted', status: 'inspection_submitted' });
    expect((await publicStanding(shop.id)).firstTimeAcceptance).toBeNull();

    await pastJob(people, { awardedAt, firstRecord: 'submitted', status: 'disputed', dispute: {} });
    expect((await publicStanding(shop.id)).firstTimeAcceptance).toEqual({ count: 3, of: 5, share: 0.6 });
  });

  it('when jobs finish, then on time counts working days (Monday to Friday) from the parts’ arrival, or from the award without one', async () => {
    const { shop, people } = await newPair();
    // Working days are Monday to Friday, holidays not known (common practice for quoting turnaround).
    // Awarded Friday 2 October 2026 with 2 working days: due Tuesday 6 October (Monday, Tuesday).
    const friday = at('2026-10-02T15:00:00Z');
    await pastJob(people, { awardedAt: friday, turnaroundDays: 2, finishedAt: at('2026-10-06T22:00:00Z') }); // Tuesday: on time
    await pastJob(people, { awardedAt: friday, turnaroundDays: 2, finishedAt: at('2026-10-07T08:00:00Z'), finishKind: 'shipped' }); // Wednesday: late
    // Parts arrived Monday 5 October: the same 2 days run to Wednesday 7 October.
    await pastJob(people, { awardedAt: friday, turnaroundDays: 2, partsAt: at('2026-10-05T10:00:00Z'), finishedAt: at('2026-10-07T16:00:00Z') }); // on time
    // Paid for, in the shop, its due day long gone and nothing ready: already late.
    await pastJob(people, { awardedAt: friday, turnaroundDays: 2, status: 'in_work' });
    // Awarded and never paid, or cancelled: not the shop's lateness, not counted.
    await pastJob(people, { awardedAt: friday, turnaroundDays: 2, status: 'awarded' });
    await pastJob(people, { awardedAt: friday, turnaroundDays: 2, status: 'cancelled' });
    expect((await publicStanding(shop.id)).onTime).toBeNull();

    await pastJob(people, { awardedAt: friday, turnaroundDays: 5, finishedAt: at('2026-10-09T12:00:00Z') }); // due Friday 9 October: on time
    expect((await publicStanding(shop.id)).onTime).toEqual({ count: 3, of: 5, share: 0.6 });
    // Accepted without "ready" or "shipped" ever logged, long past its due day: late too.
    await pastJob(people, { awardedAt: friday, turnaroundDays: 2, status: 'completed', firstRecord: 'accepted' });
    expect((await publicStanding(shop.id)).onTime).toEqual({ count: 3, of: 6, share: 0.5 });
  });

  it('when disputes are opened and decided, then they are counted beside the jobs completed, with how they ended', async () => {
    const { shop, people } = await newPair();
    const awardedAt = at('2026-09-01T09:00:00Z');
    await pastJob(people, { awardedAt, status: 'completed' });
    await pastJob(people, { awardedAt, status: 'completed' });
    await pastJob(people, { awardedAt, status: 'resolved', dispute: { outcome: 'refund' } });
    await pastJob(people, { awardedAt, status: 'resolved', dispute: { outcome: 'split', side: 'shop' } });
    await pastJob(people, { awardedAt, status: 'disputed', dispute: {} });
    // Four jobs completed or decided: below the minimum.
    expect((await publicStanding(shop.id)).disputes).toBeNull();

    await pastJob(people, { awardedAt, status: 'completed' });
    expect((await publicStanding(shop.id)).disputes).toEqual({ opened: 3, completed: 5, outcomes: { release: 0, refund: 1, split: 1, open: 1 } });
  });

  it('when builders write and the shop answers, then the median answer time counts a run of builder messages once, from its first', async () => {
    const { builder, shop, shopUser } = await newPair();
    const job = await createJob(m.db, builder.id);
    const [thread] = await m.db.insert(threads).values({ jobId: job.id, shopId: shop.id }).returning();
    const t0 = at('2026-09-07T09:00:00Z').getTime();
    let n = 0;
    const say = (who: 'builder' | 'shop', minutesAfter: number) =>
      said(thread.id, who === 'builder' ? builder.id : shopUser.id, new Date(t0 + minutesAfter * MINUTE), `history-${(n += 1)}`);
    // The shop writing first opens no wait.
    await say('shop', 0);
    // Waits of 30 (two builder messages, timed from the first), 10, 60 and 20 minutes.
    await say('builder', 100);
    await say('builder', 105);
    await say('shop', 130);
    await say('shop', 131);
    await say('builder', 200);
    await say('shop', 210);
    await say('builder', 300);
    await say('shop', 360);
    await say('builder', 400);
    await say('shop', 420);
    await say('builder', 500); // waiting
    expect((await publicStanding(shop.id)).answerTime).toBeNull();

    await say('shop', 545); // 45 minutes: waits 10, 20, 30, 45, 60
    expect((await publicStanding(shop.id)).answerTime).toEqual({ minutes: 30, of: 5, waiting: 0 });
  });

  it('when a shop has more than STANDING_RECENT won jobs, then its figures read the latest ones only', async () => {
    const { shop, people } = await newPair();
    await pastJob(people, { awardedAt: at('2025-01-06T09:00:00Z'), firstRecord: 'rejected' });
    for (let i = 0; i < STANDING_RECENT; i += 1) await pastJob(people, { awardedAt: new Date(at('2026-01-05T09:00:00Z').getTime() + i * DAY), firstRecord: 'accepted' });
    expect((await publicStanding(shop.id)).firstTimeAcceptance).toEqual({ count: STANDING_RECENT, of: STANDING_RECENT, share: 1 });
  });

  it('when a shop has no history, then every figure is null on the directory and on its page', async () => {
    const { shop } = await newPair();
    const none = { firstTimeAcceptance: null, onTime: null, disputes: null, answerTime: null };
    expect(await publicStanding(shop.id)).toEqual(none);
    const directory = await supertest(m.server.app).get(`/api/shops?q=${encodeURIComponent(shop.name)}`);
    expect(directory.body.shops.find((s: { id: string }) => s.id === shop.id).standing).toEqual(none);
  });
});

describe('a standing is right the moment its event is answered', () => {
  it('when the builder accepts the fifth record, then first-time acceptance and the builder’s record answers show at once, on the shop page, the bid and the job page', async () => {
    const live = await liveJob('submitted');
    const awardedAt = at('2026-09-01T09:00:00Z');
    for (let i = 0; i < 4; i += 1) await pastJob(live.people, { awardedAt, firstRecord: 'accepted' });
    expect((await publicStanding(live.shopId)).firstTimeAcceptance).toBeNull();
    expect((await live.shop.get(`/api/jobs/${live.job.id}`)).body.job.builder.standing.answersRecords).toBeNull();

    const { versions } = (await live.builder.get(`/api/jobs/${live.job.id}/inspection`)).body;
    const accepted = await live.builder.post(`/api/jobs/${live.job.id}/inspection/accept`, acceptAsRead(versions[0]));
    expect(accepted.status).toBe(200);

    const share = { count: 5, of: 5, share: 1 };
    expect((await publicStanding(live.shopId)).firstTimeAcceptance).toEqual(share);
    const bidsAnswer = await live.builder.get(`/api/jobs/${live.job.id}/bids`);
    expect(bidsAnswer.body.bids[0].shop.standing.firstTimeAcceptance).toEqual(share);
    expect((await live.shop.get(`/api/jobs/${live.job.id}`)).body.job.builder.standing.answersRecords).toEqual(share);
  });

  it('when the shop logs “ready for pickup”, then the job counts as finished on time at once', async () => {
    const live = await liveJob('submitted');
    for (let i = 0; i < 4; i += 1) await pastJob(live.people, { awardedAt: at('2026-09-01T09:00:00Z'), turnaroundDays: 5, finishedAt: at('2026-09-03T09:00:00Z') });
    expect((await publicStanding(live.shopId)).onTime).toBeNull();

    expect((await live.shop.post(`/api/jobs/${live.job.id}/milestones`, { kind: 'ready_for_pickup', note: 'Bagged and on the pickup shelf.' })).status).toBe(201);
    expect((await publicStanding(live.shopId)).onTime).toEqual({ count: 5, of: 5, share: 1 });
  });

  it('when a dispute is opened and then decided, then the shop’s dispute figure follows each step at once', async () => {
    const admin = await signedIn(m.server.app, await createUser(m.db, { role: 'admin' }));
    const live = await liveJob('submitted');
    for (let i = 0; i < 5; i += 1) await pastJob(live.people, { awardedAt: at('2026-09-01T09:00:00Z'), status: 'completed' });
    expect((await publicStanding(live.shopId)).disputes).toEqual({ opened: 0, completed: 5, outcomes: { release: 0, refund: 0, split: 0, open: 0 } });

    const opened = await live.builder.post(`/api/jobs/${live.job.id}/dispute`, { reason: 'record_outside_limits', statement: 'Cylinder four measures well over the taper limit on my own gauge.' });
    expect(opened.status).toBe(201);
    expect((await publicStanding(live.shopId)).disputes).toEqual({ opened: 1, completed: 5, outcomes: { release: 0, refund: 0, split: 0, open: 1 } });

    const resolved = await admin.post(`/api/admin/disputes/${opened.body.dispute.id}/resolve`, { outcome: 'refund', decision: 'The taper is over the limit on cylinder four; the builder is refunded in full.' });
    expect(resolved.status).toBe(200);
    expect((await publicStanding(live.shopId)).disputes).toEqual({ opened: 1, completed: 6, outcomes: { release: 0, refund: 1, split: 0, open: 0 } });
  });

  it('when the shop answers a waiting builder, then the answer time counts it at once', async () => {
    const { builder, shop, shopUser } = await newPair();
    const job = await createJob(m.db, builder.id);
    const [thread] = await m.db.insert(threads).values({ jobId: job.id, shopId: shop.id }).returning();
    const now = Date.now();
    let n = 0;
    const ago = (authorId: string, minutesAgo: number) => said(thread.id, authorId, new Date(now - minutesAgo * MINUTE), `earlier-${(n += 1)}`);
    for (const [asked, answered] of [[1000, 990], [900, 880], [800, 770], [700, 660]]) {
      await ago(builder.id, asked);
      await ago(shopUser.id, answered);
    }
    await ago(builder.id, 15);
    expect((await publicStanding(shop.id)).answerTime).toBeNull();

    const client = await signedIn(m.server.app, shopUser);
    const sent = await client.post(`/api/threads/${thread.id}/messages`, { clientId: `answer-${randomBytes(5).toString('hex')}`, body: 'Yes, we can take the heads as well.' });
    expect(sent.status).toBe(201);
    // Waits of 10, 15, 20, 30 and 40 minutes.
    expect((await publicStanding(shop.id)).answerTime).toEqual({ minutes: 20, of: 5, waiting: 0 });
  });

  it('when the builder pays for the award, then pays-on-time counts it at once; late and unpaid awards count against, one cancelled in time does not', async () => {
    const live = await liveJob('awarded');
    const awardedAt = at('2026-09-01T09:00:00Z');
    await pastJob(live.people, { awardedAt, paidAt: new Date(awardedAt.getTime() + DAY) });
    await pastJob(live.people, { awardedAt, paidAt: new Date(awardedAt.getTime() + PAY_WITHIN_DAYS * DAY) });
    await pastJob(live.people, { awardedAt, paidAt: new Date(awardedAt.getTime() + (PAY_WITHIN_DAYS + 2) * DAY) }); // late
    await pastJob(live.people, { awardedAt, status: 'awarded' }); // never paid: late
    await pastJob(live.people, { awardedAt, status: 'cancelled', cancelledAt: new Date(awardedAt.getTime() + DAY) }); // called off in time: not counted
    const builderStanding = async () => (await live.shop.get(`/api/jobs/${live.job.id}`)).body.job.builder.standing;
    // The live award is not yet PAY_WITHIN_DAYS old and unpaid: not counted yet.
    expect((await builderStanding()).paysOnTime).toBeNull();

    const { url } = (await live.builder.post(`/api/jobs/${live.job.id}/checkout`, {})).body;
    expect((await payOnPage(url, '4242424242424242')).status).toBeLessThan(400);
    await m.until('funded', async () => (await live.builder.get(`/api/jobs/${live.job.id}`)).body.job.status === 'funded', 10_000);
    expect((await builderStanding()).paysOnTime).toEqual({ count: 3, of: 5, share: 0.6 });
  });

  it('when builders leave records to the window or answer late, then answers-records counts them against, and a dispute in the window for', async () => {
    const { builder, people } = await newPair();
    const awardedAt = at('2026-09-01T09:00:00Z');
    await pastJob(people, { awardedAt, firstRecord: 'accepted' });
    await pastJob(people, { awardedAt, firstRecord: 'rejected' });
    await pastJob(people, { awardedAt, firstRecord: 'accepted', decidedHow: 'review window' }); // against
    await pastJob(people, { awardedAt, firstRecord: 'accepted', decidedLate: true }); // against
    const standing = async () => (await builderStanding(m.db, builder.id)).answersRecords;
    expect(await standing()).toBeNull();
    await pastJob(people, { awardedAt, firstRecord: 'submitted', status: 'disputed', dispute: {} }); // for
    expect(await standing()).toEqual({ count: 3, of: 5, share: 0.6 });
  });
});

describe('the builder’s standing on the board', () => {
  it('when a shop reads the board, then each row carries its builder’s standing, and a builder with no history has every figure null', async () => {
    const paying = await newPair();
    const awardedAt = at('2026-09-01T09:00:00Z');
    for (let i = 0; i < STANDING_MIN_COUNT; i += 1) await pastJob(paying.people, { awardedAt, paidAt: new Date(awardedAt.getTime() + DAY) });
    const newcomer = await createUser(m.db);
    const [theirs, fresh] = await Promise.all([createJob(m.db, paying.builder.id), createJob(m.db, newcomer.id)]);
    const shop = await signedIn(m.server.app, paying.shopUser);
    const res = await shop.get('/api/jobs?pageSize=100');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const row = (id: string) => res.body.jobs.find((j: { id: string }) => j.id === id);
    expect(row(theirs.id).builderStanding).toEqual({ paysOnTime: { count: STANDING_MIN_COUNT, of: STANDING_MIN_COUNT, share: 1 }, answersRecords: null });
    expect(row(fresh.id).builderStanding).toEqual({ paysOnTime: null, answersRecords: null });
    // The same figures as the job page gives.
    expect(row(theirs.id).builderStanding).toEqual((await shop.get(`/api/jobs/${theirs.id}`)).body.job.builder.standing);
  });
});

describe('a page of standings', () => {
  // How long it takes is measured by the benchmarks, never asserted here (see the repository's notes for figures).
  it('when a page of twenty shops with history is read, then each shop gets its own figures from the one call', async () => {
    const ids: string[] = [];
    for (let s = 0; s < 20; s += 1) {
      const { shop, people } = await newPair();
      ids.push(shop.id);
      for (let j = 0; j < 5 + (s % 3); j += 1) await pastJob(people, { awardedAt: at('2026-09-01T09:00:00Z'), firstRecord: 'accepted', finishedAt: at('2026-09-03T09:00:00Z') });
    }
    const standings = await shopStandings(m.db, ids);
    expect(ids.map((id) => [standings.get(id)?.firstTimeAcceptance?.of, standings.get(id)?.onTime?.of])).toEqual(ids.map((_, s) => [5 + (s % 3), 5 + (s % 3)]));
  });
});
