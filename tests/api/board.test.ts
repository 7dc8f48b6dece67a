import { randomBytes } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { createDb, createPool } from '../../server/db/client';
import { createLogger } from '../../server/lib/logger';
import { boardRowsQuery } from '../../server/modules/jobs/jobs.repository';
import { boardQuerySchema } from '../../shared/schemas/jobs';
import { jobs } from '../../server/db/schema';
import { createJob, createShop, createUser, inDays } from '../factories';
import { agentFor, setupTestApp, signedIn, type TestContext } from '../setup/test-env';

let ctx: TestContext;
let shopClient: Awaited<ReturnType<typeof signedIn>>;
const country = `Testland ${randomBytes(3).toString('hex')}`;
const ids: Record<string, string> = {};

beforeAll(async () => {
  ctx = await setupTestApp();
  const builder = await createUser(ctx.db);
  const make = async (name: string, input: Parameters<typeof createJob>[2] extends infer O ? O extends { input?: infer I } ? I : never : never, status: 'open' | 'draft' = 'open') => {
    const job = await createJob(ctx.db, builder.id, { status, input: { country, title: `Board ${name}`, ...input } });
    ids[name] = job.id;
    return job;
  };
  await make('iron-v8-ship', { blockMaterial: 'cast-iron', cylinders: 8, region: 'Ohio', logistics: 'ship', neededBy: inDays(20), operations: [{ code: 'bore', quantity: 8 }, { code: 'hone', quantity: 8 }] });
  await make('alloy-i4-drop', { blockMaterial: 'aluminium', cylinders: 4, region: 'Oregon', logistics: 'drop-off', neededBy: inDays(5), operations: [{ code: 'deck', quantity: 1 }] });
  await make('iron-i6-drop', { blockMaterial: 'cast-iron', cylinders: 6, region: 'Ohio', logistics: 'drop-off', neededBy: inDays(60), operations: [{ code: 'line-hone', quantity: 1 }, { code: 'bore', quantity: 6 }] });
  await make('draft-hidden', { blockMaterial: 'cast-iron', cylinders: 8 }, 'draft');
  // Different publish times for "newest", and bids for "fewest bids".
  await ctx.db.execute(sql`UPDATE jobs SET published_at = now() - interval '3 hours', bid_count = 2 WHERE id = ${ids['iron-v8-ship']}`);
  await ctx.db.execute(sql`UPDATE jobs SET published_at = now() - interval '2 hours', bid_count = 0 WHERE id = ${ids['alloy-i4-drop']}`);
  await ctx.db.execute(sql`UPDATE jobs SET published_at = now() - interval '1 hours', bid_count = 1 WHERE id = ${ids['iron-i6-drop']}`);
  const { user } = await createShop(ctx.db);
  shopClient = await signedIn(ctx.app, user);
});
afterAll(async () => {
  await ctx?.close();
});

const board = async (query: string) => {
  const res = await shopClient.get(`/api/jobs?country=${encodeURIComponent(country)}&${query}`);
  expect(res.status).toBe(200);
  return res.body as { jobs: Array<{ id: string; title: string }>; total: number };
};
const names = (body: { jobs: Array<{ id: string }> }) => body.jobs.map((j) => Object.keys(ids).find((k) => ids[k] === j.id));

