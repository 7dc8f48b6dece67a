import { describe, expect, it } from 'vitest';
import { boreSpecFor, evaluateInspection, sizeDisagreement } from '../../shared/calc/inspection-record';
import { NO_LIMITS_GIVEN, checksNotConforming, recordConforms } from '../../shared/calc/conformance';
import { responseMismatch } from '../../server/lib/http/routes';
import { inspectionResultsSchema, type InspectionInput } from '../../shared/schemas/inspection';
import { jobInput } from '../factories';

const pair = (thrust: number, axial: number) => ({ thrust, axial });

describe('evaluateInspection', () => {
  it('when the job gives a piston and a clearance range but no target, then the target is the piston plus the middle of the range', () => {
    // derived: 4.028 + (0.0025 + 0.0035) / 2 = 4.031
    expect(boreSpecFor(jobInput({ targetBore: undefined, pistonDiameter: 4.028, clearanceMin: 0.0025, clearanceMax: 0.0035 }), 'in').targetBore).toBeCloseTo(4.031, 12);
  });

  it('when the record is in millimetres and the spec in inches, then limits are converted exactly before judging', () => {
    const spec = jobInput({ maxTaper: 0.0005, maxOutOfRound: 0.0005, pistonDiameter: 4.028, clearanceMin: 0.0025, clearanceMax: 0.0035, crosshatchMinDeg: undefined, crosshatchMaxDeg: undefined });
    // derived: 1 in = 25.4 mm; 0.0005 in = 0.0127 mm
    expect(boreSpecFor(spec, 'mm').maxTaper).toBeCloseTo(0.0127, 12);
    const mm = (inches: number) => inches * 25.4;
    const cylinder = { top: pair(mm(4.0311), mm(4.0311)), middle: pair(mm(4.031), mm(4.0311)), bottom: pair(mm(4.031), mm(4.031)), piston: mm(4.028) };
    const input: InspectionInput = {
      conditions: { unit: 'mm', gaugeResolution: 0.002, temperatureC: 20, torquePlate: false },
      cylinders: Array.from({ length: 8 }, () => cylinder),
      signedOffBy: 'Test Shop',
      notes: '',
    };
    const result = evaluateInspection(input, spec);
    expect(result.pass).toBe(true);
    // derived: taper 0.0001 in = 0.00254 mm
    expect(result.bores!.worst.taper).toBeCloseTo(0.00254, 9);

    const tapered = { ...cylinder, bottom: pair(mm(4.0302), mm(4.031)) };
    const failing = evaluateInspection({ ...input, cylinders: [tapered, ...input.cylinders!.slice(1)] }, spec);
    expect(failing.pass).toBe(false);
    // derived: bottom thrust 0.0008 in under the top → taper 0.0009 in and out-of-round 0.0008 in, both over 0.0005 in (0.0127 mm)
    // derived: 4.0302 in is 0.0008 in under the 4.031 in target, outside ± 0.0005 in (common practice default), so size fails too
    // derived: 0.0025 in = 0.0635 mm exactly; the cylinder's failure keeps the unrounded limit
    expect(failing.bores!.cylinders[0].failures.find((f) => f.limit === 'clearanceMin')!.allowed).toBeCloseTo(0.0635, 12);
    expect(failing.checks.filter((c) => !c.pass).map((c) => [c.what, c.verdict, c.allowed])).toEqual([
      ['cylinder 1 size', 'fails', '102.387 mm ± 0.0127 mm'],
      // derived: bottom thrust 4.0302 − piston 4.028 = 0.0022 in, under 0.0025 in (0.0635 mm)
      ['cylinder 1 smallest piston clearance', 'fails', '≥ 0.064 mm'],
      ['cylinder 1 taper', 'fails', '≤ 0.013 mm'],
      ['cylinder 1 out-of-round', 'fails', '≤ 0.013 mm'],
    ]);
  });

  it('when deck, finish and crosshatch are given, then each is judged against the job’s limits', () => {
    const spec = jobInput({ deckFlatnessMax: 0.002, finishRaMaxUm: 0.5, crosshatchMinDeg: 40, crosshatchMaxDeg: 50 });
    const cylinder = { top: pair(4.031, 4.031), middle: pair(4.031, 4.031), bottom: pair(4.031, 4.031) };
    const result = evaluateInspection(
      {
        conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 20, torquePlate: true },
        cylinders: Array.from({ length: 8 }, () => cylinder),
        deck: { readings: [0.001, 0.003] },
        finish: { mode: 'values', raUm: 0.45 },
        // derived: 2·atan(2·L·f / (π·D·n)) with D = 4.031, n = 200, L = 4, f = 130 → about 45.8°
        crosshatch: { mode: 'settings', spindleRpm: 200, strokeLength: 4, cyclesPerMinute: 130 },
        signedOffBy: 'Test Shop',
        notes: '',
      },
      spec,
    );
    const byWhat = Object.fromEntries(result.checks.filter((c) => c.cylinder === undefined).map((c) => [c.what, c.pass]));
    expect(byWhat).toEqual({ 'deck out-of-flat': false, 'bore Ra': true, 'crosshatch included angle': true });
    expect(result.crosshatch!.includedAngleDeg).toBeCloseTo((2 * Math.atan((2 * 4 * 130) / (Math.PI * 4.031 * 200)) * 180) / Math.PI, 9);
    expect(result.pass).toBe(false);
  });
});

