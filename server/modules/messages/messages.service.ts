import { and, desc, eq, lt, or, sql } from 'drizzle-orm';
import type { HistoryPage, Message, MessagePhoto, SendMessageInput, ThreadSummary } from '../../../shared/schemas/messages';
import type { Database, Executor } from '../../db/client';
import { bids, jobs, messages, shops, threads, users, type User } from '../../db/schema';
import { AppError, conflict, forbidden, notFound } from '../../lib/errors';
import { PostgresRateLimitStore } from '../../lib/rate-limit';
import type { RealtimeHub } from '../../realtime/hub';
import { jobForViewer, mustOwnJob, mustReadThread, mustSeeDraft } from '../jobs/job-access';
import { findJob, type JobRow } from '../jobs/jobs.repository';
import { findShopByUser } from '../shops/shops.repository';
import { attachPhotos, photosOfMessages } from './message-photos.repository';

type ThreadRow = typeof threads.$inferSelect;

export interface ThreadAccess {
  thread: ThreadRow;
  job: JobRow;
  /** The two people in the conversation. */
  builderId: string;
  shopUserId: string;
  canWrite: boolean;
}

export interface MessageDeps {
  db: Database;
  /** Tells open pages of the conversation (absent in scripts without live clients). */
  hub?: RealtimeHub;
  /** Counts a message against its sender's rate (see messageRateLimit). */
  rateLimit?: MessageRateLimit;
}

type MessageRateLimit = (userId: string, onTooFast?: (retryAfterSeconds: number) => void) => Promise<void>;

/**
 * How many messages one person may send in ten seconds, counted in PostgreSQL
 * so REST and sockets on every instance share one count. Past it: 429, after
 * telling the caller how many seconds to wait.
 */
export function messageRateLimit(db: Database, perTenSeconds: number): MessageRateLimit {
  const store = new PostgresRateLimitStore(db, 'messages');
  store.init({ windowMs: 10_000 } as never);
  return async (userId, onTooFast) => {
    const { totalHits, resetTime } = await store.increment(userId);
    if (totalHits <= perTenSeconds) return;
    onTooFast?.(Math.max(1, Math.ceil(((resetTime?.getTime() ?? Date.now()) - Date.now()) / 1000)));
    throw new AppError('too_many_attempts', 'You are sending messages too fast. Wait a few seconds.', 429);
  };
}

const CLOSED_STATUSES = new Set(['cancelled', 'resolved']);

/**
 * The thread if this person may read it: the job's builder, the thread's shop, or an admin (read only).
 * One statement: the thread, its job, the shop's person and the shop the job was awarded to.
 * Writable: never once the job is closed; after the award only the thread with the winning shop goes on.
 */
export async function threadFor(db: Executor, threadId: string, user: User): Promise<ThreadAccess> {
  const [row] = await db
    .select({ thread: threads, job: jobs, shopUserId: shops.userId, awardedShopId: bids.shopId })
    .from(threads)
    .innerJoin(jobs, eq(jobs.id, threads.jobId))
    .innerJoin(shops, eq(shops.id, threads.shopId))
    .leftJoin(bids, eq(bids.id, jobs.awardedBidId))
    .where(eq(threads.id, threadId));
  if (!row) throw notFound('No conversation with that id.');
  const { thread, job, shopUserId } = row;
  const isParty = mustReadThread(job, shopUserId, user);
  const writable = !CLOSED_STATUSES.has(job.status) && (!job.awardedBidId || row.awardedShopId === thread.shopId);
  return { thread, job, builderId: job.builderId, shopUserId, canWrite: isParty && writable };
}

/**
 * The conversation between a job's builder and one shop, made on first use.
 * A shop may open one on a job it can see (to ask a question); the builder
 * may open one with a shop that bid.
 */
