/**
 * `npm run bench:lighthouse`: Lighthouse's performance audit of four pages,
 * with its phone preset (its default: a mid-range phone on a slow 4G line,
 * simulated) and its desktop preset. Builds the production client into a
 * temporary folder, serves it from the app on a throwaway PostgreSQL cluster
 * with the demo accounts and the demo scenario (server/dev/demo-scenario.ts,
 * built through the app and the payment stand-in as `npm start` builds it),
 * and prints for `/`, `/calculator`, `/board` (the demo shop) and a demo job
 * page (its builder, the open job with three bids) the performance score,
 * largest contentful paint, total blocking time and cumulative layout shift,
 * each beside the aims of issue 19 (score ≥ 90, CLS ≤ 0.05). Prints figures;
 * asserts nothing. Scores move with the machine's load: on a shared machine
 * they are indicative.
 *
 *   npm run bench:lighthouse                    build, then both presets
 *   npm run bench:lighthouse -- --dir <built>   a build made elsewhere (with its .vite/manifest.json or not)
 *   npm run bench:lighthouse -- --only phone    one preset (phone or desktop)
 *   npm run bench:lighthouse -- --page /board   the pages whose path starts so (/, /calculator, /board, /jobs/)
 *   npm run bench:lighthouse -- --reports <dir> also writes each page's full Lighthouse report there (JSON)
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { eq } from 'drizzle-orm';
import lighthouse, { desktopConfig, type Config, type Flags } from 'lighthouse';
import { chromium, type Browser } from 'playwright-core';
import { build } from 'vite';
import { createDb, createPool } from '../../server/db/client';
import { jobs } from '../../server/db/schema';
import { buildDemoScenario } from '../../server/dev/demo-scenario';
import { HttpSession } from '../../server/dev/http-session';
import { DEMO_PASSWORD, seedIfEmpty } from '../../server/dev/seed';
import { startServer, type RunningServer } from '../../server/runtime';
import { sendWebhooksTo, startTestStandIn, TEST_WEBHOOK_SECRET } from '../setup/payments';
import { freePort } from '../setup/ports';
import { benchCluster, benchConfig, migratedBenchDatabase } from './bench-app';

const root = fileURLToPath(new URL('../..', import.meta.url));
/** The aims of issue 19: Lighthouse performance on a phone at least 90; layout shift at most 0.05. */
const AIM_SCORE = 90;
const AIM_CLS = 0.05;
const SHOP_EMAIL = 'bench@lanternhill.test';
const BUILDER_EMAIL = 'juno@builders.test';
/** The demo's open job with three bids and photos (server/dev/demo-scenario.ts). */
const DEMO_JOB_TITLE = 'Iron small-block V8: bore .030 over, torque-plate hone, deck';

const args = process.argv.slice(2);
const argAfter = (name: string) => (args.includes(name) ? args[args.indexOf(name) + 1] : undefined);
const givenDir = argAfter('--dir') ? resolve(argAfter('--dir')!) : undefined;
const reportsDir = argAfter('--reports') ? resolve(argAfter('--reports')!) : undefined;
const presets: Array<{ name: 'phone' | 'desktop'; config?: Config }> = [
  { name: 'phone' as const, config: undefined },
  { name: 'desktop' as const, config: desktopConfig },
].filter((preset) => !argAfter('--only') || preset.name === argAfter('--only'));

// Everything started here is stopped in reverse order, on success, on failure and on Ctrl-C.
const cleanups: Array<() => unknown> = [];
async function cleanUp() {
  for (const cleanup of cleanups.splice(0).reverse()) {
    try {
      await cleanup();
    } catch (error) {
      console.error('[bench:lighthouse] cleanup failed:', error);
    }
  }
}
for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, () => {
    console.error(`\n${signal}: stopping …`);
    void cleanUp().then(() => process.exit(signal === 'SIGINT' ? 130 : 143));
  });
}

