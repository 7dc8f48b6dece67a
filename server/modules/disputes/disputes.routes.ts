import { Router } from 'express';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import { disputeQueueSchema, disputeResponseSchema, openDisputeSchema, resolveDisputeSchema } from '../../../shared/schemas/disputes';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import type { PaymentDeps } from '../payments/payments.service';
import { answerDispute, disputeQueue, disputeViewFor, openDispute, resolveDispute } from './disputes.service';
import { disputeCase } from './evidence';

const jobParams = z.object({ jobId: uuidSchema });
const disputeParams = z.object({ disputeId: uuidSchema });

/** Disputes: opened and answered by the two sides, decided by an admin. */
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

  router.get('/admin/disputes', requireRole('admin'), async (req, res) => {
    const { status } = disputeQueueSchema.parse(req.query);
    res.json({ disputes: await disputeQueue(deps.db, status) });
  });

  router.get('/admin/disputes/:disputeId', requireRole('admin'), async (req, res) => {
    const { disputeId } = disputeParams.parse(req.params);
    res.json(await disputeCase(deps.db, disputeId));
  });

  router.post('/admin/disputes/:disputeId/resolve', requireRole('admin'), async (req, res) => {
    const { disputeId } = disputeParams.parse(req.params);
    res.json(await resolveDispute(deps, currentUser(req), disputeId, resolveDisputeSchema.parse(req.body)));
  });

  return router;
}
