import { Router, type Request } from 'express';
import { z } from 'zod';
import { bidInputSchema, declineBidSchema } from '../../../shared/schemas/bids';
import { uuidSchema } from '../../../shared/schemas/common';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import { acceptBid, bidsForJob, bidsOfShop, bidWithHistory, createBid, declineBid, reviseBid, withdrawBid, type BidDeps } from './bids.service';

const jobParams = z.object({ jobId: uuidSchema });
const bidParams = z.object({ bidId: uuidSchema });

export function bidsRouter(deps: BidDeps) {
  const router = Router();
  /** The bid as the person who changed it now sees it. */
  const answer = (req: Request, bidId: string) => bidWithHistory(deps, currentUser(req), bidId);

  router.get('/jobs/:jobId/bids', requireUser, async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json({ bids: await bidsForJob(deps, currentUser(req), jobId) });
  });

  router.post('/jobs/:jobId/bids', requireRole('shop'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const bidId = await createBid(deps, currentUser(req), jobId, bidInputSchema.parse(req.body));
    res.status(201).json(await answer(req, bidId));
  });

  router.get('/bids/mine', requireRole('shop'), async (req, res) => {
    res.json({ bids: await bidsOfShop(deps, currentUser(req)) });
  });

  router.get('/bids/:bidId', requireUser, async (req, res) => {
    const { bidId } = bidParams.parse(req.params);
    res.json(await bidWithHistory(deps, currentUser(req), bidId));
  });

  router.put('/bids/:bidId', requireRole('shop'), async (req, res) => {
    const { bidId } = bidParams.parse(req.params);
    await reviseBid(deps, currentUser(req), bidId, bidInputSchema.parse(req.body));
    res.json(await answer(req, bidId));
  });

  router.post('/bids/:bidId/withdraw', requireRole('shop'), async (req, res) => {
    const { bidId } = bidParams.parse(req.params);
    await withdrawBid(deps, currentUser(req), bidId);
    res.json(await answer(req, bidId));
  });

  router.post('/bids/:bidId/accept', requireRole('builder'), async (req, res) => {
    const { bidId } = bidParams.parse(req.params);
    await acceptBid(deps, currentUser(req), bidId);
    res.json(await answer(req, bidId));
  });

  router.post('/bids/:bidId/decline', requireRole('builder'), async (req, res) => {
    const { bidId } = bidParams.parse(req.params);
    const { reason } = declineBidSchema.parse(req.body);
    await declineBid(deps, currentUser(req), bidId, reason);
    res.json(await answer(req, bidId));
  });

  return router;
}
