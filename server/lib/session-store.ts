import connectPgSimple from 'connect-pg-simple';
import { and, eq, sql } from 'drizzle-orm';
import type { Request } from 'express';
import session from 'express-session';
import type pg from 'pg';
import type { Database } from '../db/client';
import { sessions, users, type User } from '../db/schema';

/** How often a session's expiry is pushed forward in the database while it is in use. */
export const SESSION_TOUCH_INTERVAL_MS = 60 * 60_000;

type Callback = (err?: unknown) => void;
type StoredSession = session.SessionData & { touchedAt?: number; passport?: { user?: string } };

/**
 * The account row read with each signed-in session, keyed by the session's `passport`
 * object (express-session hands that same object on as `req.session.passport`). Held
 * weakly: it goes with the request.
 */
const usersReadWithSession = new WeakMap<object, User | null>();

/**
 * The account of a signed-in session as it stood when the session was loaded for this
 * request, in the same statement: `null` when the account is gone, `undefined` when the
 * session was not loaded that way (just signed in) and the caller must read it itself.
 */
export function userReadWithSession(req: Request, userId: string): User | null | undefined {
  const passport = (req.session as StoredSession | undefined)?.passport;
  if (!passport) return undefined;
  const user = usersReadWithSession.get(passport);
  usersReadWithSession.delete(passport);
  if (user === undefined || (user !== null && user.id !== userId)) return undefined;
  return user;
}

/**
 * Sessions in PostgreSQL (connect-pg-simple). The cookie's expiry slides on
 * every response, but the row is rewritten at most once an hour while the
 * session is only being read, instead of an UPDATE on every request. A
 * signed-in session is read together with its account in one statement, so a
 * signed-in request costs one round trip to the database before its own work
 * instead of two (passport's deserializer takes the row from `userReadWithSession`).
 */
export function createSessionStore(pool: pg.Pool, db: Database) {
  const PgStore = connectPgSimple(session);
  // Prepared once (built once here, parsed once per connection by PostgreSQL): it runs on every signed-in request.
  const sessionWithUser = db
    .select({ sess: sessions.sess, user: users })
    .from(sessions)
    // The serializer writes the account id (a uuid) and nothing else under passport.user.
    .leftJoin(users, sql`${users.id} = (${sessions.sess} #>> '{passport,user}')::uuid`)
    // As connect-pg-simple asks: expiry to the second.
    .where(and(eq(sessions.sid, sql.placeholder('sid')), sql`${sessions.expire} >= to_timestamp(${sql.placeholder('now')})`))
    .prepare('session_with_user');

  class ThrottledPgStore extends PgStore {
    override get(sid: string, fn: (err: unknown, sess?: session.SessionData | null) => void) {
      sessionWithUser.execute({ sid, now: Math.ceil(Date.now() / 1000) }).then(
        ([row]) => {
          if (!row) return fn(null, null);
          const sess = (typeof row.sess === 'string' ? JSON.parse(row.sess) : row.sess) as StoredSession;
          if (sess.passport && typeof sess.passport === 'object') usersReadWithSession.set(sess.passport, row.user);
          fn(null, sess);
        },
        (error: unknown) => fn(error),
      );
    }

    override set(sid: string, sess: session.SessionData, fn?: Callback) {
      (sess as StoredSession).touchedAt = Date.now();
      super.set(sid, sess, fn);
    }

    override touch(sid: string, sess: session.SessionData, fn?: Callback) {
      const touchedAt = (sess as StoredSession).touchedAt ?? 0;
      if (Date.now() - touchedAt < SESSION_TOUCH_INTERVAL_MS) {
        fn?.();
        return;
      }
      this.set(sid, sess, fn);
    }
  }

  return new ThrottledPgStore({ pool, tableName: 'sessions', createTableIfMissing: false, pruneSessionInterval: 15 * 60 });
}
