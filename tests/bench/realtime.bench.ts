/**
 * `npm run bench:realtime`: several hundred socket.io clients spread over two
 * app instances that share one PostgreSQL (the adapter carries messages
 * between them). Each instance runs in a process of its own, as deployed
 * (BENCH_INSTANCES=in-process runs both in the bench's own process, beside the
 * clients, as the first version of this bench did). Prints message delivery latency p50 / p99 beside the aims of
 * issue 19, the sender's acknowledgement (stored and published), the number of
 * connections held, and as a floor a bare NOTIFY → LISTEN round trip between two
 * plain connections to the same PostgreSQL, in bursts of the same size, measured
 * in the same run. Then one conversation's messages one at a time, for one
 * message's path with nothing queued beside it. Asserts nothing.
 */
import { sql } from 'drizzle-orm';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { io as connect, type Socket } from 'socket.io-client';
import { createDb, createPool } from '../../server/db/client';
import { forkInstance } from '../../server/dev/cluster';
import { hashPassword } from '../../server/lib/auth/passwords';
import { startServer } from '../../server/runtime';
import { signedIn } from '../setup/api-session';
import { benchCluster, benchConfig, benchEnv, migratedBenchDatabase } from './bench-app';

const THREADS = Number(process.env.BENCH_THREADS ?? 20);
const LISTENERS_PER_THREAD = Number(process.env.BENCH_LISTENERS ?? 15);
const MESSAGES_PER_THREAD = Number(process.env.BENCH_MESSAGES ?? 10);
/** Messages sent one at a time after the bursts (BENCH_SINGLE). */
const SINGLE_MESSAGES = Number(process.env.BENCH_SINGLE ?? 40);
const PASSWORD = 'bench password 1';
const IN_PROCESS = process.env.BENCH_INSTANCES === 'in-process';

/** An app instance as the bench uses it: where it listens, how many clients it holds, how to stop it. */
interface Instance {
  url: string;
  clients(): Promise<number>;
  close(): Promise<void>;
}

async function startInstance(env: Record<string, string>): Promise<Instance> {
  if (IN_PROCESS) {
    const running = await startServer(benchConfig(env.DATABASE_URL, env), { migrate: false });
    return { url: running.url, clients: async () => running.io.engine.clientsCount, close: () => running.close() };
  }
  return forkInstance(`bench-${randomBytes(3).toString('hex')}`, env);
}

