/**
 * The inspection record's sections beyond the bore grid: each ordered kind of
 * work judged from its raw readings against the job's limits
 * (shared/operation-limits.ts) or the default shown there, under the same
 * decision rule and temperature correction as the bores.
 *
 * - Diameters (main housing bores, cam bearings, sleeve fits, crank journals)
 *   are corrected to 20 °C (ISO 1): housings, cam bearings and the block bore
 *   for a sleeve with the block's coefficient, sleeves with cast iron's, crank
 *   journals with steel's; they are judged under the job's decision rule with
 *   the record's uncertainty, like the bores.
 * - Feeler, height, seat, installed-height, mass and unbalance readings are
 *   taken as read and judged by simple acceptance: the record states no
 *   uncertainty for those instruments.
 */
import { operations, type OperationCode } from '../catalogue';
import { CRANK_UNDERSIZE_STEPS, forceUnitFor, limitFor, operationLimitFields, type LimitField, type LimitGroup, type OperationLimits } from '../operation-limits';
import type { LimitCheck, NotJudged } from '../schemas/inspection';
import type { InspectionSections, JournalReadings, SectionFigure, SectionResult, SectionVerdict } from '../schemas/inspection-sections';
import { HOT_TANK_ON_ALUMINIUM, cleanMethodsFor } from '../schemas/values';
import { balanceTolerance, bobWeight } from './balance';
import { deckFlatnessLimit, type DeckMaterial } from './deck';
import { judgeMax, judgeMin, judgeRange, verdictRank, type DecisionRule, type Verdict } from './decision-rule';
import { EXPANSION_COEFFICIENTS, toReferenceTemperature, type ExpansionMaterial } from './thermal';
import { NEWTONS_PER_POUND_FORCE, convertLength, type LengthUnit } from './units';

export const formatLength = (value: number, unit: LengthUnit) => `${value.toFixed(unit === 'in' ? 4 : 3)} ${unit}`;
export const formatFineLength = (value: number, unit: LengthUnit) => `${value.toFixed(unit === 'in' ? 5 : 4)} ${unit}`;

/** Bob weights are commonly made to within a gram of the worked-out figure (common practice, from memory). */
export const BOB_WEIGHT_TOLERANCE_GRAMS = 1;

export interface SectionSpec {
  unit: LengthUnit;
  blockMaterial?: DeckMaterial;
  limits?: OperationLimits;
  operations: ReadonlyArray<{ code: string }>;
}

export interface SectionContext {
  /** The record's unit. */
  unit: LengthUnit;
  rule: DecisionRule;
  /** The record's expanded uncertainty (or gauge resolution), in the record's unit. */
  uncertainty: number;
  celsius: number;
  spec: SectionSpec;
  add: (check: Omit<LimitCheck, 'pass'> & { verdict: Verdict }) => void;
  notJudged: (item: NotJudged) => void;
}

/** A limit in the record's unit (lengths converted from the job's unit), with the words saying where it came from. */
function limit<G extends LimitGroup>(ctx: SectionContext, group: G, key: keyof (typeof operationLimitFields)[G] & string) {
  const found = limitFor(ctx.spec.limits, group, key, ctx.spec.unit);
  if (!found) return undefined;
  const field = (operationLimitFields[group] as Record<string, LimitField>)[key];
  const value = field.kind === 'length' ? convertLength(found.value, ctx.spec.unit, ctx.unit) : found.value;
  return { value, note: found.isDefault ? `the default, ${found.source}` : undefined };
}

const at20 = (ctx: SectionContext, material: ExpansionMaterial | 'steel', value: number) =>
  toReferenceTemperature(value, material === 'steel' ? STEEL_ALPHA : EXPANSION_COEFFICIENTS[material].alpha, ctx.celsius);

/** Steel, 11.75 × 10⁻⁶/K: the middle of the published 11.5–12 × 10⁻⁶/K (Engineering ToolBox; Machinery’s Handbook tables). */
export const STEEL_ALPHA = 11.75e-6;

/** The worst of several readings against one limit, with where it was taken. */
function worstOf(items: Array<{ value: number; where: string; verdict: Verdict; off: number }>) {
  return items.reduce((a, b) => (verdictRank(b.verdict) > verdictRank(a.verdict) || (verdictRank(b.verdict) === verdictRank(a.verdict) && b.off > a.off) ? b : a));
}

