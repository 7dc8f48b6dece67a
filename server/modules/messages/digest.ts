import { sql } from 'drizzle-orm';
import type { Logger } from 'pino';
import type { Database } from '../../db/client';
import { threadReads } from '../../db/schema';
import { enqueueMail } from '../../lib/mail/outbox';
import { unreadDigestMail } from '../../lib/mail/templates';

/** Unread this long before a digest goes out. */
export const DIGEST_AFTER_MS = 10 * 60_000;
const DIGEST_LOCK = 748_201; // any constant shared by every instance

/**
 * One mail per person and conversation when messages there have waited
 * unread for ten minutes, covering everything unread so far; the next digest
 * of that conversation covers only messages after it. An advisory lock keeps
 * two instances from sending the same digest.
 */
export async function sendDueDigests(deps: { db: Database; appUrl: string }, now: Date = new Date()): Promise<number> {
  return deps.db.transaction(async (tx) => {
    const lock = await tx.execute<{ locked: boolean }>(sql`SELECT pg_try_advisory_xact_lock(${DIGEST_LOCK}) AS locked`);
    if (!lock.rows[0].locked) return 0;
    const due = await tx.execute<{
      thread_id: string;
      user_id: string;
      email: string;
      display_name: string;
      job_id: string;
      job_title: string;
      other_name: string;
      unread: number;
      newest: Date;
    }>(sql`
      WITH parties AS (
        SELECT t.id AS thread_id, j.id AS job_id, j.title AS job_title, j.builder_id AS user_id, s.name AS other_name
        FROM threads t JOIN jobs j ON j.id = t.job_id JOIN shops s ON s.id = t.shop_id
        UNION ALL
        SELECT t.id, j.id, j.title, s.user_id, b.display_name
        FROM threads t JOIN jobs j ON j.id = t.job_id JOIN shops s ON s.id = t.shop_id JOIN users b ON b.id = j.builder_id
      )
      SELECT p.thread_id, p.user_id, u.email, u.display_name, p.job_id, p.job_title, p.other_name,
             count(m.id)::int AS unread, max(m.created_at) AS newest
      FROM parties p
      JOIN users u ON u.id = p.user_id AND u.status = 'active'
      LEFT JOIN thread_reads r ON r.thread_id = p.thread_id AND r.user_id = p.user_id
      JOIN messages m ON m.thread_id = p.thread_id AND m.author_id <> p.user_id
        AND m.created_at > greatest(coalesce(r.last_read_at, '-infinity'::timestamptz), coalesce(r.digested_through, '-infinity'::timestamptz))
      GROUP BY p.thread_id, p.user_id, u.email, u.display_name, p.job_id, p.job_title, p.other_name
      HAVING min(m.created_at) <= ${new Date(now.getTime() - DIGEST_AFTER_MS).toISOString()}::timestamptz`);
    for (const row of due.rows) {
      const newest = new Date(row.newest);
      await tx
        .insert(threadReads)
        .values({ threadId: row.thread_id, userId: row.user_id, digestedThrough: newest })
        .onConflictDoUpdate({ target: [threadReads.threadId, threadReads.userId], set: { digestedThrough: newest } });
      await enqueueMail(
        tx,
        row.email,
        unreadDigestMail({ displayName: row.display_name, otherName: row.other_name, jobTitle: row.job_title, unread: Number(row.unread), url: `${deps.appUrl}/jobs/${row.job_id}` }),
      );
    }
    return due.rows.length;
  });
}

export function startDigestWorker(deps: { db: Database; appUrl: string; logger?: Logger }, intervalMs = 60_000) {
  const timer = setInterval(() => {
    sendDueDigests(deps).catch((err) => deps.logger?.warn({ err }, 'message digest pass failed'));
  }, intervalMs);
  timer.unref();
  return { stop: () => clearInterval(timer) };
}
