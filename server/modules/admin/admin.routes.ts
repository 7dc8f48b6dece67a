import { z } from 'zod';
import {
  adminShopAnswerSchema,
  adminShopPageSchema,
  adminUserAnswerSchema,
  adminUserPageSchema,
  auditPageSchema,
  auditQuerySchema,
  createAdminSchema,
  ledgerPageSchema,
  ledgerQuerySchema,
  platformFeeSchema,
  platformFeeSettingSchema,
  shopSearchSchema,
  suspendUserSchema,
  userSearchSchema,
  verifyShopSchema,
} from '../../../shared/schemas/admin';
import { meAnswerSchema } from '../../../shared/schemas/auth';
import { uuidSchema } from '../../../shared/schemas/common';
import { disputeCaseSchema, disputeDecisionSchema, disputeQueueAnswerSchema, disputeQueueSchema, resolveDisputeSchema } from '../../../shared/schemas/disputes';
import { routesFor } from '../../lib/http/routes';
import { disputeQueue, resolveDispute } from '../disputes/disputes.service';
import { disputeCase } from '../disputes/evidence';
import type { PaymentDeps } from '../payments/payments.service';
import { toMe } from '../users/users.repository';
import { createAdmin, searchUsers } from './admin.service';
import { listAdminActions } from './audit';
import { changePlatformFee, ledgerCsv, ledgerPage, platformFee, reinstateUser, searchShopsForAdmin, setShopVerified, suspendUser } from './console.service';

const userParams = z.object({ userId: uuidSchema });
const shopParams = z.object({ shopId: uuidSchema });
const disputeParams = z.object({ disputeId: uuidSchema });

/** A decision moves money, so the console needs the payment client besides the fee's default. */
export type AdminDeps = PaymentDeps & { defaultFeeBps: number; supportEmail: string };

const route = routesFor<AdminDeps>('Admin');

/** The administrators' console: people, disputes, shops, the fee, the ledger and the audit log. */
export const adminRoutes = [
  route({
    method: 'get',
    path: '/api/admin/users',
    summary: 'Search accounts',
    access: 'admin',
    query: userSearchSchema,
    reply: { json: adminUserPageSchema },
    handler: ({ deps, query }) => searchUsers(deps.db, query),
  }),
  route({
    method: 'post',
    path: '/api/admin/admins',
    summary: 'Make another administrator',
    access: 'admin',
    body: createAdminSchema,
    reply: { status: 201, json: meAnswerSchema, description: 'Created; a link to choose a password is mailed' },
    handler: async ({ deps, user, body }) => ({ user: toMe(await createAdmin(deps, body, user)) }),
  }),
  route({
    method: 'get',
    path: '/api/admin/disputes',
    summary: 'The dispute queue with age and amount held',
    access: 'admin',
    query: disputeQueueSchema,
    reply: { json: disputeQueueAnswerSchema },
    handler: async ({ deps, query }) => ({ disputes: await disputeQueue(deps.db, query.status) }),
  }),
  route({
    method: 'get',
    path: '/api/admin/disputes/:disputeId',
    summary: 'A dispute with its evidence: messages, milestones, inspection versions, photos, change orders and money, in one timeline',
    access: 'admin',
    params: disputeParams,
    reply: { json: disputeCaseSchema },
    handler: ({ deps, params }) => disputeCase(deps.db, params.disputeId),
  }),
  route({
    method: 'post',
    path: '/api/admin/disputes/:disputeId/resolve',
    summary: 'Decide a dispute: release, refund or split, with a written decision mailed to both sides',
    access: 'admin',
    params: disputeParams,
    body: resolveDisputeSchema,
    reply: { json: disputeDecisionSchema },
    handler: ({ deps, user, params, body }) => resolveDispute(deps, user, params.disputeId, body),
  }),
  route({
    method: 'post',
    path: '/api/admin/users/:userId/suspend',
    summary: 'Suspend an account: its sessions end at once and it cannot sign in',
    access: 'admin',
    params: userParams,
    body: suspendUserSchema,
    reply: { json: adminUserAnswerSchema },
    handler: async ({ deps, user, params, body }) => ({ user: await suspendUser(deps, user, params.userId, body.reason) }),
  }),
  route({
    method: 'post',
    path: '/api/admin/users/:userId/reinstate',
    summary: 'Reinstate a suspended account',
    access: 'admin',
    params: userParams,
    reply: { json: adminUserAnswerSchema },
    handler: async ({ deps, user, params }) => ({ user: await reinstateUser(deps, user, params.userId) }),
  }),
  route({
    method: 'get',
    path: '/api/admin/shops',
    summary: 'Search shops',
    access: 'admin',
    query: shopSearchSchema,
    reply: { json: adminShopPageSchema },
    handler: ({ deps, query }) => searchShopsForAdmin(deps.db, query),
  }),
  route({
    method: 'post',
    path: '/api/admin/shops/:shopId/verification',
    summary: 'Verify a shop (a badge on its page and bids) or take it away',
    access: 'admin',
    params: shopParams,
    body: verifyShopSchema,
    reply: { json: adminShopAnswerSchema },
    handler: async ({ deps, user, params, body }) => ({ shop: await setShopVerified(deps, user, params.shopId, body.verified) }),
  }),
  route({
    method: 'get',
    path: '/api/admin/fee',
    summary: 'The platform fee for new awards',
    access: 'admin',
    reply: { json: platformFeeSettingSchema },
    handler: ({ deps }) => platformFee(deps),
  }),
  route({
    method: 'put',
    path: '/api/admin/fee',
    summary: 'Change the platform fee (applies to bids accepted from now on)',
    access: 'admin',
    body: platformFeeSchema,
    reply: { json: platformFeeSettingSchema },
    handler: ({ deps, user, body }) => changePlatformFee(deps, user, body.feeBps),
  }),
  route({
    method: 'get',
    path: '/api/admin/ledger',
    summary: 'Ledger entries with filters and totals',
    access: 'admin',
    query: ledgerQuerySchema,
    reply: { json: ledgerPageSchema },
    handler: ({ deps, query }) => ledgerPage(deps.db, query),
  }),
  route({
    method: 'get',
    path: '/api/admin/ledger.csv',
    summary: 'The filtered ledger as CSV',
    access: 'admin',
    // The page's own query, so bad paging is still refused; the file has every matching row whatever the paging says.
    query: ledgerQuerySchema,
    reply: { file: 'text/csv', description: 'Every ledger row the filters match, oldest first' },
    handler: async ({ deps, query, res }) => {
      const { limit: _limit, offset: _offset, ...filters } = query;
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="tenthmark-ledger-${new Date().toISOString().slice(0, 10)}.csv"`);
      res.setHeader('Cache-Control', 'no-store');
      for await (const chunk of ledgerCsv(deps.db, filters)) res.write(chunk);
      res.end();
    },
  }),
  route({
    method: 'get',
    path: '/api/admin/audit',
    summary: 'The audit log of administrator actions',
    access: 'admin',
    query: auditQuerySchema,
    reply: { json: auditPageSchema },
    handler: ({ deps, query }) => listAdminActions(deps.db, query),
  }),
];
