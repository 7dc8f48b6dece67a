import { sql } from 'drizzle-orm';
import geodesic from 'geographiclib-geodesic';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { METRES_PER } from '../../shared/distance';
import { boardQuerySchema } from '../../shared/schemas/jobs';
import { jobs } from '../../server/db/schema';
import { locatePostalCode } from '../../server/lib/postal-codes';
import { boardRowsQuery, type BoardOrigin } from '../../server/modules/jobs/jobs.repository';
import { mailOutbox } from '../../server/db/schema';
import { bidInput, createJob, createShop, createUser, jobInput, shopProfileInput } from '../factories';
import { apiOf, jobInState } from '../setup/job-states';
import { setupTestApp, signedIn, type TestContext } from '../setup/test-env';

/**
 * Distances on the board and in the directory: places come from postal codes when a
 * shop or job is saved, PostgreSQL's earthdistance measures, a GiST index answers
 * "within", and a postal code that gives no place falls back to region.
 */

// earthdistance's sphere (earth() in the extension: 6,378,168 m).
const EARTH_RADIUS_M = 6_378_168;
/** The point `metres` due north of a point, on that sphere: along a meridian the arc is exactly the change of latitude. */
const north = (at: { latitude: number; longitude: number }, metres: number) => ({ latitude: at.latitude + ((metres / EARTH_RADIUS_M) * 180) / Math.PI, longitude: at.longitude });

let ctx: TestContext;
let shopClient: Awaited<ReturnType<typeof signedIn>>;
let unplacedShopClient: Awaited<ReturnType<typeof signedIn>>;
let builderClient: Awaited<ReturnType<typeof signedIn>>;
const ids: Record<string, string> = {};
let dayton: { latitude: number; longitude: number };
const names = (body: { jobs: Array<{ id: string }> }) => body.jobs.map((j) => Object.keys(ids).find((k) => ids[k] === j.id) ?? 'other');

beforeAll(async () => {
  ctx = await setupTestApp();
  dayton = (await locatePostalCode('United States', '45402'))!;
  const builder = await createUser(ctx.db);
  builderClient = await signedIn(ctx.app, builder);
  const make = async (name: string, input: { postalCode?: string; region?: string; city?: string }) => {
    const job = await createJob(ctx.db, builder.id, { input: { title: `Distance ${name}`, ...input } });
    ids[name] = job.id;
    return job;
  };
  // Placed from their postal codes when saved.
  await make('dayton', { postalCode: '45402', region: 'Ohio', city: 'Dayton' });
  await make('columbus', { postalCode: '43215', region: 'Ohio', city: 'Columbus' });
  await make('chicago', { postalCode: '60601', region: 'Illinois', city: 'Chicago' });
  // Postal codes that give no place: one in the shop's region, one outside it.
  await make('ohio-unknown', { postalCode: '00000', region: 'Ohio', city: 'Nowhere' });
  await make('indiana-unknown', { region: 'Indiana', city: 'Muncie' });
  // Just inside and just outside 50 miles due north of the shop, placed by hand.
  const inside = await make('inside-50mi', { postalCode: '45402', region: 'Michigan' });
  const outside = await make('outside-50mi', { postalCode: '45402', region: 'Michigan' });
  const fifty = 50 * METRES_PER.mi;
  for (const [id, metres] of [[inside.id, fifty - 100], [outside.id, fifty + 100]] as const) {
    const at = north(dayton, metres);
    await ctx.db.update(jobs).set({ latitude: at.latitude, longitude: at.longitude }).where(sql`${jobs.id} = ${id}`);
  }
  const { user } = await createShop(ctx.db, { postalCode: '45402', region: 'Ohio', city: 'Dayton' });
  shopClient = await signedIn(ctx.app, user);
  const unplaced = await createShop(ctx.db, { postalCode: '99999', region: 'Ohio', city: 'Dayton' });
  unplacedShopClient = await signedIn(ctx.app, unplaced.user);
});
afterAll(async () => {
  await ctx?.close();
});

