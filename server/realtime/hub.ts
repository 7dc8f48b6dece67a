import type { Server } from 'socket.io';
import type { ClientToServerEvents, JobChange, ServerToClientEvents } from '../../shared/realtime-events';
import type { Message } from '../../shared/schemas/messages';
import type { Notification } from '../../shared/schemas/notifications';

/** The app's socket.io server, typed with the events declared in shared/realtime-events.ts. */
export type RealtimeServer = Server<ClientToServerEvents, ServerToClientEvents>;


/** Room names: one per user, per signed-in session, per job page, per conversation; and every admin's sockets. */
export const rooms = {
  user: (id: string) => `user:${id}`,
  session: (sid: string) => `session:${sid}`,
  admins: 'admins',
  job: (id: string) => `job:${id}`,
  thread: (id: string) => `thread:${id}`,
};

/**
 * What the rest of the server tells live clients. The socket server fills in
 * `io` once it is attached; before that (API tests without sockets) every
 * call is a no-op. With the PostgreSQL adapter, an emit on one app instance
 * reaches sockets connected to every instance.
 */
export class RealtimeHub {
  io: RealtimeServer | undefined;

  jobChanged(jobId: string, change: JobChange) {
    this.io?.to(rooms.job(jobId)).emit('job:changed', { jobId, change });
  }

  /**
   * Pages with the conversation open get the message; the participants' other
   * pages are told their unread count moved (a page that got the message knows
   * that already, so it is not sent the signal too: half the frames in a busy
   * conversation).
   */
  messageCreated(message: Message, participants: string[]) {
    const thread = rooms.thread(message.threadId);
    this.io?.to(thread).emit('message:new', message);
    if (participants.length) this.io?.to(participants.map(rooms.user)).except(thread).emit('unread:changed', { threadId: message.threadId });
  }

  /**
   * A person's live connections end now, on every instance: a suspension, a
   * password reset, or a password change (which keeps the session that made it).
   */
  signOut(userId: string, exceptSession?: string) {
    const sockets = this.io?.in(rooms.user(userId));
    (exceptSession ? sockets?.except(rooms.session(exceptSession)) : sockets)?.disconnectSockets(true);
  }

  /** The live connections of one signed-in session end (sign-out), on every instance; the person's other sessions go on. */
  endSession(sid: string) {
    this.io?.in(rooms.session(sid)).disconnectSockets(true);
  }

  /**
   * After an award only the job's builder, the shop doing the work and admins
   * follow it live: every other socket leaves the job's room, on every
   * instance. The adapter publishes in order, so the award itself still
   * reaches them first.
   */
  keepOnlyParties(jobId: string, partyUserIds: string[]) {
    this.io
      ?.in(rooms.job(jobId))
      .except([rooms.admins, ...partyUserIds.map(rooms.user)])
      .socketsLeave(rooms.job(jobId));
  }

  /** A notice was written for this person (after its transaction committed): their bell counts it. */
  notified(userId: string, notification: Notification) {
    this.io?.to(rooms.user(userId)).emit('notification:new', notification);
  }

  /** This person read notices on one page: their other pages recount. */
  notificationsRead(userId: string) {
    this.io?.to(rooms.user(userId)).emit('notifications:read', {});
  }

  readMoved(threadId: string, userId: string, messageId: string) {
    this.io?.to(rooms.thread(threadId)).emit('read', { threadId, userId, messageId });
    this.io?.to(rooms.user(userId)).emit('unread:changed', { threadId });
  }
}
