/**
 * Request and answer schemas for the calculation API (POST
 * /api/calculations/<route>); the request schemas are also used by the
 * calculator forms. Each field has a plain-English message;
 * physically impossible input (zero or negative sizes, zero speed, an empty
 * profile, NaN or infinite numbers) fails here, so the route answers 400 and
 * the library in shared/calc never sees it.
 *
 * Lengths are in the request's `unit` (inch or millimetre). Upper bounds are
 * generous sanity caps that keep results finite, not engineering limits.
 */
import { z } from 'zod';
import { MIN_PROFILE_POINTS, gaussianFilterProblem } from '../calc/roughness';
import { clearanceVolume } from '../calc/engine';
import { BALANCE_GRADES } from '../calc/balance';

/** Largest length accepted, in the request's unit (a 10 m bore in millimetres). */
export const MAX_LENGTH = 10_000;
/** Largest volume accepted, cc. */
export const MAX_VOLUME_CC = 10_000_000;
/** Largest speed or rate accepted (rev/min, cycles/min). */
export const MAX_RATE = 100_000;
/** Most cylinders accepted in one request. */
export const MAX_CYLINDERS = 64;
/** Most straightedge readings accepted. */
export const MAX_DECK_READINGS = 100;
/** Most profile heights accepted. */
export const MAX_PROFILE_POINTS = 500_000;
/** Largest profile height accepted, either sign, µm (10 cm). */
export const MAX_HEIGHT_UM = 100_000;

