/**
 * The verdicts the server stores for an inspection record (issue 15): every
 * limit judged or listed as not judged, a stated decision rule, and readings
 * corrected to 20 °C. The calculation itself is tested in
 * tests/unit/inspection-record.test.ts; here: what the route stores and serves.
 */
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { InspectionInput } from '../../shared/schemas/inspection';
import type { JobInput } from '../../shared/schemas/jobs';
import { inspectionRecords } from '../../server/db/schema';
import { createUser, jobInput } from '../factories';
import { startMoneyApp } from '../setup/money-app';
import { signedIn } from '../setup/test-env';

let m: Awaited<ReturnType<typeof startMoneyApp>>;
beforeAll(async () => {
  m = await startMoneyApp();
});
afterAll(async () => {
  await m?.close();
});

const pair = (thrust: number, axial: number) => ({ thrust, axial });
const round = (size: number, piston?: number) => ({ top: pair(size, size), middle: pair(size, size), bottom: pair(size, size), ...(piston === undefined ? {} : { piston }) });
const record = (cylinders: InspectionInput['cylinders'], conditions: Partial<InspectionInput['conditions']> = {}): InspectionInput => ({
  conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 20, torquePlate: true, ...conditions } as InspectionInput['conditions'],
  cylinders,
  signedOffBy: 'Ada Quernfield',
  notes: '',
});
/** The job of issue 15: 4.028 in pistons, 0.0025–0.0035 in clearance, no target bore and no size tolerance. */
const issueJob: Partial<JobInput> = { targetBore: undefined, pistonDiameter: 4.028, clearanceMin: 0.0025, clearanceMax: 0.0035, crosshatchMinDeg: undefined, crosshatchMaxDeg: undefined };

const inWork = (input: Partial<JobInput>) => m.jobIn('inWork', { input: jobInput(input), receivedNote: 'On a pallet.' });

