/**
 * Safety properties beside validation: SQL-looking text is only text, LIKE
 * wildcards in searches are literal, redirects and e-mailed links stay on our
 * own site, the security headers and the session cookie are what the security
 * model says, and every rate limit answers 429 in the API's shape with a
 * Retry-After.
 */
import { eq, sql } from 'drizzle-orm';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import Stripe from 'stripe';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createApp, SESSION_COOKIE } from '../../server/app';
import { createDb, createPool } from '../../server/db/client';
import { mailOutbox, payments } from '../../server/db/schema';
import { createLogger } from '../../server/lib/logger';
import { submitHostedPage } from '../../server/dev/payments-stand-in/page-client';
import { bidInput, createJob, createShop, createUser, jobInput, TEST_PASSWORD, uniqueEmail } from '../factories';
import { approveOnGithub, githubIdentity } from '../setup/github';
import { startTestStandIn } from '../setup/payments';
import { agentFor, setupTestApp, signedIn, testConfig, type TestContext } from '../setup/test-env';

const LIMIT = 3;
let ctx: TestContext;
let standIn: Awaited<ReturnType<typeof startTestStandIn>>['standIn'];
let stripe: Stripe;

beforeAll(async () => {
  standIn = (await startTestStandIn()).standIn;
  // Small limits, so each limiter is reached in a few requests. Nothing else in this file fails a sign-in or signs up.
  ctx = await setupTestApp({
    STRIPE_API_URL: standIn.url,
    RATE_LIMIT_SIGNIN_MAX: String(LIMIT),
    RATE_LIMIT_SIGNUP_MAX: String(LIMIT),
    RATE_LIMIT_CALCULATIONS_PER_MINUTE: String(LIMIT),
    RATE_LIMIT_MESSAGES_PER_10S: String(LIMIT),
    RATE_LIMIT_UPLOADS_PER_10_MIN: String(LIMIT),
  });
  const url = new URL(standIn.url);
  stripe = new Stripe('sk_test_tenthmark_local', { host: url.hostname, port: Number(url.port), protocol: 'http', telemetry: false, maxNetworkRetries: 0 });
});
afterAll(async () => {
  await ctx?.close();
  await standIn?.close();
});

const SQLISH = "'; DROP TABLE jobs; --";
const tag = () => randomBytes(3).toString('hex');

async function tablesIntact() {
  const { rows } = await ctx.db.execute<{ jobs: number; shops: number; users: number }>(
    sql`SELECT (SELECT count(*) FROM jobs)::int AS jobs, (SELECT count(*) FROM shops)::int AS shops, (SELECT count(*) FROM users)::int AS users`,
  );
  return rows[0];
}

