import { and, asc, eq, inArray, lte, ne, sql } from 'drizzle-orm';
import type Stripe from 'stripe';
import { formatCents } from '../../../shared/catalogue';
import { NAMES } from '../../../shared/glossary';
import type { Database, Executor } from '../../db/client';
import { bids, changeOrders, jobs, moneyMoves, payments, shops, type User } from '../../db/schema';
import { assertEmailConfirmed } from '../../lib/auth/guards';
import { AppError, conflict, notFound } from '../../lib/errors';
import { enqueueMail } from '../../lib/mail/outbox';
import { latePaymentRefundedMail, paymentReceiptMail, payoutSentMail, refundSentMail, type LatePaymentReason } from '../../lib/mail/templates';
import type { PaymentsClient } from '../../lib/payments-client';
import type { RealtimeHub } from '../../realtime/hub';
import { mustBeBuilder, mustSeeMoney, partiesOf } from '../jobs/job-access';
import { findJob } from '../jobs/jobs.repository';
import { findShopByUser } from '../shops/shops.repository';
import { recordAdminAction } from '../admin/audit';
import { Notices } from '../notifications/notify';
import { receiptNumberOnPaid } from './document-numbers';
import { appendLedger, feeFor, jobBalance } from './ledger';
import { closeOpenCheckouts, expireCheckoutSession, expireOpenCheckouts, scheduleCheckoutExpiry } from './open-checkouts';

export interface PaymentDeps {
  db: Database;
  payments: PaymentsClient;
  appUrl: string;
  hub?: RealtimeHub;
  currency?: string;
}

const currencyOf = (deps: PaymentDeps) => deps.currency ?? 'usd';

// ---------------------------------------------------------------------------
// Shop payout accounts

/** Makes (once) the shop's connected account and an onboarding link for it. */
export async function startPayoutOnboarding(deps: PaymentDeps, user: User): Promise<{ url: string }> {
  const shop = await findShopByUser(deps.db, user.id);
  if (!shop) throw conflict('Set up your shop profile first.', 'no_shop_profile');
  let accountId = shop.payoutAccountId;
  if (!accountId) {
    const account = await deps.payments.accounts.create(
      { type: 'express', email: user.email, capabilities: { transfers: { requested: true } }, metadata: { shop_id: shop.id } },
      { idempotencyKey: `payout-account-${shop.id}` },
    );
    accountId = account.id;
    await deps.db.update(shops).set({ payoutAccountId: accountId }).where(and(eq(shops.id, shop.id), sql`${shops.payoutAccountId} IS NULL`));
    const [fresh] = await deps.db.select({ id: shops.payoutAccountId }).from(shops).where(eq(shops.id, shop.id));
    accountId = fresh.id!;
  }
  const link = await deps.payments.accountLinks.create({
    account: accountId,
    type: 'account_onboarding',
    refresh_url: `${deps.appUrl}/shop/profile?payouts=refresh`,
    return_url: `${deps.appUrl}/shop/profile?payouts=return`,
  });
  return { url: link.url };
}

/** An account the provider says can receive transfers is ready for payouts. */
export async function applyAccount(tx: Executor, account: Stripe.Account): Promise<void> {
  const ready = account.capabilities?.transfers === 'active';
  await tx
    .update(shops)
    .set({ payoutsReadyAt: ready ? sql`coalesce(${shops.payoutsReadyAt}, now())` : null })
    .where(eq(shops.payoutAccountId, account.id));
}

// ---------------------------------------------------------------------------
// Paying in

async function checkoutFor(deps: PaymentDeps, payment: typeof payments.$inferSelect, title: string) {
  return deps.payments.checkout.sessions.create(
    {
      mode: 'payment',
      line_items: [
        {
          quantity: 1,
          price_data: { currency: payment.currency, unit_amount: payment.amountCents, product_data: { name: title } },
        },
      ],
      payment_intent_data: { transfer_group: payment.jobId, metadata: { job_id: payment.jobId, payment_id: payment.id } },
      metadata: { job_id: payment.jobId, payment_id: payment.id },
      success_url: `${deps.appUrl}/jobs/${payment.jobId}?payment=done&session={CHECKOUT_SESSION_ID}`,
      cancel_url: `${deps.appUrl}/jobs/${payment.jobId}?payment=cancelled`,
    },
    { idempotencyKey: `checkout-${payment.id}` },
  );
}

