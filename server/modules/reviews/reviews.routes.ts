import { jobParamsSchema } from '../../../shared/schemas/jobs';
import { jobReviewsSchema, reviewAnswerSchema, reviewInputSchema } from '../../../shared/schemas/reviews';
import { routesFor } from '../../lib/http/routes';
import type { PaymentDeps } from '../payments/payments.service';
import { leaveReview, reviewsFor } from './reviews.service';

const route = routesFor<PaymentDeps>('Reviews');

/** The reviews the two sides leave each other after a job ends. */
export const reviewsRoutes = [
  route({
    method: 'get',
    path: '/api/jobs/:jobId/reviews',
    summary: 'Reviews left on a finished job, and whether the viewer may still leave one',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { json: jobReviewsSchema },
    handler: ({ deps, user, params }) => reviewsFor(deps.db, user, params.jobId),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/reviews',
    summary: 'Rate the other side of a finished job, 1 to 5 with a comment (once)',
    access: 'builder or shop',
    params: jobParamsSchema,
    body: reviewInputSchema,
    reply: { status: 201, json: reviewAnswerSchema, description: 'Stored' },
    handler: async ({ deps, user, params, body }) => ({ review: await leaveReview(deps, user, params.jobId, body) }),
  }),
];
