import type { NoticeKind } from '../../../shared/notifications';
import type { Notification } from '../../../shared/schemas/notifications';
import type { Executor } from '../../db/client';
import { notifications } from '../../db/schema';
import type { RealtimeHub } from '../../realtime/hub';

export type NotificationRow = typeof notifications.$inferSelect;

export const toNotification = (row: NotificationRow): Notification => ({
  id: row.id,
  kind: row.kind as NoticeKind,
  jobId: row.jobId,
  text: row.text,
  href: row.href,
  createdAt: row.createdAt.toISOString(),
  readAt: row.readAt?.toISOString() ?? null,
});

/**
 * Writes a notice into a person's notification centre. Call it with the
 * transaction of the change it tells of, beside the matching `enqueueMail`,
 * so the notice exists exactly when the change does.
 */
export async function notify(tx: Executor, userId: string, kind: NoticeKind, notice: { jobId?: string | null; text: string; href: string }): Promise<NotificationRow> {
  const [row] = await tx
    .insert(notifications)
    .values({ userId, kind, jobId: notice.jobId ?? null, text: notice.text, href: notice.href })
    .returning();
  return row;
}

/**
 * The notices one change writes, told to their people's open pages once the
 * transaction has committed (a page told earlier could fetch before the row
 * is visible):
 * `const notices = new Notices(); await db.transaction(async (tx) => { ...; await notices.add(tx, ...) }); notices.announce(hub);`
 */
export class Notices {
  private written: NotificationRow[] = [];

  async add(tx: Executor, userId: string, kind: NoticeKind, notice: { jobId?: string | null; text: string; href: string }): Promise<void> {
    this.written.push(await notify(tx, userId, kind, notice));
  }

  /** After the commit: each person's sockets hear of their new notice. */
  announce(hub: RealtimeHub | undefined): void {
    for (const row of this.written) hub?.notified(row.userId, toNotification(row));
    this.written = [];
  }
}
