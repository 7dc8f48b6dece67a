import { and, arrayContains, asc, eq, ilike, inArray, or, sql, type SQL } from 'drizzle-orm';
import type { directoryOrigins, PublicShop, ShopDirectoryQuery, ShopProfileInput } from '../../../shared/schemas/shops';
import type { ShopStanding } from '../../../shared/schemas/standing';
import type { Executor } from '../../db/client';
import { shopRates, shops, users } from '../../db/schema';
import { shopRatings } from '../reviews/ratings';
import { METRES_PER, type DistanceUnit } from '../../../shared/distance';
import { distanceIn, earthAt, earthOf, withinMetres } from '../../db/earth';
import { placeOf, type Coordinates } from '../../lib/postal-codes';
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

/**
 * Where the directory measures from (shops.service.ts directoryOrigin): a place to order by distance from, or, when
 * its postal code gave none, a region whose shops come first. `from` says whose place it is.
 */
export type DirectoryOrigin = {
  unit: DistanceUnit;
  postalCode: string | null;
  from: (typeof directoryOrigins)[number];
  at: Coordinates | null;
  region: { country: string; region: string } | null;
};

const inRegion = (region: { country: string; region: string }) =>
  sql`(lower(${shops.country}) = lower(${region.country}) AND lower(${shops.region}) = lower(${region.region}))`;

export async function searchShops(db: Executor, query: ShopDirectoryQuery, origin: DirectoryOrigin | null = null) {
  const filters: SQL[] = [shopIsListed];
  if (query.q) {
    const pattern = `%${escapeLike(query.q)}%`;
    filters.push(or(ilike(shops.name, pattern), ilike(shops.city, pattern))!);
  }
  if (query.operation) filters.push(arrayContains(shops.capabilities, [query.operation]));
  if (query.country) filters.push(sql`lower(${shops.country}) = lower(${query.country})`);
  if (query.region) filters.push(sql`lower(${shops.region}) = lower(${query.region})`);
  if (query.takesShipped !== undefined) filters.push(eq(shops.takesShipped, query.takesShipped));
  // From a place: the nearest first (shops whose place is unknown last), within the radius when one is given.
  // From a region only (a postal code that gave no place): that region's shops first.
  const at = origin?.at ?? null;
  const shopEarth = earthOf(shops.latitude, shops.longitude);
  if (at && query.within !== undefined) filters.push(withinMetres(earthAt(at), shopEarth, query.within * METRES_PER[origin!.unit]));
  const distance = at ? distanceIn(origin!.unit, earthAt(at), shopEarth) : sql<null>`NULL::float8`;
  const byName = [sql`${shops.verifiedAt} IS NULL`, asc(shops.name), asc(shops.id)];
  const order = at ? [sql`${distance} ASC NULLS LAST`, asc(shops.id)] : origin?.region ? [sql`${inRegion(origin.region)} DESC`, ...byName] : byName;
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
    distanceFrom: origin && { unit: origin.unit, postalCode: origin.postalCode, from: origin.from, found: at !== null, region: at ? null : (origin.region?.region ?? null) },
  };
}
