/**
 * Judges a shop's inspection record against the job's specification: the
 * one function both the entry form (live) and the server (authoritative) use.
 * Lengths in the job's spec are converted to the record's unit exactly.
 *
 * What it does, in order:
 * 1. Corrects every bore and piston reading to 20 °C (ISO 1) with the block's
 *    and the pistons' expansion coefficients (`thermal.ts`); the raw readings
 *    stay in the input, the corrected ones go into `corrected`.
 * 2. Judges every limit the job sets, per cylinder: each of the six readings
 *    against the finished size (target ± tolerance), the piston clearance on
 *    the thrust axis at every depth (smallest thrust reading − piston against
 *    the minimum, largest against the maximum: the skirt bears on the thrust
 *    faces), taper and out-of-round; then the deck, finish and crosshatch.
 *    Without piston sizes in the record the job's piston diameter is used,
 *    and the record says so.
 * 3. Each check gets a verdict under the job's decision rule (`decision-rule.ts`):
 *    conforms, fails or not proven. A limit with nothing to judge it by goes
 *    into `notJudged`, and the record is then "not fully judged", never a pass;
 *    a record with nothing to judge (the job gave no limits) is not fully judged too.
 */
import type { CheckVerdict, CorrectedCylinder, InspectionInput, InspectionResults, LimitCheck, NotJudged, RecordVerdict } from '../schemas/inspection';
import type { SectionFigure } from '../schemas/inspection-sections';
import type { JobInput } from '../schemas/jobs';
import { DEPTHS, inspectBores, type CylinderReadings } from './bore';
import { crosshatchAngle } from './crosshatch';
import { deckFlatness } from './deck';
import { DECISION_RULE_WORDS, judgeMax, judgeMin, judgeRange, verdictRank, type DecisionRule, type Verdict } from './decision-rule';
import { roughness } from './roughness';
import { formatFineLength as fmtFine, formatLength as fmt, judgeOwnSections, sectionResults } from './record-sections';
import { EXPANSION_COEFFICIENTS, EXPANSION_SOURCE, PISTON_MATERIAL, REFERENCE_TEMPERATURE_C, fahrenheitToCelsius, toReferenceTemperature } from './thermal';
import { SLACK, boreSpecFor, DEFAULT_SIZE_TOLERANCE_IN, sizeDisagreement } from './bore-spec';
import { convertLength, type LengthUnit } from './units';
import { NO_LIMITS_GIVEN } from './conformance';
import { boreOperationCodes } from '../catalogue';
import { limitFor } from '../operation-limits';

type JobSpecPart = Pick<
  JobInput,
  | 'unit'
  | 'blockMaterial'
  | 'targetBore'
  | 'boreSizeTolerance'
  | 'pistonDiameter'
  | 'clearanceMin'
  | 'clearanceMax'
  | 'maxTaper'
  | 'maxOutOfRound'
  | 'deckFlatnessMax'
  | 'deckRaMaxUm'
  | 'finishRaMaxUm'
  | 'finishRkMaxUm'
  | 'finishRpkMaxUm'
  | 'finishRvkMaxUm'
  | 'crosshatchMinDeg'
  | 'crosshatchMaxDeg'
  | 'decisionRule'
> &
  Partial<Pick<JobInput, 'limits' | 'operations'>>;


export { DEFAULT_SIZE_TOLERANCE_IN, boreSpecFor, sizeDisagreement };



/** The measured temperature in °C, whichever scale it was entered in. */
export function measuredCelsius(conditions: InspectionInput['conditions']): { celsius: number; entered: 'C' | 'F' } {
  if (conditions.temperatureC !== undefined) return { celsius: conditions.temperatureC, entered: 'C' };
  if (conditions.temperatureF !== undefined) return { celsius: fahrenheitToCelsius(conditions.temperatureF), entered: 'F' };
  return { celsius: REFERENCE_TEMPERATURE_C, entered: 'C' };
}

const POSITION_WORDS = (depth: string, direction: string) => `${depth} ${direction}`;

