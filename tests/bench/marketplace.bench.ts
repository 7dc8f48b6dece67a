/**
 * `npm run bench`: the job board, job detail and message posting under load,
 * on a throwaway PostgreSQL cluster seeded with 10,000 open jobs. Prints p50,
 * p95, p99 and requests per second for each. The board's newest and filtered
 * pages (and the distance-filtered one) are measured beside a bare node:http + pg handler running the same
 * statements (no Express, no session, no validation), page 150 beside page 1;
 * each ratio is printed with its aim. Cases compared with each other run in
 * alternating turns, so a busy machine weighs on both alike. Asserts nothing.
 * BENCH_SECONDS (per case, default 10) and BENCH_ROUNDS (turns, default 2).
 */
import autocannon from 'autocannon';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { boardQuerySchema } from '../../shared/schemas/jobs';
import { createDb, createPool } from '../../server/db/client';
import { boardCountQuery, boardRowsQuery, type BoardOrigin } from '../../server/modules/jobs/jobs.repository';
import { startServer } from '../../server/runtime';
import { BENCH_JOBS as JOBS, benchCluster, benchConfig, loadOptions, migratedBenchDatabase, seedMarketplace, signInAsShop } from './bench-app';

const DURATION_S = Number(process.env.BENCH_SECONDS ?? 10);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 2);

