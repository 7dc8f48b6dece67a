import { and, eq } from 'drizzle-orm';
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest';
import { postForm, readForm } from '../../server/dev/payments-stand-in/page-client';
import { changeOrders, jobs, ledgerEntries, mailOutbox, moneyMoves, paymentEvents, payments as paymentRows } from '../../server/db/schema';
import { jobBalance } from '../../server/modules/payments/ledger';
import { applyCheckoutSession } from '../../server/modules/payments/payments.service';
import { bidInput, createJob, createShop, createUser } from '../factories';
import { startMoneyApp } from '../setup/money-app';
import { completeOnboardingPage, TEST_WEBHOOK_SECRET } from '../setup/payments';
import { signedIn } from '../setup/test-env';

/**
 * Money that arrives for a job that can no longer use it: open payment pages
 * are closed at the provider when the need for them ends, and a payment that
 * gets through anyway is sent back once, in full, with both sides told.
 */
let money: Awaited<ReturnType<typeof startMoneyApp>>;
beforeAll(async () => {
  money = await startMoneyApp();
});
afterAll(async () => {
  await money?.close();
});
// A test that fails half-way leaves no refusals queued for the next one.
afterEach(async () => {
  await money.standIn.control.failNextRequests(0);
  await money.standIn.control.release();
});

const SUCCESS_CARD = '4242 4242 4242 4242';

/** paid = released + fee + refunded + held, and nothing held below zero. */
async function expectLedgerBalanced(jobId: string) {
  const balance = await jobBalance(money.db, jobId);
  expect(balance.held).toBeGreaterThanOrEqual(0);
  expect(balance.paidIn).toBe(balance.released + balance.fee + balance.refunded + balance.held);
  return balance;
}

const jobStatus = async (id: string) => (await money.db.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, id)))[0].status;

/** Builder, shop with payouts, accepted bid: the job waits for its payment. */
async function awardedJob(totalCents: number) {
  const builderUser = await createUser(money.db);
  const job = await createJob(money.db, builderUser.id, { input: { title: `Late money block ${totalCents}` } });
  const { user: shopUser } = await createShop(money.db, {}, {}, { payouts: false });
  const shop = await signedIn(money.server.app, shopUser);
  await completeOnboardingPage((await shop.post('/api/shop-profile/payouts')).body.url);
  await money.until('payouts ready', async () => (await shop.get('/api/shop-profile')).body.shop.payouts === 'ready');
  const bid = await shop.post(`/api/jobs/${job.id}/bids`, bidInput({ lineItems: [{ description: 'Bore and hone', quantity: 1, unitPriceCents: totalCents }] }));
  expect(bid.status).toBe(201);
  const builder = await signedIn(money.server.app, builderUser);
  expect((await builder.post(`/api/bids/${bid.body.bid.id}/accept`)).status).toBe(200);
  return { job, builder, builderUser, shop, shopUser };
}

/** Opens the hosted payment page (as the builder's browser would) and keeps its filled-in form, to submit later. */
async function openPaymentPage(url: string) {
  const page = await fetch(url);
  expect(page.status).toBe(200);
  const form = readForm(await page.text());
  const sessionId = /\/(cs_[A-Za-z0-9_]+)/.exec(url)?.[1];
  expect(sessionId).toBeTruthy();
  return {
    sessionId: sessionId!,
    pay: () => postForm(new URL(form.action, url).toString(), { ...form.fields, card_number: SUCCESS_CARD }),
  };
}

/** The provider is away for the next few requests (the SDK's own retries included). */
/**
 * The provider refuses the next page expiry: its three tries (the SDK's two retries) answer 503. Only expiry
 * requests count, so the money worker's own calls in the meantime neither use up the failures nor fail.
 */
const expiryRefused = () => money.standIn.control.failNextRequests(3, 503, '/expire');