export async function openThread(db: Database, user: User, jobId: string, shopId?: string): Promise<ThreadRow> {
  const job = mustSeeDraft(await findJob(db, jobId), user);
  let targetShopId: string;
  if (user.role === 'shop') {
    const shop = await findShopByUser(db, user.id);
    if (!shop) throw conflict('Set up your shop profile before you write to builders.', 'no_shop_profile');
    if (shopId && shopId !== shop.id) throw forbidden('A shop can only open its own conversation.');
    const [bid] = await db.select({ id: bids.id }).from(bids).where(and(eq(bids.jobId, job.id), eq(bids.shopId, shop.id))).limit(1);
    if (job.status !== 'open' && !bid) throw forbidden('This job is not taking questions.');
    targetShopId = shop.id;
  } else if (user.role === 'builder') {
    mustOwnJob(job, user, 'Only the builder who posted this job can write about it.');
    if (!shopId) throw new AppError('invalid_input', 'Say which shop to write to.', 400, { shopId: 'Choose a shop.' });
    const [bid] = await db.select({ id: bids.id }).from(bids).where(and(eq(bids.jobId, job.id), eq(bids.shopId, shopId))).limit(1);
    const [existing] = await db.select().from(threads).where(and(eq(threads.jobId, job.id), eq(threads.shopId, shopId)));
    if (existing) return existing;
    if (!bid) throw conflict('You can write to shops that bid on this job or asked about it.', 'no_bid');
    targetShopId = shopId;
  } else {
    throw forbidden('Administrators read conversations; they do not start them.');
  }
  await db.insert(threads).values({ jobId: job.id, shopId: targetShopId }).onConflictDoNothing();
  const [thread] = await db.select().from(threads).where(and(eq(threads.jobId, job.id), eq(threads.shopId, targetShopId)));
  return thread;
}

type MessageRow = typeof messages.$inferSelect & { authorName: string; authorRole: User['role'] };

function toMessage(row: MessageRow, photos: MessagePhoto[] = []): Message {
  return {
    id: row.id,
    threadId: row.threadId,
    clientId: row.clientId,
    author: { id: row.authorId, displayName: row.authorName, role: row.authorRole },
    body: row.body,
    photos,
    createdAt: row.createdAt.toISOString(),
  };
}

const messageColumns = {
  id: messages.id,
  threadId: messages.threadId,
  authorId: messages.authorId,
  clientId: messages.clientId,
  body: messages.body,
  createdAt: messages.createdAt,
  authorName: users.displayName,
  authorRole: users.role,
};

const encodeCursor = (row: { createdAt: Date; id: string }) => Buffer.from(`${row.createdAt.toISOString()}|${row.id}`).toString('base64url');
function decodeCursor(cursor: string): { createdAt: Date; id: string } {
  const [iso, id] = Buffer.from(cursor, 'base64url').toString('utf8').split('|');
  const createdAt = new Date(iso);
  if (!id || Number.isNaN(createdAt.getTime()) || !/^[0-9a-f-]{36}$/.test(id)) {
    throw new AppError('invalid_input', 'That cursor is not valid.', 400, { before: 'That cursor is not valid.' });
  }
  return { createdAt, id };
}

/** A page of messages, newest first, before the cursor. */
export async function history(db: Database, user: User, threadId: string, before: string | undefined, limit: number): Promise<HistoryPage> {
  await threadFor(db, threadId, user);
  const cursor = before ? decodeCursor(before) : undefined;
  const rows = await db
    .select(messageColumns)
    .from(messages)
    .innerJoin(users, eq(users.id, messages.authorId))
    .where(
      cursor
        ? and(eq(messages.threadId, threadId), or(lt(messages.createdAt, cursor.createdAt), and(eq(messages.createdAt, cursor.createdAt), lt(messages.id, cursor.id))))
        : eq(messages.threadId, threadId),
    )
    .orderBy(desc(messages.createdAt), desc(messages.id))
    .limit(limit + 1);
  const page = rows.slice(0, limit);
  const photos = await photosOfMessages(db, page.map((row) => row.id));
  return { messages: page.map((row) => toMessage(row, photos.get(row.id))), nextCursor: rows.length > limit ? encodeCursor(page[page.length - 1]) : null };
}

/**
 * Stores a message once: the (author, client id) pair is unique, so a resend
 * after a reconnect finds the stored message (with its photos) instead of
 * making a second. Photos the sender uploaded to this conversation go with a
 * new message in the same transaction; one that does not qualify refuses the
 * whole message.
 */