export function evaluateInspection(input: InspectionInput, spec: JobSpecPart): InspectionResults {
  const unit = input.conditions.unit;
  const rule: DecisionRule = spec.decisionRule ?? 'simple';
  const uncertainty = input.conditions.uncertainty ?? input.conditions.gaugeResolution;
  const uncertaintySource = input.conditions.uncertainty !== undefined ? 'entered' : 'gauge-resolution';
  const checks: LimitCheck[] = [];
  const notJudged: NotJudged[] = [];
  const statements: string[] = [];
  const add = (check: Omit<LimitCheck, 'pass'> & { verdict: Verdict }) => checks.push({ ...check, pass: check.verdict === 'conforms' });
  /** Everything below that reads a bore or judges a bore limit is tagged with its part of the record. */
  const tagged = (section: string) => (check: Omit<LimitCheck, 'pass'> & { verdict: Verdict }) => add({ section, ...check });
  const material = spec.blockMaterial ?? 'cast-iron';

  // 1. Temperature: every reading to 20 °C.
  const { celsius, entered } = measuredCelsius(input.conditions);
  const block = EXPANSION_COEFFICIENTS[material];
  const pistonCoefficient = EXPANSION_COEFFICIENTS[PISTON_MATERIAL];
  const boreAt20 = (value: number) => toReferenceTemperature(value, block.alpha, celsius);
  const jobPiston = spec.pistonDiameter !== undefined ? convertLength(spec.pistonDiameter, spec.unit, unit) : undefined;
  const corrected: CorrectedCylinder[] = (input.cylinders ?? []).map((c) => {
    const out: CorrectedCylinder = {
      top: { thrust: boreAt20(c.top.thrust), axial: boreAt20(c.top.axial) },
      middle: { thrust: boreAt20(c.middle.thrust), axial: boreAt20(c.middle.axial) },
      bottom: { thrust: boreAt20(c.bottom.thrust), axial: boreAt20(c.bottom.axial) },
    };
    if (c.piston !== undefined) {
      out.piston = toReferenceTemperature(c.piston, pistonCoefficient.alpha, celsius);
      out.pistonSource = 'record';
    } else if (jobPiston !== undefined) {
      // The job's piston diameter is a specified size, i.e. a size at 20 °C: not corrected.
      out.piston = jobPiston;
      out.pistonSource = 'job';
    }
    return out;
  });
  const measuredAt = entered === 'F' ? `${Number(input.conditions.temperatureF!.toFixed(2))} °F (${Number(celsius.toFixed(2))} °C)` : `${Number(celsius.toFixed(2))} °C`;
  statements.push(
    Math.abs(celsius - REFERENCE_TEMPERATURE_C) < 1e-12
      ? `Measured at ${measuredAt}, the reference temperature of ISO 1: no correction needed.`
      : input.cylinders
        ? `Measured at ${measuredAt}; every reading is corrected to 20 °C (ISO 1) with L20 = Lt / (1 + α·(t − 20)): bores with ${block.words}, pistons with ${pistonCoefficient.words}. Coefficients: ${EXPANSION_SOURCE}. Clearances are judged at 20 °C.`
        : `Measured at ${measuredAt}; every diameter is corrected to 20 °C (ISO 1) with L20 = Lt / (1 + α·(t − 20)). Coefficients: ${EXPANSION_SOURCE}.`,
  );

  const limits = boreSpecFor(spec, unit);
  const bores = input.cylinders ? inspectBores({ cylinders: corrected as CylinderReadings[], spec: { targetBore: limits.targetBore } }) : undefined;
  const boreWork = (spec.operations ?? []).some((op) => boreOperationCodes.includes(op.code));
  if (!input.cylinders && boreWork) notJudged.push({ section: 'bores', what: 'bore readings', why: 'the record has no bore grid' });

  // 2. Bore limits, per cylinder.
  const fromRecord = corrected.filter((c) => c.pistonSource === 'record').length;
  const fromJob = corrected.filter((c) => c.pistonSource === 'job').length;
  if (limits.clearanceMin !== undefined || limits.clearanceMax !== undefined) {
    if (fromJob > 0 && jobPiston !== undefined) {
      statements.push(
        fromRecord === 0
          ? `The record gives no piston sizes: clearances use the job’s piston diameter, ${fmt(jobPiston, unit)}.`
          : `${fromJob} ${fromJob === 1 ? 'cylinder has' : 'cylinders have'} no piston size in the record: ${fromJob === 1 ? 'its clearance uses' : 'their clearances use'} the job’s piston diameter, ${fmt(jobPiston, unit)}.`,
      );
    }
    statements.push('Piston clearance is judged on the thrust axis at every depth: the smallest thrust reading less the piston against the minimum, the largest against the maximum.');
  }
  const sizeAllowed =
    limits.targetBore !== undefined && limits.targetTolerance !== undefined ? `${fmt(limits.targetBore, unit)} ± ${fmtFine(limits.targetTolerance, unit)}` : '';
  const toleranceNote = limits.toleranceIsDefault ? `; ± ${fmtFine(limits.targetTolerance!, unit)} is the default, common practice (the job gives no size tolerance)` : '';

  corrected.forEach((c, index) => {
    const n = index + 1;
    const figures = bores!.cylinders[index];
    if (limits.targetBore !== undefined && limits.targetTolerance !== undefined) {
      const min = limits.targetBore - limits.targetTolerance;
      const max = limits.targetBore + limits.targetTolerance;
      let worst: { verdict: Verdict; value: number; where: string } | undefined;
      for (const depth of DEPTHS) {
        for (const direction of ['thrust', 'axial'] as const) {
          const value = c[depth][direction];
          const verdict = judgeRange(value, min, max, rule, uncertainty);
          const off = Math.abs(value - limits.targetBore);
          if (!worst || verdictRank(verdict) > verdictRank(worst.verdict) || (verdictRank(verdict) === verdictRank(worst.verdict) && off > Math.abs(worst.value - limits.targetBore) + SLACK)) {
            worst = { verdict, value, where: POSITION_WORDS(depth, direction) };
          }
        }
      }
      tagged('bores')({
        what: `cylinder ${n} size`,
        limit: 'size',
        cylinder: n,
        value: worst!.value,
        allowed: sizeAllowed,
        verdict: worst!.verdict,
        note: `each of the six readings judged; the one farthest from the target is ${worst!.where}${toleranceNote}`,
      });
    }
    if (limits.clearanceMin !== undefined || limits.clearanceMax !== undefined) {
      if (c.piston === undefined) {
        notJudged.push({ section: 'bores', what: `cylinder ${n} piston clearance`, why: 'no piston size in the record and no piston diameter in the job' });
      } else {
        const thrust = DEPTHS.map((depth) => ({ depth, value: c[depth].thrust }));
        const smallest = thrust.reduce((a, b) => (b.value < a.value ? b : a));
        const largest = thrust.reduce((a, b) => (b.value > a.value ? b : a));
        const pistonWords = c.pistonSource === 'job' ? `the job’s piston diameter ${fmt(c.piston, unit)}` : `the measured piston, ${fmtFine(c.piston, unit)} at 20 °C`;
        if (limits.clearanceMin !== undefined) {
          const value = smallest.value - c.piston;
          tagged('bores')({ what: `cylinder ${n} smallest piston clearance`, limit: 'clearanceMin', cylinder: n, value, allowed: `≥ ${fmt(limits.clearanceMin, unit)}`, verdict: judgeMin(value, limits.clearanceMin, rule, uncertainty), note: `${smallest.depth} thrust less ${pistonWords}` });
        }
        if (limits.clearanceMax !== undefined) {
          const value = largest.value - c.piston;
          tagged('bores')({ what: `cylinder ${n} largest piston clearance`, limit: 'clearanceMax', cylinder: n, value, allowed: `≤ ${fmt(limits.clearanceMax, unit)}`, verdict: judgeMax(value, limits.clearanceMax, rule, uncertainty), note: `${largest.depth} thrust less ${pistonWords}` });
        }
      }
    }
    if (limits.maxTaper !== undefined) {
      tagged('bores')({ what: `cylinder ${n} taper`, limit: 'maxTaper', cylinder: n, value: figures.taper, allowed: `≤ ${fmt(limits.maxTaper, unit)}`, verdict: judgeMax(figures.taper, limits.maxTaper, rule, uncertainty) });
    }
    if (limits.maxOutOfRound !== undefined) {
      tagged('bores')({ what: `cylinder ${n} out-of-round`, limit: 'maxOutOfRound', cylinder: n, value: figures.outOfRound, allowed: `≤ ${fmt(limits.maxOutOfRound, unit)}`, verdict: judgeMax(figures.outOfRound, limits.maxOutOfRound, rule, uncertainty) });
    }
  });

  // The per-cylinder figures carry the same verdicts, so every screen that reads `bores` agrees with the checks.
  bores?.cylinders.forEach((figures, index) => {
    const mine = checks.filter((check) => check.cylinder === index + 1);
    figures.failures = mine
      .filter((check) => check.verdict === 'fails')
      .map((check) => ({
        limit: check.limit === 'size' ? 'targetBore' : (check.limit as 'clearanceMin' | 'clearanceMax' | 'maxTaper' | 'maxOutOfRound'),
        value: check.limit === 'size' ? check.value - limits.targetBore! : check.value,
        allowed: check.limit === 'size' ? limits.targetTolerance! : limits[check.limit as 'clearanceMin' | 'clearanceMax' | 'maxTaper' | 'maxOutOfRound']!,
      }));
    figures.notChecked = notJudged.some((item) => item.what === `cylinder ${index + 1} piston clearance`) ? ['clearanceMin', 'clearanceMax'].filter((l) => (l === 'clearanceMin' ? limits.clearanceMin : limits.clearanceMax) !== undefined) as Array<'clearanceMin' | 'clearanceMax'> : [];
    figures.pass = mine.every((check) => check.verdict === 'conforms') && figures.notChecked.length === 0;
  });
  if (bores) bores.pass = bores.cylinders.every((figures) => figures.pass);

  // 3. Deck: feeler leaves and heights, judged by simple acceptance (the bore gauge's uncertainty is not theirs).
  let deck: InspectionResults['deck'];
  const deckAdd = tagged('deck');
  const deckOrdered = (spec.operations ?? []).some((op) => op.code === 'deck');
  const straightedge = [...(input.deck?.readings ?? []).map((value, i) => ({ position: `reading ${i + 1}`, value })), ...(input.deck?.straightedge ?? [])];
  if (straightedge.length > 0) {
    deck = deckFlatness({
      unit,
      readings: straightedge.map((r) => r.value),
      material,
      // Without the builder's own limit, the stricter multi-layer steel figure from the common-practice table applies.
      gasket: 'mls',
      shopLimit: spec.deckFlatnessMax !== undefined ? convertLength(spec.deckFlatnessMax, spec.unit, unit) : undefined,
    });
    const worst = straightedge.reduce((a, b) => (b.value > a.value ? b : a));
    deckAdd({ what: 'deck out-of-flat', limit: 'deck', value: deck.outOfFlat, allowed: `≤ ${fmt(deck.limit, unit)}`, verdict: judgeMax(deck.outOfFlat, deck.limit, 'simple', 0), note: input.deck?.straightedge ? `the largest straightedge reading, ${worst.position}` : undefined });
  } else if (spec.deckFlatnessMax !== undefined || deckOrdered) {
    notJudged.push({ section: 'deck', what: 'deck out-of-flat', why: 'the record has no straightedge readings' });
  }
  if (spec.deckRaMaxUm !== undefined) {
    if (input.deck?.raUm !== undefined) deckAdd({ what: 'deck Ra', limit: 'deckRa', value: input.deck.raUm, allowed: `≤ ${spec.deckRaMaxUm} µm`, verdict: judgeMax(input.deck.raUm, spec.deckRaMaxUm, 'simple', 0) });
    else notJudged.push({ section: 'deck', what: 'deck Ra', why: 'the record gives no deck finish' });
  }
  const deckFigures: SectionFigure[] = deckOrdered ? judgeDeckHeights(input.deck?.heights, spec, unit, { add: deckAdd, notJudged: (item) => notJudged.push(item) }) : [];
  if (deck) deckFigures.unshift({ label: 'Out-of-flat', value: deck.outOfFlat, unit });
  if (input.deck?.raUm !== undefined) deckFigures.push({ label: 'Deck Ra', value: input.deck.raUm, unit: 'µm' });

  let finish: InspectionResults['finish'];
  if (input.finish?.mode === 'values') {
    const f = input.finish;
    finish = { raUm: f.raUm, rkUm: f.rkUm, rpkUm: f.rpkUm, rvkUm: f.rvkUm, mr1: f.mr1, mr2: f.mr2 };
  } else if (input.finish?.mode === 'profile') {
    // The filter the shop chose (none when the record does not say); the results carry what was applied.
    const r = roughness(input.finish.heightsUm, input.finish.spacingUm, input.finish.filter);
    finish = { raUm: r.ra, rqUm: r.rq, rzUm: r.rz, rkUm: r.rk, rpkUm: r.rpk, rvkUm: r.rvk, mr1: r.mr1, mr2: r.mr2, filter: r.filter };
  }
  const finishLimits: Array<[string, number | undefined, number | undefined]> = [
    ['bore Ra', finish?.raUm, spec.finishRaMaxUm],
    ['bore Rk', finish?.rkUm, spec.finishRkMaxUm],
    ['bore Rpk', finish?.rpkUm, spec.finishRpkMaxUm],
    ['bore Rvk', finish?.rvkUm, spec.finishRvkMaxUm],
  ];
  for (const [what, value, max] of finishLimits) {
    if (max === undefined) continue;
    if (value === undefined) notJudged.push({ section: 'finish', what, why: finish ? `the record’s bore finish gives no ${what.slice(5)}` : 'the record has no bore finish' });
    else add({ section: 'finish', what, limit: 'finish', value, allowed: `≤ ${max} µm`, verdict: judgeMax(value, max, 'simple', 0) });
  }

  let crosshatch: InspectionResults['crosshatch'];
  if (input.crosshatch?.mode === 'measured') {
    crosshatch = { includedAngleDeg: input.crosshatch.includedAngleDeg };
  } else if (input.crosshatch?.mode === 'settings' && bores) {
    const bore = bores.cylinders.reduce((sum, c) => sum + c.mean, 0) / bores.cylinders.length;
    crosshatch = { includedAngleDeg: crosshatchAngle({ bore, spindleRpm: input.crosshatch.spindleRpm, strokeLength: input.crosshatch.strokeLength, cyclesPerMinute: input.crosshatch.cyclesPerMinute }).includedAngleDeg };
  }
  if (spec.crosshatchMinDeg !== undefined || spec.crosshatchMaxDeg !== undefined) {
    if (!crosshatch) notJudged.push({ section: 'crosshatch', what: 'crosshatch included angle', why: 'the record has no crosshatch angle' });
    else {
      const min = spec.crosshatchMinDeg ?? 0;
      const max = spec.crosshatchMaxDeg ?? 180;
      add({ section: 'crosshatch', what: 'crosshatch included angle', limit: 'crosshatch', value: crosshatch.includedAngleDeg, allowed: `${min}° – ${max}°`, verdict: judgeRange(crosshatch.includedAngleDeg, min, max, 'simple', 0) });
    }
  }

  // 4. The other kinds of work, each from its own section of the record.
  const sectionSpec = { unit: spec.unit, blockMaterial: spec.blockMaterial, limits: spec.limits, operations: spec.operations ?? [] };
  const figures = judgeOwnSections(input.sections, { unit, rule, uncertainty, celsius, spec: sectionSpec, add, notJudged: (item) => notJudged.push(item) });
  figures.set('deck', deckFigures);
  const stones = input.sections?.hone?.stones;
  for (const code of ['hone', 'plateau-hone', 'torque-plate-hone'] as const) figures.set(code, [{ label: 'Hone stones', value: stones ?? 'not given' }]);
  const sections = sectionResults(sectionSpec, checks, notJudged, figures);

  // The rule, in words the record and the certificate print.
  const words = DECISION_RULE_WORDS[rule];
  const uncertaintyWords =
    uncertaintySource === 'entered'
      ? `expanded uncertainty U = ${fmtFine(uncertainty, unit)}, as the shop stated it`
      : `U = ${fmtFine(uncertainty, unit)}, the gauge resolution: a lower bound on the uncertainty, not the whole of it`;
  statements.unshift(
    `Decision rule: ${words.name}. ${words.words} Bore and other diameter readings: ${uncertaintyWords}. ${rule === 'guarded' ? 'Feeler, height, finish, angle, mass and unbalance readings carry no stated uncertainty and are judged by simple acceptance.' : ''}`.trim(),
  );

  // Nothing to judge is not a pass: the record says the job gave no limits.
  if (checks.length === 0 && notJudged.length === 0) notJudged.push({ ...NO_LIMITS_GIVEN });
  const verdicts = checks.map((check) => check.verdict as CheckVerdict);
  const verdict: RecordVerdict = verdicts.includes('fails') ? 'fail' : notJudged.length > 0 ? 'not-fully-judged' : verdicts.includes('not-proven') ? 'not-proven' : 'pass';
  return {
    bores,
    deck,
    sections,
    finish,
    crosshatch,
    checks,
    pass: verdict === 'pass',
    verdict,
    notJudged,
    decisionRule: { rule, name: words.name, words: words.words, uncertainty, uncertaintySource, uncertaintyWords },
    temperature: {
      measuredC: celsius,
      enteredUnit: entered,
      referenceC: REFERENCE_TEMPERATURE_C,
      block: { material, alpha: block.alpha, words: block.words },
      piston: { material: PISTON_MATERIAL, alpha: pistonCoefficient.alpha, words: pistonCoefficient.words },
      source: EXPANSION_SOURCE,
    },
    corrected,
    statements,
  };
}