function withCommas(value: number): string {
  return String(value).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

/** A finite number with "required" and "must be a number" messages. */
function numberField(label: string) {
  return z.number({
    error: (issue) => (issue.input === undefined ? `${label} is required.` : `${label} must be a number.`),
  });
}

function positive(label: string, max = MAX_LENGTH) {
  return numberField(label)
    .positive(`${label} must be greater than zero.`)
    .max(max, `${label} must be at most ${withCommas(max)}.`);
}

function nonNegative(label: string, max = MAX_LENGTH) {
  return numberField(label)
    .min(0, `${label} cannot be negative.`)
    .max(max, `${label} must be at most ${withCommas(max)}.`);
}

function signed(label: string, maxAbs = MAX_LENGTH) {
  return numberField(label)
    .min(-maxAbs, `${label} must be at least -${withCommas(maxAbs)}.`)
    .max(maxAbs, `${label} must be at most ${withCommas(maxAbs)}.`);
}

export const lengthUnitSchema = z.enum(['in', 'mm'], { error: 'Choose inches or millimetres.' });

// --- engine geometry -------------------------------------------------------

export const displacementRequestSchema = z.object({
  unit: lengthUnitSchema,
  bore: positive('Bore'),
  stroke: positive('Stroke'),
  cylinders: numberField('Number of cylinders')
    .int('Number of cylinders must be a whole number.')
    .min(1, 'Number of cylinders must be at least 1.')
    .max(MAX_CYLINDERS, `Number of cylinders must be at most ${MAX_CYLINDERS}.`),
});

const compressionFields = {
  unit: lengthUnitSchema,
  bore: positive('Bore'),
  stroke: positive('Stroke'),
  chamberCc: nonNegative('Chamber volume', MAX_VOLUME_CC),
  pistonCc: signed('Piston volume', MAX_VOLUME_CC),
  deckClearance: signed('Deck clearance'),
  gasketBore: positive('Gasket bore'),
  gasketThickness: nonNegative('Gasket thickness'),
};

type CompressionFieldValues = { [K in keyof typeof compressionFields]?: unknown };

/** Refuses a set of volumes that leaves no space above the piston at top dead centre. */
function refineClearanceVolume(value: CompressionFieldValues, ctx: z.RefinementCtx): void {
  // Runs even when a field above failed, so only judge complete, valid input.
  const numbers = [value.bore, value.stroke, value.chamberCc, value.pistonCc, value.deckClearance, value.gasketBore, value.gasketThickness];
  if (!numbers.every((n) => typeof n === 'number' && Number.isFinite(n))) return;
  if (value.unit !== 'in' && value.unit !== 'mm') return;
  const input = value as z.infer<z.ZodObject<typeof compressionFields>>;
  if (clearanceVolume(input).clearanceCc <= 0) {
    ctx.addIssue({
      code: 'custom',
      path: [input.pistonCc < 0 ? 'pistonCc' : 'deckClearance'],
      message:
        'These volumes leave no space above the piston at top dead centre. Check the dome volume (negative) and the deck clearance (negative when the piston stands above the deck).',
    });
  }
}

export const compressionRatioRequestSchema = z.object(compressionFields).superRefine(refineClearanceVolume);

export const dynamicCompressionRequestSchema = z
  .object({
    ...compressionFields,
    rodLength: positive('Rod length'),
    intakeClosingDegAbdc: numberField('Intake closing angle')
      .min(0, 'Intake closing angle cannot be negative.')
      .max(180, 'Intake closing angle must be at most 180 degrees after bottom dead centre.'),
  })
  .superRefine((value, ctx) => {
    refineClearanceVolume(value, ctx);
    const { stroke, rodLength } = value;
    if (typeof stroke === 'number' && typeof rodLength === 'number' && Number.isFinite(stroke) && rodLength <= stroke / 2) {
      ctx.addIssue({ code: 'custom', path: ['rodLength'], message: 'Rod length must be longer than half the stroke.' });
    }
  });

// --- balance ------------------------------------------------------------------

/** Heaviest rotor accepted, kg. */
export const MAX_ROTOR_MASS_KG = 100_000;
/** Heaviest mass accepted in a bob weight, g. */
export const MAX_GRAMS = 1_000_000;

export const balanceToleranceRequestSchema = z.object({
  rotorMassKg: positive('Rotor mass', MAX_ROTOR_MASS_KG),
  serviceRpm: positive('Service speed', MAX_RATE),
  grade: z.literal(BALANCE_GRADES, { error: `Choose an ISO 21940-11 balance grade: G ${BALANCE_GRADES.join(', G ')}.` }),
});

export const bobWeightRequestSchema = z.object({
  rotatingGrams: nonNegative('Rotating mass', MAX_GRAMS),
  reciprocatingGrams: nonNegative('Reciprocating mass', MAX_GRAMS),
  /** Left out: 0.5, common practice for a 90° V8. */
  reciprocatingFactor: nonNegative('Reciprocating factor', 1).optional(),
  /** Left out: no oil allowance. */
  oilGrams: nonNegative('Oil allowance', MAX_GRAMS).optional(),
});

// --- stack-up -------------------------------------------------------------------

export const deckClearanceRequestSchema = z.object({
  unit: lengthUnitSchema,
  deckHeight: positive('Deck height'),
  stroke: positive('Stroke'),
  rodLength: positive('Rod length'),
  compressionHeight: positive('Compression height'),
  /** Left out: no quench figure. */
  gasketThickness: nonNegative('Gasket thickness').optional(),
});

export const bearingClearanceRequestSchema = z
  .object({
    unit: lengthUnitSchema,
    housingBore: positive('Housing bore'),
    journalDiameter: positive('Journal diameter'),
    shellWall: positive('Shell wall'),
  })
  .superRefine((value, ctx) => {
    const { housingBore, journalDiameter } = value;
    if (typeof housingBore === 'number' && typeof journalDiameter === 'number' && journalDiameter >= housingBore) {
      ctx.addIssue({ code: 'custom', path: ['journalDiameter'], message: 'Journal diameter must be smaller than the housing bore.' });
    }
  });

// --- honing -----------------------------------------------------------------

const honeFields = {
  unit: lengthUnitSchema,
  bore: positive('Bore'),
  spindleRpm: positive('Spindle speed', MAX_RATE),
  strokeLength: positive('Stroke length'),
};

export const crosshatchRequestSchema = z.object({
  ...honeFields,
  cyclesPerMinute: positive('Cycles per minute', MAX_RATE),
});

export const crosshatchRateRequestSchema = z.object({
  ...honeFields,
  includedAngleDeg: numberField('Included angle')
    .positive('Included angle must be greater than 0 degrees.')
    .lt(180, 'Included angle must be less than 180 degrees.'),
});

// --- bores --------------------------------------------------------------------

const readingPairSchema = z.object(
  {
    thrust: positive('Thrust reading'),
    axial: positive('Axial reading'),
  },
  { error: 'Enter a thrust and an axial reading.' },
);

export const cylinderReadingsSchema = z.object(
  {
    top: readingPairSchema,
    middle: readingPairSchema,
    bottom: readingPairSchema,
    piston: positive('Piston diameter').optional(),
  },
  { error: 'Enter the top, middle and bottom readings.' },
);

export const boreSpecSchema = z
  .object({
    targetBore: positive('Target bore').optional(),
    targetTolerance: nonNegative('Target tolerance').optional(),
    clearanceMin: nonNegative('Minimum clearance').optional(),
    clearanceMax: nonNegative('Maximum clearance').optional(),
    maxTaper: nonNegative('Maximum taper').optional(),
    maxOutOfRound: nonNegative('Maximum out-of-round').optional(),
  })
  .superRefine((spec, ctx) => {
    if (typeof spec.clearanceMin === 'number' && typeof spec.clearanceMax === 'number' && spec.clearanceMin > spec.clearanceMax) {
      ctx.addIssue({ code: 'custom', path: ['clearanceMax'], message: 'Maximum clearance cannot be smaller than minimum clearance.' });
    }
  });

export const boreInspectionRequestSchema = z.object({
  unit: lengthUnitSchema,
  cylinders: z
    .array(cylinderReadingsSchema, { error: 'Enter the readings for each cylinder.' })
    .min(1, 'Enter the readings for at least one cylinder.')
    .max(MAX_CYLINDERS, `Enter at most ${MAX_CYLINDERS} cylinders.`),
  spec: boreSpecSchema.optional(),
});

export const boreSizeRequestSchema = z
  .object({
    unit: lengthUnitSchema,
    pistonDiameter: positive('Piston diameter'),
    clearanceMin: nonNegative('Minimum clearance'),
    clearanceMax: nonNegative('Maximum clearance'),
    honeAllowance: nonNegative('Hone allowance'),
  })
  .superRefine((value, ctx) => {
    const { pistonDiameter, clearanceMin, clearanceMax, honeAllowance } = value;
    if (![pistonDiameter, clearanceMin, clearanceMax, honeAllowance].every((n) => typeof n === 'number' && Number.isFinite(n))) return;
    if (clearanceMin > clearanceMax) {
      ctx.addIssue({ code: 'custom', path: ['clearanceMax'], message: 'Maximum clearance cannot be smaller than minimum clearance.' });
      return;
    }
    if (honeAllowance >= pistonDiameter + (clearanceMin + clearanceMax) / 2) {
      ctx.addIssue({ code: 'custom', path: ['honeAllowance'], message: 'Hone allowance must be smaller than the finished bore.' });
    }
  });

// --- deck ---------------------------------------------------------------------

export const deckFlatnessRequestSchema = z.object({
  unit: lengthUnitSchema,
  readings: z
    .array(nonNegative('Each straightedge reading'), { error: 'Enter the straightedge readings.' })
    .min(1, 'Enter at least one straightedge reading.')
    .max(MAX_DECK_READINGS, `Enter at most ${MAX_DECK_READINGS} straightedge readings.`),
  material: z.enum(['cast-iron', 'aluminium'], { error: 'Choose cast iron or aluminium.' }),
  gasket: z.enum(['mls', 'composite'], { error: 'Choose a multi-layer steel or composite gasket.' }),
  /** Optional: the shop's own limit, replacing the common-practice table. */
  shopLimit: positive('Shop limit').optional(),
});

// --- roughness ----------------------------------------------------------------

/** Longest Gaussian cut-off accepted, mm (ISO 4288's longest standard cut-off is 8 mm). */
export const MAX_CUTOFF_MM = 25;

/**
 * How the trace becomes a roughness profile: `none` (the default: the trace is
 * a roughness profile already) or the ISO 16610-21 Gaussian filter at a
 * cut-off in millimetres (shared/calc/roughness.ts says what is done).
 */
export const roughnessFilterSchema = z.discriminatedUnion(
  'kind',
  [z.object({ kind: z.literal('none') }), z.object({ kind: z.literal('gaussian'), cutoffMm: positive('Cut-off', MAX_CUTOFF_MM) })],
  { error: 'Choose no filter or the Gaussian filter with a cut-off.' },
);
export type RoughnessFilterInput = z.infer<typeof roughnessFilterSchema>;

/** Refuses a trace too short (or too coarsely sampled) for the Gaussian cut-off asked for; `at` prefixes the path. */
export function refineTraceForFilter(
  value: { heightsUm?: unknown; spacingUm?: unknown; filter?: { kind?: unknown; cutoffMm?: unknown } },
  ctx: z.RefinementCtx,
): void {
  // Runs even when a field above failed, so only judge complete, valid input.
  const { heightsUm, spacingUm, filter } = value;
  if (filter?.kind !== 'gaussian' || !Array.isArray(heightsUm)) return;
  if (![spacingUm, filter.cutoffMm].every((n) => typeof n === 'number' && Number.isFinite(n) && n > 0)) return;
  const problem = gaussianFilterProblem(heightsUm.length, spacingUm as number, filter.cutoffMm as number);
  if (problem) ctx.addIssue({ code: 'custom', path: problem.field.split('.'), message: problem.message });
}

export const roughnessRequestSchema = z
  .object({
    heightsUm: z
      .array(signed('Each height', MAX_HEIGHT_UM), { error: 'Enter the profile heights as a list of numbers.' })
      .min(MIN_PROFILE_POINTS, `A profile needs at least ${MIN_PROFILE_POINTS} heights.`)
      .max(MAX_PROFILE_POINTS, `A profile can have at most ${withCommas(MAX_PROFILE_POINTS)} heights.`),
    spacingUm: positive('Sample spacing', 1_000_000),
    /** Left out: no filter (`roughness` defaults to `{ kind: 'none' }`). */
    filter: roughnessFilterSchema.optional(),
  })
  .superRefine(refineTraceForFilter);

// --- rings --------------------------------------------------------------------

export const ringGapRequestSchema = z.object({
  unit: lengthUnitSchema,
  bore: positive('Bore'),
  application: z.enum(['street', 'performance', 'race', 'boost'], {
    error: 'Choose street, performance, race or boost.',
  }),
});

/** Every request schema by its route name under /api/calculations/. */
export const calculationRequestSchemas = {
  displacement: displacementRequestSchema,
  'compression-ratio': compressionRatioRequestSchema,
  crosshatch: crosshatchRequestSchema,
  'crosshatch-rate': crosshatchRateRequestSchema,
  'bore-inspection': boreInspectionRequestSchema,
  'bore-size': boreSizeRequestSchema,
  'deck-flatness': deckFlatnessRequestSchema,
  roughness: roughnessRequestSchema,
  'ring-gap': ringGapRequestSchema,
  'dynamic-compression': dynamicCompressionRequestSchema,
  'balance-tolerance': balanceToleranceRequestSchema,
  'bob-weight': bobWeightRequestSchema,
  'deck-clearance': deckClearanceRequestSchema,
  'bearing-clearance': bearingClearanceRequestSchema,
} as const;

export type CalculationRoute = keyof typeof calculationRequestSchemas;

// --- answers ------------------------------------------------------------------
//
// The JSON each route answers: the result of its function in shared/calc,
// field for field (tests/unit/calc/response-schemas.test.ts holds them equal),
// with the request's `unit` where the route echoes it.

/** An answer whose lengths are in the request's unit, which it names. */
function inRequestUnit<T extends z.ZodRawShape>(shape: T) {
  return z.object({ unit: lengthUnitSchema, ...shape });
}

export const displacementAnswerSchema = z.object({
  cc: z.number(),
  litres: z.number(),
  cubicInches: z.number(),
});

export const compressionRatioAnswerSchema = z.object({
  ratio: z.number(),
  sweptCc: z.number(),
  clearanceCc: z.number(),
  chamberCc: z.number(),
  pistonCc: z.number(),
  gasketCc: z.number(),
  deckCc: z.number(),
});

const honeSpeeds = {
  /** π · D · n, length unit per minute. */
  peripheralSpeed: z.number(),
  /** 2 · L · f, length unit per minute. */
  axialSpeed: z.number(),
};

export const crosshatchAnswerSchema = z.object({
  includedAngleDeg: z.number(),
  scratchAngleDeg: z.number(),
  ...honeSpeeds,
});

export const crosshatchRateAnswerSchema = z.object({
  cyclesPerMinute: z.number(),
  ...honeSpeeds,
});

export const boreLimitSchema = z.enum(['targetBore', 'clearanceMin', 'clearanceMax', 'maxTaper', 'maxOutOfRound']);

/** One cylinder's figures and verdict (shared/calc/bore.ts `CylinderInspection`). */
export const cylinderInspectionSchema = z.object({
  mean: z.number(),
  smallest: z.number(),
  largest: z.number(),
  taper: z.number(),
  taperThrust: z.number(),
  taperAxial: z.number(),
  outOfRound: z.number(),
  outOfRoundByDepth: z.object({ top: z.number(), middle: z.number(), bottom: z.number() }),
  /** The clearances are there only when the piston was measured. */
  thrustClearance: z.object({ smallest: z.number(), largest: z.number() }).optional(),
  clearance: z.number().optional(),
  tightestClearance: z.number().optional(),
  /** There only when the spec gives a target bore. */
  deviation: z.number().optional(),
  pass: z.boolean(),
  failures: z.array(z.object({ limit: boreLimitSchema, value: z.number(), allowed: z.number() })),
  notChecked: z.array(boreLimitSchema),
});

export const boreInspectionAnswerSchema = inRequestUnit({
  cylinders: z.array(cylinderInspectionSchema),
  worst: z.object({
    taper: z.number(),
    outOfRound: z.number(),
    taperCylinder: z.number().int(),
    outOfRoundCylinder: z.number().int(),
  }),
  pass: z.boolean(),
});

export const boreSizeAnswerSchema = inRequestUnit({
  finishedBore: z.number(),
  boreTo: z.number(),
  targetClearance: z.number(),
});

export const deckFlatnessAnswerSchema = inRequestUnit({
  outOfFlat: z.number(),
  limit: z.number(),
  pass: z.boolean(),
  limitSource: z.enum(['table', 'shop']),
});

/** The filter a roughness answer says it applied (shared/calc/roughness.ts `AppliedFilter`), lengths in mm. */
export const appliedFilterSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('none'),
    evaluatedPoints: z.number().int(),
    /** There when the spacing was given. */
    evaluationLengthMm: z.number().optional(),
    method: z.string(),
  }),
  z.object({
    kind: z.literal('gaussian'),
    cutoffMm: z.number(),
    formRemoval: z.literal('least-squares line'),
    trimmedStartMm: z.number(),
    trimmedEndMm: z.number(),
    samplingLengths: z.number().int(),
    evaluationLengthMm: z.number(),
    evaluatedPoints: z.number().int(),
    rkFilter: z.literal('ISO 13565-1 valley suppression'),
    method: z.string(),
  }),
]);

