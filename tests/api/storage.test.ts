import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { buffer } from 'node:stream/consumers';
import express from 'express';
import sharp from 'sharp';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { loadConfig } from '../../server/env';
import { withStoredPhotos } from '../../server/lib/images';
import { receivePhotos, sendPhoto, uploadedFiles } from '../../server/lib/photo-upload';
import { createStorage, type FileStorage } from '../../server/lib/storage';
import { storageSettings, storedKeys } from '../setup/storage';

/**
 * The storage contract, the same checks on the uploads folder and on the S3
 * stand-in (s3rver, started by the global setup): what goes in comes back as
 * a stream of the same bytes, a missing key is "not there", removing is
 * idempotent, and a photo save that fails leaves no file behind.
 */
const folders: string[] = [];
afterAll(() => {
  for (const dir of folders) rmSync(dir, { recursive: true, force: true });
});

function configFor(kind: 'disk' | 's3') {
  const dir = mkdtempSync(join(tmpdir(), 'tenthmark-storage-'));
  folders.push(dir);
  return loadConfig({ NODE_ENV: 'test', UPLOADS_DIR: dir, ...storageSettings(inject('s3Endpoint'), kind) }).storage;
}

const unique = () => `t${Math.random().toString(36).slice(2, 10)}`;

describe.each(['disk', 's3'] as const)('file storage on %s', (kind) => {
  const config = configFor(kind);
  const storage: FileStorage = createStorage(config);
  afterAll(() => storage.close());

  it('when a file is put, then get streams back exactly its bytes with its size', async () => {
    const key = `jobs/${unique()}/photo-large.webp`;
    // Bytes that would show any framing or re-encoding: every byte value, twice, plus a CRLF run.
    const data = Buffer.concat([Buffer.from(Array.from({ length: 512 }, (_, i) => i % 256)), Buffer.from('\r\n0\r\n\r\n')]);
    await storage.put(key, data);
    const file = await storage.get(key);
    expect(file?.size).toBe(data.length);
    expect(Buffer.compare(await buffer(file!.body), data)).toBe(0);
  });

  it('when a key was never stored, then get says it is not there', async () => {
    expect(await storage.get(`jobs/${unique()}/missing-thumb.webp`)).toBeUndefined();
  });

  it('when a file is removed, then it is gone, and removing it again is not an error', async () => {
    const key = `threads/${unique()}/photo-thumb.webp`;
    await storage.put(key, Buffer.from('thumb'));
    await storage.remove(key);
    expect(await storage.get(key)).toBeUndefined();
    await expect(storage.remove(key)).resolves.toBeUndefined();
  });

  it('when a file is put twice under one key, then the second copy is what comes back', async () => {
    const key = `milestones/${unique()}/photo-large.webp`;
    await storage.put(key, Buffer.from('first'));
    await storage.put(key, Buffer.from('second, longer'));
    expect((await buffer((await storage.get(key))!.body)).toString()).toBe('second, longer');
  });

  it('when a key is not one the app makes (a way out of the folder, an upper-case name), then it is refused before any I/O', async () => {
    for (const key of ['../etc/passwd.txt', 'jobs/../../x.webp', 'Jobs/x.webp', 'jobs//x.webp', '/jobs/x.webp']) {
      await expect(storage.put(key, Buffer.from('x'))).rejects.toThrow(/storage key/);
      await expect(storage.get(key)).rejects.toThrow(/storage key/);
    }
  });

  it('when saving the photos fails after both sizes are stored, then nothing is left behind', async () => {
    const prefix = `jobs/${unique()}/`;
    const jpeg = await sharp({ create: { width: 320, height: 240, channels: 3, background: '#8a8d90' } }).jpeg().toBuffer();
    const failed = withStoredPhotos(storage, [{ buffer: jpeg }, { buffer: jpeg }], (id, size) => `${prefix}${id}-${size}.webp`, async () => {
      // Both photos' files are in the store when the database refuses them.
      expect(await storedKeys(config, prefix)).toHaveLength(4);
      throw new Error('the insert failed');
    });
    await expect(failed).rejects.toThrow('the insert failed');
    expect(await storedKeys(config, prefix)).toEqual([]);
  });
});

describe('sending a stored photo', () => {
  it('when the store fails after part of the photo went out, then the connection is cut, not a short photo passed off as whole', async () => {
    const app = express();
    app.get('/photo', (_req, res, next) => {
      const body = new Readable({ read() {} });
      body.push(Buffer.alloc(1000, 7));
      setTimeout(() => body.destroy(new Error('the store went away')), 50);
      sendPhoto(res, { body, size: 5000 }).catch(next);
    });
    const server = app.listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    try {
      const answer = await fetch(`http://127.0.0.1:${(server.address() as AddressInfo).port}/photo`);
      expect(answer.status).toBe(200);
      expect(answer.headers.get('content-length')).toBe('5000');
      await expect(answer.arrayBuffer()).rejects.toThrow();
    } finally {
      server.close();
    }
  });
});

describe('receiving photos', () => {
  it('when photos are uploaded, then each is streamed into a temporary file holding its bytes, and the files are gone once the answer has gone', async () => {
    const photo = Buffer.from(Array.from({ length: 70_000 }, (_, i) => (i * 7) % 256));
    let seen: Array<{ path: string; bytes: number }> = [];
    const app = express();
    app.post('/photos', receivePhotos(4), (req, res) => {
      seen = uploadedFiles(req).map((file) => ({ path: file.path, bytes: file.size }));
      // Still there while the handler works on them.
      res.json({ present: seen.every((file) => existsSync(file.path)), inMemory: uploadedFiles(req).some((file) => file.buffer) });
    });
    const server = app.listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    try {
      const form = new FormData();
      for (const name of ['a.jpg', 'b.jpg']) form.append('photos', new Blob([photo]), name);
      const answer = await fetch(`http://127.0.0.1:${(server.address() as AddressInfo).port}/photos`, { method: 'POST', body: form });
      expect(await answer.json()).toEqual({ present: true, inMemory: false });
      expect(seen.map((file) => file.bytes)).toEqual([photo.length, photo.length]);
      await expect.poll(() => seen.filter((file) => existsSync(file.path))).toEqual([]);
    } finally {
      server.close();
    }
  });
});