describe('SQL-looking input is only text', () => {
  it('when a job title, spec and notes hold quotes, comment marks, %, _ and \\, then they come back verbatim and the tables are intact', async () => {
    const builder = await createUser(ctx.db);
    const b = await signedIn(ctx.app, builder);
    const text = {
      title: `Bore ${SQLISH} 100% _x_ C:\\path`,
      engineFamily: `V8'); DELETE FROM users; --`,
      notes: `Robert'); DROP TABLE shops;-- % _ \\ \\% \\_ ' " \` $1 :name ? ; /* */ \\x00`,
      deckNotes: `%_%_% \\\\ ''`,
    };
    const created = await b.post('/api/jobs', jobInput(text));
    expect(created.status).toBe(201);
    const read = await b.get(`/api/jobs/${created.body.job.id}`);
    expect(read.status).toBe(200);
    expect(read.body.job.spec).toMatchObject(text);
    expect(read.body.job.title).toBe(text.title);
    const before = await tablesIntact();
    expect(before.jobs).toBeGreaterThan(0);
    expect(before.users).toBeGreaterThan(0);
  });

  it('when a message holds SQL and LIKE characters, then the conversation shows it verbatim', async () => {
    const builder = await createUser(ctx.db);
    const job = await createJob(ctx.db, builder.id);
    const { user: shopUser } = await createShop(ctx.db);
    const s = await signedIn(ctx.app, shopUser);
    const thread = await s.post(`/api/jobs/${job.id}/threads`, {});
    expect(thread.status).toBe(201);
    const body = `${SQLISH}\n100% of the _bores_ \\ "quoted" 'single' $$ dollar $$`;
    const sent = await s.post(`/api/threads/${thread.body.thread.id}/messages`, { clientId: `sqlish-${tag()}`, body });
    expect(sent.status).toBe(201);
    const history = await s.get(`/api/threads/${thread.body.thread.id}/messages`);
    expect(history.body.messages.map((m: { body: string }) => m.body)).toEqual([body]);
    expect((await tablesIntact()).jobs).toBeGreaterThan(0);
  });

  it('when the searches get %, _, \\ or SQL, then they match those characters literally', async () => {
    const t = tag();
    const names = {
      percent: `Percent 100% Bore ${t}`,
      percentDecoy: `Percent 1000 Bore ${t}`,
      underscore: `Under_score Works ${t}`,
      underscoreDecoy: `Underxscore Works ${t}`,
      backslash: `Back\\slash Machining ${t}`,
      sqlish: `O'Brien${SQLISH} ${t}`,
    };
    for (const name of Object.values(names)) await createShop(ctx.db, { name });
    for (const name of Object.values(names)) await createUser(ctx.db, { displayName: name });
    const admin = await signedIn(ctx.app, await createUser(ctx.db, { role: 'admin' }));
    const searches: Array<[string, (q: string) => Promise<string[]>]> = [
      ['the shop directory', async (q) => (await supertest(ctx.app).get('/api/shops').query({ q, pageSize: 100 })).body.shops.map((s: { name: string }) => s.name)],
      ['the admin’s people search', async (q) => (await admin.get(`/api/admin/users?limit=100&q=${encodeURIComponent(q)}`)).body.users.map((u: { displayName: string }) => u.displayName)],
      ['the admin’s shop search', async (q) => (await admin.get(`/api/admin/shops?limit=100&q=${encodeURIComponent(q)}`)).body.shops.map((s: { name: string }) => s.name)],
    ];
    const cases: Array<[string, string, string[]]> = [
      ['100%', names.percent, [names.percentDecoy]],
      ['%', names.percent, [names.underscore, names.backslash, names.sqlish]],
      ['_', names.underscore, [names.underscoreDecoy, names.percent, names.backslash]],
      ['\\', names.backslash, [names.percent, names.underscore, names.sqlish]],
      [SQLISH, names.sqlish, [names.percent, names.underscore]],
    ];
    for (const [where, search] of searches) {
      for (const [q, found, notFound] of cases) {
        const result = await search(q);
        expect(result, `${where}, q=${q}`).toContain(found);
        for (const decoy of notFound) expect(result, `${where}, q=${q}`).not.toContain(decoy);
      }
    }
    expect(await tablesIntact()).toMatchObject({ shops: expect.any(Number), jobs: expect.any(Number) });
  });

  it('when the board is filtered by region or country with SQL or wildcards, then only the exact match is found', async () => {
    const builder = await createUser(ctx.db);
    const t = tag();
    const regions = [`Ohio${SQLISH}`, '%', '_', '\\', 'Oxhio'];
    const byRegion = new Map<string, string>();
    for (const region of regions) {
      const job = await createJob(ctx.db, builder.id, { input: { region, country: `Land ${t}`, title: `Board ${region} ${t}` } });
      byRegion.set(region, job.id);
    }
    const { user: shopUser } = await createShop(ctx.db);
    const s = await signedIn(ctx.app, shopUser);
    for (const region of regions) {
      const res = await s.get(`/api/jobs?pageSize=100&country=${encodeURIComponent(`Land ${t}`)}&region=${encodeURIComponent(region)}`);
      expect(res.status, region).toBe(200);
      expect(res.body.jobs.map((j: { id: string }) => j.id), region).toEqual([byRegion.get(region)]);
    }
    const sqlCountry = await s.get(`/api/jobs?country=${encodeURIComponent(SQLISH)}`);
    expect(sqlCountry.status).toBe(200);
    expect(sqlCountry.body.total).toBe(0);
    expect((await tablesIntact()).jobs).toBeGreaterThanOrEqual(regions.length);
  });
});

