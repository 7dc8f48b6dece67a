/**
 * The whole journey across three app instances, each a process of its own behind the
 * local reverse proxy (server/dev/cluster.ts), photos in the S3 stand-in: every request
 * goes to the proxy, which sends each to the next instance in turn. Then one instance
 * is killed (SIGKILL) and the two left carry the journey to its end, each scheduled
 * task, money move and e-mail happening once.
 */
import { randomBytes } from 'node:crypto';
import { and, eq, inArray } from 'drizzle-orm';
import sharp from 'sharp';
import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest';
import { createDb, createPool, type Database } from '../../server/db/client';
import { startCluster, type Cluster } from '../../server/dev/cluster';
import { ledgerEntries, mailOutbox, moneyMoves, notifications, scheduledTasks } from '../../server/db/schema';
import { acceptAsRead } from '../../shared/calc/conformance';
import type { InspectionView } from '../../shared/schemas/inspection';
import { createShop, jobInput, uniformRecordInput, uniqueEmail } from '../factories';
import { agentFor, signedIn, type ApiClient } from '../setup/api-session';
import { apiOf, jobInState, until, type Api } from '../setup/job-states';
import { confirmationLink } from '../setup/mail-links';
import { sdkFor, sendWebhooksTo, startTestStandIn, TEST_WEBHOOK_SECRET } from '../setup/payments';
import { connected, emit, next, socketFor } from '../setup/realtime';
import { storageSettings } from '../setup/storage';
import { createTestDatabase, testEnv } from '../setup/test-env';

let database: Awaited<ReturnType<typeof createTestDatabase>>;
let pay: Awaited<ReturnType<typeof startTestStandIn>>;
let pool: ReturnType<typeof createPool>;
let db: Database;
let cluster: Cluster;
const sockets: Socket[] = [];

beforeAll(async () => {
  database = await createTestDatabase();
  pool = createPool(database.url, 3);
  db = createDb(pool);
  pay = await startTestStandIn();
  cluster = await startCluster({
    count: 3,
    env: testEnv(database.url, {
      ...storageSettings(inject('s3Endpoint'), 's3'),
      STRIPE_API_URL: pay.standIn.url,
      STRIPE_WEBHOOK_SECRET: TEST_WEBHOOK_SECRET,
    }),
  });
  // The payment stand-in's webhooks come in through the proxy too, to whichever instance is next.
  await sendWebhooksTo(pay.standIn, cluster.url);
});
afterEach(() => {
  for (const socket of sockets.splice(0)) socket.disconnect();
});
afterAll(async () => {
  await cluster?.stop();
  await pay?.standIn.close();
  await pool?.end();
  await database?.drop();
});

const jpeg = () => sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 90, g: 95, b: 100 } } }).jpeg().toBuffer();
const clientId = () => randomBytes(8).toString('hex');

/** What the journey's steps hand on to the next (the tests of this file run in order). */
const journey = {} as {
  builderEmail: string;
  builder: ApiClient;
  shop: ApiClient;
  shopEmail: string;
  jobId: string;
  threadId: string;
  killed: string;
};

/** The same photo fetched as many times as there are instances: round robin sends each fetch to another one. */
async function fetchedFromEveryInstance(client: ApiClient, path: string) {
  const bodies: Buffer[] = [];
  for (let turn = 0; turn < cluster.instances.length; turn += 1) {
    const res = await client.get(path).buffer(true);
    expect(res.status).toBe(200);
    bodies.push(res.body as Buffer);
  }
  expect(new Set(bodies.map((body) => body.toString('base64'))).size).toBe(1);
  return bodies[0];
}

