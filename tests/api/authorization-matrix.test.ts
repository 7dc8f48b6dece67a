/**
 * The authorization matrix: every API route the Express router has, asked by
 * six callers against the same cast, with the exact status each must get.
 *
 * The cast: builder A posts the jobs; shop X is the shop awarded A's job (its
 * payout account is ready, set up through the payment stand-in); builder B
 * and shop Y are strangers to it (B has a job of its own, Y a profile of its
 * own); an admin; and a signed-out visitor. Each row says how to build the
 * state the request needs (a fresh job in the right state, with its bids,
 * thread, photo, milestone, record, change order or dispute), how to fill the
 * path parameters and the body from it, and the six statuses. Allowed callers
 * send a valid body, so their answer is the real success and not a 400.
 *
 * Each caller expected to succeed gets a state of its own, so one success
 * never changes what the next caller sees; the callers expected to be
 * refused share one (a refusal changes nothing, and one that wrongly succeeds
 * is reported anyway). A row marked `once` builds one state for all six (for
 * reads, and for the rows that move real money through the stand-in); the
 * callers expected to succeed then ask last.
 *
 * A route the router lists without a row here fails the first test, as does
 * a row for a route that no longer exists: a new route cannot ship without
 * saying who may call it.
 */
import { eq } from 'drizzle-orm';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { milestoneInputSchema } from '../../shared/schemas/inspection';
import { bids, changeOrders, inspectionRecords, jobs, payments, shops, users as usersTable, type User } from '../../server/db/schema';
import { submitHostedPage } from '../../server/dev/payments-stand-in/page-client';
import { apiRoutes } from '../../server/api-routes';
import { rolesOf } from '../../server/lib/http/routes';
import { issueToken } from '../../server/modules/auth/tokens';
import { acceptBid, createBid } from '../../server/modules/bids/bids.service';
import { openDispute } from '../../server/modules/disputes/disputes.service';
import { submitInspection } from '../../server/modules/inspections/inspections.service';
import { openThread, sendMessage } from '../../server/modules/messages/messages.service';
import { logMilestone } from '../../server/modules/milestones/milestones.service';
import { notify } from '../../server/modules/notifications/notify';
import { appendLedger } from '../../server/modules/payments/ledger';
import { startJobCheckout, startPayoutOnboarding } from '../../server/modules/payments/payments.service';
import type { ShopRow } from '../../server/modules/shops/shops.repository';
import { bidInput, createJob, createShop, createUser, jobInput, shopProfileInput, uniformRecordInput, uniqueEmail } from '../factories';
import { approveOnGithub, githubIdentity, newGithubLogin } from '../setup/github';
import { completeOnboardingPage } from '../setup/payments';
import { startMoneyApp } from '../setup/money-app';
import { agentFor, signedIn, type ApiClient } from '../setup/test-env';

// ---------------------------------------------------------------------------
// The callers

const CALLERS = ['anon', 'builderA', 'builderB', 'shopX', 'shopY', 'admin'] as const;
type Caller = (typeof CALLERS)[number];
type Person = Exclude<Caller, 'anon'>;
const CALLER_NAMES: Record<Caller, string> = {
  anon: 'signed out',
  builderA: 'builder A',
  builderB: 'builder B',
  shopX: 'shop X',
  shopY: 'shop Y',
  admin: 'admin',
};

/** Expected statuses, in the order of CALLERS: signed out, builder A, builder B, shop X, shop Y, admin. */
type Statuses = readonly [anon: number, builderA: number, builderB: number, shopX: number, shopY: number, admin: number];
const all = (status: number): Statuses => [status, status, status, status, status, status];
/** Admin only: 401 signed out, 403 for every other role. */
const adminOnly = (ok: number): Statuses => [401, 403, 403, 403, 403, ok];

type TestUser = User & { password: string };
type Client = ApiClient;
/** Who is asking: the caller (null while building a state shared by all six), their account and their session. */
interface Turn {
  caller: Caller | null;
  user?: TestUser;
  client?: Client;
}
type Params = Record<string, string>;

interface Case {
  /** Builds the state the request needs and names what fills the path (`:jobId` from `jobId`, …) and the body. */
  state?: (turn: Turn) => Promise<Params>;
  /** One state for all six callers (the ones expected to succeed ask last). */
  once?: boolean;
  body?: object | ((p: Params, turn: Turn) => object);
  query?: (p: Params) => string;
  /** Send a JPEG as multipart field "photos" instead of a JSON body. */
  upload?: boolean;
  /** A new session for each caller (routes that sign in or out as someone else). */
  fresh?: boolean;
  /** Rows with the same key run one after another: they keep a half-done GitHub sign-in in the callers' sessions. */
  serial?: string;
  after?: (p: Params, turn: Turn) => Promise<void>;
  expect: Statuses;
}
interface Row extends Case {
  /** The same route in other states (body, query and upload come from the row unless given). */
  variants?: Array<Partial<Case> & { label: string; expect: Statuses; state: Case['state'] }>;
}

// ---------------------------------------------------------------------------
// The app, the cast and ways to build state

let m: Awaited<ReturnType<typeof startMoneyApp>>;
let uploadsDir: string;
const people = {} as Record<Person, TestUser>;
const clients = {} as Record<Caller, Client>;
let shopX: ShopRow;
let shopY: ShopRow;
let jpeg: Buffer;

const hex = () => randomBytes(5).toString('hex');
const app = () => m.server.app;
const db = () => app().paymentDeps.db;
const bidDeps = () => ({ db: db(), appUrl: app().paymentDeps.appUrl, platformFeeBps: 800 });

// The address, not "localhost": no name lookup on the thread pool the password hashing uses.
const address = () => `http://127.0.0.1:${m.server.port}`;
const newClient = () => agentFor(address());
const signIn = (user: TestUser) => signedIn(address(), user);

