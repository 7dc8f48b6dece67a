import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { eq, is, sql, Table } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createDb, createPool, migrationsFolder, runMigrations, type Database } from '../../server/db/client';
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

  it('when three app instances start at once on an empty database, then each migration is applied once', async () => {
    const name = `m_${randomBytes(6).toString('hex')}`;
    const admin = new pg.Client({ connectionString: `postgres://postgres@127.0.0.1:${inject('pgPort')}/postgres` });
    await admin.connect();
    await admin.query(`CREATE DATABASE ${name}`);
    cleanups.push(async () => {
      await admin.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      await admin.end();
    });
    const url = `postgres://postgres@127.0.0.1:${inject('pgPort')}/${name}`;
    await Promise.all([runMigrations(url), runMigrations(url), runMigrations(url)]);
    const journal = JSON.parse(readFileSync(join(migrationsFolder, 'meta', '_journal.json'), 'utf8')) as { entries: unknown[] };
    const applied = new pg.Client({ connectionString: url });
    await applied.connect();
    const { rows } = await applied.query('SELECT hash FROM drizzle.__drizzle_migrations').finally(() => applied.end());
    expect(rows).toHaveLength(journal.entries.length);
    expect(new Set(rows.map((row) => row.hash)).size).toBe(rows.length);
  });
});
