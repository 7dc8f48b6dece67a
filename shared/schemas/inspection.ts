import { z } from 'zod';
import { boreSpecSchema, cylinderReadingsSchema, lengthUnitSchema, refineTraceForFilter, roughnessFilterSchema } from './calculations';

/**
 * What the shop measured and how. Computed figures are never sent: the server works them out again.
 * The temperature comes in °C (`temperatureC`) or °F (`temperatureF`), exactly one of them; records
 * stored before °F existed all carry `temperatureC`.
 */
export const inspectionConditionsSchema = z
  .object({
    unit: lengthUnitSchema,
    gaugeResolution: z.number({ error: 'Enter the gauge’s resolution.' }).positive('The resolution must be greater than zero.').max(1, 'That resolution is too coarse.'),
    /** Expanded measurement uncertainty U of the bore readings, in `unit`; without it the gauge resolution stands in as a lower bound. */
    uncertainty: z.number({ error: 'The uncertainty must be a number.' }).positive('The uncertainty must be greater than zero.').max(1, 'That uncertainty is too large.').optional(),
    temperatureC: z.number({ error: 'Enter the temperature at measurement.' }).min(-20, 'Below −20 °C? Check the figure.').max(60, 'Above 60 °C? Check the figure.').optional(),
    temperatureF: z.number({ error: 'Enter the temperature at measurement.' }).min(-4, 'Below −4 °F? Check the figure.').max(140, 'Above 140 °F? Check the figure.').optional(),
    torquePlate: z.boolean({ error: 'Say whether a torque plate was fitted.' }),
  })
  .superRefine((c, ctx) => {
    if (c.temperatureC === undefined && c.temperatureF === undefined) {
      ctx.addIssue({ code: 'custom', path: ['temperatureC'], message: 'Enter the temperature at measurement.' });
    }
    if (c.temperatureC !== undefined && c.temperatureF !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['temperatureF'], message: 'Give the temperature once, in °C or in °F.' });
    }
  });
export type InspectionConditions = z.infer<typeof inspectionConditionsSchema>;

export const finishInputSchema = z.discriminatedUnion('mode', [
  z.object({
    mode: z.literal('values'),
    raUm: z.number({ error: 'Enter Ra.' }).positive('Ra must be greater than zero.').max(100),
    rkUm: z.number().positive().max(100).optional(),
    rpkUm: z.number().positive().max(100).optional(),
    rvkUm: z.number().positive().max(100).optional(),
    mr1: z.number().min(0).max(100).optional(),
    mr2: z.number().min(0).max(100).optional(),
  }),
  z.object({
    mode: z.literal('profile'),
    heightsUm: z.array(z.number().finite()).min(10, 'A trace needs at least 10 heights.').max(200_000, 'A trace may have at most 200,000 heights.'),
    spacingUm: z.number({ error: 'Enter the sample spacing.' }).positive('The spacing must be greater than zero.'),
    /** Left out: no filter (the trace is a roughness profile already), as in records made before the choice existed. */
    filter: roughnessFilterSchema.optional(),
  }).superRefine(refineTraceForFilter),
]);

export const crosshatchInputSchema = z.discriminatedUnion('mode', [
  z.object({ mode: z.literal('measured'), includedAngleDeg: z.number({ error: 'Enter the measured angle.' }).gt(0, 'The angle must be greater than 0°.').lt(180, 'The angle must be less than 180°.') }),
  z.object({
    mode: z.literal('settings'),
    spindleRpm: z.number({ error: 'Enter the spindle speed.' }).positive('The spindle speed must be greater than zero.'),
    strokeLength: z.number({ error: 'Enter the stroke length.' }).positive('The stroke length must be greater than zero.'),
    cyclesPerMinute: z.number({ error: 'Enter the full up-and-down cycles per minute (one stroke up and one down is one cycle).' }).positive('The cycles per minute must be greater than zero.'),
  }),
]);

