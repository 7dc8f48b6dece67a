/**
 * The limits a builder can set for each kind of work beyond the bores, declared
 * once: the job form renders a field per entry, the job schema validates them,
 * and the inspection record judges against them (or against the default shown
 * beside the field, which says where it comes from).
 *
 * Lengths are in the job's unit; finishes in µm Ra; spring pressure in the
 * job's force unit (lbf for an inch job, N for a millimetre job); speed in
 * rev/min; the balance grade in mm/s (ISO 21940-11).
 */
import type { OperationCode } from './catalogue';
import type { LengthUnit } from './calc/units';

export type LimitKind = 'length' | 'roughness' | 'force' | 'speed' | 'grade';

export interface LimitDefault {
  /** The figure in inches (lengths) or as is (other kinds). */
  in: number;
  /** The figure in millimetres (lengths) or as is (other kinds). */
  mm: number;
  /** Where the figure comes from, in words shown beside it. */
  source: string;
}

export interface LimitField {
  label: string;
  kind: LimitKind;
  /** Applied when the job leaves the field empty. */
  default?: LimitDefault;
  hint?: string;
}

const COMMON = 'common practice, from memory; the maker’s figure governs';

const lengthDefault = (inches: number, mm: number, source = COMMON): LimitDefault => ({ in: inches, mm, source });

/** The balance grades of ISO 21940-11 offered for a crankshaft assembly, in mm/s. */
export const BALANCE_GRADE_CHOICES = [0.4, 1, 2.5, 6.3, 16, 40] as const;

export const operationLimitFields = {
  deck: {
    heightTarget: { label: 'Deck height, crank centreline to deck', kind: 'length', hint: 'The height to cut to; leave empty when only the deck’s flatness matters.' },
    heightTolerance: { label: 'Deck height tolerance (±)', kind: 'length', default: lengthDefault(0.002, 0.05) },
    maxEndToEnd: { label: 'Largest deck height difference, front to rear', kind: 'length', default: lengthDefault(0.002, 0.05) },
    maxBankToBank: { label: 'Largest deck height difference, bank to bank (V engines)', kind: 'length', default: lengthDefault(0.002, 0.05) },
  },
  lineHone: {
    housingMin: { label: 'Smallest main housing bore', kind: 'length', hint: 'From the engine maker’s figures, with the caps torqued.' },
    housingMax: { label: 'Largest main housing bore', kind: 'length' },
    maxOutOfRound: { label: 'Largest housing out-of-round', kind: 'length', default: lengthDefault(0.0005, 0.013) },
    maxTaper: { label: 'Largest housing taper', kind: 'length', default: lengthDefault(0.0005, 0.013) },
    maxAlignment: { label: 'Largest bore centre off the line through the end bores', kind: 'length', default: lengthDefault(0.0005, 0.013, 'common practice (a few tenths of a thousandth across a block); the maker’s figure governs') },
  },
  camBore: {
    bearingMin: { label: 'Smallest cam bearing inside diameter', kind: 'length' },
    bearingMax: { label: 'Largest cam bearing inside diameter', kind: 'length' },
    camJournal: { label: 'Cam journal diameter (for the clearance)', kind: 'length', hint: 'Give it to have the clearance worked out and judged.' },
    clearanceMin: { label: 'Smallest cam bearing clearance', kind: 'length', default: lengthDefault(0.001, 0.025) },
    clearanceMax: { label: 'Largest cam bearing clearance', kind: 'length', default: lengthDefault(0.003, 0.075) },
  },
  sleeve: {
    interferenceMin: { label: 'Smallest sleeve interference fit', kind: 'length', default: lengthDefault(0.0015, 0.04) },
    interferenceMax: { label: 'Largest sleeve interference fit', kind: 'length', default: lengthDefault(0.003, 0.075) },
    flangeProtrusionMin: { label: 'Smallest flange protrusion above the deck', kind: 'length' },
    flangeProtrusionMax: { label: 'Largest flange protrusion above the deck', kind: 'length' },
  },
  headResurface: {
    flatnessMax: { label: 'Head out-of-flat limit', kind: 'length', hint: 'Empty: the common-practice deck table for the material with a multi-layer steel gasket.' },
    maxStockRemoved: { label: 'Most stock to remove from the gasket face', kind: 'length' },
  },
  valveJob: {
    seatWidthMin: { label: 'Narrowest valve seat', kind: 'length', default: lengthDefault(0.04, 1.0) },
    seatWidthMax: { label: 'Widest valve seat', kind: 'length', default: lengthDefault(0.08, 2.0) },
    installedHeight: { label: 'Installed height target', kind: 'length' },
    installedHeightTolerance: { label: 'Installed height tolerance (±)', kind: 'length', default: lengthDefault(0.01, 0.25) },
    stemToGuideMin: { label: 'Smallest stem-to-guide clearance', kind: 'length', default: lengthDefault(0.001, 0.025) },
    stemToGuideMax: { label: 'Largest stem-to-guide clearance', kind: 'length', default: lengthDefault(0.003, 0.075) },
    springPressureMin: { label: 'Least spring pressure at installed height', kind: 'force' },
  },
  crankGrind: {
    mainStandard: { label: 'Main journal standard diameter', kind: 'length', hint: 'The undersize chosen is taken off this.' },
    rodStandard: { label: 'Rod journal standard diameter', kind: 'length' },
    journalTolerance: { label: 'Journal size tolerance (below the finished size)', kind: 'length', default: lengthDefault(0.0005, 0.013) },
    maxTaper: { label: 'Largest journal taper', kind: 'length', default: lengthDefault(0.0003, 0.008) },
    maxOutOfRound: { label: 'Largest journal out-of-round', kind: 'length', default: lengthDefault(0.0003, 0.008) },
    journalRaMaxUm: { label: 'Largest journal Ra (µm)', kind: 'roughness', default: { in: 0.25, mm: 0.25, source: COMMON } },
  },
  balance: {
    grade: { label: 'Balance grade G (mm/s, ISO 21940-11)', kind: 'grade', default: { in: 6.3, mm: 6.3, source: 'common practice for an engine crankshaft assembly (G 6.3 to G 2.5; tighter for racing)' } },
    serviceRpm: { label: 'Highest service speed (rev/min)', kind: 'speed' },
  },
} as const satisfies Record<string, Record<string, LimitField>>;

