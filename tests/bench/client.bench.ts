/**
 * `npm run bench:client`: how much the browser downloads and how soon it
 * paints. Builds the production client into a temporary folder, reads Vite's
 * manifest and prints, for every page in client/app/router.tsx, the gzipped
 * JavaScript and CSS of its first load (the entry chunk and its static
 * imports, plus the page's lazy chunk and its static imports), each beside the
 * 150 KB budget (issue 19), marked under or OVER. Then serves
 * that build from the app on a throwaway PostgreSQL cluster (demo accounts,
 * a few open jobs) and measures largest-contentful-paint of the landing page
 * and the job board in headless Chromium: a new browser context (cold cache)
 * per load, median of BENCH_LOADS (default 5) loads. Prints figures; asserts nothing.
 * Ctrl-C stops the app, the browser and the cluster and removes the temporary folders.
 *
 *   npm run bench:client                      build, sizes and paint times
 *   npm run bench:client -- --sizes-only      build and sizes only (no database, no browser)
 *   npm run bench:client -- --dir <built>     sizes (and paint times) of a build made elsewhere
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import { eq } from 'drizzle-orm';
import { chromium, type Browser } from 'playwright-core';
import { build } from 'vite';
import { createDb, createPool } from '../../server/db/client';
import { users } from '../../server/db/schema';
import { DEMO_PASSWORD, seedIfEmpty } from '../../server/dev/seed';
import { startServer, type RunningServer } from '../../server/runtime';
import { createJob } from '../factories';
import { lazyPageModules } from '../../shared/page-modules';
import { benchCluster, benchConfig, migratedBenchDatabase } from './bench-app';

const root = fileURLToPath(new URL('../..', import.meta.url));
const AIM_KB = 150;
const LOADS = Number(process.env.BENCH_LOADS ?? 5);
const OPEN_JOBS = 12;
const SHOP_EMAIL = 'bench@lanternhill.test';
const BUILDER_EMAIL = 'juno@builders.test';

const args = process.argv.slice(2);
const sizesOnly = args.includes('--sizes-only');
const givenDir = args.includes('--dir') ? resolve(args[args.indexOf('--dir') + 1] ?? '') : undefined;

// Everything started here is stopped in reverse order, on success, on failure and on Ctrl-C.
const cleanups: Array<() => unknown> = [];
let cleaning: Promise<void> | undefined;
function cleanUp(): Promise<void> {
  cleaning ??= (async () => {
    for (const cleanup of cleanups.splice(0).reverse()) {
      // Each step gets a bounded wait: after Ctrl-C the browser is gone already (the terminal signals it too)
      // and closing it may never settle. The timer also keeps Node from exiting halfway through.
      let timer: NodeJS.Timeout | undefined;
      try {
        await Promise.race([
          Promise.resolve().then(cleanup),
          new Promise((resolve) => {
            timer = setTimeout(resolve, 10_000);
          }),
        ]);
      } catch (error) {
        console.error('[bench:client] cleanup failed:', error);
      } finally {
        clearTimeout(timer);
      }
    }
  })();
  return cleaning;
}
// `on`, not `once`: a Ctrl-C may arrive twice (from the terminal and relayed by npm), and a second, unhandled
// SIGINT would end the process before the cluster is stopped. The npm script runs `node --import tsx` rather
// than the tsx CLI because the CLI SIGKILLs a child that does not acknowledge a relayed signal within 30 ms,
// which a busy machine easily misses, and then the cluster is left running.
let stopping = false;
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    console.error(`\n${signal}: stopping …`);
    void cleanUp().then(() => process.exit(signal === 'SIGINT' ? 130 : 143));
  });
}

// ---------------------------------------------------------------- sizes

interface ManifestChunk {
  file: string;
  src?: string;
  isEntry?: boolean;
  isDynamicEntry?: boolean;
  imports?: string[];
  dynamicImports?: string[];
  css?: string[];
}
type Manifest = Record<string, ManifestChunk>;

interface FirstLoad {
  jsFiles: string[];
  cssFiles: string[];
  jsRaw: number;
  jsGzip: number;
  cssGzip: number;
}

/** Each page's path and the module its `lazy` imports, read from the router's source. */
const routesFromRouter = () => lazyPageModules(readFileSync(join(root, 'client/app/router.tsx'), 'utf8'));

