import { Router } from 'express';
import { z } from 'zod';
import { uuidSchema } from '../../../shared/schemas/common';
import { reviewInputSchema } from '../../../shared/schemas/reviews';
import { currentUser, requireRole, requireUser } from '../../lib/auth/guards';
import type { PaymentDeps } from '../payments/payments.service';
import { leaveReview, reviewsFor } from './reviews.service';

const jobParams = z.object({ jobId: uuidSchema });

/** The reviews the two sides leave each other after a job ends. */
export function reviewsRouter(deps: PaymentDeps) {
  const router = Router();

  router.get('/jobs/:jobId/reviews', requireUser, async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    res.json(await reviewsFor(deps.db, currentUser(req), jobId));
  });

  router.post('/jobs/:jobId/reviews', requireRole('builder', 'shop'), async (req, res) => {
    const { jobId } = jobParams.parse(req.params);
    const review = await leaveReview(deps, currentUser(req), jobId, reviewInputSchema.parse(req.body));
    res.status(201).json({ review });
  });

  return router;
}
