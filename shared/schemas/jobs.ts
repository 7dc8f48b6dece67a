import { z } from 'zod';
import { blockMaterials, engineLayouts, logisticsOptions, pistonTypes } from './values';
import { boreOperationCodes, findOperation, partsAllow, partsNeededWords, partsOfJob, partsSent } from '../catalogue';
import { BALANCE_GRADE_CHOICES, limitGroupOperation, limitGroups, operationLimitFields, type LimitField, type OperationLimits } from '../operation-limits';
import { isoDateSchema, nearSchema, operationCodeSchema, queryInt, regionSchema, uuidSchema, withinSchema } from './common';
import { distanceUnits } from '../distance';
import { photoFileParamsSchema } from './photos';
import { builderStandingSchema } from './standing';
import { jobStatuses } from './values';

export { jobStatuses, type JobStatus } from './values';


export { blockMaterials, engineLayouts, logisticsOptions, pistonTypes };

/** Today as YYYY-MM-DD by the UTC calendar, the same in the browser and on the server. */
const utcDay = (date: Date) => date.toISOString().slice(0, 10);
const isPlainDate = (value: string) => /^\d{4}-\d{2}-\d{2}$/.test(value);

export const NEEDED_BY_PAST_MESSAGE = 'Pick a date in the future: the work cannot be needed by a day that has passed.';
export const NEEDED_BY_FAR_MESSAGE = 'Pick a date within two years from today.';

/** Whether a needed-by date is a day that has passed (UTC calendar): refused when entered, and again when a draft saved earlier is published. */
export const neededByHasPassed = (value: string) => isPlainDate(value) && value < utcDay(new Date());

/**
 * The date a builder needs the work by: in the future (today counts, by the
 * UTC calendar, so no time zone's tomorrow is refused) and within two years.
 */
export const neededBySchema = isoDateSchema('Needed by')
  .refine((value) => !neededByHasPassed(value), NEEDED_BY_PAST_MESSAGE)
  .refine((value) => {
    if (!isPlainDate(value)) return true;
    const limit = new Date();
    limit.setUTCFullYear(limit.getUTCFullYear() + 2);
    return value <= utcDay(limit);
  }, NEEDED_BY_FAR_MESSAGE);

const optionalPositive = (label: string, max = 10_000) =>
  z
    .number({ error: `${label} must be a number.` })
    .positive(`${label} must be greater than zero.`)
    .max(max, `${label} must be at most ${max}.`)
    .optional();

const optionalNonNegative = (label: string, max = 10_000) =>
  z
    .number({ error: `${label} must be a number.` })
    .min(0, `${label} cannot be negative.`)
    .max(max, `${label} must be at most ${max}.`)
    .optional();

/** One limit's number, by its kind: lengths and finishes not negative, a speed in whole rev/min, a grade from the standard's list. */
function limitNumberSchema(field: LimitField) {
  const number = z.number({ error: `${field.label} must be a number.` });
  switch (field.kind) {
    case 'grade':
      return number.refine((g) => (BALANCE_GRADE_CHOICES as readonly number[]).includes(g), `Choose a grade from the list: G ${BALANCE_GRADE_CHOICES.join(', G ')}.`).optional();
    case 'speed':
      return number.int('Use whole rev/min.').positive(`${field.label} must be greater than zero.`).max(30_000, `${field.label} must be at most 30,000.`).optional();
    case 'roughness':
      return number.positive(`${field.label} must be greater than zero.`).max(100, `${field.label} must be at most 100.`).optional();
    case 'force':
      return number.positive(`${field.label} must be greater than zero.`).max(5_000, `${field.label} must be at most 5,000.`).optional();
    default:
      return number.min(0, `${field.label} cannot be negative.`).max(1_000, `${field.label} must be at most 1,000.`).optional();
  }
}

