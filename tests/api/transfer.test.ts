import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import express from 'express';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp, type App } from '../../server/app';
import { createDb, createPool } from '../../server/db/client';
import { createLogger } from '../../server/lib/logger';
import { compressAnswers } from '../../server/lib/http/transfer';
import { setupTestApp, type TestContext } from '../setup/test-env';

/**
 * How the built app travels (issue 19): answers compressed, hashed files cached for a year,
 * the HTML checked every time, 404 for an address without a page, a real robots.txt.
 * Needs the production build (`npx vite build --logLevel warn`), as the browser tests do.
 */
const clientDir = process.env.TENTHMARK_CLIENT_DIR ?? fileURLToPath(new URL('../../dist/client', import.meta.url));

let ctx: TestContext;
let app: App;
let pool: ReturnType<typeof createPool>;
let entryScript: string;

beforeAll(async () => {
  ctx = await setupTestApp();
  pool = createPool(ctx.config.databaseUrl, 2);
  app = createApp({ config: ctx.config, db: createDb(pool), pool, logger: createLogger(ctx.config), client: { kind: 'static', dir: clientDir } });
  const script = /<script[^>]+src="(\/assets\/[^"]+\.js)"/.exec(readFileSync(`${clientDir}/index.html`, 'utf8'));
  if (!script) throw new Error('the built index.html names no /assets/ script');
  entryScript = script[1];
});
afterAll(async () => {
  app?.sessionStore.close();
  await pool?.end();
  await ctx?.close();
});

const get = (path: string, encodings?: string) => {
  const request = supertest(app).get(path);
  return encodings === undefined ? request : request.set('Accept-Encoding', encodings);
};

describe('compression', () => {
  it('when the client accepts gzip, then the HTML, a script and an API answer come gzipped', async () => {
    for (const path of ['/', entryScript, '/api/openapi.json']) {
      const res = await get(path, 'gzip');
      expect(res.status, path).toBe(200);
      expect(res.headers['content-encoding'], path).toBe('gzip');
      expect(res.headers.vary, path).toMatch(/Accept-Encoding/i);
    }
  });

  it('when the client accepts brotli as well, then brotli is chosen', async () => {
    const res = await get(entryScript, 'gzip, deflate, br').buffer(true).parse((stream, done) => {
      stream.on('data', () => {});
      stream.on('end', () => done(null, null));
    });
    expect(res.headers['content-encoding']).toBe('br');
  });

  it('when the client accepts no encoding, then the answer is sent as it is', async () => {
    const res = await get(entryScript, 'identity');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBeUndefined();
  });

  it('when an answer is a live stream or already compressed (a photo, a PDF), then it is sent as it is', async () => {
    const plain = express();
    plain.use(compressAnswers());
    const body = 'x'.repeat(4096);
    for (const type of ['text/event-stream', 'image/webp', 'image/jpeg', 'application/pdf', 'text/csv']) {
      plain.get(`/${type}`, (_req, res) => res.type(type).send(body));
    }
    for (const type of ['text/event-stream', 'image/webp', 'image/jpeg', 'application/pdf']) {
      const res = await supertest(plain).get(`/${type}`).set('Accept-Encoding', 'gzip, br');
      expect(res.headers['content-encoding'], type).toBeUndefined();
    }
    // The same body as plain text is compressed: the filter is what refused the others.
    const csv = await supertest(plain).get('/text/csv').set('Accept-Encoding', 'gzip');
    expect(csv.headers['content-encoding']).toBe('gzip');
  });
});

describe('caching', () => {
  it('when a hashed file under /assets/ is fetched, then it may be kept a year without asking again', async () => {
    const res = await get(entryScript);
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
  });

  it('when the HTML or a file without a hash is fetched, then it is checked with the server on every use', async () => {
    for (const path of ['/', '/board', '/robots.txt', '/favicon.svg', '/no-such-page']) {
      const res = await get(path);
      expect(res.headers['cache-control'], path).toBe('no-cache');
    }
  });
});

