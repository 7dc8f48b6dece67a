import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq, inArray, isNull } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { messagePhotos, milestonePhotos, scheduledTasks, shops } from '../../server/db/schema';
import { PHOTO_SWEEP_EVERY_MS } from '../../server/lib/unattached-photos';
import { startMoneyApp } from '../setup/money-app';
import { storageSettings, storedKeys } from '../setup/storage';
import type { StorageConfig } from '../../server/env';
import { testConfig, type ApiClient } from '../setup/test-env';

/**
 * The hourly sweep of photos uploaded for a message or a milestone and never
 * attached: after a day the row and both stored sizes go, on the uploads
 * folder and on the S3 stand-in alike; a fresh photo, an attached one and one
 * the shop's saved inspection draft holds stay.
 */
const DAY_AND_AN_HOUR_MS = 25 * 60 * 60_000;

describe.each(['disk', 's3'] as const)('the sweep of unattached photos on %s', (kind) => {
  const settings = { STORAGE: kind, UPLOADS_DIR: mkdtempSync(join(tmpdir(), 'tenthmark-sweep-')), ...storageSettings(inject('s3Endpoint'), kind) };
  let m: Awaited<ReturnType<typeof startMoneyApp>>;
  let storage: StorageConfig;
  beforeAll(async () => {
    m = await startMoneyApp(settings);
    // The app's own storage settings, to list what is stored there.
    storage = testConfig(m.databaseUrl, settings).storage;
  });
  afterAll(async () => {
    await m?.close();
    rmSync(settings.UPLOADS_DIR, { recursive: true, force: true });
  });

  const jpeg = sharp({ create: { width: 64, height: 48, channels: 3, background: '#6b7075' } }).jpeg().toBuffer();
  async function uploadOne(client: ApiClient, path: string): Promise<string> {
    const res = await client.upload(path, 'photos', [{ buffer: await jpeg, name: 'part.jpg' }]);
    expect(res.status).toBe(201);
    return res.body.photos[0].id;
  }
  const keysOf = (prefix: string, id: string) => [`${prefix}${id}-large.webp`, `${prefix}${id}-thumb.webp`];

  it('when a photo was uploaded more than a day ago and never attached, then its row and files are gone; fresh, attached and drafted ones stay', async () => {
    const { job, builder, shop, shopUser } = await m.jobIn('inWork');
    const [shopRow] = await m.db.select().from(shops).where(eq(shops.userId, shopUser.id));
    const thread = await builder.post(`/api/jobs/${job.id}/threads`, { shopId: shopRow.id });
    expect(thread.status).toBe(201);
    const threadId: string = thread.body.thread.id;
    const threadPrefix = `threads/${threadId}/`;
    const jobPrefix = `milestones/${job.id}/`;

    const messagePhoto = (name: string) => uploadOne(builder, `/api/threads/${threadId}/photos`).then((id) => [name, id] as const);
    const milestonePhoto = (name: string) => uploadOne(shop, `/api/jobs/${job.id}/milestone-photos`).then((id) => [name, id] as const);
    const sent = Object.fromEntries(await Promise.all(['oldUnsent', 'freshUnsent', 'oldSent'].map(messagePhoto)));
    const logged = Object.fromEntries(await Promise.all(['oldUnattached', 'freshUnattached', 'oldLogged', 'oldInDraft'].map(milestonePhoto)));

    expect((await builder.post(`/api/threads/${threadId}/messages`, { clientId: 'sweep-test-1', body: 'The block, as it left.', photoIds: [sent.oldSent] })).status).toBe(201);
    expect((await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'teardown', note: 'Torn down and cleaned.', photoIds: [logged.oldLogged] })).status).toBe(201);
    const draft = await shop.put(`/api/jobs/${job.id}/inspection/draft`, { draft: { sections: { crackTest: { method: 'dye-penetrant', photoIds: [logged.oldInDraft] } } } });
    expect(draft.status).toBe(200);

    // Uploaded a day and an hour ago (the sweep below runs with the clock moved on by its interval, two hours in all).
    const longAgo = new Date(Date.now() - DAY_AND_AN_HOUR_MS);
    await m.db.update(messagePhotos).set({ createdAt: longAgo }).where(inArray(messagePhotos.id, [sent.oldUnsent, sent.oldSent]));
    await m.db.update(milestonePhotos).set({ createdAt: longAgo }).where(inArray(milestonePhotos.id, [logged.oldUnattached, logged.oldLogged, logged.oldInDraft]));

    // The app scheduled the sweep at start-up; by then it is due, on whichever instance leases it first.
    const later = new Date(Date.now() + 2 * PHOTO_SWEEP_EVERY_MS);
    await m.server.scheduler.runDue(later);

    const messageRows = await m.db.select({ id: messagePhotos.id }).from(messagePhotos).where(eq(messagePhotos.threadId, threadId));
    expect(messageRows.map((row) => row.id).sort()).toEqual([sent.freshUnsent, sent.oldSent].sort());
    const milestoneRows = await m.db.select({ id: milestonePhotos.id }).from(milestonePhotos).where(eq(milestonePhotos.jobId, job.id));
    expect(milestoneRows.map((row) => row.id).sort()).toEqual([logged.freshUnattached, logged.oldLogged, logged.oldInDraft].sort());

    expect(await storedKeys(storage, threadPrefix)).toEqual([...keysOf(threadPrefix, sent.freshUnsent), ...keysOf(threadPrefix, sent.oldSent)].sort());
    expect(await storedKeys(storage, jobPrefix)).toEqual([logged.freshUnattached, logged.oldLogged, logged.oldInDraft].flatMap((id) => keysOf(jobPrefix, id)).sort());
    // What stays is still served: the sent photo to the other side, the fresh one to its uploader.
    expect((await shop.get(`/api/threads/${threadId}/photos/${sent.oldSent}/thumb`)).status).toBe(200);
    expect((await builder.get(`/api/threads/${threadId}/photos/${sent.freshUnsent}/thumb`)).status).toBe(200);
    expect((await builder.get(`/api/threads/${threadId}/photos/${sent.oldUnsent}/thumb`)).status).toBe(404);

    // The sweep put in its next run, an interval after the clock it ran with; only that one waits.
    const waiting = await m.db
      .select()
      .from(scheduledTasks)
      .where(and(eq(scheduledTasks.kind, 'sweep-unattached-photos'), isNull(scheduledTasks.doneAt)));
    expect(waiting).toHaveLength(1);
    expect(waiting[0].runAt.getTime()).toBeGreaterThan(later.getTime());
    expect(waiting[0].runAt.getTime()).toBeLessThanOrEqual(later.getTime() + PHOTO_SWEEP_EVERY_MS);
  });
});
