import { randomBytes } from 'node:crypto';
import { rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import supertest from 'supertest';
import { inject } from 'vitest';
import { createApp, type App } from '../../server/app';
import { createDb, createPool, type Database } from '../../server/db/client';
import { loadConfig, type AppConfig } from '../../server/env';
import { createLogger } from '../../server/lib/logger';

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

/** The app's configuration for tests, built through the same loader as production. */
export function testConfig(databaseUrl: string, overrides: Record<string, string> = {}): AppConfig {
  return loadConfig({
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
    ...overrides,
  });
}

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
      await Promise.all(pools.map((pool) => pool.end().catch(() => {})));
      await database.drop();
      rmSync(config.uploadsDir, { recursive: true, force: true });
    },
  };
}

/** A supertest agent that keeps cookies and sends the CSRF token it was given. */
export async function agentFor(app: App) {
  const agent = supertest.agent(app);
  const res = await agent.get('/api/auth/csrf').expect(200);
  let token: string = res.body.csrfToken;
  return {
    agent,
    get token() {
      return token;
    },
    set token(value: string) {
      token = value;
    },
    /** Posts with the current token and keeps the new one when the answer rotates it (sign-in, sign-up). */
    async post(path: string, body: object = {}) {
      const res = await agent.post(path).set('X-CSRF-Token', token).send(body);
      if (typeof res.body?.csrfToken === 'string') token = res.body.csrfToken;
      return res;
    },
    put(path: string, body: object = {}) {
      return agent.put(path).set('X-CSRF-Token', token).send(body);
    },
    get(path: string) {
      return agent.get(path);
    },
  };
}

/** An agent signed in as this person (made by the factories, so the password is known). */
export async function signedIn(app: App, user: { email: string; password: string }) {
  const client = await agentFor(app);
  const res = await client.post('/api/auth/login', { email: user.email, password: user.password });
  if (res.status !== 200) throw new Error(`sign-in failed for ${user.email}: ${res.status} ${JSON.stringify(res.body)}`);
  return client;
}
