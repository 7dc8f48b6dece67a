import { readFileSync } from 'node:fs';
import { crc32 } from 'node:zlib';
import sharp from 'sharp';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createJob, createShop, createUser } from '../factories';
import { STORAGE_UNDER_TEST, storedKeys } from '../setup/storage';
import { setupTestApp, signedIn, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

const jpeg = (width = 640, height = 480) =>
  sharp({ create: { width, height, channels: 3, background: { r: 120, g: 110, b: 100 } } }).jpeg().toBuffer();

/** A real 1×1 PNG whose header is rewritten to claim width × height pixels (with a correct checksum). */
async function pngClaiming(width: number, height: number): Promise<Buffer> {
  const png = Buffer.from(await sharp({ create: { width: 1, height: 1, channels: 3, background: '#888' } }).png().toBuffer());
  // Signature (8) + IHDR length (4) + "IHDR" (4) + width (4) + height (4) ...
  png.writeUInt32BE(width, 16);
  png.writeUInt32BE(height, 20);
  png.writeUInt32BE(crc32(png.subarray(12, 29)), 29);
  return png;
}

/** A PNG signature followed by bytes no decoder can read: sniffed as PNG, refused only when decoded (415). */
const undecodablePng = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(4096, 0x5a)]);

async function ownerWithJob() {
  const builder = await createUser(ctx.db);
  const job = await createJob(ctx.db, builder.id, { status: 'draft' });
  return { builder, job, b: await signedIn(ctx.app, builder) };
}

const upload = (client: Awaited<ReturnType<typeof signedIn>>, jobId: string, files: Array<{ data: Buffer; name: string }>) => {
  let req = client.agent.post(`/api/jobs/${jobId}/photos`).set('X-CSRF-Token', client.token);
  for (const file of files) req = req.attach('photos', file.data, file.name);
  return req;
};

