import { Router } from 'express';
import { z } from 'zod';
import {
  auditQuerySchema,
  createAdminSchema,
  ledgerQuerySchema,
  platformFeeSchema,
  shopSearchSchema,
  suspendUserSchema,
  userSearchSchema,
  verifyShopSchema,
} from '../../../shared/schemas/admin';
import { uuidSchema } from '../../../shared/schemas/common';
import type { Database } from '../../db/client';
import { currentUser, requireRole } from '../../lib/auth/guards';
import type { RealtimeHub } from '../../realtime/hub';
import { toMe } from '../users/users.repository';
import { createAdmin, searchUsers } from './admin.service';
import { listAdminActions } from './audit';
import { changePlatformFee, ledgerCsv, ledgerPage, platformFee, reinstateUser, searchShopsForAdmin, setShopVerified, suspendUser } from './console.service';

const userParams = z.object({ userId: uuidSchema });
const shopParams = z.object({ shopId: uuidSchema });

/** The administrators' console: people, shops, the fee, the ledger and the audit log. Disputes live in their own module. */
export function adminRouter(deps: { db: Database; appUrl: string; hub?: RealtimeHub; defaultFeeBps: number }) {
  const router = Router();
  router.use(requireRole('admin'));

  router.get('/users', async (req, res) => {
    const input = userSearchSchema.parse(req.query);
    res.json(await searchUsers(deps.db, input));
  });

  router.post('/admins', async (req, res) => {
    const input = createAdminSchema.parse(req.body);
    const user = await createAdmin(deps, input, currentUser(req));
    res.status(201).json({ user: toMe(user) });
  });

  router.post('/users/:userId/suspend', async (req, res) => {
    const { userId } = userParams.parse(req.params);
    const { reason } = suspendUserSchema.parse(req.body);
    res.json({ user: await suspendUser(deps, currentUser(req), userId, reason) });
  });

  router.post('/users/:userId/reinstate', async (req, res) => {
    const { userId } = userParams.parse(req.params);
    res.json({ user: await reinstateUser(deps, currentUser(req), userId) });
  });

  router.get('/shops', async (req, res) => {
    res.json(await searchShopsForAdmin(deps.db, shopSearchSchema.parse(req.query)));
  });

  router.post('/shops/:shopId/verification', async (req, res) => {
    const { shopId } = shopParams.parse(req.params);
    const { verified } = verifyShopSchema.parse(req.body);
    res.json({ shop: await setShopVerified(deps, currentUser(req), shopId, verified) });
  });

  router.get('/fee', async (_req, res) => {
    res.json(await platformFee(deps));
  });

  router.put('/fee', async (req, res) => {
    const { feeBps } = platformFeeSchema.parse(req.body);
    res.json(await changePlatformFee(deps, currentUser(req), feeBps));
  });

  router.get('/ledger', async (req, res) => {
    res.json(await ledgerPage(deps.db, ledgerQuerySchema.parse(req.query)));
  });

  router.get('/ledger.csv', async (req, res) => {
    const { limit: _limit, offset: _offset, ...filters } = ledgerQuerySchema.parse(req.query);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="tenthmark-ledger-${new Date().toISOString().slice(0, 10)}.csv"`);
    res.setHeader('Cache-Control', 'no-store');
    for await (const chunk of ledgerCsv(deps.db, filters)) res.write(chunk);
    res.end();
  });

  router.get('/audit', async (req, res) => {
    res.json(await listAdminActions(deps.db, auditQuerySchema.parse(req.query)));
  });

  return router;
}
