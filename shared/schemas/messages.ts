import { z } from 'zod';
import { roles } from './auth';
import { uuidSchema } from './common';
import { storedPhotoSchema, type StoredPhoto, type UploadedPhotos } from './photos';
import { MAX_MESSAGE_LENGTH, MAX_PHOTOS_PER_MESSAGE } from './values';

export { MAX_MESSAGE_LENGTH, MAX_PHOTOS_PER_MESSAGE } from './values';


const messageBodySchema = z
  .string({ error: 'Write a message.' })
  .trim()
  .max(MAX_MESSAGE_LENGTH, `Keep a message under ${MAX_MESSAGE_LENGTH.toLocaleString('en-US')} characters.`);

const photoIdsSchema = z
  .array(z.uuid({ error: 'That photo id is not valid.' }), { error: 'Send the photos as a list of ids.' })
  .max(MAX_PHOTOS_PER_MESSAGE, `A message can carry at most ${MAX_PHOTOS_PER_MESSAGE} photos.`)
  .refine((ids) => new Set(ids).size === ids.length, 'The same photo is attached twice.');

/** What a message says: words, photos, or both; never neither. */
const messageContent = {
  body: messageBodySchema.default(''),
  photoIds: photoIdsSchema.default([]),
};
const hasWordsOrPhotos = (message: { body: string; photoIds: string[] }) => message.body.length > 0 || message.photoIds.length > 0;
const EMPTY_MESSAGE = { message: 'Write a message or add a photo.', path: ['body'] };

/** The composer's check before a message is queued (the id is added when it is). */
export const messageContentSchema = z.object(messageContent).refine(hasWordsOrPhotos, EMPTY_MESSAGE);

/**
 * A message as the sender's browser sends it; `clientId` is made up by the
 * browser so a resend is recognised. `photoIds` are photos the sender
 * uploaded to this conversation first (POST /api/threads/:id/photos).
 */
export const sendMessageSchema = z
  .object({
    clientId: z
      .string({ error: 'The message has no id.' })
      .regex(/^[A-Za-z0-9_-]{8,64}$/, 'The message id must be 8 to 64 letters, digits, - or _.'),
    ...messageContent,
  })
  .refine(hasWordsOrPhotos, EMPTY_MESSAGE);
export type SendMessageInput = z.infer<typeof sendMessageSchema>;

export const historyQuerySchema = z.object({
  before: z
    .string()
    .regex(/^[A-Za-z0-9_-]{10,200}$/, 'That cursor is not valid.')
    .optional(),
  limit: z.coerce.number({ error: 'Give a whole number.' }).int('Give a whole number.').min(1, 'At least 1.').max(100, 'At most 100.').default(30),
});

/** A conversation named in a path (/api/threads/:threadId) or a socket event's payload. */
export const threadParamsSchema = z.object({ threadId: uuidSchema });

export const openThreadSchema = z.object({ shopId: uuidSchema.optional() });
export const markReadSchema = z.object({ messageId: uuidSchema });

// --- answers ------------------------------------------------------------------

/** A photo in a conversation, re-encoded as WebP; only people who may read the conversation can load it. */
export type MessagePhoto = StoredPhoto;

/** The answer to a photo upload: the stored photos, in the order sent, ready to go with a message. */
export type UploadedMessagePhotos = UploadedPhotos;

export const messageSchema = z.object({
  id: z.uuid(),
  threadId: z.uuid(),
  clientId: z.string(),
  author: z.object({ id: z.uuid(), displayName: z.string(), role: z.enum(roles) }),
  /** May be empty when the message carries photos. */
  body: z.string(),
  /** In the order the sender attached them; empty for words only. */
  photos: z.array(storedPhotoSchema),
  createdAt: z.iso.datetime(),
});
export type Message = z.infer<typeof messageSchema>;

export const threadSummarySchema = z.object({
  id: z.uuid(),
  jobId: z.uuid(),
  jobTitle: z.string(),
  shop: z.object({ id: z.uuid(), name: z.string() }),
  builder: z.object({ id: z.uuid(), displayName: z.string() }),
  lastMessageAt: z.iso.datetime().nullable(),
  unread: z.number().int(),
  canWrite: z.boolean(),
  /** Where the other person has read up to, for read receipts. */
  otherLastReadMessageId: z.uuid().nullable(),
});
export type ThreadSummary = z.infer<typeof threadSummarySchema>;

export const threadListSchema = z.object({ threads: z.array(threadSummarySchema) });
export type ThreadList = z.infer<typeof threadListSchema>;

export const threadAnswerSchema = z.object({ thread: threadSummarySchema });
export type ThreadAnswer = z.infer<typeof threadAnswerSchema>;

export const historyPageSchema = z.object({
  /** Newest first. */
  messages: z.array(messageSchema),
  /** Pass as `before` for the next, older page; null when there is none. */
  nextCursor: z.string().nullable(),
});
export type HistoryPage = z.infer<typeof historyPageSchema>;

/** A message sent, over HTTP or the socket: the stored one, and whether its clientId had been sent before. */
export const sentMessageSchema = z.object({ message: messageSchema, duplicate: z.boolean() });
export type SentMessage = z.infer<typeof sentMessageSchema>;

/** Where the reader's read receipt now stands. */
export const markedReadSchema = z.object({ messageId: z.uuid() });
export type MarkedRead = z.infer<typeof markedReadSchema>;
