import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createShop, createUser, shopProfileInput } from '../factories';
import { startMoneyApp } from '../setup/money-app';
import { signedIn } from '../setup/test-env';

let m: Awaited<ReturnType<typeof startMoneyApp>>;
beforeAll(async () => {
  m = await startMoneyApp();
});
afterAll(async () => {
  await m?.close();
});

const shopAddress = shopProfileInput().receivingAddress;
const returnAddress = { lines: ['42 Camshaft Lane', ''], city: 'Fort Wayne', region: 'Indiana', postalCode: '46802', country: 'United States' };

describe('the shop’s receiving address', () => {
  it('when the job is only awarded, then nobody sees the address; once paid the builder does, and other shops and builders never', async () => {
    const awarded = await m.jobIn('awarded');
    const before = await awarded.builder.get(`/api/jobs/${awarded.job.id}/shipping`);
    expect(before.status).toBe(200);
    expect(before.body.shipping).toEqual({ logistics: 'ship', shopAddress: null, returnAddress: null, legs: [] });

    const { job, builder, shop } = await m.fundedJob();
    const after = await builder.get(`/api/jobs/${job.id}/shipping`);
    expect(after.status).toBe(200);
    expect(after.body.shipping.shopAddress).toEqual(shopAddress);
    expect((await shop.get(`/api/jobs/${job.id}/shipping`)).body.shipping.shopAddress).toEqual(shopAddress);

    const otherShop = await signedIn(m.server.app, (await createShop(m.db)).user);
    const otherBuilder = await signedIn(m.server.app, await createUser(m.db));
    for (const stranger of [otherShop, otherBuilder]) {
      const res = await stranger.get(`/api/jobs/${job.id}/shipping`);
      expect(res.status).toBe(403);
      expect(JSON.stringify(res.body)).not.toContain('Foundry Row');
    }
  });

  it('when a shop saves its profile, then it reads its receiving address back, and the public page does not show it', async () => {
    const { user, shop } = await createShop(m.db);
    const own = await signedIn(m.server.app, user);
    expect((await own.get('/api/shop-profile')).body.shop.receivingAddress).toEqual(shopAddress);
    const bad = await own.put('/api/shop-profile', shopProfileInput({ receivingAddress: { ...shopAddress!, postalCode: '' } }));
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields['receivingAddress.postalCode']).toBe('Enter a postal code.');
    const anyone = await signedIn(m.server.app, await createUser(m.db));
    expect(JSON.stringify((await anyone.get(`/api/shops/${shop.id}`)).body)).not.toContain('Foundry Row');
  });
});

describe('the builder sends the parts to the shop', () => {
  it('when the builder logs it, then carrier and tracking are required, it shows on the timeline, and a shop cannot log it', async () => {
    const { job, builder, shop } = await m.fundedJob();
    const missing = await builder.post(`/api/jobs/${job.id}/sent-to-shop`, { carrier: 'Ridgeline Freight' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields.trackingNumber).toBe('Enter the tracking number.');

    const sent = await builder.post(`/api/jobs/${job.id}/sent-to-shop`, { carrier: 'Ridgeline Freight', trackingNumber: 'RF 1200 3344' });
    expect(sent.status).toBe(201);
    expect(sent.body.milestone).toMatchObject({ kind: 'sent_to_shop', carrier: 'Ridgeline Freight', trackingNumber: 'RF 1200 3344' });

    // The shop has its own route for progress, and that route refuses this kind; the builder's route is the builder's.
    expect((await shop.post(`/api/jobs/${job.id}/sent-to-shop`, { carrier: 'X', trackingNumber: 'Y' })).status).toBe(403);
    const byShop = await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'sent_to_shop', carrier: 'X', trackingNumber: 'Y' });
    expect(byShop.status).toBe(400);
    expect(byShop.body.error.fields.kind).toBe('Only the builder logs sending the parts to the shop.');

    const timeline = await shop.get(`/api/jobs/${job.id}/milestones`);
    expect(timeline.body.milestones.map((x: { kind: string }) => x.kind)).toEqual(['sent_to_shop']);
    const legs = (await shop.get(`/api/jobs/${job.id}/shipping`)).body.shipping.legs;
    expect(legs).toEqual([{ direction: 'to_shop', carrier: 'Ridgeline Freight', trackingNumber: 'RF 1200 3344', at: expect.any(String) }]);
  });

  it('when the job is not yet paid for, then the builder cannot log sending the parts', async () => {
    const { job, builder } = await m.jobIn('awarded');
    const early = await builder.post(`/api/jobs/${job.id}/sent-to-shop`, { carrier: 'Ridgeline Freight', trackingNumber: 'RF 1' });
    expect(early.status).toBe(409);
  });
});

describe('the shop ships the parts back', () => {
  it('when there is no return address, then “shipped” is refused; after the builder gives one, the shop sees it and may log it', async () => {
    const { job, builder, shop } = await m.jobIn('inWork');
    const refused = await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'shipped', carrier: 'Valley Parcel', trackingNumber: 'VP-778' });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('no_return_address');
    expect(refused.body.error.message).toContain('return address');

    expect((await shop.put(`/api/jobs/${job.id}/return-address`, returnAddress)).status).toBe(403);
    const incomplete = await builder.put(`/api/jobs/${job.id}/return-address`, { ...returnAddress, lines: [''] });
    expect(incomplete.status).toBe(400);
    expect(incomplete.body.error.fields.lines).toBe('Enter the street address.');
    const given = await builder.put(`/api/jobs/${job.id}/return-address`, returnAddress);
    expect(given.status).toBe(200);
    const stored = { ...returnAddress, lines: ['42 Camshaft Lane'] };
    expect(given.body.shipping.returnAddress).toEqual(stored);
    expect((await shop.get(`/api/jobs/${job.id}/shipping`)).body.shipping.returnAddress).toEqual(stored);

    const shipped = await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'shipped', carrier: 'Valley Parcel', trackingNumber: 'VP-778' });
    expect(shipped.status).toBe(201);
    const legs = (await builder.get(`/api/jobs/${job.id}/shipping`)).body.shipping.legs;
    expect(legs).toEqual([{ direction: 'to_builder', carrier: 'Valley Parcel', trackingNumber: 'VP-778', at: expect.any(String) }]);

    // Once the parts are on their way, the address they went to stays as it was: a change now would
    // misstate where the parcel went, so the builder is told to talk to the shop and the carrier instead.
    const late = await builder.put(`/api/jobs/${job.id}/return-address`, { ...returnAddress, city: 'Muncie' });
    expect(late.status).toBe(409);
    expect(late.body.error.code).toBe('already_shipped');
    expect((await shop.get(`/api/jobs/${job.id}/shipping`)).body.shipping.returnAddress).toEqual(stored);
  });

  it('when the parts are dropped off, then no return address is asked and the shop may log “shipped” as before', async () => {
    const { job, builder, shop } = await m.jobIn('inWork', { input: { logistics: 'drop-off' } });
    expect((await builder.put(`/api/jobs/${job.id}/return-address`, returnAddress)).status).toBe(409);
    expect((await builder.get(`/api/jobs/${job.id}/shipping`)).body.shipping).toMatchObject({ logistics: 'drop-off', shopAddress: null });
    expect((await shop.post(`/api/jobs/${job.id}/milestones`, { kind: 'shipped', carrier: 'Valley Parcel', trackingNumber: 'VP-9' })).status).toBe(201);
  });
});
