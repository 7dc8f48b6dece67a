import { Router } from 'express';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import { disputeResponseSchema, openDisputeSchema } from '../../../shared/schemas/disputes';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import type { PaymentDeps } from '../payments/payments.service';
import { answerDispute, disputeViewFor, openDispute } from './disputes.service';

const jobParams = z.object({ jobId: uuidSchema });

/** Disputes: opened and answered by the two sides (an admin decides them: server/modules/admin/admin.routes.ts). */
export function disputesRouter(deps: PaymentDeps) {
  const router = Router();

  router.get('/jobs/:jobId/dispute', requireUser, async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json(await disputeViewFor(deps.db, currentUser(req), jobId));
  });

  router.post('/jobs/:jobId/dispute', requireRole('builder', 'shop'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const dispute = await openDispute(deps, currentUser(req), jobId, openDisputeSchema.parse(req.body));
    res.status(201).json({ dispute });
  });

  router.post('/jobs/:jobId/dispute/response', requireRole('builder', 'shop'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const { statement } = disputeResponseSchema.parse(req.body);
    res.json({ dispute: await answerDispute(deps, currentUser(req), jobId, statement) });
  });

  return router;
}
