import { randomBytes } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { createDb, createPool } from '../../server/db/client';
import { createLogger } from '../../server/lib/logger';
import { boardRowsQuery } from '../../server/modules/jobs/jobs.repository';
import { encodeBoardCursor } from '../../server/modules/jobs/board-cursor';
import { BOARD_COUNT_CAP, boardQuerySchema, boardSorts } from '../../shared/schemas/jobs';
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
  return res.body as { jobs: Array<{ id: string; title: string }>; total: number; totalIsCapped: boolean; nextCursor: string | null };
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
    // A place deep in the board (job 10,000 of 20,000) for each order's cursor.
    const { rows: [deep] } = await ctx.pool.query<{ published_at: string; id: string; needed_by: string; bid_count: number }>(
      `SELECT published_at::text, id, needed_by::text, bid_count FROM jobs WHERE country = 'Fillerland' ORDER BY published_at DESC, id DESC OFFSET 10000 LIMIT 1`,
    );
    const cursors = [
      { cursor: encodeBoardCursor({ sort: 'newest', publishedAt: deep.published_at, id: deep.id }) },
      { sort: 'needed-soonest', cursor: encodeBoardCursor({ sort: 'needed-soonest', neededBy: deep.needed_by, id: deep.id }) },
      { sort: 'fewest-bids', cursor: encodeBoardCursor({ sort: 'fewest-bids', bidCount: deep.bid_count, publishedAt: deep.published_at, id: deep.id }) },
    ];
    for (const raw of [{ operation: 'line-hone' }, { material: 'aluminium', cylinders: '6', region: 'Region 7' }, { sort: 'needed-soonest' }, {}, ...cursors]) {
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

  it.each(boardSorts)('when the board is walked by cursor in "%s" order while jobs are added, then every job comes exactly once', async (sort) => {
    const place = `Cursorland ${sort}`;
    // 30 open jobs with many ties in every sort key: three per publication time (the same bid count within each three), four needed-by days.
    const add = (count: number, publishedAt: string) =>
      ctx.db.execute(sql`
        INSERT INTO jobs (builder_id, status, title, engine_family, cylinders, block_material, operations, logistics, country, region, city, needed_by, spec, published_at, bid_count)
        SELECT (SELECT id FROM users LIMIT 1), 'open', 'Cursor ' || g, 'Cursor engine', 4, 'cast-iron', ARRAY['bore'], 'ship', ${place}, 'Region', 'Town',
               current_date + (g % 4), '{}'::jsonb, ${sql.raw(publishedAt)}, (g / 6) % 3
        FROM generate_series(1, ${count}) AS g`);
    await add(30, `date_trunc('minute', now()) - (g / 3) * interval '1 minute'`);
    const { rows } = await ctx.pool.query<{ id: string }>('SELECT id FROM jobs WHERE country = $1', [place]);
    const before = new Set(rows.map((r) => r.id));

    const seen: string[] = [];
    let cursor: string | null = null;
    for (let fetches = 0; fetches < 20; fetches += 1) {
      const query = `sort=${sort}&pageSize=4${cursor ? `&cursor=${cursor}` : ''}`;
      const res = await shopClient.get(`/api/jobs?country=${encodeURIComponent(place)}&${query}`);
      expect(res.status, query).toBe(200);
      expect(res.body.jobs.length).toBeLessThanOrEqual(4);
      seen.push(...res.body.jobs.map((j: { id: string }) => j.id));
      cursor = res.body.nextCursor;
      if (!cursor) break;
      // Between two fetches, two more jobs are published (both at the same moment).
      await add(2, 'now()');
    }
    expect(cursor).toBeNull();
    expect(new Set(seen).size, 'a job came twice').toBe(seen.length);
    expect(seen.filter((id) => before.has(id)).sort()).toEqual([...before].sort());
    await ctx.db.delete(jobs).where(sql`${jobs.country} = ${place}`);
  });

  it('when a cursor is made up or belongs to another order, then 400 names the cursor', async () => {
    const first = await board('pageSize=1');
    expect(first.nextCursor).toEqual(expect.any(String));
    const uuid = '00000000-0000-4000-8000-000000000000';
    // Shaped like a cursor but not a real moment or day: the database must never be the one to refuse it.
    const shapedButImpossible = [
      { sort: 'newest', publishedAt: '2026-13-45 99:99:99+00', id: uuid },
      { sort: 'needed-soonest', neededBy: '2026-02-30', id: uuid },
      { sort: 'fewest-bids', bidCount: 1, publishedAt: '2026-02-30 10:00:00+00', id: uuid },
    ].map((c) => `sort=${c.sort}&cursor=${Buffer.from(JSON.stringify(c)).toString('base64url')}`);
    for (const query of [
      `sort=needed-soonest&cursor=${first.nextCursor}`,
      'cursor=bm90LWpzb24',
      `cursor=${Buffer.from('{"sort":"newest","publishedAt":"x","id":"1"}').toString('base64url')}`,
      ...shapedButImpossible,
    ]) {
      const res = await shopClient.get(`/api/jobs?${query}`);
      expect(res.status, query).toBe(400);
      expect(Object.keys(res.body.error.fields), query).toEqual(['cursor']);
    }
  });

  it('when the last page is reached, by page number or cursor, then there is no next cursor', async () => {
    expect((await board('pageSize=3')).nextCursor).toBeNull();
    const first = await board('pageSize=2');
    const second = await board(`pageSize=2&cursor=${first.nextCursor}`);
    expect(names(second)).toEqual(['iron-v8-ship']);
    expect(second.nextCursor).toBeNull();
  });

  it('when more jobs match than the count goes to, then the total stops at the cap and says so', async () => {
    const place = 'Capland';
    const add = (count: number) =>
      ctx.db.execute(sql`
        INSERT INTO jobs (builder_id, status, title, engine_family, cylinders, block_material, operations, logistics, country, region, city, needed_by, spec, published_at)
        SELECT (SELECT id FROM users LIMIT 1), 'open', 'Cap ' || g, 'Cap engine', 4, 'cast-iron', ARRAY['bore'], 'ship', ${place}, 'Region', 'Town', current_date + 30, '{}'::jsonb, now()
        FROM generate_series(1, ${count}) AS g`);
    const count = async () => {
      const res = await shopClient.get(`/api/jobs?country=${place}&pageSize=1`);
      expect(res.status).toBe(200);
      return { total: res.body.total, totalIsCapped: res.body.totalIsCapped };
    };
    await add(BOARD_COUNT_CAP);
    expect(await count()).toEqual({ total: BOARD_COUNT_CAP, totalIsCapped: false });
    await add(1);
    expect(await count()).toEqual({ total: BOARD_COUNT_CAP, totalIsCapped: true });
    expect((await board('')).totalIsCapped).toBe(false);
    await ctx.db.delete(jobs).where(sql`${jobs.country} = ${place}`);
  });

  it('when a builder asks for the board, then 403; drafts never appear', async () => {
    const builder = await signedIn(ctx.app, await createUser(ctx.db));
    expect((await builder.get('/api/jobs')).status).toBe(403);
    expect(names(await board('pageSize=100'))).not.toContain('draft-hidden');
  });
});
