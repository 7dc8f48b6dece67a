/**
 * Live connections end with the session behind them, on every app instance:
 * sign-out closes that session's sockets only, a password reset or change
 * closes the person's others; a socket whose session row is gone is refused
 * and closed at its next request; a losing bidder stops following the job
 * after the award; a page of another site cannot open a socket at all.
 */
import { randomBytes } from 'node:crypto';
import { and, desc, eq, sql } from 'drizzle-orm';
import type { Socket } from 'socket.io-client';
import { describe, expect, it } from 'vitest';
import { mailOutbox, messages, threadReads } from '../../server/db/schema';
import type { RunningServer } from '../../server/runtime';
import { bidInput, createJob, createShop, createUser, TEST_PASSWORD } from '../factories';
import { connected, emit, next, post, session, twoInstances, visitor, type Auth } from '../setup/realtime';

const live = twoInstances();
const socketFor = live.socketFor;

const me = async (server: RunningServer, auth: Auth) => (await fetch(`${server.url}/api/auth/me`, { headers: { Cookie: auth.cookie } })).status;

/** The reason the server gave for closing the socket, within five seconds. */
const disconnected = (socket: Socket) =>
  new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('still connected after 5 s')), 5_000);
    socket.once('disconnect', (reason) => {
      clearTimeout(timer);
      resolve(reason);
    });
  });