function rangeWords(min: number | undefined, max: number | undefined, fmt: (v: number) => string) {
  if (min !== undefined && max !== undefined) return `${fmt(min)} – ${fmt(max)}`;
  return min !== undefined ? `≥ ${fmt(min)}` : `≤ ${fmt(max!)}`;
}

function judgeBetween(value: number, min: number | undefined, max: number | undefined, rule: DecisionRule, u: number): Verdict {
  if (min !== undefined && max !== undefined) return judgeRange(value, min, max, rule, u);
  return min !== undefined ? judgeMin(value, min, rule, u) : judgeMax(value, max!, rule, u);
}

// --- clean and crack test ------------------------------------------------------

const CLEAN_WORDS = { 'hot-tank': 'hot tank', 'thermal-oven': 'thermal oven', 'spray-wash': 'spray wash', other: 'other' } as const;
const CRACK_METHOD_WORDS = { 'magnetic-particle': 'magnetic particle', 'dye-penetrant': 'dye penetrant', 'pressure-test': 'pressure test' } as const;

function judgeClean(s: NonNullable<InspectionSections['clean']>, ctx: SectionContext): SectionFigure[] {
  ctx.add({ section: 'clean', what: 'part cleaned', value: 0, valueText: s.result === 'clean' ? 'clean' : 'residue left', allowed: 'clean', verdict: s.result === 'clean' ? 'conforms' : 'fails', note: s.findings || undefined });
  // The server refuses such a record; a record kept from before is judged here, so it never reads as sound.
  if (!cleanMethodsFor(ctx.spec.blockMaterial).includes(s.method)) {
    ctx.add({ section: 'clean', what: 'cleaning method suits the metal', value: 0, valueText: `${CLEAN_WORDS[s.method]} on aluminium`, allowed: 'no caustic on aluminium', verdict: 'fails', note: HOT_TANK_ON_ALUMINIUM });
  }
  return [{ label: 'Method', value: CLEAN_WORDS[s.method] }, { label: 'Findings', value: s.findings || '—' }, { label: 'Photos', value: s.photoIds?.length ?? 0 }];
}

function judgeCrackTest(s: NonNullable<InspectionSections['crackTest']>, ctx: SectionContext): SectionFigure[] {
  const found = s.result === 'crack-found';
  ctx.add({ section: 'crack-test', what: 'crack test', value: 0, valueText: found ? 'crack found' : 'no crack found', allowed: 'no crack', verdict: found ? 'fails' : 'conforms', note: s.findings || undefined });
  return [{ label: 'Method', value: CRACK_METHOD_WORDS[s.method] }, { label: 'Findings', value: s.findings || '—' }, { label: 'Photos', value: s.photoIds?.length ?? 0 }];
}

// --- line hone ------------------------------------------------------------------