// ---------------------------------------------------------------------------

const APP_ORIGIN = 'http://localhost:5999';
const evilTargets = [
  '//evil.test',
  '//evil.test/dashboard',
  'https://evil.test',
  'http://evil.test/',
  'HTTPS://evil.test',
  '/\\evil.test',
  '\\\\evil.test',
  '/\\/evil.test',
  '\\/evil.test',
  'javascript:alert(1)',
  'JaVaScRiPt:alert(1)',
  ' javascript:alert(1)',
  'data:text/html,<script>alert(1)</script>',
  '/\t/evil.test',
  '/\n/evil.test',
  '/\r\n/evil.test',
  ' //evil.test',
  '%2F%2Fevil.test',
  '/%2F%2Fevil.test',
  '/%5Cevil.test',
  'https:evil.test',
  '///evil.test',
  '/ /evil.test',
];

/** A redirect that stays on our site: a path on our origin, no scheme, no "//host", no backslash or control character. */
function expectOwnPath(location: string | undefined, context: string) {
  expect(location, context).toBeDefined();
  expect(location!, context).toMatch(/^\/(?![/\\])/);
  expect(location!, context).not.toMatch(/[\\\u0000-\u001f]/);
  expect(new URL(location!, APP_ORIGIN).origin, context).toBe(APP_ORIGIN);
}

type Client = Awaited<ReturnType<typeof agentFor>>;

/** The whole GitHub round trip through the stand-in, as a browser makes it; `rawQuery` is sent as it is. */
async function githubRoundTrip(client: Client, login: string, rawQuery: string) {
  const start = await client.get(`/api/auth/github${rawQuery ? `?${rawQuery}` : ''}`);
  expect(start.status).toBe(302);
  const authorize = new URL(start.headers.location);
  const approve = await approveOnGithub(authorize, githubIdentity(login));
  const back = new URL(approve.headers.get('location')!);
  return client.get(back.pathname + back.search);
}

