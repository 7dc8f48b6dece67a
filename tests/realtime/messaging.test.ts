import { randomBytes } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, afterEach, beforeAll, describe, expect, inject, it } from 'vitest';
import { createDb, createPool, type Database } from '../../server/db/client';
import { mailOutbox, messages } from '../../server/db/schema';
import { createOutboxWorker } from '../../server/lib/mail/outbox';
import { createTransport } from '../../server/lib/mail/transport';
import { sendDueDigests } from '../../server/modules/messages/digest';
import { startServer, type RunningServer } from '../../server/runtime';
import { bidInput, createJob, createShop, createUser } from '../factories';
import { createTestDatabase, testConfig } from '../setup/test-env';

let database: Awaited<ReturnType<typeof createTestDatabase>>;
let pool: ReturnType<typeof createPool>;
let db: Database;
let instanceA: RunningServer;
let instanceB: RunningServer;
const sockets: Socket[] = [];

beforeAll(async () => {
  database = await createTestDatabase();
  pool = createPool(database.url, 4);
  db = createDb(pool);
  const config = testConfig(database.url, { PORT: '0', RATE_LIMIT_MESSAGES_PER_10S: '20' });
  [instanceA, instanceB] = await Promise.all([startServer(config, { migrate: false }), startServer(config, { migrate: false })]);
});
afterEach(() => {
  for (const socket of sockets.splice(0)) socket.disconnect();
});
afterAll(async () => {
  await instanceA?.close();
  await instanceB?.close();
  await pool?.end();
  await database?.drop();
});