/** Collects every `event` a socket hears from now on. */
function heard<T = any>(socket: Socket, event: string): T[] {
  const seen: T[] = [];
  socket.on(event, (payload: T) => seen.push(payload));
  return seen;
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** A point where the server is held: `reached` when it gets there (awaited as `atGate`), on again once `release`d (awaited as `gate`). */
function holdPoint() {
  let reached!: () => void;
  let release!: () => void;
  const atGate = new Promise<void>((resolve) => (reached = resolve));
  const gate = new Promise<void>((resolve) => (release = resolve));
  return { atGate, reached, gate, release };
}
const clientId = () => randomBytes(8).toString('hex');

/** A job with a bid from one shop and the conversation the shop opened; the builder signed in. */
async function conversation() {
  const builder = await createUser(live.db);
  const job = await createJob(live.db, builder.id);
  const { user: shopUser } = await createShop(live.db);
  const shopAuth = await session(live.instanceB, shopUser);
  const opened = await post(live.instanceB, shopAuth, `/api/jobs/${job.id}/threads`);
  expect(opened.status).toBe(201);
  return { builder, shopUser, job, threadId: opened.body.thread.id as string, shopAuth };
}

/** The token of the newest reset mail queued for an address. */
async function latestResetToken(email: string) {
  const [mail] = await live.db
    .select()
    .from(mailOutbox)
    .where(and(eq(mailOutbox.toAddress, email), eq(mailOutbox.template, 'reset_password')))
    .orderBy(desc(mailOutbox.createdAt))
    .limit(1);
  return /token=([A-Za-z0-9_-]+)/.exec(mail.textBody)![1];
}

describe('sockets end with the session', () => {
  it('when a person signs out, then that session’s socket is closed on the other instance, and their other session stays connected', async () => {
    const { builder, threadId } = await conversation();
    const leaving = await session(live.instanceA, builder);
    const staying = await session(live.instanceB, builder);
    const leavingSocket = socketFor(live.instanceB, leaving.cookie);
    const stayingSocket = socketFor(live.instanceA, staying.cookie);
    await Promise.all([connected(leavingSocket), connected(stayingSocket)]);
    expect((await emit(leavingSocket, 'thread:join', { threadId })).ok).toBe(true);

    const closed = disconnected(leavingSocket);
    const stayingClosed = heard(stayingSocket, 'disconnect');
    const out = await fetch(`${live.instanceA.url}/api/auth/logout`, { method: 'POST', headers: { Cookie: leaving.cookie, 'X-CSRF-Token': leaving.csrf } });
    expect(out.status).toBe(204);
    expect(await closed).toBe('io server disconnect');

    // The other session goes on, live and over HTTP.
    await pause(300);
    expect(stayingClosed).toEqual([]);
    expect(stayingSocket.connected).toBe(true);
    expect(await emit(stayingSocket, 'message:send', { threadId, clientId: clientId(), body: 'Still here on the other device.' })).toMatchObject({ ok: true });
    expect(await me(live.instanceB, staying)).toBe(200);
    expect(await me(live.instanceA, leaving)).toBe(401);
    // The old cookie opens no new socket either.
    await expect(connected(socketFor(live.instanceA, leaving.cookie))).rejects.toThrow('unauthenticated');
  });

  it('when the session row is gone, then the socket’s next message is refused, nothing is stored, and the socket is closed', async () => {
    const { shopUser, threadId, shopAuth } = await conversation();
    const socket = socketFor(live.instanceA, shopAuth.cookie);
    await connected(socket);
    // In the conversation first, so the session's own check when the socket came in is behind it.
    expect((await emit(socket, 'thread:join', { threadId })).ok).toBe(true);
    // Ended behind the app's back (expired, or deleted by hand): no disconnect was sent.
    await live.db.execute(sql`DELETE FROM sessions WHERE sess -> 'passport' ->> 'user' = ${shopUser.id}`);

    const closed = disconnected(socket);
    const answer = await emit(socket, 'message:send', { threadId, clientId: clientId(), body: 'From a session that has ended.' });
    expect(answer).toMatchObject({ ok: false, error: { code: 'unauthenticated' } });
    expect(await closed).toBe('io server disconnect');
    expect(await live.db.select().from(messages).where(eq(messages.threadId, threadId))).toHaveLength(0);
  });

  it('when the session row is gone, then marking a message read and typing are refused too, and the read mark does not move', async () => {
    const { builder, shopUser, threadId, shopAuth } = await conversation();
    const builderAuth = await session(live.instanceB, builder);
    const sent = await post(live.instanceB, builderAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body: 'Is the block still on the stand?' });
    expect(sent.status).toBe(201);
    const messageId: string = sent.body.message.id;
    const builderSocket = socketFor(live.instanceB, builderAuth.cookie);
    // Two sockets of the shop's session: each is closed at its first refusal.
    const reading = socketFor(live.instanceA, shopAuth.cookie);
    const typing = socketFor(live.instanceB, shopAuth.cookie);
    await Promise.all([connected(builderSocket), connected(reading), connected(typing)]);
    for (const socket of [builderSocket, reading, typing]) expect((await emit(socket, 'thread:join', { threadId })).ok).toBe(true);
    const typingHeard = heard(builderSocket, 'typing');
    const readHeard = heard(builderSocket, 'read');
    await live.db.execute(sql`DELETE FROM sessions WHERE sess -> 'passport' ->> 'user' = ${shopUser.id}`);

    const closed = Promise.all([disconnected(reading), disconnected(typing)]);
    expect(await emit(reading, 'read', { threadId, messageId })).toMatchObject({ ok: false, error: { code: 'unauthenticated' } });
    expect(await emit(typing, 'typing', { threadId })).toMatchObject({ ok: false, error: { code: 'unauthenticated' } });
    expect(await closed).toEqual(['io server disconnect', 'io server disconnect']);
    await pause(300);
    expect([...typingHeard, ...readHeard]).toEqual([]);
    const marks = await live.db.select().from(threadReads).where(and(eq(threadReads.threadId, threadId), eq(threadReads.userId, shopUser.id)));
    expect(marks.filter((mark) => mark.lastReadMessageId === messageId)).toEqual([]);
  });

  it('when the password is reset by mail, then every socket of that person is closed, on both instances', async () => {
    const { builder } = await conversation();
    const [one, two] = [await session(live.instanceA, builder), await session(live.instanceB, builder)];
    const socketOne = socketFor(live.instanceA, one.cookie);
    const socketTwo = socketFor(live.instanceB, two.cookie);
    await Promise.all([connected(socketOne), connected(socketTwo)]);
    const closed = Promise.all([disconnected(socketOne), disconnected(socketTwo)]);

    const anon = await visitor(live.instanceB);
    expect((await post(live.instanceB, anon, '/api/auth/password-reset/request', { email: builder.email })).status).toBe(202);
    const token = await latestResetToken(builder.email);
    expect((await post(live.instanceB, anon, '/api/auth/password-reset/confirm', { token, password: 'a reset new password' })).status).toBe(200);

    expect(await closed).toEqual(['io server disconnect', 'io server disconnect']);
    expect(await me(live.instanceA, one)).toBe(401);
  });

  it('when the password is changed, then the other sessions and their sockets end, this one goes on, and an outstanding reset link dies', async () => {
    const { shopUser, threadId } = await conversation();
    const here = await session(live.instanceA, shopUser);
    const elsewhere = await session(live.instanceB, shopUser);
    const hereSocket = socketFor(live.instanceB, here.cookie);
    const elsewhereSocket = socketFor(live.instanceA, elsewhere.cookie);
    await Promise.all([connected(hereSocket), connected(elsewhereSocket)]);
    const anon = await visitor(live.instanceA);
    expect((await post(live.instanceA, anon, '/api/auth/password-reset/request', { email: shopUser.email })).status).toBe(202);
    const outstanding = await latestResetToken(shopUser.email);

    const wrong = await post(live.instanceA, here, '/api/auth/password', { currentPassword: 'not my password', newPassword: 'a changed password' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error).toMatchObject({ code: 'wrong_password', fields: { currentPassword: expect.any(String) } });
    const weak = await post(live.instanceA, here, '/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.fields.newPassword).toBe('Use at least 10 characters.');
    expect(elsewhereSocket.connected).toBe(true);

    const closed = disconnected(elsewhereSocket);
    const hereClosed = heard(hereSocket, 'disconnect');
    const changed = await post(live.instanceA, here, '/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: 'a changed password' });
    expect(changed).toEqual({ status: 200, body: { changed: true } });
    expect(await closed).toBe('io server disconnect');

    await pause(300);
    expect(hereClosed).toEqual([]);
    expect(await emit(hereSocket, 'message:send', { threadId, clientId: clientId(), body: 'Changed my password, still here.' })).toMatchObject({ ok: true });
    expect(await me(live.instanceA, here)).toBe(200);
    expect(await me(live.instanceB, elsewhere)).toBe(401);
    await expect(connected(socketFor(live.instanceB, elsewhere.cookie))).rejects.toThrow('unauthenticated');

    const stale = await post(live.instanceB, anon, '/api/auth/password-reset/confirm', { token: outstanding, password: 'an attacker password' });
    expect(stale.status).toBe(400);
    expect(stale.body.error.code).toBe('link_expired');
    expect((await session(live.instanceB, { email: shopUser.email, password: 'a changed password' })).cookie).toBeTruthy();
    const mails = await live.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, shopUser.email), eq(mailOutbox.template, 'password_changed')));
    expect(mails).toHaveLength(1);
  });

  it('when the password changes while a socket of another session is being let in, then that socket is closed as soon as it is in', async () => {
    const user = await createUser(live.db);
    const here = await session(live.instanceB, user);
    const elsewhere = await session(live.instanceA, user);
    // Hold the next connection on instance A after its session was read and before it joins its rooms.
    const { atGate, reached, gate, release } = holdPoint();
    let holding = true;
    live.instanceA.io.use((_socket, next) => {
      if (!holding) return next();
      holding = false;
      reached();
      void gate.then(() => next());
    });

    const socket = socketFor(live.instanceA, elsewhere.cookie);
    await atGate;
    const changed = await post(live.instanceB, here, '/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: 'changed while it knocked' });
    expect(changed.status).toBe(200);
    await pause(300); // the sign-out has reached instance A, and found no socket of that session in its rooms yet
    const closed = disconnected(socket);
    release();
    expect(await closed).toBe('io server disconnect');
  });

  it('when nobody is signed in, then changing a password is 401', async () => {
    const anon = await visitor(live.instanceA);
    const res = await post(live.instanceA, anon, '/api/auth/password', { currentPassword: TEST_PASSWORD, newPassword: 'a changed password' });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });
});

describe('a job’s live room after the award', () => {
  it('when a bid is accepted, then the losing bidder hears the award and nothing after it; the winner goes on hearing', async () => {
    const builder = await createUser(live.db);
    const job = await createJob(live.db, builder.id);
    const loser = await createShop(live.db);
    const winner = await createShop(live.db);
    const looker = await createShop(live.db);
    const builderAuth = await session(live.instanceA, builder);
    const loserAuth = await session(live.instanceB, loser.user);
    const winnerAuth = await session(live.instanceA, winner.user);
    expect((await post(live.instanceB, loserAuth, `/api/jobs/${job.id}/bids`, bidInput())).status).toBe(201);
    const winning = await post(live.instanceA, winnerAuth, `/api/jobs/${job.id}/bids`, bidInput());
    expect(winning.status).toBe(201);

    // The losing bidder on instance B, the winner and a shop that only looked on instance A.
    const lookerAuth = await session(live.instanceA, looker.user);
    const loserSocket = socketFor(live.instanceB, loserAuth.cookie);
    const winnerSocket = socketFor(live.instanceA, winnerAuth.cookie);
    const lookerSocket = socketFor(live.instanceA, lookerAuth.cookie);
    await Promise.all([connected(loserSocket), connected(winnerSocket), connected(lookerSocket)]);
    for (const socket of [loserSocket, winnerSocket, lookerSocket]) expect((await emit(socket, 'job:watch', { jobId: job.id })).ok).toBe(true);
    const loserHeard = heard(loserSocket, 'job:changed');
    const lookerHeard = heard(lookerSocket, 'job:changed');

    const awarded = next(winnerSocket, 'job:changed');
    expect((await post(live.instanceA, builderAuth, `/api/bids/${winning.body.bid.id}/accept`)).status).toBe(200);
    expect(await awarded).toEqual({ jobId: job.id, change: 'bid_accepted' });

    // The next change to the job reaches the winner only.
    const cancelled = next(winnerSocket, 'job:changed');
    expect((await post(live.instanceA, builderAuth, `/api/jobs/${job.id}/cancel`)).status).toBe(200);
    expect(await cancelled).toEqual({ jobId: job.id, change: 'job_cancelled' });
    await pause(300);
    expect(loserHeard).toEqual([{ jobId: job.id, change: 'bid_accepted' }]);
    expect(lookerHeard).toEqual([{ jobId: job.id, change: 'bid_accepted' }]);

    // Nor can the losing bidder join again, though it may still read the job and its own bid.
    expect(await emit(loserSocket, 'job:watch', { jobId: job.id })).toMatchObject({ ok: false, error: { code: 'forbidden' } });
    expect((await fetch(`${live.instanceB.url}/api/jobs/${job.id}`, { headers: { Cookie: loserAuth.cookie } })).status).toBe(200);
  });
});

describe('a job’s live room while the award is made', () => {
  it('when a shop starts following the job just as another shop’s bid is accepted, then it does not stay in the room', async () => {
    const builder = await createUser(live.db);
    const job = await createJob(live.db, builder.id);
    const late = await createShop(live.db);
    const winner = await createShop(live.db);
    const builderAuth = await session(live.instanceA, builder);
    const winnerAuth = await session(live.instanceA, winner.user);
    const winning = await post(live.instanceA, winnerAuth, `/api/jobs/${job.id}/bids`, bidInput());
    expect(winning.status).toBe(201);

    // Hold the late shop's join of the job's room on instance B until the award has gone out.
    const { atGate, reached, gate, release } = holdPoint();
    live.instanceB.io.use((socket, next) => {
      if ((socket.data.user as { id: string } | undefined)?.id === late.user.id) {
        const join = socket.join.bind(socket);
        socket.join = ((room: string | string[]) => {
          if (room !== `job:${job.id}`) return join(room);
          reached();
          return gate.then(() => join(room));
        }) as typeof socket.join;
      }
      next();
    });
    const lateSocket = socketFor(live.instanceB, (await session(live.instanceB, late.user)).cookie);
    const winnerSocket = socketFor(live.instanceA, winnerAuth.cookie);
    await Promise.all([connected(lateSocket), connected(winnerSocket)]);
    expect((await emit(winnerSocket, 'job:watch', { jobId: job.id })).ok).toBe(true);
    const lateHeard = heard(lateSocket, 'job:changed');

    const watching = emit(lateSocket, 'job:watch', { jobId: job.id });
    await atGate;
    const awarded = next(winnerSocket, 'job:changed');
    expect((await post(live.instanceA, builderAuth, `/api/bids/${winning.body.bid.id}/accept`)).status).toBe(200);
    await awarded;
    await pause(300); // the room change has reached instance B, before the late socket is in the room
    release();
    expect(await watching).toMatchObject({ ok: false, error: { code: 'forbidden' } });

    const cancelled = next(winnerSocket, 'job:changed');
    expect((await post(live.instanceA, builderAuth, `/api/jobs/${job.id}/cancel`)).status).toBe(200);
    expect(await cancelled).toEqual({ jobId: job.id, change: 'job_cancelled' });
    await pause(300);
    expect(lateHeard).toEqual([]);
  });
});

describe('socket origin', () => {
  it('when a page of another site opens a socket with the cookie, then it is refused; the app’s own origin connects', async () => {
    const user = await createUser(live.db);
    const auth = await session(live.instanceA, user);
    const foreign = socketFor(live.instanceA, auth.cookie, 'https://elsewhere.example');
    await expect(connected(foreign)).rejects.toThrow();
    const lookalike = socketFor(live.instanceB, auth.cookie, `${new URL(live.config.appUrl).origin}.elsewhere.example`);
    await expect(connected(lookalike)).rejects.toThrow();
    // The same host on another port is another origin (another app could be listening there).
    const app = new URL(live.config.appUrl);
    const otherPort = socketFor(live.instanceA, auth.cookie, `${app.protocol}//${app.hostname}:${Number(app.port || 80) + 1}`);
    await expect(connected(otherPort)).rejects.toThrow();

    const own = socketFor(live.instanceA, auth.cookie, new URL(live.config.appUrl).origin);
    await connected(own);
    expect(own.connected).toBe(true);
  });
});