describe('job photos', () => {
  it('when JPEG and PNG photos are uploaded, then each is stored as a large and a thumbnail WebP, shown to allowed people only', async () => {
    const { job, b } = await ownerWithJob();
    const res = await upload(b, job.id, [
      { data: await jpeg(3000, 2000), name: 'block-front.jpg' },
      { data: Buffer.from(await sharp({ create: { width: 300, height: 300, channels: 4, background: '#345' } }).png().toBuffer()), name: 'deck.png' },
    ]);
    expect(res.status).toBe(201);
    expect(res.body.photos).toHaveLength(2);
    expect(res.body.photos[0]).toMatchObject({ width: 2000, height: 1333 });
    // Two sizes of each, in the storage this run is about (the uploads folder, or the S3 stand-in).
    expect(ctx.config.storage.kind).toBe(STORAGE_UNDER_TEST);
    expect(await storedKeys(ctx.config.storage, `jobs/${job.id}/`)).toHaveLength(4);

    const large = await b.agent.get(res.body.photos[0].largeUrl).buffer(true);
    expect(large.status).toBe(200);
    expect(large.headers['content-type']).toBe('image/webp');
    const meta = await sharp(large.body as Buffer).metadata();
    expect(meta.format).toBe('webp');
    expect(Math.max(meta.width!, meta.height!)).toBe(2000);
    const thumb = await sharp((await b.agent.get(res.body.photos[0].thumbUrl).buffer(true)).body as Buffer).metadata();
    expect(Math.max(thumb.width!, thumb.height!)).toBe(480);

    // A draft's photos are nobody else's; a signed-out visitor is asked to sign in.
    const { user: shopUser } = await createShop(ctx.db);
    const shop = await signedIn(ctx.app, shopUser);
    expect((await shop.get(res.body.photos[0].thumbUrl)).status).toBe(404);
    expect((await supertest(ctx.app).get(res.body.photos[0].thumbUrl)).status).toBe(401);
    await b.post(`/api/jobs/${job.id}/publish`);
    expect((await shop.get(res.body.photos[0].thumbUrl)).status).toBe(200);

    const detail = await shop.get(`/api/jobs/${job.id}`);
    expect(detail.body.job.photos.map((p: { id: string }) => p.id)).toEqual(res.body.photos.map((p: { id: string }) => p.id));
  });

  it('when a photo carries GPS data, then the stored copy has no metadata at all, and its orientation is applied', async () => {
    const { job, b } = await ownerWithJob();
    const withGps = await sharp({ create: { width: 400, height: 200, channels: 3, background: '#777' } })
      .jpeg()
      .withMetadata({ orientation: 6 })
      .withExifMerge({
        IFD0: { Copyright: 'marker-for-test' },
        IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '48/1 51/1 2400/100', GPSLongitudeRef: 'E', GPSLongitude: '2/1 21/1 300/100' },
      })
      .toBuffer();
    const inputMeta = await sharp(withGps).metadata();
    expect(inputMeta.exif?.includes(Buffer.from('marker-for-test'))).toBe(true);
    // The GPSInfo pointer, tag 0x8825, stored little-endian.
    expect(inputMeta.exif?.includes(Buffer.from([0x25, 0x88]))).toBe(true);
    expect(inputMeta.orientation).toBe(6);

    const res = await upload(b, job.id, [{ data: withGps, name: 'with-gps.jpg' }]);
    expect(res.status).toBe(201);
    const stored = (await b.agent.get(res.body.photos[0].largeUrl).buffer(true)).body as Buffer;
    const meta = await sharp(stored).metadata();
    expect(meta.exif).toBeUndefined();
    expect(meta.xmp).toBeUndefined();
    expect(meta.icc).toBeUndefined();
    expect(stored.includes(Buffer.from('marker-for-test'))).toBe(false);
    // Orientation 6 means "rotate 90°": the stored picture stands upright, taller than wide.
    expect([meta.width, meta.height]).toEqual([200, 400]);
  });

  it('when an executable is renamed .jpg, then 415 and nothing is stored', async () => {
    const { job, b } = await ownerWithJob();
    const res = await upload(b, job.id, [{ data: readFileSync('/bin/true'), name: 'holiday.jpg' }]);
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_type');
    expect((await b.get(`/api/jobs/${job.id}`)).body.job.photos).toHaveLength(0);
    expect(await storedKeys(ctx.config.storage, `jobs/${job.id}/`)).toEqual([]);
  });

  it('when a file is 20 MB, then 413', async () => {
    const { job, b } = await ownerWithJob();
    const big = Buffer.concat([await jpeg(), Buffer.alloc(20 * 1024 * 1024)]);
    const res = await upload(b, job.id, [{ data: big, name: 'huge.jpg' }]);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
  });

  it('when a PNG claims 20000 × 20000 pixels, then it is refused before decoding', async () => {
    const { job, b } = await ownerWithJob();
    const bomb = await pngClaiming(20_000, 20_000);
    expect((await sharp(bomb, { limitInputPixels: false }).metadata()).width).toBe(20_000);
    const res = await upload(b, job.id, [{ data: bomb, name: 'bomb.png' }]);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_many_pixels');
  });

  it('when a job would pass 12 photos, then 409; a shop cannot upload; the owner can remove one', async () => {
    const { job, b } = await ownerWithJob();
    const small = await jpeg(64, 64);
    const twelve = Array.from({ length: 12 }, (_, i) => ({ data: small, name: `p${i}.jpg` }));
    const first = await upload(b, job.id, twelve);
    expect(first.status).toBe(201);
    const more = await upload(b, job.id, [{ data: small, name: 'thirteen.jpg' }]);
    expect(more.status).toBe(409);
    expect(more.body.error.code).toBe('too_many_photos');
    // The thirteenth was stored before the count was checked under the job's lock, and removed again.
    expect(await storedKeys(ctx.config.storage, `jobs/${job.id}/`)).toHaveLength(24);

    const { user } = await createShop(ctx.db);
    const shop = await signedIn(ctx.app, user);
    expect((await upload(shop, job.id, [{ data: small, name: 'x.jpg' }])).status).toBe(403);

    const removed = await b.agent.delete(`/api/jobs/${job.id}/photos/${first.body.photos[0].id}`).set('X-CSRF-Token', b.token);
    expect(removed.status).toBe(204);
    expect((await b.get(first.body.photos[0].thumbUrl)).status).toBe(404);
    expect((await storedKeys(ctx.config.storage, `jobs/${job.id}/`)).filter((key) => key.includes(first.body.photos[0].id))).toEqual([]);
    expect((await upload(b, job.id, [{ data: small, name: 'again.jpg' }])).status).toBe(201);
  });

  it('when someone uploads to a job that is not theirs, then 404 or 403 before the file is decoded', async () => {
    const { job: draft, b: owner } = await ownerWithJob();
    const open = await createJob(ctx.db, (await createUser(ctx.db)).id);
    const stranger = await signedIn(ctx.app, await createUser(ctx.db));
    // The owner's own upload of these bytes reaches the decoder and is refused there.
    expect((await upload(owner, draft.id, [{ data: undecodablePng, name: 'broken.png' }])).status).toBe(415);

    const hidden = await upload(stranger, draft.id, [{ data: undecodablePng, name: 'broken.png' }]);
    expect(hidden.status).toBe(404);
    expect(hidden.body).toEqual({ error: { code: 'not_found', message: expect.any(String) } });
    const notTheirs = await upload(stranger, open.id, [{ data: undecodablePng, name: 'broken.png' }]);
    expect(notTheirs.status).toBe(403);
    expect(notTheirs.body.error.code).toBe('forbidden');
    expect((await upload(stranger, '00000000-0000-4000-8000-000000000000', [{ data: undecodablePng, name: 'broken.png' }])).status).toBe(404);
  });

  it('when the upload has no files or the wrong field name, then 400', async () => {
    const { job, b } = await ownerWithJob();
    expect((await b.post(`/api/jobs/${job.id}/photos`)).status).toBe(400);
    const wrongField = await b.agent.post(`/api/jobs/${job.id}/photos`).set('X-CSRF-Token', b.token).attach('picture', await jpeg(), 'a.jpg');
    expect(wrongField.status).toBe(400);
  });
});

