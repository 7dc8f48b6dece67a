/**
 * `npm run bench`: the job board, job detail and message posting under load,
 * on a throwaway PostgreSQL cluster seeded with 10,000 open jobs. Prints p50,
 * p95, p99 and requests per second for each, then serves the same board query
 * from a bare node:http + pg handler (no Express, no session, no validation)
 * as a baseline and prints the ratio of the two; asserts nothing.
 */
import autocannon from 'autocannon';
import { sql } from 'drizzle-orm';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { boardQuerySchema } from '../../shared/schemas/jobs';
import { createDb, createPool } from '../../server/db/client';
import { boardRowsQuery } from '../../server/modules/jobs/jobs.repository';
import { hashPassword } from '../../server/lib/auth/passwords';
import { startServer } from '../../server/runtime';
import { benchCluster, benchConfig, migratedBenchDatabase } from './bench-app';

const JOBS = 10_000;
const DURATION_S = Number(process.env.BENCH_SECONDS ?? 10);

const dir = mkdtempSync(join(tmpdir(), 'tenthmark-bench-'));
const cluster = await benchCluster(dir);
let server: Awaited<ReturnType<typeof startServer>> | undefined;
let bare: Server | undefined;
let barePool: pg.Pool | undefined;
try {
  const url = await migratedBenchDatabase(cluster);
  const pool = createPool(url, 2);
  const db = createDb(pool);
  const hash = await hashPassword('bench password 1');
  console.log(`seeding ${JOBS.toLocaleString()} open jobs …`);
  await db.execute(sql`INSERT INTO users (email, display_name, role, password_hash, email_verified_at)
    VALUES ('builder@bench.test', 'Bench Builder', 'builder', ${hash}, now()), ('shop@bench.test', 'Bench Shop', 'shop', ${hash}, now())`);
  await db.execute(sql`INSERT INTO shops (user_id, name, country, region, city, takes_shipped, capabilities, turnaround_days)
    SELECT id, 'Bench Shop', 'United States', 'Ohio', 'Dayton', true, ARRAY['bore','hone','deck'], 10 FROM users WHERE role = 'shop'`);
  await db.execute(sql`
    INSERT INTO jobs (builder_id, status, title, engine_family, cylinders, block_material, operations, logistics, country, region, city, needed_by, spec, published_at, bid_count)
    SELECT (SELECT id FROM users WHERE role = 'builder'), 'open', 'Bench job ' || g, 'Bench V8', (ARRAY[4,6,8])[1 + g % 3],
      CASE WHEN g % 3 = 0 THEN 'aluminium' ELSE 'cast-iron' END,
      CASE g % 4 WHEN 0 THEN ARRAY['bore','hone'] WHEN 1 THEN ARRAY['deck'] WHEN 2 THEN ARRAY['bore','hone','deck'] ELSE ARRAY['line-hone'] END,
      CASE WHEN g % 2 = 0 THEN 'ship' ELSE 'drop-off' END,
      'United States', (ARRAY['Ohio','Oregon','Texas','Maine','Utah'])[1 + g % 5], 'Town ' || (g % 50), current_date + (g % 120),
      jsonb_build_object('title', 'Bench job ' || g, 'unit', 'in', 'stockBore', 4, 'stroke', 3.48), now() - g * interval '1 minute', g % 7
    FROM generate_series(1, ${JOBS}) AS g`);
  await db.execute(sql`ANALYZE`);
  const [{ id: sampleJob }] = (await db.execute<{ id: string }>(sql`SELECT id FROM jobs ORDER BY published_at DESC LIMIT 1 OFFSET 500`)).rows;
  // A conversation between the builder and the shop on that job, for message posting.
  const [{ id: threadId }] = (
    await db.execute<{ id: string }>(sql`INSERT INTO threads (job_id, shop_id) SELECT ${sampleJob}, id FROM shops LIMIT 1 RETURNING id`)
  ).rows;
  // The exact statements the app runs for the newest-first board page, for the bare baseline.
  const boardSql = boardRowsQuery(db, boardQuerySchema.parse({ pageSize: '20' })).toSQL();
  await pool.end();

  const config = benchConfig(url, {
    RATE_LIMIT_SIGNIN_MAX: '1000',
    // The per-person message limit would turn a load test into a test of the limiter.
    RATE_LIMIT_MESSAGES_PER_10S: '1000000',
  });
  server = await startServer(config, { migrate: false });
  const base = `http://127.0.0.1:${server.port}`;

  // Sign in as the shop once and reuse the session cookie.
  const csrfRes = await fetch(`${base}/api/auth/csrf`);
  const firstCookie = csrfRes.headers.get('set-cookie')!.split(';')[0];
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Cookie: firstCookie, 'X-CSRF-Token': csrfToken },
    body: JSON.stringify({ email: 'shop@bench.test', password: 'bench password 1' }),
  });
  if (login.status !== 200) throw new Error(`bench sign-in failed: ${login.status}`);
  const cookie = login.headers.get('set-cookie')!.split(';')[0];
  const { csrfToken: token } = (await login.json()) as { csrfToken: string };
  let sent = 0;

  const cases: Array<{ name: string; path: string; post?: boolean }> = [
    { name: 'board, newest, 20 a page', path: '/api/jobs?pageSize=20' },
    { name: 'board, filtered (bore, cast iron, Ohio) and sorted by needed-by', path: '/api/jobs?operation=bore&material=cast-iron&region=Ohio&sort=needed-soonest' },
    { name: 'board, page 150 of 50-row pages', path: '/api/jobs?pageSize=50&page=150' },
    { name: 'job detail', path: `/api/jobs/${sampleJob}` },
    { name: 'post a message (stored, fanned out, unread counts)', path: `/api/threads/${threadId}/messages`, post: true },
  ];
  console.log(`\n${JOBS.toLocaleString()} open jobs; ${DURATION_S} s per case, 20 connections, one app instance\n`);
  const header = () => console.log('case'.padEnd(70), 'p50 ms'.padStart(8), 'p95 ms'.padStart(8), 'p99 ms'.padStart(8), 'req/s'.padStart(9), 'errors'.padStart(7));
  const row = (name: string, result: autocannon.Result) => {
    const p95 = (result.latency as unknown as Record<string, number>).p95 ?? result.latency.p97_5;
    console.log(
      name.padEnd(70),
      String(result.latency.p50).padStart(8),
      String(p95).padStart(8),
      String(result.latency.p99).padStart(8),
      result.requests.average.toFixed(0).padStart(9),
      String(result.errors + result.non2xx).padStart(7),
    );
  };
  header();
  const results = new Map<string, autocannon.Result>();
  for (const c of cases) {
    const result = await autocannon({
      url: `${base}${c.path}`,
      connections: 20,
      duration: DURATION_S,
      headers: { cookie, ...(c.post ? { 'x-csrf-token': token, 'content-type': 'application/json' } : {}) },
      ...(c.post
        ? {
            method: 'POST' as const,
            // Each message has its own client id, as each browser message does.
            setupClient: (client: autocannon.Client) => {
              const next = () => client.setBody(JSON.stringify({ clientId: `bench-${process.pid}-${(sent += 1)}`, body: 'Bench message: bores measured, record on its way.' }));
              next();
              client.on('response', next);
            },
          }
        : {}),
    });
    results.set(c.name, result);
    row(c.name, result);
  }

  // The baseline: the same two statements for the newest board page, served by node:http and pg alone.
  barePool = new pg.Pool({ connectionString: url, max: 10 });
  const countSql = `SELECT count(*)::int AS total FROM jobs WHERE status = 'open'`;
  bare = createServer(async (_req, res) => {
    try {
      const [rows, count] = await Promise.all([barePool!.query(boardSql.sql, boardSql.params as unknown[]), barePool!.query(countSql)]);
      res.writeHead(200, { 'content-type': 'application/json' });
      res.end(JSON.stringify({ jobs: rows.rows, total: count.rows[0].total }));
    } catch (error) {
      res.writeHead(500);
      res.end(String(error));
    }
  });
  await new Promise<void>((resolve) => bare!.listen(0, '127.0.0.1', resolve));
  const barePort = (bare.address() as { port: number }).port;
  const baseline = await autocannon({ url: `http://127.0.0.1:${barePort}/`, connections: 20, duration: DURATION_S });
  console.log('');
  header();
  row('baseline: newest board page, bare node:http + pg (same SQL)', baseline);
  const app = results.get('board, newest, 20 a page')!;
  console.log(
    `\nthe app serves the newest board page at ${((app.requests.average / baseline.requests.average) * 100).toFixed(0)} % of the bare baseline's requests per second` +
      ` (ratio ${(app.requests.average / baseline.requests.average).toFixed(2)}); p50 ${app.latency.p50} ms against ${baseline.latency.p50} ms` +
      ` (session, CSRF, validation, logging and JSON shaping are the difference).`,
  );
} finally {
  await new Promise((resolve) => (bare ? bare.close(resolve) : resolve(undefined)));
  await barePool?.end();
  await server?.close();
  cluster.stop();
  rmSync(dir, { recursive: true, force: true });
}
