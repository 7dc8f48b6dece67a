import { and, arrayContains, asc, eq, ilike, inArray, or, sql, type SQL } from 'drizzle-orm';
import type { PublicShop, ShopDirectoryQuery, ShopProfileInput } from '../../../shared/schemas/shops';
import type { ShopStanding } from '../../../shared/schemas/standing';
import type { Executor } from '../../db/client';
import { shopRates, shops, users } from '../../db/schema';
import { shopRatings } from '../reviews/ratings';
import { METRES_PER } from '../../../shared/distance';
import { distanceIn, earthAt, earthOf, withinMetres } from '../../db/earth';
import { badRequest } from '../../lib/errors';
import { locateAnyPostalCode, placeOf } from '../../lib/postal-codes';
import { shopStandings } from '../standing/standing.repository';

export type ShopRow = typeof shops.$inferSelect;

export async function findShopByUser(db: Executor, userId: string): Promise<ShopRow | undefined> {
  const [row] = await db.select().from(shops).where(eq(shops.userId, userId));
  return row;
}

export async function findShopById(db: Executor, id: string): Promise<ShopRow | undefined> {
  const [row] = await db.select().from(shops).where(eq(shops.id, id));
  return row;
}

/**
 * A shop shows to the public (the directory, its page, the bidder lists of
 * jobs) only while its owner's account is active: a suspended shop disappears.
 */
export const shopIsListed = sql`EXISTS (SELECT 1 FROM ${users} WHERE ${users.id} = ${shops.userId} AND ${users.status} = 'active')`;

/** A shop as the public sees it: undefined when there is none, or its account is suspended. */
export async function findListedShopById(db: Executor, id: string): Promise<ShopRow | undefined> {
  const [row] = await db.select().from(shops).where(and(eq(shops.id, id), shopIsListed));
  return row;
}

/** Whether the account behind this shop is suspended. */
export async function shopSuspended(db: Executor, shopId: string): Promise<boolean> {
  const [row] = await db.select({ status: users.status }).from(shops).innerJoin(users, eq(users.id, shops.userId)).where(eq(shops.id, shopId));
  return row?.status === 'suspended';
}

export async function ratesFor(db: Executor, shopIds: string[]) {
  if (shopIds.length === 0) return new Map<string, Array<{ operation: string; priceCents: number }>>();
  const rows = await db.select().from(shopRates).where(inArray(shopRates.shopId, shopIds)).orderBy(asc(shopRates.operation));
  const map = new Map<string, Array<{ operation: string; priceCents: number }>>();
  for (const row of rows) {
    const list = map.get(row.shopId) ?? [];
    list.push({ operation: row.operation, priceCents: row.priceCents });
    map.set(row.shopId, list);
  }
  return map;
}

/** Creates or replaces the shop's profile and rate card in one transaction's worth of statements. */
export async function upsertShop(db: Executor, userId: string, input: ShopProfileInput): Promise<ShopRow> {
  const values = {
    name: input.name,
    country: input.country,
    region: input.region,
    city: input.city,
    ...(await placeOf(input.country, input.postalCode)),
    takesShipped: input.takesShipped,
    capabilities: input.capabilities,
    equipmentNotes: input.equipmentNotes,
    turnaroundDays: input.turnaroundDays,
    notifyMatchingJobs: input.notifyMatchingJobs,
    receivingAddress: input.receivingAddress,
  };
  const [row] = await db
    .insert(shops)
    .values({ userId, ...values })
    .onConflictDoUpdate({ target: shops.userId, set: values })
    .returning();
  await db.delete(shopRates).where(eq(shopRates.shopId, row.id));
  if (input.rateCard.length) {
    await db.insert(shopRates).values(input.rateCard.map((r) => ({ shopId: row.id, operation: r.operation, priceCents: r.priceCents })));
  }
  return row;
}

export function toPublicShop(row: ShopRow, rateCard: Array<{ operation: string; priceCents: number }>, rating: PublicShop['rating'], standing: ShopStanding): PublicShop {
  return {
    id: row.id,
    name: row.name,
    country: row.country,
    region: row.region,
    city: row.city,
    takesShipped: row.takesShipped,
    capabilities: row.capabilities,
    equipmentNotes: row.equipmentNotes,
    turnaroundDays: row.turnaroundDays,
    rateCard,
    verified: row.verifiedAt !== null,
    rating,
    standing,
  };
}

const escapeLike = (value: string) => value.replace(/[\\%_]/g, (c) => `\\${c}`);

export async function searchShops(db: Executor, query: ShopDirectoryQuery) {
  const filters: SQL[] = [shopIsListed];
  if (query.q) {
    const pattern = `%${escapeLike(query.q)}%`;
    filters.push(or(ilike(shops.name, pattern), ilike(shops.city, pattern))!);
  }
  if (query.operation) filters.push(arrayContains(shops.capabilities, [query.operation]));
  if (query.country) filters.push(sql`lower(${shops.country}) = lower(${query.country})`);
  if (query.region) filters.push(sql`lower(${shops.region}) = lower(${query.region})`);
  if (query.takesShipped !== undefined) filters.push(eq(shops.takesShipped, query.takesShipped));
  // Near a postal code: the nearest first (shops whose place is unknown last), within the radius when one is given.
  const near = query.near === undefined ? null : await locateAnyPostalCode(query.near);
  if (query.near !== undefined && !near) throw badRequest('That postal code was not found.', { near: 'Postal code not found.' });
  const unit = query.unit ?? near?.unit ?? 'mi';
  const shopEarth = earthOf(shops.latitude, shops.longitude);
  if (near && query.within !== undefined) filters.push(withinMetres(earthAt(near), shopEarth, query.within * METRES_PER[unit]));
  const distance = near ? distanceIn(unit, earthAt(near), shopEarth) : sql<null>`NULL::float8`;
  const order = near ? [sql`${distance} ASC NULLS LAST`, asc(shops.id)] : [sql`${shops.verifiedAt} IS NULL`, asc(shops.name), asc(shops.id)];
  const where = and(...filters);
  const [rows, [{ total }]] = await Promise.all([
    db
      .select({ shop: shops, distance })
      .from(shops)
      .where(where)
      .orderBy(...order)
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
    db.select({ total: sql<number>`count(*)::int` }).from(shops).where(where),
  ]);
  const ids = rows.map((r) => r.shop.id);
  const [rates, ratings, standings] = await Promise.all([ratesFor(db, ids), shopRatings(db, ids), shopStandings(db, ids)]);
  return {
    shops: rows.map(({ shop, distance }) => ({ ...toPublicShop(shop, rates.get(shop.id) ?? [], ratings.get(shop.id) ?? null, standings.get(shop.id)!), distance })),
    total,
    page: query.page,
    pageSize: query.pageSize,
    distanceFrom: near ? { unit, postalCode: query.near! } : null,
  };
}
