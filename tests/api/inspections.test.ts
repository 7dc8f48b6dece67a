import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluateInspection } from '../../shared/calc/inspection-record';
import type { InspectionInput } from '../../shared/schemas/inspection';
import { inspectionRecords, jobs, mailOutbox, milestonePhotos, scheduledTasks } from '../../server/db/schema';
import { createScheduler } from '../../server/lib/scheduler';
import { inspectionTaskHandlers } from '../../server/modules/inspections/inspections.service';
import { jobBalance } from '../../server/modules/payments/ledger';
import { createUser, inspectionRecordInput, jobInput } from '../factories';
import { startMoneyApp } from '../setup/money-app';
import { certificateText, expectStoredCopyServed, storedDocuments } from '../setup/pdf';
import { signedIn } from '../setup/test-env';

let m: Awaited<ReturnType<typeof startMoneyApp>>;
beforeAll(async () => {
  m = await startMoneyApp();
});
afterAll(async () => {
  await m?.close();
});

const record = (overrides: Partial<InspectionInput> = {}, badTaperOn?: number) => inspectionRecordInput(overrides, badTaperOn);

const spec = jobInput({ maxTaper: 0.0005, maxOutOfRound: 0.0005, crosshatchMinDeg: 40, crosshatchMaxDeg: 50, finishRaMaxUm: 0.6 });

const inWork = () => m.jobIn('inWork', { input: spec, receivedNote: 'Arrived on a pallet, plugs in.' });

describe('milestones', () => {
  it('when the shop logs the block received, then the job is in work and both sides see the timeline; others cannot log', async () => {
    const { job, builder, shop } = await m.fundedJob();
    expect((await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'teardown', note: 'Found a crack' })).status).toBe(409);
    expect((await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'block_received' })).status).toBe(201);
    expect((await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'block_received' })).status).toBe(409);
    expect((await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'operation_started', operation: 'bore' })).status).toBe(201);
    expect((await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'shipped', carrier: 'Freight' })).body.error.fields.trackingNumber).toBeDefined();
    const timeline = await builder.get(`/api/jobs/${job.id}/milestones`);
    expect(timeline.body.milestones.map((x: { kind: string }) => x.kind)).toEqual(['block_received', 'operation_started']);
    expect((await builder.get(`/api/jobs/${job.id}`)).body.job.status).toBe('in_work');
    const stranger = await signedIn(m.server.app, await createUser(m.db));
    expect((await stranger.get(`/api/jobs/${job.id}/milestones`)).status).toBe(403);
    expect((await builder.post(`/api/jobs/${job.id}/milestones`, { kind: 'note', note: 'hi' })).status).toBe(403);
  });
});

type Client = Awaited<ReturnType<typeof signedIn>>;
const uploadMilestonePhotos = (client: Client, jobId: string, files: Array<{ data: Buffer; name: string }>) => {
  let req = client.agent.post(`/api/jobs/${jobId}/milestone-photos`).set('X-CSRF-Token', client.token);
  for (const file of files) req = req.attach('photos', file.data, file.name);
  return req;
};
/** A JPEG carrying a marker and GPS position in its EXIF, which must not survive. */
const jpegWithGps = () =>
  sharp({ create: { width: 640, height: 480, channels: 3, background: { r: 120, g: 110, b: 100 } } })
    .jpeg()
    .withExifMerge({
      IFD0: { Copyright: 'marker-for-test' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '48/1 51/1 2400/100', GPSLongitudeRef: 'E', GPSLongitude: '2/1 21/1 300/100' },
    })
    .toBuffer();

