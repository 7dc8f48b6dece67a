import { desc, eq, inArray } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { changeOrders, jobs, mailOutbox, users } from '../../server/db/schema';
import { bidInput, createJob, createShop, createUser, inDays, jobInput, uniqueEmail } from '../factories';
import { confirmationLink, deliverQueuedMail } from '../setup/mail-links';
import { agentFor, setupTestApp, signedIn, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});


const expectUnconfirmed = (res: supertest.Response) => {
  expect(res.status).toBe(403);
  expect(res.body.error.code).toBe('email_unconfirmed');
  expect(res.body.error.message).toMatch(/confirm your e-mail address/i);
  expect(res.body.error.message).toMatch(/link/i);
};

describe('a confirmed e-mail address before anyone relies on you', () => {
  it('when a builder who signed up has not confirmed, then publishing is refused; after following the mailed link it works', async () => {
    const client = await agentFor(ctx.app);
    const email = uniqueEmail('unconfirmed-builder');
    expect((await client.post('/api/auth/signup', { displayName: 'Ansel Quirkwood', email, password: 'a long enough password', role: 'builder', acceptTerms: true })).status).toBe(201);
    const draft = await client.post('/api/jobs', jobInput({ title: 'Unconfirmed builder block' }));
    expect(draft.status).toBe(201); // a draft is the builder's own business

    const refused = await client.post(`/api/jobs/${draft.body.job.id}/publish`);
    expectUnconfirmed(refused);
    const [job] = await ctx.db.select().from(jobs).where(eq(jobs.id, draft.body.job.id));
    expect(job.status).toBe('draft');

    await deliverQueuedMail(ctx.db);
    const { token } = await confirmationLink(email);
    expect((await client.post('/api/auth/verify-email', { token })).status).toBe(200);

    const published = await client.post(`/api/jobs/${draft.body.job.id}/publish`);
    expect(published.status).toBe(200);
    expect(published.body.job.status).toBe('open');
  });

  it('when a shop has not confirmed, then placing and revising a bid are refused', async () => {
    const builder = await createUser(ctx.db);
    const job = await createJob(ctx.db, builder.id);
    const { user } = await createShop(ctx.db, {}, { emailVerifiedAt: null });
    const shop = await signedIn(ctx.app, user);
    expectUnconfirmed(await shop.post(`/api/jobs/${job.id}/bids`, bidInput()));

    // A bid placed while confirmed, then (say, after an e-mail change) the address is unconfirmed: no revising either.
    await ctx.db.update(users).set({ emailVerifiedAt: new Date() }).where(eq(users.id, user.id));
    const placed = await shop.post(`/api/jobs/${job.id}/bids`, bidInput());
    expect(placed.status).toBe(201);
    await ctx.db.update(users).set({ emailVerifiedAt: null }).where(eq(users.id, user.id));
    expectUnconfirmed(await shop.put(`/api/bids/${placed.body.bid.id}`, bidInput({ turnaroundDays: 5 })));
  });

  it('when a builder has not confirmed, then opening a checkout for the job or a change order is refused', async () => {
    const builderUser = await createUser(ctx.db, { emailVerifiedAt: null });
    const job = await createJob(ctx.db, builderUser.id);
    const { user: shopUser, shop } = await createShop(ctx.db);
    const bid = await (await signedIn(ctx.app, shopUser)).post(`/api/jobs/${job.id}/bids`, bidInput());
    expect(bid.status).toBe(201);
    const builder = await signedIn(ctx.app, builderUser);
    expect((await builder.post(`/api/bids/${bid.body.bid.id}/accept`)).status).toBe(200);

    expectUnconfirmed(await builder.post(`/api/jobs/${job.id}/checkout`));

    await ctx.db.update(jobs).set({ status: 'in_work' }).where(eq(jobs.id, job.id));
    const [order] = await ctx.db.insert(changeOrders).values({ jobId: job.id, shopId: shop.id, description: 'Line-hone the mains too', amountCents: 30_000 }).returning();
    expectUnconfirmed(await builder.post(`/api/change-orders/${order.id}/approve`));
    const [after] = await ctx.db.select().from(changeOrders).where(eq(changeOrders.id, order.id));
    expect(after.status).toBe('proposed');
  });

  it('when the refusal happens, then no mail about the job went anywhere', async () => {
    const builder = await createUser(ctx.db, { emailVerifiedAt: null });
    await createShop(ctx.db, { notifyMatchingJobs: true });
    const job = await createJob(ctx.db, builder.id, { status: 'draft', input: { title: 'Quiet refused publish' } });
    const client = await signedIn(ctx.app, builder);
    expectUnconfirmed(await client.post(`/api/jobs/${job.id}/publish`));
    const mails = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.template, 'matching_job')).orderBy(desc(mailOutbox.createdAt));
    expect(mails.filter((m) => m.subject.includes('Quiet refused publish'))).toHaveLength(0);
  });
});