/**
 * The builder pays the accepted bid's total. A pending payment is reused, so
 * pressing Pay twice makes one Checkout Session.
 */
export async function startJobCheckout(deps: PaymentDeps, user: User, jobId: string): Promise<{ url: string }> {
  assertEmailConfirmed(user, 'pay');
  const job = mustBeBuilder(await findJob(deps.db, jobId), user);
  if (job.status !== 'awarded' || !job.awardedBidId) throw conflict('Only a job with an accepted bid waits for payment.', 'job_not_awarded');
  const [bid] = await deps.db.select().from(bids).where(eq(bids.id, job.awardedBidId));
  const payment = await deps.db.transaction(async (tx) => {
    // Under the job's lock, as a cancel takes it: no payment starts for a job cancelled a moment ago.
    const locked = await findJob(tx, job.id, { forUpdate: true });
    if (locked?.status !== 'awarded' || locked.awardedBidId !== bid.id) throw conflict('Only a job with an accepted bid waits for payment.', 'job_not_awarded');
    const [existing] = await tx
      .select()
      .from(payments)
      .where(and(eq(payments.jobId, job.id), eq(payments.kind, 'bid'), inArray(payments.status, ['pending', 'paid'])))
      .for('update');
    if (existing?.status === 'paid') throw conflict('This job is already paid.', 'already_paid');
    if (existing) return existing;
    const [created] = await tx.insert(payments).values({ jobId: job.id, kind: 'bid', bidId: bid.id, amountCents: bid.totalCents, currency: currencyOf(deps) }).returning();
    return created;
  });
  const session = await checkoutFor(deps, payment, `Machine work: ${job.title}`);
  return keepSession(deps, payment, session);
}

/**
 * Records the payment's page. A page that replaces an older one (the provider
 * made a new session for the same payment) retires the old one; a payment that
 * stopped waiting while the page was being made (the job was cancelled) gets
 * its new page expired at once instead of handed out.
 */
async function keepSession(deps: PaymentDeps, payment: typeof payments.$inferSelect, session: Stripe.Checkout.Session): Promise<{ url: string }> {
  const kept = await deps.db.transaction(async (tx) => {
    const [row] = await tx.select().from(payments).where(eq(payments.id, payment.id)).for('update');
    if (row.status !== 'pending') return row.status === 'paid' ? ('paid' as const) : false;
    if (row.checkoutSessionId && row.checkoutSessionId !== session.id) await scheduleCheckoutExpiry(tx, row.jobId, row.checkoutSessionId);
    await tx.update(payments).set({ checkoutSessionId: session.id }).where(eq(payments.id, payment.id));
    return true;
  });
  if (kept !== true) {
    if (kept === 'paid') throw conflict('This is already paid.', 'already_paid');
    await expireCheckoutSession(deps.payments, session.id).catch(() => {});
    throw conflict('This payment is no longer needed.', 'payment_not_needed');
  }
  await expireOpenCheckouts(deps, payment.jobId);
  return { url: session.url! };
}

