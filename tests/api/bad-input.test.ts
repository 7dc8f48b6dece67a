/**
 * Bad input never breaks the server. Every route the Express router has
 * (read with listRoutes, so a new route is covered the day it is added) gets
 * arbitrary and malformed input from fast-check: random JSON, bodies shaped
 * like the route's own schema with one value made wrong, malformed JSON text,
 * odd content types and charsets, random query strings, path parameters that
 * are not ids, ids of nothing or path tricks, and random files on the upload
 * routes. The caller is signed in with a role the route allows (its `access`
 * in server/openapi.ts), and about half the time the path parameters point to
 * real rows of a small fixture, so the input reaches the services.
 *
 * Property: never a 5xx; every 4xx is JSON shaped { error: { code, message } };
 * Object.prototype is never polluted.
 *
 * The seed is fixed (BAD_INPUT_SEED to change it, BAD_INPUT_RUNS for more
 * runs per route); fast-check prints the seed, path and counterexample when a
 * property fails, and the error names the request and the answer.
 */
import { eq } from 'drizzle-orm';
import fc from 'fast-check';
import { tmpdir } from 'node:os';
import { crc32 } from 'node:zlib';
import sharp from 'sharp';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { createDb, createPool } from '../../server/db/client';
import { shops } from '../../server/db/schema';
import { loadConfig } from '../../server/env';
import { createLogger } from '../../server/lib/logger';
import { listRoutes, type ListedRoute } from '../../server/lib/routes-list';
import { apiRoutes } from '../../server/api-routes';
import { rolesOf, type Access } from '../../server/lib/http/routes';
import { openApiDocument } from '../../server/openapi';
import { createUser, inDays, jobInput, TEST_PASSWORD } from '../factories';
import { apiOf, jobInState } from '../setup/job-states';
import { startMoneyApp } from '../setup/money-app';
import { agentFor, signedIn } from '../setup/test-env';

const SEED = Number(process.env.BAD_INPUT_SEED ?? 20_260_517);
const RUNS = Number(process.env.BAD_INPUT_RUNS ?? 18);
const MAX_QUERY = 8_000;

type Role = 'anonymous' | 'builder' | 'shop' | 'admin';
interface Caller {
  cookie?: string;
  token?: string;
}
type Money = Awaited<ReturnType<typeof startMoneyApp>>;

let money: Money;
let base: string;
const callers = {} as Record<Exclude<Role, 'anonymous'>, Caller>;
/** Real ids for each path parameter name. */
const realIds: Record<string, string[]> = {};
let tinyPng: Buffer;
let tinyJpeg: Buffer;
let bombPng: Buffer;
const statsByRoute = new Map<string, Record<string, number>>();
const pristinePrototype = Object.getOwnPropertyNames(Object.prototype).sort().join();

beforeAll(async () => {
  // Limits high enough that the fuzzing reaches validation instead of stopping at 429 (rate limits have their own tests).
  money = await startMoneyApp({
    RATE_LIMIT_SIGNIN_MAX: '100000',
    RATE_LIMIT_SIGNUP_MAX: '100000',
    RATE_LIMIT_CALCULATIONS_PER_MINUTE: '100000',
    RATE_LIMIT_MESSAGES_PER_10S: '100000',
    RATE_LIMIT_UPLOADS_PER_10_MIN: '100000',
  });
  base = money.server.url;
  const image = (format: 'png' | 'jpeg') => sharp({ create: { width: 8, height: 6, channels: 3, background: '#a53' } })[format]().toBuffer();
  [tinyPng, tinyJpeg] = await Promise.all([image('png'), image('jpeg')]);
  bombPng = Buffer.from(await sharp({ create: { width: 1, height: 1, channels: 3, background: '#888' } }).png().toBuffer());
  bombPng.writeUInt32BE(60_000, 16);
  bombPng.writeUInt32BE(60_000, 20);
  bombPng.writeUInt32BE(crc32(bombPng.subarray(12, 29)), 29);

  // A funded job in work (the shop logged the block's arrival), plus a draft, an open and an awarded job of the same builder.
  const funded = await money.jobIn('inWork');
  const { builderUser, shopUser, builder, shop } = funded;
  const admin = await createUser(money.db, { role: 'admin' });
  const victim = await createUser(money.db, { role: 'builder' });
  callers.builder = await signIn(builderUser.email);
  callers.shop = await signIn(shopUser.email);
  callers.admin = await signIn(admin.email);

  const [shopRow] = await money.db.select().from(shops).where(eq(shops.userId, shopUser.id));
  const people = { builder: apiOf(builder), shop: apiOf(shop) };
  const { job: draft } = await jobInState('draft', people);
  const { job: open, bid: openBid } = await jobInState('bid', people);
  const { job: awarded, bid: awardedBid } = await jobInState('awarded', people);
  const thread = await builder.post(`/api/jobs/${funded.job.id}/threads`, { shopId: shopRow.id });
  expect(thread.status).toBe(201);
  const threadId: string = thread.body.thread.id;
  const message = await builder.post(`/api/threads/${threadId}/messages`, { clientId: 'fixture-message-1', body: 'Block is on its way.' });
  expect(message.status).toBe(201);
  const order = await shop.post(`/api/jobs/${funded.job.id}/change-orders`, { description: 'Extra deck pass', amountCents: 4_000 });
  expect(order.status).toBe(201);
  const upload = (agent: typeof builder, path: string) => agent.agent.post(path).set('X-CSRF-Token', agent.token).attach('photos', tinyPng, 'fixture.png');
  const jobPhoto = await upload(builder, `/api/jobs/${draft.id}/photos`);
  const threadPhoto = await upload(builder, `/api/threads/${threadId}/photos`);
  const milestonePhoto = await upload(shop, `/api/jobs/${funded.job.id}/milestone-photos`);
  for (const res of [jobPhoto, threadPhoto, milestonePhoto]) expect(res.status).toBe(201);
  const jobMoney = await builder.get(`/api/jobs/${funded.job.id}/money`);

  Object.assign(realIds, {
    jobId: [funded.job.id, draft.id, open.id, awarded.id],
    bidId: [openBid!.id, awardedBid!.id],
    shopId: [shopRow.id],
    threadId: [threadId],
    photoId: [jobPhoto.body.photos[0].id, threadPhoto.body.photos[0].id, milestonePhoto.body.photos[0].id],
    changeOrderId: [order.body.changeOrder.id],
    paymentId: jobMoney.body.payments.map((p: { id: string }) => p.id),
    userId: [victim.id],
    messageId: [message.body.message.id],
    disputeId: [], // no dispute in the fixture: random ids only
    notificationId: [], // someone else's or none: random ids only
    size: ['thumb', 'large'],
    version: ['1', '2'],
  });
}, 180_000);