describe('addresses without a page', () => {
  it('when an address is one of the app’s pages, then its HTML comes with 200', async () => {
    for (const path of ['/', '/board', `/jobs/${randomUUID()}`, `/jobs/${randomUUID()}/edit`, '/shops/some-shop', '/signin?returnTo=%2Fboard']) {
      const res = await get(path);
      expect(res.status, path).toBe(200);
      expect(res.headers['content-type'], path).toMatch(/^text\/html/);
      expect(res.text, path).toContain('<div id="root">');
    }
  });

  it('when an address has no page, then the app’s HTML comes with 404 (it shows its not-found page)', async () => {
    for (const path of ['/no-such-page', '/board/extra', '/admin', '/wp-login.php', `/jobs/${randomUUID()}/nothing`]) {
      const res = await get(path);
      expect(res.status, path).toBe(404);
      expect(res.headers['content-type'], path).toMatch(/^text\/html/);
      expect(res.text, path).toContain('<div id="root">');
    }
  });

  it('when the app runs on the dev server, then an address without a page gets 404 there too', async () => {
    const devPool = createPool(ctx.config.databaseUrl, 1);
    const dev = createApp({
      config: ctx.config,
      db: createDb(devPool),
      pool: devPool,
      logger: createLogger(ctx.config),
      // Stands in for Vite's middleware, which passes on every address that is not one of its files.
      client: { kind: 'middleware', handler: (_req, _res, next) => next(), indexHtml: async () => '<!doctype html><div id="root"></div>' },
    });
    try {
      expect((await supertest(dev).get('/board')).status).toBe(200);
      const missing = await supertest(dev).get('/no-such-page');
      expect(missing.status).toBe(404);
      expect(missing.text).toContain('<div id="root">');
    } finally {
      dev.sessionStore.close();
      await devPool.end();
    }
  });

  it('when an /api/ address has no route, then 404 is JSON as before, and a missing hashed file is 404 too', async () => {
    const api = await get('/api/no-such-route');
    expect(api.status).toBe(404);
    expect(api.headers['content-type']).toMatch(/^application\/json/);
    expect((await get('/assets/no-such-file-0000.js')).status).toBe(404);
  });
});

describe('robots.txt', () => {
  it('when a crawler asks for /robots.txt, then plain text keeps it out of the API and the signed-in pages', async () => {
    const res = await get('/robots.txt');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
    expect(res.text).toMatch(/^User-agent: \*$/m);
    for (const rule of ['/api/', '/admin', '/settings', '/dashboard', '/board']) expect(res.text).toMatch(new RegExp(`^Disallow: ${rule}$`, 'm'));
  });
});

describe('a page names its own code', () => {
  const modulePreloads = (html: string) => [...html.matchAll(/<link rel="modulepreload" crossorigin href="([^"]+)">/g)].map((m) => m[1]);
  // The entry's own (index.html as built names what the entry needs).
  const entryPreloads = modulePreloads(readFileSync(`${clientDir}/index.html`, 'utf8'));
  const preloads = (html: string) => modulePreloads(html).filter((file) => !entryPreloads.includes(file));
  const chunksOf = JSON.parse(readFileSync(`${clientDir}/.vite/page-chunks.json`, 'utf8')) as Record<string, string[]>;

  it('when a page is asked for, then its HTML preloads exactly the chunks the build lists for that page, each of which is served; a fixed path beats a parameter', async () => {
    for (const [path, pattern] of [
      ['/board', '/board'],
      [`/jobs/${randomUUID()}`, '/jobs/:jobId'],
      ['/jobs/new', '/jobs/new'],
      ['/calculator', '/calculator'],
    ]) {
      const res = await get(path);
      expect(res.status, path).toBe(200);
      expect(chunksOf[pattern]?.length, pattern).toBeGreaterThan(0);
      expect(preloads(res.text), path).toEqual(chunksOf[pattern]);
      expect(res.text.indexOf('modulepreload'), path).toBeLessThan(res.text.indexOf('</head>'));
    }
    // The build's list names the page's own route chunk and nothing the entry loads anyway.
    expect(chunksOf['/jobs/new'][0]).toMatch(/^\/assets\/job-new-/);
    expect(chunksOf['/jobs/:jobId'][0]).toMatch(/^\/assets\/job-detail-/);
    expect(Object.values(chunksOf).flat()).not.toContain(entryScript);
    for (const file of new Set(Object.values(chunksOf).flat())) {
      const res = await get(file);
      expect(res.status, file).toBe(200);
      expect(res.headers['content-type'], file).toMatch(/javascript/);
    }
  });

  it('when an address has no page, then its 404 HTML preloads nothing', async () => {
    const res = await get('/no-such-page/here');
    expect(res.status).toBe(404);
    expect(preloads(res.text)).toEqual([]);
  });
});
