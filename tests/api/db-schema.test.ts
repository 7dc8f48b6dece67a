import { eq, is, sql, Table } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, createPool, type Database } from '../../server/db/client';
import * as schema from '../../server/db/schema';
import { createTestDatabase } from '../setup/test-env';

/** The schema keeps updated_at itself, and every table is known to the relational query API. */
describe('database schema', () => {
  const cleanups: Array<() => Promise<unknown>> = [];
  let db: Database;
  beforeAll(async () => {
    const database = await createTestDatabase();
    cleanups.push(database.drop);
    const pool = createPool(database.url, 2);
    cleanups.push(() => pool.end());
    db = createDb(pool);
  });
  afterAll(async () => {
    for (const cleanup of cleanups.reverse()) await cleanup();
  });

  const longAgo = new Date('2020-01-01T00:00:00Z');

  it('when a row is updated through Drizzle without naming updatedAt, then updatedAt moves forward', async () => {
    const [user] = await db.insert(schema.users).values({ email: 'stamp@example.test', displayName: 'Stamp', role: 'builder' }).returning();
    // Raw SQL is not reached by the schema's $onUpdate, so this leaves the stamp in the past.
    await db.execute(sql`UPDATE users SET updated_at = ${longAgo.toISOString()}::timestamptz WHERE id = ${user.id}`);

    const before = Date.now();
    const [updated] = await db.update(schema.users).set({ displayName: 'Stamp Two' }).where(eq(schema.users.id, user.id)).returning();

    expect(updated.displayName).toBe('Stamp Two');
    expect(updated.updatedAt.getTime()).toBeGreaterThanOrEqual(before - 1000);
    expect(updated.createdAt.getTime()).toBe(user.createdAt.getTime());
  });

  it('when an upsert hits an existing row, then its updatedAt moves forward too', async () => {
    await db.insert(schema.platformSettings).values({ key: 'stamp_test', value: 1 });
    await db.execute(sql`UPDATE platform_settings SET updated_at = ${longAgo.toISOString()}::timestamptz WHERE key = 'stamp_test'`);

    const before = Date.now();
    await db
      .insert(schema.platformSettings)
      .values({ key: 'stamp_test', value: 2 })
      .onConflictDoUpdate({ target: schema.platformSettings.key, set: { value: 2 } });

    const [row] = await db.select().from(schema.platformSettings).where(eq(schema.platformSettings.key, 'stamp_test'));
    expect(row.value).toBe(2);
    expect(row.updatedAt.getTime()).toBeGreaterThanOrEqual(before - 1000);
  });

  it('every table in the schema can be read with the relational query API', async () => {
    const tableNames = Object.entries(schema)
      .filter(([, value]) => is(value, Table))
      .map(([name]) => name)
      .sort();
    expect(tableNames.length).toBeGreaterThan(25);
    expect(Object.keys(db.query).sort()).toEqual(tableNames);
    expect(await db.query.adminActions.findMany({ limit: 1 })).toEqual([]);
  });
});
