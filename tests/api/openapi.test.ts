import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listRoutes } from '../../server/lib/routes-list';
import { setupTestApp, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

describe('GET /api/openapi.json', () => {
  it('when fetched, then it is an OpenAPI 3.1 document that lists exactly the routes the router has', async () => {
    const res = await supertest(ctx.app).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.1.0');

    const documented = Object.entries(res.body.paths as Record<string, Record<string, unknown>>)
      .flatMap(([path, methods]) => Object.keys(methods).map((method) => `${method.toUpperCase()} ${path}`))
      .sort();
    const served = listRoutes(ctx.app)
      .filter((r) => r.path.startsWith('/api/'))
      .map((r) => `${r.method} ${r.path.replace(/:(\w+)/g, '{$1}')}`)
      .sort();
    expect(served.length).toBeGreaterThan(40);
    expect(documented).toEqual(served);
  });

  it('when a route takes a body, then its schema comes from the zod schema the route parses with', async () => {
    const res = await supertest(ctx.app).get('/api/openapi.json');
    const signup = res.body.paths['/api/auth/signup'].post;
    const schema = signup.requestBody.content['application/json'].schema;
    expect(schema.required.sort()).toEqual(['displayName', 'email', 'password', 'role']);
    expect(schema.properties.role.enum).toEqual(['builder', 'shop']);
    expect(schema.properties.password.minLength).toBe(10);

    const board = res.body.paths['/api/jobs'].get;
    expect(board.parameters.map((p: { name: string }) => p.name)).toEqual(
      expect.arrayContaining(['operation', 'material', 'cylinders', 'region', 'logistics', 'neededBefore', 'sort', 'page', 'pageSize']),
    );
    expect(res.body.paths['/api/calculations/displacement'].post.requestBody).toBeDefined();
  });
});
