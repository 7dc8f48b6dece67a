import { randomUUID } from 'node:crypto';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiRoutes } from '../../server/api-routes';
import { needsCsrf } from '../../server/lib/http/routes';
import { agentFor, setupTestApp, type TestContext } from '../setup/test-env';

/**
 * The CSRF check comes from each route's declaration: every state-changing
 * route is refused without the session's token, before anything else is
 * looked at, unless it is declared `csrf: false`.
 */
let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

/** A path with its parameters filled by values of the right form. */
const concrete = (path: string) =>
  path.replace(/:(\w+)/g, (_, name: string) => (name === 'size' ? 'thumb' : name === 'version' ? '1' : randomUUID()));

const send = (agent: ReturnType<typeof supertest.agent>, method: string, path: string) =>
  (agent as unknown as Record<string, (path: string) => supertest.Test>)[method](path).send({});

describe('CSRF from the route declarations', () => {
  const guarded = apiRoutes.filter(needsCsrf);
  const open = apiRoutes.filter((route) => route.method !== 'get' && !needsCsrf(route));

  it('when a state-changing route is called with the session but without its token, then 403 csrf_failed, for every such route', async () => {
    expect(guarded.length).toBeGreaterThan(40);
    const client = await agentFor(ctx.app);
    const wrong: string[] = [];
    for (const route of guarded) {
      const res = await send(client.agent, route.method, concrete(route.path));
      if (res.status !== 403 || res.body?.error?.code !== 'csrf_failed') wrong.push(`${route.method} ${route.path}: ${res.status} ${res.body?.error?.code}`);
    }
    expect(wrong).toEqual([]);
  });

  it('when a route declared csrf: false is called without a token, then the CSRF check does not refuse it', async () => {
    expect(open.map((route) => route.path)).toEqual(expect.arrayContaining(['/api/payments/webhook', '/api/calculations/displacement']));
    for (const route of open) {
      const res = await send(supertest.agent(ctx.app), route.method, concrete(route.path));
      expect(res.body?.error?.code, `${route.method} ${route.path}`).not.toBe('csrf_failed');
    }
  });

  it('when the same request carries the token, then it gets past the check (a signed-out caller is then asked to sign in)', async () => {
    const client = await agentFor(ctx.app);
    const res = await client.post('/api/jobs', {});
    expect(res.status).toBe(401);
  });
});