function judgeLineHone(s: NonNullable<InspectionSections['lineHone']>, ctx: SectionContext): SectionFigure[] {
  const { unit, rule, uncertainty: u } = ctx;
  const material = ctx.spec.blockMaterial ?? 'cast-iron';
  const fmt = (v: number) => formatLength(v, unit);
  const min = limit(ctx, 'lineHone', 'housingMin');
  const max = limit(ctx, 'lineHone', 'housingMax');
  const oor = limit(ctx, 'lineHone', 'maxOutOfRound')!;
  const taper = limit(ctx, 'lineHone', 'maxTaper')!;
  const second = s.secondDirection === '45' ? 'at 45°' : 'horizontal';
  const figures: SectionFigure[] = [{ label: 'Second direction', value: second }];
  if (!min && !max) ctx.notJudged({ section: 'line-hone', what: 'main housing bore size', why: 'the job gives no housing bore size range' });
  s.bores.forEach((bore, index) => {
    const n = index + 1;
    const readings = [
      { where: 'vertical, front', value: at20(ctx, material, bore.vertical.front) },
      { where: 'vertical, rear', value: at20(ctx, material, bore.vertical.rear) },
      { where: `${second}, front`, value: at20(ctx, material, bore.second.front) },
      { where: `${second}, rear`, value: at20(ctx, material, bore.second.rear) },
    ];
    if (min || max) {
      const middle = min && max ? (min.value + max.value) / 2 : (min ?? max)!.value;
      const worst = worstOf(readings.map((r) => ({ ...r, verdict: judgeBetween(r.value, min?.value, max?.value, rule, u), off: Math.abs(r.value - middle) })));
      ctx.add({ section: 'line-hone', what: `main bore ${n} size`, value: worst.value, allowed: rangeWords(min?.value, max?.value, fmt), verdict: worst.verdict, note: `each of the four readings judged; the one farthest from the middle of the range is ${worst.where}` });
    }
    const outOfRound = Math.max(Math.abs(readings[0].value - readings[2].value), Math.abs(readings[1].value - readings[3].value));
    ctx.add({ section: 'line-hone', what: `main bore ${n} out-of-round`, value: outOfRound, allowed: `≤ ${fmt(oor.value)}`, verdict: judgeMax(outOfRound, oor.value, rule, u), note: oor.note });
    const bend = Math.max(Math.abs(readings[0].value - readings[1].value), Math.abs(readings[2].value - readings[3].value));
    ctx.add({ section: 'line-hone', what: `main bore ${n} taper`, value: bend, allowed: `≤ ${fmt(taper.value)}`, verdict: judgeMax(bend, taper.value, rule, u), note: taper.note });
    figures.push({ label: `Main bore ${n}, mean`, value: Number((readings.reduce((sum, r) => sum + r.value, 0) / 4).toFixed(6)), unit });
  });
  const centres = s.bores.map((bore) => bore.centre);
  const alignment = limit(ctx, 'lineHone', 'maxAlignment')!;
  if (centres.every((c): c is number => c !== undefined)) {
    const deviations = lineDeviations(centres);
    const worst = deviations.reduce((a, b, i) => (Math.abs(b) > Math.abs(deviations[a]) ? i : a), 0);
    const value = Math.abs(deviations[worst]);
    ctx.add({ section: 'line-hone', what: 'main bore alignment', value, allowed: `≤ ${fmt(alignment.value)}`, verdict: judgeMax(value, alignment.value, 'simple', 0), note: `bore ${worst + 1} is farthest from the line through the end bores${alignment.note ? `; ${alignment.note}` : ''}` });
    figures.push({ label: 'Largest centre off the line', value: Number(value.toFixed(6)), unit });
  } else {
    ctx.notJudged({ section: 'line-hone', what: 'main bore alignment', why: 'the record does not give every bore’s centre reading' });
  }
  return figures;
}

/**
 * Each point's distance from the straight line through the first and last
 * points, the points taken as equally spaced (main bearing bores are).
 */
export function lineDeviations(centres: readonly number[]): number[] {
  const last = centres.length - 1;
  if (last < 1) return centres.map(() => 0);
  return centres.map((c, i) => c - (centres[0] + ((centres[last] - centres[0]) * i) / last));
}

// --- cam bore -------------------------------------------------------------------

function judgeCamBore(s: NonNullable<InspectionSections['camBore']>, ctx: SectionContext): SectionFigure[] {
  const { unit, rule, uncertainty: u } = ctx;
  const fmt = (v: number) => formatLength(v, unit);
  const material = ctx.spec.blockMaterial ?? 'cast-iron';
  const min = limit(ctx, 'camBore', 'bearingMin');
  const max = limit(ctx, 'camBore', 'bearingMax');
  const jobJournal = limit(ctx, 'camBore', 'camJournal');
  const cMin = limit(ctx, 'camBore', 'clearanceMin')!;
  const cMax = limit(ctx, 'camBore', 'clearanceMax')!;
  const figures: SectionFigure[] = [];
  s.bearings.forEach((raw, index) => {
    const n = index + 1;
    const bearing = at20(ctx, material, raw);
    if (min || max) ctx.add({ section: 'cam-bore', what: `cam bearing ${n} inside diameter`, value: bearing, allowed: rangeWords(min?.value, max?.value, fmt), verdict: judgeBetween(bearing, min?.value, max?.value, rule, u) });
    const journal = s.journals ? at20(ctx, 'steel', s.journals[index]) : jobJournal?.value;
    if (journal !== undefined) {
      const clearance = bearing - journal;
      const note = s.journals ? 'the measured journal at 20 °C' : 'the job’s cam journal diameter';
      ctx.add({ section: 'cam-bore', what: `cam bearing ${n} clearance`, value: clearance, allowed: rangeWords(cMin.value, cMax.value, fmt), verdict: judgeRange(clearance, cMin.value, cMax.value, rule, u), note: [note, cMin.note].filter(Boolean).join('; ') });
    }
    figures.push({ label: `Bearing ${n} inside diameter`, value: Number(bearing.toFixed(6)), unit });
  });
  if (!min && !max) ctx.notJudged({ section: 'cam-bore', what: 'cam bearing size', why: 'the job gives no cam bearing size range' });
  return figures;
}