/** The session cookie (`name=value`) of a demo account signed in through the app's API. */
async function sessionCookie(base: string, email: string) {
  const session = await HttpSession.signIn(base, email, DEMO_PASSWORD);
  const cookie = session.cookieHeader();
  if (!cookie) throw new Error(`no session cookie for ${email}`);
  return cookie;
}

const fmt = {
  score: (score: number | null | undefined) => (score == null ? '–' : String(Math.round(score * 100))),
  ms: (ms: number | undefined) => (ms == null ? '–' : `${Math.round(ms)} ms`),
  cls: (cls: number | undefined) => (cls == null ? '–' : cls.toFixed(3)),
};

async function main() {
  let dir = givenDir;
  if (!dir) {
    const outDir = mkdtempSync(join(tmpdir(), 'tenthmark-lighthouse-build-'));
    cleanups.push(() => rmSync(outDir, { recursive: true, force: true }));
    console.log(`building the production client into ${outDir} …`);
    await build({ root, configFile: join(root, 'vite.config.ts'), logLevel: 'warn', build: { outDir, emptyOutDir: true } });
    dir = outDir;
  }

  console.log('starting a throwaway PostgreSQL cluster, the payment stand-in and the app on the production build …');
  const work = mkdtempSync(join(tmpdir(), 'tenthmark-lighthouse-'));
  cleanups.push(() => rmSync(work, { recursive: true, force: true }));
  const cluster = await benchCluster(work);
  cleanups.push(() => cluster.stop());
  const url = await migratedBenchDatabase(cluster);
  const pool = createPool(url, 2);
  cleanups.push(() => pool.end());
  const db = createDb(pool);
  await seedIfEmpty(db);

  const pay = await startTestStandIn();
  cleanups.push(() => pay.standIn.close());
  const port = await freePort();
  const config = benchConfig(url, {
    PORT: String(port),
    APP_URL: `http://127.0.0.1:${port}`,
    STRIPE_API_URL: pay.standIn.url,
    STRIPE_WEBHOOK_SECRET: TEST_WEBHOOK_SECRET,
    RATE_LIMIT_SIGNIN_MAX: '1000',
    UPLOADS_DIR: join(work, 'uploads'),
  });
  const server: RunningServer = await startServer(config, { client: { kind: 'static', dir }, migrate: false });
  cleanups.push(() => server.close());
  await sendWebhooksTo(pay.standIn, server.url);
  console.log('building the demo scenario through the app …');
  const made = await buildDemoScenario({ appUrl: server.url, db });
  const [demoJob] = await db.select({ id: jobs.id }).from(jobs).where(eq(jobs.title, DEMO_JOB_TITLE));
  if (!demoJob) throw new Error(`the demo scenario (${made} jobs) has no job "${DEMO_JOB_TITLE}"`);

  const pages = [
    { name: '/ (signed out)', path: '/', cookie: undefined },
    { name: '/calculator (signed out)', path: '/calculator', cookie: undefined },
    { name: '/board (demo shop)', path: '/board', cookie: await sessionCookie(server.url, SHOP_EMAIL) },
    { name: 'demo job page (its builder)', path: `/jobs/${demoJob.id}`, cookie: await sessionCookie(server.url, BUILDER_EMAIL) },
  ];

  // Debian's Chromium, as the browser tests launch it, with a debugging port for Lighthouse. Playwright must
  // not handle Ctrl-C itself: its handler ends the process at once, before the cluster is stopped.
  const debuggingPort = await freePort();
  const browser: Browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--disable-gpu', `--remote-debugging-port=${debuggingPort}`],
    handleSIGINT: false,
    handleSIGTERM: false,
    handleSIGHUP: false,
  });
  cleanups.push(() => browser.close());

  const chosen = pages.filter((page) => !argAfter('--page') || (argAfter('--page') === '/' ? page.path === '/' : page.path.startsWith(argAfter('--page')!)));
  const rows: string[][] = [];
  const shiftNotes: string[] = [];
  for (const preset of presets) {
    for (const page of chosen) {
      const flags: Flags = {
        port: debuggingPort,
        output: 'json',
        logLevel: 'error',
        onlyCategories: ['performance'],
        // The session travels as a header on every request, so Lighthouse's storage reset cannot sign the page out.
        ...(page.cookie ? { extraHeaders: { Cookie: page.cookie } } : {}),
      };
      // Lighthouse now and then fails to record the trace (NO_NAVSTART on a loaded machine): one more try.
      let lhr;
      for (let attempt = 1; attempt <= 2; attempt += 1) {
        const result = await lighthouse(`${server.url}${page.path}`, flags, preset.config);
        if (!result) throw new Error(`Lighthouse gave no result for ${page.path}`);
        lhr = result.lhr;
        if (!lhr.runtimeError) break;
        console.error(`  ${page.name} (${preset.name}), try ${attempt}: ${lhr.runtimeError.code} ${lhr.runtimeError.message}`);
      }
      if (!lhr) throw new Error(`Lighthouse gave no result for ${page.path}`);
      if (reportsDir) {
        mkdirSync(reportsDir, { recursive: true });
        writeFileSync(join(reportsDir, `${preset.name}-${page.name.replace(/[^a-z0-9]+/gi, '-').replace(/^-|-$/g, '') || 'home'}.json`), JSON.stringify(lhr));
      }
      const audit = (id: string) => lhr.audits[id]?.numericValue;
      const score = lhr.categories.performance?.score;
      const cls = audit('cumulative-layout-shift');
      rows.push([
        preset.name,
        page.name,
        fmt.score(score),
        score == null ? '' : score * 100 >= AIM_SCORE ? 'yes' : 'no',
        fmt.ms(audit('largest-contentful-paint')),
        fmt.ms(audit('total-blocking-time')),
        fmt.cls(cls),
        cls == null ? '' : cls <= AIM_CLS ? 'yes' : 'no',
      ]);
      console.log(`  measured ${page.name} (${preset.name})`);
      if (cls != null && cls > AIM_CLS) shiftNotes.push(`${page.name} (${preset.name}): ${movedElements(lhr.audits['layout-shifts'])}`);
    }
  }

  const head = ['preset', 'page', 'score', `≥ ${AIM_SCORE}?`, 'LCP', 'TBT', 'CLS', `≤ ${AIM_CLS}?`];
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => (i < 2 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  const { version } = JSON.parse(readFileSync(join(root, 'node_modules/lighthouse/package.json'), 'utf8')) as { version: string };
  console.log(`\nLighthouse ${version}, performance only, Debian's Chromium, loopback`);
  console.log(`aims (issue 19): performance score ≥ ${AIM_SCORE} on a phone, cumulative layout shift ≤ ${AIM_CLS}\n`);
  console.log(line(head));
  for (const row of rows) console.log(line(row));
  if (shiftNotes.length) console.log(`\nwhat moved where CLS is over the aim (Lighthouse's layout-shifts audit):\n${shiftNotes.map((n) => `  ${n}`).join('\n')}`);
}

/** The elements of Lighthouse's layout-shifts audit with their share of the shift, largest first. */
function movedElements(audit: { details?: unknown; errorMessage?: string; scoreDisplayMode?: string } | undefined) {
  const items = (audit?.details as { items?: Array<{ node?: { snippet?: string; nodeLabel?: string }; score?: number }> } | undefined)?.items ?? [];
  if (items.length === 0) return `(no elements named: ${audit?.errorMessage ?? audit?.scoreDisplayMode ?? 'no layout-shifts audit'})`;
  return items
    .slice(0, 5)
    .map((item) => `${(item.score ?? 0).toFixed(3)} ${item.node?.nodeLabel?.slice(0, 50) ?? ''} ${item.node?.snippet?.slice(0, 80) ?? ''}`.trim())
    .join('; ');
}

try {
  await main();
} finally {
  await cleanUp();
}