export const inspectionInputSchema = z.object({
  conditions: inspectionConditionsSchema,
  cylinders: z.array(cylinderReadingsSchema, { error: 'Enter the bore readings.' }).min(1).max(16),
  deck: z
    .object({
      readings: z.array(z.number().min(0, 'A feeler reading cannot be negative.').max(1)).min(1, 'Enter at least one straightedge reading.').max(40),
      raUm: z.number().positive().max(100).optional(),
    })
    .optional(),
  finish: finishInputSchema.optional(),
  crosshatch: crosshatchInputSchema.optional(),
  signedOffBy: z.string({ error: 'Sign the record with your name.' }).trim().min(2, 'Sign the record with your name.').max(80),
  notes: z.string().trim().max(2000).default(''),
});
export type InspectionInput = z.infer<typeof inspectionInputSchema>;

/** A draft may be incomplete; it is only kept, never judged. */
export const inspectionDraftSchema = z.object({ draft: z.record(z.string(), z.unknown()) });

export const rejectInspectionSchema = z.object({
  reasons: z.string({ error: 'Say what needs redoing.' }).trim().min(5, 'Say what needs redoing.').max(2000),
});

/** conforms, fails or not proven (ISO 14253-1's uncertainty range under guarded acceptance). */
export type CheckVerdict = 'conforms' | 'fails' | 'not-proven';

/**
 * The record as a whole: every limit judged and conforming (pass), at least one failing (fail),
 * none failing but at least one limit that could not be judged (not-fully-judged), or every
 * limit judged, none failing, some not proven (not-proven).
 */
export type RecordVerdict = 'pass' | 'fail' | 'not-fully-judged' | 'not-proven';

export interface LimitCheck {
  /** e.g. "cylinder 3 taper", "deck out-of-flat", "bore Ra". */
  what: string;
  value: number;
  allowed: string;
  /** True only when the check conforms (kept for records stored before verdicts). */
  pass: boolean;
  /** Absent on records stored before verdicts: read it with `checkVerdict`. */
  verdict?: CheckVerdict;
  /** Which limit: size, clearanceMin, clearanceMax, maxTaper, maxOutOfRound, deck, deckRa, finish, crosshatch. */
  limit?: string;
  /** One-based cylinder, for bore checks. */
  cylinder?: number;
  /** Where the value came from, in words (the worst reading's place, the piston used, a default limit). */
  note?: string;
}

/** A limit the job sets that the record gave nothing to judge against. */
export interface NotJudged {
  what: string;
  why: string;
}

/** The readings of one cylinder corrected to 20 °C, and the piston each clearance used. */
export interface CorrectedCylinder {
  top: { thrust: number; axial: number };
  middle: { thrust: number; axial: number };
  bottom: { thrust: number; axial: number };
  /** The piston at 20 °C: the record's own reading corrected, or the job's piston diameter. */
  piston?: number;
  pistonSource?: 'record' | 'job';
}

export interface InspectionResults {
  /** Bore figures worked out from the readings corrected to 20 °C (records stored before the correction: from the raw readings). */
  bores: ReturnType<typeof import('../calc/bore').inspectBores>;
  deck?: { outOfFlat: number; limit: number; pass: boolean; limitSource: string };
  /** `filter`: what was applied to a trace (absent for entered values and for results stored before the choice existed). */
  finish?: { raUm: number; rqUm?: number; rzUm?: number; rkUm?: number; rpkUm?: number; rvkUm?: number; mr1?: number; mr2?: number; filter?: import('../calc/roughness').AppliedFilter };
  crosshatch?: { includedAngleDeg: number };
  checks: LimitCheck[];
  /** True only when every limit was judged and every check conforms. */
  pass: boolean;
  /** Absent on records stored before verdicts: read it with `recordVerdict`. */
  verdict?: RecordVerdict;
  notJudged?: NotJudged[];
  decisionRule?: {
    rule: 'simple' | 'guarded';
    name: string;
    words: string;
    /** The expanded uncertainty used, in the record's unit. */
    uncertainty: number;
    uncertaintySource: 'entered' | 'gauge-resolution';
    /** What the uncertainty is, in words (a lower bound when it is the gauge resolution). */
    uncertaintyWords: string;
  };
  temperature?: {
    measuredC: number;
    enteredUnit: 'C' | 'F';
    referenceC: number;
    block: { material: 'cast-iron' | 'aluminium'; alpha: number; words: string };
    piston: { material: 'cast-iron' | 'aluminium'; alpha: number; words: string };
    source: string;
  };
  /** The readings at 20 °C, per cylinder (the raw ones stay in the input). */
  corrected?: CorrectedCylinder[];
  /** The record's statements in plain sentences: the rule, the uncertainty, the temperature correction, the pistons used. */
  statements?: string[];
}

