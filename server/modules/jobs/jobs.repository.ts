import { createHash } from 'node:crypto';
import { LRUCache } from 'lru-cache';
import { and, arrayContains, asc, desc, eq, lte, sql, type SQL } from 'drizzle-orm';
import { BOARD_COUNT_CAP, type BoardPage, type BoardQuery, type JobInput, type JobSummary } from '../../../shared/schemas/jobs';
import type { Database, Executor } from '../../db/client';
import { jobPhotos, jobs } from '../../db/schema';
import { decodeBoardCursor, encodeBoardCursor, type BoardCursor } from './board-cursor';
import { METRES_PER, type DistanceUnit } from '../../../shared/distance';
import { distanceIn, earthAt, earthOf, metresBetween, withinMetres } from '../../db/earth';
import { placeOf, type Coordinates } from '../../lib/postal-codes';
import { builderStandings } from '../standing/standing.repository';

export type JobRow = typeof jobs.$inferSelect;

export const photoUrl = (jobId: string, photoId: string, size: 'thumb' | 'large') => `/api/jobs/${jobId}/photos/${photoId}/${size}`;

/** Filterable columns taken from the specification, with the place its postal code names (looked up now, on save). */
export async function columnsFromInput(input: JobInput) {
  return {
    ...(await placeOf(input.country, input.postalCode)),
    title: input.title,
    engineFamily: input.engineFamily,
    cylinders: input.cylinders,
    blockMaterial: input.blockMaterial,
    operations: input.operations.map((op) => op.code),
    logistics: input.logistics,
    country: input.country,
    region: input.region,
    city: input.city,
    neededBy: input.neededBy,
    spec: input,
  };
}

export async function insertJob(db: Executor, builderId: string, input: JobInput): Promise<JobRow> {
  const [row] = await db.insert(jobs).values({ builderId, ...(await columnsFromInput(input)) }).returning();
  return row;
}

export async function findJob(db: Executor, id: string, options: { forUpdate?: boolean } = {}): Promise<JobRow | undefined> {
  const query = db.select().from(jobs).where(eq(jobs.id, id));
  const [row] = options.forUpdate ? await query.for('update') : await query;
  return row;
}

// Written out in full: inside a subquery an unqualified "id" would mean the photo's own id.
const firstPhotoId = sql<string | null>`(SELECT p.id FROM job_photos p WHERE p.job_id = "jobs"."id" ORDER BY p.position, p.created_at LIMIT 1)`;

const summaryColumns = {
  id: jobs.id,
  title: jobs.title,
  status: jobs.status,
  engineFamily: jobs.engineFamily,
  cylinders: jobs.cylinders,
  blockMaterial: jobs.blockMaterial,
  operations: jobs.operations,
  logistics: jobs.logistics,
  country: jobs.country,
  region: jobs.region,
  city: jobs.city,
  neededBy: jobs.neededBy,
  bidCount: jobs.bidCount,
  publishedAt: jobs.publishedAt,
  createdAt: jobs.createdAt,
  firstPhotoId,
  placeFound: sql<boolean>`(${jobs.latitude} IS NOT NULL)`,
};

type SummaryRow = { [K in keyof typeof summaryColumns]: unknown } & { firstPhotoId: string | null; distance?: unknown };

export function toSummary(row: SummaryRow): JobSummary {
  const r = row as unknown as Omit<JobSummary, 'thumbUrl' | 'publishedAt' | 'createdAt'> & {
    publishedAt: Date | null;
    createdAt: Date;
    firstPhotoId: string | null;
  };
  return {
    id: r.id,
    title: r.title,
    status: r.status,
    engineFamily: r.engineFamily,
    cylinders: r.cylinders,
    blockMaterial: r.blockMaterial,
    operations: r.operations,
    logistics: r.logistics,
    country: r.country,
    region: r.region,
    city: r.city,
    neededBy: r.neededBy,
    bidCount: r.bidCount,
    publishedAt: r.publishedAt ? r.publishedAt.toISOString() : null,
    createdAt: r.createdAt.toISOString(),
    thumbUrl: r.firstPhotoId ? photoUrl(r.id, r.firstPhotoId, 'thumb') : null,
    placeFound: r.placeFound,
    distance: (row.distance as number | null | undefined) ?? null,
  };
}