function sizer(dir: string) {
  const manifest = JSON.parse(readFileSync(join(dir, '.vite/manifest.json'), 'utf8')) as Manifest;
  const entryKey = Object.keys(manifest).find((key) => manifest[key].isEntry);
  if (!entryKey) throw new Error('the manifest names no entry chunk');
  const gzipped = new Map<string, { raw: number; gzip: number }>();
  const measure = (file: string) => {
    let size = gzipped.get(file);
    if (!size) {
      const bytes = readFileSync(join(dir, file));
      size = { raw: bytes.length, gzip: gzipSync(bytes).length };
      gzipped.set(file, size);
    }
    return size;
  };
  /** The chunks fetched before `keys` can run: themselves and their static imports, transitively. */
  const closure = (keys: string[]) => {
    const seen = new Set<string>();
    const visit = (key: string) => {
      if (seen.has(key)) return;
      if (!manifest[key]) throw new Error(`the manifest has no chunk ${key}`);
      seen.add(key);
      for (const next of manifest[key].imports ?? []) visit(next);
    };
    keys.forEach(visit);
    return [...seen];
  };
  const firstLoad = (keys: string[]): FirstLoad => {
    const chunks = closure(keys).map((key) => manifest[key]);
    const jsFiles = [...new Set(chunks.map((chunk) => chunk.file))];
    const cssFiles = [...new Set(chunks.flatMap((chunk) => chunk.css ?? []))];
    return {
      jsFiles,
      cssFiles,
      jsRaw: jsFiles.reduce((sum, file) => sum + measure(file).raw, 0),
      jsGzip: jsFiles.reduce((sum, file) => sum + measure(file).gzip, 0),
      cssGzip: cssFiles.reduce((sum, file) => sum + measure(file).gzip, 0),
    };
  };
  const routeKeys = new Set(routesFromRouter().map((route) => route.module));
  /** Chunks the entry loads on demand that are not pages (say, the live connection once signed in). */
  const deferred = (manifest[entryKey].dynamicImports ?? []).filter((key) => !routeKeys.has(key));
  return { manifest, entryKey, firstLoad, deferred, measure };
}

const kb = (bytes: number) => (bytes / 1024).toFixed(1);

