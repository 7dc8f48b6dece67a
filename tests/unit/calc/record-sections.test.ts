/**
 * The inspection record's sections beyond the bores (issue 17), judged by
 * evaluateInspection from raw readings. Sources beside each check:
 * /work/shared/references.md sections "Rotating assembly", "Stack-up and
 * bearings", "Judging a measurement"; common-practice defaults from
 * shared/operation-limits.ts are labelled as such.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateInspection } from '../../../shared/calc/inspection-record';
import { STEEL_ALPHA, journalFigures, lineDeviations } from '../../../shared/calc/record-sections';
import type { InspectionInput } from '../../../shared/schemas/inspection';
import { cleanMethods, cleanMethodsFor, type InspectionSections } from '../../../shared/schemas/inspection-sections';
import type { JobInput } from '../../../shared/schemas/jobs';
import { expectWithin } from './expectations';

type Spec = Parameters<typeof evaluateInspection>[1];
const spec = (operations: string[], extra: Partial<JobInput> = {}): Spec => ({ unit: 'in', blockMaterial: 'cast-iron', operations: operations.map((code) => ({ code, quantity: 1 })) as JobInput['operations'], ...extra }) as Spec;
const record = (sections: InspectionSections, extra: Partial<InspectionInput> = {}): InspectionInput => ({
  conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 20 },
  sections,
  signedOffBy: 'A. Tester',
  notes: '',
  ...extra,
});
const journal = (size: number) => ({ front: { vertical: size, horizontal: size }, rear: { vertical: size, horizontal: size } });

describe('line hone', () => {
  it('alignment is each centre against the straight line through the end bores', () => {
    // derived: the line through (0, 0) and (4, 0.0004) rises 0.0001 per bore; bore 3 at 0.0005 sits 0.0003 above it.
    const deviations = lineDeviations([0, 0.0001, 0.0005, 0.0003, 0.0004]);
    [0, 0, 0.0003, 0, 0].forEach((expected, i) => expectWithin(deviations[i], expected, 1e-12));
  });

  it('property: a tilted line of centres is perfectly aligned, and the end bores always lie on the line', () => {
    fc.assert(
      fc.property(fc.double({ min: -0.01, max: 0.01, noNaN: true }), fc.double({ min: -0.001, max: 0.001, noNaN: true }), fc.integer({ min: 2, max: 10 }), (start, slope, count) => {
        const straight = Array.from({ length: count }, (_, i) => start + slope * i);
        expect(Math.max(...lineDeviations(straight).map(Math.abs))).toBeLessThan(1e-12);
        const bent = straight.map((c, i) => c + (i % 2 ? 0.0002 : -0.0001));
        const d = lineDeviations(bent);
        expect(Math.abs(d[0])).toBeLessThan(1e-12);
        expect(Math.abs(d[count - 1])).toBeLessThan(1e-12);
      }),
    );
  });

  it('judges size, out-of-round and taper per bore, with the default limits named as common practice', () => {
    const bore = (v: number, s: number, centre = 0) => ({ vertical: { front: v, rear: v }, second: { front: s, rear: s }, centre });
    const result = evaluateInspection(
      record({ lineHone: { secondDirection: 'horizontal', bores: [bore(2.641, 2.641), bore(2.6418, 2.641), bore(2.641, 2.641)] } }),
      spec(['line-hone'], { limits: { lineHone: { housingMin: 2.6406, housingMax: 2.6415 } } }),
    );
    const failing = result.checks.filter((c) => c.verdict === 'fails').map((c) => c.what);
    // derived: 2.6418 in is over the 2.6415 in maximum; vertical against horizontal differs by 0.0008 in, over the 0.0005 in default (common practice).
    expect(failing).toEqual(['main bore 2 size', 'main bore 2 out-of-round']);
    expect(result.checks.find((c) => c.what === 'main bore 1 taper')!.note).toMatch(/common practice/);
    expect(result.sections).toMatchObject([{ operation: 'line-hone', verdict: 'fails' }]);
  });
});

describe('crank grind', () => {
  it('taper is front against rear in one direction, out-of-round vertical against horizontal at one position', () => {
    // derived from the definitions in the section's comment.
    const f = journalFigures({ front: { vertical: 2.1, horizontal: 2.0997 }, rear: { vertical: 2.0998, horizontal: 2.0997 } });
    expectWithin(f.taper, 0.0002, 1e-12);
    expectWithin(f.outOfRound, 0.0003, 1e-12);
  });

  it('the size range is the standard less the undersize, less the tolerance; a journal read warm is corrected with steel’s coefficient', () => {
    const crank = (size: number): InspectionSections => ({ crankGrind: { undersize: 0.01, mains: [journal(size)], rods: [journal(2.0893)], raUm: 0.15 } });
    const limits = { crankGrind: { mainStandard: 2.4495, rodStandard: 2.0995 } };
    // derived: 2.4495 − 0.010 = 2.4395 in; with the 0.0005 in default tolerance (common practice, from memory): 2.4390–2.4395 in.
    expect(evaluateInspection(record(crank(2.4392)), spec(['crank-grind'], { limits })).checks.find((c) => c.what === 'main journal 1 size')!.verdict).toBe('conforms');
    expect(evaluateInspection(record(crank(2.4397)), spec(['crank-grind'], { limits })).checks.find((c) => c.what === 'main journal 1 size')!.verdict).toBe('fails');
    // ISO 1 correction, steel α = 11.75e-6/K (Engineering ToolBox, middle of 11.5–12e-6/K): 2.4392 at 20 °C reads 2.4392·(1 + α·15) at 35 °C.
    const warm = 2.4392 * (1 + STEEL_ALPHA * 15);
    const result = evaluateInspection(record(crank(warm), { conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 35 } }), spec(['crank-grind'], { limits }));
    expectWithin(result.checks.find((c) => c.what === 'main journal 1 size')!.value, 2.4392, 1e-9);
  });

  it('without the standard diameters the size is not judged and the record cannot pass', () => {
    const result = evaluateInspection(record({ crankGrind: { undersize: 0, mains: [journal(2.45)], rods: [journal(2.1)], raUm: 0.1 } }), spec(['crank-grind']));
    expect(result.notJudged!.map((n) => n.what)).toEqual(['main journal size', 'rod journal size']);
    expect(result.verdict).toBe('not-fully-judged');
  });
});

describe('balance', () => {
  const balance = (residual: number[], bob = 1830): InspectionSections => ({
    balance: { rotatingGrams: 1240, reciprocatingGrams: 1180, bobWeightGrams: bob, rotorMassKg: 20, grade: 2.5, serviceRpm: 7000, residual: residual.map((gmm, i) => ({ plane: i ? 'rear' : 'front', gmm })) },
  });
  const job = spec(['balance'], { limits: { balance: { grade: 2.5, serviceRpm: 7000 } } });

  it('residual per plane is judged against half the ISO 21940-11 permissible unbalance', () => {
    // ISO 21940-11 worked check (references.md, derived): G 2.5, 20 kg, 7000 rev/min → U = 68.2 g·mm, 34.1 g·mm per plane.
    expect(evaluateInspection(record(balance([34, 34])), job).verdict).toBe('pass');
    const over = evaluateInspection(record(balance([34, 34.2])), job);
    expect(over.checks.filter((c) => c.verdict === 'fails').map((c) => c.what)).toEqual(['residual unbalance, rear plane']);
  });

  it('the bob weight fitted must match the weighed parts within a gram (common practice, from memory)', () => {
    // references.md (common practice, 90° V8): 1240 + 0.5 × 1180 = 1830 g.
    expect(evaluateInspection(record(balance([10, 10], 1830.8)), job).verdict).toBe('pass');
    const wrong = evaluateInspection(record(balance([10, 10], 1815)), job);
    expect(wrong.checks.find((c) => c.what === 'bob weight fitted')).toMatchObject({ verdict: 'fails', allowed: '1830.0 g ± 1 g' });
  });

  it('without a job grade the common-practice G 6.3 applies and says so', () => {
    // ISO 21940-11: 9549 × 6.3 / 7000 × 20 / 2 = 85.9 g·mm per plane (derived).
    const result = evaluateInspection(record(balance([80, 80])), spec(['balance'], { limits: { balance: { serviceRpm: 7000 } } }));
    expect(result.verdict).toBe('pass');
    expect(result.checks.find((c) => c.what === 'residual unbalance, front plane')).toMatchObject({ allowed: '≤ 85.9 g·mm', note: expect.stringMatching(/G 6\.3.*common practice/) });
  });
});

describe('valve job and spring pressure', () => {
  it('a spring limit set in lbf on an inch job is judged in N on a millimetre record (1 lbf = 4.4482216152605 N, exact)', () => {
    // NIST SP 811: 1 lbf = 4.448 222 N (the pound-force defined from the pound and standard gravity); the constant is tested in tests/unit/operation-limits.test.ts.
    const valves = [{ label: '1 intake', kind: 'intake' as const, seatWidth: 1.5, installedHeight: 45.7, stemToGuide: 0.05, springPressure: 440 }];
    const job = spec(['valve-job'], { limits: { valveJob: { springPressureMin: 100, installedHeight: 1.8 } } });
    const mm = evaluateInspection(record({ valveJob: { valves } }, { conditions: { unit: 'mm', gaugeResolution: 0.001, temperatureC: 20 } }), job);
    // derived: 100 lbf = 444.8 N; 440 N is under it.
    expect(mm.checks.find((c) => c.what === 'spring pressure at installed height')).toMatchObject({ verdict: 'fails', allowed: '≥ 444.8 N' });
  });
});

describe('deck heights', () => {
  it('front-to-rear and side-to-side differences from the four corners, each against its limit', () => {
    const heights = { frontLeft: 9.0, frontRight: 9.001, rearLeft: 9.003, rearRight: 9.001 };
    const result = evaluateInspection(record({}, { deck: { straightedge: [{ position: 'left edge', value: 0.001 }], heights } }), spec(['deck']));
    // derived: |9.000 − 9.003| = 0.003 in front to rear on the left, over the 0.002 in default (common practice, from memory);
    // side to side |9.003 − 9.001| = 0.002 in at the rear, at the limit.
    expect(result.checks.filter((c) => c.section === 'deck').map((c) => [c.what, c.verdict])).toEqual([
      ['deck out-of-flat', 'conforms'],
      ['deck height, front to rear', 'fails'],
      ['deck height, side to side', 'conforms'],
    ]);
    expect(result.checks.find((c) => c.what === 'deck out-of-flat')!.note).toMatch(/left edge/);
  });

  it('a deck job without deck readings is not judged', () => {
    const result = evaluateInspection(record({}), spec(['deck']));
    expect(result.notJudged).toEqual([{ section: 'deck', what: 'deck out-of-flat', why: 'the record has no straightedge readings' }]);
    expect(result.sections).toMatchObject([{ operation: 'deck', verdict: 'not-judged' }]);
  });
});

describe('clean', () => {
  // Common practice: caustic hot-tank solutions attack aluminium, so an aluminium block or head is cleaned in a thermal oven or a spray wash.
  it('offers the caustic hot tank for iron and for parts without a stated metal, never for aluminium', () => {
    expect(cleanMethodsFor('cast-iron')).toEqual(cleanMethods);
    expect(cleanMethodsFor(null)).toEqual(cleanMethods);
    expect(cleanMethodsFor('aluminium')).toEqual(['thermal-oven', 'spray-wash', 'other']);
  });

  it('a record that says hot tank on an aluminium job fails, with the reason; the same on iron conforms', () => {
    const clean = { method: 'hot-tank', result: 'clean', findings: '' } as const;
    const aluminium = evaluateInspection(record({ clean }), spec(['clean'], { blockMaterial: 'aluminium' }));
    expect(aluminium.checks.find((c) => c.what === 'cleaning method suits the metal')).toMatchObject({ verdict: 'fails', pass: false, note: expect.stringMatching(/caustic hot tank attacks aluminium/) });
    expect(aluminium.sections).toMatchObject([{ operation: 'clean', verdict: 'fails' }]);
    const iron = evaluateInspection(record({ clean }), spec(['clean']));
    expect(iron.checks.map((c) => c.what)).toEqual(['part cleaned']);
    expect(iron.sections).toMatchObject([{ operation: 'clean', verdict: 'conforms' }]);
    const oven = evaluateInspection(record({ clean: { ...clean, method: 'thermal-oven' } }), spec(['clean'], { blockMaterial: 'aluminium' }));
    expect(oven.sections).toMatchObject([{ operation: 'clean', verdict: 'conforms' }]);
  });
});

describe('a record that leaves out ordered work', () => {
  it('property: whatever work is ordered, a record with no readings for it is never a pass, and every ordered operation has a section result', () => {
    const codes = ['clean', 'crack-test', 'deck', 'line-hone', 'cam-bore', 'head-resurface', 'valve-job', 'crank-grind', 'balance'];
    fc.assert(
      fc.property(fc.subarray(codes, { minLength: 1 }), (ordered) => {
        const result = evaluateInspection(record({}), spec(ordered));
        expect(result.verdict).not.toBe('pass');
        expect(result.pass).toBe(false);
        expect(result.sections!.map((s) => s.operation).sort()).toEqual([...ordered].sort());
        expect(result.sections!.every((s) => s.verdict === 'not-judged')).toBe(true);
      }),
    );
  });
});
