import { OpenAPIRegistry, OpenApiGeneratorV31, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { apiRoutes } from './api-routes';
import { needsCsrf, openApiPath, successStatus, type Access, type Reply, type RouteDef } from './lib/http/routes';
import { auditQuerySchema, createAdminSchema, ledgerQuerySchema, platformFeeSchema, shopSearchSchema, suspendUserSchema, userSearchSchema, verifyShopSchema } from '../shared/schemas/admin';
import { disputeQueueSchema, disputeResponseSchema, openDisputeSchema, resolveDisputeSchema } from '../shared/schemas/disputes';
import { reviewInputSchema } from '../shared/schemas/reviews';
import { bidInputSchema, declineBidSchema } from '../shared/schemas/bids';
import { uuidSchema } from '../shared/schemas/common';
import { boardQuerySchema, jobInputSchema, myJobsQuerySchema } from '../shared/schemas/jobs';
import { changeOrderInputSchema, splitSchema } from '../shared/schemas/payments';
import { inspectionDraftSchema, inspectionInputSchema, rejectInspectionSchema } from '../shared/schemas/inspection';

/**
 * The API's OpenAPI description, built from the same zod schemas the routes
 * parse with. tests/api/openapi.test.ts checks it lists every route the
 * Express router has, and nothing it lacks.
 */

interface RouteDoc {
  method: 'get' | 'post' | 'put' | 'delete';
  path: string;
  summary: string;
  tag: string;
  access: Access;
  body?: z.ZodType;
  query?: z.ZodObject;
  params?: z.ZodObject;
  ok?: { status: number; description: string };
  /** A state-changing request needs the X-CSRF-Token header, except where it says otherwise. */
  csrf?: boolean;
}

const errorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});

const jobId = z.object({ jobId: uuidSchema });
const bidId = z.object({ bidId: uuidSchema });
const shopId = z.object({ shopId: uuidSchema });
const changeOrderId = z.object({ changeOrderId: uuidSchema });
const disputeId = z.object({ disputeId: uuidSchema });
const userId = z.object({ userId: uuidSchema });
const historyQuery = z.object({ limit: z.coerce.number().int().min(1).max(100).optional(), offset: z.coerce.number().int().min(0).optional() });
const photo = z.object({ jobId: uuidSchema, photoId: uuidSchema });
const photoSized = photo.extend({ size: z.enum(['thumb', 'large']) });

