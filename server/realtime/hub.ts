import type { Server } from 'socket.io';
import type { Message } from '../../shared/schemas/messages';

/** Room names: one per user, per job page, per conversation. */
export const rooms = {
  user: (id: string) => `user:${id}`,
  job: (id: string) => `job:${id}`,
  thread: (id: string) => `thread:${id}`,
};

export type JobChange = 'bid_placed' | 'bid_revised' | 'bid_withdrawn' | 'bid_accepted' | 'bid_declined' | 'job_updated' | 'job_published' | 'job_cancelled' | 'photos_changed';

/**
 * What the rest of the server tells live clients. The socket server fills in
 * `io` once it is attached; before that (API tests without sockets) every
 * call is a no-op. With the PostgreSQL adapter, an emit on one app instance
 * reaches sockets connected to every instance.
 */
export class RealtimeHub {
  io: Server | undefined;

  jobChanged(jobId: string, change: JobChange) {
    this.io?.to(rooms.job(jobId)).emit('job:changed', { jobId, change });
  }

  messageCreated(message: Message, participants: string[]) {
    this.io?.to(rooms.thread(message.threadId)).emit('message:new', message);
    for (const userId of participants) this.io?.to(rooms.user(userId)).emit('unread:changed', { threadId: message.threadId });
  }

  /** A suspended account's live connections end now, on every instance. */
  signOut(userId: string) {
    this.io?.in(rooms.user(userId)).disconnectSockets(true);
  }

  readMoved(threadId: string, userId: string, messageId: string) {
    this.io?.to(rooms.thread(threadId)).emit('read', { threadId, userId, messageId });
    this.io?.to(rooms.user(userId)).emit('unread:changed', { threadId });
  }
}
