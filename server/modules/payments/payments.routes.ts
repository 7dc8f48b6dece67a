import express, { Router } from 'express';
import type Stripe from 'stripe';
import { z } from 'zod';
import { queryInt, uuidSchema } from '../../../shared/schemas/common';
import { changeOrderInputSchema, splitSchema } from '../../../shared/schemas/payments';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import { AppError } from '../../lib/errors';
import { approveChangeOrder, changeOrdersFor, declineChangeOrder, proposeChangeOrder } from './change-orders.service';
import { applyPaymentEvent } from './payment-events';
import {
  cancelFundedJob,
  moneyViewFor,
  releaseJob,
  splitJob,
  startJobCheckout,
  startPayoutOnboarding,
  type PaymentDeps,
} from './payments.service';
import { moneyHistory } from './money-history';

const jobParams = z.object({ jobId: uuidSchema });
const orderParams = z.object({ changeOrderId: uuidSchema });
const historyQuery = z.object({ limit: queryInt('limit', 1, 100).default(25), offset: queryInt('offset', 0, 1_000_000).default(0) });

/**
 * The provider's webhook: raw body, signature checked by the SDK, then the
 * event goes to applyPaymentEvent (stored by id, applied once). A failure
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
    const { duplicate } = await applyPaymentEvent(deps, event);
    res.json(duplicate ? { received: true, duplicate: true } : { received: true });
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
    res.json({ changeOrders: await changeOrdersFor(deps, currentUser(req), jobId) });
  });

  router.post('/jobs/:jobId/change-orders', requireRole('shop'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const order = await proposeChangeOrder(deps, currentUser(req), jobId, changeOrderInputSchema.parse(req.body));
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

  // Hand release and split for support cases outside a dispute (disputes are decided in the disputes module). Both are audited in the money's transaction.
  router.post('/admin/jobs/:jobId/release', requireRole('admin'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json(await releaseJob(deps, jobId, currentUser(req)));
  });

  router.post('/admin/jobs/:jobId/split', requireRole('admin'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const { shopCents } = splitSchema.parse(req.body);
    res.json(await splitJob(deps, currentUser(req), jobId, shopCents));
  });

  return router;
}