/** A chunk's source, or for a chunk of library code with no single source, the package most of it comes from (read from its source map). */
function describe(dir: string, chunk: ManifestChunk): string {
  if (chunk.src) return chunk.src.replace(/^.*node_modules\//, '');
  try {
    const { sources } = JSON.parse(readFileSync(join(dir, `${chunk.file}.map`), 'utf8')) as { sources: string[] };
    const counts = new Map<string, number>();
    for (const source of sources) {
      const pkg = /node_modules\/((?:@[^/]+\/)?[^/]+)/.exec(source)?.[1];
      if (pkg) counts.set(pkg, (counts.get(pkg) ?? 0) + 1);
    }
    const top = [...counts].sort((a, b) => b[1] - a[1])[0];
    if (top) return `${top[0]} (library)`;
    const own = sources.map((source) => /(?:^|\/)((?:client|shared)\/.*)$/.exec(source)?.[1]).find(Boolean);
    if (own) return own;
  } catch {
    // No source map: fall back to the file name.
  }
  return chunk.file;
}

function printSizes(dir: string) {
  const { manifest, entryKey, firstLoad, deferred, measure } = sizer(dir);
  const entry = firstLoad([entryKey]);
  console.log(`\nFirst load per page (gzip level 6 via node:zlib; KB = 1024 bytes)\n`);
  console.log(
    'page'.padEnd(46),
    'chunks'.padStart(6),
    'JS raw'.padStart(9),
    'JS gzip'.padStart(9),
    'CSS gzip'.padStart(9),
    'page-only JS gzip'.padStart(18),
    `  JS gzip against the ${AIM_KB} KB budget`,
  );
  console.log(
    '(entry alone)'.padEnd(46),
    String(entry.jsFiles.length).padStart(6),
    kb(entry.jsRaw).padStart(9),
    kb(entry.jsGzip).padStart(9),
    kb(entry.cssGzip).padStart(9),
    ''.padStart(18),
  );
  const totals = new Map<string, FirstLoad>();
  for (const route of routesFromRouter()) {
    // A page missing from the manifest was bundled into the entry (imported eagerly).
    const own = Boolean(manifest[route.module]);
    const load = own ? firstLoad([entryKey, route.module]) : entry;
    totals.set(route.path, load);
    console.log(
      (own ? route.path : `${route.path} (in the entry)`).padEnd(46),
      String(load.jsFiles.length).padStart(6),
      kb(load.jsRaw).padStart(9),
      kb(load.jsGzip).padStart(9),
      kb(load.cssGzip).padStart(9),
      kb(load.jsGzip - entry.jsGzip).padStart(18),
      `  ${verdict(load.jsGzip)}`,
    );
  }
  if (deferred.length) {
    console.log('\nLoaded by the entry on demand, after the first paint (not counted above):');
    for (const key of deferred) {
      const extra = firstLoad([key]).jsFiles.filter((file) => !entry.jsFiles.includes(file));
      const gzip = extra.reduce((sum, file) => sum + measure(file).gzip, 0);
      console.log(`  ${describe(dir, manifest[key]).padEnd(56)} ${kb(gzip).padStart(7)} KB gzip  (${extra.join(', ')})`);
    }
  }
  const over = [...totals].filter(([, load]) => load.jsGzip > AIM_KB * 1024);
  console.log(`\nBudget: at most ${AIM_KB} KB of gzipped JavaScript for the first load of every page`);
  console.log(
    over.length === 0
      ? `  every page (${totals.size}) within the budget; largest ${kb(Math.max(...[...totals.values()].map((load) => load.jsGzip)))} KB`
      : `  ${over.length} of ${totals.size} pages over: ${over.map(([path, load]) => `${path} ${kb(load.jsGzip)}`).join(', ')}`,
  );
}

/** A page's first-load JS against the budget: "under by 12.3 KB" or "OVER by 4.5 KB". */
function verdict(jsGzip: number): string {
  const margin = AIM_KB * 1024 - jsGzip;
  return margin >= 0 ? `under by ${kb(margin)} KB` : `OVER by ${kb(-margin)} KB`;
}

// ---------------------------------------------------------------- paint times

/** Resolves to the latest largest-contentful-paint candidate once the page has something on screen. */
const readLcp = () =>
  new Promise<{ ms: number; element: string }>((resolve) => {
    setTimeout(() => resolve({ ms: Number.NaN, element: '(no largest-contentful-paint entry)' }), 5_000);
    new PerformanceObserver((list) => {
      const entries = list.getEntries() as Array<PerformanceEntry & { element?: Element | null; size?: number }>;
      const last = entries.at(-1);
      if (!last) return;
      const el = last.element;
      const label = el ? `${el.tagName.toLowerCase()} "${(el.textContent ?? '').trim().slice(0, 40)}"` : '(element gone)';
      resolve({ ms: last.startTime, element: label });
    }).observe({ type: 'largest-contentful-paint', buffered: true });
  });

async function measureLcp(dir: string) {
  const work = mkdtempSync(join(tmpdir(), 'tenthmark-client-bench-'));
  cleanups.push(() => rmSync(work, { recursive: true, force: true }));
  console.log('\nstarting a throwaway PostgreSQL cluster and the app on the production build …');
  const cluster = await benchCluster(work);
  cleanups.push(() => cluster.stop());
  const url = await migratedBenchDatabase(cluster);
  const pool = createPool(url, 2);
  try {
    const db = createDb(pool);
    await seedIfEmpty(db);
    const [builder] = await db.select().from(users).where(eq(users.email, BUILDER_EMAIL));
    for (let n = 1; n <= OPEN_JOBS; n += 1) {
      await createJob(db, builder.id, { input: { title: `Bench board job ${n}`, city: n % 2 ? 'Columbus' : 'Dayton' } });
    }
  } finally {
    await pool.end();
  }

  const config = benchConfig(url, { RATE_LIMIT_SIGNIN_MAX: '1000' });
  const server: RunningServer = await startServer(config, { client: { kind: 'static', dir }, migrate: false });
  cleanups.push(() => server.close());
  const base = `http://127.0.0.1:${server.port}`;

  // Launched as the browser tests launch it (tests/setup/browser.ts), except that Playwright must not handle
  // Ctrl-C itself: its handler ends the process at once, before the cluster is stopped.
  const browser: Browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--disable-gpu'],
    handleSIGINT: false,
    handleSIGTERM: false,
    handleSIGHUP: false,
  });
  cleanups.push(() => browser.close());

  // Sign the shop in once; every measured load starts from a new context with only that cookie (no cached files).
  const signIn = await browser.newContext();
  const csrf = (await (await signIn.request.get(`${base}/api/auth/csrf`)).json()) as { csrfToken: string };
  const login = await signIn.request.post(`${base}/api/auth/login`, {
    data: { email: SHOP_EMAIL, password: DEMO_PASSWORD },
    headers: { 'X-CSRF-Token': csrf.csrfToken },
  });
  if (!login.ok()) throw new Error(`the demo shop could not sign in: ${login.status()} ${await login.text()}`);
  const shopState = await signIn.storageState();
  await signIn.close();

  const cases = [
    { name: 'landing page (/), signed out', path: '/', storageState: undefined, ready: 'h1' },
    { name: 'job board (/board), demo shop', path: '/board', storageState: shopState, ready: 'a:text-is("Bench board job 1"):visible' },
  ];
  console.log(`\nLargest contentful paint, headless Chromium, loopback, cold cache per load, ${LOADS} loads each\n`);
  console.log('page'.padEnd(36), 'median ms'.padStart(10), 'min'.padStart(7), 'max'.padStart(7), ' JS requests', ' LCP element');
  for (const c of cases) {
    const samples: Array<{ ms: number; element: string; scripts: number }> = [];
    for (let i = 0; i < LOADS; i += 1) {
      const context = await browser.newContext({ viewport: { width: 1280, height: 900 }, storageState: c.storageState });
      try {
        const page = await context.newPage();
        let scripts = 0;
        page.on('request', (request) => {
          if (request.resourceType() === 'script') scripts += 1;
        });
        await page.goto(`${base}${c.path}`, { waitUntil: 'load' });
        await page.locator(c.ready).first().waitFor({ timeout: 15_000 });
        // Let the frame that shows the content be painted and reported.
        await page.waitForTimeout(300);
        samples.push({ ...(await page.evaluate(readLcp)), scripts });
      } finally {
        await context.close();
      }
    }
    const sorted = samples.map((s) => s.ms).sort((a, b) => a - b);
    const median = sorted[Math.floor(sorted.length / 2)];
    const typical = samples.find((s) => s.ms === median) ?? samples[0];
    console.log(
      c.name.padEnd(36),
      median.toFixed(0).padStart(10),
      sorted[0].toFixed(0).padStart(7),
      sorted.at(-1)!.toFixed(0).padStart(7),
      String(typical.scripts).padStart(12),
      ` ${typical.element}`,
    );
  }
}

// ---------------------------------------------------------------- run

try {
  let dir = givenDir;
  if (!dir) {
    const outDir = mkdtempSync(join(tmpdir(), 'tenthmark-client-build-'));
    cleanups.push(() => rmSync(outDir, { recursive: true, force: true }));
    console.log(`building the production client into ${outDir} …`);
    await build({
      root,
      configFile: join(root, 'vite.config.ts'),
      logLevel: 'warn',
      build: { outDir, emptyOutDir: true, manifest: true },
    });
    dir = outDir;
  }
  printSizes(dir);
  if (!sizesOnly) await measureLcp(dir);
} catch (error) {
  // After Ctrl-C the half-finished measurement fails against a closed browser: that is no news.
  if (!stopping) throw error;
} finally {
  await cleanUp();
}
