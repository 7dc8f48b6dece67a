import type { RouteDef } from './lib/http/routes';
import { authRoutes } from './modules/auth/auth.routes';
import { calculationsRoutes } from './modules/calculations/calculations.routes';
import { healthRoutes } from './modules/health/health.routes';
import { messagesRoutes } from './modules/messages/messages.routes';
import { milestonesRoutes } from './modules/milestones/milestones.routes';
import { shopsRoutes } from './modules/shops/shops.routes';

/**
 * Every declared API route, module by module, in the order the app mounts
 * them. The OpenAPI document and the authorization matrix read this list;
 * tests/api/openapi.test.ts holds it equal to what the router serves.
 */
export const routeModules = {
  health: healthRoutes,
  auth: authRoutes,
  calculations: calculationsRoutes,
  shops: shopsRoutes,
  messages: messagesRoutes,
  milestones: milestonesRoutes,
} satisfies Record<string, readonly RouteDef<never>[]>;

export const apiRoutes: readonly RouteDef<never>[] = Object.values(routeModules).flat();
