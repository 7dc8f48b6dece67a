import { readdirSync, readFileSync } from 'node:fs';
import { dirname } from 'node:path';
import Stripe from 'stripe';
import { afterEach, describe, expect, it } from 'vitest';
import { DEFAULT_SECRET_KEY } from '../../../server/dev/payments-stand-in';
import { createSession, paidSession, payOnPage, readyAccount, startHarnessWithReceiver, startReceiver, waitFor, WEBHOOK_SECRET } from '../../setup/payments';

const cleanups: Array<() => Promise<void>> = [];
afterEach(async () => {
  for (const cleanup of cleanups.splice(0).reverse()) await cleanup();
});

async function setUp(respond?: Parameters<typeof startReceiver>[0]) {
  const { receiver, harness, close } = await startHarnessWithReceiver(respond);
  cleanups.push(close);
  return { receiver, harness };
}

const PAYMENT_EVENTS = ['charge.succeeded', 'payment_intent.succeeded', 'checkout.session.completed'];

describe('webhook signatures', () => {
  it('when an event is delivered, then the SDK constructEvent accepts its Stripe-Signature with the whsec_ secret', async () => {
    const { receiver, harness } = await setUp();
    await createSession(harness.stripe).then((s) => harness.stripe.checkout.sessions.expire(s.id));
    await waitFor(() => receiver.all.length === 1, 5_000, 'the event');
    const [delivery] = receiver.all;
    const header = String(delivery.headers['stripe-signature']);
    expect(header).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
    expect(delivery.headers['content-type']).toMatch(/^application\/json/);

    const event = harness.stripe.webhooks.constructEvent(delivery.body, header, WEBHOOK_SECRET);
    expect(event).toMatchObject({ object: 'event', type: 'checkout.session.expired', api_version: '2026-10-28.endive', livemode: false });
    expect(event.id).toMatch(/^evt_/);
    expect(await harness.stripe.events.retrieve(event.id)).toMatchObject({ id: event.id, type: 'checkout.session.expired' });
  });

  it('when the body, the secret or the signature is forged, then constructEvent refuses it', async () => {
    const { receiver, harness } = await setUp();
    await createSession(harness.stripe).then((s) => harness.stripe.checkout.sessions.expire(s.id));
    await waitFor(() => receiver.all.length === 1, 5_000, 'the event');
    const [delivery] = receiver.all;
    const header = String(delivery.headers['stripe-signature']);
    const forgedBody = delivery.body.replace('checkout.session.expired', 'checkout.session.completed');
    expect(() => harness.stripe.webhooks.constructEvent(forgedBody, header, WEBHOOK_SECRET)).toThrow(Stripe.errors.StripeSignatureVerificationError);
    expect(() => harness.stripe.webhooks.constructEvent(delivery.body, header, 'whsec_someone_else')).toThrow(Stripe.errors.StripeSignatureVerificationError);
    const forgedHeader = harness.stripe.webhooks.generateTestHeaderString({ payload: delivery.body, secret: 'whsec_someone_else' });
    expect(() => harness.stripe.webhooks.constructEvent(delivery.body, forgedHeader, WEBHOOK_SECRET)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
  });
});

describe('delivery and retries', () => {
  it('when the endpoint answers 500 twice and then 200, then the same event is retried until it is delivered', async () => {
    const { receiver, harness } = await setUp((attempt) => (attempt <= 2 ? 500 : 200));
    await createSession(harness.stripe).then((s) => harness.stripe.checkout.sessions.expire(s.id));
    await waitFor(() => harness.standIn.control.deliveries()[0]?.status === 'delivered', 5_000, 'delivery');
    expect(receiver.all).toHaveLength(3);
    expect(new Set(receiver.all.map((r) => r.event.id)).size).toBe(1);
    const [delivery] = harness.standIn.control.deliveries();
    expect(delivery.attempts).toBe(3);
    expect(delivery.history.map((h) => h.status)).toEqual([500, 500, 200]);
    // each attempt is signed afresh and verifies
    for (const r of receiver.all) harness.stripe.webhooks.constructEvent(r.body, String(r.headers['stripe-signature']), WEBHOOK_SECRET);
  });

  it('when the endpoint cannot be reached, then delivery keeps trying and succeeds once it is back', async () => {
    const { receiver, harness } = await setUp();
    const port = receiver.port;
    await receiver.close();
    await createSession(harness.stripe).then((s) => harness.stripe.checkout.sessions.expire(s.id));
    await waitFor(() => (harness.standIn.control.deliveries()[0]?.attempts ?? 0) >= 2, 5_000, 'failed attempts');
    expect(harness.standIn.control.deliveries()[0]).toMatchObject({ status: 'pending' });
    expect(harness.standIn.control.deliveries()[0].history[0].error).toBeTruthy();
    const back = await startReceiver(() => 200, port);
    cleanups.push(() => back.close());
    await waitFor(() => back.all.length === 1, 5_000, 'the event at the returned endpoint');
    expect(back.all[0].event.type).toBe('checkout.session.expired');
  });
});

describe('test controls', () => {
  it('when deliverTwice(2) is set, then the next two events each arrive twice, and later ones once', async () => {
    const { receiver, harness } = await setUp();
    await harness.standIn.control.deliverTwice(2);
    await paidSession(harness.stripe);
    await harness.standIn.control.drain();
    const counts = new Map<string, number>();
    for (const r of receiver.all) counts.set(r.event.type, (counts.get(r.event.type) ?? 0) + 1);
    expect(Object.fromEntries(counts)).toEqual({ 'charge.succeeded': 2, 'payment_intent.succeeded': 2, 'checkout.session.completed': 1 });
    const duplicated = receiver.all.filter((r) => r.event.type === 'charge.succeeded');
    expect(duplicated[0].event.id).toBe(duplicated[1].event.id);
  });

  it('when reverseNext(3) is set, then the three payment events arrive newest first', async () => {
    const { receiver, harness } = await setUp();
    await harness.standIn.control.reverseNext(3);
    await paidSession(harness.stripe);
    await harness.standIn.control.drain();
    expect(receiver.types()).toEqual([...PAYMENT_EVENTS].reverse());
  });

  it('when events are held, then nothing arrives until release, which can send them in reverse', async () => {
    const { receiver, harness } = await setUp();
    await harness.standIn.control.hold();
    await paidSession(harness.stripe);
    await harness.standIn.control.drain();
    expect(receiver.all).toHaveLength(0);
    expect(harness.standIn.control.deliveries().every((d) => d.held)).toBe(true);
    await harness.standIn.control.release({ order: 'reverse' });
    await harness.standIn.control.drain();
    expect(receiver.types()).toEqual([...PAYMENT_EVENTS].reverse());
  });

  it('when delivery is paused, then events queue up and arrive in order after resume', async () => {
    const { receiver, harness } = await setUp();
    await harness.standIn.control.pause();
    await paidSession(harness.stripe);
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(receiver.all).toHaveLength(0);
    expect(await harness.standIn.control.drain(200)).toBe(false);
    await harness.standIn.control.resume();
    await harness.standIn.control.drain();
    expect(receiver.types()).toEqual(PAYMENT_EVENTS);
  });

  it('when the controls are used over HTTP, then they need the secret key and work the same', async () => {
    const { receiver, harness } = await setUp();
    const url = `${harness.standIn.url}/_control`;
    expect((await fetch(`${url}/deliver-twice`, { method: 'POST' })).status).toBe(401);
    const auth = { authorization: `Bearer ${DEFAULT_SECRET_KEY}`, 'content-type': 'application/json' };
    expect((await fetch(`${url}/deliver-twice`, { method: 'POST', headers: auth, body: JSON.stringify({ count: 1 }) })).status).toBe(200);
    await createSession(harness.stripe).then((s) => harness.stripe.checkout.sessions.expire(s.id));
    const drained = (await (await fetch(`${url}/drain`, { method: 'POST', headers: auth, body: '{}' })).json()) as { drained: boolean };
    expect(drained.drained).toBe(true);
    expect(receiver.all).toHaveLength(2);
    const listed = (await (await fetch(`${url}/deliveries`, { headers: auth })).json()) as { data: Array<{ status: string }> };
    expect(listed.data.map((d) => d.status)).toEqual(['delivered', 'delivered']);
  });
});

describe('restarts', () => {
  it('when the stand-in is closed and started again on the same data file, then accounts, charges and pending deliveries survive', async () => {
    let accept = false;
    const { receiver, harness } = await setUp(() => (accept ? 200 : 500));
    const shop = await readyAccount(harness);
    const { session, charge } = await paidSession(harness.stripe);
    await waitFor(() => receiver.all.length >= 3, 5_000, 'first failed attempts');
    const pendingBefore = harness.standIn.control.deliveries().filter((d) => d.status === 'pending');
    expect(pendingBefore.length).toBeGreaterThanOrEqual(3);

    await harness.standIn.close();
    // A delivery already on the wire when the stand-in closed may still land; after that, nothing more comes.
    await new Promise((resolve) => setTimeout(resolve, 100));
    const seen = receiver.all.length;
    accept = true;
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(receiver.all.length).toBe(seen);

    await harness.restart();
    expect(await harness.stripe.accounts.retrieve(shop.id)).toMatchObject({ capabilities: { transfers: 'active' } });
    expect(await harness.stripe.charges.retrieve(charge.id)).toMatchObject({ status: 'succeeded', amount: 125_000 });
    expect(await harness.stripe.checkout.sessions.retrieve(session.id)).toMatchObject({ payment_status: 'paid' });
    await harness.standIn.control.retryNow();
    expect(await harness.standIn.control.drain()).toBe(true);
    const delivered = new Set(receiver.all.filter((_, i) => i >= seen).map((r) => r.event.id));
    for (const d of pendingBefore) expect(delivered.has(d.eventId)).toBe(true);
    expect(harness.standIn.control.deliveries().every((d) => d.status === 'delivered')).toBe(true);
  });

  it('when changes are made, then the data file is one whole JSON document holding every kind of state, with no temporary files left', async () => {
    const { harness } = await setUp();
    const shop = await readyAccount(harness);
    const { charge, intent } = await paidSession(harness.stripe);
    await harness.stripe.transfers.create({ amount: 500, currency: 'usd', destination: shop.id, source_transaction: charge.id }, { idempotencyKey: 'file-check' });
    await harness.stripe.refunds.create({ payment_intent: intent.id, amount: 100 });
    await harness.standIn.control.drain();
    const saved = JSON.parse(readFileSync(harness.dataFile, 'utf8')) as Record<string, Record<string, unknown>>;
    for (const table of ['accounts', 'checkoutSessions', 'paymentIntents', 'charges', 'transfers', 'refunds', 'balanceTransactions', 'events', 'idempotency', 'deliveries']) {
      expect(Object.keys(saved[table]).length, table).toBeGreaterThan(0);
    }
    expect(saved.accounts[shop.id]).toMatchObject({ capabilities: { transfers: 'active' } });
    expect(readdirSync(dirname(harness.dataFile)).filter((name) => name.endsWith('.tmp'))).toEqual([]);
  });

  it('when the payment server is away, then the SDK gets a connection error, and after it is back the page and the API work again', async () => {
    const { harness } = await setUp();
    const session = await createSession(harness.stripe);
    await harness.standIn.close();
    await expect(harness.stripe.checkout.sessions.retrieve(session.id)).rejects.toBeInstanceOf(Stripe.errors.StripeConnectionError);
    await harness.restart();
    const answer = await payOnPage(session.url!, '4242424242424242');
    expect(answer.status).toBe(303);
    expect((await harness.stripe.checkout.sessions.retrieve(session.id)).payment_status).toBe('paid');
  });
});