afterAll(async () => {
  if (process.env.BAD_INPUT_STATS) {
    for (const [route, counts] of statsByRoute) console.log(route.padEnd(60), JSON.stringify(counts));
  }
  await money?.close();
});

/** A signed-in session: its cookie and CSRF token, sent by hand so no answer can change them. */
async function signIn(email: string): Promise<Caller> {
  const client = await signedIn(base, { email, password: TEST_PASSWORD });
  return { cookie: client.cookie, token: client.token };
}

/** A signed-out session with a CSRF token of its own. */
async function anonymous(): Promise<Caller> {
  const client = await agentFor(base);
  return { cookie: client.cookie, token: client.token };
}

// ---------------------------------------------------------------------------
// Arbitraries

/** Strings that have broken servers before. */
const nastyStrings = [
  '',
  ' ',
  '\u0000',
  'nul\u0000inside',
  '\uD800',
  'low \uDFFF first',
  '\uDBFF\uDFFF',
  '\uFFFE\uFFFF',
  '\u202Egnp.exe',
  'e\u0301\u0301\u0301',
  '😀'.repeat(30),
  "'; DROP TABLE jobs; --",
  "' OR '1'='1",
  '%',
  '_',
  '\\',
  '%00',
  '%zz',
  '../../../../etc/passwd',
  '..\\..\\windows\\win.ini',
  '<script>alert(1)</script>',
  '{{7*7}}${7*7}',
  'NaN',
  'Infinity',
  '-0',
  '1e309',
  '0x10',
  'null',
  'undefined',
  'true',
  '[]',
  '{}',
  '__proto__',
  'constructor',
  '\r\nSet-Cookie: x=1',
  '2027-02-30',
  '9999-12-31',
  '0000-00-00',
];
const protoKeys = ['__proto__', 'constructor', 'prototype', 'toString', 'valueOf', 'hasOwnProperty', 'isAdmin', 'role', ''];

const nastyString = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom(...nastyStrings) },
  { weight: 3, arbitrary: fc.string({ unit: 'binary', maxLength: 40 }) },
  { weight: 1, arbitrary: fc.integer({ min: 2_000, max: 260_000 }).map((n) => 'x'.repeat(n)) },
);
const nastyNumber = fc.oneof(
  fc.constantFrom(-0, 2 ** 53 + 2, -(2 ** 63), 2 ** 64, 1e308, -1e308, 5e-324, 0.1 + 0.2, 2 ** 31, -(2 ** 31) - 1, 1.5, -1),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer(),
);
/** A marker replaced by deeply nested arrays after JSON.stringify (which could not make them itself). */
const DEEP = (depth: number) => `__deep_nesting_${depth}__`;
const deepText = (depth: number) => '['.repeat(depth) + ']'.repeat(depth);
const deepObject = (depth: number) => '{"a":'.repeat(depth) + '1' + '}'.repeat(depth);
const withDeepNesting = (text: string) => text.replace(/"__deep_nesting_(\d+)__"/g, (_m, depth: string) => deepText(Number(depth)));

const protoObject = fc.constantFrom(...protoKeys).map((key) => {
  const polluting = JSON.parse('{"polluted":"yes","isAdmin":true,"role":"admin","prototype":{"polluted":"yes"}}');
  return JSON.parse(`{${JSON.stringify(key)}: ${JSON.stringify(polluting)}}`) as unknown;
});

const nastyValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: nastyString },
  { weight: 3, arbitrary: nastyNumber },
  { weight: 1, arbitrary: fc.constantFrom(true, false, null) },
  { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
  { weight: 1, arbitrary: fc.array(nastyString, { maxLength: 4 }) },
  { weight: 1, arbitrary: protoObject },
  { weight: 1, arbitrary: fc.integer({ min: 200, max: 90_000 }).map(DEEP) },
);

