import { and, eq } from 'drizzle-orm';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, createPool, type Database } from '../../server/db/client';
import { adminActions, jobs, ledgerEntries, mailOutbox, moneyMoves, paymentEvents, payments as paymentRows, shops } from '../../server/db/schema';
import { jobBalance } from '../../server/modules/payments/ledger';
import { startServer, type RunningServer } from '../../server/runtime';
import { bidInput, createJob, createShop, createUser } from '../factories';
import { until } from '../setup/job-states';
import { postForm, readForm, sendWebhooksTo, startTestStandIn, TEST_WEBHOOK_SECRET } from '../setup/payments';
import { createTestDatabase, signedIn, testConfig } from '../setup/test-env';

type StandIn = Awaited<ReturnType<typeof startTestStandIn>>;
let database: Awaited<ReturnType<typeof createTestDatabase>>;
let pool: ReturnType<typeof createPool>;
let db: Database;
let pay: StandIn;
let server: RunningServer;
let stripe: Stripe;

beforeAll(async () => {
  database = await createTestDatabase();
  pool = createPool(database.url, 4);
  db = createDb(pool);
  pay = await startTestStandIn();
  server = await startServer(
    testConfig(database.url, { PORT: '0', STRIPE_API_URL: pay.standIn.url, STRIPE_WEBHOOK_SECRET: TEST_WEBHOOK_SECRET, PLATFORM_FEE_BPS: '800' }),
    { migrate: false },
  );
  await sendWebhooksTo(pay.standIn, server.url);
  const url = new URL(pay.standIn.url);
  stripe = new Stripe('sk_test_tenthmark_local', { host: url.hostname, port: Number(url.port), protocol: 'http', telemetry: false, maxNetworkRetries: 0 });
});
afterAll(async () => {
  await server?.close();
  await pay?.standIn.close();
  await pool?.end();
  await database?.drop();
});

/** paid = released + fee + refunded + held, and nothing held below zero. */
async function expectLedgerBalanced(jobId: string) {
  const balance = await jobBalance(db, jobId);
  expect(balance.held).toBeGreaterThanOrEqual(0);
  expect(balance.paidIn).toBe(balance.released + balance.fee + balance.refunded + balance.held);
  return balance;
}

/** A shop that went through the stand-in's onboarding page, as a person would. */
async function shopWithPayouts() {
  const { user, shop } = await createShop(db, {}, {}, { payouts: false });
  const client = await signedIn(server.app, user);
  const { body } = await client.post('/api/shop-profile/payouts');
  const page = await fetch(body.url);
  const form = readForm(await page.text());
  const done = await postForm(new URL(form.action, body.url).toString(), form.fields);
  expect(done.status).toBe(303);
  const deadline = Date.now() + 5_000;
  for (;;) {
    const [row] = await db.select().from(shops).where(eq(shops.id, shop.id));
    if (row.payoutsReadyAt) return { user, shop: row, client };
    if (Date.now() > deadline) throw new Error('the payout account never became ready');
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** An awarded job: builder, shop with payouts, accepted bid. */
async function awardedJob(totalCents = 66_000) {
  const builderUser = await createUser(db);
  const job = await createJob(db, builderUser.id);
  const { user: shopUser, client: shopClient } = await shopWithPayouts();
  const bid = await shopClient.post(`/api/jobs/${job.id}/bids`, bidInput({ lineItems: [{ description: 'Bore, hone and deck', quantity: 1, unitPriceCents: totalCents }] }));
  expect(bid.status).toBe(201);
  const builder = await signedIn(server.app, builderUser);
  expect((await builder.post(`/api/bids/${bid.body.bid.id}/accept`)).status).toBe(200);
  return { job, builder, builderUser, shopUser, shopClient };
}

async function payWith(builder: Awaited<ReturnType<typeof signedIn>>, jobId: string, card: string, path = `/api/jobs/${jobId}/checkout`) {
  const checkout = await builder.post(path);
  expect(checkout.status).toBe(200);
  const page = await fetch(checkout.body.url);
  const form = readForm(await page.text());
  return postForm(new URL(form.action, checkout.body.url).toString(), { ...form.fields, card_number: card });
}

const jobStatus = async (id: string) => (await db.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, id)))[0].status;