/** The limits per kind of work, one object per group of `operationLimitFields`, every field optional. */
export const operationLimitsSchema = z
  .object(
    Object.fromEntries(
      limitGroups.map((group) => [
        group,
        z
          .object(Object.fromEntries(Object.entries(operationLimitFields[group] as Record<string, LimitField>).map(([key, field]) => [key, limitNumberSchema(field)])))
          .strict()
          .optional(),
      ]),
    ),
    { error: 'Send the limits as an object per kind of work.' },
  )
  .strict() as unknown as z.ZodType<OperationLimits>;

export const jobOperationSchema = z.object({
  code: operationCodeSchema,
  quantity: z.number({ error: 'Enter how many.' }).int('Use a whole number.').min(1, 'At least one.').max(64, 'At most 64.'),
});

/**
 * The block's specification and what the builder wants done. Lengths are in
 * `unit`; finishes in micrometres; angles in degrees.
 */
export const jobFieldsSchema = z.object({
  title: z.string({ error: 'Give the job a short title.' }).trim().min(4, 'Use at least 4 characters.').max(120, 'Use at most 120 characters.'),
  engineFamily: z.string({ error: 'Describe the engine.' }).trim().min(2, 'Describe the engine, e.g. “small-block V8, 1970s”.').max(120, 'Use at most 120 characters.'),
  layout: z.enum(engineLayouts, { error: 'Choose inline, V, flat or other.' }),
  cylinders: z.number({ error: 'Enter the number of cylinders.' }).int('Use a whole number.').min(1, 'At least one cylinder.').max(16, 'At most 16 cylinders.'),
  /** What the builder sends the shop; absent on jobs posted before parts were named (a block). */
  parts: z
    .array(z.enum(partsSent, { error: 'Choose what you send from the list.' }), { error: 'Say which parts you send.' })
    .min(1, 'Say which parts you send.')
    .max(partsSent.length)
    .refine((parts) => new Set(parts).size === parts.length, 'Each part once, please.')
    .optional(),
  /** The block's material (or the heads' when only heads are sent); needed when a block or heads are sent. */
  blockMaterial: z.enum(blockMaterials, { error: 'Choose cast iron or aluminium.' }).optional(),
  unit: z.enum(['in', 'mm'], { error: 'Choose inches or millimetres.' }),
  /** The bore specification (stock bore, stroke, finished size, pistons) is needed only for work on the cylinder bores. */
  stockBore: optionalPositive('The stock bore'),
  stroke: optionalPositive('The stroke'),
  targetBore: optionalPositive('Target bore'),
  /** ± on every bore reading around the finished size; without it the common-practice default applies (DEFAULT_SIZE_TOLERANCE_IN). */
  boreSizeTolerance: optionalPositive('Finished-size tolerance', 10),
  pistonDiameter: optionalPositive('Piston diameter'),
  clearanceMin: optionalNonNegative('Minimum clearance', 10),
  clearanceMax: optionalNonNegative('Maximum clearance', 10),
  pistonType: z.enum(pistonTypes, { error: 'Choose cast, hypereutectic or forged.' }).optional(),
  crosshatchMinDeg: optionalPositive('Smallest crosshatch included angle', 179),
  crosshatchMaxDeg: optionalPositive('Largest crosshatch included angle', 179),
  finishRaMaxUm: optionalPositive('Largest bore Ra', 100),
  finishRkMaxUm: optionalPositive('Largest Rk', 100),
  finishRpkMaxUm: optionalPositive('Largest Rpk', 100),
  finishRvkMaxUm: optionalPositive('Largest Rvk', 100),
  maxTaper: optionalNonNegative('Maximum taper', 10),
  maxOutOfRound: optionalNonNegative('Maximum out-of-round', 10),
  deckFlatnessMax: optionalNonNegative('Deck out-of-flat limit', 10),
  deckRaMaxUm: optionalPositive('Largest deck Ra', 100),
  /** How the inspection record's readings are judged against the limits; without it, simple acceptance. */
  decisionRule: z.enum(['simple', 'guarded'], { error: 'Choose simple or guarded acceptance.' }).optional(),
  deckNotes: z.string().trim().max(1000, 'Use at most 1,000 characters.').default(''),
  /** Limits for the work beyond the bores, by kind of work (shared/operation-limits.ts); empty fields take the defaults shown there. */
  limits: operationLimitsSchema.optional(),
  operations: z
    .array(jobOperationSchema, { error: 'Choose the work you want done.' })
    .min(1, 'Choose at least one kind of work.')
    .max(20, 'At most 20 kinds of work.'),
  logistics: z.enum(logisticsOptions, { error: 'Choose shipping or drop-off.' }),
  ...regionSchema.shape,
  neededBy: neededBySchema,
  notes: z.string().trim().max(4000, 'Use at most 4,000 characters.').default(''),
});