interface JsonSchema {
  type?: string | string[];
  enum?: unknown[];
  const?: unknown;
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  minItems?: number;
  maxItems?: number;
  minLength?: number;
  maxLength?: number;
  pattern?: string;
  format?: string;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  oneOf?: JsonSchema[];
  anyOf?: JsonSchema[];
  allOf?: JsonSchema[];
}

const anyRealId = () => Object.entries(realIds).flatMap(([name, ids]) => (['size', 'version'].includes(name) ? [] : ids));

/** Values that fit the route's own schema (often, not always): the starting point for one wrong value. */
function plausible(schema: JsonSchema | undefined, depth = 0): fc.Arbitrary<unknown> {
  if (!schema || depth > 8) return fc.jsonValue({ maxDepth: 2 });
  const choices = schema.oneOf ?? schema.anyOf;
  if (choices) return fc.oneof(...choices.map((choice) => plausible(choice, depth + 1)));
  if (schema.allOf) return plausible(Object.assign({}, ...schema.allOf) as JsonSchema, depth + 1);
  if (schema.const !== undefined) return fc.constant(schema.const);
  if (schema.enum) return fc.constantFrom(...schema.enum);
  const type = Array.isArray(schema.type) ? schema.type.find((t) => t !== 'null') : schema.type;
  switch (type) {
    case 'string': {
      if (schema.format === 'uuid') return fc.oneof(fc.constantFrom(...anyRealId()), fc.uuid());
      if (schema.format === 'date') return fc.integer({ min: -20, max: 400 }).map(inDays);
      if (schema.format === 'date-time') return fc.date({ noInvalidDate: true }).map((d) => d.toISOString());
      if (schema.format === 'email') return fc.emailAddress();
      if (schema.pattern) return fc.stringMatching(new RegExp(schema.pattern));
      const minLength = schema.minLength ?? 0;
      const maxLength = Math.min(schema.maxLength ?? minLength + 30, minLength + 30);
      // Often a string the schema takes, carrying characters that storage or rendering may choke on.
      const fitting = fc
        .tuple(fc.constantFrom(...nastyStrings.filter(Boolean)), fc.string({ maxLength: 10 }))
        .map(([nasty, rest]) => `${nasty}${rest}`.padEnd(minLength, '.').slice(0, Math.max(minLength, schema.maxLength ?? Infinity)));
      return fc.oneof(fc.string({ minLength, maxLength }), fitting);
    }
    case 'integer': {
      const min = schema.minimum ?? (schema.exclusiveMinimum !== undefined ? Math.floor(schema.exclusiveMinimum) + 1 : -1_000);
      const max = schema.maximum ?? (schema.exclusiveMaximum !== undefined ? Math.ceil(schema.exclusiveMaximum) - 1 : min + 10_000);
      return fc.integer({ min: Math.max(min, -(2 ** 31)), max: Math.min(max, 2 ** 31 - 1) });
    }
    case 'number': {
      const min = schema.minimum ?? schema.exclusiveMinimum ?? -1_000;
      const max = schema.maximum ?? schema.exclusiveMaximum ?? min + 10_000;
      return fc.double({ min, max, minExcluded: schema.exclusiveMinimum !== undefined, maxExcluded: schema.exclusiveMaximum !== undefined, noNaN: true });
    }
    case 'boolean':
      return fc.boolean();
    case 'array': {
      const minLength = schema.minItems ?? 0;
      return fc.array(plausible(schema.items, depth + 1), { minLength, maxLength: Math.min(schema.maxItems ?? minLength + 3, minLength + 3) });
    }
    case 'object': {
      if (!schema.properties) return fc.dictionary(fc.string({ maxLength: 8 }), fc.oneof(fc.jsonValue({ maxDepth: 2 }), nastyValue), { maxKeys: 4 });
      const model = Object.fromEntries(Object.entries(schema.properties).map(([key, value]) => [key, plausible(value, depth + 1)]));
      return fc.record(model, { requiredKeys: (schema.required ?? []).filter((key) => key in model) });
    }
    default:
      return fc.jsonValue({ maxDepth: 2 });
  }
}

type Path = Array<string | number>;
function containers(value: unknown, path: Path = [], out: Path[] = []): Path[] {
  out.push(path);
  if (Array.isArray(value)) value.forEach((item, i) => containers(item, [...path, i], out));
  else if (value && typeof value === 'object') for (const [key, item] of Object.entries(value)) containers(item, [...path, key], out);
  return out;
}

/** One value in a plausible body made wrong: replaced, removed, or a dangerous key added beside it. */
function mutate(value: unknown, evil: unknown, pick: number, how: 'replace' | 'remove' | 'add-key', key: string): unknown {
  const copy = structuredClone(value);
  const paths = containers(copy);
  const path = paths[pick % paths.length];
  if (path.length === 0) {
    if (how !== 'add-key' || !copy || typeof copy !== 'object') return evil;
    Object.defineProperty(copy, key, { value: evil, enumerable: true, configurable: true, writable: true });
    return copy;
  }
  const parent = path.slice(0, -1).reduce<any>((node, step) => node[step], copy);
  const last = path[path.length - 1];
  if (how === 'replace') parent[last] = evil;
  else if (how === 'remove' && Array.isArray(parent)) parent.splice(Number(last), 1);
  else if (how === 'remove') delete parent[last];
  else Object.defineProperty(parent, key, { value: evil, enumerable: true, configurable: true, writable: true });
  return copy;
}

