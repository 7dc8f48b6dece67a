import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailOutbox } from '../../server/db/schema';
import { bidInput, createJob, createShop, createUser, inDays, jobInput } from '../factories';
import { setupTestApp, signedIn, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

describe('jobs', () => {
  it('when a builder creates a draft and publishes it, then shops see it on the board only after publishing', async () => {
    const builder = await createUser(ctx.db);
    const { user: shopUser } = await createShop(ctx.db);
    const b = await signedIn(ctx.app, builder);
    const s = await signedIn(ctx.app, shopUser);

    const created = await b.post('/api/jobs', jobInput({ title: 'Draft then open' }));
    expect(created.status).toBe(201);
    expect(created.body.job).toMatchObject({ status: 'draft', title: 'Draft then open', viewer: { isOwner: true } });
    const id = created.body.job.id;

    expect((await s.get(`/api/jobs/${id}`)).status).toBe(404);
    const boardBefore = await s.get('/api/jobs?pageSize=100');
    expect(boardBefore.body.jobs.map((j: { id: string }) => j.id)).not.toContain(id);

    const published = await b.post(`/api/jobs/${id}/publish`);
    expect(published.status).toBe(200);
    expect(published.body.job.status).toBe('open');
    expect((await b.post(`/api/jobs/${id}/publish`)).status).toBe(409);

    const seen = await s.get(`/api/jobs/${id}`);
    expect(seen.status).toBe(200);
    expect(seen.body.job.viewer).toEqual({ isOwner: false, canBid: true, myBidId: null });
    expect(seen.body.job.spec.pistonDiameter).toBe(4.028);
  });

  it('when the job form is wrong, then each problem is named beside its field', async () => {
    const b = await signedIn(ctx.app, await createUser(ctx.db));
    const res = await b.post('/api/jobs', {
      ...jobInput(),
      cylinders: 0,
      pistonDiameter: 4.03,
      clearanceMin: 0.004,
      clearanceMax: 0.002,
      operations: [{ code: 'polish-the-moon', quantity: 1 }],
      neededBy: 'soon',
    });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['cylinders', 'neededBy', 'operations.0.code']);

    // Rules across fields are checked once each field is valid on its own.
    const crossed = await b.post('/api/jobs', { ...jobInput(), targetBore: undefined, pistonDiameter: 4.03, clearanceMin: 0.004, clearanceMax: 0.002 });
    expect(crossed.status).toBe(400);
    expect(crossed.body.error.fields).toEqual({ clearanceMax: 'The largest clearance cannot be smaller than the smallest.' });
    const neither = await b.post('/api/jobs', { ...jobInput(), pistonDiameter: undefined, clearanceMin: undefined, clearanceMax: undefined });
    expect(neither.body.error.fields).toEqual({ targetBore: 'Give a target bore, or the piston diameter with a clearance range.' });
  });

  it('when a shop or a signed-out visitor tries to post a job, then 403 or 401', async () => {
    const { user } = await createShop(ctx.db);
    const s = await signedIn(ctx.app, user);
    expect((await s.post('/api/jobs', jobInput())).status).toBe(403);
  });

  it('when another builder asks for a job, then 403 for an open one and 404 for a draft', async () => {
    const owner = await createUser(ctx.db);
    const other = await signedIn(ctx.app, await createUser(ctx.db));
    const open = await createJob(ctx.db, owner.id, { status: 'open' });
    const draft = await createJob(ctx.db, owner.id, { status: 'draft' });
    expect((await other.get(`/api/jobs/${open.id}`)).status).toBe(403);
    expect((await other.get(`/api/jobs/${draft.id}`)).status).toBe(404);
    expect((await other.agent.put(`/api/jobs/${open.id}`).set('X-CSRF-Token', other.token).send(jobInput())).status).toBe(403);
    expect((await other.get('/api/jobs')).status).toBe(403);
  });

  it('when an open job with bids is edited, then every active bidder is e-mailed', async () => {
    const builder = await createUser(ctx.db);
    const job = await createJob(ctx.db, builder.id);
    const { user: shopUser } = await createShop(ctx.db);
    const s = await signedIn(ctx.app, shopUser);
    expect((await s.post(`/api/jobs/${job.id}/bids`, bidInput())).status).toBe(201);

    const b = await signedIn(ctx.app, builder);
    const res = await b.agent.put(`/api/jobs/${job.id}`).set('X-CSRF-Token', b.token).send(jobInput({ title: 'Now with a deck cut', operations: [{ code: 'bore', quantity: 8 }, { code: 'hone', quantity: 8 }, { code: 'deck', quantity: 1 }] }));
    expect(res.status).toBe(200);
    expect(res.body.job.operations).toEqual(['bore', 'hone', 'deck']);
    const mails = await ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, shopUser.email), eq(mailOutbox.template, 'job_changed')));
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toContain('Now with a deck cut');
  });

  it('when a job is published, then shops that asked for matching work and can do all of it are e-mailed, others not', async () => {
    const fits = await createShop(ctx.db, { notifyMatchingJobs: true, capabilities: ['bore', 'hone', 'deck', 'line-hone'], rateCard: [] });
    const partial = await createShop(ctx.db, { notifyMatchingJobs: true, capabilities: ['bore'], rateCard: [] });
    const quiet = await createShop(ctx.db, { notifyMatchingJobs: false, capabilities: ['bore', 'hone', 'line-hone'], rateCard: [] });
    const builder = await createUser(ctx.db);
    const job = await createJob(ctx.db, builder.id, { status: 'draft', input: { operations: [{ code: 'bore', quantity: 8 }, { code: 'line-hone', quantity: 1 }] } });
    const b = await signedIn(ctx.app, builder);
    expect((await b.post(`/api/jobs/${job.id}/publish`)).status).toBe(200);
    const to = async (email: string) => ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, email), eq(mailOutbox.template, 'matching_job')));
    expect(await to(fits.user.email)).toHaveLength(1);
    expect(await to(partial.user.email)).toHaveLength(0);
    expect(await to(quiet.user.email)).toHaveLength(0);
  });

  it('when a builder cancels an open job, then its bids close and the shops are told; a cancelled job cannot be edited', async () => {
    const builder = await createUser(ctx.db);
    const job = await createJob(ctx.db, builder.id);
    const { user: shopUser } = await createShop(ctx.db);
    await (await signedIn(ctx.app, shopUser)).post(`/api/jobs/${job.id}/bids`, bidInput());
    const b = await signedIn(ctx.app, builder);
    const res = await b.post(`/api/jobs/${job.id}/cancel`);
    expect(res.status).toBe(200);
    expect(res.body.job.status).toBe('cancelled');
    const bids = await b.get(`/api/jobs/${job.id}/bids`);
    expect(bids.body.bids.map((x: { status: string }) => x.status)).toEqual(['declined']);
    expect(await ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, shopUser.email), eq(mailOutbox.template, 'job_cancelled')))).toHaveLength(1);
    expect((await b.agent.put(`/api/jobs/${job.id}`).set('X-CSRF-Token', b.token).send(jobInput())).status).toBe(409);
  });

  it('when a builder lists their jobs, then only their own come back, filtered by status', async () => {
    const builder = await createUser(ctx.db);
    await createJob(ctx.db, builder.id, { status: 'draft', input: { neededBy: inDays(40) } });
    await createJob(ctx.db, builder.id, { status: 'open' });
    await createJob(ctx.db, (await createUser(ctx.db)).id);
    const b = await signedIn(ctx.app, builder);
    expect((await b.get('/api/jobs/mine')).body.jobs).toHaveLength(2);
    const drafts = await b.get('/api/jobs/mine?status=draft');
    expect(drafts.body.jobs.map((j: { status: string }) => j.status)).toEqual(['draft']);
  });
});
