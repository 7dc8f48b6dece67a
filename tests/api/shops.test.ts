import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createShop, createUser, shopProfileInput } from '../factories';
import { setupTestApp, signedIn, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

describe('shop profiles', () => {
  it('when a shop saves its profile, then it reads it back and it shows in the public directory and on its page', async () => {
    const user = await createUser(ctx.db, { role: 'shop' });
    const client = await signedIn(ctx.app, user);
    expect((await client.get('/api/shop-profile')).status).toBe(404);

    const input = shopProfileInput({ name: 'Quarry Road Cylinder Shop', region: 'Vermont', city: 'Barre', capabilities: ['bore', 'hone', 'line-hone'], rateCard: [{ operation: 'line-hone', priceCents: 42000 }] });
    const saved = await client.agent.put('/api/shop-profile').set('X-CSRF-Token', client.token).send(input);
    expect(saved.status).toBe(200);
    expect(saved.body.shop).toMatchObject({ name: 'Quarry Road Cylinder Shop', capabilities: ['bore', 'hone', 'line-hone'], rateCard: [{ operation: 'line-hone', priceCents: 42000 }], verified: false, rating: null });

    const directory = await supertest(ctx.app).get('/api/shops?operation=line-hone&region=vermont');
    expect(directory.status).toBe(200);
    expect(directory.body.shops.map((s: { name: string }) => s.name)).toContain('Quarry Road Cylinder Shop');
    const page = await supertest(ctx.app).get(`/api/shops/${saved.body.shop.id}`);
    expect(page.status).toBe(200);
    expect(page.body.shop.city).toBe('Barre');
    expect(page.body.shop.notifyMatchingJobs).toBeUndefined();
  });

  it('when the rate card prices work the shop does not list, or money is not whole cents, then 400 beside the field', async () => {
    const user = await createUser(ctx.db, { role: 'shop' });
    const client = await signedIn(ctx.app, user);
    const res = await client.agent
      .put('/api/shop-profile')
      .set('X-CSRF-Token', client.token)
      .send(shopProfileInput({ capabilities: ['bore'], rateCard: [{ operation: 'deck', priceCents: 10.5 }] }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'rateCard.0.priceCents': 'Price must be whole cents.' });
    const unlisted = await client.agent
      .put('/api/shop-profile')
      .set('X-CSRF-Token', client.token)
      .send(shopProfileInput({ capabilities: ['bore'], rateCard: [{ operation: 'deck', priceCents: 1050 }] }));
    expect(unlisted.status).toBe(400);
    expect(unlisted.body.error.fields).toEqual({ 'rateCard.0.operation': 'Price only work you list as a capability.' });
  });

  it('when a builder tries to keep a shop profile, then 403', async () => {
    const user = await createUser(ctx.db, { role: 'builder' });
    const client = await signedIn(ctx.app, user);
    const res = await client.agent.put('/api/shop-profile').set('X-CSRF-Token', client.token).send(shopProfileInput());
    expect(res.status).toBe(403);
  });

  it('when the directory is filtered by shipping and paged, then the total and the page agree', async () => {
    const tag = `Pagetest ${Date.now()}`;
    for (let i = 0; i < 3; i += 1) await createShop(ctx.db, { name: `${tag} ${i}`, takesShipped: i !== 1 });
    const first = await supertest(ctx.app).get(`/api/shops?q=${encodeURIComponent(tag)}&takesShipped=true&pageSize=1`);
    expect(first.body.total).toBe(2);
    expect(first.body.shops).toHaveLength(1);
    const bad = await supertest(ctx.app).get('/api/shops?pageSize=500&takesShipped=maybe');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['pageSize', 'takesShipped']);
  });
});
