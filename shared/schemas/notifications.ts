import { z } from 'zod';
import { mailTopicKinds, noticeKinds } from '../notifications';
import { uuidSchema } from './common';

// --- requests -----------------------------------------------------------------

export const notificationsQuerySchema = z.object({
  /** The id of the last notification of the page before: the next page starts after it. */
  cursor: uuidSchema.optional(),
});

export const notificationParamsSchema = z.object({ notificationId: uuidSchema });

export const notificationPreferencesInputSchema = z.object({
  preferences: z
    .array(z.object({ kind: z.enum(mailTopicKinds, { error: 'That is not a kind of notice.' }), email: z.boolean({ error: 'Say on or off.' }) }))
    .max(mailTopicKinds.length * 2, 'Too many choices.'),
});
export type NotificationPreferencesInput = z.infer<typeof notificationPreferencesInputSchema>;

// --- answers ------------------------------------------------------------------

export const notificationSchema = z.object({
  id: z.uuid(),
  kind: z.enum(noticeKinds),
  jobId: z.uuid().nullable(),
  text: z.string(),
  /** Where in the app the notice leads (a path). */
  href: z.string(),
  createdAt: z.iso.datetime(),
  readAt: z.iso.datetime().nullable(),
});
export type Notification = z.infer<typeof notificationSchema>;

export const notificationPageSchema = z.object({
  notifications: z.array(notificationSchema),
  /** Pass as `cursor` for the next page; null on the last. */
  nextCursor: z.uuid().nullable(),
  unread: z.number().int(),
});
export type NotificationPage = z.infer<typeof notificationPageSchema>;

export const unreadNotificationsSchema = z.object({ unread: z.number().int() });
export type UnreadNotifications = z.infer<typeof unreadNotificationsSchema>;

export const notificationPreferencesSchema = z.object({
  preferences: z.array(
    z.object({
      kind: z.enum(mailTopicKinds),
      label: z.string(),
      email: z.boolean(),
      /** False for mail that always goes (receipts, dispute decisions, the account's own mail). */
      canTurnOff: z.boolean(),
    }),
  ),
});
export type NotificationPreferences = z.infer<typeof notificationPreferencesSchema>;

export const needsYouKinds = [
  'bids-to-compare',
  'payment-due',
  'results-to-review',
  'dispute-waiting',
  'bid-accepted-awaiting-payment',
  'jobs-coming-due',
  'record-rejected',
  'dispute-to-decide',
] as const;

export const needsYouSchema = z.object({
  items: z.array(
    z.object({
      kind: z.enum(needsYouKinds),
      jobId: z.uuid(),
      title: z.string(),
      text: z.string(),
      /** When the thing is due (the review window's end, the agreed finish), or null. */
      dueAt: z.iso.datetime().nullable(),
      href: z.string(),
    }),
  ),
});
export type NeedsYou = z.infer<typeof needsYouSchema>;
export type NeedsYouItem = NeedsYou['items'][number];