describe('the journey across three instances behind the proxy', () => {
  it('when a builder signs up through the proxy and confirms by mail, then the account works on every instance', async () => {
    const builder = await agentFor(cluster.url);
    const email = uniqueEmail('cluster-builder');
    const signup = await builder.post('/api/auth/signup', { displayName: 'Ines Halloran', email, password: 'a long enough password', role: 'builder', acceptTerms: true });
    expect(signup.status).toBe(201);
    // The confirmation mail goes out from whichever instance's outbox worker takes it first, once.
    const { token } = await confirmationLink(email);
    expect((await builder.post('/api/auth/verify-email', { token })).status).toBe(200);
    for (let turn = 0; turn < cluster.instances.length; turn += 1) {
      expect((await builder.get('/api/auth/me')).body.user).toMatchObject({ email, emailVerified: true });
    }
    journey.builder = builder;
    journey.builderEmail = email;
  });

  it('when the builder posts a job with photos, then every instance serves the photos from the object store', async () => {
    const { builder } = journey;
    const posted = await builder.post('/api/jobs', jobInput({ title: 'Cluster test: bore and hone a cast-iron V8' }));
    expect(posted.status).toBe(201);
    const jobId: string = posted.body.job.id;
    const uploaded = await builder.upload(`/api/jobs/${jobId}/photos`, 'photos', [
      { buffer: await jpeg(), name: 'block-front.jpg', mimeType: 'image/jpeg' },
      { buffer: await jpeg(), name: 'deck.jpg', mimeType: 'image/jpeg' },
    ]);
    expect(uploaded.status).toBe(201);
    expect((await builder.post(`/api/jobs/${jobId}/publish`)).status).toBe(200);
    const large = await fetchedFromEveryInstance(builder, uploaded.body.photos[0].largeUrl);
    expect((await sharp(large).metadata()).format).toBe('webp');
    journey.jobId = jobId;
  });

  it('when a shop bids, is awarded and the builder pays on the stand-in, then the webhook funds the job and the shop logs progress', async () => {
    const { user: shopUser } = await createShop(db, {}, {}, { payouts: false });
    const shop = await signedIn(cluster.url, shopUser);
    const made = await jobInState('inWork', { builder: apiOf(journey.builder), shop: apiOf(shop) }, { openJob: { id: journey.jobId } });
    expect(made.job.id).toBe(journey.jobId);
    const { job } = await apiOf(journey.builder)<{ job: { status: string } }>('GET', `/api/jobs/${journey.jobId}`);
    expect(job.status).toBe('in_work');
    journey.shop = shop;
    journey.shopEmail = shopUser.email;
  });

  it('when the shop sends a message with a photo through one instance, then the builder’s sockets on every instance hear it live, a long-polling one too', async () => {
    const { builder, shop, jobId } = journey;
    const shopApi: Api = apiOf(shop);
    const profile = await shopApi<{ shop: { id: string } }>('GET', '/api/shop-profile');
    const opened = await builder.post(`/api/jobs/${jobId}/threads`, { shopId: profile.shop.id });
    expect([200, 201]).toContain(opened.status);
    const threadId: string = opened.body.thread.id;

    // Three upgrades in a row: round robin puts one socket on each instance.
    const before = new Map(cluster.proxy.served);
    const listening = cluster.instances.map(() => socketFor(sockets, cluster, builder.cookie));
    await Promise.all(listening.map(connected));
    for (const instance of cluster.instances) expect(cluster.proxy.served.get(instance.id)).toBeGreaterThan(before.get(instance.id) ?? 0);
    // A client on long polling (where a network blocks websockets): each poll is a request of its own, kept on
    // one instance by the proxy's cookie (here the last instance's, as a first answer would have set it).
    const polling = connect(cluster.url, {
      transports: ['polling'],
      extraHeaders: { cookie: `${builder.cookie}; tenthmark_instance=${cluster.instances[2].id}` },
      reconnection: false,
      forceNew: true,
    });
    sockets.push(polling);
    listening.push(polling);
    await connected(polling);
    for (const socket of listening) expect(await emit(socket, 'thread:join', { threadId })).toMatchObject({ ok: true });

    const arriving = listening.map((socket) => next(socket, 'message:new'));
    const photo = await shop.upload(`/api/threads/${threadId}/photos`, 'photos', [{ buffer: await jpeg(), name: 'crack.jpg', mimeType: 'image/jpeg' }]);
    expect(photo.status).toBe(201);
    const sent = await shop.post(`/api/threads/${threadId}/messages`, { clientId: clientId(), body: 'Block is here; one photo of the deck.', photoIds: [photo.body.photos[0].id] });
    expect(sent.status).toBe(201);
    for (const received of await Promise.all(arriving)) {
      expect(received).toMatchObject({ id: sent.body.message.id, threadId, body: 'Block is here; one photo of the deck.' });
      expect(received.photos).toHaveLength(1);
    }
    await fetchedFromEveryInstance(builder, sent.body.message.photos[0].thumbUrl);
    journey.threadId = threadId;
  });

  it('when the shop submits its record and an instance is then killed, then the two left finish the journey: each task, transfer and e-mail once', async () => {
    const { builder, shop, jobId, builderEmail, shopEmail } = journey;
    expect((await shop.post(`/api/jobs/${jobId}/inspection`, uniformRecordInput())).status).toBe(201);
    const { versions, reviewDueAt: dueText } = (await builder.get(`/api/jobs/${jobId}/inspection`)).body as InspectionView;
    const reviewDueAt = new Date(dueText!);

    // Every instance has answered a share of the journey so far.
    for (const instance of cluster.instances) expect(cluster.proxy.served.get(instance.id) ?? 0).toBeGreaterThan(5);

    // The mail sent so far has gone (a kill during an SMTP send can send that one mail twice: the outbox is at-least-once there).
    const people = [builderEmail, shopEmail];
    await until('the outbox empty', async () => (await db.select().from(mailOutbox).where(and(inArray(mailOutbox.toAddress, people), eq(mailOutbox.status, 'pending')))).length === 0, 15_000);
    const killed = cluster.instances[1];
    await cluster.kill(killed.id);
    expect(killed.alive()).toBe(false);
    const left = cluster.instances.filter((instance) => instance.alive());
    const servedByKilled = cluster.proxy.served.get(killed.id);

    // The reminder falls due (a day before the window ends): both instances look for due tasks at once; one runs it.
    // (Other tasks fall due too, such as the hourly photo sweep: the reminder's own row says how often it ran.)
    const reminderKey = `review-reminder-${versions[0].id}`;
    await Promise.all(left.map((instance) => instance.runDue(new Date(reviewDueAt.getTime() - 60 * 60_000))));
    const [reminder] = await db.select().from(scheduledTasks).where(eq(scheduledTasks.key, reminderKey));
    expect(reminder).toMatchObject({ attempts: 1, lastError: null, doneAt: expect.any(Date) });

    // The first payout attempts fail at the provider (three: the SDK tries twice more), so the move is left to the money
    // workers of both instances, which may also race the acceptance's own attempt: the idempotency key and the claim of a
    // pending move keep it to one transfer and one release, whoever finishes it.
    await pay.standIn.control.failNextRequests(3, 500, '/transfers');
    const accepted = await builder.post(`/api/jobs/${jobId}/inspection/accept`, acceptAsRead(versions[0]));
    expect(accepted.status).toBe(200);
    await until('the payout done', async () => (await db.select().from(moneyMoves).where(eq(moneyMoves.jobId, jobId))).every((move) => move.status === 'done'), 30_000);
    await until('the job completed', async () => (await builder.get(`/api/jobs/${jobId}`)).body.job.status === 'completed', 15_000);
    await pay.standIn.control.failNextRequests(0);

    // The window ends: the task runs once across the instances (it finds the record accepted and does nothing more).
    await Promise.all(left.map((instance) => instance.runDue(new Date(reviewDueAt.getTime() + 60_000))));
    const tasks = await db.select().from(scheduledTasks).where(inArray(scheduledTasks.key, [reminderKey, `review-window-${versions[0].id}`]));
    expect(tasks).toHaveLength(2);
    for (const task of tasks) expect(task).toMatchObject({ attempts: 1, lastError: null, doneAt: expect.any(Date) });

    // One transfer at the provider, one release in the ledger.
    const transfers = await sdkFor(Number(new URL(pay.standIn.url).port)).transfers.list({ transfer_group: jobId });
    expect(transfers.data).toHaveLength(1);
    const released = await db.select().from(ledgerEntries).where(and(eq(ledgerEntries.jobId, jobId), eq(ledgerEntries.kind, 'released')));
    expect(released).toHaveLength(1);
    expect(released[0].reference).toBe(transfers.data[0].id);

    // One reminder notice and one reminder mail; every mail sent once, and maildev holds each once.
    expect(await db.select().from(notifications).where(and(eq(notifications.jobId, jobId), eq(notifications.kind, 'review_window_ending')))).toHaveLength(1);
    await until('the outbox sent', async () => (await db.select().from(mailOutbox).where(and(inArray(mailOutbox.toAddress, people), eq(mailOutbox.status, 'pending')))).length === 0, 15_000);
    const mails = await db.select().from(mailOutbox).where(inArray(mailOutbox.toAddress, people));
    expect(mails.filter((mail) => mail.template === 'review_reminder')).toHaveLength(1);
    for (const mail of mails) expect(mail).toMatchObject({ attempts: mail.status === 'skipped' ? 0 : 1, status: expect.stringMatching(/^(sent|skipped)$/) });
    const delivered = (await (await fetch(`${inject('maildevUrl')}/api/email`)).json()) as Array<{ subject: string; to: Array<{ address: string }> }>;
    for (const mail of mails.filter((one) => one.status === 'sent')) {
      const copies = delivered.filter((one) => one.subject === mail.subject && one.to.some((to) => to.address === mail.toAddress));
      const queued = mails.filter((one) => one.status === 'sent' && one.subject === mail.subject && one.toAddress === mail.toAddress);
      expect(copies.length, `${mail.template} to ${mail.toAddress}`).toBe(queued.length);
    }

    // After the kill, the proxy sent nothing more to the killed instance, and the two left answered.
    expect(cluster.proxy.served.get(killed.id)).toBe(servedByKilled);
    journey.killed = killed.id;
  });
});