// --- sleeve ---------------------------------------------------------------------

function judgeSleeve(s: NonNullable<InspectionSections['sleeve']>, ctx: SectionContext): SectionFigure[] {
  const { unit, rule, uncertainty: u } = ctx;
  const fmt = (v: number) => formatLength(v, unit);
  const material = ctx.spec.blockMaterial ?? 'cast-iron';
  const iMin = limit(ctx, 'sleeve', 'interferenceMin')!;
  const iMax = limit(ctx, 'sleeve', 'interferenceMax')!;
  const pMin = limit(ctx, 'sleeve', 'flangeProtrusionMin');
  const pMax = limit(ctx, 'sleeve', 'flangeProtrusionMax');
  const figures: SectionFigure[] = [];
  for (const row of s.cylinders) {
    const interference = at20(ctx, 'cast-iron', row.sleeveOutside) - at20(ctx, material, row.blockBore);
    ctx.add({ section: 'sleeve', what: `cylinder ${row.cylinder} sleeve interference`, cylinder: row.cylinder, value: interference, allowed: rangeWords(iMin.value, iMax.value, fmt), verdict: judgeRange(interference, iMin.value, iMax.value, rule, u), note: ['sleeve outside less block bore, both at 20 °C', iMin.note].filter(Boolean).join('; ') });
    figures.push({ label: `Cylinder ${row.cylinder} interference`, value: Number(interference.toFixed(6)), unit });
    if (pMin || pMax) {
      if (row.flangeProtrusion === undefined) ctx.notJudged({ section: 'sleeve', what: `cylinder ${row.cylinder} flange protrusion`, why: 'the record gives no protrusion' });
      else ctx.add({ section: 'sleeve', what: `cylinder ${row.cylinder} flange protrusion`, cylinder: row.cylinder, value: row.flangeProtrusion, allowed: rangeWords(pMin?.value, pMax?.value, fmt), verdict: judgeBetween(row.flangeProtrusion, pMin?.value, pMax?.value, 'simple', 0) });
    }
  }
  return figures;
}

// --- head resurface -------------------------------------------------------------

function judgeHeadResurface(s: NonNullable<InspectionSections['headResurface']>, ctx: SectionContext): SectionFigure[] {
  const { unit } = ctx;
  const fmt = (v: number) => formatLength(v, unit);
  const own = limit(ctx, 'headResurface', 'flatnessMax');
  const material = ctx.spec.blockMaterial ?? 'aluminium';
  const flatness = own ?? { value: deckFlatnessLimit(material, 'mls', unit), note: `the common-practice deck table for ${material === 'aluminium' ? 'aluminium' : 'cast iron'} with a multi-layer steel gasket` };
  const maxStock = limit(ctx, 'headResurface', 'maxStockRemoved');
  const figures: SectionFigure[] = [];
  s.heads.forEach((head, index) => {
    const n = index + 1;
    const worst = head.straightedge.reduce((a, b) => (b.value > a.value ? b : a));
    ctx.add({ section: 'head-resurface', what: `head ${n} out-of-flat`, value: worst.value, allowed: `≤ ${fmt(flatness.value)}`, verdict: judgeMax(worst.value, flatness.value, 'simple', 0), note: [`largest straightedge reading, ${worst.position}`, flatness.note].filter(Boolean).join('; ') });
    figures.push({ label: `Head ${n} out-of-flat`, value: worst.value, unit });
    if (head.stockRemoved !== undefined) {
      figures.push({ label: `Head ${n} stock removed`, value: head.stockRemoved, unit });
      if (maxStock) ctx.add({ section: 'head-resurface', what: `head ${n} stock removed`, value: head.stockRemoved, allowed: `≤ ${fmt(maxStock.value)}`, verdict: judgeMax(head.stockRemoved, maxStock.value, 'simple', 0) });
    } else if (maxStock) {
      ctx.notJudged({ section: 'head-resurface', what: `head ${n} stock removed`, why: 'the record does not say how much was removed' });
    }
    if (head.chamberBeforeCc !== undefined) figures.push({ label: `Head ${n} chamber before`, value: head.chamberBeforeCc, unit: 'cc' });
    if (head.chamberAfterCc !== undefined) figures.push({ label: `Head ${n} chamber after`, value: head.chamberAfterCc, unit: 'cc' });
    if (head.chamberBeforeCc !== undefined && head.chamberAfterCc !== undefined) {
      figures.push({ label: `Head ${n} chamber change`, value: Number((head.chamberAfterCc - head.chamberBeforeCc).toFixed(2)), unit: 'cc' });
    }
  });
  return figures;
}