/** The builder pays an approved change order; an unpaid earlier attempt is reused. */
export async function startChangeOrderCheckout(
  deps: PaymentDeps,
  job: { id: string; title: string },
  order: typeof changeOrders.$inferSelect,
): Promise<{ url: string }> {
  const payment = await deps.db.transaction(async (tx) => {
    // Under the job's lock, as a decline, a cancel or the job's settlement takes it.
    const locked = await findJob(tx, job.id, { forUpdate: true });
    const [current] = await tx.select({ status: changeOrders.status }).from(changeOrders).where(eq(changeOrders.id, order.id));
    if (!locked || !CHANGE_ORDER_PAYABLE.has(locked.status) || current?.status !== 'approved') {
      throw conflict('This extra work can no longer be paid.', 'change_order_settled');
    }
    const [existing] = await tx
      .select()
      .from(payments)
      .where(and(eq(payments.changeOrderId, order.id), inArray(payments.status, ['pending', 'paid'])))
      .for('update');
    if (existing?.status === 'paid') throw conflict('This extra work is already paid.', 'already_paid');
    if (existing) return existing;
    const [created] = await tx
      .insert(payments)
      .values({ jobId: job.id, kind: 'change_order', changeOrderId: order.id, amountCents: order.amountCents, currency: currencyOf(deps) })
      .returning();
    return created;
  });
  const session = await checkoutFor(deps, payment, `Extra work on ${job.title}: ${order.description}`.slice(0, 250));
  return keepSession(deps, payment, session);
}

/** Where a change order's checkout may be opened (the builder agrees while the work is on). */
const CHANGE_ORDER_PAYABLE = new Set(['funded', 'in_work']);
/** Where a change order's payment may still arrive and be held with the rest (before the job's money is decided). */
const CHANGE_ORDER_RECEIVABLE = new Set(['funded', 'in_work', 'inspection_submitted', 'disputed']);

/**
 * A Checkout Session finished. The session is read back from the API (never
 * trusted from the event alone) and, when paid, the payment, its ledger entry
 * and the job's new state are written in one transaction, once. Money that
 * arrives when the job can no longer take it (see whyNotTaken) is entered and
 * sent back in full instead, also once.
 */
export async function applyCheckoutSession(deps: PaymentDeps, sessionId: string): Promise<void> {
  const session = await deps.payments.checkout.sessions.retrieve(sessionId, { expand: ['payment_intent.latest_charge'] });
  const paymentId = session.metadata?.payment_id;
  if (!paymentId) return;
  const intent = session.payment_intent as Stripe.PaymentIntent | null;
  const charge = intent && typeof intent === 'object' ? (intent.latest_charge as Stripe.Charge | null) : null;
  const [known] = await deps.db.select({ jobId: payments.jobId }).from(payments).where(eq(payments.id, paymentId));
  if (!known) return;
  const jobId = known.jobId;
  let lateMoveId: string | undefined;
  const notices = new Notices();
  await deps.db.transaction(async (tx) => {
    // The job's row lock first, as a cancel, a decline and the money's settlement take it: a payment and the change that ends its need never pass each other.
    const job = (await findJob(tx, jobId, { forUpdate: true }))!;
    const [payment] = await tx.select().from(payments).where(eq(payments.id, paymentId)).for('update');
    if (session.status === 'expired' && payment.status === 'pending') {
      await tx.update(payments).set({ status: 'expired' }).where(eq(payments.id, payment.id));
      return;
    }
    if (session.payment_status !== 'paid' || !intent || !charge) return;
    // This money is entered already (taken, or sent back): a repeated or concurrent delivery changes nothing.
    const [seen] = await tx.select({ id: payments.id }).from(payments).where(and(eq(payments.jobId, jobId), eq(payments.chargeId, charge.id)));
    if (seen) return;
    if (session.amount_total !== payment.amountCents) throw new Error(`paid ${session.amount_total} for a payment of ${payment.amountCents}`);
    const reason = await whyNotTaken(tx, job, payment);
    if (reason) {
      lateMoveId = await sendBackLatePayment(deps, tx, { job, payment, session, intent, charge, reason });
      return;
    }
    await tx
      .update(payments)
      .set({ status: 'paid', paidAt: new Date(), paymentIntentId: intent.id, chargeId: charge.id, checkoutSessionId: session.id, failureMessage: null, receiptNumber: receiptNumberOnPaid() })
      .where(eq(payments.id, payment.id));
    // Another page made for the same payment is no longer wanted.
    if (payment.checkoutSessionId && payment.checkoutSessionId !== session.id) await scheduleCheckoutExpiry(tx, jobId, payment.checkoutSessionId);
    await appendLedger(tx, { jobId: payment.jobId, paymentId: payment.id, kind: 'paid_in', amountCents: payment.amountCents, reference: charge.id });
    if (payment.kind === 'bid') {
      await tx.update(jobs).set({ status: 'funded' }).where(and(eq(jobs.id, payment.jobId), eq(jobs.status, 'awarded')));
    } else if (payment.changeOrderId) {
      await tx.update(changeOrders).set({ status: 'paid' }).where(eq(changeOrders.id, payment.changeOrderId));
    }
    const parties = await mailPartiesOf(tx, job.id);
    const receipt = { jobTitle: job.title, amountCents: payment.amountCents, what: payment.kind === 'bid' ? 'the accepted bid' : 'extra work', url: `${deps.appUrl}/jobs/${job.id}` };
    await enqueueMail(tx, parties.builderEmail, paymentReceiptMail({ ...receipt, name: parties.builderName, side: 'builder' }));
    if (parties.shopEmail) await enqueueMail(tx, parties.shopEmail, paymentReceiptMail({ ...receipt, name: parties.shopName!, side: 'shop' }));
    const held = `${formatCents(payment.amountCents)} for ${receipt.what} on “${job.title}” is paid and held`;
    const href = `/jobs/${job.id}`;
    await notices.add(tx, parties.builderId, 'payment_held', { jobId: job.id, text: `${held} until you accept the results.`, href });
    if (parties.shopUserId) await notices.add(tx, parties.shopUserId, 'payment_held', { jobId: job.id, text: `${held}: it is paid out to you when the builder accepts the results.`, href });
  });
  notices.announce(deps.hub);
  await expireOpenCheckouts(deps, jobId);
  if (lateMoveId) await runMove(deps, lateMoveId);
  deps.hub?.jobChanged(jobId, 'job_updated');
}