type Body =
  | { kind: 'none' }
  | { kind: 'raw'; contentType: string; data: string | Buffer; encoding?: string }
  | { kind: 'multipart'; files: Array<{ field: string; data: Buffer; filename: string; contentType: string }>; fields: Array<[string, string]> };

const json = (text: string): Body => ({ kind: 'raw', contentType: 'application/json', data: text });

const malformedJson: fc.Arbitrary<Body> = fc
  .oneof(
    fc.constantFrom(
      '{',
      '}',
      '{"a":}',
      '{"a":1,}',
      "{'a':1}",
      '[1,2',
      'NaN',
      '{"n":NaN}',
      '{"n":Infinity}',
      '{"n":-Infinity}',
      '{"n":1e309}',
      '{"n":-1e309}',
      '{"n":1e-400}',
      '{"n":0x10}',
      '{"n":01}',
      '{"n":.5}',
      'undefined',
      'null',
      'true',
      '0',
      '""',
      '"\\ud800"',
      '{"a":"\\u0000"}',
      '{"a":"\\ud800"}',
      '{"a":"\\udfff\\ud800"}',
      '{"__proto__":{"isAdmin":true,"role":"admin","polluted":"yes"}}',
      '{"constructor":{"prototype":{"polluted":"yes"}}}',
      '{"a":1,"a":2}',
      '\uFEFF{}',
      '{"a":"\\x41"}',
      '{"a":"\t"}',
      '{"a":1}garbage',
      ' ',
      '',
    ),
    fc.string({ unit: 'binary', maxLength: 200 }),
    fc
      .jsonValue({ maxDepth: 3 })
      .map((v) => JSON.stringify(v))
      .chain((text) => fc.nat(Math.max(0, text.length - 1)).map((cut) => text.slice(0, cut))),
    fc.integer({ min: 1_000, max: 90_000 }).map(deepText),
    fc.integer({ min: 1_000, max: 30_000 }).map((depth) => '{"a":'.repeat(depth) + '1' + '}'.repeat(depth)),
  )
  .map(json);

const oddlyTyped: fc.Arbitrary<Body> = fc.record({
  contentType: fc.constantFrom(
    'text/plain',
    'application/x-www-form-urlencoded',
    'application/xml',
    'application/json; charset=utf-16',
    'application/json; charset=latin1',
    'application/json; charset=no-such-charset',
    'application/vnd.api+json',
    'application/json, text/html',
    'multipart/form-data',
    'multipart/form-data; boundary=----nothing-here',
    '',
  ),
  data: fc.oneof(
    fc.constantFrom('{"a":1}', 'a=1&a=2&__proto__[polluted]=yes', '<a>1</a>'),
    fc.uint8Array({ maxLength: 300 }).map((bytes) => Buffer.from(bytes)),
  ),
  encoding: fc.option(fc.constantFrom('gzip', 'deflate', 'br', 'compress', 'identity', 'x-nonsense'), { nil: undefined, freq: 3 }),
}).map((r): Body => ({ kind: 'raw', ...r }));

/** Invalid UTF-8 inside a JSON string, sent as bytes. */
const badUtf8: fc.Arbitrary<Body> = fc.uint8Array({ minLength: 1, maxLength: 16 }).map((bytes) => ({
  kind: 'raw',
  contentType: 'application/json',
  data: Buffer.concat([Buffer.from('{"title":"'), Buffer.from([0xc3, 0x28, 0xff, 0xfe, 0xed, 0xa0, 0x80, ...bytes.filter((b) => b !== 0x22 && b !== 0x5c)]), Buffer.from('"}')]),
}));

function bodies(schema: JsonSchema | undefined, upload: boolean): fc.Arbitrary<Body> {
  const guided = fc
    .tuple(plausible(schema), nastyValue, fc.nat(), fc.constantFrom('replace', 'replace', 'replace', 'remove', 'add-key'), fc.constantFrom(...protoKeys))
    .map(([value, evil, pick, how, key]) => json(withDeepNesting(JSON.stringify(mutate(value, evil, pick, how as 'replace', key)) ?? 'null')));
  const asIs = plausible(schema).map((value) => json(withDeepNesting(JSON.stringify(value) ?? 'null')));
  const anyJson = nastyValue.map((value) => json(withDeepNesting(JSON.stringify(value) ?? 'null')));
  const options: Array<fc.WeightedArbitrary<Body>> = [
    { weight: 1, arbitrary: fc.constant<Body>({ kind: 'none' }) },
    { weight: schema ? 5 : 1, arbitrary: guided },
    { weight: schema ? 3 : 0, arbitrary: asIs },
    { weight: 2, arbitrary: anyJson },
    { weight: 2, arbitrary: malformedJson },
    { weight: 1, arbitrary: oddlyTyped },
    { weight: 1, arbitrary: badUtf8 },
  ];
  if (upload) options.push({ weight: 10, arbitrary: multipart() }, { weight: 1, arbitrary: brokenMultipart });
  return fc.oneof(...options.filter((o) => o.weight > 0));
}