type JobFields = z.infer<typeof jobFieldsSchema>;

/** Rules across fields, shared by create and edit. */
function checkJob(job: Partial<JobFields>, ctx: z.RefinementCtx) {
  const codes = (job.operations ?? []).map((op) => op.code);
  const parts = partsOfJob(job);
  codes.forEach((code, index) => {
    if (!partsAllow(code, parts)) {
      ctx.addIssue({ code: 'custom', path: ['operations', index, 'code'], message: `${findOperation(code)?.name ?? 'That work'} needs ${partsNeededWords(code)}: add it to the parts you send, or leave this work out.` });
    }
  });
  if (codes.some((code) => boreOperationCodes.includes(code))) {
    if (job.stockBore === undefined) ctx.addIssue({ code: 'custom', path: ['stockBore'], message: 'Enter the stock bore: the bore work needs it.' });
    if (job.stroke === undefined) ctx.addIssue({ code: 'custom', path: ['stroke'], message: 'Enter the stroke: the bore work needs it.' });
    if (job.pistonType === undefined) ctx.addIssue({ code: 'custom', path: ['pistonType'], message: 'Choose cast, hypereutectic or forged.' });
    if (job.targetBore === undefined && job.pistonDiameter === undefined) {
      ctx.addIssue({ code: 'custom', path: ['targetBore'], message: 'Give a target bore, or the piston diameter with a clearance range.' });
    }
  }
  if ((parts.includes('block') || parts.includes('heads')) && job.blockMaterial === undefined) {
    ctx.addIssue({ code: 'custom', path: ['blockMaterial'], message: 'Choose cast iron or aluminium.' });
  }
  if (codes.includes('balance') && job.limits?.balance?.serviceRpm === undefined) {
    ctx.addIssue({ code: 'custom', path: ['limits', 'balance', 'serviceRpm'], message: 'Give the highest service speed: the permissible unbalance depends on it.' });
  }
  for (const group of limitGroups) {
    const set = job.limits?.[group] as Record<string, number | undefined> | undefined;
    if (!set) continue;
    if (!codes.includes(limitGroupOperation[group])) {
      ctx.addIssue({ code: 'custom', path: ['limits', group], message: `These limits are for ${findOperation(limitGroupOperation[group])!.name.toLowerCase()}, which the job does not ask for.` });
      continue;
    }
    for (const [key, value] of Object.entries(set)) {
      if (value === undefined || !key.endsWith('Min')) continue;
      const maxKey = `${key.slice(0, -3)}Max`;
      const max = set[maxKey];
      if (max !== undefined && value > max) {
        ctx.addIssue({ code: 'custom', path: ['limits', group, maxKey], message: 'The largest cannot be smaller than the smallest.' });
      }
    }
  }
  if (job.pistonDiameter !== undefined && (job.clearanceMin === undefined || job.clearanceMax === undefined)) {
    ctx.addIssue({ code: 'custom', path: ['clearanceMax'], message: 'With a piston diameter, give the clearance range too.' });
  }
  if (job.clearanceMin !== undefined && job.clearanceMax !== undefined && job.clearanceMin > job.clearanceMax) {
    ctx.addIssue({ code: 'custom', path: ['clearanceMax'], message: 'The largest clearance cannot be smaller than the smallest.' });
  }
  if (job.crosshatchMinDeg !== undefined && job.crosshatchMaxDeg !== undefined && job.crosshatchMinDeg > job.crosshatchMaxDeg) {
    ctx.addIssue({ code: 'custom', path: ['crosshatchMaxDeg'], message: 'The largest angle cannot be smaller than the smallest.' });
  }
  codes.forEach((code, index) => {
    if (codes.indexOf(code) !== index) ctx.addIssue({ code: 'custom', path: ['operations', index, 'code'], message: 'Each kind of work once, please.' });
  });
}

