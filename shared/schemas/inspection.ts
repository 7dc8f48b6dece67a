import { z } from 'zod';
import { MAX_PHOTOS_PER_MILESTONE, milestoneKinds } from './values';
import {
  appliedFilterSchema,
  boreInspectionAnswerSchema,
  boreSpecSchema,
  cylinderReadingsSchema,
  lengthUnitSchema,
  refineTraceForFilter,
  roughnessFilterSchema,
} from './calculations';
import { deckSectionSchema, inspectionSectionsSchema, sectionResultSchema } from './inspection-sections';

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
    /** Whether a torque plate was fitted while the bores were measured; left out for work without bores. */
    torquePlate: z.boolean({ error: 'Say whether a torque plate was fitted.' }).optional(),
  })
  .superRefine((c, ctx) => {
    if (c.temperatureC === undefined && c.temperatureF === undefined) {
      ctx.addIssue({ code: 'custom', path: ['temperatureC'], message: 'Enter the temperature at measurement.' });
    }
    if (c.temperatureC !== undefined && c.temperatureF !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['temperatureF'], message: 'Give the temperature once, in °C or in °F.' });
    }
    // The resolution is a lower bound on U (ISO 14253-1, ILAC-G8): a smaller U would narrow guarded acceptance below what the gauge can tell.
    if (c.uncertainty !== undefined && c.uncertainty < c.gaugeResolution - 1e-12) {
      ctx.addIssue({ code: 'custom', path: ['uncertainty'], message: 'The uncertainty cannot be smaller than the gauge’s resolution; leave it empty to use the resolution.' });
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
  /** The bore grid: needed when the job orders work on the bores. */
  cylinders: z.array(cylinderReadingsSchema, { error: 'Enter the bore readings.' }).min(1).max(16).optional(),
  deck: deckSectionSchema.optional(),
  /** The other kinds of work's sections (shared/schemas/inspection-sections.ts). */
  sections: inspectionSectionsSchema.optional(),
  finish: finishInputSchema.optional(),
  crosshatch: crosshatchInputSchema.optional(),
  signedOffBy: z.string({ error: 'Sign the record with your name.' }).trim().min(2, 'Sign the record with your name.').max(80),
  notes: z.string().trim().max(2000).default(''),
});
export type InspectionInput = z.infer<typeof inspectionInputSchema>;

/** A draft may be incomplete; it is only kept, never judged. */
export const inspectionDraftSchema = z.object({ draft: z.record(z.string(), z.unknown()) });

const versionAnsweredSchema = (verb: string) => z.number({ error: `Say which version of the record you ${verb}.` }).int().min(1, `Say which version of the record you ${verb}.`);

/** The builder asks for changes to one version, the one they read: a version that is no longer the one waiting is refused. */
export const rejectInspectionSchema = z.object({
  version: versionAnsweredSchema('answer'),
  reasons: z.string({ error: 'Say what needs redoing.' }).trim().min(5, 'Say what needs redoing.').max(2000),
});
export type RejectInspectionInput = z.input<typeof rejectInspectionSchema>;

/**
 * The builder accepts one version, the one they read: a version that is no
 * longer the one waiting is refused. When that version has checks that do not
 * conform, each is named here as the accept dialog listed it (the names of
 * `checksNotConforming`).
 */
export const acceptInspectionSchema = z.object({
  version: versionAnsweredSchema('accept'),
  confirmedChecks: z.array(z.string().max(500)).max(1000).optional(),
});
export type AcceptInspectionInput = z.input<typeof acceptInspectionSchema>;

/** conforms, fails or not proven (ISO 14253-1's uncertainty range under guarded acceptance). */
export const checkVerdictSchema = z.enum(['conforms', 'fails', 'not-proven']);
export type CheckVerdict = z.infer<typeof checkVerdictSchema>;

/**
 * The record as a whole: every limit judged and conforming (pass), at least one failing (fail),
 * none failing but at least one limit that could not be judged (not-fully-judged), or every
 * limit judged, none failing, some not proven (not-proven).
 */
export const recordVerdictSchema = z.enum(['pass', 'fail', 'not-fully-judged', 'not-proven']);
export type RecordVerdict = z.infer<typeof recordVerdictSchema>;