const SETTLED = new Set(['completed', 'resolved']);

/**
 * Why a paid session cannot be taken, or null when the job is waiting for it:
 * a bid payment while the job is awarded to that bid and the payment waits; a
 * change order's while it is agreed and unpaid and the job's money is not yet
 * decided. Runs under the job's and the payment's row locks.
 */
async function whyNotTaken(tx: Executor, job: typeof jobs.$inferSelect, payment: typeof payments.$inferSelect): Promise<LatePaymentReason | null> {
  if (job.status === 'cancelled') return 'job_cancelled';
  if (SETTLED.has(job.status)) return 'job_finished';
  if (payment.kind === 'bid') {
    if (job.status !== 'awarded' || (payment.bidId && payment.bidId !== job.awardedBidId)) return job.status === 'draft' || job.status === 'open' ? 'job_cancelled' : 'already_paid';
    return payment.status === 'pending' ? null : 'already_paid';
  }
  const [order] = payment.changeOrderId ? await tx.select().from(changeOrders).where(eq(changeOrders.id, payment.changeOrderId)) : [];
  if (!order || order.status === 'declined') return 'change_order_declined';
  if (order.status === 'paid' || payment.status === 'paid') return 'already_paid';
  if (!CHANGE_ORDER_RECEIVABLE.has(job.status)) return 'job_finished';
  // Once the job's money is decided (released, refunded or split), nothing more can join it.
  const [decided] = await tx.select({ id: moneyMoves.id }).from(moneyMoves).where(and(eq(moneyMoves.jobId, job.id), ne(moneyMoves.kind, 'late_refund'))).limit(1);
  if (decided) return 'job_finished';
  return payment.status === 'pending' ? null : 'change_order_declined';
}

/**
 * Enters money that cannot be used and plans sending it back in full, in the
 * caller's transaction: the payment in the ledger, a refund keyed by the
 * session (so it is made once however often this runs or is retried), and a
 * mail to the builder and the shop. The refund itself runs after the commit,
 * and the money worker retries it while the provider is away.
 */
