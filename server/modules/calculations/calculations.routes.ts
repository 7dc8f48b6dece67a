import { Router } from 'express';
import {
  compressionRatio,
  crosshatchAngle,
  crosshatchRate,
  deckFlatness,
  displacement,
  inspectBores,
  boreSize,
  ringGap,
  roughness,
} from '../../../shared/calc';
import {
  boreInspectionRequestSchema,
  boreSizeRequestSchema,
  compressionRatioRequestSchema,
  crosshatchRateRequestSchema,
  crosshatchRequestSchema,
  deckFlatnessRequestSchema,
  displacementRequestSchema,
  ringGapRequestSchema,
  roughnessRequestSchema,
} from '../../../shared/schemas/calculations';
import type { Database } from '../../db/client';
import { createLimiter } from '../../lib/rate-limit';

/** A 500,000-point profile written as JSON numbers is a few megabytes. */
export const ROUGHNESS_BODY_LIMIT = '12mb';

/**
 * The calculation API: JSON in, JSON out, open to signed-out visitors and to
 * scripts. Nothing here reads or writes stored data, so these POSTs need no
 * session and no CSRF token; they are rate limited per address instead.
 * Lengths come back in the request's unit.
 */
export function calculationsRouter(deps: { db: Database; perMinute: number }) {
  const router = Router();
  router.use(
    createLimiter({
      db: deps.db,
      name: 'calculations-ip',
      windowMs: 60_000,
      limit: deps.perMinute,
      message: 'Too many calculations from your network in the last minute. Wait a moment and try again.',
    }),
  );

  router.post('/displacement', (req, res) => {
    res.json(displacement(displacementRequestSchema.parse(req.body)));
  });

  router.post('/compression-ratio', (req, res) => {
    res.json(compressionRatio(compressionRatioRequestSchema.parse(req.body)));
  });

  router.post('/crosshatch', (req, res) => {
    res.json(crosshatchAngle(crosshatchRequestSchema.parse(req.body)));
  });

  router.post('/crosshatch-rate', (req, res) => {
    res.json(crosshatchRate(crosshatchRateRequestSchema.parse(req.body)));
  });

  router.post('/bore-inspection', (req, res) => {
    const input = boreInspectionRequestSchema.parse(req.body);
    res.json({ unit: input.unit, ...inspectBores(input) });
  });

  router.post('/bore-size', (req, res) => {
    const input = boreSizeRequestSchema.parse(req.body);
    res.json({ unit: input.unit, ...boreSize(input) });
  });

  router.post('/deck-flatness', (req, res) => {
    const input = deckFlatnessRequestSchema.parse(req.body);
    res.json({ unit: input.unit, ...deckFlatness(input) });
  });

  router.post('/roughness', (req, res) => {
    const input = roughnessRequestSchema.parse(req.body);
    // `filter` left out means none; the answer's `filter` says what was applied.
    res.json(roughness(input.heightsUm, input.spacingUm, input.filter));
  });

  router.post('/ring-gap', (req, res) => {
    const input = ringGapRequestSchema.parse(req.body);
    res.json({ unit: input.unit, ...ringGap(input) });
  });

  return router;
}
