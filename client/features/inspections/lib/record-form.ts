/**
 * The inspection entry form's state, and how it becomes the request.
 *
 * Inputs hold text exactly as typed (a reading of "4.0310" stays "4.0310"),
 * so a draft restores what the shop saw. `toRawInput` turns the text into the
 * shape `inspectionInputSchema` checks; the same schema the server uses then
 * says what is missing or wrong, field by field.
 */
import { type LengthUnit, STANDARD_CUTOFFS_MM, microinchesToMicrometres } from '@shared/calc';
import { inspectionInputSchema, type InspectionInput } from '@shared/schemas/inspection';
import { DEPTHS, DIRECTIONS, type Depth, type GridColumn, cellKey, cellPathWords } from '@client/lib/bore-readings';
import { lengthToText, numberToText, toNumber, toNumberList } from '@client/lib/numbers';
import { deckFromFields, fieldsFromInput, isFieldPath, sectionPathWords, sectionsFromFields } from './section-fields';

export type FinishMode = 'none' | 'values' | 'profile';
export type CrosshatchMode = 'none' | 'measured' | 'settings';
export type FinishUnit = 'um' | 'uin';

/** The trace's filter choices: none, or the Gaussian filter at a standard cut-off. */
export const PROFILE_FILTER_CHOICES = ['none', ...STANDARD_CUTOFFS_MM.map(String)] as const;

/** A finish height typed in `unit`, in micrometres (1 µin = 0.0254 µm exactly). */
function finishUm(text: string, unit: FinishUnit): number | undefined {
  const value = toNumber(text);
  return value === undefined || unit === 'um' ? value : microinchesToMicrometres(value);
}

export interface ProfileTrace {
  fileName: string;
  /** Heights in micrometres; null when the file was too large to keep in a draft and must be chosen again. */
  heights: number[] | null;
}

export interface RecordForm {
  unit: LengthUnit;
  gaugeResolution: string;
  /** The temperature as typed, in `temperatureScale` (°C unless the shop chose °F). */
  temperatureC: string;
  temperatureScale?: 'C' | 'F';
  /** Expanded uncertainty U of the bore readings, optional (the gauge resolution stands in, as a lower bound). */
  uncertainty?: string;
  torquePlate: boolean;
  /** Grid text by schema path: "cylinders.2.middle.axial" → "4.0311". */
  cells: Record<string, string>;
  deckReadings: string;
  deckRa: string;
  /** The deck's positioned readings and heights, and every other section's readings, by request path (lib/section-fields.ts). */
  fields: Record<string, string>;
  finishMode: FinishMode;
  finish: { ra: string; rk: string; rpk: string; rvk: string; mr1: string; mr2: string };
  /** The unit Ra, Rk, Rpk and Rvk are typed in; sent in micrometres. */
  finishUnit: FinishUnit;
  profile: ProfileTrace | null;
  profileSpacing: string;
  /** 'none', or the Gaussian cut-off in mm as text ("0.8"). */
  profileFilter: string;
  crosshatchMode: CrosshatchMode;
  crosshatch: { angle: string; spindleRpm: string; strokeLength: string; cyclesPerMinute: string };
  signedOffBy: string;
  notes: string;
}

export function emptyRecord(unit: LengthUnit): RecordForm {
  return {
    unit,
    gaugeResolution: '',
    temperatureC: '',
    temperatureScale: 'C',
    uncertainty: '',
    torquePlate: false,
    cells: {},
    deckReadings: '',
    deckRa: '',
    fields: {},
    finishMode: 'none',
    finish: { ra: '', rk: '', rpk: '', rvk: '', mr1: '', mr2: '' },
    finishUnit: 'um',
    profile: null,
    profileSpacing: '',
    profileFilter: 'none',
    crosshatchMode: 'none',
    crosshatch: { angle: '', spindleRpm: '', strokeLength: '', cyclesPerMinute: '' },
    signedOffBy: '',
    notes: '',
  };
}

const withoutUndefined = <T extends Record<string, unknown>>(value: T): T =>
  Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as T;

const isBlank = (text: string) => text.trim() === '';

/**
 * The form as the request's shape, numbers read from the text; blanks are left undefined so the schema reports them as still to enter.
 * `cylinderCount` is the bore grid's rows: 0 when the job orders no bore work (the record then has no grid).
 */
