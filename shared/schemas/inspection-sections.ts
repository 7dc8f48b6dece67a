import { z } from 'zod';
import { BALANCE_GRADE_CHOICES } from '../operation-limits';
import { type CleanMethod, HOT_TANK_ON_ALUMINIUM, SECTION_INPUT_KEYS, cleanMethods, cleanMethodsFor, crackTestMethods } from './values';

/**
 * The inspection record's sections beyond the bore grid, deck, finish and
 * crosshatch: one per kind of work (shared/measurement-sheets.ts says what each
 * measures). Lengths are in the record's unit, finishes in µm Ra, masses in
 * grams, volumes in cc, spring pressure in the record's force unit (lbf for
 * inches, N for millimetres), unbalance in g·mm. Only raw readings come in; the
 * server works out every figure and judges it.
 */

export { type CleanMethod, HOT_TANK_ON_ALUMINIUM, cleanMethods, cleanMethodsFor, crackTestMethods };

const size = (label: string) =>
  z.number({ error: `${label}: enter a number.` }).positive(`${label} must be greater than zero.`).max(10_000, `${label} must be at most 10,000.`);
const small = (label: string, max = 1) =>
  z.number({ error: `${label}: enter a number.` }).min(0, `${label} cannot be negative.`).max(max, `${label} must be at most ${max}.`);
const words = (max = 2000) => z.string({ error: 'Write it in words.' }).trim().max(max, `Use at most ${max.toLocaleString('en-US')} characters.`).default('');
const photoIds = z.array(z.uuid({ error: 'That photo id is not valid.' })).max(8, 'At most 8 photos.').optional();

/** One straightedge-and-feeler reading and where it was taken, e.g. "left edge", "diagonal A", "across cylinder 3". */
export const straightedgeReadingSchema = z.object({
  position: z.string({ error: 'Say where the reading was taken.' }).trim().min(1, 'Say where the reading was taken.').max(40, 'Use at most 40 characters.'),
  value: small('A feeler reading'),
});
export type StraightedgeReading = z.infer<typeof straightedgeReadingSchema>;


export const cleanSectionSchema = z.object({
  method: z.enum(cleanMethods, { error: 'Choose how the part was cleaned.' }),
  result: z.enum(['clean', 'residue-left'], { error: 'Say whether the part came out clean.' }),
  findings: words(),
  photoIds,
});

export const crackTestSectionSchema = z
  .object({
    method: z.enum(crackTestMethods, { error: 'Choose the crack-test method.' }),
    result: z.enum(['no-crack', 'crack-found'], { error: 'Say whether a crack was found.' }),
    findings: words(),
    photoIds,
  })
  .superRefine((s, ctx) => {
    if (s.result === 'crack-found' && s.findings.length < 5) ctx.addIssue({ code: 'custom', path: ['findings'], message: 'Say where the crack is and how long.' });
  });

export const honeSectionSchema = z.object({
  stones: z.string({ error: 'Name the hone stones used.' }).trim().min(2, 'Name the hone stones used (grit and bond, per pass).').max(500, 'Use at most 500 characters.'),
});

const twoEnds = (label: string) => z.object({ front: size(`${label}, front end`), rear: size(`${label}, rear end`) });

export const lineHoneSectionSchema = z.object({
  /** The second direction each housing bore was read in, besides vertical. */
  secondDirection: z.enum(['45', 'horizontal'], { error: 'Say whether the second direction is at 45° or horizontal.' }),
  bores: z
    .array(
      z.object({
        vertical: twoEnds('Vertical'),
        second: twoEnds('Second direction'),
        /** The bore centre's height on the alignment bar's indicator (signed), for the alignment. */
        centre: z.number({ error: 'The centre reading must be a number.' }).min(-1, 'Check the centre reading.').max(1, 'Check the centre reading.').optional(),
      }),
      { error: 'Enter each main housing bore.' },
    )
    .min(2, 'Enter at least two main housing bores.')
    .max(12, 'At most 12 main housing bores.'),
});

export const camBoreSectionSchema = z
  .object({
    bearings: z.array(size('Bearing inside diameter'), { error: 'Enter each cam bearing’s inside diameter.' }).min(1, 'Enter at least one cam bearing.').max(12, 'At most 12 cam bearings.'),
    /** Measured cam journals, one per bearing; without them the job's cam journal diameter is used. */
    journals: z.array(size('Cam journal')).max(12).optional(),
  })
  .superRefine((s, ctx) => {
    if (s.journals && s.journals.length !== s.bearings.length) ctx.addIssue({ code: 'custom', path: ['journals'], message: 'Give one cam journal per bearing.' });
  });

export const sleeveSectionSchema = z.object({
  cylinders: z
    .array(
      z.object({
        cylinder: z.number({ error: 'Say which cylinder.' }).int('Use a whole number.').min(1).max(16),
        blockBore: size('Block bore for the sleeve'),
        sleeveOutside: size('Sleeve outside diameter'),
        flangeProtrusion: z.number({ error: 'The protrusion must be a number.' }).min(-1).max(1).optional(),
      }),
    )
    .min(1, 'Enter at least one sleeved cylinder.')
    .max(16)
    .refine((rows) => new Set(rows.map((r) => r.cylinder)).size === rows.length, 'Each cylinder once, please.'),
});

export const headResurfaceSectionSchema = z.object({
  heads: z
    .array(
      z.object({
        straightedge: z.array(straightedgeReadingSchema).min(1, 'Enter at least one straightedge reading.').max(40),
        stockRemoved: small('Stock removed', 10).optional(),
        chamberBeforeCc: z.number().positive().max(1000).optional(),
        chamberAfterCc: z.number().positive().max(1000).optional(),
      }),
    )
    .min(1, 'Enter at least one head.')
    .max(4, 'At most 4 heads.'),
});

