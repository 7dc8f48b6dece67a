import { sql } from 'drizzle-orm';
import { boolean, index, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { mustReference, stampedNow, uuidPrimaryKey } from './columns';
import { jobs } from './jobs';
import { users } from './users-and-sessions';

// What the app tells a person inside it, and which optional e-mails they turned off.

/** A notice in a person's notification centre, written in the transaction of the change it tells of. */
export const notifications = pgTable(
  'notifications',
  {
    id: uuidPrimaryKey(),
    userId: mustReference(() => users.id, { onDelete: 'cascade' }),
    /** One of shared/notifications.ts `noticeKinds`. */
    kind: text().notNull(),
    jobId: uuid().references(() => jobs.id, { onDelete: 'cascade' }),
    text: text().notNull(),
    /** A path inside the app. */
    href: text().notNull(),
    createdAt: stampedNow(),
    readAt: timestamp({ withTimezone: true }),
  },
  (t) => [
    index('notifications_user_idx').on(t.userId, t.createdAt.desc(), t.id.desc()),
    index('notifications_unread_idx').on(t.userId).where(sql`${t.readAt} IS NULL`),
  ],
);

/** A person's choice about one optional kind of e-mail (shared/notifications.ts `mailTopics`); no row means on. */
export const notificationPreferences = pgTable(
  'notification_preferences',
  {
    userId: mustReference(() => users.id, { onDelete: 'cascade' }),
    kind: text().notNull(),
    email: boolean().notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.kind] })],
);
