import { z } from 'zod';
import { bidInputSchema, bidListAnswerSchema, bidWithHistorySchema, declineBidSchema, shopBidListAnswerSchema } from '../../../shared/schemas/bids';
import { uuidSchema } from '../../../shared/schemas/common';
import { routesFor } from '../../lib/http/routes';
import { acceptBid, bidsForJob, bidsOfShop, bidWithHistory, createBid, declineBid, reviseBid, withdrawBid, type BidDeps } from './bids.service';

const jobParams = z.object({ jobId: uuidSchema });
const bidParams = z.object({ bidId: uuidSchema });

const route = routesFor<BidDeps>('Bids');

/** Bids on a job: placed and revised by shops, accepted or declined by the job's builder. Each change answers the bid as its changer now sees it. */
export const bidsRoutes = [
  route({
    method: 'get',
    path: '/api/jobs/:jobId/bids',
    summary: 'A job’s bids: all for its builder, its own for a shop',
    access: 'signed-in',
    params: jobParams,
    reply: { json: bidListAnswerSchema },
    handler: async ({ deps, user, params }) => ({ bids: await bidsForJob(deps, user, params.jobId) }),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/bids',
    summary: 'Bid on an open job (the total is worked out by the server)',
    access: 'shop',
    params: jobParams,
    body: bidInputSchema,
    reply: { status: 201, description: 'Bid placed', json: bidWithHistorySchema },
    handler: async ({ deps, user, params, body }) => bidWithHistory(deps, user, await createBid(deps, user, params.jobId, body)),
  }),
  route({
    method: 'get',
    path: '/api/bids/mine',
    summary: 'The signed-in shop’s bids',
    access: 'shop',
    reply: { json: shopBidListAnswerSchema },
    handler: async ({ deps, user }) => ({ bids: await bidsOfShop(deps, user) }),
  }),
  route({
    method: 'get',
    path: '/api/bids/:bidId',
    summary: 'A bid with its earlier versions',
    access: 'signed-in',
    params: bidParams,
    reply: { json: bidWithHistorySchema },
    handler: ({ deps, user, params }) => bidWithHistory(deps, user, params.bidId),
  }),
  route({
    method: 'put',
    path: '/api/bids/:bidId',
    summary: 'Revise an active bid (the old version is kept)',
    access: 'shop',
    params: bidParams,
    body: bidInputSchema,
    reply: { json: bidWithHistorySchema },
    handler: async ({ deps, user, params, body }) => {
      await reviseBid(deps, user, params.bidId, body);
      return bidWithHistory(deps, user, params.bidId);
    },
  }),
  route({
    method: 'post',
    path: '/api/bids/:bidId/withdraw',
    summary: 'Withdraw an active bid',
    access: 'shop',
    params: bidParams,
    reply: { json: bidWithHistorySchema },
    handler: async ({ deps, user, params }) => {
      await withdrawBid(deps, user, params.bidId);
      return bidWithHistory(deps, user, params.bidId);
    },
  }),
  route({
    method: 'post',
    path: '/api/bids/:bidId/accept',
    summary: 'Accept a bid: the job is awarded and every other bid declined',
    access: 'builder',
    params: bidParams,
    reply: { json: bidWithHistorySchema },
    handler: async ({ deps, user, params }) => {
      await acceptBid(deps, user, params.bidId);
      return bidWithHistory(deps, user, params.bidId);
    },
  }),
  route({
    method: 'post',
    path: '/api/bids/:bidId/decline',
    summary: 'Decline a bid',
    access: 'builder',
    params: bidParams,
    body: declineBidSchema,
    reply: { json: bidWithHistorySchema },
    handler: async ({ deps, user, params, body }) => {
      await declineBid(deps, user, params.bidId, body.reason);
      return bidWithHistory(deps, user, params.bidId);
    },
  }),
];