function multipart(): fc.Arbitrary<Body> {
  const content = fc.oneof(
    fc.uint8Array({ maxLength: 2_048 }).map((bytes) => Buffer.from(bytes)),
    fc.constant(Buffer.alloc(0)),
    fc.constant(null).map(() => tinyPng),
    fc.constant(null).map(() => tinyJpeg),
    fc.constant(null).map(() => bombPng),
    fc.nat(60).map((cut) => tinyPng.subarray(0, cut + 8)),
    fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })).map(([at, byte]) => {
      const copy = Buffer.from(tinyJpeg);
      copy[at % copy.length] = byte;
      return copy;
    }),
    fc.constantFrom(
      Buffer.from('%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF'),
      Buffer.from('GIF89a\x01\x00\x01\x00\x00\x00\x00;'),
      Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"><script>alert(1)</script></svg>'),
      Buffer.from('<!doctype html><script>alert(1)</script>'),
      Buffer.from('MZ\x90\x00\x03\x00\x00\x00'),
      Buffer.from('PK\x03\x04 not really a zip'),
    ),
  );
  const file = fc.record({
    field: fc.oneof({ weight: 6, arbitrary: fc.constant('photos') }, { weight: 1, arbitrary: fc.constantFrom('photo', 'photos[]', 'file', '__proto__', 'PHOTOS') }),
    data: content,
    filename: fc.constantFrom('photo.png', 'block.jpg', '../../etc/passwd', '..\\..\\win.ini', 'a.exe', 'x'.repeat(300) + '.png', 'gnp\u202E.exe', 'no-extension', '.png', 'photo.png\u0000.exe'),
    contentType: fc.constantFrom('image/png', 'image/jpeg', 'image/webp', 'application/octet-stream', 'text/html', 'image/svg+xml', 'application/x-msdownload'),
  });
  return fc
    .record({ files: fc.array(file, { maxLength: 6 }), fields: fc.array(fc.tuple(fc.constantFrom('caption', 'photos', '__proto__', 'a'), nastyString.filter((s) => s.length < 5_000)), { maxLength: 7 }) })
    .map((r): Body => ({ kind: 'multipart', ...r }));
}

const brokenMultipart: fc.Arbitrary<Body> = fc
  .tuple(
    fc.constantFrom('multipart/form-data; boundary=XyZ', 'multipart/form-data', 'multipart/form-data; boundary=', 'multipart/mixed; boundary=XyZ'),
    fc.oneof(
      fc.constantFrom(
        '--XyZ\r\nContent-Disposition: form-data; name="photos"; filename="a.png"\r\n\r\n\x89PNG',
        '--XyZ\r\nContent-Disposition: form-data\r\n\r\nno name\r\n--XyZ--',
        '--XyZ\r\nno header end',
        'not multipart at all',
        '',
      ),
      fc.string({ unit: 'binary', maxLength: 300 }),
    ),
  )
  .map(([contentType, data]): Body => ({ kind: 'raw', contentType, data: Buffer.from(data, 'binary') }));

/** A URL part as it would travel: encoded, even when the string is not well-formed Unicode. */
const encode = (value: string) => {
  try {
    return encodeURIComponent(value);
  } catch {
    return [...Buffer.from(value, 'utf8')].map((b) => `%${b.toString(16).padStart(2, '0')}`).join('');
  }
};

/** Path parameters already as they go into the URL. */
function paramValue(name: string): fc.Arbitrary<string> {
  const real = realIds[name] ?? [];
  const sample = real[0] ?? '6f1c2f6e-3c1d-4c5e-9a7b-2b8f0c1d2e3f';
  const tricks = fc.constantFrom(
    '00000000-0000-0000-0000-000000000000',
    'ffffffff-ffff-ffff-ffff-ffffffffffff',
    sample.toUpperCase(),
    `%7B${sample}%7D`,
    `${sample}x`,
    sample.replace(/-/g, ''),
    `%20${sample}`,
    `${sample}%00`,
    '..%2f..%2f..%2fetc%2fpasswd',
    '..%2F',
    '%2e%2e',
    '%2e%2e%2f%2e%2e%2f',
    '..%5c..%5c',
    '%252e%252e%252f',
    '%00',
    '%zz',
    '%',
    '%E0%A4%A',
    '%ED%A0%80',
    'null',
    'undefined',
    '-1',
    '0',
    '1e309',
    'NaN',
    "1'%20OR%20'1'%3D'1",
    '%27%3B%20DROP%20TABLE%20jobs%3B%20--',
    'a'.repeat(1_500),
  );
  return fc.oneof(
    { weight: real.length ? 6 : 0, arbitrary: real.length ? fc.constantFrom(...real) : fc.constant(sample) },
    { weight: 1, arbitrary: fc.uuid() },
    { weight: 2, arbitrary: tricks },
    { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 60 }).map(encode) },
  );
}

interface QueryParamDoc {
  name: string;
  schema?: JsonSchema;
}

