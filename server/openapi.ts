import { OpenAPIRegistry, OpenApiGeneratorV31, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { apiRoutes } from './api-routes';
import { needsCsrf, openApiPath, successStatus, type Access, type Reply, type RouteDef } from './lib/http/routes';
import { uuidSchema } from '../shared/schemas/common';
import { milestoneInputSchema } from '../shared/schemas/inspection';
import { historyQuerySchema, markReadSchema, openThreadSchema, sendMessageSchema } from '../shared/schemas/messages';

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
const threadId = z.object({ threadId: uuidSchema });
const photo = z.object({ jobId: uuidSchema, photoId: uuidSchema });
const photoSized = photo.extend({ size: z.enum(['thumb', 'large']) });
const threadPhotoSized = z.object({ threadId: uuidSchema, photoId: uuidSchema, size: z.enum(['thumb', 'large']) });

export const routeDocs: RouteDoc[] = [
  { method: 'get', path: '/api/threads', summary: 'The signed-in person’s conversations with unread counts', tag: 'Messages', access: 'signed-in' },
  { method: 'get', path: '/api/jobs/{jobId}/threads', summary: 'A job’s conversations the person may read', tag: 'Messages', access: 'signed-in', params: jobId },
  { method: 'post', path: '/api/jobs/{jobId}/threads', summary: 'Open (or find) the conversation between the job’s builder and a shop', tag: 'Messages', access: 'builder or shop', params: jobId, body: openThreadSchema, ok: { status: 201, description: 'The conversation' } },
  { method: 'get', path: '/api/threads/{threadId}/messages', summary: 'Message history, newest first, paged by cursor', tag: 'Messages', access: 'signed-in', params: threadId, query: historyQuerySchema },
  { method: 'post', path: '/api/threads/{threadId}/messages', summary: 'Send a message: words, up to 4 uploaded photos (photoIds), or both; a repeated clientId returns the stored one; live clients use the socket', tag: 'Messages', access: 'builder or shop', params: threadId, body: sendMessageSchema, ok: { status: 201, description: 'Stored and delivered' } },
  { method: 'post', path: '/api/threads/{threadId}/photos', summary: 'Upload photos for a message (multipart field "photos"; JPEG, PNG or WebP; 15 MB each; 4 at a time); send their ids as the message’s photoIds', tag: 'Messages', access: 'builder or shop', params: threadId, ok: { status: 201, description: 'Stored, waiting for a message' } },
  { method: 'get', path: '/api/threads/{threadId}/photos/{photoId}/{size}', summary: 'A photo in a conversation, re-encoded as WebP (before it is sent, only for its uploader)', tag: 'Messages', access: 'signed-in', params: threadPhotoSized, ok: { status: 200, description: 'image/webp' } },
  { method: 'post', path: '/api/threads/{threadId}/read', summary: 'Mark the conversation read up to a message', tag: 'Messages', access: 'signed-in', params: threadId, body: markReadSchema },
  { method: 'get', path: '/api/jobs/{jobId}/milestones', summary: 'The job’s progress timeline', tag: 'Work', access: 'signed-in', params: jobId },
  { method: 'post', path: '/api/jobs/{jobId}/milestones', summary: 'The working shop logs progress (block received starts the work)', tag: 'Work', access: 'shop', params: jobId, body: milestoneInputSchema, ok: { status: 201, description: 'Logged' } },
  { method: 'post', path: '/api/jobs/{jobId}/milestone-photos', summary: 'The working shop uploads photos for a milestone (multipart field "photos"; JPEG, PNG or WebP; 15 MB each; 4 at a time); send their ids as the milestone’s photoIds', tag: 'Work', access: 'shop', params: jobId, ok: { status: 201, description: 'Stored, waiting for a milestone' } },
  { method: 'get', path: '/api/jobs/{jobId}/milestone-photos/{photoId}/{size}', summary: 'A milestone photo, re-encoded as WebP (before it is attached, only for its uploader)', tag: 'Work', access: 'signed-in', params: photoSized, ok: { status: 200, description: 'image/webp' } },
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