describe('milestone photos', () => {
  it('when the shop logs a teardown with a photo, then the builder sees it on the timeline and can load it; strangers cannot', async () => {
    const { job, builder, shop } = await inWork();
    // Only the working shop uploads.
    expect((await uploadMilestonePhotos(builder, job.id, [{ data: await jpegWithGps(), name: 'x.jpg' }])).status).toBe(403);
    const up = await uploadMilestonePhotos(shop, job.id, [{ data: await jpegWithGps(), name: 'teardown.jpg' }]);
    expect(up.status).toBe(201);
    expect(up.body.photos).toHaveLength(1);
    const photo = up.body.photos[0];
    expect(photo).toMatchObject({ width: 640, height: 480, thumbUrl: `/api/jobs/${job.id}/milestone-photos/${photo.id}/thumb` });
    const [row] = await m.db.select().from(milestonePhotos).where(eq(milestonePhotos.id, photo.id));
    expect(row.storageKey.startsWith(`milestones/${job.id}/`)).toBe(true);

    // Before it is attached, only the uploader sees it.
    expect((await builder.agent.get(photo.largeUrl)).status).toBe(404);

    const logged = await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'teardown', note: 'Cracked main web, photo attached.', photoIds: [photo.id] });
    expect(logged.status).toBe(201);
    expect(logged.body.milestone.photos).toEqual([photo]);

    const timeline = await builder.get(`/api/jobs/${job.id}/milestones`);
    const teardown = timeline.body.milestones.find((x: { kind: string }) => x.kind === 'teardown');
    expect(teardown.photos).toEqual([photo]);
    expect(timeline.body.milestones.find((x: { kind: string }) => x.kind === 'block_received').photos).toEqual([]);

    const large = await builder.agent.get(photo.largeUrl).buffer(true);
    expect(large.status).toBe(200);
    expect(large.headers['content-type']).toBe('image/webp');
    const meta = await sharp(large.body as Buffer).metadata();
    expect(meta.format).toBe('webp');
    expect(meta.exif).toBeUndefined();
    expect((large.body as Buffer).includes(Buffer.from('marker-for-test'))).toBe(false);
    expect((await builder.agent.get(photo.thumbUrl)).status).toBe(200);

    const stranger = await signedIn(m.server.app, await createUser(m.db));
    expect([403, 404]).toContain((await stranger.agent.get(photo.largeUrl)).status);
    expect([403, 404]).toContain((await uploadMilestonePhotos(stranger, job.id, [{ data: await jpegWithGps(), name: 'x.jpg' }])).status);

    // The same photo cannot go on a second milestone.
    const again = await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'note', note: 'Again', photoIds: [photo.id] });
    expect(again.status).toBe(400);
    expect(again.body.error.fields.photoIds).toBeDefined();
  });

  it('when a milestone names a photo from another job, or the same photo twice, then 400 with a field message and nothing is logged', async () => {
    const first = await inWork();
    const other = await inWork();
    const up = await uploadMilestonePhotos(other.shop, other.job.id, [{ data: await jpegWithGps(), name: 'theirs.jpg' }]);
    expect(up.status).toBe(201);
    const theirs = up.body.photos[0].id as string;

    const refused = await first.shop.post(`/api/jobs/${first.job.id}/milestones`, { kind: 'note', note: 'Borrowed photo', photoIds: [theirs] });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.photoIds).toMatch(/not one you uploaded/);
    // The other shop cannot use it on the first job either, nor repeat one.
    expect((await other.shop.post(`/api/jobs/${first.job.id}/milestones`, { kind: 'note', note: 'x', photoIds: [theirs] })).status).toBe(404);
    const twice = await other.shop.post(`/api/jobs/${other.job.id}/milestones`, { kind: 'note', note: 'x', photoIds: [theirs, theirs] });
    expect(twice.status).toBe(400);

    const timeline = await first.builder.get(`/api/jobs/${first.job.id}/milestones`);
    expect(timeline.body.milestones.map((x: { kind: string }) => x.kind)).toEqual(['block_received']);
    const [row] = await m.db.select().from(milestonePhotos).where(eq(milestonePhotos.id, theirs));
    expect(row.milestoneId).toBeNull();
  });
});

