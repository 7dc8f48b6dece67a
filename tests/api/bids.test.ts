import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bids, jobs, mailOutbox } from '../../server/db/schema';
import { bidInput, createJob, createShop, createUser, inDays } from '../factories';
import { agentFor, setupTestApp, signedIn, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

async function openJobWithBuilder() {
  const builder = await createUser(ctx.db);
  const job = await createJob(ctx.db, builder.id);
  return { builder, job, b: await signedIn(ctx.app, builder) };
}

describe('bids', () => {
  it('when a shop bids, then the total is added up on the server in cents, the builder is e-mailed, and a second bid is refused', async () => {
    const { job, builder } = await openJobWithBuilder();
    const { user } = await createShop(ctx.db);
    const s = await signedIn(ctx.app, user);
    const res = await s.post(`/api/jobs/${job.id}/bids`, {
      ...bidInput({
        lineItems: [
          { operation: 'bore', description: 'Bore 8 cylinders', quantity: 8, unitPriceCents: 3499 },
          { description: 'Freight crate', quantity: 1, unitPriceCents: 4501 },
        ],
      }),
      totalCents: 1, // a client's idea of the total is ignored
    });
    expect(res.status).toBe(201);
    expect(res.body.bid.totalCents).toBe(8 * 3499 + 4501);
    expect(res.body.bid.lineItems.map((l: { amountCents: number }) => l.amountCents)).toEqual([27992, 4501]);
    expect(res.body.bid.capabilityMatch).toBe(1);

    const [row] = await ctx.db.select().from(jobs).where(eq(jobs.id, job.id));
    expect(row.bidCount).toBe(1);
    expect(await ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, builder.email), eq(mailOutbox.template, 'new_bid')))).toHaveLength(1);

    const again = await s.post(`/api/jobs/${job.id}/bids`, bidInput());
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('bid_exists');
  });

  it('when a builder tries to bid, then 403', async () => {
    const { job } = await openJobWithBuilder();
    const other = await signedIn(ctx.app, await createUser(ctx.db));
    expect((await other.post(`/api/jobs/${job.id}/bids`, bidInput())).status).toBe(403);
  });

  it('when a shop without a profile bids, then 409 asking for the profile first', async () => {
    const { job } = await openJobWithBuilder();
    const s = await signedIn(ctx.app, await createUser(ctx.db, { role: 'shop' }));
    const res = await s.post(`/api/jobs/${job.id}/bids`, bidInput());
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('no_shop_profile');
  });

  it('when a shop looks at a job, then it sees only its own bid; another builder sees none; the owner sees all', async () => {
    const { job, b } = await openJobWithBuilder();
    const x = await createShop(ctx.db);
    const y = await createShop(ctx.db);
    const sx = await signedIn(ctx.app, x.user);
    const sy = await signedIn(ctx.app, y.user);
    const bx = (await sx.post(`/api/jobs/${job.id}/bids`, bidInput())).body.bid.id;
    const by = (await sy.post(`/api/jobs/${job.id}/bids`, bidInput({ turnaroundDays: 3 }))).body.bid.id;

    const seenByX = await sx.get(`/api/jobs/${job.id}/bids`);
    expect(seenByX.body.bids.map((bid: { id: string }) => bid.id)).toEqual([bx]);
    expect((await sx.get(`/api/bids/${by}`)).status).toBe(404);

    const stranger = await signedIn(ctx.app, await createUser(ctx.db));
    expect((await stranger.get(`/api/jobs/${job.id}/bids`)).status).toBe(403);
    expect((await stranger.get(`/api/bids/${bx}`)).status).toBe(404);

    const owner = await b.get(`/api/jobs/${job.id}/bids`);
    expect(owner.body.bids.map((bid: { id: string }) => bid.id).sort()).toEqual([bx, by].sort());
    expect((await (await agentFor(ctx.app)).get(`/api/jobs/${job.id}/bids`)).status).toBe(401);
  });

  it('when a shop revises its bid, then the earlier version is kept in the history and the builder is told', async () => {
    const { job, builder } = await openJobWithBuilder();
    const { user } = await createShop(ctx.db);
    const s = await signedIn(ctx.app, user);
    const created = await s.post(`/api/jobs/${job.id}/bids`, bidInput());
    const id = created.body.bid.id;
    const revised = await s.agent
      .put(`/api/bids/${id}`)
      .set('X-CSRF-Token', s.token)
      .send(bidInput({ lineItems: [{ operation: 'bore', description: 'Bore', quantity: 8, unitPriceCents: 3000 }], turnaroundDays: 12 }));
    expect(revised.status).toBe(200);
    expect(revised.body.bid).toMatchObject({ version: 2, totalCents: 24000, turnaroundDays: 12 });
    expect(revised.body.revisions).toHaveLength(1);
    expect(revised.body.revisions[0]).toMatchObject({ version: 1, totalCents: created.body.bid.totalCents, turnaroundDays: 8 });
    expect(revised.body.revisions[0].lineItems).toHaveLength(2);
    expect(await ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, builder.email), eq(mailOutbox.template, 'bid_revised')))).toHaveLength(1);
  });

  it('when a shop withdraws, then the bid count drops, and it may bid again', async () => {
    const { job } = await openJobWithBuilder();
    const { user } = await createShop(ctx.db);
    const s = await signedIn(ctx.app, user);
    const id = (await s.post(`/api/jobs/${job.id}/bids`, bidInput())).body.bid.id;
    const withdrawn = await s.post(`/api/bids/${id}/withdraw`);
    expect(withdrawn.body.bid.status).toBe('withdrawn');
    expect((await s.post(`/api/bids/${id}/withdraw`)).status).toBe(409);
    const [row] = await ctx.db.select().from(jobs).where(eq(jobs.id, job.id));
    expect(row.bidCount).toBe(0);
    expect((await s.post(`/api/jobs/${job.id}/bids`, bidInput())).status).toBe(201);
  });

  it('when the builder accepts one bid, then the job is awarded, that bid accepted, the others declined, and all shops are told', async () => {
    const { job, b } = await openJobWithBuilder();
    const shopsWithBids = [];
    for (let i = 0; i < 3; i += 1) {
      const { user } = await createShop(ctx.db);
      const s = await signedIn(ctx.app, user);
      shopsWithBids.push({ user, bidId: (await s.post(`/api/jobs/${job.id}/bids`, bidInput())).body.bid.id as string });
    }
    const res = await b.post(`/api/bids/${shopsWithBids[1].bidId}/accept`);
    expect(res.status).toBe(200);
    expect(res.body.bid.status).toBe('accepted');
    const rows = await ctx.db.select().from(bids).where(eq(bids.jobId, job.id));
    expect(rows.map((r) => r.status).sort()).toEqual(['accepted', 'declined', 'declined']);
    const [jobRow] = await ctx.db.select().from(jobs).where(eq(jobs.id, job.id));
    expect(jobRow).toMatchObject({ status: 'awarded', awardedBidId: shopsWithBids[1].bidId });
    const templates = async (email: string) => (await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, email))).map((m) => m.template);
    expect(await templates(shopsWithBids[1].user.email)).toEqual(['bid_accepted']);
    expect(await templates(shopsWithBids[0].user.email)).toEqual(['bid_declined']);

    expect((await b.post(`/api/bids/${shopsWithBids[0].bidId}/accept`)).status).toBe(409);
    const lateShop = await createShop(ctx.db);
    expect((await (await signedIn(ctx.app, lateShop.user)).post(`/api/jobs/${job.id}/bids`, bidInput())).status).toBe(409);
  });

  it('when 50 accepts of different bids race on one job, then exactly one bid is accepted and the rest get 409', async () => {
    const { job, b } = await openJobWithBuilder();
    const bidIds: string[] = [];
    for (let i = 0; i < 50; i += 1) {
      const { shop } = await createShop(ctx.db);
      const [row] = await ctx.db
        .insert(bids)
        .values({ jobId: job.id, shopId: shop.id, totalCents: 10_000 + i, turnaroundDays: 5, validUntil: inDays(10), jobRevision: 1 })
        .returning();
      bidIds.push(row.id);
    }
    const answers = await Promise.all(bidIds.map((id) => b.post(`/api/bids/${id}/accept`)));
    const statuses = answers.map((a) => a.status);
    expect(statuses.filter((st) => st === 200)).toHaveLength(1);
    expect(statuses.filter((st) => st === 409)).toHaveLength(49);
    const rows = await ctx.db.select().from(bids).where(eq(bids.jobId, job.id));
    expect(rows.filter((r) => r.status === 'accepted')).toHaveLength(1);
    expect(rows.filter((r) => r.status === 'declined')).toHaveLength(49);
  });

  it('when a builder declines a bid, then the shop is told with the reason; only the job’s builder may decide', async () => {
    const { job, b } = await openJobWithBuilder();
    const { user } = await createShop(ctx.db);
    const s = await signedIn(ctx.app, user);
    const id = (await s.post(`/api/jobs/${job.id}/bids`, bidInput())).body.bid.id;
    const stranger = await signedIn(ctx.app, await createUser(ctx.db));
    expect((await stranger.post(`/api/bids/${id}/decline`, { reason: 'no' })).status).toBe(404);
    expect((await s.post(`/api/bids/${id}/accept`)).status).toBe(403);
    const res = await b.post(`/api/bids/${id}/decline`, { reason: 'Too far away for drop-off.' });
    expect(res.body.bid.status).toBe('declined');
    const [mail] = await ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, user.email), eq(mailOutbox.template, 'bid_declined')));
    expect(mail.textBody).toContain('Too far away for drop-off.');
  });

  it('when a bid is past its valid-until date, then it cannot be accepted, and a new bid cannot start out expired', async () => {
    const { job, b } = await openJobWithBuilder();
    const { shop } = await createShop(ctx.db);
    const [old] = await ctx.db.insert(bids).values({ jobId: job.id, shopId: shop.id, totalCents: 100, turnaroundDays: 5, validUntil: inDays(-1), jobRevision: 1 }).returning();
    const res = await b.post(`/api/bids/${old.id}/accept`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('bid_expired');
    const other = await createShop(ctx.db);
    const expired = await (await signedIn(ctx.app, other.user)).post(`/api/jobs/${job.id}/bids`, bidInput({ validUntil: inDays(-2) }));
    expect(expired.status).toBe(400);
    expect(expired.body.error.fields.validUntil).toBeDefined();
  });
});
