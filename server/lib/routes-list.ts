import type { Express } from 'express';

export interface ListedRoute {
  method: string;
  /** Express's own pattern, e.g. /api/jobs/:jobId */
  path: string;
}

interface Layer {
  rawPath?: string | string[];
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/**
 * Every route the app answers, read from Express's router itself, so lists
 * built from it (the OpenAPI check, the authorization matrix) cannot drift.
 */
export function listRoutes(app: Express): ListedRoute[] {
  const routes: ListedRoute[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      const own = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
      if (layer.route) {
        for (const method of Object.keys(layer.route.methods)) {
          if (method === '_all') continue;
          const path = `${prefix}${layer.route.path}`;
          routes.push({ method: method.toUpperCase(), path: path.length > 1 ? path.replace(/\/$/, '') : path });
        }
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack, `${prefix}${own}`);
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return routes;
}
