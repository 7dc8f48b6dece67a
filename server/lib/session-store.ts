import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import type pg from 'pg';

/** How often a session's expiry is pushed forward in the database while it is in use. */
export const SESSION_TOUCH_INTERVAL_MS = 60 * 60_000;

type Callback = (err?: unknown) => void;
type StoredSession = session.SessionData & { touchedAt?: number };

/**
 * Sessions in PostgreSQL (connect-pg-simple). The cookie's expiry slides on
 * every response, but the row is rewritten at most once an hour while the
 * session is only being read, instead of an UPDATE on every request.
 */
export function createSessionStore(pool: pg.Pool) {
  const PgStore = connectPgSimple(session);

  class ThrottledPgStore extends PgStore {
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