/** A query string, already encoded (or deliberately not quite). */
function queryStrings(documented: QueryParamDoc[]): fc.Arbitrary<string> {
  const key = fc.oneof(
    { weight: documented.length ? 4 : 0, arbitrary: documented.length ? fc.constantFrom(...documented.map((p) => p.name)) : fc.constant('q') },
    { weight: 1, arbitrary: fc.constantFrom(...protoKeys, 'page[]', 'q[a]', 'a.b', 'pageSize[0]', 'sort]') },
    { weight: 1, arbitrary: fc.string({ maxLength: 12 }) },
  );
  const value = fc.oneof(
    { weight: 3, arbitrary: nastyString.filter((s) => s.length < 3_000) },
    { weight: 1, arbitrary: fc.integer({ min: 1_000, max: 6_000 }).map((n) => '9'.repeat(n)) },
    { weight: 2, arbitrary: fc.constantFrom('1', '0', '-1', '1.5', '1e3', '1e309', 'NaN', 'Infinity', '0x10', ' 1', '', 'true', 'yes', '%', '_') },
    ...documented.map((p) => ({ weight: 2, arbitrary: plausible(p.schema).map((v) => String(v)) })),
  );
  const pair = fc.tuple(key, fc.oneof(value.map((v) => [v]), fc.array(value, { minLength: 2, maxLength: 3 })));
  const encoded = fc.array(pair, { maxLength: 6 }).map((pairs) => pairs.flatMap(([k, vs]) => vs.map((v) => `${encode(k)}=${encode(v)}`)).join('&'));
  const raw = fc.constantFrom('%', '%zz', 'q=%E0%A4%A', 'q=%FF%FE', 'q=%00', '&&&', '==', 'page[=1', 'page=1&page=2', 'q', '=x', 'q=a+b%2Bc');
  // Node itself answers 431 (no JSON) past 16 kB of headers, before the app sees anything: stay below.
  return fc.oneof({ weight: 5, arbitrary: encoded.map((q) => q.slice(0, MAX_QUERY)) }, { weight: 1, arbitrary: raw }, { weight: 1, arbitrary: fc.constant('') });
}

// ---------------------------------------------------------------------------
// The routes and the property

interface RequestCase {
  role: Role;
  csrf: boolean;
  params: Record<string, string>;
  query: string;
  body: Body;
  signature?: string;
}

/** A route's declaration. */
const docFor = (route: ListedRoute) => apiRoutes.find((d) => d.method.toUpperCase() === route.method && d.path === route.path);

/** Callers the route lets through its guard, so the input reaches the schemas and the services. */
function rolesFor(access: Access | undefined): Role[] {
  if (access === 'public') return ['anonymous'];
  return (access && rolesOf(access)) || ['builder', 'shop', 'admin'];
}

/**
 * Reads first, then writes with bodies, and last the routes that change
 * state whatever they are sent (no body: cancel, accept, refund…) and the
 * admin's: so the fixture's jobs keep their states for most of the routes.
 */
const order = (route: ListedRoute) => {
  if (route.method === 'GET') return 0;
  if (route.path.includes('/admin/')) return 3;
  return docFor(route)?.body || /photos|webhook/.test(route.path) ? 1 : 2;
};

function describeBody(body: Body): string {
  if (body.kind === 'none') return '(no body)';
  if (body.kind === 'multipart') {
    return `multipart ${JSON.stringify(body.files.map((f) => ({ field: f.field, filename: f.filename.slice(0, 40), type: f.contentType, bytes: f.data.length })))} fields ${JSON.stringify(body.fields.map(([k, v]) => [k, v.slice(0, 40)]))}`;
  }
  const text = typeof body.data === 'string' ? body.data : `<bytes ${body.data.toString('hex').slice(0, 200)}>`;
  return `${body.contentType}${body.encoding ? ` (Content-Encoding: ${body.encoding})` : ''} ${body.data.length} chars: ${JSON.stringify(text.slice(0, 300))}`;
}

async function send(route: ListedRoute, request: RequestCase) {
  const caller = request.role === 'anonymous' ? await anonymous() : callers[request.role];
  const path = route.path.replace(/:(\w+)/g, (_m, name: string) => request.params[name]);
  const url = `${path}${request.query ? `?${request.query}` : ''}`;
  const method = route.method.toLowerCase() as 'get' | 'post' | 'put' | 'delete';
  let req = supertest(base)[method](url).timeout(30_000);
  if (caller.cookie) req = req.set('Cookie', caller.cookie);
  if (request.csrf && caller.token) req = req.set('X-CSRF-Token', caller.token);
  if (request.signature !== undefined) req = req.set('Stripe-Signature', request.signature);
  const { body } = request;
  if (body.kind === 'raw') {
    if (body.contentType) req = req.set('Content-Type', body.contentType);
    if (body.encoding) req = req.set('Content-Encoding', body.encoding);
    req = req.send(body.data);
  } else if (body.kind === 'multipart') {
    for (const [name, value] of body.fields) req = req.field(name, value);
    for (const file of body.files) req = req.attach(file.field, file.data, { filename: file.filename, contentType: file.contentType });
    if (!body.files.length && !body.fields.length) req = req.field('nothing', '');
  }
  const res = await req.buffer(true).ok(() => true);
  return { res, url };
}