async function sendBackLatePayment(
  deps: PaymentDeps,
  tx: Executor,
  late: { job: typeof jobs.$inferSelect; payment: typeof payments.$inferSelect; session: Stripe.Checkout.Session; intent: Stripe.PaymentIntent; charge: Stripe.Charge; reason: LatePaymentReason },
): Promise<string | undefined> {
  const { job, payment, session, intent, charge, reason } = late;
  const amountCents = session.amount_total ?? payment.amountCents;
  const money = { status: 'refunded' as const, paidAt: new Date(), paymentIntentId: intent.id, chargeId: charge.id, checkoutSessionId: session.id, failureMessage: null };
  let rowId = payment.id;
  if (payment.status === 'paid' || payment.status === 'refunded') {
    // The payment was settled by another page: this money gets a row of its own.
    const [row] = await tx
      .insert(payments)
      .values({ jobId: job.id, kind: payment.kind, bidId: payment.bidId, changeOrderId: payment.changeOrderId, amountCents, currency: payment.currency, ...money })
      .returning({ id: payments.id });
    rowId = row.id;
  } else {
    await tx.update(payments).set(money).where(eq(payments.id, payment.id));
  }
  await appendLedger(tx, { jobId: job.id, paymentId: rowId, kind: 'paid_in', amountCents, reference: charge.id });
  const [move] = await tx
    .insert(moneyMoves)
    .values({ jobId: job.id, paymentId: rowId, kind: 'late_refund', amountCents, idempotencyKey: `late-refund-${session.id}` })
    .onConflictDoNothing()
    .returning({ id: moneyMoves.id });

  const parties = await mailPartiesOf(tx, job.id, payment);
  const mail = { jobTitle: job.title, amountCents, reason, what: payment.kind === 'bid' ? 'the accepted bid' : 'extra work', url: `${deps.appUrl}/jobs/${job.id}` };
  await enqueueMail(tx, parties.builderEmail, latePaymentRefundedMail({ ...mail, name: parties.builderName, side: 'builder' }));
  if (parties.shopEmail) await enqueueMail(tx, parties.shopEmail, latePaymentRefundedMail({ ...mail, name: parties.shopName!, side: 'shop' }));
  return move?.id;
}

/** Remembers why a card was refused, for the builder's page. */
export async function applyPaymentFailed(deps: PaymentDeps, intent: Stripe.PaymentIntent): Promise<void> {
  const paymentId = intent.metadata?.payment_id;
  if (!paymentId) return;
  const message = intent.last_payment_error?.message ?? 'The payment did not go through.';
  const [updated] = await deps.db
    .update(payments)
    .set({ failureMessage: message })
    .where(and(eq(payments.id, paymentId), eq(payments.status, 'pending')))
    .returning({ jobId: payments.jobId });
  // An open job page shows the refusal without a reload, as it shows a success.
  if (updated) deps.hub?.jobChanged(updated.jobId, 'job_updated');
}

/** Whom a job's money mails go to: its builder and the shop doing the work (with a payment, the shop it was for). */
async function mailPartiesOf(tx: Executor, jobId: string, payment?: Pick<typeof payments.$inferSelect, 'bidId' | 'changeOrderId'>) {
  const { builder, shop } = await partiesOf(tx, jobId, { payment });
  return { builderId: builder.id, builderEmail: builder.email, builderName: builder.displayName, shopUserId: shop?.userId, shopEmail: shop?.email, shopName: shop?.name };
}

// ---------------------------------------------------------------------------
// Paying out and refunding

async function awardedShop(tx: Executor, jobId: string) {
  const job = await findJob(tx, jobId);
  if (!job?.awardedBidId) throw conflict('This job has no accepted bid.', 'job_not_awarded');
  const [shop] = await tx.select().from(shops).innerJoin(bids, eq(bids.shopId, shops.id)).where(eq(bids.id, job.awardedBidId));
  return { job, shop: shop.shops };
}

/**
 * Plans the movements that empty what the job holds: for each paid payment,
 * its share to the shop (less the fee) and/or back to the builder. Planning
 * happens under the job's row lock and each movement has a key derived from
 * the payment, so any number of callers plan the same movements once.
 */
