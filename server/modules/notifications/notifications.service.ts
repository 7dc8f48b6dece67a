import { and, count, desc, eq, isNull, sql } from 'drizzle-orm';
import { mailTopicKinds, mailTopics, type MailTopicKind } from '../../../shared/notifications';
import type { Notification, NotificationPage, NotificationPreferences, NotificationPreferencesInput } from '../../../shared/schemas/notifications';
import type { Database, Executor } from '../../db/client';
import { notificationPreferences, notifications, type User } from '../../db/schema';
import { notFound } from '../../lib/errors';
import type { RealtimeHub } from '../../realtime/hub';
import { toNotification } from './notify';

export interface NotificationDeps {
  db: Database;
  hub?: RealtimeHub;
}

export const NOTIFICATIONS_PAGE = 20;

async function unreadCount(db: Executor, userId: string): Promise<number> {
  const [row] = await db.select({ n: count() }).from(notifications).where(and(eq(notifications.userId, userId), isNull(notifications.readAt)));
  return row.n;
}

/** A page of the person's notices, newest first, after the one named by the cursor, with their unread count. */
export async function listNotifications(db: Database, user: User, cursor: string | undefined): Promise<NotificationPage> {
  const after = cursor
    ? sql`(${notifications.createdAt}, ${notifications.id}) < (SELECT created_at, id FROM notifications WHERE id = ${cursor} AND user_id = ${user.id})`
    : undefined;
  const rows = await db
    .select()
    .from(notifications)
    .where(and(eq(notifications.userId, user.id), after))
    .orderBy(desc(notifications.createdAt), desc(notifications.id))
    .limit(NOTIFICATIONS_PAGE + 1);
  const page = rows.slice(0, NOTIFICATIONS_PAGE);
  return {
    notifications: page.map(toNotification),
    nextCursor: rows.length > NOTIFICATIONS_PAGE ? page[page.length - 1].id : null,
    unread: await unreadCount(db, user.id),
  };
}

export async function unreadNotifications(db: Database, user: User) {
  return { unread: await unreadCount(db, user.id) };
}

/** Marks one of the person's own notices read; someone else's is not found. */
export async function markNotificationRead(deps: NotificationDeps, user: User, id: string): Promise<Notification> {
  const [existing] = await deps.db.select().from(notifications).where(and(eq(notifications.id, id), eq(notifications.userId, user.id)));
  if (!existing) throw notFound('No notification with that id.');
  if (existing.readAt) return toNotification(existing);
  const [row] = await deps.db.update(notifications).set({ readAt: new Date() }).where(eq(notifications.id, id)).returning();
  deps.hub?.notificationsRead(user.id);
  return toNotification(row);
}

export async function markAllNotificationsRead(deps: NotificationDeps, user: User) {
  await deps.db
    .update(notifications)
    .set({ readAt: new Date() })
    .where(and(eq(notifications.userId, user.id), isNull(notifications.readAt)));
  deps.hub?.notificationsRead(user.id);
  return { unread: 0 };
}

/** Every kind of e-mail with the person's choice; mail that always goes is listed as on and cannot be turned off. */
export async function notificationPreferencesOf(db: Executor, user: User): Promise<NotificationPreferences> {
  const rows = await db.select().from(notificationPreferences).where(eq(notificationPreferences.userId, user.id));
  const chosen = new Map(rows.map((r) => [r.kind, r.email]));
  return {
    preferences: mailTopicKinds.map((kind) => {
      const topic = mailTopics[kind];
      return { kind, label: topic.label, email: topic.optional ? (chosen.get(kind) ?? true) : true, canTurnOff: topic.optional };
    }),
  };
}

/** Stores the person's choices for optional kinds; a choice about mail that always goes is ignored. */
export async function saveNotificationPreferences(db: Database, user: User, input: NotificationPreferencesInput): Promise<NotificationPreferences> {
  const optional = input.preferences.filter((p) => mailTopics[p.kind as MailTopicKind].optional);
  await db.transaction(async (tx) => {
    for (const { kind, email } of optional) {
      await tx
        .insert(notificationPreferences)
        .values({ userId: user.id, kind, email })
        .onConflictDoUpdate({ target: [notificationPreferences.userId, notificationPreferences.kind], set: { email } });
    }
  });
  return notificationPreferencesOf(db, user);
}