const dir = mkdtempSync(join(tmpdir(), 'tenthmark-rt-bench-'));
const cluster = await benchCluster(dir);
const servers: Instance[] = [];
const sockets: Socket[] = [];
try {
  const url = await migratedBenchDatabase(cluster);
  const pool = createPool(url, 2);
  const db = createDb(pool);
  const hash = await hashPassword(PASSWORD);
  await db.execute(sql`
    INSERT INTO users (email, display_name, role, password_hash, email_verified_at)
    SELECT 'builder' || g || '@bench.test', 'Bench Builder ' || g, 'builder'::user_role, ${hash}, now() FROM generate_series(1, ${THREADS}) g
    UNION ALL
    SELECT 'shop' || g || '@bench.test', 'Bench Shop ' || g, 'shop'::user_role, ${hash}, now() FROM generate_series(1, ${THREADS}) g`);
  await db.execute(sql`
    INSERT INTO shops (user_id, name, country, region, city, takes_shipped, capabilities, turnaround_days)
    SELECT id, display_name, 'United States', 'Ohio', 'Dayton', true, ARRAY['bore'], 10 FROM users WHERE role = 'shop'`);
  await db.execute(sql`
    INSERT INTO jobs (builder_id, status, title, engine_family, cylinders, block_material, operations, logistics, country, region, city, needed_by, spec, published_at)
    SELECT id, 'open', 'Bench job ' || split_part(email, '@', 1), 'Bench V8', 8, 'cast-iron', ARRAY['bore'], 'ship', 'United States', 'Ohio', 'Dayton', current_date + 30, '{}'::jsonb, now()
    FROM users WHERE role = 'builder'`);
  const pairs = (
    await db.execute<{ thread_id: string; builder_email: string; shop_email: string }>(sql`
      WITH b AS (SELECT id, email, row_number() OVER (ORDER BY email) n FROM users WHERE role = 'builder'),
           s AS (SELECT sh.id AS shop_id, u.email, row_number() OVER (ORDER BY u.email) n FROM shops sh JOIN users u ON u.id = sh.user_id),
           t AS (INSERT INTO threads (job_id, shop_id)
                 SELECT j.id, s.shop_id FROM b JOIN jobs j ON j.builder_id = b.id JOIN s ON s.n = b.n RETURNING id, job_id, shop_id)
      SELECT t.id AS thread_id, b.email AS builder_email, s.email AS shop_email
      FROM t JOIN jobs j ON j.id = t.job_id JOIN b ON b.id = j.builder_id JOIN s ON s.shop_id = t.shop_id`)
  ).rows;
  await pool.end();

  const env = benchEnv(url, { RATE_LIMIT_SIGNIN_MAX: '100000', RATE_LIMIT_MESSAGES_PER_10S: '100000' });
  servers.push(...(await Promise.all([startInstance(env), startInstance(env)])));

  const cookies = new Map<string, string>();
  async function cookieFor(email: string): Promise<string> {
    const known = cookies.get(email);
    if (known) return known;
    const cookie = (await signedIn(servers[0].url, { email, password: PASSWORD })).cookie!;
    cookies.set(email, cookie);
    return cookie;
  }

  const open = async (server: Instance, cookie: string) => {
    const socket = connect(server.url, { transports: ['websocket'], extraHeaders: { cookie }, reconnection: false, forceNew: true });
    sockets.push(socket);
    await new Promise<void>((resolve, reject) => {
      socket.once('connect', () => resolve());
      socket.once('connect_error', reject);
    });
    return socket;
  };

  console.log(`connecting ${THREADS * (LISTENERS_PER_THREAD + 1)} clients over two instances …`);
  const latencies: number[] = [];
  const acks: number[] = [];
  let expected = 0;
  const senders: Array<{ socket: Socket; threadId: string }> = [];
  for (const pair of pairs) {
    const builderCookie = await cookieFor(pair.builder_email);
    const shopCookie = await cookieFor(pair.shop_email);
    for (let l = 0; l < LISTENERS_PER_THREAD; l += 1) {
      // Listeners alternate between the instances; the sender sits on instance A.
      const listener = await open(servers[l % 2], builderCookie);
      const joined = (await listener.timeout(10_000).emitWithAck('thread:join', { threadId: pair.thread_id })) as { ok: boolean };
      if (!joined.ok) throw new Error('a listener could not join its thread');
      listener.on('message:new', (message: { body: string }) => {
        const sentAt = Number(message.body.split(' ')[1]);
        latencies.push(performance.now() - sentAt);
      });
    }
    senders.push({ socket: await open(servers[0], shopCookie), threadId: pair.thread_id });
  }
  const clientsHeld = await Promise.all(servers.map((s) => s.clients()));
  const held = clientsHeld[0] + clientsHeld[1];

  const started = performance.now();
  for (let m = 0; m < MESSAGES_PER_THREAD; m += 1) {
    await Promise.all(
      senders.map(async ({ socket, threadId }) => {
        const sentAt = performance.now();
        const answer = (await socket.timeout(10_000).emitWithAck('message:send', {
          threadId,
          clientId: randomBytes(8).toString('hex'),
          body: `sent ${sentAt}`,
        })) as { ok: boolean };
        acks.push(performance.now() - sentAt);
        if (answer.ok) expected += LISTENERS_PER_THREAD;
      }),
    );
  }
  const deadline = Date.now() + 15_000;
  while (latencies.length < expected && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
  const elapsed = (performance.now() - started) / 1000;

  // Then one conversation at a time: the first sender's messages one after another, each waiting for its
  // deliveries, so the figure is one message's path with nothing queued beside it.
  const burst = latencies.splice(0);
  const single: number[] = [];
  for (let m = 0; m < SINGLE_MESSAGES; m += 1) {
    const { socket, threadId } = senders[0];
    const before = latencies.length;
    const sentAt = performance.now();
    await socket.timeout(10_000).emitWithAck('message:send', { threadId, clientId: randomBytes(8).toString('hex'), body: `sent ${sentAt}` });
    const waitUntil = Date.now() + 5_000;
    while (latencies.length < before + LISTENERS_PER_THREAD && Date.now() < waitUntil) await new Promise((r) => setImmediate(r));
  }
  single.push(...latencies.splice(0));
  latencies.push(...burst);

  // The floor: a bare NOTIFY from one plain connection reaching another that LISTENs, in bursts as large as the senders'.
  const listener = new pg.Client({ connectionString: url });
  const notifier = new pg.Pool({ connectionString: url, max: 10 });
  await listener.connect();
  const bare: number[] = [];
  listener.on('notification', (n) => bare.push(performance.now() - Number(n.payload)));
  await listener.query('LISTEN bench_floor');
  for (let m = 0; m < MESSAGES_PER_THREAD; m += 1) {
    await Promise.all(senders.map(() => notifier.query('SELECT pg_notify($1, $2)', ['bench_floor', String(performance.now())])));
  }
  const floorDeadline = Date.now() + 5_000;
  while (bare.length < senders.length * MESSAGES_PER_THREAD && Date.now() < floorDeadline) await new Promise((r) => setTimeout(r, 20));
  await listener.end();
  await notifier.end();

  const pick = (values: number[], q: number) => {
    const sorted = [...values].sort((a, b) => a - b);
    return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] ?? NaN;
  };
  const ms = (value: number) => `${value.toFixed(1).padStart(7)} ms`;
  const aim = (value: number, limit: number) => `aim ≤ ${limit} ms, ${value <= limit ? 'met' : 'not met'}`;
  const p50 = pick(latencies, 0.5);
  const p99 = pick(latencies, 0.99);
  console.log(`
instances               two, ${IN_PROCESS ? 'both in the bench\'s own process, beside the clients' : 'each in a process of its own'}
connections held        ${held} (instance A ${clientsHeld[0]}, instance B ${clientsHeld[1]})
messages sent           ${THREADS * MESSAGES_PER_THREAD} (${THREADS} conversations × ${MESSAGES_PER_THREAD}, ${THREADS} at a time)
deliveries              ${latencies.length} of ${expected} expected, in ${elapsed.toFixed(1)} s

                        p50          p99          max
delivery in bursts (${THREADS} conversations sending at once; send → other sockets, both instances)
                     ${ms(p50)}   ${ms(p99)}   ${ms(Math.max(...latencies))}
  against the aims      p50 ${aim(p50, 15)}; p99 ${aim(p99, 40)}
one conversation at a time (${single.length} deliveries: ${SINGLE_MESSAGES} messages, each to ${LISTENERS_PER_THREAD} sockets, nothing else sent)
                     ${ms(pick(single, 0.5))}   ${ms(pick(single, 0.99))}   ${ms(Math.max(...single))}
  against the aims      p50 ${aim(pick(single, 0.5), 15)}; p99 ${aim(pick(single, 0.99), 40)}
sender's answer in the bursts (stored, committed, published)
                     ${ms(pick(acks, 0.5))}   ${ms(pick(acks, 0.99))}   ${ms(Math.max(...acks))}
floor: bare NOTIFY → LISTEN, same bursts (${bare.length} notifications)
                     ${ms(pick(bare, 0.5))}   ${ms(pick(bare, 0.99))}   ${ms(Math.max(...bare))}
  delivery p50 is ${(p50 / pick(bare, 0.5)).toFixed(1)} × the floor's p50`);
} finally {
  for (const socket of sockets) socket.disconnect();
  for (const server of servers) await server.close();
  cluster.stop();
  rmSync(dir, { recursive: true, force: true });
}