/**
 * Where the board measures distances from: the shop's place (or the `near` postal
 * code's), in the unit asked or the shop's country's. `at` is null when the postal
 * code gave no place; `region` is the shop's, for the fallback.
 */
export type BoardOrigin = { unit: DistanceUnit; postalCode: string | null; at: Coordinates | null; region: { country: string; region: string } | null };

const jobEarth = earthOf(jobs.latitude, jobs.longitude);
const inRegion = (region: { country: string; region: string }) =>
  sql`(lower(${jobs.country}) = lower(${region.country}) AND lower(${jobs.region}) = lower(${region.region}))`;

/**
 * "Within N of my shop": the jobs whose place is that close (the GiST index on their
 * points answers the box), and, as a fallback, the jobs of the shop's region whose
 * postal code gave no place. A shop whose own postal code gave no place gets its region.
 */
function withinFilter(within: number, origin: BoardOrigin): SQL {
  if (!origin.at) return origin.region ? inRegion(origin.region) : sql`false`;
  const near = withinMetres(earthAt(origin.at), jobEarth, within * METRES_PER[origin.unit]);
  return origin.region ? sql`(${near} OR (${jobs.latitude} IS NULL AND ${inRegion(origin.region)}))` : near;
}

/** The filters of the job board as SQL; every one works on open jobs only. */
export function boardWhere(query: BoardQuery, origin: BoardOrigin | null = null): SQL {
  const filters: SQL[] = [eq(jobs.status, 'open')];
  if (query.operation) filters.push(arrayContains(jobs.operations, [query.operation]));
  if (query.material) filters.push(eq(jobs.blockMaterial, query.material));
  if (query.cylinders) filters.push(eq(jobs.cylinders, query.cylinders));
  if (query.country) filters.push(sql`lower(${jobs.country}) = lower(${query.country})`);
  if (query.region) filters.push(sql`lower(${jobs.region}) = lower(${query.region})`);
  if (query.logistics) filters.push(eq(jobs.logistics, query.logistics));
  if (query.neededBefore) filters.push(lte(jobs.neededBy, query.neededBefore));
  if (query.within !== undefined && origin) filters.push(withinFilter(query.within, origin));
  return and(...filters)!;
}

// Each order ends with the id, so no two jobs tie and a cursor names one place exactly.
const boardOrder = {
  newest: [desc(jobs.publishedAt), desc(jobs.id)],
  'needed-soonest': [asc(jobs.neededBy), asc(jobs.id)],
  'fewest-bids': [asc(jobs.bidCount), desc(jobs.publishedAt), desc(jobs.id)],
} as const;

/** Metres from the origin to the job (null when either place is unknown): the key of the distance order and its cursor. */
const metresFrom = (origin: BoardOrigin | null): SQL<number | null> => (origin?.at ? metresBetween(earthAt(origin.at), jobEarth) : sql<null>`NULL::float8`);

function orderOf(sort: BoardQuery['sort'], origin: BoardOrigin | null) {
  // Nearest first, jobs of unknown place last; with nothing to measure from, by id alone.
  return sort === 'distance' ? [sql`${metresFrom(origin)} ASC NULLS LAST`, asc(jobs.id)] : boardOrder[sort];
}

/** After (publishedAt, id) in the order "published_at DESC, id DESC", where PostgreSQL puts a missing date first. */
const afterPublished = (publishedAt: string | null, id: string) =>
  publishedAt === null
    ? sql`(${jobs.publishedAt} IS NOT NULL OR ${jobs.id} < ${id}::uuid)`
    : sql`(${jobs.publishedAt}, ${jobs.id}) < (${publishedAt}::timestamptz, ${id}::uuid)`;