/**
 * The router's routes, read while the tests are being collected (before the
 * database exists) from an app whose pool is never used.
 */
function routeTable(): ListedRoute[] {
  const config = loadConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent', DATABASE_URL: 'postgres://nobody@127.0.0.1:9/never', UPLOADS_DIR: tmpdir() });
  const pool = createPool(config.databaseUrl, 1);
  const app = createApp({ config, db: createDb(pool), pool, logger: createLogger(config) });
  void app.sessionStore.close();
  void pool.end();
  return listRoutes(app)
    .filter((r) => r.path.startsWith('/api/'))
    .sort((a, b) => order(a) - order(b));
}
const routes = routeTable();

/** Sends one request and throws, naming the request and the answer, when the property does not hold. */
async function expectHandled(route: ListedRoute, request: RequestCase, counts?: Record<string, number>) {
  const { res, url } = await send(route, request);
  if (counts) counts[res.status] = (counts[res.status] ?? 0) + 1;
  const problems: string[] = [];
  if (res.status >= 500) problems.push(`answered ${res.status}`);
  if (res.status >= 400) {
    if (!/^application\/json\b/.test(res.headers['content-type'] ?? '')) problems.push(`a ${res.status} that is not JSON (${res.headers['content-type']})`);
    const error = (res.body as { error?: { code?: unknown; message?: unknown } } | undefined)?.error;
    if (typeof error?.code !== 'string' || typeof error?.message !== 'string') problems.push('a 4xx without { error: { code, message } }');
  }
  // Unsigned, so always refused: 400, or 415 for a Content-Encoding it does not read.
  if (route.path === '/api/payments/webhook' && res.status !== 400 && !(res.status === 415 && request.body.kind === 'raw' && request.body.encoding)) {
    problems.push(`the webhook answered ${res.status} to an unsigned body`);
  }
  if (Object.getOwnPropertyNames(Object.prototype).sort().join() !== pristinePrototype || ({} as Record<string, unknown>).polluted !== undefined) {
    problems.push('Object.prototype was polluted');
  }
  if (problems.length) {
    const answer = Buffer.isBuffer(res.body) ? res.body.toString('utf8') : JSON.stringify(res.body);
    throw new Error(
      `${route.method} ${url.slice(0, 400)} as ${request.role}${request.csrf ? '' : ' (no CSRF token)'}\n  body: ${describeBody(request.body)}\n  → ${res.status} ${res.headers['content-type']} ${String(answer).slice(0, 400)}\n  ${problems.join('; ')}`,
    );
  }
  return res;
}

/**
 * What the fuzzing found (each answered 500 before its fix), kept as fixed
 * examples so they stay fixed whatever the seed draws. They run before the
 * fuzzing, while the fixture's jobs are still in the states they need.
 */
describe('bad input that once caused a 500', () => {
  const route = (method: string, path: string): ListedRoute => {
    const found = routes.find((r) => r.method === method && r.path === path);
    if (!found) throw new Error(`no route ${method} ${path}`);
    return found;
  };
  const base: RequestCase = { role: 'builder', csrf: true, params: {}, query: '', body: { kind: 'none' } };
  const real = (name: string, index = 0) => realIds[name][index];
  const draftJob = () => real('jobId', 1);
  const fundedJob = () => real('jobId', 0);
  const cases: Array<[string, number, () => [ListedRoute, RequestCase]]> = [
    ['a path parameter is not valid percent-encoding', 400, () => [route('GET', '/api/jobs/:jobId'), { ...base, params: { jobId: '%zz' } }]],
    ['a path parameter decodes to half a UTF-16 pair', 400, () => [route('GET', '/api/threads/:threadId/messages'), { ...base, params: { threadId: '%ED%A0%80' } }]],
    ['a search holds a NUL byte', 400, () => [route('GET', '/api/shops'), { ...base, role: 'anonymous', query: 'q=%00' }]],
    ['an e-mail address holds a NUL byte', 400, () => [route('POST', '/api/auth/password-reset/request'), { ...base, role: 'anonymous', body: json('{"email":"nobody\\u0000@example.test"}') }]],
    ['a job title holds a NUL byte', 400, () => [route('POST', '/api/jobs'), { ...base, body: json(JSON.stringify({ ...jobInput(), title: 'Bore \u0000 the block' })) }]],
    ['a job (stored as jsonb) holds half a UTF-16 pair', 400, () => [route('POST', '/api/jobs'), { ...base, body: json(JSON.stringify({ ...jobInput(), city: 'low \udfff first' })) }]],
    ['an inspection draft holds half a UTF-16 pair', 400, () => [route('PUT', '/api/jobs/:jobId/inspection/draft'), { ...base, role: 'shop', params: { jobId: fundedJob() }, body: json('{"draft":{"note":"\\ud800"}}') }]],
    ['the e-mail for a reset is a deeply nested array (the rate limiter stringified it)', 400, () => [route('POST', '/api/auth/password-reset/request'), { ...base, role: 'anonymous', body: json(`{"email":${deepText(20_000)}}`) }]],
    ['the e-mail at sign-in is a deeply nested array', 400, () => [route('POST', '/api/auth/login'), { ...base, role: 'anonymous', body: json(`{"email":${deepText(20_000)},"password":"x"}`) }]],
    ['an inspection draft is nested 5,000 levels deep', 400, () => [route('PUT', '/api/jobs/:jobId/inspection/draft'), { ...base, role: 'shop', params: { jobId: fundedJob() }, body: json(`{"draft":${deepObject(5_000)}}`) }]],
    ['a job is nested 5,000 levels deep', 400, () => [route('POST', '/api/jobs'), { ...base, body: json(JSON.stringify(jobInput()).replace(/}$/, `,"notes":${deepObject(5_000)}}`)) }]],
    ['a multipart body is cut off inside a part', 400, () => [route('POST', '/api/jobs/:jobId/photos'), { ...base, params: { jobId: draftJob() }, body: { kind: 'raw', contentType: 'multipart/form-data; boundary=XyZ', data: '--XyZ\r\nContent-Disposition: form-data; name="photos"; filename="a.png"\r\n\r\n\x89PNG' } }]],
    ['a multipart body has no boundary', 400, () => [route('POST', '/api/threads/:threadId/photos'), { ...base, params: { threadId: real('threadId') }, body: { kind: 'raw', contentType: 'multipart/form-data', data: 'x' } }]],
    ['a milestone photo is asked for with the job id in capitals', 200, () => [route('GET', '/api/jobs/:jobId/milestone-photos/:photoId/:size'), { ...base, role: 'shop', params: { jobId: fundedJob().toUpperCase(), photoId: real('photoId', 2), size: 'thumb' } }]],
    ['a conversation photo is asked for with the conversation id in capitals', 200, () => [route('GET', '/api/threads/:threadId/photos/:photoId/:size'), { ...base, params: { threadId: real('threadId').toUpperCase(), photoId: real('photoId', 1), size: 'thumb' } }]],
    ['a milestone photo is sent to the job id in capitals', 201, () => [route('POST', '/api/jobs/:jobId/milestone-photos'), { ...base, role: 'shop', params: { jobId: fundedJob().toUpperCase() }, body: { kind: 'multipart', files: [{ field: 'photos', data: tinyPng, filename: 'a.png', contentType: 'image/png' }], fields: [] } }]],
  ];
  it.each(cases)('when %s, then %i (not a 500)', async (_name, status, make) => {
    const [r, request] = make();
    const res = await expectHandled(r, request);
    expect(res.status).toBe(status);
  });
});

