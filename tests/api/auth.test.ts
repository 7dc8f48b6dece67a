import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailOutbox, users } from '../../server/db/schema';
import { createUser, TEST_PASSWORD, uniqueEmail } from '../factories';
import { agentFor, setupTestApp, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

const sessionCookie = (res: supertest.Response) =>
  ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('tm.sid='));

describe('sign-up', () => {
  it('when a builder signs up, then the account exists, they are signed in, and a verification mail is queued', async () => {
    const client = await agentFor(ctx.app);
    const email = uniqueEmail('new-builder');
    const res = await client.post('/api/auth/signup', {
      displayName: 'Rhea Cobbold',
      email,
      password: 'a long enough password',
      role: 'builder',
      acceptTerms: true,
    });
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({ email, role: 'builder', emailVerified: false, hasPassword: true });

    const me = await client.get('/api/auth/me').expect(200);
    expect(me.body.user.email).toBe(email);

    const [row] = await ctx.db.select().from(users).where(eq(users.email, email));
    expect(row.passwordHash).toMatch(/^\$argon2id\$/);
    const mails = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, email));
    expect(mails).toHaveLength(1);
    expect(mails[0].template).toBe('verify_email');
    expect(mails[0].textBody).toContain('/verify-email?token=');
  });

  it('when the e-mail is already taken (in any letter case), then 409 with a message beside the field', async () => {
    const existing = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/signup', {
      displayName: 'Someone Else',
      email: existing.email.toUpperCase(),
      password: 'another long password',
      role: 'shop',
      acceptTerms: true,
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('email_taken');
    expect(res.body.error.fields.email).toMatch(/already exists/);
  });

  it('when fields are missing or wrong, then 400 with a message per field', async () => {
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/signup', { email: 'not-an-address', password: 'short', role: 'admin' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['acceptTerms', 'displayName', 'email', 'password', 'role']);
    expect(res.body.error.fields.password).toBe('Use at least 10 characters.');
  });

  it('when someone asks to sign up as admin, then it is refused', async () => {
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/signup', {
      displayName: 'Sneaky',
      email: uniqueEmail(),
      password: 'a long enough password',
      role: 'admin',
      acceptTerms: true,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.role).toBeDefined();
  });
});