/** Signs in over HTTP and returns the session cookie and a CSRF token for it. */
async function session(server: RunningServer, user: { email: string; password: string }) {
  const first = await fetch(`${server.url}/api/auth/csrf`);
  const anon = first.headers.get('set-cookie')!.split(';')[0];
  const { csrfToken } = (await first.json()) as { csrfToken: string };
  const login = await fetch(`${server.url}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Cookie: anon, 'X-CSRF-Token': csrfToken },
    body: JSON.stringify({ email: user.email, password: user.password }),
  });
  expect(login.status).toBe(200);
  const body = (await login.json()) as { csrfToken: string };
  return { cookie: login.headers.get('set-cookie')!.split(';')[0], csrf: body.csrfToken };
}

async function post(server: RunningServer, auth: { cookie: string; csrf: string }, path: string, body: unknown) {
  const res = await fetch(`${server.url}${path}`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Cookie: auth.cookie, 'X-CSRF-Token': auth.csrf },
    body: JSON.stringify(body),
  });
  return { status: res.status, body: (await res.json().catch(() => ({}))) as Record<string, any> };
}

function socketFor(server: RunningServer, cookie?: string): Socket {
  const socket = connect(server.url, { transports: ['websocket'], extraHeaders: cookie ? { cookie } : {}, reconnection: false, forceNew: true });
  sockets.push(socket);
  return socket;
}

const connected = (socket: Socket) =>
  new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', reject);
  });

const emit = <T = any>(socket: Socket, event: string, payload: unknown) => socket.timeout(5_000).emitWithAck(event, payload) as Promise<T>;

const next = <T = any>(socket: Socket, event: string) =>
  new Promise<T>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`no ${event} within 5 s`)), 5_000);
    socket.once(event, (payload: T) => {
      clearTimeout(timer);
      resolve(payload);
    });
  });

/** A job with a bid from one shop, and the conversation between them opened by the builder. */
async function conversation() {
  const builder = await createUser(db);
  const job = await createJob(db, builder.id);
  const { user: shopUser, shop } = await createShop(db);
  const builderAuth = await session(instanceA, builder);
  const shopAuth = await session(instanceB, shopUser);
  expect((await post(instanceB, shopAuth, `/api/jobs/${job.id}/bids`, bidInput())).status).toBe(201);
  const opened = await post(instanceA, builderAuth, `/api/jobs/${job.id}/threads`, { shopId: shop.id });
  expect(opened.status).toBe(201);
  return { builder, shopUser, job, threadId: opened.body.thread.id as string, builderAuth, shopAuth };
}

const clientId = () => randomBytes(8).toString('hex');

describe('live messaging', () => {
  it('when a socket has no session, then the connection is refused', async () => {
    const socket = socketFor(instanceA);
    await expect(connected(socket)).rejects.toThrow('unauthenticated');
    const forged = socketFor(instanceA, 'tm.sid=s%3Anot-a-real-session.signature');
    await expect(connected(forged)).rejects.toThrow('unauthenticated');
  });

  it('when a user asks to join someone else’s conversation, then it is refused', async () => {
    const { threadId } = await conversation();
    const stranger = await createUser(db);
    const socket = socketFor(instanceA, (await session(instanceA, stranger)).cookie);
    await connected(socket);
    const answer = await emit(socket, 'thread:join', { threadId });
    expect(answer).toMatchObject({ ok: false, error: { code: 'not_found' } });
    const send = await emit(socket, 'message:send', { threadId, clientId: clientId(), body: 'hello?' });
    expect(send.ok).toBe(false);
    expect(await db.select().from(messages).where(eq(messages.threadId, threadId))).toHaveLength(0);
  });

  it('when the shop sends through instance B, then the builder connected to instance A gets it live, and it is stored', async () => {
    const { threadId, builderAuth, shopAuth, builder } = await conversation();
    const builderSocket = socketFor(instanceA, builderAuth.cookie);
    const shopSocket = socketFor(instanceB, shopAuth.cookie);
    await Promise.all([connected(builderSocket), connected(shopSocket)]);
    expect(await emit(builderSocket, 'thread:join', { threadId })).toMatchObject({ ok: true, canWrite: true });
    expect((await emit(shopSocket, 'thread:join', { threadId })).ok).toBe(true);

    const arriving = next(builderSocket, 'message:new');
    const unread = next(builderSocket, 'unread:changed');
    const typing = next(builderSocket, 'typing');
    await emit(shopSocket, 'typing', { threadId });
    expect(await typing).toMatchObject({ threadId });
    const sent = await emit(shopSocket, 'message:send', { threadId, clientId: clientId(), body: 'Cylinder 3 has a crack at the top.' });
    expect(sent).toMatchObject({ ok: true, duplicate: false });
    const received = await arriving;
    expect(received).toMatchObject({ id: sent.message.id, threadId, body: 'Cylinder 3 has a crack at the top.', author: { role: 'shop' } });
    expect(await unread).toEqual({ threadId });

    const stored = await db.select().from(messages).where(eq(messages.threadId, threadId));
    expect(stored.map((m) => m.body)).toEqual(['Cylinder 3 has a crack at the top.']);

    // The builder's unread count, then a read receipt that reaches the shop.
    const threads = await fetch(`${instanceA.url}/api/threads`, { headers: { Cookie: builderAuth.cookie } }).then((r) => r.json());
    expect(threads.threads.find((t: { id: string }) => t.id === threadId).unread).toBe(1);
    const receipt = next(shopSocket, 'read');
    expect((await emit(builderSocket, 'read', { threadId, messageId: sent.message.id })).ok).toBe(true);
    expect(await receipt).toEqual({ threadId, userId: builder.id, messageId: sent.message.id });
    const after = await fetch(`${instanceA.url}/api/threads`, { headers: { Cookie: builderAuth.cookie } }).then((r) => r.json());
    expect(after.threads.find((t: { id: string }) => t.id === threadId).unread).toBe(0);
  });

  it('when a message is resent after a reconnect with the same id, then it is stored once', async () => {
    const { threadId, shopAuth } = await conversation();
    const id = clientId();
    const first = socketFor(instanceB, shopAuth.cookie);
    await connected(first);
    const a = await emit(first, 'message:send', { threadId, clientId: id, body: 'Block arrived.' });
    first.disconnect();
    const second = socketFor(instanceA, shopAuth.cookie);
    await connected(second);
    const b = await emit(second, 'message:send', { threadId, clientId: id, body: 'Block arrived.' });
    expect(a).toMatchObject({ ok: true, duplicate: false });
    expect(b).toMatchObject({ ok: true, duplicate: true, message: { id: a.message.id } });
    expect(await db.select().from(messages).where(eq(messages.threadId, threadId))).toHaveLength(1);
  });

  it('when someone floods a conversation, then messages past the limit are refused with 429', async () => {
    const { threadId, builderAuth } = await conversation();
    const socket = socketFor(instanceA, builderAuth.cookie);
    await connected(socket);
    const answers = await Promise.all(Array.from({ length: 30 }, (_, i) => emit(socket, 'message:send', { threadId, clientId: clientId(), body: `flood ${i}` })));
    const refused = answers.filter((a) => !a.ok);
    expect(answers.filter((a) => a.ok)).toHaveLength(20);
    expect(refused).toHaveLength(10);
    expect(refused[0].error.code).toBe('too_many_attempts');
    expect(await db.select().from(messages).where(eq(messages.threadId, threadId))).toHaveLength(20);
  });

  it('when a message is too long or empty, then the sender is told why and nothing is stored', async () => {
    const { threadId, shopAuth } = await conversation();
    const socket = socketFor(instanceB, shopAuth.cookie);
    await connected(socket);
    const long = await emit(socket, 'message:send', { threadId, clientId: clientId(), body: 'x'.repeat(4001) });
    expect(long).toMatchObject({ ok: false, error: { code: 'invalid_input', fields: { body: 'Keep a message under 4,000 characters.' } } });
    const empty = await emit(socket, 'message:send', { threadId, clientId: clientId(), body: '   ' });
    expect(empty.error.fields.body).toBe('Write a message.');
  });

  it('when a job page is open and a bid is accepted, then the page hears of it; other shops’ threads become read-only', async () => {
    const { job, threadId, builderAuth, shopAuth } = await conversation();
    const other = await createShop(db);
    const otherAuth = await session(instanceA, other.user);
    const otherBid = await post(instanceA, otherAuth, `/api/jobs/${job.id}/bids`, bidInput());
    const otherThread = await post(instanceA, builderAuth, `/api/jobs/${job.id}/threads`, { shopId: other.shop.id });

    const watcher = socketFor(instanceB, shopAuth.cookie);
    await connected(watcher);
    expect((await emit(watcher, 'job:watch', { jobId: job.id })).ok).toBe(true);
    const change = next(watcher, 'job:changed');
    expect((await post(instanceA, builderAuth, `/api/bids/${otherBid.body.bid.id}/accept`, {})).status).toBe(200);
    expect(await change).toEqual({ jobId: job.id, change: 'bid_accepted' });

    // The losing shop's conversation is closed; the winner's goes on.
    const loser = await post(instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body: 'Still there?' });
    expect(loser.status).toBe(409);
    const winner = await post(instanceA, otherAuth, `/api/threads/${otherThread.body.thread.id}/messages`, { clientId: clientId(), body: 'Ship it Monday.' });
    expect(winner.status).toBe(201);

    const stranger = socketFor(instanceA, (await session(instanceA, await createUser(db))).cookie);
    await connected(stranger);
    expect((await emit(stranger, 'job:watch', { jobId: job.id })).ok).toBe(false);
  });

  it('when the history is paged, then every message comes back once, newest first', async () => {
    const { threadId, builderAuth } = await conversation();
    for (let i = 0; i < 7; i += 1) {
      expect((await post(instanceA, builderAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body: `note ${i}` })).status).toBe(201);
    }
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const url = `${instanceA.url}/api/threads/${threadId}/messages?limit=3${cursor ? `&before=${cursor}` : ''}`;
      const page = (await fetch(url, { headers: { Cookie: builderAuth.cookie } }).then((r) => r.json())) as { messages: Array<{ body: string }>; nextCursor: string | null };
      seen.push(...page.messages.map((m) => m.body));
      cursor = page.nextCursor;
    } while (cursor);
    expect(seen).toEqual(['note 6', 'note 5', 'note 4', 'note 3', 'note 2', 'note 1', 'note 0']);
  });

  it('when messages wait unread for ten minutes, then one digest per conversation arrives in maildev, once', async () => {
    const { threadId, shopAuth, builder } = await conversation();
    for (const body of ['First question', 'Second question', 'Third question']) {
      expect((await post(instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body })).status).toBe(201);
    }
    expect(await sendDueDigests({ db, appUrl: 'http://localhost' }, new Date())).toBe(0); // not ten minutes yet
    const later = new Date(Date.now() + 11 * 60_000);
    expect(await sendDueDigests({ db, appUrl: 'http://localhost' }, later)).toBeGreaterThanOrEqual(1);
    expect(await sendDueDigests({ db, appUrl: 'http://localhost' }, new Date(later.getTime() + 60_000))).toBe(0);

    const queued = await db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, builder.email), eq(mailOutbox.template, 'unread_digest')));
    expect(queued).toHaveLength(1);
    expect(queued[0].subject).toContain('3 messages');

    const transport = createTransport({ host: '127.0.0.1', port: inject('smtpPort'), secure: false });
    await createOutboxWorker({ db, transport, from: 'Tenthmark <no-reply@tenthmark.test>' }).processDue();
    transport.close();
    const deadline = Date.now() + 5_000;
    let arrived: Array<{ subject: string; to: Array<{ address: string }> }> = [];
    while (Date.now() < deadline) {
      const all = (await fetch(`${inject('maildevUrl')}/api/email`).then((r) => r.json())) as typeof arrived;
      arrived = all.filter((m) => m.to.some((t) => t.address === builder.email) && m.subject.includes('3 messages'));
      if (arrived.length) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(arrived).toHaveLength(1);
  });
});