export async function planMoves(tx: Executor, jobId: string, shopShareCents: number | 'all'): Promise<void> {
  const job = await findJob(tx, jobId, { forUpdate: true });
  if (!job) throw notFound('No job with that id.');
  // The job's money is being decided: pages still open for it (a change order's) are no longer wanted.
  await closeOpenCheckouts(tx, { jobId });
  const paid = await tx.select().from(payments).where(and(eq(payments.jobId, jobId), eq(payments.status, 'paid'))).orderBy(asc(payments.paidAt));
  // A late payment's refund is not part of the job's decision.
  const planned = await tx.select().from(moneyMoves).where(and(eq(moneyMoves.jobId, jobId), ne(moneyMoves.kind, 'late_refund')));
  if (planned.length > 0) return; // already decided: the same decision is carried out, not a second one
  if (paid.length === 0) throw conflict('Nothing has been paid for this job.', 'nothing_held');
  const total = paid.reduce((sum, p) => sum + p.amountCents, 0);
  let toShop = shopShareCents === 'all' ? total : shopShareCents;
  if (!Number.isSafeInteger(toShop) || toShop < 0 || toShop > total) {
    throw new AppError('invalid_input', `The shop's share must be between $0 and what is held.`, 400, { shopCents: 'Must be between 0 and the amount held.' });
  }
  const feeBps = job.feeBps ?? 0;
  const rows: Array<typeof moneyMoves.$inferInsert> = [];
  for (const payment of paid) {
    const shopPart = Math.min(toShop, payment.amountCents);
    toShop -= shopPart;
    const refundPart = payment.amountCents - shopPart;
    if (shopPart > 0) {
      const fee = feeFor(shopPart, feeBps);
      rows.push({ jobId, paymentId: payment.id, kind: 'release', amountCents: shopPart - fee, feeCents: fee, idempotencyKey: `release-${payment.id}` });
    }
    if (refundPart > 0) rows.push({ jobId, paymentId: payment.id, kind: 'refund', amountCents: refundPart, idempotencyKey: `refund-${payment.id}` });
  }
  await tx.insert(moneyMoves).values(rows).onConflictDoNothing();
}

/** Carries out one planned movement with its key; the ledger is written once, when it is done. */
export async function runMove(deps: PaymentDeps, moveId: string): Promise<'done' | 'pending'> {
  const [move] = await deps.db.select().from(moneyMoves).where(eq(moneyMoves.id, moveId));
  if (!move || move.status === 'done') return 'done';
  const [payment] = await deps.db.select().from(payments).where(eq(payments.id, move.paymentId));
  try {
    let providerId: string;
    if (move.kind === 'release') {
      const { shop } = await awardedShop(deps.db, move.jobId);
      if (!shop.payoutAccountId) throw new Error('the shop has no payout account');
      if (move.amountCents === 0) {
        providerId = `none-${move.id}`;
      } else {
        const transfer = await deps.payments.transfers.create(
          { amount: move.amountCents, currency: payment.currency, destination: shop.payoutAccountId, transfer_group: move.jobId, source_transaction: payment.chargeId!, metadata: { job_id: move.jobId, payment_id: payment.id } },
          { idempotencyKey: move.idempotencyKey },
        );
        providerId = transfer.id;
      }
    } else {
      const refund = await deps.payments.refunds.create(
        { payment_intent: payment.paymentIntentId!, amount: move.amountCents, metadata: { job_id: move.jobId, payment_id: payment.id } },
        { idempotencyKey: move.idempotencyKey },
      );
      providerId = refund.id;
    }
    const notices = new Notices();
    await deps.db.transaction(async (tx) => {
      const [claimed] = await tx
        .update(moneyMoves)
        .set({ status: 'done', providerId, doneAt: new Date(), lastError: null })
        .where(and(eq(moneyMoves.id, move.id), eq(moneyMoves.status, 'pending')))
        .returning();
      if (!claimed) return; // someone else finished it first
      if (move.kind === 'release') {
        if (move.amountCents > 0) await appendLedger(tx, { jobId: move.jobId, paymentId: payment.id, kind: 'released', amountCents: move.amountCents, reference: providerId });
        if (move.feeCents > 0) await appendLedger(tx, { jobId: move.jobId, paymentId: payment.id, kind: 'fee', amountCents: move.feeCents, reference: `fee-${move.id}` });
      } else {
        await appendLedger(tx, { jobId: move.jobId, paymentId: payment.id, kind: 'refunded', amountCents: move.amountCents, reference: providerId });
      }
      // A late payment's refund stands apart: its people were told when it was planned, and the job's state is not its business.
      if (move.kind !== 'late_refund') await settleJobIfEmpty(deps, tx, move.jobId, notices);
    });
    notices.announce(deps.hub);
    return 'done';
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    await deps.db
      .update(moneyMoves)
      .set({
        attempts: sql`${moneyMoves.attempts} + 1`,
        lastError: message.slice(0, 500),
        nextAttemptAt: sql`now() + least(power(2, ${moneyMoves.attempts}) * interval '5 seconds', interval '10 minutes')`,
      })
      .where(and(eq(moneyMoves.id, move.id), eq(moneyMoves.status, 'pending')));
    return 'pending';
  }
}