/** Posts one stored event to the app's webhook again, freshly signed, as a provider's repeat delivery does. */
async function redeliver(event: unknown) {
  const body = JSON.stringify(event);
  return fetch(`${money.server.url}/api/payments/webhook`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'Stripe-Signature': money.stripe.webhooks.generateTestHeaderString({ payload: body, secret: TEST_WEBHOOK_SECRET }) },
    body,
  });
}

const eventsFor = (sessionId: string, intentId: string) =>
  money.standIn.control
    .events()
    .filter((e) => ['checkout.session.completed', 'payment_intent.succeeded'].includes(e.type))
    .filter((e) => [sessionId, intentId].includes((e.data.object as { id: string }).id));

async function refundsOf(sessionId: string) {
  const session = await money.stripe.checkout.sessions.retrieve(sessionId);
  const intentId = String(session.payment_intent);
  return { intentId, refunds: (await money.stripe.refunds.list({ payment_intent: intentId })).data };
}

const lateMails = (jobId: string) =>
  money.db
    .select()
    .from(mailOutbox)
    .where(eq(mailOutbox.template, 'late_payment_refunded'))
    .then((rows) => rows.filter((row) => row.textBody.includes(jobId)));

/** The mail that reached an address in maildev and matches, waiting for it a while. */
async function mailTo(address: string, matches: (mail: { subject: string; text: string }) => boolean) {
  const deadline = Date.now() + 10_000;
  for (;;) {
    const res = await fetch(`${inject('maildevUrl')}/api/email`);
    const mails = ((await res.json()) as Array<{ subject: string; text: string; to: Array<{ address: string }> }>).filter((m) => m.to.some((t) => t.address === address));
    const found = mails.find(matches);
    if (found || Date.now() > deadline) return found;
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('open payment pages close when the job no longer needs the payment', () => {
  it('when the builder cancels an awarded job with its payment page open, then the page is expired at the provider', async () => {
    const { job, builder } = await awardedJob(31_000);
    const checkout = await builder.post(`/api/jobs/${job.id}/checkout`);
    expect(checkout.status).toBe(200);
    const { sessionId, pay } = await openPaymentPage(checkout.body.url);
    expect((await money.stripe.checkout.sessions.retrieve(sessionId)).status).toBe('open');

    expect((await builder.post(`/api/jobs/${job.id}/cancel`)).status).toBe(200);

    expect((await money.stripe.checkout.sessions.retrieve(sessionId)).status).toBe('expired');
    const refused = await pay();
    expect(refused.status).not.toBe(303);
    expect(await jobStatus(job.id)).toBe('cancelled');
    expect((await jobBalance(money.db, job.id)).paidIn).toBe(0);
  });

  it('when the provider is away at the cancel, then the page is expired later by the task runner, once it is back', async () => {
    const { job, builder } = await awardedJob(32_000);
    const { sessionId } = await openPaymentPage((await builder.post(`/api/jobs/${job.id}/checkout`)).body.url);
    await expiryRefused();
    expect((await builder.post(`/api/jobs/${job.id}/cancel`)).status).toBe(200);
    expect((await money.stripe.checkout.sessions.retrieve(sessionId)).status).toBe('open');

    // Time passes to the retry; the scheduled task expires it with the provider back.
    await money.server.scheduler.runDue(new Date(Date.now() + 10 * 60_000));
    expect((await money.stripe.checkout.sessions.retrieve(sessionId)).status).toBe('expired');
  });
});

describe('a payment that still arrives for a job that cannot take it is refunded once', () => {
  it('when the builder pays on a page left open after cancelling, then one full refund, a balanced ledger, the job stays cancelled and both sides are told', async () => {
    const { job, builder, builderUser, shopUser } = await awardedJob(45_500);
    const { sessionId, pay } = await openPaymentPage((await builder.post(`/api/jobs/${job.id}/checkout`)).body.url);
    await expiryRefused(); // the expiry does not land: the page stays open
    expect((await builder.post(`/api/jobs/${job.id}/cancel`)).status).toBe(200);
    expect((await pay()).status).toBe(303);

    const { intentId, refunds } = await money.until('refunded at the provider', async () => {
      const found = await refundsOf(sessionId);
      return found.refunds.length > 0 && found;
    });
    expect(refunds).toHaveLength(1);
    expect(refunds[0].amount).toBe(45_500);
    await money.until('ledger settled', async () => (await jobBalance(money.db, job.id)).refunded === 45_500);
    const balance = await expectLedgerBalanced(job.id);
    expect(balance).toMatchObject({ paidIn: 45_500, refunded: 45_500, released: 0, fee: 0, held: 0 });
    expect(await jobStatus(job.id)).toBe('cancelled');
    const entries = await money.db.select().from(ledgerEntries).where(eq(ledgerEntries.jobId, job.id));
    expect(entries.map((e) => e.kind).sort()).toEqual(['paid_in', 'refunded']);

    const mails = await lateMails(job.id);
    expect(mails.map((m) => m.toAddress).sort()).toEqual([builderUser.email, shopUser.email].sort());
    const toBuilder = await mailTo(builderUser.email, (m) => /refunded/i.test(m.subject));
    expect(toBuilder?.text).toContain('$455.00');
    expect(toBuilder?.text).toMatch(/after the job was cancelled/);
    expect(await mailTo(shopUser.email, (m) => /refunded/i.test(m.subject))).toBeTruthy();

    // The builder's money view says so.
    const view = await builder.get(`/api/jobs/${job.id}/money`);
    expect(view.status).toBe(200);
    expect(view.body.balance).toMatchObject({ paidIn: 45_500, refunded: 45_500, held: 0 });
    expect(view.body.payments).toEqual([expect.objectContaining({ kind: 'bid', amountCents: 45_500, status: 'refunded' })]);

    // The same events again, one after another and all at once: nothing changes.
    const events = eventsFor(sessionId, intentId);
    expect(events.length).toBeGreaterThanOrEqual(2);
    for (const event of events) expect((await redeliver(event)).status).toBe(200);
    const answers = await Promise.all(events.flatMap((event) => [redeliver(event), redeliver(event), redeliver(event)]));
    expect(answers.every((a) => a.status === 200)).toBe(true);
    expect((await refundsOf(sessionId)).refunds).toHaveLength(1);
    expect(await money.db.select().from(ledgerEntries).where(eq(ledgerEntries.jobId, job.id))).toHaveLength(2);
    expect(await lateMails(job.id)).toHaveLength(2);
    expect(await jobStatus(job.id)).toBe('cancelled');
  });

  it('when the paid events arrive at once, several times each, before anything was applied, then still one refund', async () => {
    const { job, builder } = await awardedJob(27_300);
    const { sessionId, pay } = await openPaymentPage((await builder.post(`/api/jobs/${job.id}/checkout`)).body.url);
    await expiryRefused();
    expect((await builder.post(`/api/jobs/${job.id}/cancel`)).status).toBe(200);
    await money.standIn.control.hold();
    expect((await pay()).status).toBe(303);
    const session = await money.stripe.checkout.sessions.retrieve(sessionId);
    const events = eventsFor(sessionId, String(session.payment_intent));
    expect(events.length).toBeGreaterThanOrEqual(2);
    const answers = await Promise.all(events.flatMap((event) => Array.from({ length: 4 }, () => redeliver(event))));
    expect(answers.every((a) => a.status === 200)).toBe(true);
    await money.standIn.control.release();
    expect(await money.standIn.control.drain()).toBe(true);

    await money.until('ledger settled', async () => (await jobBalance(money.db, job.id)).refunded === 27_300);
    const { refunds } = await refundsOf(sessionId);
    expect(refunds).toHaveLength(1);
    expect(refunds[0].amount).toBe(27_300);
    expect(await expectLedgerBalanced(job.id)).toMatchObject({ paidIn: 27_300, refunded: 27_300, held: 0 });
    expect(await lateMails(job.id)).toHaveLength(2);
    for (const event of events) expect(await money.db.select().from(paymentEvents).where(eq(paymentEvents.id, event.id))).toHaveLength(1);
  });

  it('when the provider refuses the refund at first, then the money worker makes it later with the same key, once', async () => {
    const { job, builder } = await awardedJob(19_900);
    const { sessionId, pay } = await openPaymentPage((await builder.post(`/api/jobs/${job.id}/checkout`)).body.url);
    await expiryRefused();
    expect((await builder.post(`/api/jobs/${job.id}/cancel`)).status).toBe(200);
    await money.standIn.control.hold(); // the app hears of the payment only below
    expect((await pay()).status).toBe(303);

    // The app learns of the payment while the provider refuses refunds.
    const deps = money.server.app.paymentDeps;
    const refusing = Object.create(deps.payments, {
      refunds: {
        value: {
          create: async () => {
            throw new Error('the payment server is away');
          },
        },
      },
    }) as typeof deps.payments;
    await applyCheckoutSession({ ...deps, payments: refusing }, sessionId);
    expect(await expectLedgerBalanced(job.id)).toMatchObject({ paidIn: 19_900, refunded: 0, held: 19_900 });
    const [waiting] = await money.db.select().from(moneyMoves).where(eq(moneyMoves.jobId, job.id));
    expect(waiting).toMatchObject({ kind: 'late_refund', status: 'pending', idempotencyKey: `late-refund-${sessionId}`, amountCents: 19_900 });
    expect(waiting.lastError).toMatch(/away/);
    expect((await refundsOf(sessionId)).refunds).toHaveLength(0);

    // The provider's own deliveries arrive meanwhile: nothing new is planned.
    await money.standIn.control.release();
    expect(await money.standIn.control.drain()).toBe(true);
    expect(await money.db.select().from(moneyMoves).where(eq(moneyMoves.jobId, job.id))).toHaveLength(1);

    // Time passes to the retry; the app's money worker makes the refund with the same key.
    await money.db.update(moneyMoves).set({ nextAttemptAt: new Date(0) }).where(eq(moneyMoves.id, waiting.id));
    await money.until('refunded by the worker', async () => (await jobBalance(money.db, job.id)).refunded === 19_900, 15_000);
    expect((await refundsOf(sessionId)).refunds.map((r) => r.amount)).toEqual([19_900]);
    expect(await expectLedgerBalanced(job.id)).toMatchObject({ paidIn: 19_900, refunded: 19_900, held: 0 });
    expect(await jobStatus(job.id)).toBe('cancelled');
    expect(await lateMails(job.id)).toHaveLength(2);
  });

  it('when a second page for a payment that is already funded gets paid, then that second payment is refunded and the job stays funded with its first', async () => {
    const { job, builderUser } = await money.fundedJob({ totalCents: 21_000 });
    const [payment] = await money.db.select().from(paymentRows).where(eq(paymentRows.jobId, job.id));
    // A second Checkout Session for the same payment (as a lapsed idempotency record would make).
    const second = await money.stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ quantity: 1, price_data: { currency: 'usd', unit_amount: 21_000, product_data: { name: 'Machine work: again' } } }],
      payment_intent_data: { transfer_group: job.id, metadata: { job_id: job.id, payment_id: payment.id } },
      metadata: { job_id: job.id, payment_id: payment.id },
      success_url: 'http://localhost:5999/done',
      cancel_url: 'http://localhost:5999/cancelled',
    });
    const { pay } = await openPaymentPage(second.url!);
    expect((await pay()).status).toBe(303);

    await money.until('refunded at the provider', async () => (await refundsOf(second.id)).refunds.length > 0);
    expect((await refundsOf(second.id)).refunds.map((r) => r.amount)).toEqual([21_000]);
    expect((await refundsOf(payment.checkoutSessionId!)).refunds).toHaveLength(0);
    await money.until('ledger settled', async () => (await jobBalance(money.db, job.id)).refunded === 21_000);
    expect(await expectLedgerBalanced(job.id)).toMatchObject({ paidIn: 42_000, refunded: 21_000, held: 21_000 });
    expect(await jobStatus(job.id)).toBe('funded');
    const [still] = await money.db.select().from(paymentRows).where(eq(paymentRows.id, payment.id));
    expect(still).toMatchObject({ status: 'paid', checkoutSessionId: payment.checkoutSessionId });
    expect((await lateMails(job.id)).map((m) => m.toAddress)).toContain(builderUser.email);

    // The funded job's own money still moves normally: the release pays out the first payment only.
    const admin = await signedIn(money.server.app, await createUser(money.db, { role: 'admin' }));
    expect((await admin.post(`/api/admin/jobs/${job.id}/release`)).status).toBe(200);
    // derived: 21,000 less 8 % (1,680) → 19,320 to the shop
    expect(await expectLedgerBalanced(job.id)).toMatchObject({ paidIn: 42_000, released: 19_320, fee: 1_680, refunded: 21_000, held: 0 });
    expect(await jobStatus(job.id)).toBe('completed');
  });
});

