import { sql, type AnyColumn, type SQL } from 'drizzle-orm';
import { METRES_PER, type DistanceUnit } from '../../shared/distance';
import type { Executor } from './client';
import type { Coordinates } from '../lib/postal-codes';

/**
 * Great-circle distances in PostgreSQL with the cube and earthdistance extensions
 * (migration 0014). earthdistance takes the earth as a sphere of radius 6,378,168 m;
 * a distance from it is within about 0.5 % of the ellipsoidal one.
 *
 * A place is written `ll_to_earth(latitude, longitude)` exactly as the GiST indexes
 * jobs_open_earth_idx and shops_earth_idx are, so "within" can read them.
 */

/** The point of a row's place columns (null when they are). */
export const earthOf = (latitude: AnyColumn, longitude: AnyColumn): SQL => sql`ll_to_earth(${latitude}, ${longitude})`;

/** The point of known coordinates. */
export const earthAt = (at: Coordinates): SQL => sql`ll_to_earth(${at.latitude}::float8, ${at.longitude}::float8)`;

/** Metres between two points along the sphere (null when either is). */
export const metresBetween = (a: SQL, b: SQL): SQL<number | null> => sql<number | null>`earth_distance(${a}, ${b})`;

/** The same in miles or kilometres. */
export const distanceIn = (unit: DistanceUnit, a: SQL, b: SQL): SQL<number | null> => sql<number | null>`(earth_distance(${a}, ${b}) / ${METRES_PER[unit]}::float8)`;

/**
 * Places no further than `metres` from `origin`: the cube around the origin first
 * (earth_box, which the GiST index answers), then the exact distance, since the box's
 * corners reach further than the radius.
 */
export const withinMetres = (origin: SQL, place: SQL, metres: number): SQL =>
  sql`(earth_box(${origin}, ${metres}::float8) @> ${place} AND earth_distance(${origin}, ${place}) <= ${metres}::float8)`;

/** The coordinates of a row's place columns, or null when its postal code gave none. */
export const placeAt = (row: { latitude: number | null; longitude: number | null }): Coordinates | null =>
  row.latitude === null || row.longitude === null ? null : { latitude: row.latitude, longitude: row.longitude };

/** The distance between two known places, measured by PostgreSQL as everywhere else; null when either is unknown. */
export async function distanceBetween(db: Executor, unit: DistanceUnit, a: Coordinates | null, b: Coordinates | null): Promise<number | null> {
  if (!a || !b) return null;
  const { rows } = await db.execute<{ distance: number }>(sql`SELECT ${distanceIn(unit, earthAt(a), earthAt(b))} AS distance`);
  return Number(rows[0].distance);
}