describe('inspection record', () => {
  it('when a record is submitted with made-up computed figures, then they are ignored and the server’s own results match the calculation library', async () => {
    const { job, builder, shop, builderUser } = await inWork();
    const input = record({}, 2);
    const tampered = {
      ...input,
      results: { pass: true, checks: [] },
      pass: true,
      cylinders: input.cylinders!.map((c) => ({ ...c, taper: 0, outOfRound: 0, pass: true })),
    };
    const res = await shop.post(`/api/jobs/${job.id}/inspection`, tampered);
    expect(res.status).toBe(201);
    const version = res.body.version;
    expect(version.version).toBe(1);
    expect(version.input.results).toBeUndefined();
    expect(version.input.cylinders[0].taper).toBeUndefined();
    // derived: the same library the form uses, on the raw readings alone
    expect(version.results).toEqual(JSON.parse(JSON.stringify(evaluateInspection(input, spec))));
    // derived: cylinder 3's 0.0010 in taper read at 21 °C is 0.0010 / (1 + 10.8e-6 · 1) at 20 °C (ISO 1; α grey cast iron, Engineering ToolBox)
    expect(version.results.bores.cylinders[2].taper).toBeCloseTo(0.001 / (1 + 10.8e-6), 9);
    expect(version.results.pass).toBe(false);
    expect(version.results.checks.find((c: { what: string }) => c.what === 'cylinder 3 taper')).toMatchObject({ pass: false });
    const [stored] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));
    expect(stored.pass).toBe(false);
    expect((await builder.get(`/api/jobs/${job.id}`)).body.job.status).toBe('inspection_submitted');
    expect(await m.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, builderUser.email), eq(mailOutbox.template, 'inspection_submitted')))).toHaveLength(1);
  });

  it('when the record has the wrong number of cylinders, then 400; a second record while one waits is 409', async () => {
    const { job, shop } = await inWork();
    const short = record();
    short.cylinders = short.cylinders!.slice(0, 6);
    expect((await shop.post(`/api/jobs/${job.id}/inspection`, short)).status).toBe(400);
    expect((await shop.post(`/api/jobs/${job.id}/inspection`, record())).status).toBe(201);
    expect((await shop.post(`/api/jobs/${job.id}/inspection`, record())).status).toBe(409);
  });

  it('when the builder rejects with reasons and the shop resubmits, then both versions are kept and readable', async () => {
    const { job, builder, shop } = await inWork();
    await shop.post(`/api/jobs/${job.id}/inspection`, record({}, 4));
    const rejected = await builder.post(`/api/jobs/${job.id}/inspection/reject`, { version: 1, reasons: 'Cylinder 5 is tapered; hone it again.' });
    expect(rejected.status).toBe(200);
    expect(rejected.body.version.status).toBe('rejected');
    expect((await builder.get(`/api/jobs/${job.id}`)).body.job.status).toBe('in_work');
    const second = await shop.post(`/api/jobs/${job.id}/inspection`, record());
    expect(second.body.version.version).toBe(2);
    const view = await builder.get(`/api/jobs/${job.id}/inspection`);
    expect(view.body.versions.map((v: { version: number; status: string }) => [v.version, v.status])).toEqual([
      [2, 'submitted'],
      [1, 'rejected'],
    ]);
    expect(view.body.versions[1].rejectReasons).toBe('Cylinder 5 is tapered; hone it again.');
    expect(view.body.versions[0].results.pass).toBe(true);
    expect(view.body.reviewDueAt).toBeTruthy();
  });

  it('when 20 accepts race, then one succeeds, the payment is released exactly once and the job is completed', async () => {
    const { job, builder, shop } = await inWork();
    await shop.post(`/api/jobs/${job.id}/inspection`, record());
    const answers = await Promise.all(Array.from({ length: 20 }, () => builder.post(`/api/jobs/${job.id}/inspection/accept`, { version: 1 })));
    expect(answers.filter((a) => a.status === 200)).toHaveLength(1);
    expect(answers.filter((a) => a.status === 409)).toHaveLength(19);
    expect((await m.stripe.transfers.list({ transfer_group: job.id })).data).toHaveLength(1);
    const balance = await jobBalance(m.db, job.id);
    // derived: 50,000 less 8 % (4,000)
    expect(balance).toMatchObject({ paidIn: 50_000, released: 46_000, fee: 4_000, held: 0 });
    expect((await builder.get(`/api/jobs/${job.id}`)).body.job.status).toBe('completed');
  });

  it('when nobody answers, then with two workers and a moved clock the reminder goes once and the record is accepted once', async () => {
    const { job, shop, builderUser, shopUser } = await inWork();
    await shop.post(`/api/jobs/${job.id}/inspection`, record());
    const [submitted] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));
    const workers = [0, 1].map(() => createScheduler({ db: m.db, handlers: inspectionTaskHandlers(m.server.app.workDeps) }));

    // Four days and a bit: only the reminder is due.
    const dayFour = new Date(submitted.reviewDueAt.getTime() - 23 * 60 * 60_000);
    await Promise.all(workers.map((w) => w.runDue(dayFour)));
    const reminders = await m.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, builderUser.email), eq(mailOutbox.template, 'review_reminder')));
    expect(reminders).toHaveLength(1);
    expect((await m.db.select().from(jobs).where(eq(jobs.id, job.id)))[0].status).toBe('inspection_submitted');

    // Past the window: accepted by itself, released once, told once.
    const after = new Date(submitted.reviewDueAt.getTime() + 60_000);
    await Promise.all([...workers.map((w) => w.runDue(after)), ...workers.map((w) => w.runDue(after))]);
    expect((await m.db.select().from(jobs).where(eq(jobs.id, job.id)))[0].status).toBe('completed');
    const [decided] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));
    expect(decided).toMatchObject({ status: 'accepted', decidedHow: 'review window' });
    expect((await m.stripe.transfers.list({ transfer_group: job.id })).data).toHaveLength(1);
    expect(await m.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, shopUser.email), eq(mailOutbox.template, 'inspection_accepted_by_window')))).toHaveLength(1);
    const tasks = await m.db.select().from(scheduledTasks).where(eq(scheduledTasks.key, `review-window-${submitted.id}`));
    expect(tasks[0].doneAt).not.toBeNull();
    expect(tasks[0].attempts).toBe(1);
  });

  it('when the builder answered in time, then the window ending changes nothing', async () => {
    const { job, builder, shop } = await inWork();
    await shop.post(`/api/jobs/${job.id}/inspection`, record());
    await builder.post(`/api/jobs/${job.id}/inspection/reject`, { version: 1, reasons: 'Deck finish is too rough.' });
    const [first] = await m.db.select().from(inspectionRecords).where(eq(inspectionRecords.jobId, job.id));
    await createScheduler({ db: m.db, handlers: inspectionTaskHandlers(m.server.app.workDeps) }).runDue(new Date(first.reviewDueAt.getTime() + 60_000));
    expect((await m.db.select().from(jobs).where(eq(jobs.id, job.id)))[0].status).toBe('in_work');
    expect((await m.stripe.transfers.list({ transfer_group: job.id })).data).toHaveLength(0);
  });

  it('when the certificate is downloaded, then the PDF’s own text holds every reading, the results, the sign-off and the caution', async () => {
    const { job, builder, shop } = await inWork();
    const input = record({}, 6);
    await shop.post(`/api/jobs/${job.id}/inspection`, input);
    // The download answers 200 with application/pdf (checked inside certificateText).
    const text = await certificateText(builder, job.id, 1);
    for (const cylinder of input.cylinders!) {
      for (const value of [cylinder.top.thrust, cylinder.top.axial, cylinder.middle.thrust, cylinder.bottom.thrust]) expect(text).toContain(value.toFixed(4));
    }
    expect(text).toContain('Ada Quernfield');
    expect(text).toContain('FAIL');
    expect(text).toContain('cylinder 7 taper');
    expect(text).toMatch(/Figures are guidance/);
    const stranger = await signedIn(m.server.app, await createUser(m.db));
    expect((await stranger.get(`/api/jobs/${job.id}/inspection/1/certificate.pdf`)).status).toBe(403);
    expect((await builder.get(`/api/jobs/${job.id}/inspection/9/certificate.pdf`)).status).toBe(404);
  });

  it('when a certificate is downloaded again, then the stored copy is sent, not a new print; when its version is sent back, then a new one says so', async () => {
    const { job, builder, shop } = await inWork();
    await shop.post(`/api/jobs/${job.id}/inspection`, record());
    const path = `/api/jobs/${job.id}/inspection/1/certificate.pdf`;
    await expectStoredCopyServed(builder, path, { config: m.config, storage: m.server.app.storage }, 'certificates', `${job.id}-v1`);
    expect((await builder.post(`/api/jobs/${job.id}/inspection/reject`, { version: 1, reasons: 'Deck finish is too rough.' })).status).toBe(200);
    expect(await certificateText(builder, job.id, 1)).toContain('Changes asked');
    expect(await storedDocuments(m.config.storage, 'certificates', `${job.id}-v1`)).toHaveLength(2);
  });

  it('when a record without a bore grid has line hone and balance sections, then the PDF prints a part per operation with its checks, no bore table, and ≤ as text', async () => {
    const { job, shop, builder } = await m.jobIn('inWork', {
      input: jobInput({
        title: 'Line hone and balance, no bore work',
        parts: ['block', 'rotating-assembly'],
        operations: [
          { code: 'line-hone', quantity: 1 },
          { code: 'balance', quantity: 1 },
        ],
        limits: { lineHone: { housingMin: 2.6406, housingMax: 2.6416 }, balance: { serviceRpm: 6500 } },
      }),
    });
    const bore = { vertical: { front: 2.641, rear: 2.6411 }, second: { front: 2.641, rear: 2.6411 }, centre: 0 };
    const input: InspectionInput = {
      conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 20 },
      sections: {
        lineHone: { secondDirection: '45', bores: [bore, bore, { ...bore, centre: 0.0002 }, bore, bore] },
        balance: { rotatingGrams: 1580, reciprocatingGrams: 1260, bobWeightGrams: 2210, rotorMassKg: 23, grade: 6.3, serviceRpm: 6500, residual: [{ plane: 'front', gmm: 60 }, { plane: 'rear', gmm: 55 }] },
      },
      signedOffBy: 'Ada Quernfield',
      notes: '',
    };
    const submitted = await shop.post(`/api/jobs/${job.id}/inspection`, input);
    expect(submitted.status).toBe(201);
    expect(submitted.body.version.results.sections.map((s: { operation: string; verdict: string }) => [s.operation, s.verdict])).toEqual([
      ['line-hone', 'conforms'],
      ['balance', 'conforms'],
    ]);
    const text = await certificateText(builder, job.id, 1);
    expect(text).toContain('Line hone: Conforms');
    expect(text).toContain('Balance: Conforms');
    expect(text).toContain('main bore alignment');
    expect(text).toContain('residual unbalance, rear plane');
    expect(text).toMatch(/allowed ≤ 0\.0005 in/);
    expect(text).not.toContain('Bores (');
  });

  it('when the shop saves drafts, then they come back only to it, stop once the record is submitted, and a long surface trace fits in the record', async () => {
    const { job, shop, builder } = await inWork();
    const saved = await shop.agent.put(`/api/jobs/${job.id}/inspection/draft`).set('X-CSRF-Token', shop.token).send({ draft: { cylinders: [{ top: { thrust: '4.03' } }] } });
    expect(saved.status).toBe(200);
    expect((await shop.get(`/api/jobs/${job.id}/inspection`)).body.draft).toEqual({ cylinders: [{ top: { thrust: '4.03' } }] });
    // A trace of 100,000 heights (about 1 MB of JSON): a triangle wave, Ra = A/2 (derived).
    const heightsUm = Array.from({ length: 100_000 }, (_, i) => {
      const phase = (i % 400) / 400;
      return phase < 0.5 ? -1 + 4 * phase : 3 - 4 * phase;
    });
    const submitted = await shop.post(`/api/jobs/${job.id}/inspection`, record({ finish: { mode: 'profile', heightsUm, spacingUm: 0.5 } }));
    expect(submitted.status).toBe(201);
    expect(submitted.body.version.results.finish.raUm).toBeCloseTo(0.5, 3);
    const late = await shop.agent.put(`/api/jobs/${job.id}/inspection/draft`).set('X-CSRF-Token', shop.token).send({ draft: { late: true } });
    expect(late.status).toBe(409);
    expect((await builder.get(`/api/jobs/${job.id}/milestones`)).body.milestones.map((x: { kind: string }) => x.kind)).toEqual(['block_received', 'inspection_submitted']);
  });

  it('when someone else tries, then the shop alone submits and the builder alone decides', async () => {
    const { job, builder, shop } = await inWork();
    expect((await builder.post(`/api/jobs/${job.id}/inspection`, record())).status).toBe(403);
    await shop.post(`/api/jobs/${job.id}/inspection`, record());
    expect((await shop.post(`/api/jobs/${job.id}/inspection/accept`, { version: 1 })).status).toBe(403);
    const otherBuilder = await signedIn(m.server.app, await createUser(m.db));
    expect((await otherBuilder.post(`/api/jobs/${job.id}/inspection/accept`, { version: 1 })).status).toBe(403);
    expect((await otherBuilder.get(`/api/jobs/${job.id}/inspection`)).status).toBe(403);
    expect((await builder.get(`/api/jobs/${job.id}/inspection`)).body.draft).toBeNull();
  });
});