/** The jobs that come after the cursor in its order (written as row comparisons so an index can start there). */
function afterCursor(cursor: BoardCursor, origin: BoardOrigin | null): SQL {
  switch (cursor.sort) {
    case 'distance': {
      const metres = metresFrom(origin);
      return cursor.metres === null
        ? sql`(${metres} IS NULL AND ${jobs.id} > ${cursor.id}::uuid)`
        : sql`(${metres} IS NULL OR (${metres}, ${jobs.id}) > (${cursor.metres}::float8, ${cursor.id}::uuid))`;
    }
    case 'newest':
      return afterPublished(cursor.publishedAt, cursor.id);
    case 'needed-soonest':
      return sql`(${jobs.neededBy}, ${jobs.id}) > (${cursor.neededBy}::date, ${cursor.id}::uuid)`;
    case 'fewest-bids':
      return sql`${jobs.bidCount} >= ${cursor.bidCount} AND (${jobs.bidCount} > ${cursor.bidCount} OR ${afterPublished(cursor.publishedAt, cursor.id)})`;
  }
}

const boardColumns = (origin: BoardOrigin | null) => ({
  ...summaryColumns,
  // Whose standing the row carries (not itself sent).
  builderId: jobs.builderId,
  // The exact timestamp for the cursor: a JavaScript Date would drop its microseconds.
  publishedKey: sql<string | null>`${jobs.publishedAt}::text`,
  // float8 comes back as the shortest text that reads back to the same number, so the cursor's metres compare equal.
  metres: metresFrom(origin),
  distance: origin?.at ? distanceIn(origin.unit, earthAt(origin.at), jobEarth) : sql<null>`NULL::float8`,
});
type BoardRow = { [K in keyof ReturnType<typeof boardColumns>]: unknown } & { firstPhotoId: string | null; publishedKey: string | null; metres: number | null; builderId: string };

function cursorAfter(row: BoardRow, sort: BoardQuery['sort']): string {
  const id = row.id as string;
  switch (sort) {
    case 'distance':
      return encodeBoardCursor({ sort, metres: row.metres, id });
    case 'newest':
      return encodeBoardCursor({ sort, publishedAt: row.publishedKey, id });
    case 'needed-soonest':
      return encodeBoardCursor({ sort, neededBy: row.neededBy as string, id });
    case 'fewest-bids':
      return encodeBoardCursor({ sort, bidCount: row.bidCount as number, publishedAt: row.publishedKey, id });
  }
}

/**
 * The board's page query (exposed so a test can EXPLAIN exactly what runs): from the cursor
 * when there is one, else by page number; one row more than the page, to tell whether another follows.
 */
export function boardRowsQuery(db: Executor, query: BoardQuery, origin: BoardOrigin | null = null) {
  const cursor = decodeBoardCursor(query);
  const rows = db
    .select(boardColumns(origin))
    .from(jobs)
    .where(cursor ? and(boardWhere(query, origin), afterCursor(cursor, origin)) : boardWhere(query, origin))
    .orderBy(...orderOf(query.sort, origin))
    .limit(query.pageSize + 1);
  return cursor ? rows : rows.offset((query.page - 1) * query.pageSize);
}

/** How many jobs match, counted no further than one past the cap: a large board costs no more to count than a page (exposed for the bench's bare baseline). */
export function boardCountQuery(db: Executor, query: BoardQuery, origin: BoardOrigin | null = null) {
  const matching = db.select({ one: sql`1` }).from(jobs).where(boardWhere(query, origin)).limit(BOARD_COUNT_CAP + 1).as('matching');
  return db.select({ total: sql<number>`count(*)::int` }).from(matching);
}

/**
 * The board's two statements, built once per distinct query (filters, order,
 * page, place measured from) and kept for the most recent few hundred: building
 * them cost drizzle more time than PostgreSQL takes to run a page. Each is
 * prepared under a name made from its SQL text, so each connection plans a shape
 * once: planning the distance expressions (ll_to_earth, earth_distance) on every
 * request cost PostgreSQL more than running the page. The values (filters, the
 * place's coordinates, the cursor) are parameters, so shops share their shapes,
 * and the shapes are few (which filters are given, the order, cursor or page).
 */
