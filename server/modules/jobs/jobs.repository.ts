import { and, arrayContains, asc, desc, eq, lte, sql, type SQL } from 'drizzle-orm';
import type { BoardQuery, JobInput, JobSummary } from '../../../shared/schemas/jobs';
import type { Executor } from '../../db/client';
import { jobPhotos, jobs } from '../../db/schema';

export type JobRow = typeof jobs.$inferSelect;

export const photoUrl = (jobId: string, photoId: string, size: 'thumb' | 'large') => `/api/jobs/${jobId}/photos/${photoId}/${size}`;

/** Filterable columns taken from the specification. */
export function columnsFromInput(input: JobInput) {
  return {
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
  const [row] = await db.insert(jobs).values({ builderId, ...columnsFromInput(input) }).returning();
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
};

type SummaryRow = { [K in keyof typeof summaryColumns]: unknown } & { firstPhotoId: string | null };

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
  };
}

/** The filters of the job board as SQL; every one works on open jobs only. */
export function boardWhere(query: BoardQuery): SQL {
  const filters: SQL[] = [eq(jobs.status, 'open')];
  if (query.operation) filters.push(arrayContains(jobs.operations, [query.operation]));
  if (query.material) filters.push(eq(jobs.blockMaterial, query.material));
  if (query.cylinders) filters.push(eq(jobs.cylinders, query.cylinders));
  if (query.country) filters.push(sql`lower(${jobs.country}) = lower(${query.country})`);
  if (query.region) filters.push(sql`lower(${jobs.region}) = lower(${query.region})`);
  if (query.logistics) filters.push(eq(jobs.logistics, query.logistics));
  if (query.neededBefore) filters.push(lte(jobs.neededBy, query.neededBefore));
  return and(...filters)!;
}

const boardOrder = {
  newest: [desc(jobs.publishedAt), desc(jobs.id)],
  'needed-soonest': [asc(jobs.neededBy), asc(jobs.id)],
  'fewest-bids': [asc(jobs.bidCount), desc(jobs.publishedAt), desc(jobs.id)],
} as const;

/** The board's page query (exposed so a test can EXPLAIN exactly what runs). */
export function boardRowsQuery(db: Executor, query: BoardQuery) {
  return db
    .select(summaryColumns)
    .from(jobs)
    .where(boardWhere(query))
    .orderBy(...boardOrder[query.sort])
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
}

/** One page of the board and the total: two statements whatever the page size. */
export async function boardPage(db: Executor, query: BoardQuery) {
  const [rows, [{ total }]] = await Promise.all([
    boardRowsQuery(db, query),
    db.select({ total: sql<number>`count(*)::int` }).from(jobs).where(boardWhere(query)),
  ]);
  return { jobs: rows.map(toSummary), total, page: query.page, pageSize: query.pageSize, sort: query.sort };
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
