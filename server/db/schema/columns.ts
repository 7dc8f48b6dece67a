import { doublePrecision, text, timestamp, uuid, type AnyPgColumn, type UpdateDeleteAction } from 'drizzle-orm/pg-core';

// Column sets more than one table declares. Each helper builds fresh columns, so
// a table spreads or calls it where it would have written the columns out.

/** A random uuid primary key. */
export const uuidPrimaryKey = () => uuid().primaryKey().defaultRandom();

/** A moment stamped by the database when the row is written. */
export const stampedNow = () => timestamp({ withTimezone: true }).notNull().defaultNow();

/** A moment stamped when the row is written and again on every update Drizzle builds. */
export const updatedNow = () => stampedNow().$onUpdate(() => new Date());

/** A uuid that must name a row of another table (`onDelete: 'cascade'` goes with that row). */
export const mustReference = (target: () => AnyPgColumn, actions?: { onDelete?: UpdateDeleteAction }) => uuid().notNull().references(target, actions);

/**
 * createdAt and updatedAt for tables whose rows change. Drizzle sets updatedAt on
 * every update it builds (`$onUpdate`), so callers never set it by hand; raw SQL
 * updates are not reached and must set it themselves.
 */
export const timestamps = {
  createdAt: stampedNow(),
  updatedAt: updatedNow(),
};

/**
 * Where a shop or a job's parts are, for distances: the postal code as given, and the
 * coordinates the postal-code dataset has for it (server/lib/postal-codes.ts), looked up
 * when the row is saved. Null coordinates mean the code was not given or not found:
 * distances then fall back to region.
 */
export const placeColumns = () => ({
  postalCode: text(),
  latitude: doublePrecision(),
  longitude: doublePrecision(),
});