describe('the date a builder needs the work by', () => {
  it('when it is in the past or three years ahead, then 400 with the message beside neededBy; within two years it is fine', async () => {
    const builder = await signedIn(ctx.app, await createUser(ctx.db));
    const past = await builder.post('/api/jobs', jobInput({ neededBy: inDays(-1) }));
    expect(past.status).toBe(400);
    expect(Object.keys(past.body.error.fields)).toEqual(['neededBy']);
    expect(past.body.error.fields.neededBy).toMatch(/future/);

    const far = await builder.post('/api/jobs', jobInput({ neededBy: inDays(3 * 365) }));
    expect(far.status).toBe(400);
    expect(Object.keys(far.body.error.fields)).toEqual(['neededBy']);
    expect(far.body.error.fields.neededBy).toMatch(/two years/);

    const created = await builder.post('/api/jobs', jobInput({ neededBy: inDays(700) }));
    expect(created.status).toBe(201);
    const edited = await builder.put(`/api/jobs/${created.body.job.id}`, jobInput({ neededBy: inDays(-10) }));
    expect(edited.status).toBe(400);
    expect(edited.body.error.fields.neededBy).toMatch(/future/);
  });

  it('when a draft’s date has passed by the time it is published, then publishing is refused with the date named; edited to a future date it publishes', async () => {
    const builderUser = await createUser(ctx.db);
    const builder = await signedIn(ctx.app, builderUser);
    const draft = await createJob(ctx.db, builderUser.id, { status: 'draft' });
    // Saved weeks ago for a date that was then ahead.
    await ctx.db.update(jobs).set({ neededBy: inDays(-3) }).where(eq(jobs.id, draft.id));

    const refused = await builder.post(`/api/jobs/${draft.id}/publish`);
    expect(refused.status).toBe(400);
    expect(refused.body.error.code).toBe('needed_by_passed');
    expect(refused.body.error.fields.neededBy).toMatch(/future/);
    const [still] = await ctx.db.select().from(jobs).where(eq(jobs.id, draft.id));
    expect(still.status).toBe('draft');

    expect((await builder.put(`/api/jobs/${draft.id}`, jobInput({ neededBy: inDays(30) }))).status).toBe(200);
    expect((await builder.post(`/api/jobs/${draft.id}/publish`)).status).toBe(200);
  });
});

describe('suspended shops', () => {
  it('when a shop is suspended, then it leaves the directory, its page and the bidder lists; the builder still sees the shop they awarded', async () => {
    const tag = `Suspendtest ${Date.now()}`;
    const kept = await createShop(ctx.db, { name: `${tag} kept` });
    const gone = await createShop(ctx.db, { name: `${tag} gone` });
    const awarded = await createShop(ctx.db, { name: `${tag} awarded` });
    const builderUser = await createUser(ctx.db);
    const builder = await signedIn(ctx.app, builderUser);
    const openJob = await createJob(ctx.db, builderUser.id);
    const awardedJob = await createJob(ctx.db, builderUser.id);
    for (const shop of [kept, gone]) expect((await (await signedIn(ctx.app, shop.user)).post(`/api/jobs/${openJob.id}/bids`, bidInput())).status).toBe(201);
    const winning = await (await signedIn(ctx.app, awarded.user)).post(`/api/jobs/${awardedJob.id}/bids`, bidInput());
    expect((await builder.post(`/api/bids/${winning.body.bid.id}/accept`)).status).toBe(200);

    await ctx.db.update(users).set({ status: 'suspended' }).where(inArray(users.id, [gone.user.id, awarded.user.id]));

    const directory = await supertest(ctx.app).get(`/api/shops?q=${encodeURIComponent(tag)}`);
    expect(directory.body.shops.map((s: { name: string }) => s.name)).toEqual([`${tag} kept`]);
    expect(directory.body.total).toBe(1);
    expect((await supertest(ctx.app).get(`/api/shops/${gone.shop.id}`)).status).toBe(404);
    expect((await supertest(ctx.app).get(`/api/shops/${kept.shop.id}`)).status).toBe(200);

    const bidders = await builder.get(`/api/jobs/${openJob.id}/bids`);
    expect(bidders.body.bids.map((b: { shop: { name: string } }) => b.shop.name)).toEqual([`${tag} kept`]);

    // The job they already awarded keeps its shop, so the builder knows who has the block.
    const own = await builder.get(`/api/jobs/${awardedJob.id}/bids`);
    expect(own.body.bids.map((b: { shop: { name: string }; status: string }) => [b.shop.name, b.status])).toEqual([[`${tag} awarded`, 'accepted']]);
  });

  it('when a suspended shop still has an active bid, then it cannot be accepted', async () => {
    const builderUser = await createUser(ctx.db);
    const job = await createJob(ctx.db, builderUser.id);
    const shop = await createShop(ctx.db);
    const bid = await (await signedIn(ctx.app, shop.user)).post(`/api/jobs/${job.id}/bids`, bidInput());
    await ctx.db.update(users).set({ status: 'suspended' }).where(eq(users.id, shop.user.id));
    const res = await (await signedIn(ctx.app, builderUser)).post(`/api/bids/${bid.body.bid.id}/accept`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('shop_suspended');
  });
});
