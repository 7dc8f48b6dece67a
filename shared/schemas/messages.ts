import { z } from 'zod';
import { uuidSchema } from './common';

export const MAX_MESSAGE_LENGTH = 4000;

export const MAX_PHOTOS_PER_MESSAGE = 4;

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

export const openThreadSchema = z.object({ shopId: uuidSchema.optional() });
export const markReadSchema = z.object({ messageId: uuidSchema });

/** A photo in a conversation, re-encoded as WebP; only people who may read the conversation can load it. */
export interface MessagePhoto {
  id: string;
  width: number;
  height: number;
  thumbUrl: string;
  largeUrl: string;
}

/** The answer to a photo upload: the stored photos, in the order sent, ready to go with a message. */
export interface UploadedMessagePhotos {
  photos: MessagePhoto[];
}

export interface Message {
  id: string;
  threadId: string;
  clientId: string;
  author: { id: string; displayName: string; role: 'builder' | 'shop' | 'admin' };
  /** May be empty when the message carries photos. */
  body: string;
  /** In the order the sender attached them; empty for words only. */
  photos: MessagePhoto[];
  createdAt: string;
}

export interface ThreadSummary {
  id: string;
  jobId: string;
  jobTitle: string;
  shop: { id: string; name: string };
  builder: { id: string; displayName: string };
  lastMessageAt: string | null;
  unread: number;
  canWrite: boolean;
  /** Where the other person has read up to, for read receipts. */
  otherLastReadMessageId: string | null;
}

export interface HistoryPage {
  messages: Message[];
  /** Pass as `before` for the next, older page; null when there is none. */
  nextCursor: string | null;
}