export const routeDocs: RouteDoc[] = [
  { method: 'get', path: '/api/jobs', summary: 'The job board: open jobs, filtered, sorted and paged', tag: 'Jobs', access: 'shop', query: boardQuerySchema },
  { method: 'get', path: '/api/jobs/mine', summary: 'The signed-in builder’s jobs', tag: 'Jobs', access: 'builder', query: myJobsQuerySchema },
  { method: 'post', path: '/api/jobs', summary: 'Create a draft job', tag: 'Jobs', access: 'builder', body: jobInputSchema, ok: { status: 201, description: 'Draft created' } },
  { method: 'get', path: '/api/jobs/{jobId}', summary: 'A job, for its builder, shops while open, and shops that bid', tag: 'Jobs', access: 'signed-in', params: jobId },
  { method: 'put', path: '/api/jobs/{jobId}', summary: 'Edit a draft or open job (bidders are told)', tag: 'Jobs', access: 'builder', params: jobId, body: jobInputSchema },
  { method: 'post', path: '/api/jobs/{jobId}/publish', summary: 'Publish a draft to the board', tag: 'Jobs', access: 'builder', params: jobId },
  { method: 'post', path: '/api/jobs/{jobId}/cancel', summary: 'Cancel a job before payment (an open payment page for it is expired)', tag: 'Jobs', access: 'builder', params: jobId },
  { method: 'post', path: '/api/jobs/{jobId}/photos', summary: 'Upload photos (multipart field "photos"; JPEG, PNG or WebP; 15 MB each; 12 per job)', tag: 'Jobs', access: 'builder', params: jobId, ok: { status: 201, description: 'Stored' } },
  { method: 'get', path: '/api/jobs/{jobId}/photos/{photoId}/{size}', summary: 'A photo, re-encoded as WebP', tag: 'Jobs', access: 'signed-in', params: photoSized, ok: { status: 200, description: 'image/webp' } },
  { method: 'delete', path: '/api/jobs/{jobId}/photos/{photoId}', summary: 'Remove a photo', tag: 'Jobs', access: 'builder', params: photo, ok: { status: 204, description: 'Removed' } },
  { method: 'get', path: '/api/jobs/{jobId}/bids', summary: 'A job’s bids: all for its builder, its own for a shop', tag: 'Bids', access: 'signed-in', params: jobId },
  { method: 'post', path: '/api/jobs/{jobId}/bids', summary: 'Bid on an open job (the total is worked out by the server)', tag: 'Bids', access: 'shop', params: jobId, body: bidInputSchema, ok: { status: 201, description: 'Bid placed' } },
  { method: 'get', path: '/api/bids/mine', summary: 'The signed-in shop’s bids', tag: 'Bids', access: 'shop' },
  { method: 'get', path: '/api/bids/{bidId}', summary: 'A bid with its earlier versions', tag: 'Bids', access: 'signed-in', params: bidId },
  { method: 'put', path: '/api/bids/{bidId}', summary: 'Revise an active bid (the old version is kept)', tag: 'Bids', access: 'shop', params: bidId, body: bidInputSchema },
  { method: 'post', path: '/api/bids/{bidId}/withdraw', summary: 'Withdraw an active bid', tag: 'Bids', access: 'shop', params: bidId },
  { method: 'post', path: '/api/bids/{bidId}/accept', summary: 'Accept a bid: the job is awarded and every other bid declined', tag: 'Bids', access: 'builder', params: bidId },
  { method: 'post', path: '/api/bids/{bidId}/decline', summary: 'Decline a bid', tag: 'Bids', access: 'builder', params: bidId, body: declineBidSchema },
  { method: 'get', path: '/api/jobs/{jobId}/inspection', summary: 'Inspection record versions with the server’s results, the shop’s draft, and the review deadline', tag: 'Work', access: 'signed-in', params: jobId },
  { method: 'put', path: '/api/jobs/{jobId}/inspection/draft', summary: 'Keep the shop’s unfinished record', tag: 'Work', access: 'shop', params: jobId, body: inspectionDraftSchema },
  { method: 'post', path: '/api/jobs/{jobId}/inspection', summary: 'Submit the measured record (raw readings only; the server computes and judges)', tag: 'Work', access: 'shop', params: jobId, body: inspectionInputSchema, ok: { status: 201, description: 'A new version' } },
  { method: 'post', path: '/api/jobs/{jobId}/inspection/accept', summary: 'Accept the record: the held payment is released to the shop', tag: 'Work', access: 'builder', params: jobId },
  { method: 'get', path: '/api/jobs/{jobId}/inspection/{version}/certificate.pdf', summary: 'The certificate of one version as a PDF', tag: 'Work', access: 'signed-in', params: jobId.extend({ version: z.coerce.number().int().min(1) }), ok: { status: 200, description: 'application/pdf' } },
  { method: 'post', path: '/api/jobs/{jobId}/inspection/reject', summary: 'Reject the record with reasons; the shop submits a new version', tag: 'Work', access: 'builder', params: jobId, body: rejectInspectionSchema },
  { method: 'post', path: '/api/payments/webhook', summary: 'Payment provider events (signed with Stripe-Signature; raw JSON body)', tag: 'Payments', access: 'public', csrf: false },
  { method: 'post', path: '/api/shop-profile/payouts', summary: 'Start or continue the shop’s payout account onboarding; answers the provider’s link', tag: 'Payments', access: 'shop' },
  { method: 'post', path: '/api/jobs/{jobId}/checkout', summary: 'Pay the accepted bid: answers a hosted payment page address', tag: 'Payments', access: 'builder', params: jobId },
  { method: 'get', path: '/api/jobs/{jobId}/money', summary: 'The job’s payments, ledger balance and any payout or refund still on its way', tag: 'Payments', access: 'signed-in', params: jobId },
  { method: 'post', path: '/api/jobs/{jobId}/cancel-and-refund', summary: 'Cancel a paid job the shop has not started; the payment is refunded in full', tag: 'Payments', access: 'builder', params: jobId },
  { method: 'get', path: '/api/jobs/{jobId}/change-orders', summary: 'Extra work proposed on a job', tag: 'Payments', access: 'signed-in', params: jobId },
  { method: 'post', path: '/api/jobs/{jobId}/change-orders', summary: 'The awarded shop proposes extra work with a price', tag: 'Payments', access: 'shop', params: jobId, body: changeOrderInputSchema, ok: { status: 201, description: 'Proposed' } },
  { method: 'post', path: '/api/change-orders/{changeOrderId}/approve', summary: 'Agree to extra work and pay for it: answers a hosted payment page address', tag: 'Payments', access: 'builder', params: changeOrderId },
  { method: 'post', path: '/api/change-orders/{changeOrderId}/decline', summary: 'Decline extra work that is not paid yet (its open payment page is expired)', tag: 'Payments', access: 'builder', params: changeOrderId },
  { method: 'post', path: '/api/admin/jobs/{jobId}/release', summary: 'Release what the job holds to the shop, less the fee (once, however often asked)', tag: 'Payments', access: 'admin', params: jobId },
  { method: 'post', path: '/api/admin/jobs/{jobId}/split', summary: 'Pay the shop a share of what is held and refund the rest', tag: 'Payments', access: 'admin', params: jobId, body: splitSchema },
  { method: 'get', path: '/api/admin/users', summary: 'Search accounts', tag: 'Admin', access: 'admin', query: userSearchSchema },
  { method: 'post', path: '/api/admin/admins', summary: 'Make another administrator', tag: 'Admin', access: 'admin', body: createAdminSchema, ok: { status: 201, description: 'Created; a link to choose a password is mailed' } },
  { method: 'get', path: '/api/me/money', summary: 'The signed-in builder’s or shop’s money history across their jobs', tag: 'Payments', access: 'builder or shop', query: historyQuery },
  { method: 'get', path: '/api/jobs/{jobId}/dispute', summary: 'The job’s dispute, and whether the viewer may open or answer one', tag: 'Disputes', access: 'signed-in', params: jobId },
  { method: 'post', path: '/api/jobs/{jobId}/dispute', summary: 'Open a dispute; the held payment stays held until an administrator decides', tag: 'Disputes', access: 'builder or shop', params: jobId, body: openDisputeSchema, ok: { status: 201, description: 'Opened; both sides are told by e-mail' } },
  { method: 'post', path: '/api/jobs/{jobId}/dispute/response', summary: 'The other side answers the dispute (once)', tag: 'Disputes', access: 'builder or shop', params: jobId, body: disputeResponseSchema },
  { method: 'get', path: '/api/jobs/{jobId}/reviews', summary: 'Reviews left on a finished job, and whether the viewer may still leave one', tag: 'Reviews', access: 'signed-in', params: jobId },
  { method: 'post', path: '/api/jobs/{jobId}/reviews', summary: 'Rate the other side of a finished job, 1 to 5 with a comment (once)', tag: 'Reviews', access: 'builder or shop', params: jobId, body: reviewInputSchema, ok: { status: 201, description: 'Stored' } },
  { method: 'get', path: '/api/admin/disputes', summary: 'The dispute queue with age and amount held', tag: 'Admin', access: 'admin', query: disputeQueueSchema },
  { method: 'get', path: '/api/admin/disputes/{disputeId}', summary: 'A dispute with its evidence: messages, milestones, inspection versions, photos, change orders and money, in one timeline', tag: 'Admin', access: 'admin', params: disputeId },
  { method: 'post', path: '/api/admin/disputes/{disputeId}/resolve', summary: 'Decide a dispute: release, refund or split, with a written decision mailed to both sides', tag: 'Admin', access: 'admin', params: disputeId, body: resolveDisputeSchema },
  { method: 'post', path: '/api/admin/users/{userId}/suspend', summary: 'Suspend an account: its sessions end at once and it cannot sign in', tag: 'Admin', access: 'admin', params: userId, body: suspendUserSchema },
  { method: 'post', path: '/api/admin/users/{userId}/reinstate', summary: 'Reinstate a suspended account', tag: 'Admin', access: 'admin', params: userId },
  { method: 'get', path: '/api/admin/shops', summary: 'Search shops', tag: 'Admin', access: 'admin', query: shopSearchSchema },
  { method: 'post', path: '/api/admin/shops/{shopId}/verification', summary: 'Verify a shop (a badge on its page and bids) or take it away', tag: 'Admin', access: 'admin', params: shopId, body: verifyShopSchema },
  { method: 'get', path: '/api/admin/fee', summary: 'The platform fee for new awards', tag: 'Admin', access: 'admin' },
  { method: 'put', path: '/api/admin/fee', summary: 'Change the platform fee (applies to bids accepted from now on)', tag: 'Admin', access: 'admin', body: platformFeeSchema },
  { method: 'get', path: '/api/admin/ledger', summary: 'Ledger entries with filters and totals', tag: 'Admin', access: 'admin', query: ledgerQuerySchema },
  { method: 'get', path: '/api/admin/ledger.csv', summary: 'The filtered ledger as CSV', tag: 'Admin', access: 'admin', query: ledgerQuerySchema.omit({ limit: true, offset: true }), ok: { status: 200, description: 'text/csv' } },
  { method: 'get', path: '/api/admin/audit', summary: 'The audit log of administrator actions', tag: 'Admin', access: 'admin', query: auditQuerySchema },
  { method: 'get', path: '/api/openapi.json', summary: 'This description', tag: 'Health', access: 'public' },
];

