/**
 * Limits an address header cannot reset, and reset links that stop working
 * once the password has changed. The app trusts no proxy unless TRUST_PROXY
 * names one, so a forged X-Forwarded-For gives a client no new address; the
 * per-account limits count the account whatever the address.
 */
import { and, asc, eq } from 'drizzle-orm';
import { rmSync } from 'node:fs';
import type pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp, type App } from '../../server/app';
import { createDb, createPool } from '../../server/db/client';
import { mailOutbox } from '../../server/db/schema';
import { loadConfig } from '../../server/env';
import { createLogger } from '../../server/lib/logger';
import { createUser, TEST_PASSWORD, uniqueEmail } from '../factories';
import { agentFor, setupTestApp, testConfig, type TestContext } from '../setup/test-env';

let ctx: TestContext;
const extras: Array<{ app: App; pool: pg.Pool; uploadsDir: string }> = [];

beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  for (const extra of extras) {
    extra.app.sessionStore.close();
    await extra.pool.end().catch(() => {});
    rmSync(extra.uploadsDir, { recursive: true, force: true });
  }
  await ctx?.close();
});

/** Another app on this file's database with other settings (rate-limit counters are shared through it). */
function appWith(overrides: Record<string, string>): App {
  const config = testConfig(ctx.config.databaseUrl, overrides);
  const pool = createPool(config.databaseUrl, 2);
  const app = createApp({ config, db: createDb(pool), pool, logger: createLogger(config) });
  extras.push({ app, pool, uploadsDir: config.uploadsDir });
  return app;
}

/** A POST with the agent's CSRF token, claiming to come through a proxy for `forwardedFor`. */
async function postFrom(client: Awaited<ReturnType<typeof agentFor>>, path: string, forwardedFor: string, body: object) {
  return client.agent.post(path).set('X-CSRF-Token', client.token).set('X-Forwarded-For', forwardedFor).send(body);
}

let counter = 0;
/** A different documentation address (198.18.0.0/15) each call. */
const nextAddress = () => {
  counter += 1;
  return `198.18.${Math.floor(counter / 250)}.${(counter % 250) + 1}`;
};

describe('TRUST_PROXY', () => {
  it('when unset, then no proxy is trusted; otherwise it takes hops, addresses, subnets and named ranges', () => {
    const base = { DATABASE_URL: 'postgres://nobody@127.0.0.1:1/none' };
    expect(loadConfig(base).trustProxy).toBe(false);
    expect(loadConfig({ ...base, TRUST_PROXY: 'false' }).trustProxy).toBe(false);
    expect(loadConfig({ ...base, TRUST_PROXY: '2' }).trustProxy).toBe(2);
    expect(loadConfig({ ...base, TRUST_PROXY: 'loopback, 10.0.0.0/8,fd00::1' }).trustProxy).toEqual(['loopback', '10.0.0.0/8', 'fd00::1']);
    expect(() => loadConfig({ ...base, TRUST_PROXY: 'loopback,proxy.example.test' })).toThrow(/TRUST_PROXY/);
    expect(() => loadConfig({ ...base, TRUST_PROXY: '10.0.0.0/33' })).toThrow(/TRUST_PROXY/);
  });

  it('when it names loopback, then each forwarded address has its own per-address limit; by default the header is ignored', async () => {
    const trusting = appWith({ TRUST_PROXY: 'loopback', RATE_LIMIT_SIGNUP_MAX: '2' });
    const [a, b] = [nextAddress(), nextAddress()];
    const signUp = async (app: App, from: string) =>
      postFrom(await agentFor(app), '/api/auth/signup', from, { displayName: 'Proxy Tester', email: uniqueEmail('proxy'), password: 'long enough password', role: 'builder', acceptTerms: true });
    expect((await signUp(trusting, a)).status).toBe(201);
    expect((await signUp(trusting, a)).status).toBe(201);
    expect((await signUp(trusting, a)).status).toBe(429);
    expect((await signUp(trusting, b)).status).toBe(201);

    // Trusting no proxy, every request is the loopback address it really came from.
    const plain = appWith({ RATE_LIMIT_SIGNUP_MAX: '2' });
    expect((await signUp(plain, nextAddress())).status).toBe(201);
    expect((await signUp(plain, nextAddress())).status).toBe(201);
    const third = await signUp(plain, nextAddress());
    expect(third.status).toBe(429);
    expect(third.body.error.code).toBe('too_many_attempts');
  });
});

