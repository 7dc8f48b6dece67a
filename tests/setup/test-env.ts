import { randomBytes } from 'node:crypto';
import { rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { inject } from 'vitest';
import { createApp, type App } from '../../server/app';
import { createDb, createPool, type Database } from '../../server/db/client';
import { loadConfig, type AppConfig } from '../../server/env';
import { createLogger } from '../../server/lib/logger';
import { storageSettings } from './storage';

const adminUrl = () => `postgres://postgres@127.0.0.1:${inject('pgPort')}/postgres`;

/** A fresh database for one test file, copied from the migrated template. */
export async function createTestDatabase(): Promise<{ url: string; drop: () => Promise<void> }> {
  const name = `t_${randomBytes(6).toString('hex')}`;
  const client = new pg.Client({ connectionString: adminUrl() });
  await client.connect();
  try {
    for (let attempt = 0; ; attempt += 1) {
      try {
        await client.query(`CREATE DATABASE ${name} TEMPLATE ${inject('templateDatabase')}`);
        break;
      } catch (error) {
        // Two files copying the template at the same instant: wait and try again.
        if (attempt > 20 || !/being accessed by other users/.test(String(error))) throw error;
        await new Promise((r) => setTimeout(r, 100 + Math.random() * 200));
      }
    }
  } finally {
    await client.end();
  }
  const url = `postgres://postgres@127.0.0.1:${inject('pgPort')}/${name}`;
  return {
    url,
    drop: async () => {
      const admin = new pg.Client({ connectionString: adminUrl() });
      await admin.connect();
      await admin.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`).finally(() => admin.end());
    },
  };
}

/** The app's settings for tests, as the environment would give them; photos on the storage under test (tests/setup/storage.ts). */
export function testEnv(databaseUrl: string, overrides: Record<string, string> = {}): Record<string, string> {
  return {
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    LOG_LEVEL: 'silent',
    SESSION_SECRET: 'test-session-secret-0123456789',
    APP_URL: 'http://localhost:5999',
    UPLOADS_DIR: join(tmpdir(), `tenthmark-uploads-${randomBytes(6).toString('hex')}`),
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(inject('smtpPort')),
    GITHUB_STAND_IN_URL: inject('githubStandInUrl'),
    // Every test shares 127.0.0.1; the sign-in limit stays at its real value.
    RATE_LIMIT_SIGNUP_MAX: '1000',
    RATE_LIMIT_RESET_PER_ADDRESS: '1000',
    ...storageSettings(inject('s3Endpoint')),
    ...overrides,
  };
}

/** The app's configuration for tests (testEnv), built through the same loader as production. */
export const testConfig = (databaseUrl: string, overrides: Record<string, string> = {}): AppConfig => loadConfig(testEnv(databaseUrl, overrides));

export interface TestContext {
  config: AppConfig;
  db: Database;
  pool: pg.Pool;
  app: App;
  /** Builds another app instance on the same database (a restart, or a second instance). */
  newApp: () => { app: App; pool: pg.Pool };
  close: () => Promise<void>;
}

/** A database of its own plus an app on it, for one test file. */
export async function setupTestApp(overrides: Record<string, string> = {}): Promise<TestContext> {
  const database = await createTestDatabase();
  const config = testConfig(database.url, overrides);
  const pools: pg.Pool[] = [];
  const apps: App[] = [];
  const newApp = () => {
    const pool = createPool(database.url, 5);
    pools.push(pool);
    const app = createApp({ config, db: createDb(pool), pool, logger: createLogger(config) });
    apps.push(app);
    return { app, pool };
  };
  const first = newApp();
  return {
    config,
    db: createDb(first.pool),
    pool: first.pool,
    app: first.app,
    newApp,
    close: async () => {
      for (const app of apps) app.sessionStore.close();
      await Promise.all(apps.map((app) => app.storage.close()));
      await Promise.all(pools.map((pool) => pool.end().catch(() => {})));
      await database.drop();
      rmSync(config.uploadsDir, { recursive: true, force: true });
    },
  };
}

export { agentFor, signedIn, type ApiClient } from './api-session';