type BoardBody = {
  jobs: Array<{ id: string; distance: number | null; placeFound: boolean }>;
  total: number;
  nextCursor: string | null;
  distanceFrom: { unit: string; found: boolean; postalCode: string | null } | null;
};
const board = async (client: typeof shopClient, query: string) => {
  const res = await client.get(`/api/jobs?${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as BoardBody;
};

describe('great-circle distance in PostgreSQL', () => {
  it('when measured between LAX and JFK, then it matches the published worked example and the ellipsoid within 0.5 %', async () => {
    // Ed Williams, Aviation Formulary, "Worked examples": LAX (33°57'N, 118°24'W) to JFK (40°38'N, 73°47'W)
    // is 0.623585 radians of great circle, 2,144 nautical miles.
    const lax = { latitude: 33 + 57 / 60, longitude: -(118 + 24 / 60) };
    const jfk = { latitude: 40 + 38 / 60, longitude: -(73 + 47 / 60) };
    const { rows: [row] } = await ctx.pool.query<{ metres: number }>(
      'SELECT earth_distance(ll_to_earth($1, $2), ll_to_earth($3, $4)) AS metres',
      [lax.latitude, lax.longitude, jfk.latitude, jfk.longitude],
    );
    const formulary = 0.623585 * EARTH_RADIUS_M; // the formulary's angle on earthdistance's sphere
    expect(Math.abs(row.metres - formulary) / formulary).toBeLessThan(0.005);
    // GeographicLib (Karney's geodesics on the WGS84 ellipsoid): the sphere stays within 0.5 % of it here.
    const ellipsoidal = geodesic.Geodesic.WGS84.Inverse(lax.latitude, lax.longitude, jfk.latitude, jfk.longitude).s12!;
    expect(Math.abs(row.metres - ellipsoidal) / ellipsoidal).toBeLessThan(0.005);
  });
});

describe('places from postal codes', () => {
  it('when a job is saved with a postal code, then the dataset’s coordinates are stored; an unknown code stores none', async () => {
    const { rows } = await ctx.pool.query<{ id: string; postal_code: string | null; latitude: number | null; longitude: number | null }>(
      'SELECT id, postal_code, latitude, longitude FROM jobs WHERE id = ANY($1)',
      [[ids.dayton, ids['ohio-unknown'], ids['indiana-unknown']]],
    );
    const byId = new Map(rows.map((r) => [r.id, r]));
    expect(byId.get(ids.dayton)).toMatchObject({ postal_code: '45402', latitude: dayton.latitude, longitude: dayton.longitude });
    expect(byId.get(ids['ohio-unknown'])).toMatchObject({ postal_code: '00000', latitude: null, longitude: null });
    expect(byId.get(ids['indiana-unknown'])).toMatchObject({ postal_code: null, latitude: null });
  });

  it('when Canadian and malformed codes are looked up, then the area of a Canadian code is found and the rest are not', async () => {
    expect(await locatePostalCode('Canada', 'K1A 0B1')).toMatchObject({ latitude: expect.closeTo(45.42, 1) });
    expect(await locatePostalCode('United States', 'K1A 0B1')).toBeNull();
    expect(await locatePostalCode('Germany', '10115')).toBeNull();
    expect(await locatePostalCode('usa', '45402-1234')).toEqual(dayton);
  });

  it('when a shop saves its profile, then its own profile says whether the postal code was found', async () => {
    const found = await shopClient.get('/api/shop-profile');
    expect(found.body.shop).toMatchObject({ postalCode: '45402', placeFound: true });
    const missing = await unplacedShopClient.get('/api/shop-profile');
    expect(missing.body.shop).toMatchObject({ postalCode: '99999', placeFound: false });
  });
});

describe('the board within a distance of the shop', () => {
  it('when filtered within 50 miles, then exactly the jobs inside come back, with the region fallback for unknown places', async () => {
    const body = await board(shopClient, 'within=50&sort=distance');
    expect(names(body)).toEqual(['dayton', 'inside-50mi', 'ohio-unknown']);
    expect(body.distanceFrom).toEqual({ unit: 'mi', postalCode: '45402', found: true });
    const inside = body.jobs.find((j) => j.id === ids['inside-50mi'])!;
    expect(inside.distance).toBeCloseTo(50 - 100 / METRES_PER.mi, 6);
    expect(body.jobs.find((j) => j.id === ids['ohio-unknown'])).toMatchObject({ distance: null, placeFound: false });
  });

  it('when the radius is in kilometres, then the same limit holds in that unit', async () => {
    const km = 50 * 1.609344;
    expect(names(await board(shopClient, `within=${km + 0.2}&unit=km&sort=distance`))).toEqual(['dayton', 'inside-50mi', 'outside-50mi', 'ohio-unknown']);
    const body = await board(shopClient, `within=${km}&unit=km&sort=distance`);
    expect(names(body)).toEqual(['dayton', 'inside-50mi', 'ohio-unknown']);
    expect(body.jobs[1].distance).toBeCloseTo(km - 0.1, 6);
  });

  it('when sorted by distance, then nearest first, unknown places last, and the cursor pages through the same order', async () => {
    const all = await board(shopClient, 'sort=distance');
    expect(names(all)).toEqual(['dayton', 'inside-50mi', 'outside-50mi', 'columbus', 'chicago', expect.any(String), expect.any(String)]);
    expect(names(all).slice(5).sort()).toEqual(['indiana-unknown', 'ohio-unknown']);
    // Columbus is about 65 miles from Dayton (ZIP centroids; common knowledge of the two cities).
    expect(all.jobs[3].distance).toBeGreaterThan(60);
    expect(all.jobs[3].distance).toBeLessThan(75);
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const page: BoardBody = await board(shopClient, `sort=distance&pageSize=2${cursor ? `&cursor=${cursor}` : ''}`);
      seen.push(...page.jobs.map((j) => j.id));
      cursor = page.nextCursor;
    } while (cursor);
    expect(seen).toEqual(all.jobs.map((j) => j.id));
  });

  it('when the shop’s postal code gives no place, then "within" means its region and no distances are given', async () => {
    const body = await board(unplacedShopClient, 'within=50');
    expect(body.distanceFrom).toEqual({ unit: 'mi', postalCode: '99999', found: false });
    expect(names(body).sort()).toEqual(['columbus', 'dayton', 'ohio-unknown']);
    expect(body.jobs.every((j) => j.distance === null)).toBe(true);
  });

  it('when measured from a given postal code, then distances are from there', async () => {
    const body = await board(shopClient, 'near=60601&within=5&sort=distance');
    expect(names(body)).toEqual(['chicago']);
    expect(body.jobs[0].distance).toBe(0);
  });

  it('when the distance query is wrong, then 400 names the field', async () => {
    const res = await shopClient.get('/api/jobs?within=-3&unit=furlongs&near=!!');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['near', 'unit', 'within']);
    const unknown = await shopClient.get('/api/jobs?near=00000');
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields).toEqual({ near: 'Postal code not found.' });
    const tooFar = await shopClient.get('/api/jobs?within=5001');
    expect(tooFar.body.error.fields.within).toMatch(/at most 5,000/);
  });

  it('when nothing is there to measure from, then "within" and sorting by distance are refused', async () => {
    const admin = await createUser(ctx.db, { role: 'admin' });
    const adminClient = await signedIn(ctx.app, admin);
    expect((await adminClient.get('/api/jobs?within=10')).status).toBe(400);
    expect((await adminClient.get('/api/jobs?sort=distance')).status).toBe(400);
    const plain = await board(adminClient, '');
    expect(plain.distanceFrom).toBeNull();
    expect(plain.jobs.every((j) => j.distance === null)).toBe(true);
  });

  it('when the board is filtered within a radius over many jobs, then the GiST index answers it', async () => {
    // 20,000 open jobs spread over the continental United States.
    await ctx.db.execute(sql`
      INSERT INTO jobs (builder_id, status, title, engine_family, cylinders, block_material, operations, logistics, country, region, city, needed_by, spec, published_at, latitude, longitude)
      SELECT (SELECT id FROM users LIMIT 1), 'open', 'Filler ' || g, 'Filler engine', 4, 'cast-iron', ARRAY['bore'], 'ship', 'United States', 'Region ' || (g % 40), 'Town',
             current_date + (g % 90), '{}'::jsonb, now() - g * interval '1 minute', 25 + (g % 200) * 0.12, -124 + (g / 200) * 0.57
      FROM generate_series(1, 20000) AS g`);
    await ctx.db.execute(sql`ANALYZE jobs`);
    const origin: BoardOrigin = { unit: 'mi', postalCode: '45402', at: dayton, region: { country: 'United States', region: 'Ohio' } };
    try {
      for (const raw of [{ within: '50' }, { within: '50', sort: 'distance' }, { within: '25', sort: 'needed-soonest' }]) {
        const query = boardRowsQuery(ctx.db, boardQuerySchema.parse(raw), origin).toSQL();
        const plan = await ctx.pool.query(`EXPLAIN ${query.sql}`, query.params as unknown[]);
        const text = plan.rows.map((r: { 'QUERY PLAN': string }) => r['QUERY PLAN']).join('\n');
        expect(text, `plan for ${JSON.stringify(raw)}:\n${text}`).toMatch(/jobs_open_earth_idx/);
        expect(text).not.toMatch(/Seq Scan on jobs/);
      }
      // And the answer is still exactly the jobs inside: the fillers near Dayton are counted as PostgreSQL measures them.
      const { rows: [{ inside }] } = await ctx.pool.query<{ inside: number }>(
        `SELECT count(*)::int AS inside FROM jobs WHERE status = 'open' AND earth_distance(ll_to_earth($1, $2), ll_to_earth(latitude, longitude)) <= $3`,
        [dayton.latitude, dayton.longitude, 50 * METRES_PER.mi],
      );
      const body = await board(shopClient, 'within=50&pageSize=100');
      const unplacedInOhio = 1;
      expect(body.total).toBe(inside + unplacedInOhio);
    } finally {
      await ctx.db.delete(jobs).where(sql`${jobs.title} LIKE 'Filler %'`);
    }
  });
});

describe('the directory near a postal code', () => {
  it('when asked near a postal code within a radius, then the shops inside come back nearest first with their distance', async () => {
    const far = await createShop(ctx.db, { name: 'Lakefront Test Boring', postalCode: '60601', region: 'Illinois', city: 'Chicago' });
    const res = await builderClient.get('/api/shops?near=45402&within=10');
    expect(res.status).toBe(200);
    expect(res.body.distanceFrom).toEqual({ unit: 'mi', postalCode: '45402', from: 'near', found: true, region: null });
    expect(res.body.shops.map((s: { city: string; distance: number }) => [s.city, s.distance])).toEqual([['Dayton', 0]]);
    const wide = await builderClient.get('/api/shops?near=45402');
    const order = wide.body.shops.map((s: { id: string; distance: number | null }) => s.distance);
    expect(order).toEqual([0, expect.any(Number), null]);
    expect(wide.body.shops[1].id).toBe(far.shop.id);
    // Chicago is roughly 250 miles from Dayton (common knowledge of the two cities; ZIP centroids).
    expect(order[1]).toBeGreaterThan(230);
    expect(order[1]).toBeLessThan(270);
  });

  it('when a builder opens the directory without a postal code, then the nearest shops to their latest job with a known place come first', async () => {
    const builder = await createUser(ctx.db);
    const client = await signedIn(ctx.app, builder);
    // Signed in with no job yet: nothing to measure from, as before.
    expect((await client.get('/api/shops')).body.distanceFrom).toBeNull();
    await createJob(ctx.db, builder.id, { input: { postalCode: '60601', region: 'Illinois', city: 'Chicago' } });
    // The latest job's postal code gives no place, so the one before it is used.
    await createJob(ctx.db, builder.id, { status: 'draft', input: { postalCode: '00000', region: 'Ohio', city: 'Nowhere' } });
    const near = await createShop(ctx.db, { name: 'Loop Test Honing', postalCode: '60601', region: 'Illinois', city: 'Chicago' });
    const res = await client.get('/api/shops?pageSize=100');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.distanceFrom).toEqual({ unit: 'mi', postalCode: '60601', from: 'latest-job', found: true, region: null });
    const distances = res.body.shops.map((s: { distance: number | null }) => s.distance);
    expect(distances[0]).toBe(0);
    expect(res.body.shops.slice(0, 2).map((s: { id: string }) => s.id)).toContain(near.shop.id);
    const known = distances.filter((d: number | null) => d !== null);
    expect(known).toEqual([...known].sort((a: number, b: number) => a - b));
    expect(distances.slice(known.length).every((d: number | null) => d === null)).toBe(true);
    // A postal code typed in still wins.
    expect((await client.get('/api/shops?near=45402')).body.distanceFrom).toMatchObject({ postalCode: '45402', from: 'near' });
    // Nobody else gets the builder's place: signed out, the directory measures nothing.
    expect((await supertest(ctx.app).get('/api/shops')).body.distanceFrom).toBeNull();
  });

  it('when none of the builder’s jobs has a known place, then the shops of their latest job’s region come first, and the answer says so', async () => {
    const builder = await createUser(ctx.db);
    const client = await signedIn(ctx.app, builder);
    await createJob(ctx.db, builder.id, { input: { postalCode: '00000', region: 'Illinois', city: 'Nowhere' } });
    const res = await client.get('/api/shops?pageSize=100');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.distanceFrom).toEqual({ unit: 'mi', postalCode: '00000', from: 'latest-job', found: false, region: 'Illinois' });
    const regions = res.body.shops.map((s: { region: string }) => s.region);
    const inRegion = regions.filter((r: string) => r === 'Illinois').length;
    expect(inRegion).toBeGreaterThan(0);
    expect(regions.slice(0, inRegion).every((r: string) => r === 'Illinois')).toBe(true);
    expect(res.body.shops.every((s: { distance: number | null }) => s.distance === null)).toBe(true);
  });

  it('when the directory query is wrong, then 400 names the field', async () => {
    const res = await builderClient.get('/api/shops?within=20');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('near');
    const unknown = await builderClient.get('/api/shops?near=00000');
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields).toEqual({ near: 'Postal code not found.' });
  });
});

describe('distance on bids', () => {
  it('when a shop bids, then the builder sees how far the shop is from the job’s place', async () => {
    const builder = await createUser(ctx.db);
    const client = await signedIn(ctx.app, builder);
    const job = await createJob(ctx.db, builder.id, { input: { postalCode: '43215', region: 'Ohio', city: 'Columbus' } });
    const bid = await shopClient.post(`/api/jobs/${job.id}/bids`, bidInput());
    expect(bid.status, JSON.stringify(bid.body)).toBe(201);
    const res = await client.get(`/api/jobs/${job.id}/bids`);
    expect(res.status).toBe(200);
    expect(res.body.bids[0].distance).toMatchObject({ unit: 'mi' });
    expect(res.body.bids[0].distance.value).toBeGreaterThan(60);
    expect(res.body.bids[0].distance.value).toBeLessThan(75);
  });
});

describe('distance on the job page', () => {
  it('when a shop opens a job, then it sees the distance from its own place in its unit; the builder and a shop of unknown place see none', async () => {
    const builder = await createUser(ctx.db);
    const own = await signedIn(ctx.app, builder);
    const job = await createJob(ctx.db, builder.id, { input: { postalCode: '43215', region: 'Ohio', city: 'Columbus' } });
    const seen = await shopClient.get(`/api/jobs/${job.id}`);
    expect(seen.status, JSON.stringify(seen.body)).toBe(200);
    // Columbus is about 65 miles from Dayton (ZIP centroids; common knowledge of the two cities).
    expect(seen.body.job.distanceUnit).toBe('mi');
    expect(seen.body.job.distance).toBeGreaterThan(60);
    expect(seen.body.job.distance).toBeLessThan(75);
    // The same figure the board gives for the same pair of places.
    const row = (await board(shopClient, 'sort=distance&pageSize=100')).jobs.find((j) => j.id === job.id)!;
    expect(seen.body.job.distance).toBeCloseTo(row.distance!, 6);
    expect((await own.get(`/api/jobs/${job.id}`)).body.job).toMatchObject({ distance: null, distanceUnit: null });
    expect((await unplacedShopClient.get(`/api/jobs/${job.id}`)).body.job).toMatchObject({ distance: null, distanceUnit: null });
  });
});

describe('the builder’s postal code stays theirs', () => {
  it('when a shop is told of a job, bids, wins it and reads everything about it, then no answer and no e-mail carries the job’s postal code', async () => {
    const code = '45459';
    const builderUser = await createUser(ctx.db);
    const shopUser = await createUser(ctx.db, { role: 'shop' });
    const shopSession = await signedIn(ctx.app, shopUser);
    const shop = apiOf(shopSession);
    await shop('PUT', '/api/shop-profile', shopProfileInput({ postalCode: '45402', region: 'Ohio', city: 'Dayton', notifyMatchingJobs: true }));
    const builder = apiOf(await signedIn(ctx.app, builderUser));
    const input = { postalCode: code, region: 'Ohio', city: 'Centerville' };
    const { job, bid } = await jobInState('bid', { builder, shop }, { input });
    // The builder changes the job, so its bidder is e-mailed and told about it.
    await builder('PUT', `/api/jobs/${job.id}`, jobInput({ ...input, title: 'Changed: V8 bore and hone' }));
    const stored = await ctx.pool.query<{ postal_code: string }>('SELECT postal_code FROM jobs WHERE id = $1', [job.id]);
    expect(stored.rows[0].postal_code).toBe(code);
    const paths = [
      `/api/jobs/${job.id}`,
      '/api/jobs?pageSize=100',
      '/api/jobs?sort=distance&pageSize=100',
      `/api/jobs/${job.id}/bids`,
      `/api/bids/${bid!.id}`,
      '/api/bids/mine',
      '/api/shop/queue',
      '/api/notifications',
      '/api/me/needs-you',
      '/api/threads',
      `/api/jobs/${job.id}/threads`,
      `/api/jobs/${job.id}/milestones`,
      `/api/jobs/${job.id}/money`,
      `/api/jobs/${job.id}/shipping`,
      '/api/me/export',
      '/api/openapi.json',
    ];
    const leaks = async () => {
      const found: string[] = [];
      for (const path of paths) {
        const res = await shopSession.get(path);
        // The work's own pages open only once the shop has won it; a refusal must not carry the code either.
        expect([200, 403], `${path}: ${JSON.stringify(res.body)}`).toContain(res.status);
        if (JSON.stringify(res.body).includes(code)) found.push(path);
      }
      return found;
    };
    expect(await leaks()).toEqual([]);
    // And the shop wins it (set in the database: the payment steps add nothing here), so its data export holds the job.
    await ctx.pool.query("UPDATE bids SET status = 'accepted', decided_at = now() WHERE id = $1", [bid!.id]);
    await ctx.pool.query("UPDATE jobs SET status = 'awarded', awarded_bid_id = $1 WHERE id = $2", [bid!.id, job.id]);
    expect(await leaks()).toEqual([]);
    const mails = await ctx.db.select().from(mailOutbox).where(sql`${mailOutbox.toAddress} = ${shopUser.email}`);
    expect(mails.map((m) => m.template)).toEqual(expect.arrayContaining(['matching_job', 'job_changed']));
    for (const mail of mails) expect(`${mail.subject}\n${mail.textBody}\n${mail.htmlBody}`, mail.template).not.toContain(code);
  });
});
