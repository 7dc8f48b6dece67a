import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { JobInput } from '../../shared/schemas/jobs';
import { bidInput, createShop, createUser, jobInput } from '../factories';
import { setupTestApp, signedIn, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

/** A job with no bore specification at all: the factory's job without its stock bore, stroke, pistons and bore limits. */
function jobWithoutBores(overrides: Partial<JobInput>): JobInput {
  return jobInput({
    stockBore: undefined,
    stroke: undefined,
    pistonDiameter: undefined,
    clearanceMin: undefined,
    clearanceMax: undefined,
    pistonType: undefined,
    crosshatchMinDeg: undefined,
    crosshatchMaxDeg: undefined,
    maxTaper: undefined,
    maxOutOfRound: undefined,
    ...overrides,
  });
}

const headsValveJob = (overrides: Partial<JobInput> = {}) =>
  jobWithoutBores({ title: 'Valve job on a pair of iron heads', parts: ['heads'], blockMaterial: 'cast-iron', operations: [{ code: 'valve-job', quantity: 2 }], ...overrides });

const crankGrindJob = (overrides: Partial<JobInput> = {}) =>
  jobWithoutBores({ title: 'Grind a crank, nothing else sent', parts: ['crankshaft'], blockMaterial: undefined, operations: [{ code: 'crank-grind', quantity: 1 }], ...overrides });

describe('jobs for any part', () => {
  it('when a builder posts a heads-only valve job without bore, stroke or pistons, then it is made, published and listed on the board with its material', async () => {
    const b = await signedIn(ctx.app, await createUser(ctx.db));
    const s = await signedIn(ctx.app, (await createShop(ctx.db)).user);
    const created = await b.post('/api/jobs', headsValveJob());
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.job.spec).not.toHaveProperty('stockBore');
    expect(created.body.job.spec.parts).toEqual(['heads']);
    const id = created.body.job.id as string;
    expect((await b.post(`/api/jobs/${id}/publish`)).status).toBe(200);

    const board = await s.get('/api/jobs?operation=valve-job&material=cast-iron&pageSize=100');
    expect(board.status).toBe(200);
    const listed = board.body.jobs.find((j: { id: string }) => j.id === id);
    expect(listed).toMatchObject({ blockMaterial: 'cast-iron', operations: ['valve-job'] });

    // Heads are sent, so their material is needed.
    const noMaterial = await b.post('/api/jobs', headsValveJob({ blockMaterial: undefined }));
    expect(noMaterial.status).toBe(400);
    expect(noMaterial.body.error.fields).toEqual({ blockMaterial: 'Choose cast iron or aluminium.' });
  });

  it('when a crank-only grind job gives no material, then it is made, edited and published, the board shows no material and the material filter leaves it out', async () => {
    const b = await signedIn(ctx.app, await createUser(ctx.db));
    const s = await signedIn(ctx.app, (await createShop(ctx.db)).user);
    const created = await b.post('/api/jobs', crankGrindJob());
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.job.blockMaterial).toBeNull();
    const id = created.body.job.id as string;

    const edited = await b.put(`/api/jobs/${id}`, crankGrindJob({ title: 'Grind a crank ten under', limits: { crankGrind: { mainStandard: 2.4995 } } }));
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect(edited.body.job).toMatchObject({ title: 'Grind a crank ten under', blockMaterial: null });
    expect((await b.post(`/api/jobs/${id}/publish`)).status).toBe(200);

    const board = await s.get('/api/jobs?operation=crank-grind&pageSize=100');
    expect(board.body.jobs.find((j: { id: string }) => j.id === id)).toMatchObject({ blockMaterial: null, operations: ['crank-grind'] });
    const filtered = await s.get('/api/jobs?material=cast-iron&pageSize=100');
    expect(filtered.body.jobs.map((j: { id: string }) => j.id)).not.toContain(id);

    // The shop opens it to bid: the spec has no bore figures, and the detail answers all the same.
    const seen = await s.get(`/api/jobs/${id}`);
    expect(seen.status).toBe(200);
    expect(seen.body.job.spec).toMatchObject({ parts: ['crankshaft'], operations: [{ code: 'crank-grind', quantity: 1 }] });
    expect(seen.body.job.viewer.canBid).toBe(true);
    const bid = await s.post(`/api/jobs/${id}/bids`, bidInput({ lineItems: [{ operation: 'crank-grind', description: 'Grind mains and rods', quantity: 1, unitPriceCents: 32_000 }] }));
    expect(bid.status, JSON.stringify(bid.body)).toBe(201);
  });

  it('when work is ordered on a part that is not sent, then it is refused on that operation with what to send', async () => {
    const b = await signedIn(ctx.app, await createUser(ctx.db));
    const res = await b.post('/api/jobs', headsValveJob({ parts: ['block'] }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'operations.0.code': 'Valve job needs the cylinder heads: add it to the parts you send, or leave this work out.' });
  });

  it('when limits are sent for work the job does not order, or a smallest above its largest, then each is refused on its path', async () => {
    const b = await signedIn(ctx.app, await createUser(ctx.db));
    const notOrdered = await b.post('/api/jobs', crankGrindJob({ limits: { lineHone: { maxTaper: 0.0004 } } }));
    expect(notOrdered.status).toBe(400);
    expect(notOrdered.body.error.fields).toEqual({ 'limits.lineHone': 'These limits are for line hone, which the job does not ask for.' });

    const crossed = await b.post('/api/jobs', headsValveJob({ limits: { valveJob: { stemToGuideMin: 0.003, stemToGuideMax: 0.001 } } }));
    expect(crossed.status).toBe(400);
    expect(crossed.body.error.fields).toEqual({ 'limits.valveJob.stemToGuideMax': 'The largest cannot be smaller than the smallest.' });
  });

  it('when a balance job leaves out the service speed, then it is refused on limits.balance.serviceRpm', async () => {
    const b = await signedIn(ctx.app, await createUser(ctx.db));
    const balance = (limits: JobInput['limits']) =>
      jobWithoutBores({ title: 'Balance a rotating assembly', parts: ['rotating-assembly'], blockMaterial: undefined, operations: [{ code: 'balance', quantity: 1 }], limits });
    const res = await b.post('/api/jobs', balance({ balance: { grade: 2.5 } }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'limits.balance.serviceRpm': 'Give the highest service speed: the permissible unbalance depends on it.' });
    expect((await b.post('/api/jobs', balance({ balance: { grade: 2.5, serviceRpm: 7000 } }))).status).toBe(201);
  });

  it('when a bore job leaves out the stock bore, then it is still refused on stockBore', async () => {
    const b = await signedIn(ctx.app, await createUser(ctx.db));
    const res = await b.post('/api/jobs', jobInput({ stockBore: undefined }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ stockBore: 'Enter the stock bore: the bore work needs it.' });
  });

  it('when a job sets limits, then GET gives them back exactly as sent', async () => {
    const b = await signedIn(ctx.app, await createUser(ctx.db));
    const limits = {
      deck: { heightTarget: 9.025, heightTolerance: 0.003 },
      lineHone: { housingMin: 2.6406, housingMax: 2.6415, maxAlignment: 0.0004 },
    };
    const created = await b.post('/api/jobs', jobInput({ operations: [{ code: 'bore', quantity: 8 }, { code: 'deck', quantity: 1 }, { code: 'line-hone', quantity: 1 }], limits }));
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const got = await b.get(`/api/jobs/${created.body.job.id}`);
    expect(got.body.job.spec.limits).toEqual(limits);
  });
});
