import { z } from 'zod';
import { routesFor } from '../../lib/http/routes';

/** The document itself, as an object: the generator and tests/api/openapi.test.ts (an OpenAPI 3.1 validator) answer for its parts. */
const openApiDocumentSchema = z.record(z.string(), z.unknown()).meta({ description: 'An OpenAPI 3.1 document' });

/** The app hands in the builder (server/openapi.ts), which reads the route list this module is part of. */
const route = routesFor<{ document: () => object }>('Health');

/** The API's own description, built from the route declarations. */
export const openApiRoutes = [
  route({
    method: 'get',
    path: '/api/openapi.json',
    summary: 'This description',
    access: 'public',
    reply: { json: openApiDocumentSchema, description: 'The OpenAPI 3.1 document of every route' },
    // Spread: the generator's interface types say nothing of other keys; on the wire it is one plain object.
    handler: ({ deps }) => ({ ...deps.document() }),
  }),
];