/**
 * Deck height at the four corners (crank centreline to deck): the difference
 * front to rear on each side and side to side (bank to bank on a V) at each
 * end, and each corner against the job's target height when it gives one.
 */
function judgeDeckHeights(
  heights: NonNullable<InspectionInput['deck']>['heights'],
  spec: JobSpecPart,
  unit: LengthUnit,
  out: { add: (check: Omit<LimitCheck, 'pass'> & { verdict: Verdict }) => void; notJudged: (item: NotJudged) => void },
) {
  const target = limitFor(spec.limits, 'deck', 'heightTarget', spec.unit);
  if (!heights) {
    if (target || spec.limits?.deck?.maxEndToEnd !== undefined || spec.limits?.deck?.maxBankToBank !== undefined) {
      out.notJudged({ section: 'deck', what: 'deck height', why: 'the record gives no deck heights' });
    }
    return [];
  }
  const inUnit = (found: { value: number; isDefault: boolean; source?: string }) => ({ value: convertLength(found.value, spec.unit, unit), note: found.isDefault ? `the default, ${found.source}` : undefined });
  const { frontLeft, frontRight, rearLeft, rearRight } = heights;
  const endToEnd = Math.max(Math.abs(frontLeft - rearLeft), Math.abs(frontRight - rearRight));
  const bankToBank = Math.max(Math.abs(frontLeft - frontRight), Math.abs(rearLeft - rearRight));
  const e2e = inUnit(limitFor(spec.limits, 'deck', 'maxEndToEnd', spec.unit)!);
  const b2b = inUnit(limitFor(spec.limits, 'deck', 'maxBankToBank', spec.unit)!);
  out.add({ what: 'deck height, front to rear', value: endToEnd, allowed: `≤ ${fmt(e2e.value, unit)}`, verdict: judgeMax(endToEnd, e2e.value, 'simple', 0), note: e2e.note });
  out.add({ what: 'deck height, side to side', value: bankToBank, allowed: `≤ ${fmt(b2b.value, unit)}`, verdict: judgeMax(bankToBank, b2b.value, 'simple', 0), note: b2b.note });
  if (target) {
    const height = convertLength(target.value, spec.unit, unit);
    const tolerance = inUnit(limitFor(spec.limits, 'deck', 'heightTolerance', spec.unit)!);
    const corners = [
      { where: 'front left', value: frontLeft },
      { where: 'front right', value: frontRight },
      { where: 'rear left', value: rearLeft },
      { where: 'rear right', value: rearRight },
    ];
    const worst = corners.reduce((a, b) => (Math.abs(b.value - height) > Math.abs(a.value - height) ? b : a));
    out.add({ what: 'deck height', value: worst.value, allowed: `${fmt(height, unit)} ± ${fmtFine(tolerance.value, unit)}`, verdict: judgeRange(worst.value, height - tolerance.value, height + tolerance.value, 'simple', 0), note: [`each corner judged; the farthest from the target is ${worst.where}`, tolerance.note].filter(Boolean).join('; ') });
  }
  return [
    { label: 'Deck height, front left / front right', value: `${fmt(frontLeft, unit)} / ${fmt(frontRight, unit)}` },
    { label: 'Deck height, rear left / rear right', value: `${fmt(rearLeft, unit)} / ${fmt(rearRight, unit)}` },
    { label: 'Front-to-rear difference', value: Number(endToEnd.toFixed(6)), unit },
    { label: 'Side-to-side difference', value: Number(bankToBank.toFixed(6)), unit },
  ];
}
