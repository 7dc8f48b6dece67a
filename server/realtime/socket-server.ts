import { createAdapter } from '@socket.io/postgres-adapter';
import type { RequestHandler } from 'express';
import type { Server as HttpServer } from 'node:http';
import type pg from 'pg';
import type { Logger } from 'pino';
import { Server } from 'socket.io';
import { z } from 'zod';
import type { ClientToServerEvents, ServerToClientEvents, SocketAck } from '../../shared/realtime-events';
import { jobParamsSchema } from '../../shared/schemas/jobs';
import { markReadSchema, sendMessageSchema, threadParamsSchema } from '../../shared/schemas/messages';
import type { Database } from '../db/client';
import type { User } from '../db/schema';
import { nestsDeeperThan, tooDeep } from '../lib/json-body';
import { AppError, zodFields } from '../lib/errors';
import { jobForLiveWatcher } from '../modules/jobs/job-access';
import { markRead, messageRateLimit, sendMessage, threadFor } from '../modules/messages/messages.service';
import { findUserById, sessionIsLive } from '../modules/users/users.repository';
import { rooms, type RealtimeHub, type RealtimeServer } from './hub';

export interface RealtimeOptions {
  server: HttpServer;
  sessionMiddleware: RequestHandler;
  db: Database;
  /** The live channel's own connections: one held for LISTEN, one for publications (see adapterPool). */
  pool: pg.Pool;
  hub: RealtimeHub;
  logger: Logger;
  /** The app's public address: sockets are accepted only from pages of this origin. */
  appUrl: string;
  /** Messages one person may send in ten seconds. */
  messagesPer10s: number;
}

/** What an event's acknowledgement carries besides `ok: true`, as shared/realtime-events.ts declares it. */
type AckOf<E extends keyof ClientToServerEvents> = Parameters<ClientToServerEvents[E]>[1] extends ((answer: SocketAck<infer T>) => void) | undefined ? T : never;

function failure(error: unknown): SocketAck {
  if (error instanceof AppError) return { ok: false as const, error: { code: error.code, message: error.message, ...(error.fields ? { fields: error.fields } : {}) } };
  if (error instanceof z.ZodError) return { ok: false as const, error: { code: 'invalid_input', message: 'Some of the values are not valid.', fields: zodFields(error) } };
  return { ok: false as const, error: { code: 'internal', message: 'Something went wrong on our side.' } };
}

/** The adapter's statement for a publication (socket.io-postgres-adapter 0.5). */
const NOTIFY = 'SELECT pg_notify($1, $2)';
/** Every publication waiting for its turn goes out in one statement, in the order they were made. */
const NOTIFY_ALL = 'SELECT pg_notify(n.channel, n.payload) FROM unnest($1::text[], $2::text[]) WITH ORDINALITY AS n(channel, payload, place) ORDER BY n.place';
/** While the database is away, at most this many publications wait; later ones fail (the adapter logs them). */
const MAX_WAITING_PUBLICATIONS = 5_000;

/**
 * The pool as the adapter sees it. The adapter keeps one connection checked
 * out for LISTEN; when the database goes away it drops that connection and
 * takes a new one without releasing the old, so the pool would wait for it
 * for ever when the app shuts down. Here a connection that ends while checked
 * out goes back to the pool (as broken), once.
 *
 * Publications go out in the order they were made: an event and the room change
 * after it (a job's last news, then its losing bidders leaving) reach every
 * instance in that order. One statement is in flight at a time; whatever is
 * published meanwhile waits and then goes out together in the next, in order (one
 * transaction, whose notifications PostgreSQL delivers in the order they were
 * made). A burst therefore costs two round trips to the database, not one per
 * publication after the other. (Within one statement PostgreSQL delivers two
 * byte-identical publications once; every event the hub sends is either unique,
 * as a message with its id, or a signal to recount or refetch, so once is enough.)
 */
