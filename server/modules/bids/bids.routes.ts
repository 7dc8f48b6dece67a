import { bidInputSchema, bidListAnswerSchema, bidParamsSchema, bidWithHistorySchema, declineBidSchema, feeRateSchema, shopBidListAnswerSchema, workQueueAnswerSchema } from '../../../shared/schemas/bids';
import { jobParamsSchema } from '../../../shared/schemas/jobs';
import type { User } from '../../db/schema';
import { routesFor } from '../../lib/http/routes';
import { acceptBid, bidsForJob, bidsOfShop, bidWithHistory, createBid, declineBid, feeRateNow, reviseBid, withdrawBid, workQueue, type BidDeps } from './bids.service';

/** The bid once a change to it is done, as the person who made the change now sees it. */
const answerBid = async (deps: BidDeps, user: User, bidId: string, change: Promise<void>) => {
  await change;
  return bidWithHistory(deps, user, bidId);
};

const route = routesFor<BidDeps>('Bids');

/** Bids on a job: placed and revised by shops, accepted or declined by the job's builder. Each change answers the bid as its changer now sees it. */
export const bidsRoutes = [
  route({
    method: 'get',
    path: '/api/jobs/:jobId/bids',
    summary: 'A job’s bids: all for its builder, its own for a shop',
    access: 'signed-in',
    params: jobParamsSchema,
    reply: { json: bidListAnswerSchema },
    handler: async ({ deps, user, params }) => ({ bids: await bidsForJob(deps, user, params.jobId) }),
  }),
  route({
    method: 'post',
    path: '/api/jobs/:jobId/bids',
    summary: 'Bid on an open job (the total is worked out by the server)',
    access: 'shop',
    params: jobParamsSchema,
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
    path: '/api/shop/queue',
    summary: 'The signed-in shop’s won jobs not finished yet, soonest due first',
    access: 'shop',
    reply: { json: workQueueAnswerSchema },
    handler: async ({ deps, user }) => ({ jobs: await workQueue(deps, user) }),
  }),
  route({
    method: 'get',
    path: '/api/bids/fee-rate',
    summary: 'The Tenthmark fee rate now, for a shop working out what it keeps of a bid',
    access: 'shop',
    reply: { json: feeRateSchema },
    handler: ({ deps }) => feeRateNow(deps),
  }),
  route({
    method: 'get',
    path: '/api/bids/:bidId',
    summary: 'A bid with its earlier versions',
    access: 'signed-in',
    params: bidParamsSchema,
    reply: { json: bidWithHistorySchema },
    handler: ({ deps, user, params }) => bidWithHistory(deps, user, params.bidId),
  }),
  route({
    method: 'put',
    path: '/api/bids/:bidId',
    summary: 'Revise an active bid (the old version is kept)',
    access: 'shop',
    params: bidParamsSchema,
    body: bidInputSchema,
    reply: { json: bidWithHistorySchema },
    handler: ({ deps, user, params, body }) => answerBid(deps, user, params.bidId, reviseBid(deps, user, params.bidId, body)),
  }),
  route({
    method: 'post',
    path: '/api/bids/:bidId/withdraw',
    summary: 'Withdraw an active bid',
    access: 'shop',
    params: bidParamsSchema,
    reply: { json: bidWithHistorySchema },
    handler: ({ deps, user, params }) => answerBid(deps, user, params.bidId, withdrawBid(deps, user, params.bidId)),
  }),
  route({
    method: 'post',
    path: '/api/bids/:bidId/accept',
    summary: 'Accept a bid: the job is awarded and every other bid declined',
    access: 'builder',
    params: bidParamsSchema,
    reply: { json: bidWithHistorySchema },
    handler: ({ deps, user, params }) => answerBid(deps, user, params.bidId, acceptBid(deps, user, params.bidId)),
  }),
  route({
    method: 'post',
    path: '/api/bids/:bidId/decline',
    summary: 'Decline a bid',
    access: 'builder',
    params: bidParamsSchema,
    body: declineBidSchema,
    reply: { json: bidWithHistorySchema },
    handler: ({ deps, user, params, body }) => answerBid(deps, user, params.bidId, declineBid(deps, user, params.bidId, body.reason)),
  }),
];