const dir = mkdtempSync(join(tmpdir(), 'tenthmark-bench-'));
const cluster = await benchCluster(dir);
let server: Awaited<ReturnType<typeof startServer>> | undefined;
let bare: Server | undefined;
let barePool: pg.Pool | undefined;
try {
  const url = await migratedBenchDatabase(cluster);
  const pool = createPool(url, 2);
  const db = createDb(pool);
  console.log(`seeding ${JOBS.toLocaleString()} open jobs …`);
  const { shopPlace, sampleJob, threadId } = await seedMarketplace(db, JOBS);
  // The exact statements the app runs for each board query, for the bare baselines.
  const statements = (raw: Record<string, string>, origin: BoardOrigin | null = null) => {
    const query = boardQuerySchema.parse(raw);
    return { rows: boardRowsQuery(db, query, origin).toSQL(), count: boardCountQuery(db, query, origin).toSQL() };
  };
  const newestSql = statements({ pageSize: '20' });
  const filteredRaw = { operation: 'bore', material: 'cast-iron', region: 'Ohio', sort: 'needed-soonest' };
  const filteredSql = statements(filteredRaw);
  // Within 150 miles of the shop, nearest first: the origin the app builds for the signed-in shop.
  const nearRaw = { within: '150', sort: 'distance' };
  const nearOrigin: BoardOrigin = {
    unit: 'mi',
    postalCode: shopPlace.postalCode,
    at: { latitude: shopPlace.latitude!, longitude: shopPlace.longitude! },
    region: { country: 'United States', region: 'Ohio' },
  };
  const nearSql = statements(nearRaw, nearOrigin);
  await pool.end();

  const config = benchConfig(url, {
    RATE_LIMIT_SIGNIN_MAX: '1000',
    // The per-person message limit would turn a load test into a test of the limiter.
    RATE_LIMIT_MESSAGES_PER_10S: '1000000',
  });
  server = await startServer(config, { migrate: false });
  const base = `http://127.0.0.1:${server.port}`;

  // Sign in as the shop once and reuse the session cookie.
  const { cookie, token } = await signInAsShop(base);

  // Page 150 of 50-row pages reached as a person paging on would: following each page's nextCursor.
  let cursor: string | null = null;
  for (let page = 1; page < 150; page += 1) {
    const answer: Response = await fetch(`${base}/api/jobs?pageSize=50${cursor ? `&cursor=${cursor}` : ''}`, { headers: { cookie } });
    cursor = ((await answer.json()) as { nextCursor: string | null }).nextCursor;
    if (!cursor) throw new Error(`the board ended at page ${page}`);
  }

  // The baselines: the same statements served by node:http and pg alone (no Express, session, validation or logging).
  barePool = new pg.Pool({ connectionString: url, max: 10 });
  const bareHandler = (statements: { rows: { sql: string; params: unknown[] }; count: { sql: string; params: unknown[] } }) =>
    async (res: import('node:http').ServerResponse) => {
      const [rows, count] = await Promise.all([barePool!.query(statements.rows.sql, statements.rows.params), barePool!.query(statements.count.sql, statements.count.params)]);
      res.writeHead(200, { 'content-type': 'application/json' });
      res.end(JSON.stringify({ jobs: rows.rows, total: count.rows[0].total }));
    };
  const bareRoutes: Record<string, ReturnType<typeof bareHandler>> = { '/newest': bareHandler(newestSql), '/filtered': bareHandler(filteredSql), '/near': bareHandler(nearSql) };
  bare = createServer((req, res) => {
    const handle = bareRoutes[req.url ?? ''];
    if (!handle) return void res.writeHead(404).end();
    handle(res).catch((error: unknown) => res.writeHead(500).end(String(error)));
  });
  await new Promise<void>((resolve) => bare!.listen(0, '127.0.0.1', resolve));
  const bareBase = `http://127.0.0.1:${(bare.address() as { port: number }).port}`;

  interface Case {
    name: string;
    url: string;
    post?: boolean;
  }
  interface Measured {
    requests: number;
    seconds: number;
    p50: number[];
    p95: number[];
    p99: number[];
    errors: number;
  }
  const run = (c: Case, connections: number, seconds: number): Promise<autocannon.Result> =>
    autocannon(loadOptions({ url: c.url, connections, seconds, cookie, token, post: c.post }));

  /**
   * Runs the cases of a group in turns (ROUNDS rounds of DURATION_S / ROUNDS seconds each), so
   * that whatever else the machine is doing weighs on each case alike and their ratios hold.
   */
  const measureGroup = async (cases: Case[], connections: number) => {
    const measured = cases.map((): Measured => ({ requests: 0, seconds: 0, p50: [], p95: [], p99: [], errors: 0 }));
    const slice = Math.max(1, Math.round(DURATION_S / ROUNDS));
    for (let round = 0; round < ROUNDS; round += 1) {
      for (const [i, c] of cases.entries()) {
        const result = await run(c, connections, slice);
        const m = measured[i];
        m.requests += result.requests.total;
        m.seconds += result.duration;
        m.p50.push(result.latency.p50);
        m.p95.push((result.latency as unknown as Record<string, number>).p95 ?? result.latency.p97_5);
        m.p99.push(result.latency.p99);
        m.errors += result.errors + result.non2xx;
      }
    }
    return measured.map((m) => ({ ...m, rate: m.requests / m.seconds }));
  };
  type Figures = Awaited<ReturnType<typeof measureGroup>>[number];
  const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;

  const row = (name: string, f: Figures, against?: { name: string; figures: Figures; aim: number }) => {
    console.log(
      name.padEnd(66),
      mean(f.p50).toFixed(0).padStart(7),
      mean(f.p95).toFixed(0).padStart(7),
      mean(f.p99).toFixed(0).padStart(7),
      f.rate.toFixed(0).padStart(8),
      String(f.errors).padStart(7),
      against ? `  ${(f.rate / against.figures.rate).toFixed(2)} of ${against.name} (aim ≥ ${against.aim})` : '',
    );
  };
  const section = (title: string) => {
    console.log(`\n${title}`);
    console.log('case'.padEnd(66), 'p50 ms'.padStart(7), 'p95 ms'.padStart(7), 'p99 ms'.padStart(7), 'req/s'.padStart(8), 'errors'.padStart(7));
  };

  console.log(`\n${JOBS.toLocaleString()} open jobs; ${DURATION_S} s per case in ${ROUNDS} turns, one app instance; latencies are the mean of the turns`);
  const summary: string[] = [];
  const ratio = (what: string, f: Figures, against: Figures, aim: number) => {
    const r = f.rate / against.rate;
    summary.push(`${what.padEnd(52)} ${r.toFixed(3).padStart(6)}  aim ≥ ${aim}  ${r >= aim ? 'met' : 'not met'}`);
  };

  /** The app's answer to `path` beside the bare handler's `barePath`, in turns; its ratio goes in the summary. */
  const againstBare = async (title: string, ratioName: string, path: string, barePath: string, connections: number, aim: number) => {
    section(title);
    const [app, bareFigures] = await measureGroup(
      [
        { name: 'app', url: `${base}${path}` },
        { name: 'bare', url: `${bareBase}${barePath}` },
      ],
      connections,
    );
    row('bare node:http + pg, same statements', bareFigures);
    row('app, signed in as a shop', app, { name: 'bare', figures: bareFigures, aim });
    ratio(ratioName, app, bareFigures, aim);
  };

  // The board is for signed-in people (a signed-out request gets 401), so every case carries the shop's session.
  await againstBare('board, newest 20, 20 connections', 'newest, against bare', '/api/jobs?pageSize=20', '/newest', 20, 0.75);
  await againstBare('board, newest 20, 50 connections', 'newest at 50 connections, against bare', '/api/jobs?pageSize=20', '/newest', 50, 0.75);
  await againstBare(
    'board, filtered (bore, cast iron, Ohio) and sorted by needed-by, 20 connections',
    'filtered, against its bare',
    `/api/jobs?${new URLSearchParams(filteredRaw)}`,
    '/filtered',
    20,
    0.6,
  );
  await againstBare(
    'board, within 150 miles of the shop, nearest first (GiST index), 20 connections',
    'within 150 miles, against its bare',
    `/api/jobs?${new URLSearchParams(nearRaw)}`,
    '/near',
    20,
    0.6,
  );

  section('board, 50-row pages, 20 connections');
  const [page1, page150, page150Cursor] = await measureGroup(
    [
      { name: 'page 1', url: `${base}/api/jobs?pageSize=50` },
      { name: 'page 150 by number', url: `${base}/api/jobs?pageSize=50&page=150` },
      { name: 'page 150 by cursor', url: `${base}/api/jobs?pageSize=50&cursor=${cursor}` },
    ],
    20,
  );
  const firstPage = { name: 'page 1', figures: page1, aim: 0.8 };
  row('page 1', page1);
  row('page 150 by number (?page=150)', page150, firstPage);
  row('page 150 by cursor (nextCursor of page 149)', page150Cursor, firstPage);
  ratio('page 150 by cursor, against page 1', page150Cursor, page1, 0.8);
  ratio('page 150 by number, against page 1', page150, page1, 0.8);

  section('other requests, 20 connections');
  const [detail, message] = await measureGroup(
    [
      { name: 'job detail', url: `${base}/api/jobs/${sampleJob}` },
      { name: 'message', url: `${base}/api/threads/${threadId}/messages`, post: true },
    ],
    20,
  );
  row('job detail', detail);
  row('post a message (stored, fanned out, unread counts)', message);

  console.log(`\nratios in this run (requests per second; the aims of issue 19)\n${summary.join('\n')}`);
} finally {
  await new Promise((resolve) => (bare ? bare.close(resolve) : resolve(undefined)));
  await barePool?.end();
  await server?.close();
  cluster.stop();
  rmSync(dir, { recursive: true, force: true });
}