function adapterPool(pool: pg.Pool): pg.Pool {
  let waiting: Array<{ channel: string; payload: string; settle: (error?: unknown) => void }> = [];
  let sending = false;
  const sendWaiting = async () => {
    sending = true;
    while (waiting.length > 0) {
      const batch = waiting;
      waiting = [];
      try {
        await pool.query(NOTIFY_ALL, [batch.map((p) => p.channel), batch.map((p) => p.payload)]);
        for (const p of batch) p.settle();
      } catch (error) {
        for (const p of batch) p.settle(error);
      }
    }
    sending = false;
  };
  const query = (text: string, values?: unknown[]) => {
    if (text !== NOTIFY || !values) return pool.query(text, values);
    if (waiting.length >= MAX_WAITING_PUBLICATIONS) return Promise.reject(new Error('too many publications are waiting for the database'));
    return new Promise<void>((resolve, reject) => {
      waiting.push({ channel: String(values[0]), payload: String(values[1]), settle: (error) => (error ? reject(error as Error) : resolve()) });
      if (!sending) void sendWaiting();
    });
  };
  return {
    query,
    connect: async () => {
      const client = await pool.connect();
      client.once('end', () => {
        try {
          client.release(new Error('the LISTEN connection ended'));
        } catch {
          // Already released by the adapter's own close().
        }
      });
      return client;
    },
  } as unknown as pg.Pool;
}

/**
 * socket.io on the app's HTTP server. A socket connects with the same session
 * cookie as the pages (no session, no connection), joins its own user room,
 * and may join only the conversations and job pages its user may read.
 */
