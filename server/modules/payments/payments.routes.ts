import express from 'express';
import type Stripe from 'stripe';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import { jobParamsSchema } from '../../../shared/schemas/jobs';
import {
  changeOrderAnswerSchema,
  changeOrderInputSchema,
  changeOrderListSchema,
  moneyHistoryQuerySchema,
  moneyPeriodSchema,
  moneyHistorySchema,
  moneyViewSchema,
  providerLinkSchema,
  splitSchema,
  webhookReceiptSchema,
} from '../../../shared/schemas/payments';
import { sendDownload } from '../../lib/http/download';
import { routesFor } from '../../lib/http/routes';
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
import { moneyCsv, moneyHistory } from './money-history';

const orderParams = z.object({ changeOrderId: uuidSchema });

const webhookRoute = routesFor<PaymentDeps & { webhookSecret: string }>('Payments');

/**
 * The provider's webhook: raw body, signature checked by the SDK, then the
 * event goes to applyPaymentEvent (stored by id, applied once). A failure
 * answers 500 so the provider delivers again. Mounted before the session,
 * the JSON parser and the CSRF check.
 */
export const paymentsWebhookRoutes = [
  webhookRoute({
    method: 'post',
    path: '/api/payments/webhook',
    summary: 'Payment provider events (signed with Stripe-Signature; raw JSON body)',
    access: 'public',
    csrf: false,
    use: () => [express.raw({ type: () => true, limit: '1mb' })],
    reply: { json: webhookReceiptSchema, description: 'Received (duplicate: the event had been applied before)' },
    handler: async ({ deps, req }) => {
      let event: Stripe.Event;
      try {
        event = deps.payments.webhooks.constructEvent(req.body as Buffer, req.get('stripe-signature') ?? '', deps.webhookSecret);
      } catch {
        throw new AppError('bad_signature', 'The webhook signature does not match.', 400);
      }
      const { duplicate } = await applyPaymentEvent(deps, event);
      return duplicate ? { received: true as const, duplicate: true as const } : { received: true as const };
    },
  }),
];

const route = routesFor<PaymentDeps>('Payments');

/** Paying for jobs and extra work, payouts, refunds, and everyone's money history. */
export const paymentsRoutes = [
  route({
    method: 'post',
    path: '/api/shop-profile/payouts',
    summary: 'Start or continue the shop’s payout account onboarding; answers the provider’s link',
    access: 'shop',
    reply: { json: providerLinkSchema, description: 'The onboarding page to send the shop to' },
    handler: ({ deps, user }) => startPayoutOnboarding(deps, user),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/checkout',
    summary: 'Pay the accepted bid: answers a hosted payment page address',
    access: 'builder',
    params: jobParamsSchema,
    reply: { json: providerLinkSchema, description: 'The payment page to send the builder to' },
    handler: ({ deps, user, params }) => startJobCheckout(deps, user, params.jobId),
  }),
  route({
    method: 'get',
    path: '/api/jobs/:jobId/money',
    summary: 'The job’s payments, ledger balance and any payout or refund still on its way',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { json: moneyViewSchema },
    handler: ({ deps, user, params }) => moneyViewFor(deps, user, params.jobId),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/cancel-and-refund',
    summary: 'Cancel a paid job the shop has not started; the payment is refunded in full',
    access: 'builder',
    params: jobParamsSchema,
    reply: { json: moneyViewSchema, description: 'The job’s money after the refund' },
    handler: ({ deps, user, params }) => cancelFundedJob(deps, user, params.jobId),
  }),
  route({
    method: 'get',
    path: '/api/jobs/:jobId/change-orders',
    summary: 'Extra work proposed on a job',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { json: changeOrderListSchema },
    handler: async ({ deps, user, params }) => ({ changeOrders: await changeOrdersFor(deps, user, params.jobId) }),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/change-orders',
    summary: 'The awarded shop proposes extra work with a price',
    access: 'shop',
    params: jobParamsSchema,
    body: changeOrderInputSchema,
    reply: { status: 201, json: changeOrderAnswerSchema, description: 'Proposed' },
    handler: async ({ deps, user, params, body }) => ({ changeOrder: await proposeChangeOrder(deps, user, params.jobId, body) }),
  }),
  route({
    method: 'post',
    path: '/api/change-orders/:changeOrderId/approve',
    summary: 'Agree to extra work and pay for it: answers a hosted payment page address',
    access: 'builder',
    params: orderParams,
    reply: { json: providerLinkSchema, description: 'The payment page to send the builder to' },
    handler: ({ deps, user, params }) => approveChangeOrder(deps, user, params.changeOrderId),
  }),
  route({
    method: 'post',
    path: '/api/change-orders/:changeOrderId/decline',
    summary: 'Decline extra work that is not paid yet (its open payment page is expired)',
    access: 'builder',
    params: orderParams,
    reply: { json: changeOrderAnswerSchema },
    handler: async ({ deps, user, params }) => ({ changeOrder: await declineChangeOrder(deps, user, params.changeOrderId) }),
  }),
  route({
    method: 'get',
    path: '/api/me/money',
    summary: 'The signed-in builder’s or shop’s money history across their jobs',
    access: 'builder or shop',
    query: moneyHistoryQuerySchema,
    reply: { json: moneyHistorySchema },
    handler: ({ deps, user, query }) => moneyHistory(deps.db, user, query),
  }),
  route({
    method: 'get',
    path: '/api/me/money.csv',
    summary: 'The money history over a period as CSV, with a line per total',
    access: 'builder or shop',
    query: moneyPeriodSchema,
    reply: { file: 'text/csv', description: 'The period’s ledger rows, oldest first, then the totals' },
    handler: async ({ deps, user, query, res }) =>
      sendDownload(res, {
        type: 'text/csv; charset=utf-8',
        filename: `tenthmark-money-${query.from ?? 'start'}-to-${query.to ?? new Date().toISOString().slice(0, 10)}.csv`,
        body: await moneyCsv(deps.db, user, query),
      }),
  }),
  // Hand release and split for support cases outside a dispute (disputes are decided in the disputes module). Both are audited in the money's transaction.
  route({
    method: 'post',
    path: '/api/admin/jobs/:jobId/release',
    summary: 'Release what the job holds to the shop, less the fee (once, however often asked)',
    access: 'admin',
    params: jobParamsSchema,
    reply: { json: moneyViewSchema, description: 'The job’s money after the release' },
    handler: ({ deps, user, params }) => releaseJob(deps, params.jobId, user),
  }),
  route({
    method: 'post',
    path: '/api/admin/jobs/:jobId/split',
    summary: 'Pay the shop a share of what is held and refund the rest',
    access: 'admin',
    params: jobParamsSchema,
    body: splitSchema,
    reply: { json: moneyViewSchema, description: 'The job’s money after the split' },
    handler: ({ deps, user, params, body }) => splitJob(deps, user, params.jobId, body.shopCents),
  }),
];
