import type { RouteDef } from './lib/http/routes';
import { accountRoutes } from './modules/account/account.routes';
import { adminRoutes } from './modules/admin/admin.routes';
import { authRoutes } from './modules/auth/auth.routes';
import { bidsRoutes } from './modules/bids/bids.routes';
import { calculationsRoutes } from './modules/calculations/calculations.routes';
import { catalogueRoutes } from './modules/catalogue/catalogue.routes';
import { documentsRoutes } from './modules/documents/documents.routes';
import { disputesRoutes } from './modules/disputes/disputes.routes';
import { healthRoutes } from './modules/health/health.routes';
import { helpRoutes } from './modules/help/help.routes';
import { inspectionsRoutes } from './modules/inspections/inspections.routes';
import { jobsRoutes } from './modules/jobs/jobs.routes';
import { paymentsRoutes, paymentsWebhookRoutes } from './modules/payments/payments.routes';
import { reviewsRoutes } from './modules/reviews/reviews.routes';
import { openApiRoutes } from './modules/health/openapi.routes';
import { messagesRoutes } from './modules/messages/messages.routes';
import { milestonesRoutes } from './modules/milestones/milestones.routes';
import { notificationsRoutes } from './modules/notifications/notifications.routes';
import { shippingRoutes } from './modules/shipping/shipping.routes';
import { shopsRoutes } from './modules/shops/shops.routes';

/**
 * Every declared API route, module by module, in the order the app mounts
 * them. The OpenAPI document and the authorization matrix read this list;
 * tests/api/openapi.test.ts holds it equal to what the router serves.
 */
export const routeModules = {
  health: healthRoutes,
  paymentsWebhook: paymentsWebhookRoutes,
  auth: authRoutes,
  account: accountRoutes,
  calculations: calculationsRoutes,
  catalogue: catalogueRoutes,
  help: helpRoutes,
  shops: shopsRoutes,
  jobs: jobsRoutes,
  bids: bidsRoutes,
  payments: paymentsRoutes,
  documents: documentsRoutes,
  messages: messagesRoutes,
  milestones: milestonesRoutes,
  shipping: shippingRoutes,
  inspections: inspectionsRoutes,
  disputes: disputesRoutes,
  reviews: reviewsRoutes,
  notifications: notificationsRoutes,
  admin: adminRoutes,
  openapi: openApiRoutes,
} satisfies Record<string, readonly RouteDef<never>[]>;

export const apiRoutes: readonly RouteDef<never>[] = Object.values(routeModules).flat();