const errorResponse = (description: string) => ({ description, content: { 'application/json': { schema: errorSchema } } });

/** The 4xx answers every route of this access may give, besides its own 400s, 404s and 409s. */
function refusals(access: Access) {
  return {
    400: errorResponse('Input not valid; a message per field'),
    ...(access !== 'public' ? { 401: errorResponse('Not signed in') } : {}),
    ...(access !== 'public' ? { 403: errorResponse('Not allowed for this account') } : {}),
    429: errorResponse('Too many requests'),
  };
}

function csrfHeader(needed: boolean) {
  return needed ? { headers: z.object({ 'x-csrf-token': z.string() }) } : {};
}

function describeAccess(access: Access, csrf: boolean): string {
  return `Who may call it: ${access}.${csrf ? ' Send the session cookie and the X-CSRF-Token header from GET /api/auth/csrf.' : ''}`;
}

/** A success answer as OpenAPI says it: a JSON schema, a file type, a redirect or nothing. */
function successResponse(reply: Reply) {
  if ('json' in reply) return { description: reply.description ?? 'Done', content: { 'application/json': { schema: reply.json } } };
  if ('file' in reply) return { description: reply.description, content: { [reply.file]: { schema: z.string().meta({ format: 'binary' }) } } };
  return { description: reply.description };
}