export type LimitGroup = keyof typeof operationLimitFields;
export type OperationLimits = { [G in LimitGroup]?: { [K in keyof (typeof operationLimitFields)[G]]?: number } };

/** Which ordered operation each group of limits belongs to. */
export const limitGroupOperation: Record<LimitGroup, OperationCode> = {
  deck: 'deck',
  lineHone: 'line-hone',
  camBore: 'cam-bore',
  sleeve: 'sleeve',
  headResurface: 'head-resurface',
  valveJob: 'valve-job',
  crankGrind: 'crank-grind',
  balance: 'balance',
};

export const limitGroups = Object.keys(operationLimitFields) as LimitGroup[];

/** The undersize steps a crank is commonly ground to (common practice): 0.010, 0.020 and 0.030 in, or 0.25, 0.50 and 0.75 mm. */
export const CRANK_UNDERSIZE_STEPS: Record<LengthUnit, readonly number[]> = {
  in: [0, 0.01, 0.02, 0.03],
  mm: [0, 0.25, 0.5, 0.75],
};

/** The force unit that goes with a length unit. */
export const forceUnitFor = (unit: LengthUnit): 'lbf' | 'N' => (unit === 'in' ? 'lbf' : 'N');

/**
 * A limit as it applies: the job's own figure, else the default (converted to
 * `unit` for lengths), with where it came from; undefined when neither exists.
 */
export function limitFor<G extends LimitGroup>(
  limits: OperationLimits | undefined,
  group: G,
  key: keyof (typeof operationLimitFields)[G] & string,
  unit: LengthUnit,
): { value: number; isDefault: boolean; source?: string } | undefined {
  const own = (limits?.[group] as Record<string, number | undefined> | undefined)?.[key];
  if (own !== undefined) return { value: own, isDefault: false };
  const field = (operationLimitFields[group] as Record<string, LimitField>)[key];
  if (!field.default) return undefined;
  return { value: field.default[unit], isDefault: true, source: field.default.source };
}