// --- valve job ------------------------------------------------------------------

function judgeValveJob(s: NonNullable<InspectionSections['valveJob']>, ctx: SectionContext): SectionFigure[] {
  const { unit } = ctx;
  const fmt = (v: number) => formatLength(v, unit);
  const force = forceUnitFor(unit);
  const jobForce = forceUnitFor(ctx.spec.unit);
  const worstCheck = (what: string, values: Array<{ value: number; label: string }>, min: number | undefined, max: number | undefined, allowed: string, note?: string) => {
    const middle = min !== undefined && max !== undefined ? (min + max) / 2 : (min ?? max)!;
    const worst = worstOf(values.map((v) => ({ value: v.value, where: v.label, verdict: judgeBetween(v.value, min, max, 'simple', 0), off: Math.abs(v.value - middle) })));
    ctx.add({ section: 'valve-job', what, value: worst.value, allowed, verdict: worst.verdict, note: [`every valve judged; the farthest from the middle is valve ${worst.where}`, note].filter(Boolean).join('; ') });
  };
  const seatMin = limit(ctx, 'valveJob', 'seatWidthMin')!;
  const seatMax = limit(ctx, 'valveJob', 'seatWidthMax')!;
  worstCheck('valve seat width', s.valves.map((v) => ({ value: v.seatWidth, label: v.label })), seatMin.value, seatMax.value, rangeWords(seatMin.value, seatMax.value, fmt), seatMin.note);
  const guideMin = limit(ctx, 'valveJob', 'stemToGuideMin')!;
  const guideMax = limit(ctx, 'valveJob', 'stemToGuideMax')!;
  worstCheck('stem-to-guide clearance', s.valves.map((v) => ({ value: v.stemToGuide, label: v.label })), guideMin.value, guideMax.value, rangeWords(guideMin.value, guideMax.value, fmt), guideMin.note);
  const target = limit(ctx, 'valveJob', 'installedHeight');
  const tolerance = limit(ctx, 'valveJob', 'installedHeightTolerance')!;
  if (target) {
    worstCheck('valve installed height', s.valves.map((v) => ({ value: v.installedHeight, label: v.label })), target.value - tolerance.value, target.value + tolerance.value, `${fmt(target.value)} ± ${fmt(tolerance.value)}`, tolerance.note);
  } else {
    ctx.notJudged({ section: 'valve-job', what: 'valve installed height', why: 'the job gives no installed height target' });
  }
  const springMin = limit(ctx, 'valveJob', 'springPressureMin');
  if (springMin) {
    // A force limit is in the job's force unit: lbf for inches, N for millimetres (1 lbf = 4.4482216152605 N, exact by definition of the pound-force).
    const least = jobForce === force ? springMin.value : jobForce === 'lbf' ? springMin.value * NEWTONS_PER_POUND_FORCE : springMin.value / NEWTONS_PER_POUND_FORCE;
    const given = s.valves.filter((v) => v.springPressure !== undefined);
    if (given.length < s.valves.length) ctx.notJudged({ section: 'valve-job', what: 'spring pressure at installed height', why: 'the record does not give every valve’s spring pressure' });
    if (given.length > 0) {
      const weakest = given.reduce((a, b) => (b.springPressure! < a.springPressure! ? b : a));
      ctx.add({ section: 'valve-job', what: 'spring pressure at installed height', value: weakest.springPressure!, allowed: `≥ ${Number(least.toFixed(1))} ${force}`, verdict: judgeMin(weakest.springPressure!, least, 'simple', 0), note: `the weakest is valve ${weakest.label}` });
    }
  }
  return [
    { label: 'Valves measured', value: s.valves.length },
    { label: 'Seat width, narrowest – widest', value: `${fmt(Math.min(...s.valves.map((v) => v.seatWidth)))} – ${fmt(Math.max(...s.valves.map((v) => v.seatWidth)))}` },
    { label: 'Installed height, lowest – highest', value: `${fmt(Math.min(...s.valves.map((v) => v.installedHeight)))} – ${fmt(Math.max(...s.valves.map((v) => v.installedHeight)))}` },
  ];
}

