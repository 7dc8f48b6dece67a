import { and, desc, eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailOutbox, userTokens } from '../../server/db/schema';
import { createUser, TEST_PASSWORD, uniqueEmail } from '../factories';
import { agentFor, setupTestApp, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

/** The single-use token in the newest queued mail to an address, read from the link in its text. */
async function tokenFromLatestMail(to: string, template: string) {
  const [mail] = await ctx.db
    .select()
    .from(mailOutbox)
    .where(and(eq(mailOutbox.toAddress, to), eq(mailOutbox.template, template)))
    .orderBy(desc(mailOutbox.createdAt))
    .limit(1);
  expect(mail, `a ${template} mail to ${to}`).toBeDefined();
  const match = /token=([A-Za-z0-9_-]+)/.exec(mail.textBody);
  expect(match).not.toBeNull();
  expect(mail.htmlBody).toContain(match![1]);
  return match![1];
}

describe('password reset', () => {
  it('when a reset is confirmed, then the new password works, the old one does not, and other sessions end', async () => {
    const user = await createUser(ctx.db);
    const elsewhere = await agentFor(ctx.app);
    await elsewhere.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    await elsewhere.get('/api/auth/me').expect(200);

    const client = await agentFor(ctx.app);
    const asked = await client.post('/api/auth/password-reset/request', { email: user.email });
    expect(asked.status).toBe(202);
    const token = await tokenFromLatestMail(user.email, 'reset_password');

    const done = await client.post('/api/auth/password-reset/confirm', { token, password: 'a brand new password' });
    expect(done.status).toBe(200);

    await elsewhere.get('/api/auth/me').expect(401);
    const old = await client.post('/api/auth/login', { email: user.email, password: TEST_PASSWORD });
    expect(old.status).toBe(401);
    const fresh = await client.post('/api/auth/login', { email: user.email, password: 'a brand new password' });
    expect(fresh.status).toBe(200);
    const changed = await ctx.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, user.email), eq(mailOutbox.template, 'password_changed')));
    expect(changed).toHaveLength(1);
  });

  it('when a reset link is used twice, then the second use is refused', async () => {
    const user = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    await client.post('/api/auth/password-reset/request', { email: user.email });
    const token = await tokenFromLatestMail(user.email, 'reset_password');
    expect((await client.post('/api/auth/password-reset/confirm', { token, password: 'first new password' })).status).toBe(200);
    const again = await client.post('/api/auth/password-reset/confirm', { token, password: 'second new password' });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('link_expired');
  });

  it('when two confirmations of one link race, then exactly one succeeds', async () => {
    const user = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    await client.post('/api/auth/password-reset/request', { email: user.email });
    const token = await tokenFromLatestMail(user.email, 'reset_password');
    const [a, b] = await Promise.all([
      client.post('/api/auth/password-reset/confirm', { token, password: 'racing password one' }),
      client.post('/api/auth/password-reset/confirm', { token, password: 'racing password two' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 400]);
  });

  it('when a reset link has expired, then it is refused', async () => {
    const user = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    await client.post('/api/auth/password-reset/request', { email: user.email });
    const token = await tokenFromLatestMail(user.email, 'reset_password');
    await ctx.db.update(userTokens).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(userTokens.userId, user.id));
    const res = await client.post('/api/auth/password-reset/confirm', { token, password: 'too late password' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.token).toBeDefined();
  });

  it('when the address has no account, then the answer is the same 202 and no mail is queued', async () => {
    const email = uniqueEmail('nobody');
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/password-reset/request', { email });
    expect(res.status).toBe(202);
    expect(await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, email))).toHaveLength(0);
  });
});

describe('e-mail verification', () => {
  it('when the link from the sign-up mail is followed, then the address is confirmed once', async () => {
    const client = await agentFor(ctx.app);
    const email = uniqueEmail('verify');
    await client.post('/api/auth/signup', { displayName: 'Vera Lintwhistle', email, password: 'a long enough password', role: 'shop', acceptTerms: true });
    expect((await client.get('/api/auth/me')).body.user.emailVerified).toBe(false);

    const token = await tokenFromLatestMail(email, 'verify_email');
    const res = await supertest(ctx.app).post('/api/auth/verify-email').set('X-CSRF-Token', 'x').send({ token });
    expect(res.status).toBe(403); // a CSRF token is needed even here

    const ok = await client.post('/api/auth/verify-email', { token });
    expect(ok.status).toBe(200);
    expect((await client.get('/api/auth/me')).body.user.emailVerified).toBe(true);
    expect((await client.post('/api/auth/verify-email', { token })).status).toBe(400);
  });

  it('when a signed-in person asks again, then a new link is queued; once confirmed, asking again is a 409', async () => {
    const client = await agentFor(ctx.app);
    const email = uniqueEmail('resend');
    await client.post('/api/auth/signup', { displayName: 'Otis Farrowby', email, password: 'a long enough password', role: 'builder', acceptTerms: true });
    expect((await client.post('/api/auth/verify-email/resend')).status).toBe(202);
    const mails = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, email));
    expect(mails.filter((m) => m.template === 'verify_email')).toHaveLength(2);
    const token = await tokenFromLatestMail(email, 'verify_email');
    await client.post('/api/auth/verify-email', { token });
    expect((await client.post('/api/auth/verify-email/resend')).status).toBe(409);
  });

  it('when a token is malformed, then 400 with a field message', async () => {
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/auth/verify-email', { token: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.token).toBeDefined();
  });
});