/** Once nothing is held and every movement is done, the job reaches its end state and both sides get a receipt. */
async function settleJobIfEmpty(deps: PaymentDeps, tx: Executor, jobId: string, notices: Notices) {
  const moves = await tx.select().from(moneyMoves).where(eq(moneyMoves.jobId, jobId));
  if (moves.some((m) => m.status === 'pending' && m.kind !== 'late_refund')) return;
  // Late payments sent back (or on their way back) are not the job's money: leave them out of its end state and receipts.
  const late = moves.filter((m) => m.kind === 'late_refund');
  const lateIn = late.reduce((sum, m) => sum + m.amountCents, 0);
  const lateBack = late.filter((m) => m.status === 'done').reduce((sum, m) => sum + m.amountCents, 0);
  const all = await jobBalance(tx, jobId);
  const balance = { ...all, paidIn: all.paidIn - lateIn, refunded: all.refunded - lateBack, held: all.held - (lateIn - lateBack) };
  if (balance.held !== 0) return;
  const job = (await findJob(tx, jobId, { forUpdate: true }))!;
  const parties = await mailPartiesOf(tx, jobId);
  const url = `${deps.appUrl}/jobs/${jobId}`;
  if (balance.released + balance.fee > 0 && parties.shopEmail) {
    await enqueueMail(tx, parties.shopEmail, payoutSentMail({ name: parties.shopName!, jobTitle: job.title, amountCents: balance.released, feeCents: balance.fee, url }));
    await notices.add(tx, parties.shopUserId!, 'payment_released', { jobId, text: `${formatCents(balance.released)} for “${job.title}” was paid out to you (${NAMES.fee} ${formatCents(balance.fee)}).`, href: `/jobs/${jobId}` });
  }
  if (balance.refunded > 0) {
    await enqueueMail(tx, parties.builderEmail, refundSentMail({ name: parties.builderName, jobTitle: job.title, amountCents: balance.refunded, url }));
    await notices.add(tx, parties.builderId, 'refund_sent', { jobId, text: `${formatCents(balance.refunded)} for “${job.title}” was refunded to you.`, href: `/jobs/${jobId}` });
  }
  // A disputed job ends as resolved whatever the decision; otherwise a full refund cancels it.
  const next = job.status === 'disputed' ? 'resolved' : balance.refunded === balance.paidIn ? 'cancelled' : 'completed';
  await tx.update(jobs).set({ status: next }).where(eq(jobs.id, jobId));
}

/** Runs the movements already planned for a job (now; the worker retries any the provider refused). */
export async function carryOut(deps: PaymentDeps, jobId: string) {
  // First stop money coming in: pages closed by the decision are expired before any money goes out.
  await expireOpenCheckouts(deps, jobId);
  const moves = await deps.db.select().from(moneyMoves).where(and(eq(moneyMoves.jobId, jobId), eq(moneyMoves.status, 'pending')));
  for (const move of moves) await runMove(deps, move.id);
  deps.hub?.jobChanged(jobId, 'job_updated');
  return moneyView(deps.db, jobId);
}