describe('sign-in and sign-out', () => {
  it('when the password is right, then the session id changes and /me answers; after sign-out /me is 401', async () => {
    const user = await createUser(ctx.db, { role: 'shop' });
    const client = await agentFor(ctx.app);
    const before = await client.get('/api/auth/csrf');
    const cookieBefore = sessionCookie(before) ?? '';

    const res = await client.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ id: user.id, role: 'shop' });
    const cookieAfter = sessionCookie(res);
    expect(cookieAfter).toBeDefined();
    expect(cookieAfter!.split(';')[0]).not.toBe(cookieBefore.split(';')[0]);
    expect(cookieAfter).toMatch(/HttpOnly/);
    expect(cookieAfter).toMatch(/SameSite=Lax/);

    await client.get('/api/auth/me').expect(200);
    const out = await client.post('/api/auth/logout');
    expect(out.status).toBe(204);
    await client.get('/api/auth/me').expect(401);
  });

  it('when the session is destroyed at sign-out, then the old cookie no longer works', async () => {
    const user = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    const cookie = sessionCookie(res)!.split(';')[0];
    await client.post('/api/auth/logout');
    const replay = await supertest(ctx.app).get('/api/auth/me').set('Cookie', cookie);
    expect(replay.status).toBe(401);
  });

  it('when the password is wrong, then 401 with a clear message that does not say which part was wrong', async () => {
    const user = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/login', { email: user.email, password: 'not the password' });
    expect(res.status).toBe(401);
    expect(res.body.error).toEqual({ code: 'wrong_credentials', message: 'That e-mail and password do not match an account.' });
    const unknown = await client.post('/api/auth/login', { email: uniqueEmail(), password: 'not the password' });
    expect(unknown.status).toBe(401);
    expect(unknown.body.error.message).toBe(res.body.error.message);
  });

  it('when sign-in fails rapidly, then the eleventh try gets 429 even with the right password', async () => {
    const user = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    for (let i = 0; i < ctx.config.rateLimits.signInMax; i += 1) {
      const res = await client.post('/api/auth/login', { email: user.email, password: `wrong ${i}` });
      expect(res.status).toBe(401);
    }
    const blocked = await client.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('too_many_attempts');
    expect(blocked.headers['ratelimit-policy']).toBeDefined();
  });

  it('when a suspended user tries to sign in, then 403 and no session', async () => {
    const user = await createUser(ctx.db, { status: 'suspended' });
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    await client.get('/api/auth/me').expect(401);
  });

  it('when signed out, then /me answers 401 in the error shape', async () => {
    const res = await supertest(ctx.app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('when the browser asks who is signed in, then /session answers 200 with the person, and 200 with null once signed out', async () => {
    const anonymous = await supertest(ctx.app).get('/api/auth/session').expect(200);
    expect(anonymous.body).toEqual({ user: null });

    const user = await createUser(ctx.db, { role: 'shop' });
    const client = await agentFor(ctx.app);
    await client.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    const signedIn = await client.get('/api/auth/session').expect(200);
    expect(signedIn.body.user).toMatchObject({ id: user.id, email: user.email, role: 'shop' });
    const me = await client.get('/api/auth/me').expect(200);
    expect(signedIn.body).toEqual(me.body);

    await client.post('/api/auth/logout');
    expect((await client.get('/api/auth/session').expect(200)).body).toEqual({ user: null });
  });
});

describe('sessions and CSRF', () => {
  it('when the server restarts, then a signed-in session still works', async () => {
    const user = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    const cookie = sessionCookie(res)!.split(';')[0];

    // A new app instance with its own connection pool: nothing shared in memory.
    const restarted = ctx.newApp();
    const me = await supertest(restarted.app).get('/api/auth/me').set('Cookie', cookie);
    expect(me.status).toBe(200);
    expect(me.body.user.id).toBe(user.id);
  });

  it('when a signed-in person keeps reading, then the session row is rewritten at most hourly, yet its expiry still slides', async () => {
    const user = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    const sid = decodeURIComponent(sessionCookie(res)!.split(';')[0].slice('tm.sid='.length)).slice(2).split('.')[0];
    const read = async () => (await ctx.pool.query('SELECT expire, sess FROM sessions WHERE sid = $1', [sid])).rows[0] as { expire: Date; sess: { touchedAt: number } };

    const first = await read();
    await client.get('/api/auth/me').expect(200);
    await client.get('/api/auth/me').expect(200);
    expect(await read()).toEqual(first);

    // Two hours on, the next request pushes the expiry forward.
    const old = new Date(first.expire.getTime() - 2 * 3_600_000);
    await ctx.pool.query(
      `UPDATE sessions SET expire = $2, sess = jsonb_set(sess::jsonb, '{touchedAt}', to_jsonb($3::bigint))::json WHERE sid = $1`,
      [sid, old, first.sess.touchedAt - 2 * 3_600_000],
    );
    await client.get('/api/auth/me').expect(200);
    const after = await read();
    expect(after.expire.getTime()).toBeGreaterThan(old.getTime() + 3_600_000);
    expect(after.sess.touchedAt).toBeGreaterThan(first.sess.touchedAt - 1);
  });

  it('when a state-changing request has no CSRF token, then 403 and nothing changes', async () => {
    const email = uniqueEmail();
    const client = await agentFor(ctx.app);
    const res = await client.agent
      .post('/api/auth/signup')
      .send({ displayName: 'No Token', email, password: 'a long enough password', role: 'builder', acceptTerms: true });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_failed');
    const rows = await ctx.db.select().from(users).where(eq(users.email, email));
    expect(rows).toHaveLength(0);
  });

  it('when the CSRF token belongs to another session, then 403', async () => {
    const a = await agentFor(ctx.app);
    const b = await agentFor(ctx.app);
    const res = await b.agent.post('/api/auth/logout').set('X-CSRF-Token', a.token).send({});
    expect(res.status).toBe(403);
  });

  it('when the body is not JSON, then 400 malformed_body, not 500', async () => {
    const client = await agentFor(ctx.app);
    const res = await client.agent
      .post('/api/auth/login')
      .set('X-CSRF-Token', client.token)
      .set('Content-Type', 'application/json')
      .send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('malformed_body');
  });

  it('when an unknown API path is asked for, then 404 in the error shape with a request id header', async () => {
    const res = await supertest(ctx.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(res.headers['x-request-id']).toMatch(/^[\w-]{8,}$/);
  });
});