async function uploadPhoto(client: Client, path: string): Promise<string> {
  const res = await client.agent.post(path).set('X-CSRF-Token', client.token).attach('photos', jpeg, 'photo.jpg');
  if (res.status !== 201) throw new Error(`upload to ${path}: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.photos[0].id;
}

/** Eight cylinders honed to 4.0310 in, within the factory job's limits. */
const record = uniformRecordInput;

const statement = 'Cylinder four measures well over the taper limit on my own gauge.';
const shopStatement = 'The builder has not answered the change order for the cracked cylinder.';
const answer = 'Our gauge was checked against a ring that morning; the readings stand.';
const decision = 'The record is within every limit; the shop is paid what is held.';
type Money = 'fake' | 'real';

/** Jobs of builder A in each state, built through the services (and the stand-in where money must really move). */
const w = {
  async job(status: 'draft' | 'open' = 'open') {
    return (await createJob(db(), people.builderA.id, { status })).id;
  },
  bid(jobId: string, shop: 'shopX' | 'shopY' = 'shopX') {
    return createBid(bidDeps(), people[shop], jobId, bidInput());
  },
  /** A's open job with a bid from shop X, not yet accepted. */
  async openWithBid() {
    const jobId = await w.job();
    await w.bid(jobId);
    return { jobId };
  },
  async award(jobId: string, bidId: string) {
    await acceptBid(bidDeps(), people.builderA, bidId);
    return { jobId, bidId };
  },
  /** A's job with shop X's bid accepted (and, when `loser`, shop Y's bid declined by it). */
  async awarded(options: { loser?: boolean; photo?: boolean } = {}) {
    const jobId = await w.job();
    const photoId = options.photo ? await uploadPhoto(clients.builderA, `/api/jobs/${jobId}/photos`) : '';
    if (options.loser) await w.bid(jobId, 'shopY');
    const bidId = await w.bid(jobId);
    await w.award(jobId, bidId);
    return { jobId, bidId, photoId };
  },
  /**
   * Paid for and held. `fake` writes the paid payment and its ledger entry
   * straight into the database (enough for everything that reads the state);
   * `real` pays on the stand-in's hosted page and waits for the signed
   * webhook, for the rows that move the money.
   */
  async fund(jobId: string, money: Money) {
    if (money === 'real') {
      const { url } = await startJobCheckout(app().paymentDeps, people.builderA, jobId);
      const paid = await submitHostedPage(url, { card_number: '4242424242424242', exp: '12 / 34', cvc: '123' });
      if (paid.status >= 400) throw new Error(`the payment page answered ${paid.status}`);
      await m.until('funded', async () => (await db().select({ status: jobs.status }).from(jobs).where(eq(jobs.id, jobId)))[0].status === 'funded', 20_000);
      return;
    }
    const [job] = await db().select().from(jobs).where(eq(jobs.id, jobId));
    const [bid] = await db().select().from(bids).where(eq(bids.id, job.awardedBidId!));
    const ref = hex();
    const [payment] = await db()
      .insert(payments)
      .values({ jobId, kind: 'bid', amountCents: bid.totalCents, status: 'paid', paidAt: new Date(), paymentIntentId: `pi_matrix_${ref}`, chargeId: `ch_matrix_${ref}` })
      .returning();
    await appendLedger(db(), { jobId, paymentId: payment.id, kind: 'paid_in', amountCents: payment.amountCents, reference: payment.chargeId! });
    await db().update(jobs).set({ status: 'funded' }).where(eq(jobs.id, jobId));
  },
  async funded(money: Money = 'fake', options: { loser?: boolean; photo?: boolean } = {}) {
    const job = await w.awarded(options);
    await w.fund(job.jobId, money);
    return job;
  },
  /** Funded, and shop X has logged the block received. */
  async inWork(money: Money = 'fake') {
    const job = await w.funded(money);
    await logMilestone({ db: db() }, people.shopX, job.jobId, milestoneInputSchema.parse({ kind: 'block_received' }));
    return job;
  },
  /** Shop X's inspection record waits for builder A. */
  async submitted(money: Money = 'fake') {
    const job = await w.inWork(money);
    await submitInspection(app().workDeps, people.shopX, job.jobId, record());
    return job;
  },
  changeOrder(jobId: string, status: 'proposed' | 'declined' = 'proposed') {
    return db()
      .insert(changeOrders)
      .values({ jobId, shopId: shopX.id, description: 'Sleeve cylinder three (cracked)', amountCents: 18_000, status })
      .returning()
      .then(([row]) => row.id);
  },
  /** A record waiting, and a dispute opened by the builder (over the record) or by the shop (over a change order). */
  async disputed(by: 'builder' | 'shop', money: Money = 'fake') {
    const job = await w.submitted(money);
    if (by === 'shop') await w.changeOrder(job.jobId);
    const dispute =
      by === 'builder'
        ? await openDispute(app().paymentDeps, people.builderA, job.jobId, { reason: 'record_outside_limits', statement })
        : await openDispute(app().paymentDeps, people.shopX, job.jobId, { reason: 'change_order', statement: shopStatement });
    return { ...job, disputeId: dispute.id };
  },
  /** The builder accepted the record: the job is completed (the release itself is the accept row's business). */
  async completed() {
    const job = await w.submitted();
    await db().update(inspectionRecords).set({ status: 'accepted', decidedAt: new Date(), decidedBy: people.builderA.id, decidedHow: 'builder' }).where(eq(inspectionRecords.jobId, job.jobId));
    await db().update(jobs).set({ status: 'completed' }).where(eq(jobs.id, job.jobId));
    return job;
  },
  /** The conversation between builder A and shop X about a job, with one message from A. */
  async thread(jobId: string) {
    const thread = await openThread(db(), people.shopX, jobId);
    const { message } = await sendMessage({ db: db() }, people.builderA, thread.id, { clientId: `m-${hex()}`, body: 'Is the block there yet?' });
    return { threadId: thread.id, messageId: message.id };
  },
  /** An account nobody in the cast owns, for the routes that act on one by e-mail, token or id. */
  async stranger(overrides: Parameters<typeof createUser>[1] = {}) {
    return createUser(db(), { emailVerifiedAt: null, ...overrides });
  },
  /** Walks the GitHub stand-in's approval for a new identity; resolves to where it sends the browser back. */
  async githubApproval(client: Client) {
    const start = await client.agent.get('/api/auth/github');
    if (start.status !== 302) throw new Error(`GitHub sign-in did not start: ${start.status}`);
    const authorize = new URL(start.headers.location);
    const approve = await approveOnGithub(authorize, githubIdentity(newGithubLogin()));
    if (approve.status !== 302) throw new Error(`the GitHub stand-in answered ${approve.status}`);
    return new URL(approve.headers.get('location')!);
  },
  /** A GitHub sign-in waiting in this session for the person to choose a role. */
  async githubPending(client: Client) {
    const back = await w.githubApproval(client);
    const res = await client.agent.get(back.pathname + back.search);
    if (res.headers.location !== '/welcome/github') throw new Error(`GitHub callback went to ${res.headers.location}`);
  },
};

const shopFor = (turn: Turn) => (turn.caller === 'shopY' ? shopY : shopX);
const isBuilder = (turn: Turn) => turn.caller === 'builderA' || turn.caller === 'builderB';
const isShop = (turn: Turn) => turn.caller === 'shopX' || turn.caller === 'shopY';

// ---------------------------------------------------------------------------
// The matrix: METHOD + Express pattern → state, body and the six statuses
//                                                    signed out, A,  B,   X,   Y,   admin

const matrix: Record<string, Row> = {
  // --- public -------------------------------------------------------------
  'GET /api/health': { expect: all(200) },
  'GET /api/openapi.json': { expect: all(200) },
  'GET /api/auth/csrf': { expect: all(200) },
  'GET /api/auth/me': { expect: [401, 200, 200, 200, 200, 200] },
  'GET /api/auth/session': { expect: all(200) },
  'POST /api/auth/signup': {
    fresh: true,
    body: () => ({ displayName: 'New Person', email: uniqueEmail('signup'), password: 'a long enough password', role: 'builder', acceptTerms: true }),
    expect: all(201),
  },
  'POST /api/auth/login': {
    // A wrong password is refused the same way whoever asks.
    state: async () => ({ email: (await w.stranger()).email }),
    body: (p) => ({ email: p.email, password: 'not the password at all' }),
    expect: all(401),
  },
  'POST /api/auth/logout': { fresh: true, expect: all(204) },
  'POST /api/auth/verify-email': {
    state: async () => ({ token: await issueToken(db(), (await w.stranger()).id, 'verify_email', 60 * 60_000) }),
    body: (p) => ({ token: p.token }),
    expect: all(200),
  },
  'POST /api/auth/verify-email/resend': {
    // Only an unconfirmed address can be sent the link again: the caller's is unconfirmed for this one request.
    state: async (turn) => {
      if (turn.user) await db().update(usersTable).set({ emailVerifiedAt: null }).where(eq(usersTable.id, turn.user.id));
      return {};
    },
    after: async (_p, turn) => {
      if (turn.user) await db().update(usersTable).set({ emailVerifiedAt: new Date() }).where(eq(usersTable.id, turn.user.id));
    },
    expect: [401, 202, 202, 202, 202, 202],
  },
  'POST /api/auth/password-reset/request': {
    state: async () => ({ email: (await w.stranger()).email }),
    body: (p) => ({ email: p.email }),
    expect: all(202),
  },
  'POST /api/auth/password-reset/confirm': {
    state: async () => ({ token: await issueToken(db(), (await w.stranger()).id, 'reset_password', 60 * 60_000) }),
    body: (p) => ({ token: p.token, password: 'a brand new password' }),
    expect: all(200),
  },
  'POST /api/auth/password': {
    // A wrong current password is refused the same way whoever is signed in (a right one would end the caller's
    // other sessions, which the other rows use; tests/realtime/session-end.test.ts changes passwords for real).
    body: { currentPassword: 'not the password at all', newPassword: 'another long password' },
    expect: [401, 400, 400, 400, 400, 400],
  },
  // --- the signed-in person's own account ---------------------------------------
  'POST /api/me/email': {
    // Only asks: the address changes when the link is followed, so the caller's account stays as the other rows need it.
    body: (_p, turn) => ({ newEmail: uniqueEmail('moving'), currentPassword: turn.user?.password ?? 'not signed in' }),
    expect: [401, 202, 202, 202, 202, 202],
  },
  'POST /api/me/email/confirm': {
    state: async () => {
      const someone = await w.stranger({ pendingEmail: uniqueEmail('moved') });
      return { token: await issueToken(db(), someone.id, 'change_email', 60 * 60_000) };
    },
    body: (p) => ({ token: p.token }),
    expect: all(200),
  },
  'GET /api/me/export': { expect: [401, 200, 200, 200, 200, 200] },
  'GET /api/me/export.csv': { expect: [401, 200, 200, 200, 200, 200] },
  'GET /api/me/deletion': { expect: [401, 200, 200, 200, 200, 200] },
  'POST /api/me/delete': {
    // A wrong current password is refused whoever asks (an admin's account is never closed from its settings); a right one
    // would close the caller's account, which the other rows use: tests/api/account-settings.test.ts deletes for real.
    body: { currentPassword: 'not the password at all' },
    expect: [401, 400, 400, 400, 400, 400],
  },
  'GET /api/auth/github': { serial: 'github', expect: all(302) },
  'GET /api/auth/github/callback': {
    serial: 'github',
    state: async (turn) => ({ search: (await w.githubApproval(turn.client!)).search.slice(1) }),
    query: (p) => p.search,
    expect: all(302),
  },
  'GET /api/auth/github/pending': {
    serial: 'github',
    state: async (turn) => (await w.githubPending(turn.client!), {}),
    expect: all(200),
  },
  'POST /api/auth/github/complete': {
    fresh: true,
    state: async (turn) => (await w.githubPending(turn.client!), {}),
    body: { role: 'shop', acceptTerms: true },
    expect: all(201),
  },

  // --- calculations (public, no session needed) ------------------------------
  'POST /api/calculations/displacement': { body: { unit: 'in', bore: 4.03, stroke: 3.48, cylinders: 8 }, expect: all(200) },
  'POST /api/calculations/compression-ratio': {
    body: { unit: 'in', bore: 4.03, stroke: 3.48, chamberCc: 64, pistonCc: -5, deckClearance: 0.005, gasketBore: 4.1, gasketThickness: 0.04 },
    expect: all(200),
  },
  'POST /api/calculations/crosshatch': { body: { unit: 'in', bore: 4.03, spindleRpm: 150, strokeLength: 4, cyclesPerMinute: 60 }, expect: all(200) },
  'POST /api/calculations/crosshatch-rate': { body: { unit: 'in', bore: 4.03, spindleRpm: 150, strokeLength: 4, includedAngleDeg: 45 }, expect: all(200) },
  'POST /api/calculations/bore-inspection': {
    body: { unit: 'in', cylinders: record().cylinders, spec: { maxTaper: 0.0005, maxOutOfRound: 0.0005, clearanceMin: 0.0025, clearanceMax: 0.0035 } },
    expect: all(200),
  },
  'POST /api/calculations/bore-size': { body: { unit: 'in', pistonDiameter: 4.028, clearanceMin: 0.0025, clearanceMax: 0.0035, honeAllowance: 0.003 }, expect: all(200) },
  'POST /api/calculations/deck-flatness': { body: { unit: 'in', readings: [0.001, 0.0015, 0.001], material: 'cast-iron', gasket: 'mls' }, expect: all(200) },
  'POST /api/calculations/roughness': {
    body: { heightsUm: Array.from({ length: 400 }, (_, i) => Math.round(Math.sin(i / 3) * 800) / 1000), spacingUm: 0.5 },
    expect: all(200),
  },
  'POST /api/calculations/ring-gap': { body: { unit: 'in', bore: 4.03, application: 'street' }, expect: all(200) },
  'POST /api/calculations/dynamic-compression': {
    body: { unit: 'in', bore: 4.03, stroke: 3.48, chamberCc: 64, pistonCc: -5, deckClearance: 0.005, gasketBore: 4.1, gasketThickness: 0.04, rodLength: 5.7, intakeClosingDegAbdc: 60 },
    expect: all(200),
  },
  'POST /api/calculations/balance-tolerance': { body: { rotorMassKg: 20, serviceRpm: 7000, grade: 2.5 }, expect: all(200) },
  'POST /api/calculations/bob-weight': { body: { rotatingGrams: 1100, reciprocatingGrams: 1400 }, expect: all(200) },
  'POST /api/calculations/deck-clearance': { body: { unit: 'in', deckHeight: 9.025, stroke: 3.48, rodLength: 5.7, compressionHeight: 1.56, gasketThickness: 0.015 }, expect: all(200) },
  'POST /api/calculations/bearing-clearance': { body: { unit: 'in', housingBore: 2.689, journalDiameter: 2.4995, shellWall: 0.0935 }, expect: all(200) },

  // --- shops ---------------------------------------------------------------
  'GET /api/shops': { expect: all(200) },
  'GET /api/catalogue': { once: true, expect: all(200) },
  'GET /api/help/contact': { once: true, expect: all(200) },
  'GET /api/shops/:shopId': { state: async () => ({ shopId: shopX.id }), once: true, expect: all(200) },
  'GET /api/shop-profile': { expect: [401, 403, 403, 200, 200, 403] },
  'PUT /api/shop-profile': { body: (_p, turn) => shopProfileInput({ name: shopFor(turn).name }), expect: [401, 403, 403, 200, 200, 403] },

  // --- jobs ----------------------------------------------------------------
  'GET /api/jobs': { expect: [401, 403, 403, 200, 200, 200] },
  'GET /api/jobs/mine': { expect: [401, 200, 200, 403, 403, 403] },
  'POST /api/jobs': { body: () => jobInput(), expect: [401, 201, 201, 403, 403, 403] },
  'GET /api/jobs/:jobId': {
    once: true,
    state: () => w.funded(),
    expect: [401, 200, 403, 200, 403, 200],
    variants: [
      { label: 'open', state: async () => ({ jobId: await w.job() }), expect: [401, 200, 403, 200, 200, 200] },
      { label: 'draft', state: async () => ({ jobId: await w.job('draft') }), expect: [401, 200, 404, 404, 404, 200] },
      { label: 'shop Y bid and lost', state: () => w.funded('fake', { loser: true }), expect: [401, 200, 403, 200, 200, 200] },
    ],
  },
  'PUT /api/jobs/:jobId': {
    state: () => w.openWithBid(),
    body: () => jobInput({ title: 'Bore, hone and deck a V8 block' }),
    expect: [401, 200, 403, 403, 403, 403],
    variants: [{ label: 'draft', state: async () => ({ jobId: await w.job('draft') }), expect: [401, 200, 404, 403, 403, 403] }],
  },
  'POST /api/jobs/:jobId/publish': { state: async () => ({ jobId: await w.job('draft') }), expect: [401, 200, 404, 403, 403, 403] },
  'POST /api/jobs/:jobId/cancel': {
    state: () => w.openWithBid(),
    expect: [401, 200, 403, 403, 403, 403],
  },
  'POST /api/jobs/:jobId/photos': {
    state: async () => ({ jobId: await w.job() }),
    upload: true,
    expect: [401, 201, 403, 403, 403, 403],
    variants: [{ label: 'draft', state: async () => ({ jobId: await w.job('draft') }), expect: [401, 201, 404, 403, 403, 403] }],
  },
  'GET /api/jobs/:jobId/photos/:photoId/:size': {
    once: true,
    state: async () => ({ ...(await w.funded('fake', { photo: true })), size: 'thumb' }),
    expect: [401, 200, 403, 200, 403, 200],
    variants: [
      {
        label: 'draft',
        state: async () => {
          const jobId = await w.job('draft');
          return { jobId, photoId: await uploadPhoto(clients.builderA, `/api/jobs/${jobId}/photos`), size: 'large' };
        },
        expect: [401, 200, 404, 404, 404, 200],
      },
    ],
  },
  'DELETE /api/jobs/:jobId/photos/:photoId': {
    once: true,
    state: async () => {
      const jobId = await w.job();
      return { jobId, photoId: await uploadPhoto(clients.builderA, `/api/jobs/${jobId}/photos`) };
    },
    expect: [401, 204, 403, 403, 403, 403],
  },

  // --- bids ----------------------------------------------------------------
  'GET /api/jobs/:jobId/bids': {
    once: true,
    state: () => w.funded(),
    expect: [401, 200, 403, 200, 403, 200],
    variants: [
      {
        label: 'open, shop X bid',
        state: () => w.openWithBid(),
        expect: [401, 200, 403, 200, 200, 200],
      },
      { label: 'draft', state: async () => ({ jobId: await w.job('draft') }), expect: [401, 200, 404, 404, 404, 200] },
    ],
  },
  'POST /api/jobs/:jobId/bids': { state: async () => ({ jobId: await w.job() }), body: () => bidInput(), expect: [401, 403, 403, 201, 201, 403] },
  'GET /api/bids/mine': { expect: [401, 403, 403, 200, 200, 403] },
  'GET /api/bids/fee-rate': { expect: [401, 403, 403, 200, 200, 403] },
  'GET /api/shop/queue': { expect: [401, 403, 403, 200, 200, 403] },
  'GET /api/bids/:bidId': {
    once: true,
    state: async () => {
      const jobId = await w.job();
      return { bidId: await w.bid(jobId) };
    },
    expect: [401, 200, 404, 200, 404, 200],
  },
  'PUT /api/bids/:bidId': {
    state: async () => ({ bidId: await w.bid(await w.job()) }),
    body: () => bidInput({ note: 'Revised: deck included.' }),
    expect: [401, 403, 403, 200, 404, 403],
  },
  'POST /api/bids/:bidId/withdraw': { state: async () => ({ bidId: await w.bid(await w.job()) }), expect: [401, 403, 403, 200, 404, 403] },
  'POST /api/bids/:bidId/accept': { state: async () => ({ bidId: await w.bid(await w.job()) }), expect: [401, 200, 404, 403, 403, 403] },
  'POST /api/bids/:bidId/decline': {
    state: async () => ({ bidId: await w.bid(await w.job()) }),
    body: { reason: 'Too far to ship the block.' },
    expect: [401, 200, 404, 403, 403, 403],
  },

  // --- messages ------------------------------------------------------------
  'GET /api/threads': { expect: [401, 200, 200, 200, 200, 200] },
  'GET /api/jobs/:jobId/threads': {
    once: true,
    state: async () => {
      const job = await w.funded();
      await w.thread(job.jobId);
      return job;
    },
    expect: [401, 200, 403, 200, 403, 200],
    variants: [{ label: 'draft', state: async () => ({ jobId: await w.job('draft') }), expect: [401, 200, 404, 404, 404, 200] }],
  },
  'POST /api/jobs/:jobId/threads': {
    state: () => w.funded(),
    // The builder names the shop; a shop opens its own conversation.
    body: (_p, turn) => (isShop(turn) ? {} : { shopId: shopX.id }),
    expect: [401, 201, 403, 201, 403, 403],
    variants: [
      {
        label: 'open, shop X bid',
        state: () => w.openWithBid(),
        // On an open job any shop may ask a question.
        expect: [401, 201, 403, 201, 201, 403],
      },
    ],
  },
  'GET /api/threads/:threadId/messages': { once: true, state: async () => w.thread((await w.funded()).jobId), expect: [401, 200, 404, 200, 404, 200] },
  'POST /api/threads/:threadId/messages': {
    state: async () => w.thread((await w.funded()).jobId),
    body: () => ({ clientId: `m-${hex()}`, body: 'The block ships on Monday.' }),
    expect: [401, 201, 404, 201, 404, 403],
  },
  'POST /api/threads/:threadId/photos': { state: async () => w.thread((await w.funded()).jobId), upload: true, expect: [401, 201, 404, 201, 404, 403] },
  'GET /api/threads/:threadId/photos/:photoId/:size': {
    once: true,
    state: async () => {
      const { threadId } = await w.thread((await w.funded()).jobId);
      const photoId = await uploadPhoto(clients.shopX, `/api/threads/${threadId}/photos`);
      await sendMessage({ db: db() }, people.shopX, threadId, { clientId: `m-${hex()}`, body: '', photoIds: [photoId] });
      return { threadId, photoId, size: 'large' };
    },
    expect: [401, 200, 404, 200, 404, 200],
  },
  'POST /api/threads/:threadId/read': {
    state: async () => w.thread((await w.funded()).jobId),
    body: (p) => ({ messageId: p.messageId }),
    expect: [401, 200, 404, 200, 404, 200],
  },

  // --- the work record -------------------------------------------------------
  'GET /api/jobs/:jobId/milestones': {
    once: true,
    state: () => w.inWork(),
    expect: [401, 200, 403, 200, 403, 200],
    variants: [{ label: 'shop Y bid and lost', state: () => w.funded('fake', { loser: true }), expect: [401, 200, 403, 200, 403, 200] }],
  },
  'POST /api/jobs/:jobId/milestones': { state: () => w.inWork(), body: { kind: 'note', note: 'Bores measured before honing.' }, expect: [401, 403, 403, 201, 404, 403] },
  'GET /api/jobs/:jobId/shipping': { once: true, state: () => w.funded(), expect: [401, 200, 403, 200, 403, 200] },
  'POST /api/jobs/:jobId/sent-to-shop': { state: () => w.funded(), body: { carrier: 'Ridgeline Freight', trackingNumber: 'RF 5501 2210' }, expect: [401, 201, 403, 403, 403, 403] },
  'PUT /api/jobs/:jobId/return-address': {
    state: () => w.inWork(),
    body: { lines: ['42 Camshaft Lane'], city: 'Fort Wayne', region: 'Indiana', postalCode: '46802', country: 'United States' },
    expect: [401, 200, 403, 403, 403, 403],
  },
  'POST /api/jobs/:jobId/milestone-photos': { state: () => w.inWork(), upload: true, expect: [401, 403, 403, 201, 404, 403] },
  'GET /api/jobs/:jobId/milestone-photos/:photoId/:size': {
    once: true,
    state: async () => {
      const { jobId } = await w.inWork();
      const photoId = await uploadPhoto(clients.shopX, `/api/jobs/${jobId}/milestone-photos`);
      await logMilestone({ db: db() }, people.shopX, jobId, milestoneInputSchema.parse({ kind: 'teardown', note: 'Main web cracked.', photoIds: [photoId] }));
      return { jobId, photoId, size: 'thumb' };
    },
    expect: [401, 200, 403, 200, 403, 200],
  },
  'GET /api/jobs/:jobId/inspection': { once: true, state: () => w.submitted(), expect: [401, 200, 403, 200, 403, 200] },
  'PUT /api/jobs/:jobId/inspection/draft': { state: () => w.inWork(), body: { draft: { notes: 'Half the bores measured.' } }, expect: [401, 403, 403, 200, 404, 403] },
  'POST /api/jobs/:jobId/inspection': { state: () => w.inWork(), body: () => record(), expect: [401, 403, 403, 201, 404, 403] },
  'POST /api/jobs/:jobId/inspection/accept': { once: true, state: () => w.submitted('real'), body: { version: 1 }, expect: [401, 200, 403, 403, 403, 403] },
  'POST /api/jobs/:jobId/inspection/reject': {
    state: () => w.submitted(),
    body: { version: 1, reasons: 'Cylinder four taper is over the limit.' },
    expect: [401, 200, 403, 403, 403, 403],
  },
  'GET /api/jobs/:jobId/inspection/:version/certificate.pdf': {
    once: true,
    state: async () => ({ ...(await w.submitted()), version: '1' }),
    expect: [401, 200, 403, 200, 403, 200],
  },

  // --- money ---------------------------------------------------------------
  // The webhook proves itself by signature, not by session: unsigned is refused for everyone.
  'POST /api/payments/webhook': { body: { id: 'evt_unsigned', type: 'checkout.session.completed' }, expect: all(400) },
  'POST /api/shop-profile/payouts': { expect: [401, 403, 403, 200, 200, 403] },
  'POST /api/jobs/:jobId/checkout': { state: () => w.awarded(), expect: [401, 200, 404, 403, 403, 403] },
  'GET /api/jobs/:jobId/money': {
    once: true,
    state: () => w.funded(),
    expect: [401, 200, 403, 200, 403, 200],
    variants: [{ label: 'shop Y bid and lost', state: () => w.funded('fake', { loser: true }), expect: [401, 200, 403, 200, 403, 200] }],
  },
  'POST /api/jobs/:jobId/cancel-and-refund': { once: true, state: () => w.funded('real'), expect: [401, 200, 404, 403, 403, 403] },
  'GET /api/jobs/:jobId/change-orders': {
    once: true,
    state: async () => {
      const job = await w.funded();
      await w.changeOrder(job.jobId);
      return job;
    },
    expect: [401, 200, 403, 200, 403, 200],
    variants: [
      {
        // The extra work and its price are between the builder and the shop doing the work, as the job's money is.
        label: 'shop Y bid and lost',
        state: async () => {
          const job = await w.funded('fake', { loser: true });
          await w.changeOrder(job.jobId);
          return job;
        },
        expect: [401, 200, 403, 200, 403, 200],
      },
    ],
  },
  'POST /api/jobs/:jobId/change-orders': {
    state: () => w.funded(),
    body: { description: 'Sleeve cylinder three (cracked)', amountCents: 18_000 },
    expect: [401, 403, 403, 201, 403, 403],
  },
  'POST /api/change-orders/:changeOrderId/approve': {
    state: async () => ({ changeOrderId: await w.changeOrder((await w.funded()).jobId) }),
    expect: [401, 200, 404, 403, 403, 403],
  },
  'POST /api/change-orders/:changeOrderId/decline': {
    state: async () => ({ changeOrderId: await w.changeOrder((await w.funded()).jobId) }),
    expect: [401, 200, 404, 403, 403, 403],
  },
  'GET /api/me/money': { expect: [401, 200, 200, 200, 200, 403] },
  'GET /api/me/money.csv': { expect: [401, 200, 200, 200, 200, 403] },
  // The receipt is the payer's: to the shop it was for, as to everyone else, the payment does not exist.
  'GET /api/payments/:paymentId/receipt.pdf': {
    once: true,
    state: async () => {
      const job = await w.funded();
      const [payment] = await db().select({ id: payments.id }).from(payments).where(eq(payments.jobId, job.jobId));
      return { ...job, paymentId: payment.id };
    },
    expect: [401, 200, 404, 404, 404, 200],
  },
  'GET /api/jobs/:jobId/invoice.pdf': { once: true, state: () => w.completed(), expect: [401, 200, 403, 200, 403, 200] },
  'GET /api/bids/:bidId/quote.pdf': { once: true, state: async () => ({ bidId: await w.bid(await w.job()) }), expect: [401, 200, 404, 200, 404, 200] },
  'POST /api/admin/jobs/:jobId/release': { once: true, state: () => w.funded('real'), expect: adminOnly(200) },
  'POST /api/admin/jobs/:jobId/split': { once: true, state: () => w.funded('real'), body: { shopCents: 30_000 }, expect: adminOnly(200) },

  // --- disputes and reviews --------------------------------------------------
  'GET /api/jobs/:jobId/dispute': { once: true, state: () => w.disputed('builder'), expect: [401, 200, 403, 200, 403, 200] },
  'POST /api/jobs/:jobId/dispute': {
    // A record waits (the builder's ground) and a change order is unanswered (the shop's).
    state: async () => {
      const job = await w.submitted();
      await w.changeOrder(job.jobId);
      return job;
    },
    body: (_p, turn) => (isBuilder(turn) ? { reason: 'record_outside_limits', statement } : { reason: 'change_order', statement: shopStatement }),
    expect: [401, 201, 403, 201, 403, 403],
  },
  'POST /api/jobs/:jobId/dispute/response': {
    // The other side answers: for builder A the shop opened it, for everyone else the builder did.
    state: (turn) => w.disputed(turn.caller === 'builderA' ? 'shop' : 'builder'),
    body: { statement: answer },
    expect: [401, 200, 403, 200, 403, 403],
  },
  'GET /api/jobs/:jobId/reviews': { once: true, state: () => w.completed(), expect: [401, 200, 403, 200, 403, 200] },
  'POST /api/jobs/:jobId/reviews': {
    state: () => w.completed(),
    body: { rating: 5, comment: 'Straight answers and round bores.' },
    expect: [401, 201, 403, 201, 403, 403],
  },
  'GET /api/admin/disputes': { expect: adminOnly(200) },
  'GET /api/admin/disputes/:disputeId': { once: true, state: () => w.disputed('builder'), expect: adminOnly(200) },
  'POST /api/admin/disputes/:disputeId/resolve': {
    once: true,
    state: () => w.disputed('builder', 'real'),
    body: { outcome: 'release', decision },
    expect: adminOnly(200),
  },

  // --- what needs the person, notices and e-mail choices ------------------------
  'GET /api/me/needs-you': { expect: [401, 200, 200, 200, 200, 200] },
  'GET /api/notifications': { expect: [401, 200, 200, 200, 200, 200] },
  'GET /api/notifications/unread': { expect: [401, 200, 200, 200, 200, 200] },
  'POST /api/notifications/read-all': { expect: [401, 200, 200, 200, 200, 200] },
  'POST /api/notifications/:notificationId/read': {
    // A notice of builder A's: nobody else can tell it exists.
    state: async () => ({ notificationId: (await notify(db(), people.builderA.id, 'bid_received', { text: 'A bid came in.', href: '/jobs' })).id }),
    expect: [401, 200, 404, 404, 404, 404],
  },
  'GET /api/me/notification-preferences': { expect: [401, 200, 200, 200, 200, 200] },
  'PUT /api/me/notification-preferences': { body: { preferences: [{ kind: 'matching_jobs', email: false }] }, expect: [401, 200, 200, 200, 200, 200] },

  // --- the admin console -----------------------------------------------------
  'GET /api/admin/users': { expect: adminOnly(200) },
  'POST /api/admin/admins': { body: () => ({ displayName: 'Another Admin', email: uniqueEmail('admin') }), expect: adminOnly(201) },
  'POST /api/admin/users/:userId/suspend': {
    state: async () => ({ userId: (await w.stranger()).id }),
    body: { reason: 'Listings reported as spam.' },
    expect: adminOnly(200),
  },
  'POST /api/admin/users/:userId/reinstate': { state: async () => ({ userId: (await w.stranger({ status: 'suspended' })).id }), expect: adminOnly(200) },
  'GET /api/admin/shops': { expect: adminOnly(200) },
  'POST /api/admin/shops/:shopId/verification': {
    state: async () => ({ shopId: (await createShop(db())).shop.id }),
    body: { verified: true },
    expect: adminOnly(200),
  },
  'GET /api/admin/fee': { expect: adminOnly(200) },
  'PUT /api/admin/fee': { body: { feeBps: 800 }, expect: adminOnly(200) },
  'GET /api/admin/ledger': { expect: adminOnly(200) },
  'GET /api/admin/ledger.csv': { expect: adminOnly(200) },
  'GET /api/admin/audit': { expect: adminOnly(200) },
};

// ---------------------------------------------------------------------------
// Running it

interface Mismatch {
  route: string;
  caller: string;
  expected: string;
  got: string;
  code: string;
}

const isSuccess = (status: number) => status >= 200 && status < 400;

function fillPath(pattern: string, p: Params): string {
  return pattern.replace(/:(\w+)/g, (_, name: string) => {
    if (p[name] === undefined) throw new Error(`the state gives no value for :${name}`);
    return encodeURIComponent(p[name]);
  });
}

async function send(client: Client, method: string, path: string, body: object | undefined, upload: boolean) {
  const agent = client.agent;
  let req =
    method === 'GET' ? agent.get(path) : method === 'POST' ? agent.post(path) : method === 'PUT' ? agent.put(path) : method === 'DELETE' ? agent.delete(path) : undefined;
  if (!req) throw new Error(`no way to send ${method}`);
  req = req.timeout(60_000).redirects(0);
  if (method !== 'GET') req = req.set('X-CSRF-Token', client.token);
  if (upload) req = req.attach('photos', jpeg, 'photo.jpg');
  else if (body !== undefined) req = req.send(body);
  return req;
}

/** One route in one state, asked by the six callers; answers the mismatches. */
async function runCase(key: string, label: string | undefined, c: Case): Promise<Mismatch[]> {
  const [method, pattern] = key.split(' ');
  const name = label ? `${key} [${label}]` : key;
  const out: Mismatch[] = [];
  const expected = (caller: Caller) => c.expect[CALLERS.indexOf(caller)];
  // Callers who must be refused share one state (a refusal changes nothing); each caller who may succeed gets its own,
  // unless the row says `once`, and then they ask after everyone who may not.
  const order = [...CALLERS].sort((a, b) => Number(isSuccess(expected(a))) - Number(isSuccess(expected(b))));
  let shared: Params | undefined;
  for (const caller of order) {
    const want = String(expected(caller));
    try {
      const ownState = !c.once && (c.fresh || c.serial !== undefined || isSuccess(expected(caller)));
      if (!ownState && !shared) shared = (await c.state?.({ caller: null })) ?? {};
      const user = caller === 'anon' ? undefined : people[caller];
      const client = c.fresh ? (user ? await signIn(user) : await newClient()) : clients[caller];
      const turn: Turn = { caller, user, client };
      const p = ownState ? ((await c.state?.(turn)) ?? {}) : shared!;
      const path = fillPath(pattern, p) + (c.query ? `?${c.query(p)}` : '');
      const body = typeof c.body === 'function' ? c.body(p, turn) : c.body;
      let res: supertest.Response;
      try {
        res = await send(client, method, path, body, c.upload ?? false);
      } finally {
        await c.after?.(p, turn);
      }
      const code = typeof res.body?.error?.code === 'string' ? res.body.error.code : '';
      if (String(res.status) !== want) {
        out.push({ route: name, caller: CALLER_NAMES[caller], expected: want, got: String(res.status), code: code || (res.body?.error?.message ?? '') });
      } else if (res.status >= 400 && !(typeof res.body?.error?.code === 'string' && typeof res.body?.error?.message === 'string')) {
        out.push({ route: name, caller: CALLER_NAMES[caller], expected: `${want} as { error: { code, message } }`, got: `${res.status} ${String(res.text).slice(0, 60)}`, code: '' });
      }
    } catch (error) {
      out.push({ route: name, caller: CALLER_NAMES[caller], expected: want, got: `failed: ${error instanceof Error ? error.message : String(error)}`.slice(0, 120), code: '' });
    }
  }
  return out;
}

function table(rows: Mismatch[]): string {
  const head: Mismatch = { route: 'route', caller: 'caller', expected: 'expected', got: 'got', code: 'error code' };
  const cols = ['route', 'caller', 'expected', 'got', 'code'] as const;
  const width = Object.fromEntries(cols.map((col) => [col, Math.max(...[head, ...rows].map((r) => r[col].length))])) as Record<(typeof cols)[number], number>;
  const line = (r: Mismatch) => cols.map((col) => r[col].padEnd(width[col])).join(' | ').trimEnd();
  return [line(head), cols.map((col) => '-'.repeat(width[col])).join('-|-'), ...rows.map(line)].join('\n');
}

async function inParallel<T>(items: T[], limit: number, work: (item: T) => Promise<void>) {
  let next = 0;
  await Promise.all(
    Array.from({ length: limit }, async () => {
      while (next < items.length) await work(items[next++]);
    }),
  );
}

// ---------------------------------------------------------------------------

beforeAll(async () => {
  uploadsDir = mkdtempSync(join(tmpdir(), 'tenthmark-matrix-'));
  m = await startMoneyApp({ UPLOADS_DIR: uploadsDir });
  jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 120, g: 110, b: 100 } } }).jpeg().toBuffer();

  const [a, b, admin, x, y] = await Promise.all([
    createUser(db(), { displayName: 'Builder A' }),
    createUser(db(), { displayName: 'Builder B' }),
    createUser(db(), { role: 'admin', displayName: 'Admin' }),
    createShop(db(), { name: `Shop X ${hex()}` }, {}, { payouts: false }),
    createShop(db(), { name: `Shop Y ${hex()}` }, {}, { payouts: false }),
  ]);
  Object.assign(people, { builderA: a, builderB: b, admin, shopX: x.user, shopY: y.user });
  shopY = y.shop;
  // Builder B has a job of its own.
  await createJob(db(), people.builderB.id);

  // Shop X's payout account, through the stand-in's onboarding page as a person would.
  await completeOnboardingPage((await startPayoutOnboarding(app().paymentDeps, people.shopX)).url);
  shopX = await m.until('shop X payouts ready', async () => {
    const [row] = await db().select().from(shops).where(eq(shops.id, x.shop.id));
    return row.payoutsReadyAt ? row : undefined;
  }, 20_000);

  clients.anon = await newClient();
  await Promise.all((['builderA', 'builderB', 'shopX', 'shopY', 'admin'] as const).map(async (person) => (clients[person] = await signIn(people[person]))));
}, 120_000);

afterAll(async () => {
  await m?.close();
  if (uploadsDir) rmSync(uploadsDir, { recursive: true, force: true });
});

describe('authorization matrix', () => {
  it('has a row for every declared API route, and none for a route that is not declared', () => {
    // The declarations (server/api-routes.ts); tests/api/openapi.test.ts holds them equal to what the router serves.
    const served = apiRoutes.map((r) => `${r.method.toUpperCase()} ${r.path}`);
    const missing = served.filter((route) => !(route in matrix));
    const stale = Object.keys(matrix).filter((route) => !served.includes(route));
    const problems = [
      ...missing.map((route) => `no row for ${route}: add it to the matrix with the six expected statuses`),
      ...stale.map((route) => `a row for ${route}, which is not declared`),
    ];
    if (problems.length) throw new Error(`The authorization matrix does not match the declared routes:\n${problems.join('\n')}`);
    expect(served.length).toBeGreaterThan(90);
  });

  it('agrees with each declaration on who may call: signed out is 401 unless public, another role is 403', () => {
    const roleOf: Record<Person, string> = { builderA: 'builder', builderB: 'builder', shopX: 'shop', shopY: 'shop', admin: 'admin' };
    const problems: string[] = [];
    for (const route of apiRoutes) {
      const key = `${route.method.toUpperCase()} ${route.path}`;
      const row = matrix[key] as Row | undefined;
      if (!row) continue; // the test above reports it
      const roles = rolesOf(route.access);
      for (const statuses of [row.expect, ...(row.variants ?? []).map((variant) => variant.expect)]) {
        CALLERS.forEach((caller, index) => {
          const status = statuses[index];
          if (caller === 'anon') {
            if (route.access !== 'public' && status !== 401) problems.push(`${key}: declared ${route.access}, but signed out expects ${status}`);
          } else if (roles && !roles.includes(roleOf[caller] as (typeof roles)[number]) && status !== 403) {
            problems.push(`${key}: declared ${route.access}, but ${CALLER_NAMES[caller]} expects ${status}`);
          }
        });
      }
    }
    expect(problems).toEqual([]);
  });

  it('answers each of the six callers with exactly the status the table says, and every refusal as { error: { code, message } }', async () => {
    const cases = Object.entries(matrix).flatMap(([key, row]) => [
      { key, label: undefined as string | undefined, c: row as Case },
      ...(row.variants ?? []).map(({ label, ...variant }) => ({ key, label, c: { ...row, ...variant } as Case })),
    ]);
    const mismatches: Mismatch[] = [];
    const run = async ({ key, label, c }: (typeof cases)[number]) => {
      mismatches.push(...(await runCase(key, label, c)));
    };
    // Rows that must not overlap run as one task each group, started first; the rest six at a time.
    const groups = new Map<string, typeof cases>();
    for (const item of cases) if (item.c.serial) groups.set(item.c.serial, [...(groups.get(item.c.serial) ?? []), item]);
    const tasks = [
      ...[...groups.values()].map((group) => async () => {
        for (const item of group) await run(item);
      }),
      ...cases.filter((item) => !item.c.serial).map((item) => () => run(item)),
    ];
    await inParallel(tasks, 6, (task) => task());
    if (mismatches.length) {
      mismatches.sort((a, b) => a.route.localeCompare(b.route) || CALLERS.findIndex((k) => CALLER_NAMES[k] === a.caller) - CALLERS.findIndex((k) => CALLER_NAMES[k] === b.caller));
      throw new Error(`${mismatches.length} answer(s) differ from the authorization matrix:\n\n${table(mismatches)}\n`);
    }
  }, 240_000);
});
