import {
  balanceTolerance,
  bearingClearance,
  bobWeight,
  compressionRatio,
  deckClearance,
  dynamicCompression,
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
  balanceToleranceAnswerSchema,
  balanceToleranceRequestSchema,
  bearingClearanceAnswerSchema,
  bearingClearanceRequestSchema,
  bobWeightAnswerSchema,
  bobWeightRequestSchema,
  deckClearanceAnswerSchema,
  deckClearanceRequestSchema,
  dynamicCompressionAnswerSchema,
  dynamicCompressionRequestSchema,
  boreInspectionAnswerSchema,
  boreInspectionRequestSchema,
  boreSizeAnswerSchema,
  boreSizeRequestSchema,
  compressionRatioAnswerSchema,
  compressionRatioRequestSchema,
  crosshatchAnswerSchema,
  crosshatchRateAnswerSchema,
  crosshatchRateRequestSchema,
  crosshatchRequestSchema,
  deckFlatnessAnswerSchema,
  deckFlatnessRequestSchema,
  displacementAnswerSchema,
  displacementRequestSchema,
  ringGapAnswerSchema,
  ringGapRequestSchema,
  roughnessAnswerSchema,
  roughnessRequestSchema,
} from '../../../shared/schemas/calculations';
import type { Database } from '../../db/client';
import { routesFor } from '../../lib/http/routes';
import { createLimiter } from '../../lib/rate-limit';

/** A 500,000-point profile written as JSON numbers is a few megabytes. */
export const ROUGHNESS_BODY_LIMIT = '12mb';

type CalculationDeps = { db: Database; perMinute: number };

/** One count per address across every calculation (the same function on each route, so one limiter). */
const perAddressLimit = (deps: CalculationDeps) => [
  createLimiter({
    db: deps.db,
    name: 'calculations-ip',
    windowMs: 60_000,
    limit: deps.perMinute,
    message: 'Too many calculations from your network in the last minute. Wait a moment and try again.',
  }),
];

const route = routesFor<CalculationDeps>('Calculations');

/** The parts every calculation route shares: a public POST with no CSRF token, behind the per-address limit. */
const calculation = { method: 'post', access: 'public', csrf: false, use: perAddressLimit } as const;

/**
 * The calculation API: JSON in, JSON out, open to signed-out visitors and to
 * scripts. Nothing here reads or writes stored data, so these POSTs need no
 * session and no CSRF token; they are rate limited per address instead.
 * Lengths come back in the request's unit.
 */
export const calculationsRoutes = [
  route({
    ...calculation,
    path: '/api/calculations/displacement',
    summary: 'Calculate: displacement',
    body: displacementRequestSchema,
    reply: { json: displacementAnswerSchema },
    handler: ({ body }) => displacement(body),
  }),
  route({
    ...calculation,
    path: '/api/calculations/compression-ratio',
    summary: 'Calculate: compression ratio',
    body: compressionRatioRequestSchema,
    reply: { json: compressionRatioAnswerSchema },
    handler: ({ body }) => compressionRatio(body),
  }),
  route({
    ...calculation,
    path: '/api/calculations/crosshatch',
    summary: 'Calculate: crosshatch',
    body: crosshatchRequestSchema,
    reply: { json: crosshatchAnswerSchema },
    handler: ({ body }) => crosshatchAngle(body),
  }),
  route({
    ...calculation,
    path: '/api/calculations/crosshatch-rate',
    summary: 'Calculate: crosshatch rate',
    body: crosshatchRateRequestSchema,
    reply: { json: crosshatchRateAnswerSchema },
    handler: ({ body }) => crosshatchRate(body),
  }),
  route({
    ...calculation,
    path: '/api/calculations/bore-inspection',
    summary: 'Calculate: bore inspection',
    body: boreInspectionRequestSchema,
    reply: { json: boreInspectionAnswerSchema },
    handler: ({ body }) => ({ unit: body.unit, ...inspectBores(body) }),
  }),
  route({
    ...calculation,
    path: '/api/calculations/bore-size',
    summary: 'Calculate: bore size',
    body: boreSizeRequestSchema,
    reply: { json: boreSizeAnswerSchema },
    handler: ({ body }) => ({ unit: body.unit, ...boreSize(body) }),
  }),
  route({
    ...calculation,
    path: '/api/calculations/deck-flatness',
    summary: 'Calculate: deck flatness',
    body: deckFlatnessRequestSchema,
    reply: { json: deckFlatnessAnswerSchema },
    handler: ({ body }) => ({ unit: body.unit, ...deckFlatness(body) }),
  }),
  route({
    ...calculation,
    path: '/api/calculations/roughness',
    summary: 'Calculate: roughness',
    body: roughnessRequestSchema,
    reply: { json: roughnessAnswerSchema },
    // `filter` left out means none; the answer's `filter` says what was applied.
    handler: ({ body }) => roughness(body.heightsUm, body.spacingUm, body.filter),
  }),
  route({
    ...calculation,
    path: '/api/calculations/ring-gap',
    summary: 'Calculate: ring gap',
    body: ringGapRequestSchema,
    reply: { json: ringGapAnswerSchema },
    handler: ({ body }) => ({ unit: body.unit, ...ringGap(body) }),
  }),
  route({
    ...calculation,
    path: '/api/calculations/dynamic-compression',
    summary: 'Calculate: dynamic compression ratio',
    body: dynamicCompressionRequestSchema,
    reply: { json: dynamicCompressionAnswerSchema },
    handler: ({ body }) => ({ unit: body.unit, ...dynamicCompression(body) }),
  }),
  route({
    ...calculation,
    path: '/api/calculations/balance-tolerance',
    summary: 'Calculate: permissible residual unbalance (ISO 21940-11)',
    body: balanceToleranceRequestSchema,
    reply: { json: balanceToleranceAnswerSchema },
    handler: ({ body }) => balanceTolerance(body),
  }),
  route({
    ...calculation,
    path: '/api/calculations/bob-weight',
    summary: 'Calculate: bob weight',
    body: bobWeightRequestSchema,
    reply: { json: bobWeightAnswerSchema },
    handler: ({ body }) => bobWeight(body),
  }),
  route({
    ...calculation,
    path: '/api/calculations/deck-clearance',
    summary: 'Calculate: piston deck clearance and quench',
    body: deckClearanceRequestSchema,
    reply: { json: deckClearanceAnswerSchema },
    handler: ({ body }) => ({ unit: body.unit, ...deckClearance(body) }),
  }),
  route({
    ...calculation,
    path: '/api/calculations/bearing-clearance',
    summary: 'Calculate: bearing oil clearance',
    body: bearingClearanceRequestSchema,
    reply: { json: bearingClearanceAnswerSchema },
    handler: ({ body }) => ({ unit: body.unit, ...bearingClearance(body) }),
  }),
];