export async function sendMessage(
  deps: MessageDeps,
  user: User,
  threadId: string,
  input: Pick<SendMessageInput, 'clientId' | 'body'> & { photoIds?: string[] },
  options: { onTooFast?: (retryAfterSeconds: number) => void; sessionCheck?: () => Promise<void> } = {},
): Promise<{ message: Message; duplicate: boolean; access: ThreadAccess }> {
  const { db } = deps;
  // The session, the count and the conversation are read side by side, before anything is written;
  // an ended session's refusal comes first, then the limit's.
  const [live, limited, found] = await Promise.allSettled([options.sessionCheck?.(), deps.rateLimit?.(user.id, options.onTooFast), threadFor(db, threadId, user)]);
  if (live.status === 'rejected') throw live.reason;
  if (limited.status === 'rejected') throw limited.reason;
  // The shared schema says the same; callers that skip it (scripts, benches) meet it here, since the table allows ''.
  if (!input.body && !input.photoIds?.length) {
    throw new AppError('invalid_input', 'Write a message or add a photo.', 400, { body: 'Write a message or add a photo.' });
  }
  if (found.status === 'rejected') throw found.reason;
  const access = found.value;
  if (!access.canWrite) throw conflict('This conversation is closed to new messages.', 'thread_closed');
  const store = { threadId, authorId: user.id, clientId: input.clientId, body: input.body };
  const photoIds = input.photoIds ?? [];
  // Words alone are stored by one statement; photos are attached in the same transaction as their message.
  const stored = photoIds.length
    ? await db.transaction(async (tx) => {
        const row = await storeMessage(tx, store);
        if (row.inserted) await attachPhotos(tx, { threadId, userId: user.id, messageId: row.id, photoIds });
        return { row, photos: (await photosOfMessages(tx, [row.id])).get(row.id) };
      })
    : { row: await storeMessage(db, store), photos: undefined };
  const { row } = stored;
  // A resent message may have photos from its first sending.
  const photos = stored.photos ?? (row.inserted ? undefined : (await photosOfMessages(db, [row.id])).get(row.id));
  const sent = { message: toMessage(row, photos), duplicate: !row.inserted, access };
  // Every open page of the conversation gets the message; the other side's unread count moves.
  if (!sent.duplicate) deps.hub?.messageCreated(sent.message, [access.builderId, access.shopUserId].filter((id) => id !== user.id));
  return sent;
}

/**
 * The reader's mark moves to the message in the statement's `source` (with its
 * id, thread_id and created_at); marks only move forward.
 */
const moveReadMark = (source: 'stored' | 'target', userId: string) => sql`
  INSERT INTO thread_reads (thread_id, user_id, last_read_at, last_read_message_id)
  SELECT thread_id, ${userId}::uuid, created_at, id FROM ${sql.identifier(source)}
  ON CONFLICT (thread_id, user_id) DO UPDATE SET last_read_at = EXCLUDED.last_read_at, last_read_message_id = EXCLUDED.last_read_message_id
  WHERE thread_reads.last_read_at IS NULL OR thread_reads.last_read_at < EXCLUDED.last_read_at`;

interface StoredRow extends MessageRow {
  /** False when the sender's client id was already used: the row is the earlier message. */
  inserted: boolean;
}

/**
 * Stores a message once per client id, in one statement: the message, the
 * conversation's last-message time and the sender's read mark; answers the
 * stored row with its author, or the earlier message with the same client id.
 */
async function storeMessage(db: Executor, input: { threadId: string; authorId: string; clientId: string; body: string }): Promise<StoredRow> {
  const existing = sql`SELECT m.id, m.thread_id, m.author_id, m.client_id, m.body, m.created_at FROM messages m WHERE m.author_id = ${input.authorId} AND m.client_id = ${input.clientId}`;
  const result = await db.execute<{ id: string; thread_id: string; author_id: string; client_id: string; body: string; created_at: string | Date; inserted: boolean; author_name: string; author_role: User['role'] }>(sql`
    WITH stored AS (
      INSERT INTO messages (thread_id, author_id, client_id, body) VALUES (${input.threadId}, ${input.authorId}, ${input.clientId}, ${input.body})
      ON CONFLICT (author_id, client_id) DO NOTHING
      RETURNING id, thread_id, author_id, client_id, body, created_at
    ), touched AS (
      UPDATE threads SET last_message_at = stored.created_at FROM stored WHERE threads.id = stored.thread_id
    ), marked AS (${moveReadMark('stored', input.authorId)}),
    found AS (
      SELECT stored.*, true AS inserted FROM stored
      UNION ALL SELECT e.*, false FROM (${existing}) e WHERE NOT EXISTS (SELECT 1 FROM stored)
    )
    SELECT found.*, u.display_name AS author_name, u.role AS author_role FROM found JOIN users u ON u.id = found.author_id`);
  // Another request storing the same client id at this moment: its row was not yet visible to this statement.
  const row = result.rows[0] ?? (await db.execute<(typeof result.rows)[number]>(sql`SELECT e.*, false AS inserted, u.display_name AS author_name, u.role AS author_role FROM (${existing}) e JOIN users u ON u.id = e.author_id`)).rows[0];
  if (!row) throw conflict('That message could not be stored. Send it again.', 'message_not_stored');
  if (row.thread_id !== input.threadId) throw conflict('That message id was already used in another conversation.', 'client_id_reused');
  return {
    id: row.id,
    threadId: row.thread_id,
    authorId: row.author_id,
    clientId: row.client_id,
    body: row.body,
    createdAt: new Date(row.created_at),
    authorName: row.author_name,
    authorRole: row.author_role,
    inserted: row.inserted,
  };
}

