import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { createDb, createPool } from '../../server/db/client';
import { createLogger } from '../../server/lib/logger';
import { createUser, TEST_PASSWORD } from '../factories';
import { freePort } from '../setup/ports';
import { agentFor, setupTestApp, testConfig, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

describe('GET /api/health', () => {
  it('when the database answers, then 200 ok', async () => {
    const res = await supertest(ctx.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok' });
  });

  it('when the database is away, then health is 503 and other routes answer 503 in the error shape', async () => {
    // A port where no PostgreSQL listens: the database is away.
    const url = `postgres://postgres@127.0.0.1:${await freePort()}/nowhere`;
    const config = testConfig(url);
    const pool = createPool(url, 2);
    const app = createApp({ config, db: createDb(pool), pool, logger: createLogger(config) });
    try {
      const health = await supertest(app).get('/api/health');
      expect(health.status).toBe(503);
      expect(health.body).toEqual({ status: 'degraded', db: 'unavailable' });

      // A signed-in visitor's session lives in the database, so their next request needs it.
      const user = await createUser(ctx.db);
      const client = await agentFor(ctx.app);
      const login = await client.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
      const cookie = ([] as string[]).concat(login.headers['set-cookie'])[0].split(';')[0];
      const me = await supertest(app).get('/api/auth/me').set('Cookie', cookie);
      expect(me.status).toBe(503);
      expect(me.headers['retry-after']).toBe('5');
      expect(me.body.error.code).toBe('unavailable');
      expect(JSON.stringify(me.body)).not.toMatch(/ECONNREFUSED|at .*\.ts/);
    } finally {
      app.sessionStore.close();
      await pool.end();
    }
  });
});