describe('redirects and links only go to our own paths', () => {
  it('when a GitHub sign-in starts with an off-site or tricky return path, then it ends on our own path', async () => {
    const login = `gh-safety-${tag()}`;
    const first = await agentFor(ctx.app);
    await githubRoundTrip(first, login, '');
    expect((await first.post('/api/auth/github/complete', { role: 'builder', acceptTerms: true })).status).toBe(201);

    const queries = [
      ...evilTargets.map((target) => `returnTo=${encodeURIComponent(target)}`),
      // Sent without our encoding: decoded once by the query parser.
      'returnTo=%2F%2Fevil.test',
      'returnTo=%2F%5Cevil.test',
      'returnTo=/%09/evil.test',
      'returnTo=%252F%252Fevil.test',
      'returnTo=/board&returnTo=//evil.test',
      'returnTo[]=//evil.test',
      'returnTo[href]=https://evil.test',
    ];
    for (const query of queries) {
      const client = await agentFor(ctx.app);
      const res = await githubRoundTrip(client, login, query);
      expect(res.status, query).toBe(302);
      expectOwnPath(res.headers.location, query);
    }
    // The test can tell the difference: our own path is kept.
    const own = await githubRoundTrip(await agentFor(ctx.app), login, `returnTo=${encodeURIComponent('/board?sort=newest')}`);
    expect(own.headers.location).toBe('/board?sort=newest');
  });

  it('when the provider comes back with an error that names another site, then the person lands on our sign-in page', async () => {
    const client = await agentFor(ctx.app);
    const res = await client.get(
      `/api/auth/github/callback?error=${encodeURIComponent('https://evil.test')}&error_description=${encodeURIComponent('//evil.test')}&error_uri=${encodeURIComponent('https://evil.test')}`,
    );
    expect(res.status).toBe(302);
    expectOwnPath(res.headers.location, 'callback error');
    expect(res.headers.location).toMatch(/^\/signin\?error=/);
  });

  it('when a checkout or payout onboarding is asked for with other return addresses, then the provider is given our own pages only', async () => {
    const builderUser = await createUser(ctx.db);
    const builder = await signedIn(ctx.app, builderUser);
    const job = await createJob(ctx.db, builderUser.id);
    const { user: shopUser } = await createShop(ctx.db);
    const shop = await signedIn(ctx.app, shopUser);
    const bid = await shop.post(`/api/jobs/${job.id}/bids`, bidInput());
    expect((await builder.post(`/api/bids/${bid.body.bid.id}/accept`)).status).toBe(200);

    const evil = { success_url: 'https://evil.test/ok', cancel_url: '//evil.test', returnTo: 'https://evil.test', return_url: 'https://evil.test' };
    const checkout = await builder.agent
      .post(`/api/jobs/${job.id}/checkout?success_url=${encodeURIComponent('https://evil.test')}&returnTo=${encodeURIComponent('//evil.test')}`)
      .set('X-CSRF-Token', builder.token)
      .send(evil);
    expect(checkout.status).toBe(200);
    const [payment] = await ctx.db.select().from(payments).where(eq(payments.jobId, job.id));
    const session = await stripe.checkout.sessions.retrieve(payment.checkoutSessionId!);
    expect(session.success_url!.startsWith(`${ctx.config.appUrl}/jobs/${job.id}?`)).toBe(true);
    expect(session.cancel_url!.startsWith(`${ctx.config.appUrl}/jobs/${job.id}?`)).toBe(true);

    const { user: newShop } = await createShop(ctx.db, {}, {}, { payouts: false });
    const onboarding = await (await signedIn(ctx.app, newShop)).post('/api/shop-profile/payouts', evil);
    expect(onboarding.status).toBe(200);
    const done = await submitHostedPage(onboarding.body.url);
    expect(done.status).toBe(303);
    expect(done.headers.get('location')!.startsWith(`${ctx.config.appUrl}/shop/profile?`)).toBe(true);
  });

  it('when a mail with a link is caused from a request naming another host, then every link in it points at APP_URL, and names are escaped in the HTML', async () => {
    const evilHeaders = { Host: 'evil.test', 'X-Forwarded-Host': 'evil.test', 'X-Forwarded-Proto': 'https', Origin: 'https://evil.test', Referer: 'https://evil.test/x' };
    const withHeaders = (req: supertest.Test) => Object.entries(evilHeaders).reduce((r, [k, v]) => r.set(k, v), req);

    const resetUser = await createUser(ctx.db, { displayName: '<script>alert(1)</script> Reset' });
    const anon = await agentFor(ctx.app);
    const reset = await withHeaders(anon.agent.post('/api/auth/password-reset/request').set('X-CSRF-Token', anon.token)).send({ email: resetUser.email, returnTo: 'https://evil.test' });
    expect(reset.status).toBe(202);

    const unverified = await createUser(ctx.db, { emailVerifiedAt: null, displayName: '<img src=x onerror=alert(1)> Verify' });
    const u = await signedIn(ctx.app, unverified);
    expect((await withHeaders(u.agent.post('/api/auth/verify-email/resend').set('X-CSRF-Token', u.token)).send({ url: 'https://evil.test' })).status).toBe(202);

    const admin = await signedIn(ctx.app, await createUser(ctx.db, { role: 'admin' }));
    const inviteEmail = uniqueEmail('invited');
    const invite = await withHeaders(admin.agent.post('/api/admin/admins').set('X-CSRF-Token', admin.token)).send({ displayName: '"><svg onload=alert(1)>', email: inviteEmail });
    expect(invite.status).toBe(201);

    for (const address of [resetUser.email, unverified.email, inviteEmail]) {
      const mails = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, address));
      expect(mails.length, address).toBeGreaterThan(0);
      for (const mail of mails) {
        const links = [...`${mail.textBody}\n${mail.htmlBody}`.matchAll(/(?:https?:)?\/\/[^\s"'<>)]+/gi)].map((m) => m[0]);
        expect(links.length, mail.template).toBeGreaterThan(0);
        for (const link of links) expect(link.startsWith(`${ctx.config.appUrl}/`), `${mail.template}: ${link}`).toBe(true);
        expect(mail.htmlBody).not.toMatch(/<script>|<img src=x|<svg onload/);
      }
    }
    const [resetMail] = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, resetUser.email));
    expect(resetMail.htmlBody).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
  });
});