describe('evaluateInspection: every limit judged or visibly not judged (issue 15)', () => {
  const at20 = { unit: 'in' as const, gaugeResolution: 0.0001, temperatureC: 20, torquePlate: true };
  const round = (size: number, piston?: number) => ({ top: pair(size, size), middle: pair(size, size), bottom: pair(size, size), ...(piston === undefined ? {} : { piston }) });
  const record = (cylinders: InspectionInput['cylinders'], conditions: InspectionInput['conditions'] = at20): InspectionInput => ({ conditions, cylinders, signedOffBy: 'Test Shop', notes: '' });
  // The job of the issue: 4.028 in pistons, 0.0025–0.0035 in clearance, no target bore, no size tolerance, nothing else asked.
  const issueJob = jobInput({ targetBore: undefined, pistonDiameter: 4.028, clearanceMin: 0.0025, clearanceMax: 0.0035, crosshatchMinDeg: undefined, crosshatchMaxDeg: undefined });

  it('when the bores are 0.0093 in over the piston size, round and straight, with no piston sizes, then size and clearance fail (judged with the job’s piston)', () => {
    // derived: target = 4.028 + (0.0025 + 0.0035)/2 = 4.031 in; default tolerance ± 0.0005 in (common practice (no published source)).
    // derived: each reading 4.0373 is 0.0063 in over 4.031, outside ± 0.0005; clearance 4.0373 − 4.028 = 0.0093 > 0.0035.
    const result = evaluateInspection(record(Array.from({ length: 8 }, () => round(4.0373))), issueJob);
    expect(result.verdict).toBe('fail');
    expect(result.pass).toBe(false);
    const c1 = result.checks.filter((c) => c.cylinder === 1);
    expect(c1.find((c) => c.limit === 'size')).toMatchObject({ verdict: 'fails', pass: false });
    expect(c1.find((c) => c.limit === 'size')!.note).toMatch(/common practice/);
    expect(c1.find((c) => c.limit === 'clearanceMax')).toMatchObject({ verdict: 'fails' });
    expect(c1.find((c) => c.limit === 'clearanceMax')!.value).toBeCloseTo(0.0093, 9);
    expect(result.corrected![0]).toMatchObject({ piston: 4.028, pistonSource: 'job' });
    expect(result.statements!.join(' ')).toMatch(/job’s piston diameter/);
  });

  it('when bottom thrust is 4.0303 in against a 4.0280 in piston, then clearance fails at 0.0023 in though the mean of six gives 0.0027 in', () => {
    // common practice (no published source): the piston skirt bears on the thrust faces, so clearance is judged on the thrust axis at every depth.
    // derived: mean of the six readings = (4 × 4.0308 + 4.0303 + 4.0307) / 6 = 4.0307 → 0.0027 in, inside 0.0025–0.0035;
    // smallest thrust − piston = 4.0303 − 4.0280 = 0.0023 in < 0.0025 in.
    const cylinder = { top: pair(4.0308, 4.0308), middle: pair(4.0308, 4.0308), bottom: pair(4.0303, 4.0307), piston: 4.028 };
    const job = { ...issueJob, boreSizeTolerance: 0.001 };
    const result = evaluateInspection(record([cylinder, ...Array.from({ length: 7 }, () => round(4.031, 4.028))]), job);
    expect(result.bores!.cylinders[0].mean - 4.028).toBeCloseTo(0.0027, 9);
    const failing = result.checks.filter((c) => c.verdict === 'fails');
    expect(failing.map((c) => [c.cylinder, c.limit])).toEqual([[1, 'clearanceMin']]);
    expect(failing[0].value).toBeCloseTo(0.0023, 9);
    expect(failing[0].note).toMatch(/bottom thrust/);
    // derived: largest thrust − piston = 4.0308 − 4.0280 = 0.0028 ≤ 0.0035
    expect(result.checks.find((c) => c.cylinder === 1 && c.limit === 'clearanceMax')).toMatchObject({ verdict: 'conforms' });
    expect(result.verdict).toBe('fail');
  });

  it('when the job asks for guarded acceptance, then a taper of 0.00045 in against 0.0005 in with 0.0001 in uncertainty is not proven, 0.00035 conforms and 0.00065 fails', () => {
    // source: ISO 14253-1 decision rules (references.md): conformance zone limit − U, non-conformance beyond limit + U.
    const job = { ...issueJob, decisionRule: 'guarded' as const, maxTaper: 0.0005, maxOutOfRound: 0.001, boreSizeTolerance: 0.002 };
    const tapered = (taper: number) => ({ top: pair(4.031, 4.031), middle: pair(4.031, 4.031), bottom: pair(4.031 - taper, 4.031), piston: 4.028 });
    const judge = (taper: number) => {
      const result = evaluateInspection(record([tapered(taper), ...Array.from({ length: 7 }, () => round(4.031, 4.028))], { ...at20, uncertainty: 0.0001 }), job);
      return { taper: result.checks.find((c) => c.cylinder === 1 && c.limit === 'maxTaper')!.verdict, record: result.verdict, rule: result.decisionRule };
    };
    expect(judge(0.00045)).toMatchObject({ taper: 'not-proven', record: 'not-proven' });
    expect(judge(0.00035)).toMatchObject({ taper: 'conforms', record: 'pass' });
    expect(judge(0.00065)).toMatchObject({ taper: 'fails', record: 'fail' });
    expect(judge(0.00045).rule).toMatchObject({ rule: 'guarded', uncertainty: 0.0001, uncertaintySource: 'entered' });
    expect(judge(0.00045).rule!.name).toMatch(/ISO 14253-1/);
  });

  it('when no uncertainty is entered, then the gauge resolution stands in and is called a lower bound; simple acceptance is the default rule', () => {
    // source: references.md "Judging a measurement" — a gauge's resolution is a lower bound on U; ILAC-G8 simple acceptance.
    const result = evaluateInspection(record(Array.from({ length: 8 }, () => round(4.031, 4.028))), issueJob);
    expect(result.decisionRule).toMatchObject({ rule: 'simple', uncertainty: 0.0001, uncertaintySource: 'gauge-resolution' });
    expect(result.decisionRule!.uncertaintyWords).toMatch(/lower bound/);
    expect(result.verdict).toBe('pass');
  });

  it('when the readings were taken at 30 °C on a cast-iron block, then they are corrected to 20 °C with 10.8e-6/K and the clearance is judged at 20 °C', () => {
    // source: ISO 1 (20 °C reference); α grey cast iron 10.8e-6/K and aluminium alloy 22e-6/K, middles of the published ranges
    // 10.5–11 and 21–23 × 10⁻⁶/K (Engineering ToolBox, "Thermal expansion – linear expansion coefficients").
    const aIron = 10.8e-6;
    const aAl = 22e-6;
    const dT = 30 - 20;
    // derived: ΔL = α·L20·ΔT and Lt = L20 + ΔL, so L20 = Lt / (1 + α·ΔT)
    const bore20 = 4.0315 / (1 + aIron * dT);
    const piston20 = 4.0289 / (1 + aAl * dT);
    expect(4.0315 - bore20).toBeCloseTo(aIron * bore20 * dT, 12);
    const job = { ...issueJob, blockMaterial: 'cast-iron' as const };
    const result = evaluateInspection(record(Array.from({ length: 8 }, () => round(4.0315, 4.0289)), { ...at20, temperatureC: 30 }), job);
    expect(result.temperature).toMatchObject({ measuredC: 30, referenceC: 20, block: { material: 'cast-iron', alpha: aIron }, piston: { material: 'aluminium', alpha: aAl } });
    expect(result.corrected![0].top.thrust).toBeCloseTo(bore20, 12);
    expect(result.corrected![0].piston).toBeCloseTo(piston20, 12);
    // derived: clearance at 20 °C = 4.0315/1.000108 − 4.0289/1.00022 ≈ 0.003050 in (warm it reads 0.0026 in)
    const clearance = result.checks.find((c) => c.cylinder === 1 && c.limit === 'clearanceMin')!;
    expect(clearance.value).toBeCloseTo(bore20 - piston20, 12);
    expect(clearance.value).toBeCloseTo(0.00305, 5);
    // The same record with the temperature in °F (86 °F = 30 °C exactly) is corrected the same way.
    const inF = evaluateInspection(record(Array.from({ length: 8 }, () => round(4.0315, 4.0289)), { unit: 'in', gaugeResolution: 0.0001, temperatureF: 86, torquePlate: true }), job);
    expect(inF.temperature).toMatchObject({ enteredUnit: 'F' });
    expect(inF.corrected![0].top.thrust).toBeCloseTo(bore20, 12);
  });

  it('when the job limits the bore Ra and the record has no finish, then the record is not fully judged and says which limit', () => {
    // common practice (no published source): a limit nobody measured is not a pass.
    const job = { ...issueJob, finishRaMaxUm: 0.5 };
    const result = evaluateInspection(record(Array.from({ length: 8 }, () => round(4.031, 4.028))), job);
    expect(result.verdict).toBe('not-fully-judged');
    expect(result.pass).toBe(false);
    expect(result.notJudged).toEqual([{ section: 'finish', what: 'bore Ra', why: expect.stringMatching(/no bore finish/) }]);
  });

  it('when the job gives no limits at all, then a record with no checks is not fully judged (never a pass), says no limits were given, and does not conform', () => {
    // common practice (no published source): a record passes only when something was judged and conformed.
    const noLimits = jobInput({ targetBore: undefined, pistonDiameter: undefined, clearanceMin: undefined, clearanceMax: undefined, maxTaper: undefined, maxOutOfRound: undefined, crosshatchMinDeg: undefined, crosshatchMaxDeg: undefined });
    const result = evaluateInspection(record(Array.from({ length: 8 }, () => round(4.031))), noLimits);
    expect(result.checks).toEqual([]);
    expect(result.verdict).toBe('not-fully-judged');
    expect(result.pass).toBe(false);
    expect(result.notJudged).toEqual([NO_LIMITS_GIVEN]);
    expect(recordConforms(result)).toBe(false);
    expect(checksNotConforming(result)).toEqual([`${NO_LIMITS_GIVEN.what} (not judged)`]);
    // A record stored before this rule (verdict pass, no checks, nothing not judged) does not conform either.
    const stored = { ...result, verdict: 'pass' as const, pass: true, notJudged: [] };
    expect(recordConforms(stored)).toBe(false);
    expect(checksNotConforming(stored)).toEqual([`${NO_LIMITS_GIVEN.what} (not judged)`]);
  });

  it('when a target bore and the piston with its clearance disagree, then the disagreement says the shop works to the target', () => {
    // derived: 4.028 + [0.0025, 0.0035] = 4.0305–4.0315; a 4.030 target lies outside it.
    expect(sizeDisagreement({ ...issueJob, targetBore: 4.03 })).toMatchObject({ worksTo: 'target', target: 4.03 });
    expect(sizeDisagreement({ ...issueJob, targetBore: 4.031 })).toBeUndefined();
  });
});