export async function markRead(deps: MessageDeps, user: User, threadId: string, messageId: string): Promise<{ messageId: string; access: ThreadAccess }> {
  const { db } = deps;
  const access = await threadFor(db, threadId, user);
  // The message is found and the mark moved in one statement.
  const found = await db.execute<{ id: string }>(sql`
    WITH target AS (SELECT id, thread_id, created_at FROM messages WHERE id = ${messageId} AND thread_id = ${threadId}),
    moved AS (${moveReadMark('target', user.id)})
    SELECT id FROM target`);
  if (!found.rows[0]) throw notFound('No such message in this conversation.');
  deps.hub?.readMoved(threadId, user.id, messageId);
  return { messageId, access };
}

/** A job's conversations, for whoever may see the job. */
export async function threadsOfJob(db: Database, user: User, jobId: string): Promise<ThreadSummary[]> {
  await jobForViewer(db, jobId, user);
  return myThreads(db, user, jobId);
}

/** Threads the person is part of, newest first, with unread counts. */
export async function myThreads(db: Database, user: User, jobId?: string): Promise<ThreadSummary[]> {
  const shop = user.role === 'shop' ? await findShopByUser(db, user.id) : undefined;
  if (user.role === 'shop' && !shop) return [];
  const mine =
    user.role === 'admin'
      ? jobId
        ? sql`true`
        : sql`false`
      : user.role === 'shop'
        ? sql`t.shop_id = ${shop!.id}`
        : sql`j.builder_id = ${user.id}`;
  const rows = await db.execute<{
    id: string;
    job_id: string;
    job_title: string;
    shop_id: string;
    shop_name: string;
    shop_user_id: string;
    builder_id: string;
    builder_name: string;
    last_message_at: Date | null;
    unread: number;
    other_last_read: string | null;
    open_for_writing: boolean;
  }>(sql`
    SELECT t.id, t.job_id, j.title AS job_title, s.id AS shop_id, s.name AS shop_name, s.user_id AS shop_user_id,
           j.builder_id, b.display_name AS builder_name, t.last_message_at,
           (SELECT count(*)::int FROM messages m
              WHERE m.thread_id = t.id AND m.author_id <> ${user.id}
                AND m.created_at > coalesce(r.last_read_at, '-infinity'::timestamptz)) AS unread,
           (SELECT o.last_read_message_id FROM thread_reads o WHERE o.thread_id = t.id AND o.user_id <> ${user.id}
              AND o.user_id IN (j.builder_id, s.user_id) LIMIT 1) AS other_last_read,
           (j.status NOT IN ('cancelled', 'resolved')
              AND (j.awarded_bid_id IS NULL OR EXISTS (SELECT 1 FROM bids ab WHERE ab.id = j.awarded_bid_id AND ab.shop_id = t.shop_id))) AS open_for_writing
    FROM threads t
    JOIN jobs j ON j.id = t.job_id
    JOIN shops s ON s.id = t.shop_id
    JOIN users b ON b.id = j.builder_id
    LEFT JOIN thread_reads r ON r.thread_id = t.id AND r.user_id = ${user.id}
    WHERE ${mine} ${jobId ? sql`AND t.job_id = ${jobId}` : sql``}
    ORDER BY t.last_message_at DESC NULLS LAST, t.created_at DESC`);
  return rows.rows.map((row) => {
    const isParty = user.id === row.builder_id || user.id === row.shop_user_id;
    return {
      id: row.id,
      jobId: row.job_id,
      jobTitle: row.job_title,
      shop: { id: row.shop_id, name: row.shop_name },
      builder: { id: row.builder_id, displayName: row.builder_name },
      lastMessageAt: row.last_message_at ? new Date(row.last_message_at).toISOString() : null,
      unread: isParty ? Number(row.unread) : 0,
      // The same rule as threadFor's writable, in SQL, so the list costs one statement.
      canWrite: isParty && row.open_for_writing,
      otherLastReadMessageId: row.other_last_read,
    };
  });
}