// ---------------------------------------------------------------------------

function cookieAttributes(setCookie: string[] | string | undefined, name: string) {
  const all = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const cookie = all.find((c) => c.startsWith(`${name}=`));
  if (!cookie) return undefined;
  const [, ...parts] = cookie.split(';').map((p) => p.trim());
  return Object.fromEntries(parts.map((p) => [p.split('=')[0].toLowerCase(), p.includes('=') ? p.slice(p.indexOf('=') + 1) : true])) as Record<string, string | true>;
}

function cspDirectives(header: string | undefined) {
  expect(header).toBeDefined();
  return Object.fromEntries(
    header!
      .split(';')
      .map((d) => d.trim())
      .filter(Boolean)
      .map((d) => {
        const [name, ...values] = d.split(/\s+/);
        return [name.toLowerCase(), values];
      }),
  ) as Record<string, string[]>;
}

function expectSecurityHeaders(res: supertest.Response, what: string) {
  const csp = cspDirectives(res.headers['content-security-policy']);
  const scriptSrc = csp['script-src'] ?? csp['default-src'];
  expect(scriptSrc, `${what}: script-src`).toContain("'self'");
  for (const loose of ["'unsafe-inline'", "'unsafe-eval'", "'unsafe-hashes'", '*', 'data:', 'http:', 'https:', 'blob:']) {
    expect(scriptSrc, `${what}: script-src allows ${loose}`).not.toContain(loose);
  }
  if (csp['script-src-attr']) expect(csp['script-src-attr'], `${what}: script-src-attr`).toEqual(["'none'"]);
  expect(csp['frame-ancestors'], `${what}: frame-ancestors`).toEqual(["'none'"]);
  expect(csp['object-src'], `${what}: object-src`).toEqual(["'none'"]);
  expect(csp['default-src'], `${what}: default-src`).toEqual(["'self'"]);
  expect(res.headers['x-content-type-options'], what).toBe('nosniff');
  expect(res.headers['referrer-policy'], what).toMatch(/^(no-referrer|same-origin|strict-origin|strict-origin-when-cross-origin)$/);
  expect(res.headers['x-frame-options'], what).toMatch(/^(DENY|SAMEORIGIN)$/);
  expect(res.headers['x-powered-by'], what).toBeUndefined();
}