describe('the inspection results schema', () => {
  const cylinder = { top: pair(4.0311, 4.031), middle: pair(4.031, 4.0311), bottom: pair(4.0309, 4.031), piston: 4.028 };

  it('when a record with every part is judged (°F, guarded rule, deck, a filtered trace, hone settings), then the results are exactly what the schema declares', () => {
    const heightsUm = Array.from({ length: 5000 }, (_, i) => Math.sin(i / 7) * 0.4 + Math.sin(i / 290) * 2);
    const input: InspectionInput = {
      conditions: { unit: 'in', gaugeResolution: 0.0001, uncertainty: 0.0001, temperatureF: 77, torquePlate: true },
      cylinders: [cylinder, { ...cylinder, piston: undefined }],
      deck: { readings: [0.001, 0.0015], raUm: 1.2 },
      finish: { mode: 'profile', heightsUm, spacingUm: 1, filter: { kind: 'gaussian', cutoffMm: 0.8 } },
      crosshatch: { mode: 'settings', spindleRpm: 200, strokeLength: 4, cyclesPerMinute: 130 },
      signedOffBy: 'Test Shop',
      notes: '',
    };
    const spec = jobInput({ cylinders: 2, decisionRule: 'guarded', maxTaper: 0.0005, maxOutOfRound: 0.0005, pistonDiameter: 4.028, clearanceMin: 0.0025, clearanceMax: 0.0035, deckFlatnessMax: 0.002, deckRaMaxUm: 1.6, finishRaMaxUm: 0.8, finishRkMaxUm: 1 });
    const results = evaluateInspection(input, spec);
    expect(results.finish?.filter?.kind).toBe('gaussian');
    expect(results.corrected?.[1].pistonSource).toBe('job');
    expect(responseMismatch(inspectionResultsSchema, results)).toBeNull();
  });

  it('when a record was stored before verdicts and the temperature correction existed, then its results still match the schema, and a field it never had does not', () => {
    const old = { bores: { cylinders: [], worst: { taper: 0, outOfRound: 0, taperCylinder: 0, outOfRoundCylinder: 0 }, pass: true }, checks: [{ what: 'deck out-of-flat', value: 0.001, allowed: '≤ 0.0020 in', pass: true }], pass: true };
    expect(responseMismatch(inspectionResultsSchema, old)).toBeNull();
    expect(responseMismatch(inspectionResultsSchema, { ...old, grade: 'A' })).toMatch(/fields the schema does not declare/);
  });
});