export function toRawInput(form: RecordForm, cylinderCount: number): Record<string, unknown> {
  const grid = Array.from({ length: cylinderCount }, (_, i) => {
    const pair = (depth: Depth) => ({
      thrust: toNumber(form.cells[cellKey(i, `${depth}.thrust` as GridColumn)]),
      axial: toNumber(form.cells[cellKey(i, `${depth}.axial` as GridColumn)]),
    });
    return withoutUndefined({ top: pair('top'), middle: pair('middle'), bottom: pair('bottom'), piston: toNumber(form.cells[cellKey(i, 'piston')]) });
  });

  const positioned = deckFromFields(form.fields ?? {});
  const deck =
    isBlank(form.deckReadings) && isBlank(form.deckRa) && Object.keys(positioned).length === 0
      ? undefined
      : withoutUndefined({ readings: isBlank(form.deckReadings) ? undefined : (toNumberList(form.deckReadings) ?? []), ...positioned, raUm: toNumber(form.deckRa) });

  const f = form.finish;
  const finish =
    form.finishMode === 'values'
      ? withoutUndefined({
          mode: 'values',
          raUm: finishUm(f.ra, form.finishUnit),
          rkUm: finishUm(f.rk, form.finishUnit),
          rpkUm: finishUm(f.rpk, form.finishUnit),
          rvkUm: finishUm(f.rvk, form.finishUnit),
          mr1: toNumber(f.mr1),
          mr2: toNumber(f.mr2),
        })
      : form.finishMode === 'profile'
        ? withoutUndefined({
            mode: 'profile',
            heightsUm: form.profile?.heights ?? undefined,
            spacingUm: toNumber(form.profileSpacing),
            filter: form.profileFilter === 'none' ? { kind: 'none' } : { kind: 'gaussian', cutoffMm: Number(form.profileFilter) },
          })
        : undefined;

  const c = form.crosshatch;
  const crosshatch =
    form.crosshatchMode === 'measured'
      ? withoutUndefined({ mode: 'measured', includedAngleDeg: toNumber(c.angle) })
      : form.crosshatchMode === 'settings'
        ? withoutUndefined({ mode: 'settings', spindleRpm: toNumber(c.spindleRpm), strokeLength: toNumber(c.strokeLength), cyclesPerMinute: toNumber(c.cyclesPerMinute) })
        : undefined;

  return withoutUndefined({
    conditions: withoutUndefined({
      unit: form.unit,
      gaugeResolution: toNumber(form.gaugeResolution),
      uncertainty: toNumber(form.uncertainty),
      ...(form.temperatureScale === 'F' ? { temperatureF: toNumber(form.temperatureC) } : { temperatureC: toNumber(form.temperatureC) }),
      torquePlate: form.torquePlate,
    }),
    cylinders: grid.length > 0 ? grid : undefined,
    deck,
    sections: sectionsFromFields(form.fields ?? {}),
    finish,
    crosshatch,
    signedOffBy: isBlank(form.signedOffBy) ? undefined : form.signedOffBy,
    notes: form.notes,
  });
}

export interface RecordCheck {
  /** The parsed request when everything is present and right. */
  input?: InspectionInput;
  /** The schema's message per field path, for fields holding something wrong. */
  errors: Record<string, string>;
  /** The schema's message per field path, for fields still empty. */
  missing: Record<string, string>;
  /** Paths of everything that is wrong or missing, in form order. */
  order: string[];
}

/** Checks the form with the shared schema, splitting "still to enter" from "wrong". */
export function checkRecord(form: RecordForm, cylinderCount: number): RecordCheck {
  const parsed = inspectionInputSchema.safeParse(toRawInput(form, cylinderCount), { reportInput: true });
  if (parsed.success) return { input: parsed.data, errors: {}, missing: {}, order: [] };
  const errors: Record<string, string> = {};
  const missing: Record<string, string> = {};
  const order: string[] = [];
  for (const issue of parsed.error.issues) {
    const path = issue.path.map(String).join('.');
    if (order.includes(path)) continue;
    order.push(path);
    // A blank temperature is reported by the conditions' own rule (°C or °F, one of them): still to enter, not wrong.
    const blankTemperature = issue.code === 'custom' && path === 'conditions.temperatureC' && form.temperatureC.trim() === '';
    if ((issue.code === 'invalid_type' && issue.input === undefined) || blankTemperature) missing[path] = issue.message;
    else errors[path] = issue.message;
  }
  return { errors, missing, order };
}