describe('headers and the session cookie', () => {
  it('when an HTML page or an API answer is served, then helmet’s headers forbid inline script and framing', async () => {
    const clientDir = mkdtempSync(join(tmpdir(), 'tenthmark-safety-client-'));
    writeFileSync(join(clientDir, 'index.html'), '<!doctype html><html><head><title>Tenthmark</title><script type="module" src="/assets/app.js"></script></head><body><div id="root"></div></body></html>');
    const pool = createPool(ctx.config.databaseUrl, 2);
    const app = createApp({ config: ctx.config, db: createDb(pool), pool, logger: createLogger(ctx.config), client: { kind: 'static', dir: clientDir } });
    try {
      for (const path of ['/', '/jobs/not-a-job', '/signin?returnTo=%2Fboard']) {
        const page = await supertest(app).get(path);
        expect(page.status, path).toBe(200);
        expect(page.headers['content-type'], path).toMatch(/^text\/html/);
        expectSecurityHeaders(page, `page ${path}`);
      }
      const api = await supertest(app).get('/api/auth/csrf');
      expect(api.headers['content-type']).toMatch(/^application\/json/);
      expectSecurityHeaders(api, 'GET /api/auth/csrf');
      const missing = await supertest(app).get('/api/no-such-route');
      expect(missing.status).toBe(404);
      expectSecurityHeaders(missing, 'an API 404');
      const malformed = await supertest(app).post('/api/calculations/displacement').set('Content-Type', 'application/json').send('{"bore":');
      expect(malformed.status).toBe(400);
      expectSecurityHeaders(malformed, 'an API 400');
    } finally {
      app.sessionStore.close();
      await pool.end();
      rmSync(clientDir, { recursive: true, force: true });
    }
  });

  it('when a session starts over http, then its cookie is HttpOnly, SameSite=Lax, Path=/ and not Secure', async () => {
    const anon = await supertest(ctx.app).get('/api/auth/csrf');
    const anonCookie = cookieAttributes(anon.headers['set-cookie'], SESSION_COOKIE);
    expect(anonCookie).toMatchObject({ httponly: true, samesite: 'Lax', path: '/' });
    expect(anonCookie).not.toHaveProperty('secure');

    const user = await createUser(ctx.db);
    const client = await agentFor(ctx.app);
    const login = await client.agent.post('/api/auth/login').set('X-CSRF-Token', client.token).send({ email: user.email, password: TEST_PASSWORD });
    expect(login.status).toBe(200);
    const cookie = cookieAttributes(login.headers['set-cookie'], SESSION_COOKIE);
    expect(cookie).toMatchObject({ httponly: true, samesite: 'Lax', path: '/' });
    expect(cookie).not.toHaveProperty('secure');
    expect(cookie?.['max-age'] ?? cookie?.expires).toBeDefined();
  });

  it('when APP_URL is https, then the session cookie is Secure, and never set over plain http', async () => {
    const config = testConfig(ctx.config.databaseUrl, { APP_URL: 'https://tenthmark.example' });
    const pool = createPool(config.databaseUrl, 2);
    const app = createApp({ config, db: createDb(pool), pool, logger: createLogger(config) });
    try {
      const plain = await supertest(app).get('/api/auth/csrf');
      expect(cookieAttributes(plain.headers['set-cookie'], SESSION_COOKIE)).toBeUndefined();

      // Behind the TLS-terminating proxy (trusted on loopback), which says the browser used https.
      const csrf = await supertest(app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https');
      const anon = cookieAttributes(csrf.headers['set-cookie'], SESSION_COOKIE);
      expect(anon).toMatchObject({ httponly: true, samesite: 'Lax', path: '/', secure: true });

      const user = await createUser(ctx.db);
      const sid = csrf.headers['set-cookie']![0].split(';')[0];
      const login = await supertest(app)
        .post('/api/auth/login')
        .set('X-Forwarded-Proto', 'https')
        .set('Cookie', sid)
        .set('X-CSRF-Token', csrf.body.csrfToken)
        .send({ email: user.email, password: TEST_PASSWORD });
      expect(login.status).toBe(200);
      expect(cookieAttributes(login.headers['set-cookie'], SESSION_COOKIE)).toMatchObject({ httponly: true, samesite: 'Lax', path: '/', secure: true });
    } finally {
      app.sessionStore.close();
      await pool.end();
    }
  });
});

// ---------------------------------------------------------------------------

describe('request bodies of any shape', () => {
  const deepObject = (depth: number) => '{"a":'.repeat(depth) + '1' + '}'.repeat(depth);
  const sendJson = (client: Awaited<ReturnType<typeof signedIn>>, method: 'post' | 'put', path: string, text: string) =>
    client.agent[method](path).set('X-CSRF-Token', client.token).set('Content-Type', 'application/json').send(text);

  it('when a JSON body nests deeper than 64 levels, then 400 with the error shape, on the inspection draft and on an ordinary route', async () => {
    const { user: shopUser } = await createShop(ctx.db);
    const shop = await signedIn(ctx.app, shopUser);
    const builder = await signedIn(ctx.app, await createUser(ctx.db));
    const job = await createJob(ctx.db, (await createUser(ctx.db)).id);
    const withNotes = (notes: string) => JSON.stringify(jobInput()).replace(/}$/, `,"notes":${notes}}`);
    for (const [client, method, path, text] of [
      [shop, 'put', `/api/jobs/${job.id}/inspection/draft`, `{"draft":${deepObject(5_000)}}`],
      [builder, 'post', '/api/jobs', withNotes(deepObject(5_000))],
      [builder, 'post', '/api/jobs', `{"title":${'['.repeat(65)}${']'.repeat(65)}}`],
    ] as const) {
      const res = await sendJson(client, method, path, text);
      expect(res.status, path).toBe(400);
      expect(res.body).toEqual({ error: { code: 'too_deep', message: expect.any(String) } });
    }
    // Text in another UTF charset is checked once parsed.
    const utf16 = await builder.agent
      .post('/api/jobs')
      .set('X-CSRF-Token', builder.token)
      .set('Content-Type', 'application/json; charset=utf-16le')
      // Sent as bytes, not serialised again as JSON.
      .serialize((bytes: Buffer) => bytes as unknown as string)
      .send(Buffer.from(withNotes(deepObject(5_000)), 'utf16le'));
    expect(utf16.status).toBe(400);
    expect(utf16.body).toEqual({ error: { code: 'too_deep', message: expect.any(String) } });
    // 64 levels in all (the body is the first) is still read; the schema then says what is wrong.
    const justInside = await sendJson(builder, 'post', '/api/jobs', withNotes(deepObject(63)));
    expect(justInside.status).toBe(400);
    expect(justInside.body.error.code).toBe('invalid_input');
  });

  it('when a deep body comes in UTF-16 or a charset the scan cannot read, then it is refused before JSON.parse sees it (parsing millions of brackets costs seconds)', async () => {
    const builder = await signedIn(ctx.app, await createUser(ctx.db));
    const deep = deepObject(5_000);
    const parsed: number[] = [];
    const realParse = JSON.parse;
    const spy = vi.spyOn(JSON, 'parse').mockImplementation((text: string, reviver?: Parameters<typeof JSON.parse>[1]) => {
      if (typeof text === 'string' && text.includes('{"a":{"a":{"a":{"a":')) parsed.push(text.length);
      return realParse(text, reviver);
    });
    try {
      for (const [charset, bytes] of [
        ['utf-16le', Buffer.from(deep, 'utf16le')],
        ['utf-16be', Buffer.from(deep, 'utf16le').swap16()],
      ] as const) {
        const res = await builder.agent
          .post('/api/jobs')
          .set('X-CSRF-Token', builder.token)
          .set('Content-Type', `application/json; charset=${charset}`)
          .serialize((body: Buffer) => body as unknown as string)
          .send(bytes);
        expect(res.status, charset).toBe(400);
        expect(res.body).toEqual({ error: { code: 'too_deep', message: expect.any(String) } });
      }
      expect(parsed).toEqual([]);
      // UTF-32 cannot be scanned, so it is not taken (JSON between systems is UTF-8 anyway; UTF-16 stays for old clients).
      const utf32 = await builder.agent
        .post('/api/jobs')
        .set('X-CSRF-Token', builder.token)
        .set('Content-Type', 'application/json; charset=utf-32')
        .serialize((body: Buffer) => body as unknown as string)
        .send(Buffer.from('{"a":1}', 'utf8'));
      expect(utf32.status).toBe(415);
      expect(utf32.body.error.code).toBe('unsupported_charset');
    } finally {
      spy.mockRestore();
    }
  });

  it('when a JSON body is just over its route’s size limit, then 413 with the error shape', async () => {
    const builder = await signedIn(ctx.app, await createUser(ctx.db));
    const { user: shopUser } = await createShop(ctx.db);
    const shop = await signedIn(ctx.app, shopUser);
    const job = await createJob(ctx.db, (await createUser(ctx.db)).id);
    const padded = (bytes: number) => {
      const text = JSON.stringify({ ...jobInput(), notes: '' });
      return text.replace('"notes":""', `"notes":"${'x'.repeat(bytes - text.length)}"`);
    };
    expect(Buffer.byteLength(padded(200 * 1024))).toBe(200 * 1024);
    const small = await sendJson(builder, 'post', '/api/jobs', padded(200 * 1024 + 1));
    expect(small.status).toBe(413);
    expect(small.body).toEqual({ error: { code: 'too_large', message: expect.any(String) } });
    const draft = await sendJson(shop, 'put', `/api/jobs/${job.id}/inspection/draft`, padded(8 * 1024 * 1024 + 1));
    expect(draft.status).toBe(413);
    expect(draft.body).toEqual({ error: { code: 'too_large', message: expect.any(String) } });
  });
});

