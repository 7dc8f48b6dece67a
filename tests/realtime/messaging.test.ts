import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { describe, expect, inject, it } from 'vitest';
import { mailOutbox, messagePhotos, messages } from '../../server/db/schema';
import { createOutboxWorker } from '../../server/lib/mail/outbox';
import { createTransport } from '../../server/lib/mail/transport';
import { sendDueDigests } from '../../server/modules/messages/digest';
import type { RunningServer } from '../../server/runtime';
import { bidInput, createJob, createShop, createUser } from '../factories';
import { connected, emit, next, post, session, twoInstances } from '../setup/realtime';
import { storedKeys } from '../setup/storage';

const live = twoInstances({ RATE_LIMIT_MESSAGES_PER_10S: '20' });
const socketFor = live.socketFor;

/** A job with a bid from one shop, and the conversation between them opened by the builder. */
async function conversation() {
  const builder = await createUser(live.db);
  const job = await createJob(live.db, builder.id);
  const { user: shopUser, shop } = await createShop(live.db);
  const builderAuth = await session(live.instanceA, builder);
  const shopAuth = await session(live.instanceB, shopUser);
  expect((await post(live.instanceB, shopAuth, `/api/jobs/${job.id}/bids`, bidInput())).status).toBe(201);
  const opened = await post(live.instanceA, builderAuth, `/api/jobs/${job.id}/threads`, { shopId: shop.id });
  expect(opened.status).toBe(201);
  return { builder, shopUser, job, threadId: opened.body.thread.id as string, builderAuth, shopAuth };
}

const clientId = () => randomBytes(8).toString('hex');