function fromDeclaration(route: RouteDef<never>): RouteConfig {
  const csrf = needsCsrf(route);
  return {
    method: route.method,
    path: openApiPath(route.path),
    summary: route.summary,
    description: describeAccess(route.access, csrf),
    tags: [route.tag],
    request: {
      ...(route.params ? { params: route.params as z.ZodObject } : {}),
      ...(route.query ? { query: route.query as z.ZodObject } : {}),
      ...(route.body ? { body: { content: { 'application/json': { schema: route.body } } } } : {}),
      ...csrfHeader(csrf),
    },
    responses: { [successStatus(route.reply)]: successResponse(route.reply), ...refusals(route.access) },
  };
}

function toRouteConfig(doc: RouteDoc): RouteConfig {
  const ok = doc.ok ?? { status: 200, description: 'Done' };
  const csrf = doc.method !== 'get' && doc.csrf !== false;
  return {
    method: doc.method,
    path: doc.path,
    summary: doc.summary,
    description: describeAccess(doc.access, csrf),
    tags: [doc.tag],
    request: {
      ...(doc.params ? { params: doc.params } : {}),
      ...(doc.query ? { query: doc.query } : {}),
      ...(doc.body ? { body: { content: { 'application/json': { schema: doc.body } } } } : {}),
      ...csrfHeader(csrf),
    },
    responses: { [ok.status]: { description: ok.description }, ...refusals(doc.access) },
  };
}

let cached: object | undefined;

/** The document for every declared route (and, until their modules are declared too, the routes still listed by hand above). */
export function openApiDocument(): object {
  if (cached) return cached;
  const registry = new OpenAPIRegistry();
  const declared = new Set(apiRoutes.map((route) => `${route.method} ${openApiPath(route.path)}`));
  for (const route of apiRoutes) registry.registerPath(fromDeclaration(route));
  for (const doc of routeDocs) if (!declared.has(`${doc.method} ${doc.path}`)) registry.registerPath(toRouteConfig(doc));
  cached = new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Tenthmark API',
      version: '0.1.0',
      description: 'Engine machining jobs, bids and measured results. JSON in and out; errors as { error: { code, message, fields } }.',
    },
    servers: [{ url: '/' }],
  });
  return cached;
}