describe('rate limits', () => {
  interface Limiter {
    name: string;
    limit: number;
    /** The most seconds Retry-After may say: the limiter's window. */
    windowSeconds: number;
    /** Returns a function that makes one request counted by the limiter. */
    setup: () => Promise<() => Promise<supertest.Response>>;
  }

  const limiters: Limiter[] = [
    {
      name: 'sign-in (failed attempts per account)',
      limit: LIMIT,
      windowSeconds: 15 * 60,
      setup: async () => {
        const user = await createUser(ctx.db);
        const client = await agentFor(ctx.app);
        return () => client.post('/api/auth/login', { email: user.email, password: 'not the password' });
      },
    },
    {
      name: 'sign-up (per address)',
      limit: LIMIT,
      windowSeconds: 60 * 60,
      setup: async () => async () => {
        const client = await agentFor(ctx.app);
        return client.post('/api/auth/signup', { displayName: 'Rate Limited', email: uniqueEmail('signup'), password: 'long enough password', role: 'builder', acceptTerms: true });
      },
    },
    {
      name: 'password-reset request (per account)',
      limit: 5,
      windowSeconds: 60 * 60,
      setup: async () => {
        const user = await createUser(ctx.db);
        const client = await agentFor(ctx.app);
        return () => client.post('/api/auth/password-reset/request', { email: user.email });
      },
    },
    {
      name: 'messages (per person)',
      limit: LIMIT,
      windowSeconds: 10,
      setup: async () => {
        const builder = await createUser(ctx.db);
        const job = await createJob(ctx.db, builder.id);
        const { user: shopUser } = await createShop(ctx.db);
        const shop = await signedIn(ctx.app, shopUser);
        const thread = await shop.post(`/api/jobs/${job.id}/threads`, {});
        let n = 0;
        return () => shop.post(`/api/threads/${thread.body.thread.id}/messages`, { clientId: `limit-${tag()}-${(n += 1)}`, body: `Message ${n}` });
      },
    },
    {
      name: 'photo uploads (per person, across jobs, conversations and milestones)',
      limit: LIMIT,
      windowSeconds: 10 * 60,
      setup: async () => {
        const builder = await createUser(ctx.db);
        const client = await signedIn(ctx.app, builder);
        const photo = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#567' } }).png().toBuffer();
        let n = 0;
        // Each upload goes to a new job of the same person: the limit is the person's, not the job's.
        return async () => {
          const job = await createJob(ctx.db, builder.id, { status: 'draft' });
          return client.agent.post(`/api/jobs/${job.id}/photos`).set('X-CSRF-Token', client.token).attach('photos', photo, `limit-${(n += 1)}.png`);
        };
      },
    },
    {
      name: 'calculations (per address)',
      limit: LIMIT,
      windowSeconds: 60,
      setup: async () => () => supertest(ctx.app).post('/api/calculations/ring-gap').send({ unit: 'in', bore: 4, application: 'street' }),
    },
  ];

  it.each(limiters)('when $name goes past its limit, then 429 with the error shape and a Retry-After', async ({ limit, windowSeconds, setup }) => {
    const hit = await setup();
    for (let i = 0; i < limit; i += 1) {
      const res = await hit();
      expect(res.status, `request ${i + 1} of ${limit}`).not.toBe(429);
      expect(res.status).toBeLessThan(500);
    }
    const blocked = await hit();
    expect(blocked.status).toBe(429);
    expect(blocked.headers['content-type']).toMatch(/^application\/json/);
    expect(blocked.body).toEqual({ error: { code: 'too_many_attempts', message: expect.any(String) } });
    expect(blocked.body.error.message.length).toBeGreaterThan(10);
    const retryAfter = blocked.headers['retry-after'];
    expect(retryAfter, 'Retry-After').toMatch(/^\d+$/);
    expect(Number(retryAfter)).toBeGreaterThan(0);
    expect(Number(retryAfter)).toBeLessThanOrEqual(windowSeconds);
  });
});
