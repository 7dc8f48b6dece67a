import Stripe from 'stripe';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { DEFAULT_SECRET_KEY } from '../../../server/dev/payments-stand-in';
import { paidSession, readyAccount, startHarness, type Harness } from '../../setup/payments';

let harness: Harness;

beforeEach(async () => {
  harness = await startHarness();
});

afterEach(async () => {
  await harness.cleanup();
});

const rawPost = (path: string, body: string, key: string) =>
  fetch(`${harness.standIn.url}${path}`, {
    method: 'POST',
    headers: { authorization: `Bearer ${DEFAULT_SECRET_KEY}`, 'content-type': 'application/x-www-form-urlencoded', 'idempotency-key': key },
    body,
  });

describe('idempotency keys', () => {
  it('when a POST is repeated with the same key, then the first answer is replayed with Idempotent-Replayed and nothing new is made', async () => {
    const first = await harness.stripe.accounts.create({ type: 'express', email: 'a@example.test' }, { idempotencyKey: 'shop-7-account' });
    const second = await harness.stripe.accounts.create({ type: 'express', email: 'a@example.test' }, { idempotencyKey: 'shop-7-account' });
    expect(second.id).toBe(first.id);
    expect(second.lastResponse.headers['idempotent-replayed']).toBe('true');
    expect(first.lastResponse.headers['idempotent-replayed']).toBeUndefined();
    expect((await harness.stripe.accounts.list()).data).toHaveLength(1);
  });

  it('when the same key comes with different parameters, then the SDK raises StripeIdempotencyError', async () => {
    await harness.stripe.accounts.create({ type: 'express', email: 'a@example.test' }, { idempotencyKey: 'k-1' });
    const error = await harness.stripe.accounts
      .create({ type: 'express', email: 'b@example.test' }, { idempotencyKey: 'k-1' })
      .catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
    expect(error).toMatchObject({ statusCode: 400, type: 'StripeIdempotencyError' });
  });

  it('when the same key arrives while the first request still runs, then the second gets 409 idempotency_key_in_use', async () => {
    harness.standIn.control.setLatency(150);
    const [a, b] = await Promise.all([
      rawPost('/v1/accounts', 'type=express', 'same-moment'),
      rawPost('/v1/accounts', 'type=express', 'same-moment'),
    ]);
    const statuses = [a.status, b.status].sort();
    expect(statuses).toEqual([200, 409]);
    const conflict = [a, b].find((r) => r.status === 409)!;
    expect(((await conflict.json()) as { error: { type: string; code: string } }).error).toMatchObject({
      type: 'idempotency_error',
      code: 'idempotency_key_in_use',
    });
    harness.standIn.control.setLatency(0);
    expect((await harness.stripe.accounts.list()).data).toHaveLength(1);
  });

  it('when twenty SDK calls race with one key, then exactly one transfer is made and every call that succeeds names it', async () => {
    const { charge } = await paidSession(harness.stripe);
    const shop = await readyAccount(harness);
    harness.standIn.control.setLatency(30);
    const retrying = new Stripe(DEFAULT_SECRET_KEY, { host: '127.0.0.1', port: harness.port, protocol: 'http', telemetry: false, maxNetworkRetries: 6 });
    const results = await Promise.allSettled(
      Array.from({ length: 20 }, () =>
        retrying.transfers.create(
          { amount: 100_000, currency: 'usd', destination: shop.id, source_transaction: charge.id, transfer_group: 'job_42' },
          { idempotencyKey: 'release-job_42' },
        ),
      ),
    );
    harness.standIn.control.setLatency(0);
    const ids = new Set(results.flatMap((r) => (r.status === 'fulfilled' ? [r.value.id] : [])));
    expect(ids.size).toBe(1);
    expect((await harness.stripe.transfers.list({ transfer_group: 'job_42' })).data).toHaveLength(1);
    for (const r of results) if (r.status === 'rejected') expect((r.reason as Stripe.errors.StripeError).statusCode).toBe(409);
  });

  it('when a request was refused by validation, then the same key can be used again once the cause is fixed', async () => {
    const { charge } = await paidSession(harness.stripe);
    const shop = await harness.stripe.accounts.create({ type: 'express', capabilities: { transfers: { requested: true } } });
    const params = { amount: 1000, currency: 'usd', destination: shop.id, source_transaction: charge.id };
    await expect(harness.stripe.transfers.create(params, { idempotencyKey: 'release-1' })).rejects.toMatchObject({ statusCode: 400 });
    await harness.standIn.control.completeOnboarding(shop.id);
    await expect(harness.stripe.transfers.create(params, { idempotencyKey: 'release-1' })).resolves.toMatchObject({ amount: 1000 });
  });

  it('when the stand-in restarts, then a stored answer is still replayed', async () => {
    const first = await harness.stripe.accounts.create({ type: 'express' }, { idempotencyKey: 'across-restart' });
    await harness.standIn.close();
    await harness.restart();
    const again = await harness.stripe.accounts.create({ type: 'express' }, { idempotencyKey: 'across-restart' });
    expect(again.id).toBe(first.id);
    expect(again.lastResponse.headers['idempotent-replayed']).toBe('true');
  });
});