describe('change orders paid when they can no longer be used', () => {
  async function changeOrderPageOpen(amountCents: number) {
    const funded = await money.fundedJob({ totalCents: 60_000 });
    const proposed = await funded.shop.post(`/api/jobs/${funded.job.id}/change-orders`, { description: 'Sleeve cylinder 5 (cracked)', amountCents });
    expect(proposed.status).toBe(201);
    const approve = await funded.builder.post(`/api/change-orders/${proposed.body.changeOrder.id}/approve`);
    expect(approve.status).toBe(200);
    return { ...funded, changeOrderId: proposed.body.changeOrder.id as string, page: await openPaymentPage(approve.body.url) };
  }

  it('when the job is cancelled for a refund while the change order’s page is open, then the page is expired', async () => {
    const { job, builder, page } = await changeOrderPageOpen(9_000);
    expect((await builder.post(`/api/jobs/${job.id}/cancel-and-refund`)).status).toBe(200);
    expect((await money.stripe.checkout.sessions.retrieve(page.sessionId)).status).toBe('expired');
    expect(await expectLedgerBalanced(job.id)).toMatchObject({ paidIn: 60_000, refunded: 60_000, held: 0 });
  });

  it('when a change order is paid after its job was cancelled and refunded, then it is refunded once too and the ledger adds up', async () => {
    const { job, builder, builderUser, shopUser, page } = await changeOrderPageOpen(11_000);
    await expiryRefused(); // the expiry goes first and does not land; the refund of the job's payment then goes through
    expect((await builder.post(`/api/jobs/${job.id}/cancel-and-refund`)).status).toBe(200);
    await money.until('job refunded', async () => (await jobStatus(job.id)) === 'cancelled');
    expect((await page.pay()).status).toBe(303);

    await money.until('change order refunded', async () => (await refundsOf(page.sessionId)).refunds.length > 0);
    expect((await refundsOf(page.sessionId)).refunds.map((r) => r.amount)).toEqual([11_000]);
    await money.until('ledger settled', async () => (await jobBalance(money.db, job.id)).refunded === 71_000);
    expect(await expectLedgerBalanced(job.id)).toMatchObject({ paidIn: 71_000, refunded: 71_000, released: 0, held: 0 });
    expect(await jobStatus(job.id)).toBe('cancelled');
    expect((await lateMails(job.id)).map((m) => m.toAddress).sort()).toEqual([builderUser.email, shopUser.email].sort());

    const session = await money.stripe.checkout.sessions.retrieve(page.sessionId);
    for (const event of eventsFor(page.sessionId, String(session.payment_intent))) expect((await redeliver(event)).status).toBe(200);
    expect((await refundsOf(page.sessionId)).refunds).toHaveLength(1);
    expect(await expectLedgerBalanced(job.id)).toMatchObject({ paidIn: 71_000, refunded: 71_000, held: 0 });
    expect(await lateMails(job.id)).toHaveLength(2);
  });

  it('when a change order is paid after the job’s money was paid out, then it is refunded and the payout is not touched', async () => {
    const { job, builderUser, shopUser, page } = await changeOrderPageOpen(4_400);
    const admin = await signedIn(money.server.app, await createUser(money.db, { role: 'admin' }));
    await expiryRefused(); // the expiry goes first and does not land; the payout then goes through
    expect((await admin.post(`/api/admin/jobs/${job.id}/release`)).status).toBe(200);
    await money.until('paid out', async () => (await jobStatus(job.id)) === 'completed');
    expect((await page.pay()).status).toBe(303);

    await money.until('change order refunded', async () => (await refundsOf(page.sessionId)).refunds.length > 0);
    expect((await refundsOf(page.sessionId)).refunds.map((r) => r.amount)).toEqual([4_400]);
    await money.until('ledger settled', async () => (await jobBalance(money.db, job.id)).refunded === 4_400);
    // derived: 60,000 less 8 % (4,800) → 55,200 to the shop; the 4,400 back to the builder
    expect(await expectLedgerBalanced(job.id)).toMatchObject({ paidIn: 64_400, released: 55_200, fee: 4_800, refunded: 4_400, held: 0 });
    expect((await money.stripe.transfers.list({ transfer_group: job.id })).data.map((t) => t.amount)).toEqual([55_200]);
    expect(await jobStatus(job.id)).toBe('completed');
    const mails = await lateMails(job.id);
    expect(mails.map((m) => m.toAddress).sort()).toEqual([builderUser.email, shopUser.email].sort());
    expect(mails[0].textBody).toMatch(/already settled/);
  });

  it('when the builder declines an agreed change order and then pays its still-open page, then that payment is refunded and the job goes on', async () => {
    const { job, builder, builderUser, shopUser, changeOrderId, page } = await changeOrderPageOpen(7_500);
    await expiryRefused();
    const declined = await builder.post(`/api/change-orders/${changeOrderId}/decline`);
    expect(declined.status).toBe(200);
    expect(declined.body.changeOrder.status).toBe('declined');
    expect((await page.pay()).status).toBe(303);

    await money.until('change order refunded', async () => (await refundsOf(page.sessionId)).refunds.length > 0);
    expect((await refundsOf(page.sessionId)).refunds.map((r) => r.amount)).toEqual([7_500]);
    await money.until('ledger settled', async () => (await jobBalance(money.db, job.id)).refunded === 7_500);
    expect(await expectLedgerBalanced(job.id)).toMatchObject({ paidIn: 67_500, refunded: 7_500, held: 60_000 });
    expect(await jobStatus(job.id)).toBe('funded');
    const [order] = await money.db.select().from(changeOrders).where(eq(changeOrders.id, changeOrderId));
    expect(order.status).toBe('declined');
    expect((await lateMails(job.id)).map((m) => m.toAddress).sort()).toEqual([builderUser.email, shopUser.email].sort());
    const paid = await money.db.select().from(paymentRows).where(and(eq(paymentRows.changeOrderId, changeOrderId), eq(paymentRows.status, 'paid')));
    expect(paid).toHaveLength(0);
  });

  it('when the builder declines an agreed change order whose page is open, then the page is expired', async () => {
    const { builder, changeOrderId, page } = await changeOrderPageOpen(6_000);
    expect((await builder.post(`/api/change-orders/${changeOrderId}/decline`)).status).toBe(200);
    expect((await money.stripe.checkout.sessions.retrieve(page.sessionId)).status).toBe('expired');
  });
});
