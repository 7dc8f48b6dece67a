import { sql } from 'drizzle-orm';
import { check, index, integer, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { mustReference, stampedNow, uuidPrimaryKey } from './columns';
import { jobIdColumn, photoFileColumns } from './jobs';
import { shops } from './shops';
import { users } from './users-and-sessions';

// Conversations between a job's builder and a shop: threads, messages, their photos and read marks.

/** One conversation per job and shop, between the job's builder and that shop. */
export const threads = pgTable(
  'threads',
  {
    id: uuidPrimaryKey(),
    jobId: jobIdColumn(),
    shopId: mustReference(() => shops.id),
    lastMessageAt: timestamp({ withTimezone: true }),
    createdAt: stampedNow(),
  },
  (t) => [uniqueIndex('threads_job_shop_idx').on(t.jobId, t.shopId), index('threads_shop_idx').on(t.shopId, t.lastMessageAt)],
);

export const messages = pgTable(
  'messages',
  {
    id: uuidPrimaryKey(),
    threadId: mustReference(() => threads.id, { onDelete: 'cascade' }),
    authorId: mustReference(() => users.id),
    /** The id the sender's browser made up, so a resend after a reconnect is stored once. */
    clientId: text().notNull(),
    body: text().notNull(),
    /** Millisecond precision, like JavaScript dates, so cursors and read marks compare exactly. */
    createdAt: timestamp({ withTimezone: true, precision: 3 }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('messages_author_client_idx').on(t.authorId, t.clientId),
    index('messages_thread_idx').on(t.threadId, t.createdAt.desc(), t.id.desc()),
    // May be empty when the message carries photos; the service checks that it has words or photos.
    check('messages_body_check', sql`char_length(${t.body}) <= 4000`),
  ],
);

/**
 * A photo in a conversation. Uploaded first (no message yet), then attached
 * to the sender's message in the same transaction that stores it.
 */
export const messagePhotos = pgTable(
  'message_photos',
  {
    id: uuidPrimaryKey(),
    threadId: mustReference(() => threads.id, { onDelete: 'cascade' }),
    ...photoFileColumns(),
    /** Null until the photo goes out with a message. */
    messageId: uuid().references(() => messages.id, { onDelete: 'cascade' }),
    /** Its place among the message's photos, set when attached. */
    position: integer(),
    createdAt: stampedNow(),
  },
  (t) => [
    index('message_photos_message_idx').on(t.messageId, t.position),
    index('message_photos_unsent_idx').on(t.threadId, t.uploadedBy).where(sql`${t.messageId} IS NULL`),
  ],
);

/** Where each person has read up to in a thread, and up to where they were sent a digest. */
export const threadReads = pgTable(
  'thread_reads',
  {
    threadId: mustReference(() => threads.id, { onDelete: 'cascade' }),
    userId: mustReference(() => users.id, { onDelete: 'cascade' }),
    lastReadAt: timestamp({ withTimezone: true }),
    lastReadMessageId: uuid(),
    digestedThrough: timestamp({ withTimezone: true }),
  },
  (t) => [primaryKey({ columns: [t.threadId, t.userId] })],
);