export const roughnessAnswerSchema = z.object({
  mean: z.number(),
  ra: z.number(),
  rq: z.number(),
  rz: z.number(),
  rk: z.number(),
  rpk: z.number(),
  rvk: z.number(),
  mr1: z.number(),
  mr2: z.number(),
  construction: z.object({
    secantFrom: z.number(),
    secantTo: z.number(),
    top: z.number(),
    bottom: z.number(),
    a1: z.number(),
    a2: z.number(),
  }),
  points: z.number().int(),
  filter: appliedFilterSchema,
  /** There when the spacing was given. */
  lengthUm: z.number().optional(),
});

export const ringGapAnswerSchema = inRequestUnit({
  topRing: z.number(),
  secondRing: z.number(),
  topFactor: z.number(),
  secondFactor: z.number(),
});

export const dynamicCompressionAnswerSchema = inRequestUnit({
  staticRatio: z.number(),
  dynamicRatio: z.number(),
  /** Piston distance below top dead centre when the intake closes. */
  effectiveStroke: z.number(),
});

export const balanceToleranceAnswerSchema = z.object({
  specificUnbalanceGmmPerKg: z.number(),
  permissibleUnbalanceGmm: z.number(),
  perPlaneGmm: z.number(),
});

export const bobWeightAnswerSchema = z.object({
  bobWeightGrams: z.number(),
  reciprocatingFactor: z.number(),
});