describe('conversation and milestone photos', () => {
  it('when someone outside the conversation or the work uploads, then 404 before the file is decoded', async () => {
    const builder = await createUser(ctx.db);
    const job = await createJob(ctx.db, builder.id);
    const { user: shopUser } = await createShop(ctx.db);
    const shop = await signedIn(ctx.app, shopUser);
    const thread = await shop.post(`/api/jobs/${job.id}/threads`, {});
    expect(thread.status).toBe(201);
    const threadId: string = thread.body.thread.id;
    const send = (client: Awaited<ReturnType<typeof signedIn>>, path: string) =>
      client.agent.post(path).set('X-CSRF-Token', client.token).attach('photos', undecodablePng, 'broken.png');

    // A party to the conversation reaches the decoder with these bytes.
    expect((await send(shop, `/api/threads/${threadId}/photos`)).status).toBe(415);

    const strangerBuilder = await signedIn(ctx.app, await createUser(ctx.db));
    const strangerShop = await signedIn(ctx.app, (await createShop(ctx.db)).user);
    for (const stranger of [strangerBuilder, strangerShop]) {
      const res = await send(stranger, `/api/threads/${threadId}/photos`);
      expect(res.status).toBe(404);
      expect(res.body).toEqual({ error: { code: 'not_found', message: expect.any(String) } });
    }
    // No shop is doing this job's work yet: every shop's milestone photo is refused unread.
    for (const client of [shop, strangerShop]) {
      const res = await send(client, `/api/jobs/${job.id}/milestone-photos`);
      expect(res.status).toBe(404);
      expect(res.body).toEqual({ error: { code: 'not_found', message: expect.any(String) } });
    }
  });
});
