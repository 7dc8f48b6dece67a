/**
 * What the benches share to start the app: a throwaway PostgreSQL cluster, a
 * migrated `bench` database in it, and the app's configuration for a run
 * (production mode, no logging, the limits a bench must raise).
 */
import { runMigrations } from '../../server/db/client';
import { ensureCluster, ensureDatabase, type Cluster } from '../../server/dev/postgres';
import { loadConfig } from '../../server/env';
import { freePort } from '../setup/ports';

/** A throwaway cluster with its data in `dir`, on a free port; the caller stops it. */
export const benchCluster = async (dir: string): Promise<Cluster> => ensureCluster({ dir, port: await freePort(), throwaway: true });

/** Creates the `bench` database in `cluster` and runs the migrations; resolves to its URL. */
export async function migratedBenchDatabase(cluster: Cluster): Promise<string> {
  await ensureDatabase(cluster, 'bench');
  const url = cluster.url('bench');
  await runMigrations(url);
  return url;
}

/** The app's environment on `url` for a bench: production mode, silent, any free port; `limits` raises rate limits. */
export function benchEnv(url: string, limits: Record<string, string> = {}): Record<string, string> {
  return {
    NODE_ENV: 'production',
    LOG_LEVEL: 'silent',
    DATABASE_URL: url,
    PORT: '0',
    SESSION_SECRET: 'bench-session-secret-123456',
    ...limits,
  };
}

/** The app's configuration for a bench (see benchEnv). */
export const benchConfig = (url: string, limits: Record<string, string> = {}) => loadConfig(benchEnv(url, limits));