export const deckClearanceAnswerSchema = inRequestUnit({
  pistonDeckClearance: z.number(),
  /** There only when the gasket thickness was given. */
  quench: z.number().optional(),
});

export const bearingClearanceAnswerSchema = inRequestUnit({
  clearance: z.number(),
  clearancePerInchOfJournal: z.number(),
});

export type LengthUnitInput = z.infer<typeof lengthUnitSchema>;
export type DisplacementRequest = z.infer<typeof displacementRequestSchema>;
export type CompressionRatioRequest = z.infer<typeof compressionRatioRequestSchema>;
export type CrosshatchRequest = z.infer<typeof crosshatchRequestSchema>;
export type CrosshatchRateRequest = z.infer<typeof crosshatchRateRequestSchema>;
export type CylinderReadingsInput = z.infer<typeof cylinderReadingsSchema>;
export type BoreSpecInput = z.infer<typeof boreSpecSchema>;
export type BoreInspectionRequest = z.infer<typeof boreInspectionRequestSchema>;
export type BoreSizeRequest = z.infer<typeof boreSizeRequestSchema>;
export type DeckFlatnessRequest = z.infer<typeof deckFlatnessRequestSchema>;
export type RoughnessRequest = z.infer<typeof roughnessRequestSchema>;
export type RingGapRequest = z.infer<typeof ringGapRequestSchema>;
export type DisplacementAnswer = z.infer<typeof displacementAnswerSchema>;
export type CompressionRatioAnswer = z.infer<typeof compressionRatioAnswerSchema>;
export type CrosshatchAnswer = z.infer<typeof crosshatchAnswerSchema>;
export type CrosshatchRateAnswer = z.infer<typeof crosshatchRateAnswerSchema>;
export type CylinderInspectionAnswer = z.infer<typeof cylinderInspectionSchema>;
export type BoreInspectionAnswer = z.infer<typeof boreInspectionAnswerSchema>;
export type BoreSizeAnswer = z.infer<typeof boreSizeAnswerSchema>;
export type DeckFlatnessAnswer = z.infer<typeof deckFlatnessAnswerSchema>;
export type AppliedFilterAnswer = z.infer<typeof appliedFilterSchema>;
export type RoughnessAnswer = z.infer<typeof roughnessAnswerSchema>;
export type RingGapAnswer = z.infer<typeof ringGapAnswerSchema>;
export type DynamicCompressionRequest = z.infer<typeof dynamicCompressionRequestSchema>;
export type BalanceToleranceRequest = z.infer<typeof balanceToleranceRequestSchema>;
export type BobWeightRequest = z.infer<typeof bobWeightRequestSchema>;
export type DeckClearanceRequest = z.infer<typeof deckClearanceRequestSchema>;
export type BearingClearanceRequest = z.infer<typeof bearingClearanceRequestSchema>;
export type DynamicCompressionAnswer = z.infer<typeof dynamicCompressionAnswerSchema>;
export type BalanceToleranceAnswer = z.infer<typeof balanceToleranceAnswerSchema>;
export type BobWeightAnswer = z.infer<typeof bobWeightAnswerSchema>;
export type DeckClearanceAnswer = z.infer<typeof deckClearanceAnswerSchema>;
export type BearingClearanceAnswer = z.infer<typeof bearingClearanceAnswerSchema>;
