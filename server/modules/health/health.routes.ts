import { Router } from 'express';
import type pg from 'pg';

/** Liveness and database reachability; 503 while the database is away. */
export function healthRouter(pool: pg.Pool) {
  const router = Router();
  router.get('/', async (_req, res) => {
    try {
      await Promise.race([
        pool.query('SELECT 1'),
        new Promise((_, reject) => setTimeout(() => reject(new Error('database check timed out')), 3_000).unref()),
      ]);
      res.json({ status: 'ok', db: 'ok' });
    } catch {
      res.status(503).json({ status: 'degraded', db: 'unavailable' });
    }
  });
  return router;
}
