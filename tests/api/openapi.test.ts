import { Validator } from '@seriousme/openapi-schema-validator';
import supertest from 'supertest';
import { z } from 'zod';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiRoutes } from '../../server/api-routes';
import { openApiPath, responseMismatch, successStatus } from '../../server/lib/http/routes';
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
    expect(schema.required.sort()).toEqual(['acceptTerms', 'displayName', 'email', 'password', 'role']);
    expect(schema.properties.role.enum).toEqual(['builder', 'shop']);
    expect(schema.properties.password.minLength).toBe(10);

    const board = res.body.paths['/api/jobs'].get;
    expect(board.parameters.map((p: { name: string }) => p.name)).toEqual(
      expect.arrayContaining(['operation', 'material', 'cylinders', 'region', 'logistics', 'neededBefore', 'sort', 'page', 'pageSize']),
    );
    expect(res.body.paths['/api/calculations/displacement'].post.requestBody).toBeDefined();
  });
});

describe('the OpenAPI document built from the route declarations', () => {
  it('when checked with a general-purpose OpenAPI 3.1 validator, then it is valid', async () => {
    const res = await supertest(ctx.app).get('/api/openapi.json');
    const validator = new Validator();
    const result = await validator.validate(res.body);
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe('3.1');
  });

  it('when a declared route succeeds, then the document says with what: a JSON schema, a file type, or a status with no body', async () => {
    const res = await supertest(ctx.app).get('/api/openapi.json');
    const paths = res.body.paths as Record<string, Record<string, { responses: Record<string, { content?: Record<string, { schema?: object }> }> }>>;
    const problems: string[] = [];
    for (const route of apiRoutes) {
      const operation = paths[openApiPath(route.path)]?.[route.method];
      const success = operation?.responses[String(successStatus(route.reply))];
      const content = success?.content ?? {};
      if ('json' in route.reply && !content['application/json']?.schema) problems.push(`${route.method} ${route.path}: no JSON schema`);
      if ('file' in route.reply && !content[route.reply.file]?.schema) problems.push(`${route.method} ${route.path}: no ${route.reply.file} content`);
      if (('empty' in route.reply || 'redirect' in route.reply) && Object.keys(content).length) problems.push(`${route.method} ${route.path}: a body where none is sent`);
    }
    expect(problems).toEqual([]);
    const shopPage = paths['/api/shops/{shopId}'].get.responses['200'].content!['application/json'].schema as { properties: Record<string, unknown> };
    expect(Object.keys(shopPage.properties)).toEqual(['shop']);
  });
});

describe('answers held to their declarations', () => {
  it('when an answer carries a field its schema does not declare, or lacks one it requires, then the check names it', () => {
    const schema = z.object({ id: z.string(), when: z.iso.datetime() });
    expect(responseMismatch(schema, { id: 'a', when: new Date('2026-12-05T10:00:00Z') })).toBeNull();
    expect(responseMismatch(schema, { id: 'a', when: new Date(), secret: 'x' })).toMatch(/does not declare/);
    expect(responseMismatch(schema, { id: 'a' })).toMatch(/^when:/);
  });
});
