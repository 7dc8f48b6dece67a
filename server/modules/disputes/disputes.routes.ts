import { jobParamsSchema } from '../../../shared/schemas/jobs';
import { disputeAnswerSchema, disputeResponseSchema, disputeViewSchema, openDisputeSchema } from '../../../shared/schemas/disputes';
import { routesFor } from '../../lib/http/routes';
import type { PaymentDeps } from '../payments/payments.service';
import { answerDispute, disputeViewFor, openDispute } from './disputes.service';

const route = routesFor<PaymentDeps>('Disputes');

/** Disputes as the two sides open and answer them. */
export const disputesRoutes = [
  route({
    method: 'get',
    path: '/api/jobs/:jobId/dispute',
    summary: 'The job’s dispute, and whether the viewer may open or answer one',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { json: disputeViewSchema },
    handler: ({ deps, user, params }) => disputeViewFor(deps.db, user, params.jobId),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/dispute',
    summary: 'Open a dispute; the held payment stays held until an administrator decides',
    access: 'builder or shop',
    params: jobParamsSchema,
    body: openDisputeSchema,
    reply: { status: 201, json: disputeAnswerSchema, description: 'Opened; both sides are told by e-mail' },
    handler: async ({ deps, user, params, body }) => ({ dispute: await openDispute(deps, user, params.jobId, body) }),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/dispute/response',
    summary: 'The other side answers the dispute (once)',
    access: 'builder or shop',
    params: jobParamsSchema,
    body: disputeResponseSchema,
    reply: { json: disputeAnswerSchema },
    handler: async ({ deps, user, params, body }) => ({ dispute: await answerDispute(deps, user, params.jobId, body.statement) }),
  }),
];