// --- crank grind ----------------------------------------------------------------

/** A journal's size (all four readings), taper (front against rear, per direction) and out-of-round (vertical against horizontal, per position). */
export function journalFigures(j: JournalReadings) {
  const readings = [
    { where: 'front, vertical', value: j.front.vertical },
    { where: 'front, horizontal', value: j.front.horizontal },
    { where: 'rear, vertical', value: j.rear.vertical },
    { where: 'rear, horizontal', value: j.rear.horizontal },
  ];
  return {
    readings,
    taper: Math.max(Math.abs(j.front.vertical - j.rear.vertical), Math.abs(j.front.horizontal - j.rear.horizontal)),
    outOfRound: Math.max(Math.abs(j.front.vertical - j.front.horizontal), Math.abs(j.rear.vertical - j.rear.horizontal)),
  };
}

function judgeCrankGrind(s: NonNullable<InspectionSections['crankGrind']>, ctx: SectionContext): SectionFigure[] {
  const { unit, rule, uncertainty: u } = ctx;
  const fmt = (v: number) => formatLength(v, unit);
  const tolerance = limit(ctx, 'crankGrind', 'journalTolerance')!;
  const taper = limit(ctx, 'crankGrind', 'maxTaper')!;
  const oor = limit(ctx, 'crankGrind', 'maxOutOfRound')!;
  const steps = CRANK_UNDERSIZE_STEPS[unit];
  const isStep = steps.some((step) => Math.abs(step - s.undersize) < 1e-9);
  const figures: SectionFigure[] = [
    { label: 'Undersize', value: s.undersize === 0 ? 'standard' : `${fmt(s.undersize)}${isStep ? '' : ' (not one of the common steps)'}` },
  ];
  const kinds = [
    { kind: 'main' as const, journals: s.mains, standard: limit(ctx, 'crankGrind', 'mainStandard') },
    { kind: 'rod' as const, journals: s.rods, standard: limit(ctx, 'crankGrind', 'rodStandard') },
  ];
  for (const { kind, journals, standard } of kinds) {
    if (!standard) ctx.notJudged({ section: 'crank-grind', what: `${kind} journal size`, why: `the job gives no standard ${kind} journal diameter` });
    const size = standard ? standard.value - s.undersize : undefined;
    journals.forEach((raw, index) => {
      const n = index + 1;
      const j = journalFigures({
        front: { vertical: at20(ctx, 'steel', raw.front.vertical), horizontal: at20(ctx, 'steel', raw.front.horizontal) },
        rear: { vertical: at20(ctx, 'steel', raw.rear.vertical), horizontal: at20(ctx, 'steel', raw.rear.horizontal) },
      });
      if (size !== undefined) {
        const min = size - tolerance.value;
        const worst = worstOf(j.readings.map((r) => ({ ...r, verdict: judgeRange(r.value, min, size, rule, u), off: Math.abs(r.value - (min + size) / 2) })));
        ctx.add({ section: 'crank-grind', what: `${kind} journal ${n} size`, value: worst.value, allowed: `${fmt(min)} – ${fmt(size)}`, verdict: worst.verdict, note: [`standard less the undersize, less the tolerance; the reading farthest from the middle is ${worst.where}`, tolerance.note].filter(Boolean).join('; ') });
      }
      ctx.add({ section: 'crank-grind', what: `${kind} journal ${n} taper`, value: j.taper, allowed: `≤ ${fmt(taper.value)}`, verdict: judgeMax(j.taper, taper.value, rule, u), note: taper.note });
      ctx.add({ section: 'crank-grind', what: `${kind} journal ${n} out-of-round`, value: j.outOfRound, allowed: `≤ ${fmt(oor.value)}`, verdict: judgeMax(j.outOfRound, oor.value, rule, u), note: oor.note });
    });
    figures.push({ label: `${kind === 'main' ? 'Main' : 'Rod'} journals measured`, value: journals.length });
  }
  const ra = limit(ctx, 'crankGrind', 'journalRaMaxUm')!;
  if (s.raUm === undefined) ctx.notJudged({ section: 'crank-grind', what: 'journal Ra', why: 'the record gives no journal finish' });
  else {
    ctx.add({ section: 'crank-grind', what: 'journal Ra', value: s.raUm, allowed: `≤ ${ra.value} µm`, verdict: judgeMax(s.raUm, ra.value, 'simple', 0), note: ra.note });
    figures.push({ label: 'Journal Ra', value: s.raUm, unit: 'µm' });
  }
  return figures;
}

