import { timestamp } from 'drizzle-orm/pg-core';

/**
 * createdAt and updatedAt for tables whose rows change. Drizzle sets updatedAt on
 * every update it builds (`$onUpdate`), so callers never set it by hand; raw SQL
 * updates are not reached and must set it themselves.
 */
export const timestamps = {
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp({ withTimezone: true })
    .notNull()
    .defaultNow()
    .$onUpdate(() => new Date()),
};
