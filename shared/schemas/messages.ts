import { z } from 'zod';
import { uuidSchema } from './common';

export const MAX_MESSAGE_LENGTH = 4000;

/** A message as the sender's browser sends it; `clientId` is made up by the browser so a resend is recognised. */
export const sendMessageSchema = z.object({
  clientId: z
    .string({ error: 'The message has no id.' })
    .regex(/^[A-Za-z0-9_-]{8,64}$/, 'The message id must be 8 to 64 letters, digits, - or _.'),
  body: z
    .string({ error: 'Write a message.' })
    .trim()
    .min(1, 'Write a message.')
    .max(MAX_MESSAGE_LENGTH, `Keep a message under ${MAX_MESSAGE_LENGTH.toLocaleString('en-US')} characters.`),
});
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

export interface Message {
  id: string;
  threadId: string;
  clientId: string;
  author: { id: string; displayName: string; role: 'builder' | 'shop' | 'admin' };
  body: string;
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