// --- answers ------------------------------------------------------------------
//
// What the inspection routes answer, as it goes over the wire. A stored record
// keeps the shape it was written with: records stored before verdicts (or the
// temperature correction, the decision rule, the trace filter) lack those keys,
// so they are optional here and read with `checkVerdict`/`recordVerdict`.

export const limitCheckSchema = z.object({
  /** e.g. "cylinder 3 taper", "deck out-of-flat", "bore Ra". */
  what: z.string(),
  value: z.number(),
  allowed: z.string(),
  /** True only when the check conforms (kept for records stored before verdicts). */
  pass: z.boolean(),
  /** Absent on records stored before verdicts: read it with `checkVerdict`. */
  verdict: checkVerdictSchema.optional(),
  /** Which limit: size, clearanceMin, clearanceMax, maxTaper, maxOutOfRound, deck, deckRa, finish, crosshatch. */
  limit: z.string().optional(),
  /** One-based cylinder, for bore checks. */
  cylinder: z.number().int().optional(),
  /** Where the value came from, in words (the worst reading's place, the piston used, a default limit). */
  note: z.string().optional(),
  /** The value in words where it is not a number (a crack test's result); `value` is then 0. */
  valueText: z.string().optional(),
  /** Which part of the record: an operation code ('line-hone', 'deck', …) or 'bores', 'finish', 'crosshatch' for the bore grid's shared checks. Absent on records stored before sections. */
  section: z.string().optional(),
});
export type LimitCheck = z.infer<typeof limitCheckSchema>;

/** A limit the job sets that the record gave nothing to judge against. */
export const notJudgedSchema = z.object({ what: z.string(), why: z.string(), section: z.string().optional() });
export type NotJudged = z.infer<typeof notJudgedSchema>;

const directionPairSchema = z.object({ thrust: z.number(), axial: z.number() });

/** The readings of one cylinder corrected to 20 °C, and the piston each clearance used. */
export const correctedCylinderSchema = z.object({
  top: directionPairSchema,
  middle: directionPairSchema,
  bottom: directionPairSchema,
  /** The piston at 20 °C: the record's own reading corrected, or the job's piston diameter. */
  piston: z.number().optional(),
  pistonSource: z.enum(['record', 'job']).optional(),
});
export type CorrectedCylinder = z.infer<typeof correctedCylinderSchema>;

const expansionSchema = z.object({ material: z.enum(['cast-iron', 'aluminium']), alpha: z.number(), words: z.string() });

export const inspectionResultsSchema = z.object({
  /** Bore figures worked out from the readings corrected to 20 °C (records stored before the correction: from the raw readings); absent when the record has no bore grid. */
  bores: boreInspectionAnswerSchema.omit({ unit: true }).optional(),
  /** The deck calculation's answer in the record's unit; `limitSource` is read as text, as records have always stored it. */
  deck: z.object({ outOfFlat: z.number(), limit: z.number(), pass: z.boolean(), limitSource: z.string() }).optional(),
  /** One per operation the job orders, in the catalogue's order; absent on records stored before sections. */
  sections: z.array(sectionResultSchema).optional(),
  /** `filter`: what was applied to a trace (absent for entered values and for results stored before the choice existed). */
  finish: z
    .object({
      raUm: z.number(),
      rqUm: z.number().optional(),
      rzUm: z.number().optional(),
      rkUm: z.number().optional(),
      rpkUm: z.number().optional(),
      rvkUm: z.number().optional(),
      mr1: z.number().optional(),
      mr2: z.number().optional(),
      filter: appliedFilterSchema.optional(),
    })
    .optional(),
  crosshatch: z.object({ includedAngleDeg: z.number() }).optional(),
  checks: z.array(limitCheckSchema),
  /** True only when every limit was judged and every check conforms. */
  pass: z.boolean(),
  /** Absent on records stored before verdicts: read it with `recordVerdict`. */
  verdict: recordVerdictSchema.optional(),
  notJudged: z.array(notJudgedSchema).optional(),
  decisionRule: z
    .object({
      rule: z.enum(['simple', 'guarded']),
      name: z.string(),
      words: z.string(),
      /** The expanded uncertainty used, in the record's unit. */
      uncertainty: z.number(),
      uncertaintySource: z.enum(['entered', 'gauge-resolution']),
      /** What the uncertainty is, in words (a lower bound when it is the gauge resolution). */
      uncertaintyWords: z.string(),
    })
    .optional(),
  temperature: z
    .object({
      measuredC: z.number(),
      enteredUnit: z.enum(['C', 'F']),
      referenceC: z.number(),
      block: expansionSchema,
      piston: expansionSchema,
      source: z.string(),
    })
    .optional(),
  /** The readings at 20 °C, per cylinder (the raw ones stay in the input). */
  corrected: z.array(correctedCylinderSchema).optional(),
  /** The record's statements in plain sentences: the rule, the uncertainty, the temperature correction, the pistons used. */
  statements: z.array(z.string()).optional(),
});
export type InspectionResults = z.infer<typeof inspectionResultsSchema>;