const boardStatements = new WeakMap<Executor, LRUCache<string, { rows: ReturnType<ReturnType<typeof boardRowsQuery>['prepare']>; count: ReturnType<ReturnType<typeof boardCountQuery>['prepare']> }>>();
const statementName = (kind: string, text: string) => `board_${kind}_${createHash('sha1').update(text).digest('hex').slice(0, 20)}`;
function boardStatementsFor(db: Executor, query: BoardQuery, origin: BoardOrigin | null) {
  let cache = boardStatements.get(db);
  if (!cache) boardStatements.set(db, (cache = new LRUCache({ max: 500 })));
  // drizzle binds the values when it builds a statement, so each query and place has its own here.
  const key = JSON.stringify([query, origin]);
  let statements = cache.get(key);
  if (!statements) {
    const rows = boardRowsQuery(db, query, origin);
    const count = boardCountQuery(db, query, origin);
    statements = { rows: rows.prepare(statementName('rows', rows.toSQL().sql)), count: count.prepare(statementName('count', count.toSQL().sql)) };
    cache.set(key, statements);
  }
  return statements;
}

/**
 * One page of the board and the total: two prepared statements whatever the page size, then the
 * standing of the page's builders, worked out for all of them together (builderStandings).
 */
export async function boardPage(db: Database, query: BoardQuery, origin: BoardOrigin | null = null): Promise<BoardPage> {
  const statements = boardStatementsFor(db, query, origin);
  // The standings wait only for the rows (they need the page's builders), not for the count.
  const pageOf = async () => {
    const rows = await statements.rows.execute();
    const page = rows.slice(0, query.pageSize) as BoardRow[];
    return { page, more: rows.length > query.pageSize, standings: await builderStandings(db, page.map((row) => row.builderId)) };
  };
  const [{ page, more, standings }, [{ total }]] = await Promise.all([pageOf(), statements.count.execute()]);
  return {
    jobs: page.map((row) => ({ ...toSummary(row), builderStanding: standings.get(row.builderId)! })),
    total: Math.min(total, BOARD_COUNT_CAP),
    totalIsCapped: total > BOARD_COUNT_CAP,
    nextCursor: more ? cursorAfter(page[page.length - 1], query.sort) : null,
    page: query.page,
    pageSize: query.pageSize,
    sort: query.sort,
    distanceFrom: origin ? { unit: origin.unit, postalCode: origin.postalCode, found: origin.at !== null } : null,
  };
}

export async function jobsOfBuilder(db: Executor, builderId: string, status?: JobRow['status']) {
  const rows = await db
    .select(summaryColumns)
    .from(jobs)
    .where(status ? and(eq(jobs.builderId, builderId), eq(jobs.status, status)) : eq(jobs.builderId, builderId))
    .orderBy(desc(jobs.createdAt), desc(jobs.id));
  return rows.map(toSummary);
}

export async function photosOf(db: Executor, jobId: string) {
  return db.select().from(jobPhotos).where(eq(jobPhotos.jobId, jobId)).orderBy(asc(jobPhotos.position), asc(jobPhotos.createdAt));
}

export type JobPlace = { postalCode: string | null; country: string; region: string; latitude: number | null; longitude: number | null };

/**
 * Where a builder is, as their own jobs say (drafts and closed jobs too, whatever their status): the latest job whose
 * postal code gave a place, and the latest job of all (for its region when none did). Both null without a job.
 */
export async function builderPlace(db: Executor, builderId: string): Promise<{ placed: JobPlace | null; latest: JobPlace | null }> {
  const columns = { postalCode: jobs.postalCode, country: jobs.country, region: jobs.region, latitude: jobs.latitude, longitude: jobs.longitude };
  const latest = (placedOnly: boolean) =>
    db
      .select(columns)
      .from(jobs)
      .where(placedOnly ? and(eq(jobs.builderId, builderId), sql`${jobs.latitude} IS NOT NULL`) : eq(jobs.builderId, builderId))
      .orderBy(desc(jobs.createdAt), desc(jobs.id))
      .limit(1);
  const [[placed], [last]] = await Promise.all([latest(true), latest(false)]);
  return { placed: placed ?? null, latest: last ?? null };
}
