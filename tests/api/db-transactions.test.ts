import { sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb, createPool } from '../../server/db/client';
import { createTestDatabase } from '../setup/test-env';

/**
 * A transaction whose BEGIN fails (a pooled connection whose server went away in
 * a database restart, seen under a loaded machine in the faults test) must still
 * give its connection back: otherwise each such failure keeps one connection for
 * ever, and after a few the pool is empty and every request waits.
 */
describe('database transactions', () => {
  const cleanups: Array<() => Promise<unknown>> = [];
  afterAll(async () => {
    for (const cleanup of cleanups.reverse()) await cleanup();
  });

  it('when BEGIN itself fails, then the connection goes back to the pool and the next query runs', async () => {
    const database = await createTestDatabase();
    cleanups.push(database.drop);
    // One connection only: a leaked one leaves nothing for the next query.
    const pool = createPool(database.url, 1);
    cleanups.push(() => pool.end());
    const db = createDb(pool);

    // An isolation level PostgreSQL does not know makes the BEGIN statement fail.
    const badConfig = { isolationLevel: 'not a level' } as unknown as Parameters<typeof db.transaction>[1];
    await expect(db.transaction(async () => 'never', badConfig)).rejects.toThrow();

    expect(pool.totalCount - pool.idleCount).toBe(0);
    const { rows } = await db.execute<{ one: number }>(sql`select 1 as one`);
    expect(rows[0].one).toBe(1);
  });

  it('when the work fails, then it is rolled back and the connection is free again', async () => {
    const database = await createTestDatabase();
    cleanups.push(database.drop);
    const pool = createPool(database.url, 1);
    cleanups.push(() => pool.end());
    const db = createDb(pool);
    await db.execute(sql`create table t (n int)`);
    await expect(
      db.transaction(async (tx) => {
        await tx.execute(sql`insert into t values (1)`);
        throw new Error('the work failed');
      }),
    ).rejects.toThrow('the work failed');
    const { rows } = await db.execute<{ count: string }>(sql`select count(*)::text as count from t`);
    expect(rows[0].count).toBe('0');
    expect(await db.transaction(async (tx) => (await tx.execute<{ two: number }>(sql`select 2 as two`)).rows[0].two)).toBe(2);
  });
});
