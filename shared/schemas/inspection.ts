import { z } from 'zod';
import { boreSpecSchema, cylinderReadingsSchema, lengthUnitSchema } from './calculations';

/** What the shop measured and how. Computed figures are never sent: the server works them out again. */
export const inspectionConditionsSchema = z.object({
  unit: lengthUnitSchema,
  gaugeResolution: z.number({ error: 'Enter the gauge’s resolution.' }).positive('The resolution must be greater than zero.').max(1, 'That resolution is too coarse.'),
  temperatureC: z.number({ error: 'Enter the temperature at measurement.' }).min(-20, 'Below −20 °C? Check the figure.').max(60, 'Above 60 °C? Check the figure.'),
  torquePlate: z.boolean({ error: 'Say whether a torque plate was fitted.' }),
});

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
  }),
]);

export const crosshatchInputSchema = z.discriminatedUnion('mode', [
  z.object({ mode: z.literal('measured'), includedAngleDeg: z.number({ error: 'Enter the measured angle.' }).gt(0, 'The angle must be greater than 0°.').lt(180, 'The angle must be less than 180°.') }),
  z.object({
    mode: z.literal('settings'),
    spindleRpm: z.number({ error: 'Enter the spindle speed.' }).positive('The spindle speed must be greater than zero.'),
    strokeLength: z.number({ error: 'Enter the stroke length.' }).positive('The stroke length must be greater than zero.'),
    cyclesPerMinute: z.number({ error: 'Enter the strokes per minute.' }).positive('Must be greater than zero.'),
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

export interface LimitCheck {
  /** e.g. "cylinder 3 taper", "deck out-of-flat", "bore Ra". */
  what: string;
  value: number;
  allowed: string;
  pass: boolean;
}

export interface InspectionResults {
  bores: ReturnType<typeof import('../calc/bore').inspectBores>;
  deck?: { outOfFlat: number; limit: number; pass: boolean; limitSource: string };
  finish?: { raUm: number; rqUm?: number; rzUm?: number; rkUm?: number; rpkUm?: number; rvkUm?: number; mr1?: number; mr2?: number };
  crosshatch?: { includedAngleDeg: number };
  checks: LimitCheck[];
  pass: boolean;
}

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