describe('job board', () => {
  it.each([
    ['', ['iron-i6-drop', 'alloy-i4-drop', 'iron-v8-ship']],
    ['operation=bore', ['iron-i6-drop', 'iron-v8-ship']],
    ['operation=line-hone', ['iron-i6-drop']],
    ['material=aluminium', ['alloy-i4-drop']],
    ['cylinders=8', ['iron-v8-ship']],
    ['region=ohio', ['iron-i6-drop', 'iron-v8-ship']],
    ['logistics=drop-off', ['iron-i6-drop', 'alloy-i4-drop']],
    [`neededBefore=${inDays(25)}`, ['alloy-i4-drop', 'iron-v8-ship']],
    ['material=cast-iron&logistics=drop-off&region=Ohio', ['iron-i6-drop']],
  ])('when filtered by "%s", then exactly the matching open jobs come back, newest first', async (query, expected) => {
    const body = await board(query);
    expect(names(body)).toEqual(expected);
    expect(body.total).toBe(expected.length);
  });

  it('when sorted by needed-soonest or fewest-bids, then the order follows', async () => {
    expect(names(await board('sort=needed-soonest'))).toEqual(['alloy-i4-drop', 'iron-v8-ship', 'iron-i6-drop']);
    expect(names(await board('sort=fewest-bids'))).toEqual(['alloy-i4-drop', 'iron-i6-drop', 'iron-v8-ship']);
  });

  it('when paged, then each page has its slice and the total stays', async () => {
    const first = await board('pageSize=2&page=1');
    const second = await board('pageSize=2&page=2');
    expect(first.total).toBe(3);
    expect(names(first)).toEqual(['iron-i6-drop', 'alloy-i4-drop']);
    expect(names(second)).toEqual(['iron-v8-ship']);
  });

  it('when a filter value is wrong, then 400 names it', async () => {
    const res = await shopClient.get('/api/jobs?material=wood&cylinders=99&sort=cheapest&neededBefore=tomorrow');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['cylinders', 'material', 'neededBefore', 'sort']);
  });

  it('when the board is filtered on many jobs, then PostgreSQL answers from an index', async () => {
    // Enough open jobs that a full scan would be the planner's worse choice.
    await ctx.db.execute(sql`
      INSERT INTO jobs (builder_id, status, title, engine_family, cylinders, block_material, operations, logistics, country, region, city, needed_by, spec, published_at)
      SELECT (SELECT id FROM users LIMIT 1), 'open', 'Filler ' || g, 'Filler engine', 4 + (g % 3) * 2,
             CASE WHEN g % 2 = 0 THEN 'cast-iron' ELSE 'aluminium' END,
             CASE WHEN g % 50 = 0 THEN ARRAY['line-hone'] ELSE ARRAY['bore','hone'] END,
             'ship', 'Fillerland', 'Region ' || (g % 40), 'Town', current_date + (g % 90), '{}'::jsonb, now() - g * interval '1 minute'
      FROM generate_series(1, 20000) AS g`);
    await ctx.db.execute(sql`ANALYZE jobs`);
    for (const raw of [{ operation: 'line-hone' }, { material: 'aluminium', cylinders: '6', region: 'Region 7' }, { sort: 'needed-soonest' }, {}]) {
      const query = boardRowsQuery(ctx.db, boardQuerySchema.parse(raw)).toSQL();
      const plan = await ctx.pool.query(`EXPLAIN ${query.sql}`, query.params as unknown[]);
      const text = plan.rows.map((r: { 'QUERY PLAN': string }) => r['QUERY PLAN']).join('\n');
      expect(text, `plan for ${JSON.stringify(raw)}:\n${text}`).toMatch(/Index Scan|Bitmap Index Scan|Index Only Scan/);
      expect(text).not.toMatch(/Seq Scan on jobs/);
    }
    await ctx.db.delete(jobs).where(sql`${jobs.country} = 'Fillerland'`);
  });

  it('when the page size grows, then the number of SQL statements per request stays the same', async () => {
    const pool = createPool(ctx.config.databaseUrl, 2);
    let statements = 0;
    const query = pool.query.bind(pool);
    pool.query = ((...args: Parameters<typeof pool.query>) => {
      statements += 1;
      return query(...args);
    }) as typeof pool.query;
    const app = createApp({ config: ctx.config, db: createDb(pool), pool, logger: createLogger(ctx.config) });
    try {
      const client = await agentFor(app);
      const { user } = await createShop(ctx.db);
      await client.post('/api/auth/login', { email: user.email, password: user.password });
      const count = async (pageSize: number) => {
        await client.get(`/api/jobs?pageSize=${pageSize}`); // warm the session row
        statements = 0;
        const res = await client.get(`/api/jobs?pageSize=${pageSize}`);
        expect(res.status).toBe(200);
        return { statements, rows: res.body.jobs.length };
      };
      const small = await count(1);
      const large = await count(100);
      expect(large.rows).toBeGreaterThan(small.rows);
      expect(large.statements).toBe(small.statements);
      expect(small.statements).toBeLessThanOrEqual(5);
    } finally {
      app.sessionStore.close();
      await pool.end();
    }
  });

  it('when a builder asks for the board, then 403; drafts never appear', async () => {
    const builder = await signedIn(ctx.app, await createUser(ctx.db));
    expect((await builder.get('/api/jobs')).status).toBe(403);
    expect(names(await board('pageSize=100'))).not.toContain('draft-hidden');
  });
});