describe('live messaging', () => {
  it('when a socket has no session, then the connection is refused', async () => {
    const socket = socketFor(live.instanceA);
    await expect(connected(socket)).rejects.toThrow('unauthenticated');
    const forged = socketFor(live.instanceA, 'tm.sid=s%3Anot-a-real-session.signature');
    await expect(connected(forged)).rejects.toThrow('unauthenticated');
  });

  it('when an event’s payload nests 1,000 levels deep, then it is refused without being acted on; an oversized frame closes the socket', async () => {
    const { threadId, builderAuth } = await conversation();
    const socket = socketFor(live.instanceA, builderAuth.cookie);
    await connected(socket);
    // 1,000 levels: socket.io's own client recurses over a payload and cannot send much deeper.
    const deep = JSON.parse('{"a":'.repeat(1_000) + '1' + '}'.repeat(1_000)) as unknown;
    for (const [event, payload] of [
      ['message:send', { threadId, clientId: clientId(), body: 'Deep but otherwise valid.', extra: deep }],
      ['thread:join', { threadId, extra: deep }],
      ['read', deep],
    ] as const) {
      const answer = await emit(socket, event, payload);
      expect(answer, event).toEqual({ ok: false, error: { code: 'too_deep', message: expect.any(String) } });
    }
    expect(await live.db.select().from(messages).where(eq(messages.threadId, threadId))).toHaveLength(0);
    // A frame far beyond any message (4,000 characters) is not read at all: the connection closes.
    const closed = new Promise<string>((resolve) => socket.once('disconnect', resolve));
    socket.emit('message:send', { threadId, clientId: clientId(), body: 'x'.repeat(300_000) });
    expect(await closed).toMatch(/transport (close|error)/);
  });

  it('when a user asks to join someone else’s conversation, then it is refused', async () => {
    const { threadId } = await conversation();
    const stranger = await createUser(live.db);
    const socket = socketFor(live.instanceA, (await session(live.instanceA, stranger)).cookie);
    await connected(socket);
    const answer = await emit(socket, 'thread:join', { threadId });
    expect(answer).toMatchObject({ ok: false, error: { code: 'not_found' } });
    const send = await emit(socket, 'message:send', { threadId, clientId: clientId(), body: 'hello?' });
    expect(send.ok).toBe(false);
    expect(await live.db.select().from(messages).where(eq(messages.threadId, threadId))).toHaveLength(0);
  });

  it('when the shop sends through instance B, then the builder connected to instance A gets it live, and it is stored', async () => {
    const { threadId, builderAuth, shopAuth, builder } = await conversation();
    const builderSocket = socketFor(live.instanceA, builderAuth.cookie);
    // The builder's other page (say, the home page), not showing the conversation.
    const builderElsewhere = socketFor(live.instanceA, builderAuth.cookie);
    const shopSocket = socketFor(live.instanceB, shopAuth.cookie);
    await Promise.all([connected(builderSocket), connected(builderElsewhere), connected(shopSocket)]);
    expect(await emit(builderSocket, 'thread:join', { threadId })).toMatchObject({ ok: true, canWrite: true });
    expect((await emit(shopSocket, 'thread:join', { threadId })).ok).toBe(true);

    const arriving = next(builderSocket, 'message:new');
    const unread = next(builderElsewhere, 'unread:changed');
    let signalsToOpenPage = 0;
    builderSocket.on('unread:changed', () => (signalsToOpenPage += 1));
    const typing = next(builderSocket, 'typing');
    await emit(shopSocket, 'typing', { threadId });
    expect(await typing).toMatchObject({ threadId });
    const sent = await emit(shopSocket, 'message:send', { threadId, clientId: clientId(), body: 'Cylinder 3 has a crack at the top.' });
    expect(sent).toMatchObject({ ok: true, duplicate: false });
    const received = await arriving;
    expect(received).toMatchObject({ id: sent.message.id, threadId, body: 'Cylinder 3 has a crack at the top.', author: { role: 'shop' } });
    expect(await unread).toEqual({ threadId });
    // The open page learnt everything from the message: publications arrive in order, so once the
    // shop's next typing signal is here, an unread signal sent with the message would be here too.
    const typingAgain = next(builderSocket, 'typing');
    await emit(shopSocket, 'typing', { threadId });
    await typingAgain;
    expect(signalsToOpenPage).toBe(0);

    const stored = await live.db.select().from(messages).where(eq(messages.threadId, threadId));
    expect(stored.map((m) => m.body)).toEqual(['Cylinder 3 has a crack at the top.']);

    // The builder's unread count, then a read receipt that reaches the shop.
    const threads = await fetch(`${live.instanceA.url}/api/threads`, { headers: { Cookie: builderAuth.cookie } }).then((r) => r.json());
    expect(threads.threads.find((t: { id: string }) => t.id === threadId).unread).toBe(1);
    const receipt = next(shopSocket, 'read');
    expect((await emit(builderSocket, 'read', { threadId, messageId: sent.message.id })).ok).toBe(true);
    expect(await receipt).toEqual({ threadId, userId: builder.id, messageId: sent.message.id });
    const after = await fetch(`${live.instanceA.url}/api/threads`, { headers: { Cookie: builderAuth.cookie } }).then((r) => r.json());
    expect(after.threads.find((t: { id: string }) => t.id === threadId).unread).toBe(0);
  });

  it('when a sender reuses one message id in another conversation, then it is refused there (client_id_reused) and nothing is stored; in its own conversation it is the same message', async () => {
    const { builder, shopUser, threadId, builderAuth } = await conversation();
    const otherJob = await createJob(live.db, builder.id);
    const shopAuth = await session(live.instanceB, shopUser);
    expect((await post(live.instanceB, shopAuth, `/api/jobs/${otherJob.id}/bids`, bidInput())).status).toBe(201);
    const shopId = (await live.db.query.shops.findFirst({ where: (shops, { eq: is }) => is(shops.userId, shopUser.id) }))!.id;
    const other = await post(live.instanceA, builderAuth, `/api/jobs/${otherJob.id}/threads`, { shopId });
    expect(other.status).toBe(201);
    const socket = socketFor(live.instanceA, builderAuth.cookie);
    await connected(socket);
    const id = clientId();
    const first = await emit(socket, 'message:send', { threadId, clientId: id, body: 'Heads go out Monday.' });
    expect(first).toMatchObject({ ok: true, duplicate: false });
    const elsewhere = await emit(socket, 'message:send', { threadId: other.body.thread.id, clientId: id, body: 'Something else.' });
    expect(elsewhere).toMatchObject({ ok: false, error: { code: 'client_id_reused' } });
    expect(await live.db.select().from(messages).where(eq(messages.threadId, other.body.thread.id))).toHaveLength(0);
    const again = await emit(socket, 'message:send', { threadId, clientId: id, body: 'Heads go out Monday.' });
    expect(again).toMatchObject({ ok: true, duplicate: true, message: { id: first.message.id, createdAt: first.message.createdAt, author: { id: builder.id } } });
  });

  it('when a message is resent after a reconnect with the same id, then it is stored once', async () => {
    const { threadId, shopAuth } = await conversation();
    const id = clientId();
    const first = socketFor(live.instanceB, shopAuth.cookie);
    await connected(first);
    const a = await emit(first, 'message:send', { threadId, clientId: id, body: 'Block arrived.' });
    first.disconnect();
    const second = socketFor(live.instanceA, shopAuth.cookie);
    await connected(second);
    const b = await emit(second, 'message:send', { threadId, clientId: id, body: 'Block arrived.' });
    expect(a).toMatchObject({ ok: true, duplicate: false });
    expect(b).toMatchObject({ ok: true, duplicate: true, message: { id: a.message.id } });
    expect(await live.db.select().from(messages).where(eq(messages.threadId, threadId))).toHaveLength(1);
  });

  it('when someone floods a conversation, then messages past the limit are refused with 429', async () => {
    const { threadId, builderAuth } = await conversation();
    const socket = socketFor(live.instanceA, builderAuth.cookie);
    await connected(socket);
    const answers = await Promise.all(Array.from({ length: 30 }, (_, i) => emit(socket, 'message:send', { threadId, clientId: clientId(), body: `flood ${i}` })));
    const refused = answers.filter((a) => !a.ok);
    expect(answers.filter((a) => a.ok)).toHaveLength(20);
    expect(refused).toHaveLength(10);
    expect(refused[0].error.code).toBe('too_many_attempts');
    expect(await live.db.select().from(messages).where(eq(messages.threadId, threadId))).toHaveLength(20);
  });

  it('when a message is too long or empty, then the sender is told why and nothing is stored', async () => {
    const { threadId, shopAuth } = await conversation();
    const socket = socketFor(live.instanceB, shopAuth.cookie);
    await connected(socket);
    const long = await emit(socket, 'message:send', { threadId, clientId: clientId(), body: 'x'.repeat(4001) });
    expect(long).toMatchObject({ ok: false, error: { code: 'invalid_input', fields: { body: 'Keep a message under 4,000 characters.' } } });
    const empty = await emit(socket, 'message:send', { threadId, clientId: clientId(), body: '   ' });
    expect(empty.error.fields.body).toBe('Write a message or add a photo.');
  });

  it('when a job page is open and a bid is accepted, then the page hears of it; other shops’ threads become read-only', async () => {
    const { job, threadId, builderAuth, shopAuth } = await conversation();
    const other = await createShop(live.db);
    const otherAuth = await session(live.instanceA, other.user);
    const otherBid = await post(live.instanceA, otherAuth, `/api/jobs/${job.id}/bids`, bidInput());
    const otherThread = await post(live.instanceA, builderAuth, `/api/jobs/${job.id}/threads`, { shopId: other.shop.id });

    const watcher = socketFor(live.instanceB, shopAuth.cookie);
    await connected(watcher);
    expect((await emit(watcher, 'job:watch', { jobId: job.id })).ok).toBe(true);
    const change = next(watcher, 'job:changed');
    expect((await post(live.instanceA, builderAuth, `/api/bids/${otherBid.body.bid.id}/accept`, {})).status).toBe(200);
    expect(await change).toEqual({ jobId: job.id, change: 'bid_accepted' });

    // The losing shop's conversation is closed; the winner's goes on.
    const loser = await post(live.instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body: 'Still there?' });
    expect(loser.status).toBe(409);
    const winner = await post(live.instanceA, otherAuth, `/api/threads/${otherThread.body.thread.id}/messages`, { clientId: clientId(), body: 'Ship it Monday.' });
    expect(winner.status).toBe(201);

    const stranger = socketFor(live.instanceA, (await session(live.instanceA, await createUser(live.db))).cookie);
    await connected(stranger);
    expect((await emit(stranger, 'job:watch', { jobId: job.id })).ok).toBe(false);
  });

  it('when the history is paged, then every message comes back once, newest first', async () => {
    const { threadId, builderAuth } = await conversation();
    for (let i = 0; i < 7; i += 1) {
      expect((await post(live.instanceA, builderAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body: `note ${i}` })).status).toBe(201);
    }
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const url = `${live.instanceA.url}/api/threads/${threadId}/messages?limit=3${cursor ? `&before=${cursor}` : ''}`;
      const page = (await fetch(url, { headers: { Cookie: builderAuth.cookie } }).then((r) => r.json())) as { messages: Array<{ body: string }>; nextCursor: string | null };
      seen.push(...page.messages.map((m) => m.body));
      cursor = page.nextCursor;
    } while (cursor);
    expect(seen).toEqual(['note 6', 'note 5', 'note 4', 'note 3', 'note 2', 'note 1', 'note 0']);
  });

  it('when messages wait unread for ten minutes, then one digest per conversation arrives in maildev, once', async () => {
    const { threadId, shopAuth, builder } = await conversation();
    for (const body of ['First question', 'Second question', 'Third question']) {
      expect((await post(live.instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body })).status).toBe(201);
    }
    expect(await sendDueDigests({ db: live.db, appUrl: 'http://localhost' }, new Date())).toBe(0); // not ten minutes yet
    const later = new Date(Date.now() + 11 * 60_000);
    expect(await sendDueDigests({ db: live.db, appUrl: 'http://localhost' }, later)).toBeGreaterThanOrEqual(1);
    expect(await sendDueDigests({ db: live.db, appUrl: 'http://localhost' }, new Date(later.getTime() + 60_000))).toBe(0);

    const queued = await live.db.select().from(mailOutbox).where(and(eq(mailOutbox.toAddress, builder.email), eq(mailOutbox.template, 'unread_digest')));
    expect(queued).toHaveLength(1);
    expect(queued[0].subject).toContain('3 messages');

    const transport = createTransport({ host: '127.0.0.1', port: inject('smtpPort'), secure: false });
    await createOutboxWorker({ db: live.db, transport, from: 'Tenthmark <no-reply@tenthmark.test>' }).processDue();
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

/** Uploads photos to a conversation as the browser does: multipart, field "photos". */
async function uploadPhotos(server: RunningServer, auth: { cookie: string; csrf: string }, threadId: string, files: Array<{ data: Buffer; name: string; type?: string }>) {
  const form = new FormData();
  for (const file of files) form.append('photos', new Blob([new Uint8Array(file.data)], { type: file.type ?? 'image/jpeg' }), file.name);
  const res = await fetch(`${server.url}/api/threads/${threadId}/photos`, { method: 'POST', headers: { Cookie: auth.cookie, 'X-CSRF-Token': auth.csrf }, body: form });
  return { status: res.status, body: (await res.json().catch(() => ({}))) as Record<string, any> };
}

async function getImage(server: RunningServer, path: string, cookie?: string) {
  const res = await fetch(`${server.url}${path}`, { headers: cookie ? { Cookie: cookie } : {} });
  return { status: res.status, type: res.headers.get('content-type'), data: Buffer.from(await res.arrayBuffer()) };
}

const jpeg = (width = 640, height = 480) => sharp({ create: { width, height, channels: 3, background: { r: 120, g: 110, b: 100 } } }).jpeg().toBuffer();

const photoRows = (threadId: string) => live.db.select().from(messagePhotos).where(eq(messagePhotos.threadId, threadId));

describe('photos in messages', () => {
  it('when the shop uploads a photo and sends it, then the builder on the other instance gets it live, can load it, and a stranger cannot', async () => {
    const { threadId, builderAuth, shopAuth } = await conversation();
    const builderSocket = socketFor(live.instanceA, builderAuth.cookie);
    const shopSocket = socketFor(live.instanceB, shopAuth.cookie);
    await Promise.all([connected(builderSocket), connected(shopSocket)]);
    expect((await emit(builderSocket, 'thread:join', { threadId })).ok).toBe(true);

    const uploaded = await uploadPhotos(live.instanceB, shopAuth, threadId, [{ data: await jpeg(3000, 2000), name: 'cylinder-3.jpg' }]);
    expect(uploaded.status).toBe(201);
    const [photo] = uploaded.body.photos;
    expect(photo).toMatchObject({ width: 2000, height: 1333, thumbUrl: `/api/threads/${threadId}/photos/${photo.id}/thumb`, largeUrl: `/api/threads/${threadId}/photos/${photo.id}/large` });
    // Both sizes are in the store the instances share (the uploads folder, or the S3 stand-in).
    expect(await storedKeys(live.config.storage, `threads/${threadId}/`)).toEqual([`threads/${threadId}/${photo.id}-large.webp`, `threads/${threadId}/${photo.id}-thumb.webp`]);
    // Until it is sent, only the uploader sees it.
    expect((await getImage(live.instanceA, photo.thumbUrl, shopAuth.cookie)).status).toBe(200);
    expect((await getImage(live.instanceA, photo.thumbUrl, builderAuth.cookie)).status).toBe(404);

    const arriving = next(builderSocket, 'message:new');
    const sent = await emit(shopSocket, 'message:send', { threadId, clientId: clientId(), body: '', photoIds: [photo.id] });
    expect(sent).toMatchObject({ ok: true, duplicate: false, message: { body: '', photos: [photo] } });
    const received = await arriving;
    expect(received).toMatchObject({ id: sent.message.id, body: '', photos: [{ id: photo.id, width: 2000, height: 1333, thumbUrl: photo.thumbUrl, largeUrl: photo.largeUrl }] });

    const large = await getImage(live.instanceA, received.photos[0].largeUrl, builderAuth.cookie);
    expect(large.status).toBe(200);
    expect(large.type).toBe('image/webp');
    expect(await sharp(large.data).metadata()).toMatchObject({ format: 'webp', width: 2000, height: 1333 });
    const thumb = await sharp((await getImage(live.instanceA, received.photos[0].thumbUrl, builderAuth.cookie)).data).metadata();
    expect(Math.max(thumb.width!, thumb.height!)).toBe(480);

    // The history carries the photo too.
    const page = await fetch(`${live.instanceA.url}/api/threads/${threadId}/messages`, { headers: { Cookie: builderAuth.cookie } }).then((r) => r.json());
    expect(page.messages[0].photos).toEqual([photo]);

    // Someone outside the conversation is told it does not exist; nobody signed out gets it either.
    const stranger = await session(live.instanceA, await createUser(live.db));
    expect((await getImage(live.instanceA, photo.largeUrl, stranger.cookie)).status).toBe(404);
    expect((await getImage(live.instanceA, photo.largeUrl)).status).toBe(401);
    expect((await uploadPhotos(live.instanceA, stranger, threadId, [{ data: await jpeg(), name: 'mine.jpg' }])).status).toBe(404);
  });

  it('when words and several photos go together, then the photos keep the order they were attached in', async () => {
    const { threadId, builderAuth } = await conversation();
    const uploaded = await uploadPhotos(live.instanceA, builderAuth, threadId, [
      { data: await jpeg(300, 200), name: 'a.jpg' },
      { data: await jpeg(200, 300), name: 'b.jpg' },
      { data: Buffer.from(await sharp({ create: { width: 100, height: 100, channels: 4, background: '#345' } }).png().toBuffer()), name: 'c.png', type: 'image/png' },
    ]);
    expect(uploaded.status).toBe(201);
    const ids = (uploaded.body.photos as Array<{ id: string }>).map((p) => p.id);
    const order = [ids[2], ids[0], ids[1]];
    const sent = await post(live.instanceA, builderAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body: 'Front, left side, and the deck.', photoIds: order });
    expect(sent.status).toBe(201);
    expect(sent.body.message.photos.map((p: { id: string }) => p.id)).toEqual(order);
    const page = await fetch(`${live.instanceB.url}/api/threads/${threadId}/messages`, { headers: { Cookie: builderAuth.cookie } }).then((r) => r.json());
    expect(page.messages[0].photos.map((p: { id: string }) => p.id)).toEqual(order);
  });

  it('when an executable is renamed .jpg, then 415 and nothing is stored', async () => {
    const { threadId, shopAuth } = await conversation();
    const res = await uploadPhotos(live.instanceB, shopAuth, threadId, [{ data: readFileSync('/bin/true'), name: 'bore-gauge.jpg' }]);
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_type');
    expect(await photoRows(threadId)).toHaveLength(0);
  });

  it('when a message names another person’s photo, a photo from another conversation or one already sent, then 400 beside photoIds and nothing is stored', async () => {
    const { threadId, builderAuth, shopAuth } = await conversation();
    const builders = await uploadPhotos(live.instanceA, builderAuth, threadId, [{ data: await jpeg(), name: 'builder.jpg' }]);
    expect(builders.status).toBe(201);
    const theirs = await post(live.instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body: 'Look at this', photoIds: [builders.body.photos[0].id] });
    expect(theirs.status).toBe(400);
    expect(theirs.body.error.fields.photoIds).toBe('That photo is not one you uploaded to this conversation, or it was already sent.');

    // The shop's own photo, but uploaded to its conversation about another job.
    const otherJob = await createJob(live.db, (await createUser(live.db)).id);
    const otherThread = await post(live.instanceB, shopAuth, `/api/jobs/${otherJob.id}/threads`, {});
    expect(otherThread.status).toBe(201);
    const other = await uploadPhotos(live.instanceB, shopAuth, otherThread.body.thread.id, [{ data: await jpeg(), name: 'other-job.jpg' }]);
    expect(other.status).toBe(201);
    const crossed = await post(live.instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), photoIds: [other.body.photos[0].id] });
    expect(crossed.status).toBe(400);
    expect(crossed.body.error.fields.photoIds).toMatch(/not one you uploaded to this conversation/);

    const mine = await uploadPhotos(live.instanceB, shopAuth, threadId, [{ data: await jpeg(), name: 'shop.jpg' }]);
    const first = await post(live.instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), photoIds: [mine.body.photos[0].id] });
    expect(first.status).toBe(201);
    const again = await post(live.instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body: 'Once more', photoIds: [mine.body.photos[0].id] });
    expect(again.status).toBe(400);
    expect(again.body.error.fields.photoIds).toMatch(/already sent/);

    // The schema's own limits: five photos, the same one twice, or nothing at all.
    const five = await post(live.instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), photoIds: Array.from({ length: 5 }, () => crypto.randomUUID()) });
    expect(five.body.error.fields.photoIds).toBe('A message can carry at most 4 photos.');
    const twice = await post(live.instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), photoIds: [mine.body.photos[0].id, mine.body.photos[0].id] });
    expect(twice.body.error.fields.photoIds).toBe('The same photo is attached twice.');
    const nothing = await post(live.instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), body: ' ', photoIds: [] });
    expect(nothing.body.error.fields.body).toBe('Write a message or add a photo.');

    const stored = await live.db.select().from(messages).where(eq(messages.threadId, threadId));
    expect(stored).toHaveLength(1);
    const rows = await photoRows(threadId);
    expect(rows.find((r) => r.id === builders.body.photos[0].id)?.messageId).toBeNull();
    expect(rows.find((r) => r.id === mine.body.photos[0].id)?.messageId).toBe(first.body.message.id);

    const tooMany = await uploadPhotos(live.instanceB, shopAuth, threadId, Array.from({ length: 5 }, (_, i) => ({ data: Buffer.from('x'), name: `p${i}.jpg` })));
    expect(tooMany.status).toBe(413);
    expect(tooMany.body.error.code).toBe('too_many_photos');
  });

  it('when a message with a photo is resent after a reconnect with the same id, then it is stored once with the photo attached once', async () => {
    const { threadId, shopAuth } = await conversation();
    const uploaded = await uploadPhotos(live.instanceB, shopAuth, threadId, [{ data: await jpeg(), name: 'crank.jpg' }]);
    const payload = { threadId, clientId: clientId(), body: 'The crank, as it came in.', photoIds: [uploaded.body.photos[0].id] };
    const first = socketFor(live.instanceB, shopAuth.cookie);
    await connected(first);
    const a = await emit(first, 'message:send', payload);
    first.disconnect();
    const second = socketFor(live.instanceA, shopAuth.cookie);
    await connected(second);
    const b = await emit(second, 'message:send', payload);
    expect(a).toMatchObject({ ok: true, duplicate: false });
    expect(b).toMatchObject({ ok: true, duplicate: true, message: { id: a.message.id, photos: a.message.photos } });
    expect(b.message.photos).toHaveLength(1);
    expect(await live.db.select().from(messages).where(eq(messages.threadId, threadId))).toHaveLength(1);
    const rows = await photoRows(threadId);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ messageId: a.message.id, position: 0 });
  });

  it('when a photo carries GPS data, then the copy the other side loads has no metadata at all', async () => {
    const { threadId, builderAuth, shopAuth } = await conversation();
    const withGps = await sharp({ create: { width: 400, height: 200, channels: 3, background: '#777' } })
      .jpeg()
      .withExifMerge({
        IFD0: { Copyright: 'marker-for-test' },
        IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '48/1 51/1 2400/100', GPSLongitudeRef: 'E', GPSLongitude: '2/1 21/1 300/100' },
      })
      .toBuffer();
    const inputMeta = await sharp(withGps).metadata();
    // The GPSInfo pointer, tag 0x8825, stored little-endian.
    expect(inputMeta.exif?.includes(Buffer.from([0x25, 0x88]))).toBe(true);

    const uploaded = await uploadPhotos(live.instanceB, shopAuth, threadId, [{ data: withGps, name: 'where-it-was-taken.jpg' }]);
    expect(uploaded.status).toBe(201);
    expect((await post(live.instanceB, shopAuth, `/api/threads/${threadId}/messages`, { clientId: clientId(), photoIds: [uploaded.body.photos[0].id] })).status).toBe(201);
    for (const size of ['largeUrl', 'thumbUrl'] as const) {
      const stored = (await getImage(live.instanceA, uploaded.body.photos[0][size], builderAuth.cookie)).data;
      const meta = await sharp(stored).metadata();
      expect(meta.exif).toBeUndefined();
      expect(meta.xmp).toBeUndefined();
      expect(stored.includes(Buffer.from('marker-for-test'))).toBe(false);
    }
  });

  it('when the conversation is closed, then photos cannot be uploaded to it', async () => {
    const { job, threadId, shopAuth, builderAuth } = await conversation();
    const other = await createShop(live.db);
    const otherAuth = await session(live.instanceA, other.user);
    const otherBid = await post(live.instanceA, otherAuth, `/api/jobs/${job.id}/bids`, bidInput());
    expect((await post(live.instanceA, builderAuth, `/api/bids/${otherBid.body.bid.id}/accept`, {})).status).toBe(200);
    const res = await uploadPhotos(live.instanceB, shopAuth, threadId, [{ data: await jpeg(), name: 'late.jpg' }]);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('thread_closed');
    expect(await photoRows(threadId)).toHaveLength(0);
  });
});
