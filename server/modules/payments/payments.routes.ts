import express, { Router } from 'express';
import type Stripe from 'stripe';
import { z } from 'zod';
import { queryInt, uuidSchema } from '../../../shared/schemas/common';
import { changeOrderInputSchema, splitSchema } from '../../../shared/schemas/payments';
import { paymentEvents } from '../../db/schema';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import { AppError } from '../../lib/errors';
import { eq } from 'drizzle-orm';
import { approveChangeOrder, changeOrdersFor, declineChangeOrder, proposeChangeOrder } from './change-orders.service';
import {
  applyAccount,
  applyCheckoutSession,
  applyPaymentFailed,
  cancelFundedJob,
  moneyViewFor,
  releaseJob,
  splitJob,
  startJobCheckout,
  startPayoutOnboarding,
  type PaymentDeps,
} from './payments.service';
import { assertCanSeeWork, jobParties } from '../inspections/job-parties';
import { recordAdminAction } from '../admin/audit';
import { moneyHistory } from './money-history';

const jobParams = z.object({ jobId: uuidSchema });
const orderParams = z.object({ changeOrderId: uuidSchema });
const historyQuery = z.object({ limit: queryInt('limit', 1, 100).default(25), offset: queryInt('offset', 0, 1_000_000).default(0) });

/**
 * The provider's webhook: raw body, signature checked by the SDK, each event
 * stored by id and applied once. Objects whose state matters are read back
 * from the API, so events may come in any order or more than once. A failure
 * answers 500 so the provider delivers again.
 */
export function paymentsWebhook(deps: PaymentDeps & { webhookSecret: string }) {
  const router = Router();
  router.post('/payments/webhook', express.raw({ type: () => true, limit: '1mb' }), async (req, res) => {
    let event: Stripe.Event;
    try {
      event = deps.payments.webhooks.constructEvent(req.body as Buffer, req.get('stripe-signature') ?? '', deps.webhookSecret);
    } catch {
      throw new AppError('bad_signature', 'The webhook signature does not match.', 400);
    }
    await deps.db.insert(paymentEvents).values({ id: event.id, type: event.type, payload: event }).onConflictDoNothing();
    const [stored] = await deps.db.select().from(paymentEvents).where(eq(paymentEvents.id, event.id));
    if (stored.appliedAt) return res.json({ received: true, duplicate: true });

    const object = event.data.object as unknown as { id: string; object: string };
    switch (event.type) {
      case 'checkout.session.completed':
      case 'checkout.session.expired':
        await applyCheckoutSession(deps, object.id);
        break;
      case 'payment_intent.succeeded': {
        // The session carries the job; find it through the intent's metadata and read it back.
        const sessions = await deps.payments.checkout.sessions.list({ payment_intent: object.id, limit: 1 });
        if (sessions.data[0]) await applyCheckoutSession(deps, sessions.data[0].id);
        break;
      }
      case 'payment_intent.payment_failed':
        await applyPaymentFailed(deps, await deps.payments.paymentIntents.retrieve(object.id));
        break;
      case 'account.updated':
      case 'capability.updated': {
        const accountId = event.type === 'account.updated' ? object.id : (event.account ?? (event.data.object as Stripe.Capability).account);
        await applyAccount(deps.db, await deps.payments.accounts.retrieve(String(accountId)));
        break;
      }
      default:
        break; // stored, nothing to apply
    }
    await deps.db.update(paymentEvents).set({ appliedAt: new Date() }).where(eq(paymentEvents.id, event.id));
    res.json({ received: true });
  });
  return router;
}

export function paymentsRouter(deps: PaymentDeps) {
  const router = Router();

  router.post('/shop-profile/payouts', requireRole('shop'), async (req, res) => {
    res.json(await startPayoutOnboarding(deps, currentUser(req)));
  });

  router.post('/jobs/:jobId/checkout', requireRole('builder'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json(await startJobCheckout(deps, currentUser(req), jobId));
  });

  router.get('/jobs/:jobId/money', requireUser, async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json(await moneyViewFor(deps, currentUser(req), jobId));
  });

  router.post('/jobs/:jobId/cancel-and-refund', requireRole('builder'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json(await cancelFundedJob(deps, currentUser(req), jobId));
  });

  router.get('/jobs/:jobId/change-orders', requireUser, async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    // Like the job's money: its builder, the shop doing the work and admins (not every shop that once bid).
    assertCanSeeWork(await jobParties(deps.db, jobId), currentUser(req));
    res.json({ changeOrders: await changeOrdersFor(deps, jobId) });
  });

  router.post('/jobs/:jobId/change-orders', requireRole('shop'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const order = await proposeChangeOrder(deps, currentUser(req), jobId, changeOrderInputSchema.parse(req.body));
    deps.hub?.jobChanged(jobId, 'job_updated');
    res.status(201).json({ changeOrder: order });
  });

  router.post('/change-orders/:changeOrderId/approve', requireRole('builder'), async (req, res) => {
    const { changeOrderId } = orderParams.parse(req.params);
    res.json(await approveChangeOrder(deps, currentUser(req), changeOrderId));
  });

  router.post('/change-orders/:changeOrderId/decline', requireRole('builder'), async (req, res) => {
    const { changeOrderId } = orderParams.parse(req.params);
    res.json({ changeOrder: await declineChangeOrder(deps, currentUser(req), changeOrderId) });
  });

  router.get('/me/money', requireRole('builder', 'shop'), async (req, res) => {
    const page = historyQuery.parse(req.query);
    res.json(await moneyHistory(deps.db, currentUser(req), page));
  });

  // Hand release and split for support cases outside a dispute (disputes are decided in the disputes module). Both are audited.
  router.post('/admin/jobs/:jobId/release', requireRole('admin'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    await recordAdminAction(deps.db, { adminId: currentUser(req).id, action: 'job.release', targetType: 'job', targetId: jobId });
    res.json(await releaseJob(deps, jobId));
  });

  router.post('/admin/jobs/:jobId/split', requireRole('admin'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const { shopCents } = splitSchema.parse(req.body);
    await recordAdminAction(deps.db, { adminId: currentUser(req).id, action: 'job.split', targetType: 'job', targetId: jobId, details: { shopCents } });
    res.json(await splitJob(deps, jobId, shopCents));
  });

  return router;
}