export const jobInputSchema = jobFieldsSchema.superRefine(checkJob);
export type JobInput = z.infer<typeof jobInputSchema>;
/** What a form holds before parsing (defaults not yet applied). */
export type JobFormValues = z.input<typeof jobInputSchema>;

export const boardSorts = ['newest', 'needed-soonest', 'fewest-bids', 'distance'] as const;
/** The board counts matching jobs exactly up to this many; past it, it says "1,000+". */
export const BOARD_COUNT_CAP = 1000;

export const boardQuerySchema = z.object({
  operation: operationCodeSchema.optional(),
  material: z.enum(blockMaterials, { error: 'Choose cast-iron or aluminium.' }).optional(),
  cylinders: queryInt('Cylinders', 1, 16).optional(),
  country: z.string().trim().min(1).max(60).optional(),
  region: z.string().trim().min(1).max(60).optional(),
  logistics: z.enum(logisticsOptions, { error: 'Choose ship or drop-off.' }).optional(),
  neededBefore: isoDateSchema('Needed before').optional(),
  sort: z.enum(boardSorts, { error: 'Sort by newest, needed-soonest, fewest-bids or distance.' }).default('newest'),
  /** Only jobs within this distance of the shop (or of `near`); jobs whose place is unknown count when in the shop's region. */
  within: withinSchema.optional(),
  /** Miles or kilometres for `within` and the answers' distances; without it, the unit of the shop's country. */
  unit: z.enum(distanceUnits, { error: 'Use mi or km.' }).optional(),
  /** A postal code (United States or Canada) to measure from instead of the shop's own. */
  near: nearSchema.optional(),
  page: queryInt('Page', 1, 10_000).default(1),
  pageSize: queryInt('Page size', 1, 100).default(20),
  /** Where the next page starts: the `nextCursor` of the page before (opaque). With it, `page` only names the page. */
  cursor: z.string().regex(/^[\w-]{1,400}$/, 'That page link is not valid; start again from the first page.').optional(),
});
export type BoardQuery = z.infer<typeof boardQuerySchema>;

/** The path parameter of every route about one job: /api/jobs/:jobId/... */
export const jobParamsSchema = z.object({ jobId: uuidSchema });

/** A job's photo file, or a milestone photo's: /api/jobs/:jobId/(milestone-)photos/:photoId/:size */
export const jobPhotoFileParamsSchema = jobParamsSchema.extend(photoFileParamsSchema.shape);

export const myJobsQuerySchema = z.object({
  status: z.enum(jobStatuses, { error: 'Unknown status.' }).optional(),
});

// ---------------------------------------------------------------------------
// Answers: what the API sends about jobs. Other modules' answers that carry a
// job, its summary or its photos reuse these.

/** A photo of a job: its size after re-encoding and the addresses of its two sizes. */
export const jobPhotoSchema = z.object({
  id: z.uuid(),
  width: z.number().int(),
  height: z.number().int(),
  thumbUrl: z.string(),
  largeUrl: z.string(),
});
export type JobPhoto = z.infer<typeof jobPhotoSchema>;