describe('sign-in limit per account', () => {
  it.each<{ label: string; overrides: Record<string, string> }>([
    { label: 'no proxy trusted (the default)', overrides: {} },
    { label: 'loopback trusted as a proxy', overrides: { TRUST_PROXY: 'loopback' } },
  ])('when failed sign-ins rotate X-Forwarded-For ($label), then the account limit still answers 429 with Retry-After', async ({ overrides }) => {
    const app = appWith(overrides);
    const user = await createUser(ctx.db);
    const client = await agentFor(app);
    for (let i = 0; i < ctx.config.rateLimits.signInMax; i += 1) {
      const res = await postFrom(client, '/api/auth/login', nextAddress(), { email: user.email, password: 'not the password' });
      expect(res.status, `attempt ${i + 1}`).toBe(401);
    }
    // Even the right password waits now, from any address, with the e-mail written differently.
    const blocked = await postFrom(client, '/api/auth/login', nextAddress(), { email: ` ${user.email.toUpperCase()} `, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body).toEqual({ error: { code: 'too_many_attempts', message: expect.any(String) } });
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
  });
});

/** The tokens of every reset mail queued for an address, oldest first. */
async function resetTokens(to: string) {
  const mails = await ctx.db
    .select()
    .from(mailOutbox)
    .where(and(eq(mailOutbox.toAddress, to), eq(mailOutbox.template, 'reset_password')))
    .orderBy(asc(mailOutbox.createdAt), asc(mailOutbox.id));
  return mails.map((mail) => /token=([A-Za-z0-9_-]+)/.exec(mail.textBody)![1]);
}

describe('reset links', () => {
  it('when two links were sent and the newer one is used, then the older one no longer works', async () => {
    const user = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    expect((await client.post('/api/auth/password-reset/request', { email: user.email })).status).toBe(202);
    expect((await client.post('/api/auth/password-reset/request', { email: user.email })).status).toBe(202);
    const [older, newer] = await resetTokens(user.email);
    expect(older).toBeDefined();
    expect(newer).toBeDefined();

    expect((await client.post('/api/auth/password-reset/confirm', { token: newer, password: 'the newest password' })).status).toBe(200);
    const stale = await client.post('/api/auth/password-reset/confirm', { token: older, password: 'an attacker password' });
    expect(stale.status).toBe(400);
    expect(stale.body.error).toMatchObject({ code: 'link_expired', fields: { token: expect.any(String) } });
    expect((await client.post('/api/auth/login', { email: user.email, password: 'the newest password' })).status).toBe(200);
  });

  it('when reset requests for one account come from many addresses, then the sixth is refused', async () => {
    const app = appWith({ TRUST_PROXY: 'loopback' });
    const user = await createUser(ctx.db);
    const client = await agentFor(app);
    for (let i = 0; i < 5; i += 1) {
      expect((await postFrom(client, '/api/auth/password-reset/request', nextAddress(), { email: user.email })).status).toBe(202);
    }
    const blocked = await postFrom(client, '/api/auth/password-reset/request', nextAddress(), { email: user.email });
    expect(blocked.status).toBe(429);
  });

  it('when one address asks for resets of many accounts, then the per-address limit answers 429 with Retry-After', async () => {
    const app = appWith({ TRUST_PROXY: 'loopback', RATE_LIMIT_RESET_PER_ADDRESS: '3' });
    const from = nextAddress();
    const client = await agentFor(app);
    for (let i = 0; i < 3; i += 1) {
      expect((await postFrom(client, '/api/auth/password-reset/request', from, { email: uniqueEmail('reset') })).status).toBe(202);
    }
    const blocked = await postFrom(client, '/api/auth/password-reset/request', from, { email: uniqueEmail('reset') });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('too_many_attempts');
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    // Another address is counted on its own.
    expect((await postFrom(client, '/api/auth/password-reset/request', nextAddress(), { email: uniqueEmail('reset') })).status).toBe(202);
  });
});
