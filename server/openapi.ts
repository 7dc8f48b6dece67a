import { OpenAPIRegistry, OpenApiGeneratorV31, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { apiRoutes } from './api-routes';
import { needsCsrf, openApiPath, successStatus, type Access, type Reply, type RouteDef } from './lib/http/routes';

/**
 * The API's OpenAPI 3.1 description, built from the route declarations
 * (server/api-routes.ts) and the same zod schemas the router parses and
 * answers with. tests/api/openapi.test.ts validates it and checks it lists
 * exactly the routes the router serves.
 */

const errorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});

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

let cached: object | undefined;

/** The document for every declared route. */
export function openApiDocument(): object {
  if (cached) return cached;
  const registry = new OpenAPIRegistry();
  for (const route of apiRoutes) registry.registerPath(fromDeclaration(route));
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
