/**
 * The inspection record's sections beyond the bores (issue 17): the server
 * judges each ordered kind of work from its raw readings, refuses what the job
 * does not order, and stops the record when a crack is found. The judging
 * itself is unit-tested in tests/unit/calc/record-sections.test.ts.
 */
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { InspectionInput, InspectionResults } from '../../shared/schemas/inspection';
import type { InspectionSections } from '../../shared/schemas/inspection-sections';
import type { JobInput } from '../../shared/schemas/jobs';
import { inspectionRecords, jobs, milestonePhotos } from '../../server/db/schema';
import { createScheduler } from '../../server/lib/scheduler';
import { inspectionTaskHandlers } from '../../server/modules/inspections/inspections.service';
import { jobInput } from '../factories';
import { startMoneyApp } from '../setup/money-app';
import sharp from 'sharp';

let m: Awaited<ReturnType<typeof startMoneyApp>>;
beforeAll(async () => {
  m = await startMoneyApp();
});
afterAll(async () => {
  await m?.close();
});

/** A crankshaft and its rods and pistons for a line hone, grind and balance: no bore work, so no bore specification. */
const bottomEnd: Partial<JobInput> = {
  title: 'Line hone, grind and balance a bottom end',
  parts: ['block', 'rotating-assembly'],
  operations: [
    { code: 'line-hone', quantity: 1 },
    { code: 'crank-grind', quantity: 1 },
    { code: 'balance', quantity: 1 },
  ],
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
  limits: {
    lineHone: { housingMin: 2.6406, housingMax: 2.6415 },
    crankGrind: { mainStandard: 2.4495, rodStandard: 2.0995 },
    balance: { grade: 2.5, serviceRpm: 7000 },
  },
};

const journal = (size: number) => ({ front: { vertical: size, horizontal: size }, rear: { vertical: size, horizontal: size } });
const bore = (size: number, centre = 0) => ({ vertical: { front: size, rear: size }, second: { front: size, rear: size }, centre });

/** Readings within every limit of `bottomEnd`, at 20 °C. */
const goodSections = (): InspectionSections => ({
  lineHone: { secondDirection: '45', bores: [bore(2.641), bore(2.641, 0.0001), bore(2.641, 0.0001), bore(2.641, 0.0001), bore(2.641)] },
  crankGrind: { undersize: 0.01, mains: Array.from({ length: 5 }, () => journal(2.4393)), rods: Array.from({ length: 8 }, () => journal(2.0893)), raUm: 0.15 },
  balance: {
    rotatingGrams: 1240,
    reciprocatingGrams: 1180,
    bobWeightGrams: 1830,
    rotorMassKg: 20,
    grade: 2.5,
    serviceRpm: 7000,
    residual: [
      { plane: 'front', gmm: 30 },
      { plane: 'rear', gmm: 25 },
    ],
  },
});

const record = (sections: InspectionSections, extra: Partial<InspectionInput> = {}): InspectionInput => ({
  conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 20 },
  sections,
  signedOffBy: 'Ada Quernfield',
  notes: '',
  ...extra,
});

const storedResults = async (jobId: string) => {
  const [row] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, jobId));
  return row.results as InspectionResults;
};