export const valveJobSectionSchema = z.object({
  valves: z
    .array(
      z.object({
        label: z.string({ error: 'Name the valve, e.g. “1 intake”.' }).trim().min(1, 'Name the valve, e.g. “1 intake”.').max(30),
        kind: z.enum(['intake', 'exhaust'], { error: 'Intake or exhaust?' }),
        seatWidth: small('Seat width', 25),
        installedHeight: size('Installed height'),
        stemToGuide: small('Stem-to-guide clearance'),
        springPressure: z.number().positive('Spring pressure must be greater than zero.').max(5_000).optional(),
      }),
    )
    .min(1, 'Enter at least one valve.')
    .max(64, 'At most 64 valves.'),
});

const journalSchema = z.object({
  front: z.object({ vertical: size('Journal, front, vertical'), horizontal: size('Journal, front, horizontal') }),
  rear: z.object({ vertical: size('Journal, rear, vertical'), horizontal: size('Journal, rear, horizontal') }),
});
export type JournalReadings = z.infer<typeof journalSchema>;

export const crankGrindSectionSchema = z.object({
  /** The undersize ground to, in the record's unit (0 for standard); commonly a standard step. */
  undersize: small('Undersize', 2),
  mains: z.array(journalSchema).min(1, 'Enter each main journal.').max(10),
  rods: z.array(journalSchema).min(1, 'Enter each rod journal.').max(16),
  raUm: z.number().positive('Ra must be greater than zero.').max(100).optional(),
});

export const balanceSectionSchema = z.object({
  rotatingGrams: z.number({ error: 'Enter the rotating mass.' }).positive('Must be greater than zero.').max(50_000),
  reciprocatingGrams: z.number({ error: 'Enter the reciprocating mass.' }).positive('Must be greater than zero.').max(50_000),
  reciprocatingFactor: z.number().min(0).max(1).optional(),
  oilGrams: z.number().min(0).max(500).optional(),
  /** The bob weight actually fitted per throw. */
  bobWeightGrams: z.number({ error: 'Enter the bob weight fitted.' }).positive('Must be greater than zero.').max(50_000),
  rotorMassKg: z.number({ error: 'Enter the crankshaft’s mass.' }).positive('Must be greater than zero.').max(500),
  grade: z.number({ error: 'Choose the grade balanced to.' }).refine((g) => (BALANCE_GRADE_CHOICES as readonly number[]).includes(g), 'Choose a grade from the list.'),
  serviceRpm: z.number({ error: 'Enter the service speed.' }).int().positive().max(30_000),
  residual: z
    .array(z.object({ plane: z.enum(['front', 'rear'], { error: 'Front or rear plane?' }), gmm: z.number({ error: 'Enter the residual unbalance.' }).min(0).max(1_000_000) }))
    .min(1, 'Enter the residual unbalance in each correction plane.')
    .max(2)
    .refine((rows) => new Set(rows.map((r) => r.plane)).size === rows.length, 'Each plane once, please.'),
});

export { SECTION_INPUT_KEYS };

/** Every section is optional in the schema; the server says which the job's work needs. */
export const inspectionSectionsSchema = z.object({
  clean: cleanSectionSchema.optional(),
  crackTest: crackTestSectionSchema.optional(),
  hone: honeSectionSchema.optional(),
  lineHone: lineHoneSectionSchema.optional(),
  camBore: camBoreSectionSchema.optional(),
  sleeve: sleeveSectionSchema.optional(),
  headResurface: headResurfaceSectionSchema.optional(),
  valveJob: valveJobSectionSchema.optional(),
  crankGrind: crankGrindSectionSchema.optional(),
  balance: balanceSectionSchema.optional(),
});
export type InspectionSections = z.infer<typeof inspectionSectionsSchema>;

/** The deck: straightedge readings (plain, or by position), deck heights at the four corners, finish. */
export const deckSectionSchema = z
  .object({
    readings: z.array(small('A feeler reading')).min(1, 'Enter at least one straightedge reading.').max(40).optional(),
    straightedge: z.array(straightedgeReadingSchema).min(1).max(60).optional(),
    heights: z
      .object({ frontLeft: size('Front left height'), frontRight: size('Front right height'), rearLeft: size('Rear left height'), rearRight: size('Rear right height') })
      .optional(),
    raUm: z.number().positive().max(100).optional(),
  })
  .refine((d) => d.readings !== undefined || d.straightedge !== undefined || d.heights !== undefined, { message: 'Enter at least one straightedge reading.', path: ['straightedge'] });

// --- results -------------------------------------------------------------------

/** How a section came out: as a check's verdict, or not judged (nothing to judge it with), or only recorded (nothing to judge). */
export const sectionVerdictSchema = z.enum(['conforms', 'fails', 'not-proven', 'not-judged', 'recorded']);
export type SectionVerdict = z.infer<typeof sectionVerdictSchema>;

export const sectionFigureSchema = z.object({ label: z.string(), value: z.union([z.number(), z.string()]), unit: z.string().optional() });
export type SectionFigure = z.infer<typeof sectionFigureSchema>;

/** One ordered operation's part of the record, as judged. */
export const sectionResultSchema = z.object({
  operation: z.string(),
  name: z.string(),
  verdict: sectionVerdictSchema,
  /** The check sections this one covers: its own, and for bore work the shared 'bores' (and 'finish', 'crosshatch' for honing). */
  covers: z.array(z.string()),
  figures: z.array(sectionFigureSchema),
  statements: z.array(z.string()),
});
export type SectionResult = z.infer<typeof sectionResultSchema>;