export { RECORD_VERDICT_WORDS, checkVerdict, recordVerdict } from './values';


/** The readings as stored: the input schema without its trimming and default (a stored record always has both). */
const storedInputSchema = inspectionInputSchema.extend({ signedOffBy: z.string(), notes: z.string() });

export const inspectionVersionSchema = z.object({
  id: z.uuid(),
  version: z.number().int(),
  status: z.enum(['submitted', 'accepted', 'rejected']),
  input: storedInputSchema,
  results: inspectionResultsSchema,
  submittedAt: z.iso.datetime(),
  decidedAt: z.iso.datetime().nullable(),
  rejectReasons: z.string().nullable(),
  /** The version that replaced this one (the next one the shop sent after changes were asked); null for the newest. */
  replacedBy: z.number().int().nullable(),
});
export type InspectionVersion = z.infer<typeof inspectionVersionSchema>;

/** GET /api/jobs/:jobId/inspection */
export const inspectionViewSchema = z.object({
  /** Newest first. */
  versions: z.array(inspectionVersionSchema),
  /** The shop's unfinished entry; only the shop gets it. */
  draft: z.record(z.string(), z.unknown()).nullable(),
  /** When the review window of the latest submitted version ends. */
  reviewDueAt: z.iso.datetime().nullable(),
  /** Whether that version is accepted by itself when the window ends: only when every check conforms (null: none waiting). */
  autoAccept: z.boolean().nullable(),
  /** True once the window has ended on a version still waiting (one that does not conform waits for the builder). */
  reviewWindowEnded: z.boolean(),
  /** The shop doing the work, as the certificate names it. */
  shop: z.object({ name: z.string(), place: z.string() }).nullable(),
});
export type InspectionView = z.infer<typeof inspectionViewSchema>;

/** The answer to submitting, accepting or rejecting: the version as it now stands. */
export const inspectionVersionAnswerSchema = z.object({ version: inspectionVersionSchema });
export type InspectionVersionAnswer = z.infer<typeof inspectionVersionAnswerSchema>;

export const draftSavedSchema = z.object({ savedAt: z.iso.datetime() });
export type DraftSaved = z.infer<typeof draftSavedSchema>;


export { MAX_PHOTOS_PER_MILESTONE, milestoneKinds };

export const milestoneInputSchema = z
  .object({
    kind: z
      .enum(milestoneKinds, { error: 'Choose what happened.' })
      .refine((kind) => kind !== 'inspection_submitted', 'Submit the inspection record itself; it is logged on its own.')
      .refine((kind) => kind !== 'sent_to_shop', 'Only the builder logs sending the parts to the shop.'),
    operation: z.string().max(40).optional(),
    note: z.string().trim().max(2000, 'Use at most 2,000 characters.').default(''),
    carrier: z.string().trim().max(60).optional(),
    trackingNumber: z.string().trim().max(60).optional(),
    /** Photos the shop uploaded to this job first (POST /api/jobs/:jobId/milestone-photos). */
    photoIds: z
      .array(z.uuid({ error: 'That photo id is not valid.' }), { error: 'Send the photos as a list of ids.' })
      .max(MAX_PHOTOS_PER_MILESTONE, `A progress step can carry at most ${MAX_PHOTOS_PER_MILESTONE} photos.`)
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

// A milestone as the API answers it: shared/schemas/milestones.ts.

/** Used by the form to show live results with the same rules the server applies. */
export type { BoreSpecInput } from './calculations';
export { boreSpecSchema };