/**
 * Plans the job's money and carries it out. An admin's hand decision is
 * audited in the transaction that plans it, so the log has the decision
 * exactly when the plan exists.
 */
async function decideMoney(deps: PaymentDeps, jobId: string, shopShareCents: number | 'all', audit?: { admin: User; action: string; details?: Record<string, unknown> }) {
  await deps.db.transaction(async (tx) => {
    await planMoves(tx, jobId, shopShareCents);
    if (audit) await recordAdminAction(tx, { adminId: audit.admin.id, action: audit.action, targetType: 'job', targetId: jobId, details: audit.details });
  });
  return carryOut(deps, jobId);
}

/** Everything held goes to the shop, less the platform fee. Safe to call any number of times, at once. With an admin, a hand release (audited). */
export async function releaseJob(deps: PaymentDeps, jobId: string, admin?: User) {
  return decideMoney(deps, jobId, 'all', admin && { admin, action: 'job.release' });
}

/** Everything held goes back to the builder. */
export async function refundJob(deps: PaymentDeps, jobId: string) {
  return decideMoney(deps, jobId, 0);
}

/** An admin's hand split: `shopCents` of what is held to the shop (less the fee on it), the rest back to the builder (audited). */
export async function splitJob(deps: PaymentDeps, admin: User, jobId: string, shopCents: number) {
  return decideMoney(deps, jobId, shopCents, { admin, action: 'job.split', details: { shopCents } });
}

/** A builder cancelling a paid job gets everything back. */
export async function cancelFundedJob(deps: PaymentDeps, user: User, jobId: string) {
  const job = mustBeBuilder(await findJob(deps.db, jobId), user);
  if (job.status !== 'funded') throw conflict('Only a paid job that the shop has not started can be cancelled for a refund.', 'job_not_refundable');
  return refundJob(deps, jobId);
}

/** The job's money as the page shows it: balance and whether a payout or refund is still on its way. */
export async function moneyView(db: Executor, jobId: string) {
  const [balance, moves, paymentRows, [job]] = await Promise.all([
    jobBalance(db, jobId),
    db.select().from(moneyMoves).where(eq(moneyMoves.jobId, jobId)),
    db.select().from(payments).where(eq(payments.jobId, jobId)).orderBy(asc(payments.createdAt)),
    db.select({ feeBps: jobs.feeBps }).from(jobs).where(eq(jobs.id, jobId)),
  ]);
  return {
    feeBps: job?.feeBps ?? null,
    balance,
    pending: moves.filter((m) => m.status === 'pending').map((m) => ({ kind: m.kind, amountCents: m.amountCents, attempts: m.attempts, lastError: m.lastError })),
    payments: paymentRows.map((p) => ({ id: p.id, kind: p.kind, amountCents: p.amountCents, status: p.status, failureMessage: p.failureMessage, paidAt: p.paidAt?.toISOString() ?? null, receiptNumber: p.receiptNumber })),
  };
}

/** The job's money for its builder, the shop doing the work or an admin (see mustSeeMoney). */
export async function moneyViewFor(deps: PaymentDeps, user: User, jobId: string) {
  await mustSeeMoney(deps.db, jobId, user);
  return moneyView(deps.db, jobId);
}

/** Retries movements that failed (the payment API was away), with the same keys, until they succeed. */
export function startMoneyWorker(deps: PaymentDeps, intervalMs = 5_000) {
  let running = false;
  const timer = setInterval(async () => {
    if (running) return;
    running = true;
    try {
      const due = await deps.db.select({ id: moneyMoves.id }).from(moneyMoves).where(and(eq(moneyMoves.status, 'pending'), lte(moneyMoves.nextAttemptAt, sql`now()`))).limit(20);
      for (const { id } of due) await runMove(deps, id);
    } catch {
      // The database itself may be away; the next pass tries again.
    } finally {
      running = false;
    }
  }, intervalMs);
  timer.unref();
  return { stop: () => clearInterval(timer) };
}
