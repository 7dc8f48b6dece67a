import type { z } from 'zod';
import type { markReadSchema, Message, SentMessage, sendMessageSchema } from './schemas/messages';
import type { Notification } from './schemas/notifications';

/**
 * Every socket.io event, both ways, with its payload: the server's `Server`
 * (server/realtime/socket-server.ts, hub.ts) and the browser's socket
 * (client/lib/realtime.ts) are typed with these two maps, so an event name or
 * payload changed on one side is a type error on the other.
 */

/** What changed on a job whose page is open: its page refreshes what shows it. */
export type JobChange = 'bid_placed' | 'bid_revised' | 'bid_withdrawn' | 'bid_accepted' | 'bid_declined' | 'job_updated' | 'job_published' | 'job_cancelled' | 'photos_changed';

/** What a socket handler answers through its acknowledgement: `{ ok: true, ... }` or `{ ok: false, error }` in the API's error shape. */
export type SocketAck<T extends object = object> =
  | ({ ok: true } & T)
  | { ok: false; error: { code: string; message: string; fields?: Record<string, string> } };

type Acked<T extends object = object> = (answer: SocketAck<T>) => void;

export interface ThreadRef {
  threadId: string;
}

export interface JobRef {
  jobId: string;
}

/** A message sent over the socket: its conversation and what POST /api/threads/:threadId/messages takes. */
export type SendMessagePayload = ThreadRef & z.input<typeof sendMessageSchema>;

/** The reader's receipt moves to a message: its conversation and what POST /api/threads/:threadId/read takes. */
export type MarkReadPayload = ThreadRef & z.input<typeof markReadSchema>;

/** Someone read a conversation up to a message. */
export interface ReadMoved {
  threadId: string;
  userId: string;
  messageId: string;
}

/** Someone is typing in a conversation (sent to the others in it). */
export interface Typing {
  threadId: string;
  userId: string;
  displayName: string;
}

/** Events the server sends. */
export interface ServerToClientEvents {
  /** A new message, to everyone in the conversation's room. */
  'message:new': (message: Message) => void;
  /** A person's unread count for a conversation may have moved. */
  'unread:changed': (event: ThreadRef) => void;
  /** A read receipt moved, to everyone in the conversation's room. */
  read: (event: ReadMoved) => void;
  typing: (event: Typing) => void;
  /** A new notice in the person's notification centre, to their own room. */
  'notification:new': (notification: Notification) => void;
  /** The person read notices on another page: the unread count moved. */
  'notifications:read': (event: Record<string, never>) => void;
  /** Something changed on a job, to its watchers. */
  'job:changed': (event: JobRef & { change: JobChange }) => void;
}

/** Events a client sends, each with an optional acknowledgement. */
export interface ClientToServerEvents {
  /** Join a conversation's room (only one the person may read); the answer says whether they may write. */
  'thread:join': (payload: ThreadRef, ack?: Acked<{ canWrite: boolean }>) => void;
  'thread:leave': (payload: ThreadRef, ack?: Acked) => void;
  /** Follow a job's page live (only a job the person may see). */
  'job:watch': (payload: JobRef, ack?: Acked) => void;
  'job:unwatch': (payload: JobRef, ack?: Acked) => void;
  /** Send a message; a repeated clientId answers the stored one with duplicate true. */
  'message:send': (payload: SendMessagePayload, ack?: Acked<SentMessage>) => void;
  /** Tell the conversation's other pages that this person is typing (only after joining it). */
  typing: (payload: ThreadRef, ack?: Acked) => void;
  read: (payload: MarkReadPayload, ack?: Acked) => void;
}
