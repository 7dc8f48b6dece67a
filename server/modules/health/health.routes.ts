import type pg from 'pg';
import { z } from 'zod';
import { routesFor } from '../../lib/http/routes';

const healthSchema = z.object({ status: z.enum(['ok', 'degraded']), db: z.enum(['ok', 'unavailable']) });

const route = routesFor<{ pool: pg.Pool }>('Health');

/** Liveness and database reachability; 503 (same shape, "degraded") while the database is away. */
export const healthRoutes = [
  route({
    method: 'get',
    path: '/api/health',
    summary: 'Service and database health (503 with status "degraded" while the database is away)',
    access: 'public',
    reply: { json: healthSchema, description: 'The service answers; db says whether the database does' },
    handler: async ({ deps, res }) => {
      try {
        await Promise.race([
          deps.pool.query('SELECT 1'),
          new Promise((_, reject) => setTimeout(() => reject(new Error('database check timed out')), 3_000).unref()),
        ]);
        return { status: 'ok' as const, db: 'ok' as const };
      } catch {
        res.status(503);
        return { status: 'degraded' as const, db: 'unavailable' as const };
      }
    },
  }),
];
