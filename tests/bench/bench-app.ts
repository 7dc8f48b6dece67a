/**
 * What the benches share to start the app: a throwaway PostgreSQL cluster, a
 * migrated `bench` database in it, and the app's configuration for a run
 * (production mode, no logging, the limits a bench must raise).
 */
import type autocannon from 'autocannon';
import { sql } from 'drizzle-orm';
import { runMigrations, type Database } from '../../server/db/client';
import { hashPassword } from '../../server/lib/auth/passwords';
import { placeOf } from '../../server/lib/postal-codes';
import { ensureCluster, ensureDatabase, type Cluster } from '../../server/dev/postgres';
import { loadConfig } from '../../server/env';
import { freePort } from '../setup/ports';

/** A throwaway cluster with its data in `dir`, on a free port; the caller stops it. */
export const benchCluster = async (dir: string): Promise<Cluster> => ensureCluster({ dir, port: await freePort(), throwaway: true });

/** Creates the `bench` database in `cluster` and runs the migrations; resolves to its URL. */
export async function migratedBenchDatabase(cluster: Cluster): Promise<string> {
  await ensureDatabase(cluster, 'bench');
  const url = cluster.url('bench');
  await runMigrations(url);
  return url;
}

/** The app's environment on `url` for a bench: production mode, silent, any free port; `limits` raises rate limits. */
export function benchEnv(url: string, limits: Record<string, string> = {}): Record<string, string> {
  return {
    NODE_ENV: 'production',
    LOG_LEVEL: 'silent',
    DATABASE_URL: url,
    PORT: '0',
    SESSION_SECRET: 'bench-session-secret-123456',
    ...limits,
  };
}

/** The app's configuration for a bench (see benchEnv). */
export const benchConfig = (url: string, limits: Record<string, string> = {}) => loadConfig(benchEnv(url, limits));

/** How many open jobs the board benches seed. */
export const BENCH_JOBS = 10_000;
const PASSWORD = 'bench password 1';

/**
 * The board benches' data: a builder, a shop placed by its postal code as the app places it, `jobs` open
 * jobs spread over the continental United States, and a conversation on one of them for message posting.
 */
export async function seedMarketplace(db: Database, jobs: number) {
  const hash = await hashPassword(PASSWORD);
  await db.execute(sql`INSERT INTO users (email, display_name, role, password_hash, email_verified_at)
    VALUES ('builder@bench.test', 'Bench Builder', 'builder', ${hash}, now()), ('shop@bench.test', 'Bench Shop', 'shop', ${hash}, now())`);
  const shopPlace = await placeOf('United States', '45402');
  await db.execute(sql`INSERT INTO shops (user_id, name, country, region, city, postal_code, latitude, longitude, takes_shipped, capabilities, turnaround_days)
    SELECT id, 'Bench Shop', 'United States', 'Ohio', 'Dayton', ${shopPlace.postalCode}, ${shopPlace.latitude}, ${shopPlace.longitude}, true, ARRAY['bore','hone','deck'], 10 FROM users WHERE role = 'shop'`);
  await db.execute(sql`
    INSERT INTO jobs (builder_id, status, title, engine_family, cylinders, block_material, operations, logistics, country, region, city, needed_by, spec, published_at, bid_count, latitude, longitude)
    SELECT (SELECT id FROM users WHERE role = 'builder'), 'open', 'Bench job ' || g, 'Bench V8', (ARRAY[4,6,8])[1 + g % 3],
      CASE WHEN g % 3 = 0 THEN 'aluminium' ELSE 'cast-iron' END,
      CASE g % 4 WHEN 0 THEN ARRAY['bore','hone'] WHEN 1 THEN ARRAY['deck'] WHEN 2 THEN ARRAY['bore','hone','deck'] ELSE ARRAY['line-hone'] END,
      CASE WHEN g % 2 = 0 THEN 'ship' ELSE 'drop-off' END,
      'United States', (ARRAY['Ohio','Oregon','Texas','Maine','Utah'])[1 + g % 5], 'Town ' || (g % 50), current_date + (g % 120),
      jsonb_build_object('title', 'Bench job ' || g, 'unit', 'in', 'stockBore', 4, 'stroke', 3.48), now() - g * interval '1 minute', g % 7,
      25 + (g % 100) * 0.25, -124 + (g / 100) * 0.57
    FROM generate_series(1, ${jobs}) AS g`);
  await db.execute(sql`ANALYZE`);
  const [{ id: sampleJob }] = (await db.execute<{ id: string }>(sql`SELECT id FROM jobs ORDER BY published_at DESC LIMIT 1 OFFSET 500`)).rows;
  // A conversation between the builder and the shop on that job, for message posting.
  const [{ id: threadId }] = (
    await db.execute<{ id: string }>(sql`INSERT INTO threads (job_id, shop_id) SELECT ${sampleJob}, id FROM shops LIMIT 1 RETURNING id`)
  ).rows;
  return { shopPlace, sampleJob, threadId };
}

/** Signs in as the seeded shop at `base`; the session cookie (name=value) and CSRF token to send with each request. */
export async function signInAsShop(base: string): Promise<{ cookie: string; token: string }> {
  const csrfRes = await fetch(`${base}/api/auth/csrf`);
  const firstCookie = csrfRes.headers.get('set-cookie')!.split(';')[0];
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Cookie: firstCookie, 'X-CSRF-Token': csrfToken },
    body: JSON.stringify({ email: 'shop@bench.test', password: PASSWORD }),
  });
  if (login.status !== 200) throw new Error(`bench sign-in failed: ${login.status}`);
  const cookie = login.headers.get('set-cookie')!.split(';')[0];
  const { csrfToken: token } = (await login.json()) as { csrfToken: string };
  return { cookie, token };
}

/**
 * autocannon's options for one case, signed in by `cookie`: a GET of `url`, or with `post` a message
 * posted to it, each with a client id of its own, as each browser message has.
 */
export function loadOptions(c: { url: string; connections: number; seconds: number; cookie: string; token: string; post?: boolean }): autocannon.Options {
  let sent = 0;
  return {
    url: c.url,
    connections: c.connections,
    duration: c.seconds,
    headers: { cookie: c.cookie, ...(c.post ? { 'x-csrf-token': c.token, 'content-type': 'application/json' } : {}) },
    ...(c.post
      ? {
          method: 'POST' as const,
          setupClient: (client: autocannon.Client) => {
            const next = () => client.setBody(JSON.stringify({ clientId: `bench-${process.pid}-${(sent += 1)}`, body: 'Bench message: bores measured, record on its way.' }));
            next();
            client.on('response', next);
          },
        }
      : {}),
  };
}
