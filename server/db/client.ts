import { sql } from 'drizzle-orm';
import { drizzle, NodePgSession, NodePgTransaction, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import * as schema from './schema';

export type Database = NodePgDatabase<typeof schema> & { $client: pg.Pool };
/** A transaction handle; repositories accept either this or the database. */
export type Tx = Parameters<Parameters<Database['transaction']>[0]>[0];
export type Executor = Database | Tx;

export const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url));

export function createPool(url: string, max = 10): pg.Pool {
  const pool = new pg.Pool({ connectionString: url, max, connectionTimeoutMillis: 5_000, idleTimeoutMillis: 30_000 });
  // An idle client losing its server (database restarted) must not crash the process.
  pool.on('error', () => {});
  // Nor may a client that is checked out for a long time, such as the socket.io adapter's LISTEN
  // connection: pg emits 'error' on it when the server goes away, and an unheard 'error' event ends
  // the process. The failure still reaches whoever uses the client (its queries fail; the adapter
  // sees 'end' and reconnects).
  pool.on('connect', (client) => {
    client.on('error', () => {});
  });
  return pool;
}

export function createDb(pool: pg.Pool): Database {
  const db = drizzle(pool, { schema, casing: 'snake_case' }) as Database;
  releaseOnFailedBegin(db, pool);
  return db;
}

type TransactionConfig = Parameters<Database['transaction']>[1];

/**
 * drizzle's pool transaction sends BEGIN before its try/finally, so when BEGIN
 * itself fails (a pooled connection whose server went away in a restart) the
 * connection is never given back; a few of those and the pool is empty and every
 * request waits for ever. The same steps here with BEGIN inside: the connection
 * always goes back, and one whose BEGIN or ROLLBACK failed is thrown away.
 */
function releaseOnFailedBegin(db: Database, pool: pg.Pool) {
  // drizzle's own session fields (dialect, schema, options) and transaction class; only `transaction` is replaced.
  type Loose = any; // eslint-disable-line @typescript-eslint/no-explicit-any
  const session = (db as unknown as { session: Loose }).session;
  session.transaction = async (run: (tx: Loose) => Promise<unknown>, config?: TransactionConfig) => {
    const client = await pool.connect();
    const tx: Loose = new NodePgTransaction(session.dialect, new NodePgSession(client, session.dialect, session.schema, session.options), session.schema);
    try {
      await tx.execute(sql`begin${config ? sql` ${tx.getTransactionConfigSQL(config)}` : undefined}`);
    } catch (error) {
      client.release(error as Error);
      throw error;
    }
    let broken: Error | undefined;
    try {
      const result = await run(tx);
      await tx.execute(sql`commit`);
      return result;
    } catch (error) {
      await tx.execute(sql`rollback`).catch((rollbackError: Error) => {
        broken = rollbackError;
      });
      throw error;
    } finally {
      client.release(broken);
    }
  };
}

/** The advisory lock key migrations are applied under (any fixed number; this one spells "tenthmig" in hex letters). */
const MIGRATION_LOCK = 0x74656e74686d6967n;

/**
 * Applies pending migrations, once however many app instances start at the same moment: each
 * waits for a PostgreSQL advisory lock held on a connection of its own, so the first applies them
 * and the others then find none pending.
 */
export async function runMigrations(url: string): Promise<void> {
  const lock = new pg.Client({ connectionString: url });
  await lock.connect();
  const pool = createPool(url, 1);
  try {
    await lock.query('SELECT pg_advisory_lock($1)', [MIGRATION_LOCK.toString()]);
    await migrate(createDb(pool), { migrationsFolder });
  } finally {
    await pool.end();
    // Ending the session releases the lock.
    await lock.end();
  }
}

/** Errors that mean the database could not be reached, as opposed to a bad query. */
export function isDatabaseUnavailable(error: unknown): boolean {
  const err = error as { code?: string; message?: string; cause?: unknown } | undefined;
  if (!err || typeof err !== 'object') return false;
  const connectionCodes = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', '57P01', '57P02', '57P03', '08000', '08001', '08003', '08006']);
  if (err.code && connectionCodes.has(err.code)) return true;
  if (typeof err.message === 'string' && /Connection terminated|timeout exceeded when trying to connect|connection timeout/i.test(err.message)) {
    return true;
  }
  return err.cause ? isDatabaseUnavailable(err.cause) : false;
}
