import { and, eq } from 'drizzle-orm';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mailOutbox } from '../../server/db/schema';
import { createUser, uniqueEmail } from '../factories';
import { agentFor, setupTestApp, signedIn, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

async function signedInAs(role: 'builder' | 'shop' | 'admin') {
  const user = await createUser(ctx.db, { role });
  return { user, client: await signedIn(ctx.app, user) };
}

describe('role guard on the admin routes', () => {
  it('when signed out, then 401', async () => {
    const res = await supertest(ctx.app).get('/api/admin/users');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it.each(['builder', 'shop'] as const)('when a %s asks, then 403 and nothing is created', async (role) => {
    const { client } = await signedInAs(role);
    expect((await client.get('/api/admin/users')).status).toBe(403);
    const email = uniqueEmail('would-be-admin');
    const res = await client.post('/api/admin/admins', { displayName: 'Would Be', email });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect(await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, email))).toHaveLength(0);
  });

  it('when an admin makes another admin, then the new admin gets a link to choose a password and can then sign in', async () => {
    const { client } = await signedInAs('admin');
    const email = uniqueEmail('new-admin');
    const res = await client.post('/api/admin/admins', { displayName: 'Nell Sparrowgate', email });
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({ role: 'admin', hasPassword: false });

    const [mail] = await ctx.db
      .select()
      .from(mailOutbox)
      .where(and(eq(mailOutbox.toAddress, email), eq(mailOutbox.template, 'admin_invite')));
    const token = /token=([A-Za-z0-9_-]+)/.exec(mail.textBody)![1];
    const newcomer = await agentFor(ctx.app);
    expect((await newcomer.post('/api/auth/password-reset/confirm', { token, password: 'staff password here' })).status).toBe(200);
    const login = await newcomer.post('/api/auth/login', { email, password: 'staff password here' });
    expect(login.status).toBe(200);
    expect(login.body.user.role).toBe('admin');
    expect((await newcomer.get('/api/admin/users')).status).toBe(200);
  });

  it('when an admin searches users, then matches come back with a total, and bad paging is a 400', async () => {
    const { client } = await signedInAs('admin');
    const shop = await createUser(ctx.db, { role: 'shop', displayName: 'Quillon Gauge Room' });
    const res = await client.get('/api/admin/users?q=quillon&role=shop');
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(1);
    expect(res.body.users[0]).toMatchObject({ id: shop.id, role: 'shop' });
    expect(res.body.users[0].passwordHash).toBeUndefined();

    const bad = await client.get('/api/admin/users?limit=0&role=wizard');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['limit', 'role']);
  });

  it('when a user is suspended while signed in, then their next request is treated as signed out', async () => {
    const { user, client } = await signedInAs('builder');
    await client.get('/api/auth/me').expect(200);
    const { users } = await import('../../server/db/schema');
    await ctx.db.update(users).set({ status: 'suspended' }).where(eq(users.id, user.id));
    await client.get('/api/auth/me').expect(401);
  });
});