// --- balance --------------------------------------------------------------------

function judgeBalance(s: NonNullable<InspectionSections['balance']>, ctx: SectionContext): SectionFigure[] {
  const bob = bobWeight({ rotatingGrams: s.rotatingGrams, reciprocatingGrams: s.reciprocatingGrams, reciprocatingFactor: s.reciprocatingFactor, oilGrams: s.oilGrams });
  const off = s.bobWeightGrams - bob.bobWeightGrams;
  ctx.add({
    section: 'balance',
    what: 'bob weight fitted',
    value: s.bobWeightGrams,
    allowed: `${bob.bobWeightGrams.toFixed(1)} g ± ${BOB_WEIGHT_TOLERANCE_GRAMS} g`,
    verdict: judgeMax(Math.abs(off), BOB_WEIGHT_TOLERANCE_GRAMS, 'simple', 0),
    note: `worked out from the weighed parts: rotating + ${bob.reciprocatingFactor} × reciprocating${s.oilGrams ? ' + oil' : ''}; ± ${BOB_WEIGHT_TOLERANCE_GRAMS} g is common practice, from memory`,
  });
  const grade = limit(ctx, 'balance', 'grade')!;
  const jobRpm = limit(ctx, 'balance', 'serviceRpm');
  const rpm = jobRpm?.value ?? s.serviceRpm;
  const permissible = balanceTolerance({ rotorMassKg: s.rotorMassKg, serviceRpm: rpm, grade: grade.value });
  if (s.grade > grade.value + 1e-9) {
    ctx.add({ section: 'balance', what: 'balance grade', value: s.grade, allowed: `G ${grade.value} or finer`, verdict: 'fails', note: 'the record’s grade is looser than the job’s' });
  }
  for (const plane of s.residual) {
    ctx.add({ section: 'balance', what: `residual unbalance, ${plane.plane} plane`, value: plane.gmm, allowed: `≤ ${permissible.perPlaneGmm.toFixed(1)} g·mm`, verdict: judgeMax(plane.gmm, permissible.perPlaneGmm, 'simple', 0), note: `ISO 21940-11: G ${grade.value} at ${rpm} rev/min on a ${s.rotorMassKg} kg crankshaft, half the permissible unbalance in each plane${grade.note ? `; grade: ${grade.note}` : ''}` });
  }
  if (s.residual.length < 2) ctx.notJudged({ section: 'balance', what: 'residual unbalance, both planes', why: 'the record gives one correction plane only' });
  return [
    { label: 'Bob weight worked out', value: Number(bob.bobWeightGrams.toFixed(1)), unit: 'g' },
    { label: 'Bob weight fitted', value: s.bobWeightGrams, unit: 'g' },
    { label: 'Grade and speed', value: `G ${grade.value} at ${rpm} rev/min` },
    { label: 'Permissible unbalance', value: Number(permissible.permissibleUnbalanceGmm.toFixed(1)), unit: 'g·mm' },
    { label: 'Permissible per plane', value: Number(permissible.perPlaneGmm.toFixed(1)), unit: 'g·mm' },
  ];
}