describe('stored inspection verdicts', () => {
  it('when bores 0.0093 in over the piston size come with no piston sizes, then the stored record fails size and clearance, judged with the job’s piston', async () => {
    const { job, shop, builder } = await inWork(issueJob);
    const res = await shop.post(`/api/jobs/${job.id}/inspection`, record(Array.from({ length: 8 }, () => round(4.0373))));
    expect(res.status).toBe(201);
    const [stored] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));
    expect(stored.pass).toBe(false);
    const results = stored.results as { verdict: string; checks: Array<{ cylinder?: number; limit?: string; verdict: string; value: number }>; statements: string[] };
    expect(results.verdict).toBe('fail');
    // derived: 4.0373 is 0.0063 in over the 4.031 in target (4.028 + mid of 0.0025–0.0035), outside ± 0.0005 in (common practice default)
    expect(results.checks.find((c) => c.cylinder === 1 && c.limit === 'size')).toMatchObject({ verdict: 'fails' });
    // derived: 4.0373 − 4.028 = 0.0093 in > 0.0035 in
    expect(results.checks.find((c) => c.cylinder === 1 && c.limit === 'clearanceMax')!.value).toBeCloseTo(0.0093, 9);
    expect(results.statements.join(' ')).toMatch(/job’s piston diameter, 4\.0280 in/);
    const view = await builder.get(`/api/jobs/${job.id}/inspection`);
    expect(view.body.versions[0].results.verdict).toBe('fail');
    expect(view.body.versions[0].input.cylinders[0].piston).toBeUndefined();
  });

  it('when the job limits the bore finish and the record has none, then the record is stored as not fully judged, never a pass, naming the limit', async () => {
    const { job, shop } = await inWork({ ...issueJob, finishRaMaxUm: 0.5 });
    await shop.post(`/api/jobs/${job.id}/inspection`, record(Array.from({ length: 8 }, () => round(4.031, 4.028))));
    const [stored] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));
    expect(stored.pass).toBe(false);
    expect(stored.results).toMatchObject({ verdict: 'not-fully-judged', notJudged: [{ what: 'bore Ra' }] });
  });

  it('when the job asks for guarded acceptance and a taper lies within the uncertainty of its limit, then the stored record is not proven and names ISO 14253-1', async () => {
    // source: ISO 14253-1 (references.md): 0.00045 in against 0.0005 in with U = 0.0001 in lies in the uncertainty range.
    const { job, shop } = await inWork({ ...issueJob, decisionRule: 'guarded', boreSizeTolerance: 0.002 });
    const tapered = { top: pair(4.031, 4.031), middle: pair(4.031, 4.031), bottom: pair(4.03055, 4.031), piston: 4.0279 };
    await shop.post(`/api/jobs/${job.id}/inspection`, record([tapered, ...Array.from({ length: 7 }, () => round(4.031, 4.0279))], { uncertainty: 0.0001 }));
    const [stored] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));
    expect(stored.pass).toBe(false);
    expect(stored.results).toMatchObject({ verdict: 'not-proven', decisionRule: { rule: 'guarded', uncertainty: 0.0001, uncertaintySource: 'entered', name: expect.stringMatching(/ISO 14253-1/) } });
    expect(stored.input).toMatchObject({ conditions: { uncertainty: 0.0001 } });
  });

  it('when the shop enters 86 °F on a cast-iron block, then the raw readings are kept as sent and the results hold the 20 °C values', async () => {
    // source: ISO 1 (20 °C); α grey cast iron 10.8e-6/K, aluminium alloy 22e-6/K (Engineering ToolBox, middles of the published ranges);
    // NIST SP 811 temperature conversion: 86 °F = 30 °C. derived: L20 = Lt / (1 + α·10).
    const { job, shop } = await inWork(issueJob);
    const sent = record(Array.from({ length: 8 }, () => round(4.0315, 4.0289)), { temperatureC: undefined, temperatureF: 86 });
    delete (sent.conditions as { temperatureC?: number }).temperatureC;
    expect((await shop.post(`/api/jobs/${job.id}/inspection`, sent)).status).toBe(201);
    const [stored] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));
    const kept = stored.input as InspectionInput;
    expect(kept.conditions).toEqual({ unit: 'in', gaugeResolution: 0.0001, temperatureF: 86, torquePlate: true });
    expect(kept.cylinders![0]).toMatchObject({ top: { thrust: 4.0315 }, piston: 4.0289 });
    const results = stored.results as { temperature: { measuredC: number; block: { alpha: number } }; corrected: Array<{ top: { thrust: number }; piston: number }> };
    expect(results.temperature.measuredC).toBeCloseTo(30, 12);
    expect(results.temperature.block.alpha).toBe(10.8e-6);
    expect(results.corrected[0].top.thrust).toBeCloseTo(4.0315 / (1 + 10.8e-6 * 10), 12);
    expect(results.corrected[0].piston).toBeCloseTo(4.0289 / (1 + 22e-6 * 10), 12);
  });

  it('when a temperature is given in both scales or in neither, then 400 names the field', async () => {
    const { job, shop } = await inWork(issueJob);
    const both = await shop.post(`/api/jobs/${job.id}/inspection`, record(Array.from({ length: 8 }, () => round(4.031)), { temperatureF: 70 }));
    expect(both.status).toBe(400);
    expect(both.body.error.fields['conditions.temperatureF']).toMatch(/once/);
    const neither = record(Array.from({ length: 8 }, () => round(4.031)));
    delete (neither.conditions as { temperatureC?: number }).temperatureC;
    const refused = await shop.post(`/api/jobs/${job.id}/inspection`, neither);
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields['conditions.temperatureC']).toMatch(/temperature/);
  });

  it('when the stated uncertainty is smaller than the gauge’s resolution, then 400 names the field: guarded acceptance cannot be narrowed below what the gauge can tell', async () => {
    // source: references.md "Judging a measurement" — a gauge's resolution is a lower bound on U (ISO 14253-1 / ILAC-G8);
    // a U of 0.000001 in on a 0.0001 in gauge would make guarded acceptance as lenient as simple acceptance.
    const { job, shop } = await inWork({ ...issueJob, decisionRule: 'guarded' });
    const tooSmall = await shop.post(`/api/jobs/${job.id}/inspection`, record(Array.from({ length: 8 }, () => round(4.031, 4.028)), { uncertainty: 0.000001 }));
    expect(tooSmall.status).toBe(400);
    expect(tooSmall.body.error.fields['conditions.uncertainty']).toMatch(/resolution/);
    // derived: U equal to the resolution is the lower bound itself, so it is taken.
    expect((await shop.post(`/api/jobs/${job.id}/inspection`, record(Array.from({ length: 8 }, () => round(4.031, 4.028)), { uncertainty: 0.0001 }))).status).toBe(201);
  });

  it('when a record stored before verdicts existed is read, then it still reads as it was', async () => {
    const { job, shop, builder } = await inWork(issueJob);
    await shop.post(`/api/jobs/${job.id}/inspection`, record(Array.from({ length: 8 }, () => round(4.031, 4.028))));
    const old = { bores: { cylinders: [], worst: { taper: 0, outOfRound: 0, taperCylinder: 0, outOfRoundCylinder: 0 }, pass: true }, checks: [{ what: 'deck out-of-flat', value: 0.001, allowed: '≤ 0.0020 in', pass: true }], pass: true };
    await m.db.update(inspectionRecords).set({ results: old, input: { ...record(Array.from({ length: 8 }, () => round(4.031, 4.028))) } }).where(eq(inspectionRecords.jobId, job.id));
    const view = await builder.get(`/api/jobs/${job.id}/inspection`);
    expect(view.status).toBe(200);
    expect(view.body.versions[0].results).toEqual(old);
  });

  it('when a builder creates a job with a size tolerance and a decision rule, then both are kept; an unknown rule is refused', async () => {
    const b = await signedIn(m.server.app, await createUser(m.db));
    const created = await b.post('/api/jobs', jobInput({ ...issueJob, boreSizeTolerance: 0.0004, decisionRule: 'guarded' }));
    expect(created.status).toBe(201);
    expect(created.body.job.spec).toMatchObject({ boreSizeTolerance: 0.0004, decisionRule: 'guarded' });
    const refused = await b.post('/api/jobs', { ...jobInput(), decisionRule: 'lenient' });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.decisionRule).toMatch(/simple or guarded/);
  });
});