describe('arbitrary and malformed input to every route', () => {
  it('when the routes are listed, then every one has its access documented and real ids for its path parameters', () => {
    expect(routes.length).toBeGreaterThan(60);
    expect(routes.filter((r) => !docFor(r)).map((r) => `${r.method} ${r.path}`)).toEqual([]);
    expect(routes.filter((r) => r.path.includes(':')).every((r) => [...r.path.matchAll(/:(\w+)/g)].every(([, name]) => name in realIds))).toBe(true);
  });

  for (const route of routes) {
    const doc = docFor(route);
    const label = `${route.method} ${route.path}`;
    const upload = /multipart/.test(doc?.summary ?? '');
    const webhook = route.path === '/api/payments/webhook';
    it(`when ${label} gets arbitrary or malformed input, then it never answers 5xx and every 4xx is the JSON error shape`, { timeout: 120_000 }, async () => {
      const operation = (openApiDocument() as { paths: Record<string, Record<string, { requestBody?: any; parameters?: any[] }>> }).paths[route.path.replace(/:(\w+)/g, '{$1}')]?.[
        route.method.toLowerCase()
      ];
      const bodySchema: JsonSchema | undefined = operation?.requestBody?.content?.['application/json']?.schema;
      const queryDocs: QueryParamDoc[] = (operation?.parameters ?? []).filter((p) => p.in === 'query');
      const paramNames = [...route.path.matchAll(/:(\w+)/g)].map(([, name]) => name);
      const requestCase = fc.record({
        role: fc.constantFrom(...rolesFor(doc?.access)),
        csrf: fc.oneof({ weight: 9, arbitrary: fc.constant(true) }, { weight: 1, arbitrary: fc.constant(false) }),
        params: fc.record(Object.fromEntries(paramNames.map((name) => [name, paramValue(name)]))) as fc.Arbitrary<Record<string, string>>,
        query: queryStrings(queryDocs),
        body: bodies(bodySchema, upload),
        signature: webhook ? fc.option(fc.oneof(fc.constantFrom('t=1,v1=00', `t=${Math.floor(Date.now() / 1000)},v1=${'ab'.repeat(32)}`, 'garbage', ''), fc.string()), { nil: undefined }) : fc.constant(undefined),
      });
      const counts: Record<string, number> = {};
      statsByRoute.set(label, counts);
      await fc.assert(
        fc.asyncProperty(requestCase, (request) => expectHandled(route, request, counts).then(() => undefined)),
        { seed: SEED + hash(label), numRuns: RUNS, endOnFailure: false, interruptAfterTimeLimit: 100_000 },
      );
    });
  }
});

function hash(text: string): number {
  let h = 0;
  for (const ch of text) h = (Math.imul(h, 31) + ch.charCodeAt(0)) | 0;
  return Math.abs(h) % 1_000_000;
}
