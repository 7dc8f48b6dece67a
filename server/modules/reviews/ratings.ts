import { inArray, sql } from 'drizzle-orm';
import type { RatingSummary } from '../../../shared/schemas/reviews';
import type { Executor } from '../../db/client';
import { reviews, shops } from '../../db/schema';

/** Each shop's rating from the builders' reviews of it, in one query; shops without reviews are absent. */
export async function shopRatings(db: Executor, shopIds: string[]): Promise<Map<string, RatingSummary>> {
  if (shopIds.length === 0) return new Map();
  const rows = await db
    .select({
      shopId: shops.id,
      average: sql<number>`round(avg(${reviews.rating}), 2)::float8`,
      count: sql<number>`count(*)::int`,
    })
    .from(shops)
    .innerJoin(reviews, sql`${reviews.subjectId} = ${shops.userId} AND ${reviews.authorSide} = 'builder'`)
    .where(inArray(shops.id, [...new Set(shopIds)]))
    .groupBy(shops.id);
  return new Map(rows.map((r) => [r.shopId, { average: Number(r.average), count: r.count }]));
}

/** A builder's rating from the shops' reviews of them. */
export async function builderRating(db: Executor, userId: string): Promise<RatingSummary | null> {
  const [row] = await db
    .select({ average: sql<number | null>`round(avg(${reviews.rating}), 2)::float8`, count: sql<number>`count(*)::int` })
    .from(reviews)
    .where(sql`${reviews.subjectId} = ${userId} AND ${reviews.authorSide} = 'shop'`);
  return row.count > 0 ? { average: Number(row.average), count: row.count } : null;
}