// --- assembling the sections ----------------------------------------------------

type SectionKey = keyof InspectionSections;

/** Which part of the input and which judge each operation's own section has. */
const sectionJudges: Partial<Record<OperationCode, { key: SectionKey; judge: (s: never, ctx: SectionContext) => SectionFigure[] }>> = {
  clean: { key: 'clean', judge: judgeClean },
  'crack-test': { key: 'crackTest', judge: judgeCrackTest },
  'line-hone': { key: 'lineHone', judge: judgeLineHone },
  'cam-bore': { key: 'camBore', judge: judgeCamBore },
  sleeve: { key: 'sleeve', judge: judgeSleeve },
  'head-resurface': { key: 'headResurface', judge: judgeHeadResurface },
  'valve-job': { key: 'valveJob', judge: judgeValveJob },
  'crank-grind': { key: 'crankGrind', judge: judgeCrankGrind },
  balance: { key: 'balance', judge: judgeBalance },
};

/** The check sections each operation's part of the record covers. */
export const SECTION_COVERS: Record<OperationCode, readonly string[]> = {
  clean: ['clean'],
  'crack-test': ['crack-test'],
  bore: ['bores'],
  hone: ['bores', 'finish', 'crosshatch'],
  'plateau-hone': ['bores', 'finish', 'crosshatch'],
  'torque-plate-hone': ['bores', 'finish', 'crosshatch'],
  deck: ['deck'],
  'line-hone': ['line-hone'],
  sleeve: ['sleeve', 'bores'],
  'cam-bore': ['cam-bore'],
  'head-resurface': ['head-resurface'],
  'valve-job': ['valve-job'],
  'crank-grind': ['crank-grind'],
  balance: ['balance'],
};

/** Judges the ordered operations' own sections; a section the job needs and the record lacks is not judged. */
export function judgeOwnSections(sections: InspectionSections | undefined, ctx: SectionContext): Map<string, SectionFigure[]> {
  const figures = new Map<string, SectionFigure[]>();
  const ordered = new Set(ctx.spec.operations.map((op) => op.code));
  for (const op of operations) {
    const entry = sectionJudges[op.code];
    if (!entry || !ordered.has(op.code)) continue;
    const input = sections?.[entry.key];
    if (input === undefined) {
      ctx.notJudged({ section: op.code, what: op.name.toLowerCase(), why: `the record has no ${op.name.toLowerCase()} section` });
      continue;
    }
    figures.set(op.code, entry.judge(input as never, ctx));
  }
  return figures;
}

/** One result per ordered operation, in the catalogue's order, with the verdict of the checks it covers. */
export function sectionResults(
  spec: SectionSpec,
  checks: readonly LimitCheck[],
  notJudged: readonly NotJudged[],
  figures: ReadonlyMap<string, SectionFigure[]>,
  statements: ReadonlyMap<string, string[]> = new Map(),
): SectionResult[] {
  const ordered = new Set(spec.operations.map((op) => op.code));
  return operations
    .filter((op) => ordered.has(op.code))
    .map((op) => {
      const covers = SECTION_COVERS[op.code];
      const mine = checks.filter((check) => check.section !== undefined && covers.includes(check.section));
      const open = notJudged.filter((item) => item.section !== undefined && covers.includes(item.section));
      let verdict: SectionVerdict = mine.length === 0 && open.length === 0 ? 'recorded' : 'conforms';
      const verdicts = mine.map((check) => check.verdict ?? (check.pass ? 'conforms' : 'fails'));
      if (verdicts.includes('fails')) verdict = 'fails';
      else if (open.length > 0) verdict = 'not-judged';
      else if (verdicts.includes('not-proven')) verdict = 'not-proven';
      return { operation: op.code, name: op.name, verdict, covers: [...covers], figures: figures.get(op.code) ?? [], statements: statements.get(op.code) ?? [] };
    });
}