// --- drafts --------------------------------------------------------------------

const DRAFT_FORMAT = 'inspection-entry/1';
/** A trace longer than this is not kept in a draft (it would make every save large); the shop chooses the file again. */
export const MAX_DRAFT_PROFILE_POINTS = 5_000;

/** The form as a draft for the server to keep. */
export function toDraft(form: RecordForm): Record<string, unknown> {
  const profile = form.profile && form.profile.heights && form.profile.heights.length > MAX_DRAFT_PROFILE_POINTS ? { ...form.profile, heights: null } : form.profile;
  return { format: DRAFT_FORMAT, savedAt: new Date().toISOString(), form: { ...form, profile } };
}

/** When the browser saved a kept draft, if it says. */
export function draftSavedAt(draft: Record<string, unknown> | null | undefined): string | null {
  return draft && typeof draft.savedAt === 'string' && !Number.isNaN(Date.parse(draft.savedAt)) ? draft.savedAt : null;
}

const text = (value: unknown) => (typeof value === 'string' ? value.slice(0, 20_000) : '');

/** A kept draft back into the form; anything unreadable falls back to the empty form's value. */
export function fromDraft(draft: Record<string, unknown> | null | undefined, unit: LengthUnit): RecordForm | null {
  if (!draft || draft.format !== DRAFT_FORMAT || typeof draft.form !== 'object' || draft.form === null) return null;
  const saved = draft.form as Partial<Record<keyof RecordForm, unknown>>;
  const base = emptyRecord(unit);
  const cells: Record<string, string> = {};
  if (saved.cells && typeof saved.cells === 'object') {
    for (const [key, value] of Object.entries(saved.cells as Record<string, unknown>)) {
      if (/^cylinders\.\d+\.(top|middle|bottom|piston)/.test(key)) cells[key] = text(value);
    }
  }
  const pick = <K extends string>(value: unknown, allowed: readonly K[], fallback: K): K => (allowed.includes(value as K) ? (value as K) : fallback);
  const group = <T extends Record<string, string>>(value: unknown, fallback: T): T =>
    Object.fromEntries(Object.keys(fallback).map((key) => [key, text((value as Record<string, unknown> | undefined)?.[key])])) as T;
  const profile = saved.profile as ProfileTrace | null | undefined;
  return {
    unit: pick(saved.unit, ['in', 'mm'] as const, unit),
    gaugeResolution: text(saved.gaugeResolution),
    temperatureC: text(saved.temperatureC),
    temperatureScale: pick(saved.temperatureScale, ['C', 'F'] as const, 'C'),
    uncertainty: text(saved.uncertainty),
    torquePlate: saved.torquePlate === true,
    cells,
    deckReadings: text(saved.deckReadings),
    deckRa: text(saved.deckRa),
    fields: Object.fromEntries(
      Object.entries(saved.fields && typeof saved.fields === 'object' ? (saved.fields as Record<string, unknown>) : {})
        .filter(([key]) => isFieldPath(key))
        .map(([key, value]) => [key, text(value)]),
    ),
    finishMode: pick(saved.finishMode, ['none', 'values', 'profile'] as const, 'none'),
    finish: group(saved.finish, base.finish),
    finishUnit: pick(saved.finishUnit, ['um', 'uin'] as const, 'um'),
    profile:
      profile && typeof profile === 'object' && typeof profile.fileName === 'string'
        ? { fileName: profile.fileName, heights: Array.isArray(profile.heights) && profile.heights.every((h) => typeof h === 'number') ? profile.heights : null }
        : null,
    profileSpacing: text(saved.profileSpacing),
    profileFilter: pick(saved.profileFilter, PROFILE_FILTER_CHOICES, 'none'),
    crosshatchMode: pick(saved.crosshatchMode, ['none', 'measured', 'settings'] as const, 'none'),
    crosshatch: group(saved.crosshatch, base.crosshatch),
    signedOffBy: text(saved.signedOffBy),
    notes: text(saved.notes),
  };
}