export function attachRealtime(options: RealtimeOptions): RealtimeServer {
  const { db, hub, logger } = options;
  const appOrigin = new URL(options.appUrl).origin;
  const io = new Server<ClientToServerEvents, ServerToClientEvents>(options.server, {
    path: '/socket.io',
    serveClient: false,
    // Same origin only: the app and the socket share one host.
    cors: { origin: false },
    // A page of another site must not open a socket with our cookie (SameSite=Lax does not stop
    // a cross-site WebSocket): browsers always say which page opens a WebSocket or a cross-site
    // request, so a foreign Origin is refused. A request without one is not from another site's
    // page (a browser leaves it off only for same-origin polling; other clients can say anything).
    allowRequest: (req, callback) => {
      const origin = req.headers.origin;
      callback(null, origin === undefined || origin === appOrigin);
    },
    adapter: createAdapter(adapterPool(options.pool), { errorHandler: (err) => logger.warn({ err }, 'socket.io adapter error') }),
    connectionStateRecovery: { maxDisconnectionDuration: 2 * 60_000 },
    // The largest thing a client sends is a message (4,000 characters and a few photo ids); a bigger frame closes the connection unread.
    maxHttpBufferSize: 100_000,
  });
  io.engine.use(options.sessionMiddleware);

  io.use((socket, next) => {
    const session = (socket.request as unknown as { session?: { passport?: { user?: string } } }).session;
    const userId = session?.passport?.user;
    if (!userId) return next(Object.assign(new Error('unauthenticated'), { data: { code: 'unauthenticated', message: 'Sign in first.' } }));
    findUserById(db, userId).then(
      (user) => {
        if (!user || user.status !== 'active') return next(Object.assign(new Error('unauthenticated'), { data: { code: 'unauthenticated', message: 'Sign in first.' } }));
        socket.data.user = user;
        next();
      },
      (error) => next(error as Error),
    );
  });

  const messageDeps = { db, hub, rateLimit: messageRateLimit(db, options.messagesPer10s) };

  io.on('connection', (socket) => {
    const user = socket.data.user as User;
    const sid = (socket.request as unknown as { sessionID: string }).sessionID;
    // A sign-out, password change or suspension that lands after the session was read above but before these
    // rooms are joined finds no socket to close; asking once the rooms are joined catches it (the session rows
    // are deleted before the disconnect is sent, so one of the two always sees this socket).
    void Promise.resolve(socket.join([rooms.user(user.id), rooms.session(sid), ...(user.role === 'admin' ? [rooms.admins] : [])]))
      .then(() => sessionIsLive(db, sid, user.id))
      .then(
        (live) => {
          if (!live) socket.disconnect(true);
        },
        (err: unknown) => logger.warn({ err }, 'could not re-check a new socket’s session'),
      );

    /**
     * Belt and braces beside the disconnects: a socket whose session has ended is refused (and closed once
     * the refusal has gone out, see handle). Asked by every event that acts for the person (send, read,
     * typing, join, watch); only leaving a room is not.
     */
    const sessionEnded = new AppError('unauthenticated', 'Your session has ended. Sign in again.', 401);
    const checkSession = async () => {
      if (!(await sessionIsLive(db, sid, user.id))) throw sessionEnded;
    };

    /** The payload is whatever the client sent: each handler parses it with a schema before use. */
    const handle = <E extends keyof ClientToServerEvents>(event: E, run: (payload: unknown) => Promise<AckOf<E>>, options: { sessionCheck?: boolean } = {}) => {
      const listener = async (payload: unknown, ack?: (answer: SocketAck<AckOf<E>>) => void) => {
        try {
          // Like HTTP bodies: nothing deeper than MAX_JSON_DEPTH reaches a schema or the database.
          if (nestsDeeperThan(payload)) throw tooDeep();
          if (options.sessionCheck) await checkSession();
          const result = await run(payload);
          if (typeof ack === 'function') ack({ ok: true, ...result });
        } catch (error) {
          if (!(error instanceof AppError) && !(error instanceof z.ZodError)) logger.error({ err: error, event }, 'socket handler failed');
          if (typeof ack === 'function') ack(failure(error));
          if (error === sessionEnded) setImmediate(() => socket.disconnect(true));
        }
      };
      // TypeScript cannot resolve socket.io's listener type for an event not yet known; each call of handle names one.
      socket.on(event, listener as Parameters<typeof socket.on<E>>[1]);
    };

    handle('thread:join', async (payload) => {
      const { threadId } = threadParamsSchema.parse(payload);
      const access = await threadFor(db, threadId, user);
      await socket.join(rooms.thread(threadId));
      return { canWrite: access.canWrite };
    }, { sessionCheck: true });

    handle('thread:leave', async (payload) => {
      const { threadId } = threadParamsSchema.parse(payload);
      await socket.leave(rooms.thread(threadId));
      return {};
    });

    handle('job:watch', async (payload) => {
      const { jobId } = jobParamsSchema.parse(payload);
      const job = await jobForLiveWatcher(db, jobId, user);
      await socket.join(rooms.job(jobId));
      // An award saved between the check and the join sent its room change before this socket was in the
      // room (see keepOnlyParties): while the job looked open, ask again once in, and leave if no longer allowed.
      if (job.status === 'open') {
        await jobForLiveWatcher(db, jobId, user).catch(async (error: unknown) => {
          await socket.leave(rooms.job(jobId));
          throw error;
        });
      }
      return {};
    }, { sessionCheck: true });

    handle('job:unwatch', async (payload) => {
      const { jobId } = jobParamsSchema.parse(payload);
      await socket.leave(rooms.job(jobId));
      return {};
    });

    handle('message:send', async (payload) => {
      const { threadId } = threadParamsSchema.parse(payload);
      const input = sendMessageSchema.parse(payload);
      // The session is checked beside the message's other reads (one round trip), still before it is stored.
      const { message, duplicate } = await sendMessage(messageDeps, user, threadId, input, { sessionCheck: checkSession });
      return { message, duplicate };
    });

    handle('typing', async (payload) => {
      const { threadId } = threadParamsSchema.parse(payload);
      if (!socket.rooms.has(rooms.thread(threadId))) throw new AppError('forbidden', 'Join the conversation first.', 403);
      socket.to(rooms.thread(threadId)).emit('typing', { threadId, userId: user.id, displayName: user.displayName });
      return {};
    }, { sessionCheck: true });

    handle('read', async (payload) => {
      const { threadId } = threadParamsSchema.parse(payload);
      const { messageId } = markReadSchema.parse(payload);
      await markRead(messageDeps, user, threadId, messageId);
      return {};
    }, { sessionCheck: true });
  });

  hub.io = io;
  return io;
}
