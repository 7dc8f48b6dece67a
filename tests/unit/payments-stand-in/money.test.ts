import type Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { createSession, harnessWithReceiverEachTest, paidSession, payOnPage, postForm, readForm, readyAccount, submitHostedPage } from '../../setup/payments';

const run = harnessWithReceiverEachTest();

const eventsOfType = (type: string) => run.receiver.all.filter((r) => r.event.type === type).map((r) => r.event);

describe('the hosted payment page', () => {
  it('when the success card pays, then the browser goes to success_url, the session is paid, and the three events arrive', async () => {
    const session = await createSession(run.harness.stripe);
    const page = await fetch(session.url!);
    const html = await page.text();
    expect(html).toContain('Local test payment page');
    expect(html).toContain('$1,250.00');

    const answer = await payOnPage(session.url!, '4242 4242 4242 4242');
    expect(answer.status).toBe(303);
    expect(answer.headers.get('location')).toBe(`http://127.0.0.1:5999/jobs/42/funded?session=${session.id}`);

    const paid = await run.harness.stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent', 'payment_intent.latest_charge'] });
    expect(paid).toMatchObject({ status: 'complete', payment_status: 'paid' });
    const intent = paid.payment_intent as Stripe.PaymentIntent;
    expect(intent.id).toMatch(/^pi_/);
    expect(intent).toMatchObject({ status: 'succeeded', amount: 125_000, amount_received: 125_000, currency: 'usd', transfer_group: 'job_42', metadata: { job_id: 'job_42' } });
    const charge = intent.latest_charge as Stripe.Charge;
    expect(charge.id).toMatch(/^ch_/);
    expect(charge).toMatchObject({ status: 'succeeded', paid: true, amount: 125_000, amount_refunded: 0, refunded: false, transfer_group: 'job_42', payment_intent: intent.id });
    expect(await run.harness.stripe.paymentIntents.retrieve(intent.id)).toMatchObject({ latest_charge: charge.id });
    expect(await run.harness.stripe.charges.retrieve(charge.id)).toMatchObject({ id: charge.id, balance_transaction: expect.stringMatching(/^txn_/) });

    await run.harness.standIn.control.drain();
    expect(run.receiver.types()).toEqual(['charge.succeeded', 'payment_intent.succeeded', 'checkout.session.completed']);
    const completed = eventsOfType('checkout.session.completed')[0];
    expect(completed.data.object).toMatchObject({ id: session.id, payment_status: 'paid', payment_intent: intent.id, metadata: { job_id: 'job_42' } });
  });

  it.each([
    ['4000000000000002', 'generic_decline', 'The bank declined this card.'],
    ['4000000000009995', 'insufficient_funds', 'The bank declined this card: there are not enough funds for this payment.'],
  ])('when card %s is declined (%s), then the page shows the reason, payment_intent.payment_failed is sent, and another card can still pay', async (card, declineCode, message) => {
    const session = await createSession(run.harness.stripe);
    const answer = await payOnPage(session.url!, card);
    expect(answer.status).toBe(402);
    const html = await answer.text();
    expect(html).toContain(message);
    expect(readForm(html).action).toBe(`/pay/${session.id}`);

    const open = await run.harness.stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
    expect(open).toMatchObject({ status: 'open', payment_status: 'unpaid' });
    expect((open.payment_intent as Stripe.PaymentIntent).last_payment_error).toMatchObject({ code: 'card_declined', decline_code: declineCode, message });

    await run.harness.standIn.control.drain();
    const failed = eventsOfType('payment_intent.payment_failed');
    expect(failed).toHaveLength(1);
    expect((failed[0].data.object as Stripe.PaymentIntent).last_payment_error?.decline_code).toBe(declineCode);
    expect(run.receiver.types()).not.toContain('checkout.session.completed');

    const retry = await payOnPage(session.url!, '4242424242424242');
    expect(retry.status).toBe(303);
    const paid = await run.harness.stripe.checkout.sessions.retrieve(session.id);
    expect(paid.payment_status).toBe('paid');
    expect(paid.payment_intent).toBe(open.payment_intent && (open.payment_intent as Stripe.PaymentIntent).id);
  });

  it('when the 3-D Secure card is used, then an authentication step appears; approving pays', async () => {
    const session = await createSession(run.harness.stripe);
    const answer = await payOnPage(session.url!, '4000002760003184');
    expect(answer.status).toBe(200);
    const html = await answer.text();
    expect(html).toContain('Confirm this payment with your bank');
    expect(html).toContain('>Approve this payment</button>');
    expect(html).toContain('>Decline this payment</button>');
    const step = readForm(html);
    expect(step.action).toBe(`/pay/${session.id}/authenticate`);
    const pending = await run.harness.stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
    expect((pending.payment_intent as Stripe.PaymentIntent).status).toBe('requires_action');

    const approved = await postForm(new URL(step.action, session.url!).toString(), { outcome: 'approve' });
    expect(approved.status).toBe(303);
    expect((await run.harness.stripe.checkout.sessions.retrieve(session.id)).payment_status).toBe('paid');
  });

  it('when the 3-D Secure step is failed, then payment_intent.payment_failed is sent with the reason and the card form comes back', async () => {
    const session = await createSession(run.harness.stripe);
    await payOnPage(session.url!, '4000002760003184');
    const failed = await postForm(`${run.harness.standIn.url}/pay/${session.id}/authenticate`, { outcome: 'fail' });
    expect(failed.status).toBe(402);
    expect(await failed.text()).toContain('The bank could not confirm this payment.');
    await run.harness.standIn.control.drain();
    const event = eventsOfType('payment_intent.payment_failed')[0];
    expect((event.data.object as Stripe.PaymentIntent).last_payment_error?.code).toBe('payment_intent_authentication_failure');
    expect((await run.harness.stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
  });

  it.each([
    [{ card_number: '4242 4242' }, 'The card number is not complete.'],
    [{ card_number: '4242424242424242', exp: '12' }, 'The expiry date is not complete: write it as MM / YY.'],
    [{ card_number: '4242424242424242', exp: '13 / 34' }, 'The expiry month must be from 01 to 12.'],
    [{ card_number: '4242424242424242', exp: '01 / 20' }, 'This card has expired: its expiry date has passed.'],
  ])('when the card fields are %o, then the page says in plain words what to fix and nothing is paid', async (changes, sentence) => {
    const session = await createSession(run.harness.stripe);
    const answer = await submitHostedPage(session.url!, changes);
    expect(answer.status).toBe(400);
    expect(await answer.text()).toContain(sentence);
    expect((await run.harness.stripe.checkout.sessions.retrieve(session.id)).payment_status).toBe('unpaid');
  });

  it('when a card number is not a test card, then the page refuses it and nothing is sent', async () => {
    const session = await createSession(run.harness.stripe);
    const answer = await payOnPage(session.url!, '5555555555554444');
    expect(answer.status).toBe(400);
    expect(await answer.text()).toContain('test cards');
    await run.harness.standIn.control.drain();
    expect(run.receiver.all).toHaveLength(0);
  });
});

describe('transfers', () => {
  it('when the destination has not finished onboarding, then the transfer is refused', async () => {
    const { charge } = await paidSession(run.harness.stripe);
    const account = await run.harness.stripe.accounts.create({ type: 'express', capabilities: { transfers: { requested: true } } });
    await expect(
      run.harness.stripe.transfers.create({ amount: 1000, currency: 'usd', destination: account.id, source_transaction: charge.id }),
    ).rejects.toMatchObject({ statusCode: 400, code: 'insufficient_capabilities_for_transfer', param: 'destination' });
  });

  it('when transfers from a charge would exceed it, then the excess is refused; within it they are created with tr_ ids and transfer.created', async () => {
    const { charge } = await paidSession(run.harness.stripe);
    const shop = await readyAccount(run.harness);
    await expect(
      run.harness.stripe.transfers.create({ amount: 125_001, currency: 'usd', destination: shop.id, source_transaction: charge.id }),
    ).rejects.toMatchObject({ statusCode: 400, code: 'balance_insufficient' });

    const transfer = await run.harness.stripe.transfers.create({
      amount: 112_500,
      currency: 'usd',
      destination: shop.id,
      transfer_group: 'job_42',
      source_transaction: charge.id,
      metadata: { job_id: 'job_42' },
    });
    expect(transfer.id).toMatch(/^tr_/);
    expect(transfer).toMatchObject({ amount: 112_500, destination: shop.id, source_transaction: charge.id, transfer_group: 'job_42', reversed: false });
    await expect(
      run.harness.stripe.transfers.create({ amount: 12_501, currency: 'usd', destination: shop.id, source_transaction: charge.id }),
    ).rejects.toMatchObject({ code: 'balance_insufficient' });

    await run.harness.standIn.control.drain();
    expect(run.receiver.types()).toContain('transfer.created');
  });

  it('when there is no source_transaction, then the available balance decides (charges stay pending until settled)', async () => {
    await paidSession(run.harness.stripe);
    const shop = await readyAccount(run.harness);
    await expect(run.harness.stripe.transfers.create({ amount: 1000, currency: 'usd', destination: shop.id })).rejects.toMatchObject({
      code: 'balance_insufficient',
    });
    const balance = await run.harness.stripe.balance.retrieve();
    expect(balance.pending[0]).toMatchObject({ amount: 125_000, currency: 'usd' });
    await run.harness.standIn.control.settleFunds();
    await expect(run.harness.stripe.transfers.create({ amount: 1000, currency: 'usd', destination: shop.id })).resolves.toMatchObject({ amount: 1000 });
    expect((await run.harness.stripe.balance.retrieve()).available[0].amount).toBe(124_000);
  });

  it('when transfers are listed by transfer_group, then only that group comes back', async () => {
    const a = await paidSession(run.harness.stripe);
    const b = await paidSession(run.harness.stripe, { payment_intent_data: { transfer_group: 'job_43' } });
    const shop = await readyAccount(run.harness);
    const ta = await run.harness.stripe.transfers.create({ amount: 100, currency: 'usd', destination: shop.id, transfer_group: 'job_42', source_transaction: a.charge.id });
    await run.harness.stripe.transfers.create({ amount: 100, currency: 'usd', destination: shop.id, transfer_group: 'job_43', source_transaction: b.charge.id });
    const list = await run.harness.stripe.transfers.list({ transfer_group: 'job_42' });
    expect(list.data.map((t) => t.id)).toEqual([ta.id]);
    expect(await run.harness.stripe.transfers.retrieve(ta.id)).toMatchObject({ id: ta.id, amount: 100 });
  });

  it('when a transfer is reversed, then trr_ reversal, amount_reversed, transfer.reversed, and the amount can be transferred again', async () => {
    const { charge } = await paidSession(run.harness.stripe);
    const shop = await readyAccount(run.harness);
    const transfer = await run.harness.stripe.transfers.create({ amount: 125_000, currency: 'usd', destination: shop.id, source_transaction: charge.id });
    const reversal = await run.harness.stripe.transfers.createReversal(transfer.id, { amount: 25_000 });
    expect(reversal.id).toMatch(/^trr_/);
    expect(reversal).toMatchObject({ object: 'transfer_reversal', amount: 25_000, transfer: transfer.id });
    expect(await run.harness.stripe.transfers.retrieve(transfer.id)).toMatchObject({ amount_reversed: 25_000, reversed: false });
    await expect(run.harness.stripe.transfers.createReversal(transfer.id, { amount: 100_001 })).rejects.toMatchObject({ statusCode: 400 });
    await run.harness.stripe.transfers.createReversal(transfer.id);
    expect(await run.harness.stripe.transfers.retrieve(transfer.id)).toMatchObject({ amount_reversed: 125_000, reversed: true });
    expect((await run.harness.stripe.transfers.listReversals(transfer.id)).data).toHaveLength(2);
    await expect(
      run.harness.stripe.transfers.create({ amount: 125_000, currency: 'usd', destination: shop.id, source_transaction: charge.id }),
    ).resolves.toMatchObject({ amount: 125_000 });
    await run.harness.standIn.control.drain();
    const reversed = eventsOfType('transfer.reversed');
    expect(reversed).toHaveLength(2);
    expect(reversed[0].data.previous_attributes).toMatchObject({ amount_reversed: 0 });
  });
});

describe('refunds', () => {
  it('when a partial refund is made, then re_ refund, charge.amount_refunded, refund.created and charge.refunded; more than remains is refused', async () => {
    const { intent, charge } = await paidSession(run.harness.stripe);
    const refund = await run.harness.stripe.refunds.create({ payment_intent: intent.id, amount: 50_000 });
    expect(refund.id).toMatch(/^re_/);
    expect(refund).toMatchObject({ amount: 50_000, charge: charge.id, payment_intent: intent.id, status: 'succeeded' });
    expect(await run.harness.stripe.charges.retrieve(charge.id)).toMatchObject({ amount_refunded: 50_000, refunded: false });

    await expect(run.harness.stripe.refunds.create({ charge: charge.id, amount: 75_001 })).rejects.toMatchObject({
      statusCode: 400,
      code: 'amount_too_large',
    });
    const rest = await run.harness.stripe.refunds.create({ charge: charge.id });
    expect(rest.amount).toBe(75_000);
    expect(await run.harness.stripe.charges.retrieve(charge.id)).toMatchObject({ amount_refunded: 125_000, refunded: true });
    await expect(run.harness.stripe.refunds.create({ payment_intent: intent.id, amount: 1 })).rejects.toMatchObject({ code: 'charge_already_refunded' });

    await run.harness.standIn.control.drain();
    expect(eventsOfType('refund.created')).toHaveLength(2);
    const refunded = eventsOfType('charge.refunded');
    expect(refunded.map((e) => (e.data.object as Stripe.Charge).amount_refunded)).toEqual([50_000, 125_000]);
  });

  it('when part of a charge was refunded, then transfers from it are capped at what is left', async () => {
    const { intent, charge } = await paidSession(run.harness.stripe);
    const shop = await readyAccount(run.harness);
    await run.harness.stripe.refunds.create({ payment_intent: intent.id, amount: 25_000 });
    await expect(
      run.harness.stripe.transfers.create({ amount: 100_001, currency: 'usd', destination: shop.id, source_transaction: charge.id }),
    ).rejects.toMatchObject({ code: 'balance_insufficient' });
    await expect(
      run.harness.stripe.transfers.create({ amount: 100_000, currency: 'usd', destination: shop.id, source_transaction: charge.id }),
    ).resolves.toMatchObject({ amount: 100_000 });
  });

  it('when the payment intent has not succeeded, then a refund is refused', async () => {
    const session = await createSession(run.harness.stripe);
    await payOnPage(session.url!, '4000000000000002');
    const open = await run.harness.stripe.checkout.sessions.retrieve(session.id);
    await expect(run.harness.stripe.refunds.create({ payment_intent: open.payment_intent as string })).rejects.toMatchObject({ statusCode: 400 });
  });
});