/** A job as lists show it: the job board, a builder's own jobs. */
export const jobSummarySchema = z.object({
  id: z.uuid(),
  title: z.string(),
  status: z.enum(jobStatuses),
  engineFamily: z.string(),
  cylinders: z.number().int(),
  /** Null for a job that sends no block or heads. */
  blockMaterial: z.enum(blockMaterials).nullable(),
  operations: z.array(z.string()),
  logistics: z.enum(logisticsOptions),
  country: z.string(),
  region: z.string(),
  city: z.string(),
  neededBy: z.iso.date(),
  bidCount: z.number().int(),
  publishedAt: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
  /** The first photo's small size, if the job has photos. */
  thumbUrl: z.string().nullable(),
  /** Whether the job's postal code gave a place; false means distances to it fall back to region. */
  placeFound: z.boolean(),
  /** From the shop (or the board's `near`) in the board's unit; null when either place is unknown or nothing is measured from. */
  distance: z.number().nullable(),
});
export type JobSummary = z.infer<typeof jobSummarySchema>;

/**
 * The specification as stored when the builder last saved it: the input's
 * fields, without the trimming, defaults and "needed by a day still to come"
 * rule that apply only on the way in.
 */
export const jobSpecSchema = jobFieldsSchema.extend({
  title: z.string(),
  engineFamily: z.string(),
  country: z.string(),
  region: z.string(),
  city: z.string(),
  neededBy: z.iso.date(),
  deckNotes: z.string(),
  notes: z.string(),
});
export type JobSpec = z.infer<typeof jobSpecSchema>;

/** A job as its page shows it, to its builder, to shops and to admins alike; `viewer` says what the one asking may do. */
export const jobDetailSchema = jobSummarySchema.extend({
  /** The builder, with their standing from their own history (shared/schemas/standing.ts), which shops weigh before bidding. */
  builder: z.object({ id: z.uuid(), displayName: z.string(), standing: builderStandingSchema }),
  /** For a shop, `distance` is from its own place to the job's, in this unit (its country's); null with `distance` null (the builder, an admin, or either place unknown). */
  distanceUnit: z.enum(distanceUnits).nullable(),
  spec: jobSpecSchema,
  photos: z.array(jobPhotoSchema),
  awardedBidId: z.uuid().nullable(),
  updatedAt: z.iso.datetime(),
  /** What the person asking may do with it. */
  viewer: z.object({ isOwner: z.boolean(), canBid: z.boolean(), myBidId: z.uuid().nullable() }),
});
export type JobDetail = z.infer<typeof jobDetailSchema>;

/** A job on the board: its summary with its builder's standing (pays on time, answers records), which shops weigh before bidding. */
export const boardJobSchema = jobSummarySchema.extend({ builderStanding: builderStandingSchema });
export type BoardJob = z.infer<typeof boardJobSchema>;

/** One page of the job board. */
export const boardPageSchema = z.object({
  jobs: z.array(boardJobSchema),
  /** How many jobs match, counted up to BOARD_COUNT_CAP; past it, the cap with `totalIsCapped` (shown as "1,000+"). */
  total: z.number().int(),
  totalIsCapped: z.boolean(),
  /** Pass as `cursor` for the page after this one, in the same order; null on the last page. */
  nextCursor: z.string().nullable(),
  page: z.number().int(),
  pageSize: z.number().int(),
  sort: z.enum(boardSorts),
  /** What the distances are measured from, in which unit; `found` false when its postal code gave no place (then `within` means the shop's region). Null when nothing is measured from. */
  distanceFrom: z.object({ unit: z.enum(distanceUnits), postalCode: z.string().nullable(), found: z.boolean() }).nullable(),
});
export type BoardPage = z.infer<typeof boardPageSchema>;

export const jobAnswerSchema = z.object({ job: jobDetailSchema });
export const jobListAnswerSchema = z.object({ jobs: z.array(jobSummarySchema) });
export type JobAnswer = z.infer<typeof jobAnswerSchema>;
export type JobListAnswer = z.infer<typeof jobListAnswerSchema>;
export const jobPhotosAnswerSchema = z.object({ photos: z.array(jobPhotoSchema) });