describe('payments through the official SDK and the stand-in', () => {
  it('when a shop has not set up payouts, then its bid cannot be accepted', async () => {
    const builderUser = await createUser(db);
    const job = await createJob(db, builderUser.id);
    const { user } = await createShop(db, {}, {}, { payouts: false });
    const bid = await (await signedIn(server.app, user)).post(`/api/jobs/${job.id}/bids`, bidInput());
    const res = await (await signedIn(server.app, builderUser)).post(`/api/bids/${bid.body.bid.id}/accept`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('shop_payouts_not_ready');
  });

  it('when the builder pays with the success card, then the job is funded, held in the ledger, and both sides get a receipt', async () => {
    const { job, builder, builderUser, shopUser } = await awardedJob(66_000);
    const answer = await payWith(builder, job.id, '4242 4242 4242 4242');
    expect(answer.status).toBe(303);
    expect(answer.headers.get('location')).toContain(`/jobs/${job.id}?payment=done`);
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
    const balance = await expectLedgerBalanced(job.id);
    expect(balance).toMatchObject({ paidIn: 66_000, held: 66_000, released: 0 });
    const receipts = await db.select().from(mailOutbox).where(eq(mailOutbox.template, 'payment_receipt'));
    expect(receipts.map((m) => m.toAddress)).toEqual(expect.arrayContaining([builderUser.email, shopUser.email]));
    const money = await builder.get(`/api/jobs/${job.id}/money`);
    expect(money.body.balance.held).toBe(66_000);
  });

  it.each([
    ['4000 0000 0000 0002', /declined/i],
    ['4000 0000 0000 9995', /not enough funds/i],
  ])('when the card %s is declined, then the job stays unpaid with the reason, and a retry with the success card funds it', async (card, reason) => {
    const { job, builder } = await awardedJob(12_345);
    const declined = await payWith(builder, job.id, card);
    expect(declined.status).toBe(402);
    expect(await declined.text()).toMatch(reason);
    const failure = await until('failure recorded', async () => {
      const [row] = await db.select().from(paymentRows).where(eq(paymentRows.jobId, job.id));
      return row?.failureMessage ?? undefined;
    });
    expect(failure).toMatch(reason);
    expect(await jobStatus(job.id)).toBe('awarded');
    expect((await payWith(builder, job.id, '4242424242424242')).status).toBe(303);
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
    expect((await expectLedgerBalanced(job.id)).paidIn).toBe(12_345);
  });

  it('when the card needs authentication, then the extra step decides', async () => {
    const { job, builder } = await awardedJob(5_000);
    const first = await payWith(builder, job.id, '4000 0027 6000 3184');
    expect(first.status).toBe(200);
    const step = readForm(await first.text());
    const approve = await postForm(new URL(step.action, pay.standIn.url).toString(), { ...step.fields, outcome: 'approve' });
    expect(approve.status).toBe(303);
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
  });

  it('when a webhook is delivered five times, then it has one effect; a forged signature is refused', async () => {
    const { job, builder } = await awardedJob(20_000);
    await payWith(builder, job.id, '4242424242424242');
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
    const events = await pay.standIn.control.events();
    const completed = [...events].reverse().find((e) => e.type === 'checkout.session.completed')!;
    const body = JSON.stringify(completed);
    for (let i = 0; i < 5; i += 1) {
      const res = await fetch(`${server.url}/api/payments/webhook`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'Stripe-Signature': stripe.webhooks.generateTestHeaderString({ payload: body, secret: TEST_WEBHOOK_SECRET }) },
        body,
      });
      expect(res.status).toBe(200);
    }
    expect(await db.select().from(ledgerEntries).where(and(eq(ledgerEntries.jobId, job.id), eq(ledgerEntries.kind, 'paid_in')))).toHaveLength(1);
    expect(await db.select().from(paymentEvents).where(eq(paymentEvents.id, completed.id))).toHaveLength(1);
    await expectLedgerBalanced(job.id);

    const forged = await fetch(`${server.url}/api/payments/webhook`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'Stripe-Signature': stripe.webhooks.generateTestHeaderString({ payload: body, secret: 'whsec_not_ours' }) },
      body,
    });
    expect(forged.status).toBe(400);
  });

  it('when the events arrive in reverse order, then the job still ends funded', async () => {
    const { job, builder } = await awardedJob(30_000);
    await pay.standIn.control.reverseNext(3);
    await payWith(builder, job.id, '4242424242424242');
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
    expect((await expectLedgerBalanced(job.id)).paidIn).toBe(30_000);
  });

  it('when 20 release calls race, then exactly one transfer is made and the ledger shows it once', async () => {
    const { job, builder } = await awardedJob(66_000);
    await payWith(builder, job.id, '4242424242424242');
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
    const admin = await signedIn(server.app, await createUser(db, { role: 'admin' }));
    const answers = await Promise.all(Array.from({ length: 20 }, () => admin.post(`/api/admin/jobs/${job.id}/release`)));
    expect(answers.every((a) => a.status === 200)).toBe(true);
    const transfers = await stripe.transfers.list({ transfer_group: job.id });
    expect(transfers.data).toHaveLength(1);
    // derived: fee = 8 % of 66,000 = 5,280; transfer = 66,000 − 5,280
    expect(transfers.data[0].amount).toBe(60_720);
    const balance = await expectLedgerBalanced(job.id);
    expect(balance).toMatchObject({ released: 60_720, fee: 5_280, held: 0, refunded: 0 });
    expect(await jobStatus(job.id)).toBe('completed');
  });

  it('when the payment server is away at release time, then the payout waits and completes later by itself, once', async () => {
    const { job, builder } = await awardedJob(40_000);
    await payWith(builder, job.id, '4242424242424242');
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
    const port = Number(new URL(pay.standIn.url).port);
    await pay.standIn.close();
    const admin = await signedIn(server.app, await createUser(db, { role: 'admin' }));
    const answer = await admin.post(`/api/admin/jobs/${job.id}/release`);
    expect(answer.status).toBe(200);
    expect(answer.body.pending).toHaveLength(1);
    expect(answer.body.pending[0].lastError).toBeTruthy();
    expect(await jobStatus(job.id)).toBe('funded');

    pay = await startTestStandIn({ port, dataFile: pay.dataFile });
    await sendWebhooksTo(pay.standIn, server.url);
    // Time passes to the retry (the backoff is seconds to minutes); the app's own worker picks it up with the same key.
    await db.update(moneyMoves).set({ nextAttemptAt: new Date(0) }).where(eq(moneyMoves.jobId, job.id));
    await until('completed by the worker', async () => (await jobStatus(job.id)) === 'completed', 15_000);
    expect((await stripe.transfers.list({ transfer_group: job.id })).data).toHaveLength(1);
    expect((await expectLedgerBalanced(job.id)).released).toBe(36_800);
  });

  it('when a funded job is cancelled, then the builder is refunded in full, never more', async () => {
    const { job, builder } = await awardedJob(25_000);
    await payWith(builder, job.id, '4242424242424242');
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
    const first = await builder.post(`/api/jobs/${job.id}/cancel-and-refund`);
    expect(first.status).toBe(200);
    const again = await builder.post(`/api/jobs/${job.id}/cancel-and-refund`);
    expect(again.status).toBe(409);
    const [payment] = await db.select().from(paymentRows).where(eq(paymentRows.jobId, job.id));
    const refunds = await stripe.refunds.list({ payment_intent: payment.paymentIntentId! });
    expect(refunds.data.reduce((sum, r) => sum + r.amount, 0)).toBe(25_000);
    const balance = await expectLedgerBalanced(job.id);
    expect(balance).toMatchObject({ refunded: 25_000, held: 0 });
    expect(await jobStatus(job.id)).toBe('cancelled');
  });

  it('when a split is asked for more than is held, then 400; a valid split pays the shop its share and refunds the rest', async () => {
    const { job, builder } = await awardedJob(10_000);
    await payWith(builder, job.id, '4242424242424242');
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
    const admin = await signedIn(server.app, await createUser(db, { role: 'admin' }));
    expect((await admin.post(`/api/admin/jobs/${job.id}/split`, { shopCents: 10_001 })).status).toBe(400);
    const split = await admin.post(`/api/admin/jobs/${job.id}/split`, { shopCents: 6_000 });
    expect(split.status).toBe(200);
    const balance = await expectLedgerBalanced(job.id);
    // derived: shop share 6,000 less 8 % fee (480) → 5,520 transferred; 4,000 refunded
    expect(balance).toMatchObject({ released: 5_520, fee: 480, refunded: 4_000, held: 0 });
  });

  it('when an admin release or split is refused, then no audit row is left; a decision made is audited once, with the money plan', async () => {
    const { job, builder } = await awardedJob(12_000);
    const admin = await signedIn(server.app, await createUser(db, { role: 'admin' }));
    const auditOf = () => db.select().from(adminActions).where(and(eq(adminActions.targetType, 'job'), eq(adminActions.targetId, job.id)));
    // Nothing is held yet: the money plan fails, and the audit row written in its transaction goes with it.
    const early = await admin.post(`/api/admin/jobs/${job.id}/release`);
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe('nothing_held');
    await payWith(builder, job.id, '4242424242424242');
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
    expect((await admin.post(`/api/admin/jobs/${job.id}/split`, { shopCents: 12_001 })).status).toBe(400);
    expect(await auditOf()).toEqual([]);
    expect(await db.select().from(moneyMoves).where(eq(moneyMoves.jobId, job.id))).toEqual([]);

    expect((await admin.post(`/api/admin/jobs/${job.id}/split`, { shopCents: 5_000 })).status).toBe(200);
    const audit = await auditOf();
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ action: 'job.split', details: { shopCents: 5_000 } });
    expect((await db.select().from(moneyMoves).where(eq(moneyMoves.jobId, job.id))).length).toBeGreaterThan(0);
  });

  it('when the shop proposes extra work and the builder pays for it, then the release includes it', async () => {
    const { job, builder, shopClient } = await awardedJob(50_000);
    await payWith(builder, job.id, '4242424242424242');
    await until('funded', async () => (await jobStatus(job.id)) === 'funded');
    const proposed = await shopClient.post(`/api/jobs/${job.id}/change-orders`, { description: 'Sleeve cylinder 3 (cracked)', amountCents: 18_000 });
    expect(proposed.status).toBe(201);
    expect((await payWith(builder, job.id, '4242424242424242', `/api/change-orders/${proposed.body.changeOrder.id}/approve`)).status).toBe(303);
    await until('change order paid', async () => (await jobBalance(db, job.id)).paidIn === 68_000);
    const admin = await signedIn(server.app, await createUser(db, { role: 'admin' }));
    expect((await admin.post(`/api/admin/jobs/${job.id}/release`)).status).toBe(200);
    const transfers = await stripe.transfers.list({ transfer_group: job.id });
    // derived: 50,000 − 4,000 fee and 18,000 − 1,440 fee
    expect(transfers.data.map((t) => t.amount).sort((a, b) => a - b)).toEqual([16_560, 46_000]);
    const balance = await expectLedgerBalanced(job.id);
    expect(balance).toMatchObject({ paidIn: 68_000, released: 62_560, fee: 5_440, held: 0 });
  });

  it('when someone other than the builder, the awarded shop or an admin asks for a job’s money, then 403', async () => {
    const { job } = await awardedJob(1_000);
    const stranger = await signedIn(server.app, await createUser(db));
    expect((await stranger.get(`/api/jobs/${job.id}/money`)).status).toBe(403);
    const otherShop = await createShop(db);
    expect((await (await signedIn(server.app, otherShop.user)).get(`/api/jobs/${job.id}/money`)).status).toBe(403);
  });
});