describe('inspection record sections', () => {
  it('when a bottom-end job’s record is within every limit, then each ordered operation is a section that conforms and the record passes', async () => {
    const { job, shop, builder } = await m.jobIn('inWork', { input: jobInput(bottomEnd) });
    const res = await shop.post(`/api/jobs/${job.id}/inspection`, record(goodSections()));
    expect(res.status).toBe(201);
    const results = await storedResults(job.id);
    expect(results.sections!.map((s) => [s.operation, s.verdict])).toEqual([
      ['line-hone', 'conforms'],
      ['crank-grind', 'conforms'],
      ['balance', 'conforms'],
    ]);
    expect(results.verdict).toBe('pass');
    expect(results.bores).toBeUndefined();
    // ISO 21940-11 (references.md): e = 9549 · 2.5 / 7000 = 3.410 g·mm/kg; U = 68.2 g·mm on 20 kg; 34.1 g·mm per plane (derived).
    const balance = results.sections!.find((s) => s.operation === 'balance')!;
    expect(balance.figures.find((f) => f.label === 'Permissible per plane')!.value).toBeCloseTo(34.1, 1);
    // Bob weight, 90° V8 (references.md, common practice): 1240 + 0.5 × 1180 = 1830 g.
    expect(balance.figures.find((f) => f.label === 'Bob weight worked out')!.value).toBe(1830);
    const view = await builder.get(`/api/jobs/${job.id}/inspection`);
    expect(view.status).toBe(200);
    expect(view.body.versions[0].results.sections).toHaveLength(3);
  });

  it('when one rod journal is ground under size and one plane is out of balance, then those sections fail and name the journal and the plane', async () => {
    const { job, shop } = await m.jobIn('inWork', { input: jobInput(bottomEnd) });
    const sections = goodSections();
    // Rod standard 2.0995 − 0.010 undersize = 2.0895; with the 0.0005 in default tolerance (common practice) the range is 2.0890–2.0895.
    sections.crankGrind!.rods[3] = journal(2.0884);
    sections.balance!.residual = [
      { plane: 'front', gmm: 30 },
      { plane: 'rear', gmm: 40 },
    ];
    expect((await shop.post(`/api/jobs/${job.id}/inspection`, record(sections))).status).toBe(201);
    const results = await storedResults(job.id);
    expect(results.verdict).toBe('fail');
    expect(Object.fromEntries(results.sections!.map((s) => [s.operation, s.verdict]))).toEqual({ 'line-hone': 'conforms', 'crank-grind': 'fails', balance: 'fails' });
    const failing = results.checks.filter((c) => c.verdict === 'fails').map((c) => c.what);
    expect(failing).toEqual(['rod journal 4 size', 'residual unbalance, rear plane']);
  });

  it('when the line-hone bores are not read for alignment and a section is missing, then the record is not fully judged, naming both', async () => {
    const { job, shop } = await m.jobIn('inWork', { input: jobInput(bottomEnd) });
    const sections = goodSections();
    sections.lineHone!.bores = sections.lineHone!.bores.map(({ centre: _centre, ...b }) => b);
    delete sections.balance;
    expect((await shop.post(`/api/jobs/${job.id}/inspection`, record(sections))).status).toBe(201);
    const results = await storedResults(job.id);
    expect(results.verdict).toBe('not-fully-judged');
    expect(results.notJudged!.map((n) => [n.section, n.what])).toEqual([
      ['line-hone', 'main bore alignment'],
      ['balance', 'balance'],
    ]);
    expect(Object.fromEntries(results.sections!.map((s) => [s.operation, s.verdict]))).toMatchObject({ 'line-hone': 'not-judged', balance: 'not-judged' });
  });

  it('when the review window ends on a record whose crank-grind section fails, or whose balance section is missing, then neither is accepted by itself', async () => {
    // Issue 15 item 6 (common practice: no silent acceptance of bad work), for the sections of issue 17.
    const failingGrind = goodSections();
    // Rod standard 2.0995 − 0.010 undersize, ± 0.0005 in default (common practice): 2.0884 is under 2.0890.
    failingGrind.crankGrind!.rods[3] = journal(2.0884);
    const missingBalance = goodSections();
    delete missingBalance.balance;
    for (const [sections, verdict] of [
      [failingGrind, 'fail'],
      [missingBalance, 'not-fully-judged'],
    ] as const) {
      const { job, shop, builder } = await m.jobIn('inWork', { input: jobInput(bottomEnd) });
      expect((await shop.post(`/api/jobs/${job.id}/inspection`, record(sections))).status).toBe(201);
      expect((await storedResults(job.id)).verdict).toBe(verdict);
      expect((await builder.get(`/api/jobs/${job.id}/inspection`)).body.autoAccept).toBe(false);
      const [row] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));
      await createScheduler({ db: m.db, handlers: inspectionTaskHandlers(m.server.app.workDeps) }).runDue(new Date(row.reviewDueAt.getTime() + 60_000));
      expect((await m.db.select().from(jobs).where(eq(jobs.id, job.id)))[0].status).toBe('inspection_submitted');
      expect((await m.stripe.transfers.list({ transfer_group: job.id })).data).toHaveLength(0);
    }
  });

  it('when the record has a section for work the job does not order, then it is refused with the field named', async () => {
    const { job, shop } = await m.jobIn('inWork', { input: jobInput(bottomEnd) });
    const res = await shop.post(`/api/jobs/${job.id}/inspection`, record({ ...goodSections(), valveJob: { valves: [{ label: '1 intake', kind: 'intake', seatWidth: 0.05, installedHeight: 1.8, stemToGuide: 0.002 }] } }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty(['sections.valveJob']);
  });

  it('when a record says an aluminium block was hot-tanked, then it is refused with the method field named; a spray wash is taken', async () => {
    // Common practice: caustic hot-tank solutions attack aluminium.
    const { job, shop } = await m.jobIn('inWork', { input: jobInput({ ...bottomEnd, blockMaterial: 'aluminium', operations: [{ code: 'clean', quantity: 1 }, ...bottomEnd.operations!] }) });
    const res = await shop.post(`/api/jobs/${job.id}/inspection`, record({ ...goodSections(), clean: { method: 'hot-tank', result: 'clean', findings: '' } }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields['sections.clean.method']).toMatch(/caustic hot tank attacks aluminium/);
    expect((await shop.get(`/api/jobs/${job.id}`)).body.job.status).toBe('in_work');
    const washed = await shop.post(`/api/jobs/${job.id}/inspection`, record({ ...goodSections(), clean: { method: 'spray-wash', result: 'clean', findings: '' } }));
    expect(washed.status).toBe(201);
    expect((await storedResults(job.id)).sections!.find((s) => s.operation === 'clean')!.verdict).toBe('conforms');
  });

  it('when a bore job’s record has no bore grid, then it is refused: the grid is needed for bore work', async () => {
    const { job, shop } = await m.jobIn('inWork');
    const res = await shop.post(`/api/jobs/${job.id}/inspection`, record({}));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('cylinders');
  });

  it('when the crack test finds a crack, then the record is refused with crack_found, proposing extra work, and the job stays in work', async () => {
    const { job, shop } = await m.jobIn('inWork', { input: jobInput({ ...bottomEnd, operations: [{ code: 'crack-test', quantity: 1 }, ...bottomEnd.operations!] }) });
    const res = await shop.post(
      `/api/jobs/${job.id}/inspection`,
      record({ ...goodSections(), crackTest: { method: 'magnetic-particle', result: 'crack-found', findings: 'A 12 mm indication at the rear main web.' } }),
    );
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('crack_found');
    expect(res.body.error.message).toMatch(/extra work/);
    expect((await shop.get(`/api/jobs/${job.id}`)).body.job.status).toBe('in_work');
    const clear = await shop.post(`/api/jobs/${job.id}/inspection`, record({ ...goodSections(), crackTest: { method: 'magnetic-particle', result: 'no-crack', findings: '' } }));
    expect(clear.status).toBe(201);
    const results = await storedResults(job.id);
    expect(results.sections!.find((s) => s.operation === 'crack-test')!.verdict).toBe('conforms');
  });

  it('when a crack-test section carries photos, then only the shop’s own uploads to this job are taken, and they go out with the record’s milestone', async () => {
    const { job, shop } = await m.jobIn('inWork', { input: jobInput({ ...bottomEnd, operations: [{ code: 'crack-test', quantity: 1 }, ...bottomEnd.operations!] }) });
    const png = await sharp({ create: { width: 320, height: 240, channels: 3, background: { r: 90, g: 90, b: 96 } } }).png().toBuffer();
    const upload = await shop.upload(`/api/jobs/${job.id}/milestone-photos`, 'photos', [{ buffer: png, name: 'crack.png', mimeType: 'image/png' }]);
    expect(upload.status).toBe(201);
    const photoId = upload.body.photos[0].id as string;
    const sections = { ...goodSections(), crackTest: { method: 'dye-penetrant' as const, result: 'no-crack' as const, findings: '', photoIds: [crypto.randomUUID() as string] } };
    expect((await shop.post(`/api/jobs/${job.id}/inspection`, record(sections))).status).toBe(400);
    sections.crackTest.photoIds = [photoId];
    expect((await shop.post(`/api/jobs/${job.id}/inspection`, record(sections))).status).toBe(201);
    const [photo] = await m.db.select().from(milestonePhotos).where(eq(milestonePhotos.id, photoId));
    expect(photo.milestoneId).not.toBeNull();
  });

  it('when a heads-only valve job is recorded, then no bore grid is asked for and the valve section is judged against the job’s and the default limits', async () => {
    const valveJob: Partial<JobInput> = {
      ...bottomEnd,
      title: 'Valve job on two aluminium heads',
      parts: ['heads'],
      blockMaterial: 'aluminium',
      operations: [{ code: 'valve-job', quantity: 2 }],
      limits: { valveJob: { installedHeight: 1.8 } },
    };
    const { job, shop } = await m.jobIn('inWork', { input: jobInput(valveJob) });
    const valves = Array.from({ length: 16 }, (_, i) => ({ label: `${Math.floor(i / 2) + 1} ${i % 2 ? 'exhaust' : 'intake'}`, kind: (i % 2 ? 'exhaust' : 'intake') as 'intake' | 'exhaust', seatWidth: 0.06, installedHeight: 1.802, stemToGuide: 0.002 }));
    valves[5].installedHeight = 1.815;
    expect((await shop.post(`/api/jobs/${job.id}/inspection`, record({ valveJob: { valves } }))).status).toBe(201);
    const results = await storedResults(job.id);
    // 1.815 in is 0.015 in over the 1.800 in target, outside the ± 0.010 in default (common practice, from memory).
    expect(results.checks.find((c) => c.what === 'valve installed height')).toMatchObject({ verdict: 'fails', value: 1.815, note: expect.stringMatching(/valve 3 exhaust/) });
    expect(results.checks.find((c) => c.what === 'valve seat width')).toMatchObject({ verdict: 'conforms', note: expect.stringMatching(/default/) });
    expect(results.sections!.map((s) => [s.operation, s.verdict])).toEqual([['valve-job', 'fails']]);
  });
});
