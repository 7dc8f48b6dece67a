import { jobParamsSchema } from '../../../shared/schemas/jobs';
import { milestoneAnswerSchema } from '../../../shared/schemas/milestones';
import { postalAddressSchema, sentToShopInputSchema, shippingAnswerSchema } from '../../../shared/schemas/shipping';
import { routesFor } from '../../lib/http/routes';
import { logSentToShop } from '../milestones/milestones.service';
import { setReturnAddress, shippingOf, type ShippingDeps } from './shipping.service';

const route = routesFor<ShippingDeps>('Work');

/** Shipping both ways on a `ship` job: the addresses, the builder's "sent to the shop", the return address. */
export const shippingRoutes = [
  route({
    method: 'get',
    path: '/api/jobs/:jobId/shipping',
    summary: 'Where the parts go and how they travelled (the shop’s address once the job is paid for)',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { json: shippingAnswerSchema },
    handler: async ({ deps, user, params }) => ({ shipping: await shippingOf(deps.db, user, params.jobId) }),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/sent-to-shop',
    summary: 'The builder logs the parts sent to the shop, with carrier and tracking number',
    access: 'builder',
    params: jobParamsSchema,
    body: sentToShopInputSchema,
    reply: { status: 201, json: milestoneAnswerSchema, description: 'Logged on the timeline' },
    handler: async ({ deps, user, params, body }) => ({ milestone: await logSentToShop(deps, user, params.jobId, body) }),
  }),
  route({
    method: 'put',
    path: '/api/jobs/:jobId/return-address',
    summary: 'The builder gives where the shop sends the parts back',
    access: 'builder',
    params: jobParamsSchema,
    body: postalAddressSchema,
    reply: { json: shippingAnswerSchema },
    handler: async ({ deps, user, params, body }) => ({ shipping: await setReturnAddress(deps, user, params.jobId, body) }),
  }),
];