/** A submitted version back into the form, for a new version after a rejection. */
export function fromInput(input: InspectionInput): RecordForm {
  const unit = input.conditions.unit;
  const length = (value: number | undefined) => lengthToText(value, unit);
  const form = emptyRecord(unit);
  form.gaugeResolution = numberToText(input.conditions.gaugeResolution);
  form.temperatureScale = input.conditions.temperatureF !== undefined ? 'F' : 'C';
  form.temperatureC = numberToText(input.conditions.temperatureF ?? input.conditions.temperatureC);
  form.uncertainty = numberToText(input.conditions.uncertainty);
  form.torquePlate = input.conditions.torquePlate ?? false;
  (input.cylinders ?? []).forEach((cylinder, i) => {
    for (const depth of DEPTHS) {
      for (const direction of DIRECTIONS) form.cells[cellKey(i, `${depth}.${direction}`)] = length(cylinder[depth][direction]);
    }
    form.cells[cellKey(i, 'piston')] = length(cylinder.piston);
  });
  form.fields = fieldsFromInput(input);
  if (input.deck) {
    form.deckReadings = (input.deck.readings ?? []).map(length).join(' ');
    form.deckRa = numberToText(input.deck.raUm);
  }
  if (input.finish?.mode === 'values') {
    const f = input.finish;
    form.finishMode = 'values';
    form.finish = { ra: numberToText(f.raUm), rk: numberToText(f.rkUm), rpk: numberToText(f.rpkUm), rvk: numberToText(f.rvkUm), mr1: numberToText(f.mr1), mr2: numberToText(f.mr2) };
  } else if (input.finish?.mode === 'profile') {
    form.finishMode = 'profile';
    form.profile = { fileName: 'the trace sent with the last version', heights: input.finish.heightsUm };
    form.profileSpacing = numberToText(input.finish.spacingUm);
    const filter = input.finish.filter;
    form.profileFilter = filter?.kind === 'gaussian' ? String(filter.cutoffMm) : 'none';
  }
  if (input.crosshatch?.mode === 'measured') {
    form.crosshatchMode = 'measured';
    form.crosshatch.angle = numberToText(input.crosshatch.includedAngleDeg);
  } else if (input.crosshatch?.mode === 'settings') {
    form.crosshatchMode = 'settings';
    form.crosshatch = {
      angle: '',
      spindleRpm: numberToText(input.crosshatch.spindleRpm),
      strokeLength: length(input.crosshatch.strokeLength),
      cyclesPerMinute: numberToText(input.crosshatch.cyclesPerMinute),
    };
  }
  form.signedOffBy = input.signedOffBy;
  form.notes = input.notes;
  return form;
}

// --- words for paths -----------------------------------------------------------

const FIELD_WORDS: Record<string, string> = {
  'conditions.unit': 'units',
  'conditions.gaugeResolution': 'gauge resolution',
  'conditions.temperatureC': 'temperature',
  'conditions.temperatureF': 'temperature',
  'conditions.uncertainty': 'measurement uncertainty',
  'conditions.torquePlate': 'torque plate',
  deck: 'deck',
  'deck.readings': 'straightedge readings',
  'deck.raUm': 'deck Ra',
  'finish.raUm': 'bore Ra',
  'finish.rkUm': 'Rk',
  'finish.rpkUm': 'Rpk',
  'finish.rvkUm': 'Rvk',
  'finish.mr1': 'Mr1',
  'finish.mr2': 'Mr2',
  'finish.heightsUm': 'profile trace',
  'finish.spacingUm': 'sample spacing',
  'finish.filter': 'trace filter',
  'finish.filter.cutoffMm': 'cut-off',
  'crosshatch.includedAngleDeg': 'crosshatch angle',
  'crosshatch.spindleRpm': 'spindle speed',
  'crosshatch.strokeLength': 'stroke length',
  'crosshatch.cyclesPerMinute': 'the full up-and-down cycles per minute',
  signedOffBy: 'sign-off name',
  notes: 'notes',
};

/** A schema path in words: "cylinders.2.middle.axial" → "cylinder 3 middle axial". */
export function pathWords(path: string): string {
  const cell = cellPathWords(path);
  if (cell) return cell;
  const reading = /^deck\.readings\.(\d+)$/.exec(path);
  if (reading) return `straightedge reading ${Number(reading[1]) + 1}`;
  return FIELD_WORDS[path] ?? sectionPathWords(path) ?? path;
}

/** The id of the input that holds a path, so a message can lead to it. */
export function fieldId(path: string): string {
  if (/^deck\.readings\.\d+$/.test(path)) return 'field-deck-readings';
  if (path === 'cylinders') return 'field-cylinders-0-top-thrust';
  return `field-${path.replace(/\./g, '-')}`;
}