/** A check's verdict, also for records stored before verdicts existed. */
export const checkVerdict = (check: LimitCheck): CheckVerdict => check.verdict ?? (check.pass ? 'conforms' : 'fails');

/** The record's verdict, also for records stored before verdicts existed. */
export const recordVerdict = (results: InspectionResults): RecordVerdict => results.verdict ?? (results.pass ? 'pass' : 'fail');

export const RECORD_VERDICT_WORDS: Record<RecordVerdict, string> = {
  pass: 'Pass: every limit judged, every check conforms',
  fail: 'Fail: at least one check fails',
  'not-fully-judged': 'Not fully judged: at least one limit could not be judged',
  'not-proven': 'Not proven: no check fails, but at least one lies within the measurement uncertainty of its limit',
};

export interface InspectionVersion {
  id: string;
  version: number;
  status: 'submitted' | 'accepted' | 'rejected' | 'superseded';
  input: InspectionInput;
  results: InspectionResults;
  submittedAt: string;
  decidedAt: string | null;
  rejectReasons: string | null;
}

export const milestoneKinds = ['block_received', 'teardown', 'operation_started', 'operation_finished', 'inspection_submitted', 'ready_for_pickup', 'shipped', 'delivered', 'note'] as const;

/** The most photos one milestone may carry. */
export const MAX_PHOTOS_PER_MILESTONE = 4;

export const milestoneInputSchema = z
  .object({
    kind: z.enum(milestoneKinds, { error: 'Choose what happened.' }).refine((kind) => kind !== 'inspection_submitted', 'Submit the inspection record itself; it is logged on its own.'),
    operation: z.string().max(40).optional(),
    note: z.string().trim().max(2000, 'Use at most 2,000 characters.').default(''),
    carrier: z.string().trim().max(60).optional(),
    trackingNumber: z.string().trim().max(60).optional(),
    /** Photos the shop uploaded to this job first (POST /api/jobs/:jobId/milestone-photos). */
    photoIds: z
      .array(z.uuid({ error: 'That photo id is not valid.' }), { error: 'Send the photos as a list of ids.' })
      .max(MAX_PHOTOS_PER_MILESTONE, `A milestone can carry at most ${MAX_PHOTOS_PER_MILESTONE} photos.`)
      .refine((ids) => new Set(ids).size === ids.length, 'The same photo is attached twice.')
      .optional(),
  })
  .superRefine((m, ctx) => {
    if ((m.kind === 'operation_started' || m.kind === 'operation_finished') && !m.operation) {
      ctx.addIssue({ code: 'custom', path: ['operation'], message: 'Say which operation.' });
    }
    if (m.kind === 'shipped' && (!m.carrier || !m.trackingNumber)) {
      ctx.addIssue({ code: 'custom', path: ['trackingNumber'], message: 'Give the carrier and the tracking number.' });
    }
    if ((m.kind === 'teardown' || m.kind === 'note') && !m.note) {
      ctx.addIssue({ code: 'custom', path: ['note'], message: 'Write what you found.' });
    }
  });
export type MilestoneInput = z.infer<typeof milestoneInputSchema>;

export interface Milestone {
  id: string;
  kind: (typeof milestoneKinds)[number];
  operation: string | null;
  note: string;
  carrier: string | null;
  trackingNumber: string | null;
  author: { id: string; displayName: string };
  /** In the order the shop attached them; empty when none. */
  photos: MilestonePhoto[];
  createdAt: string;
}

export interface MilestonePhoto {
  id: string;
  width: number;
  height: number;
  thumbUrl: string;
  largeUrl: string;
}

/** The answer to a milestone photo upload: the stored photos, ready to go with a milestone's photoIds. */
export interface UploadedMilestonePhotos {
  photos: MilestonePhoto[];
}

/** Used by the form to show live results with the same rules the server applies. */
export type { BoreSpecInput } from './calculations';
export { boreSpecSchema };
