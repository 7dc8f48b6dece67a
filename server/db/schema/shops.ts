import { sql } from 'drizzle-orm';
import { boolean, check, index, integer, jsonb, pgTable, primaryKey, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import { mustReference, placeColumns, timestamps, uuidPrimaryKey } from './columns';
import type { PostalAddress } from '../../../shared/schemas/shipping';
import { users } from './users-and-sessions';

// Machine shops' public profiles and their prices.

/** A machine shop's public profile; one per shop account. */
export const shops = pgTable(
  'shops',
  {
    id: uuidPrimaryKey(),
    userId: mustReference(() => users.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    country: text().notNull(),
    region: text().notNull(),
    city: text().notNull(),
    ...placeColumns(),
    takesShipped: boolean().notNull(),
    capabilities: text().array().notNull(),
    equipmentNotes: text().notNull().default(''),
    turnaroundDays: integer().notNull(),
    notifyMatchingJobs: boolean().notNull().default(false),
    /** Where builders send parts; shown only to the builder of a paid-for `ship` job. */
    receivingAddress: jsonb().$type<PostalAddress>(),
    verifiedAt: timestamp({ withTimezone: true }),
    /** The shop's connected account at the payment provider, and when it became able to receive transfers. */
    payoutAccountId: text(),
    payoutsReadyAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('shops_user_idx').on(t.userId),
    index('shops_capabilities_idx').using('gin', t.capabilities),
    index('shops_region_idx').on(t.country, t.region),
    // "Shops near me" in the directory: earth_box(...) @> ll_to_earth(latitude, longitude) reads this.
    index('shops_earth_idx').using('gist', sql`ll_to_earth(${t.latitude}, ${t.longitude})`),
  ],
);

/** A shop's price per operation, integer cents. */
export const shopRates = pgTable(
  'shop_rates',
  {
    shopId: mustReference(() => shops.id, { onDelete: 'cascade' }),
    operation: text().notNull(),
    priceCents: integer().notNull(),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.operation] }), check('shop_rates_price_check', sql`${t.priceCents} >= 0`)],
);
