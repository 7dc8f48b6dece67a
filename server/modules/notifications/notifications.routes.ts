import {
  needsYouSchema,
  notificationPageSchema,
  notificationParamsSchema,
  notificationPreferencesInputSchema,
  notificationPreferencesSchema,
  notificationSchema,
  notificationsQuerySchema,
  unreadNotificationsSchema,
} from '../../../shared/schemas/notifications';
import { z } from 'zod';
import { routesFor } from '../../lib/http/routes';
import { needsYou } from './needs-you';
import {
  listNotifications,
  markAllNotificationsRead,
  markNotificationRead,
  notificationPreferencesOf,
  saveNotificationPreferences,
  unreadNotifications,
  type NotificationDeps,
} from './notifications.service';

const route = routesFor<NotificationDeps>('Notifications');

/** What waits on the signed-in person, their notices, and which e-mails they get. */
export const notificationsRoutes = [
  route({
    method: 'get',
    path: '/api/me/needs-you',
    summary: 'What waits on the signed-in person: bids to compare, payments due, results to review, jobs coming due, disputes',
    access: 'signed-in',
    reply: { json: needsYouSchema },
    handler: ({ deps, user }) => needsYou(deps.db, user),
  }),
  route({
    method: 'get',
    path: '/api/notifications',
    summary: 'The person’s notices, newest first, 20 a page, with the unread count',
    access: 'signed-in',
    query: notificationsQuerySchema,
    reply: { json: notificationPageSchema },
    handler: ({ deps, user, query }) => listNotifications(deps.db, user, query.cursor),
  }),
  route({
    method: 'get',
    path: '/api/notifications/unread',
    summary: 'How many of the person’s notices are unread',
    access: 'signed-in',
    reply: { json: unreadNotificationsSchema },
    handler: ({ deps, user }) => unreadNotifications(deps.db, user),
  }),
  route({
    method: 'post',
    path: '/api/notifications/read-all',
    summary: 'Mark every notice of the person read',
    access: 'signed-in',
    reply: { json: unreadNotificationsSchema },
    handler: ({ deps, user }) => markAllNotificationsRead(deps, user),
  }),
  route({
    method: 'post',
    path: '/api/notifications/:notificationId/read',
    summary: 'Mark one of the person’s notices read',
    access: 'signed-in',
    params: notificationParamsSchema,
    reply: { json: z.object({ notification: notificationSchema }) },
    handler: async ({ deps, user, params }) => ({ notification: await markNotificationRead(deps, user, params.notificationId) }),
  }),
  route({
    method: 'get',
    path: '/api/me/notification-preferences',
    summary: 'Which kinds of e-mail the person gets; receipts, dispute decisions and account mail always go',
    access: 'signed-in',
    reply: { json: notificationPreferencesSchema },
    handler: ({ deps, user }) => notificationPreferencesOf(deps.db, user),
  }),
  route({
    method: 'put',
    path: '/api/me/notification-preferences',
    summary: 'Turn optional kinds of e-mail on or off',
    access: 'signed-in',
    body: notificationPreferencesInputSchema,
    reply: { json: notificationPreferencesSchema },
    handler: ({ deps, user, body }) => saveNotificationPreferences(deps.db, user, body),
  }),
];
