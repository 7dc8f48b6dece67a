import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { roughness } from '../../shared/calc/roughness';
import { setupTestApp, type TestContext } from '../setup/test-env';
import { circleTrack } from '../unit/calc/expectations';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

// Signed out, no session and no CSRF token: the calculation API is open to scripts.
const calc = (route: string, body: unknown) => supertest(ctx.app).post(`/api/calculations/${route}`).send(body as object);

const near = (actual: number, expected: number, tolerance = 1e-9) => expect(Math.abs(actual - expected)).toBeLessThan(tolerance);

describe('calculation API: answers', () => {
  it('when displacement is asked, then cc, litres and cubic inches come back', async () => {
    const res = await calc('displacement', { unit: 'in', bore: 4, stroke: 3.48, cylinders: 8 });
    expect(res.status).toBe(200);
    near(res.body.cubicInches, (Math.PI / 4) * 16 * 3.48 * 8); // derived: π/4 · bore² · stroke · cylinders
    near(res.body.cc, res.body.cubicInches * 16.387064, 1e-6); // derived: 1 in³ = 16.387064 cc exactly
    near(res.body.litres, res.body.cc / 1000);
  });

  it('when compression ratio is asked for the worked example, then 9.01', async () => {
    const res = await calc('compression-ratio', circleTrack);
    expect(res.status).toBe(200);
    expect(Math.abs(res.body.ratio - 9.01)).toBeLessThan(0.01); // source: Circle Track, "Compression Ratio Rules" (worked example, 9.01)
    near(res.body.ratio, (res.body.sweptCc + res.body.clearanceCc) / res.body.clearanceCc); // derived: CR = (Vs + Vc) / Vc
  });

  it('when the crosshatch angle and its inverse are asked, then they agree', async () => {
    // derived: included angle = 2·atan(va/vt), vt = π·D·n, va = 2·L·f; for 45°, f = π·D·n·tan(22.5°) / (2·L)
    const cycles = (Math.PI * 4 * 200 * Math.tan(Math.PI / 8)) / (2 * 4);
    const rate = await calc('crosshatch-rate', { unit: 'in', bore: 4, spindleRpm: 200, strokeLength: 4, includedAngleDeg: 45 });
    expect(rate.status).toBe(200);
    near(rate.body.cyclesPerMinute, cycles, 1e-9);
    const angle = await calc('crosshatch', { unit: 'in', bore: 4, spindleRpm: 200, strokeLength: 4, cyclesPerMinute: cycles });
    expect(angle.status).toBe(200);
    near(angle.body.includedAngleDeg, 45, 1e-9);
  });

  it('when bore readings are checked against a spec, then taper, out-of-round and clearance come back with one reason per failed limit', async () => {
    const res = await calc('bore-inspection', {
      unit: 'in',
      cylinders: [
        {
          top: { thrust: 4.0312, axial: 4.031 },
          middle: { thrust: 4.0308, axial: 4.0309 },
          bottom: { thrust: 4.0306, axial: 4.0307 },
          piston: 4.028,
        },
        {
          top: { thrust: 4.031, axial: 4.031 },
          middle: { thrust: 4.031, axial: 4.031 },
          bottom: { thrust: 4.031, axial: 4.031 },
          piston: 4.028,
        },
      ],
      spec: { maxTaper: 0.0005, maxOutOfRound: 0.0005, clearanceMin: 0.0025, clearanceMax: 0.0035 },
    });
    expect(res.status).toBe(200);
    const [first, second] = res.body.cylinders;
    near(first.taper, 0.0006, 1e-12); // derived: thrust 4.0312 − 4.0306 (larger than axial 4.0310 − 4.0307)
    near(first.outOfRound, 0.0002, 1e-12); // derived: |4.0312 − 4.0310| at the top
    near(first.mean, (4.0312 + 4.031 + 4.0308 + 4.0309 + 4.0306 + 4.0307) / 6, 1e-12); // derived: mean of six readings
    near(first.clearance, first.mean - 4.028, 1e-12); // derived: mean bore − piston
    expect(first.pass).toBe(false);
    expect(first.failures).toHaveLength(1);
    expect(first.failures[0].limit).toBe('maxTaper');
    near(first.failures[0].value, 0.0006, 1e-12);
    expect(first.failures[0].allowed).toBe(0.0005);
    expect(second.pass).toBe(true);
    near(second.clearance, 0.003, 1e-12); // derived: 4.0310 − 4.0280
    near(res.body.worst.taper, 0.0006, 1e-12);
    expect(res.body.pass).toBe(false);
  });

  it('when a bore size is asked, then the finished size and the size to bore to come back', async () => {
    const res = await calc('bore-size', { unit: 'in', pistonDiameter: 4.028, clearanceMin: 0.0025, clearanceMax: 0.0035, honeAllowance: 0.0025 });
    expect(res.status).toBe(200);
    near(res.body.finishedBore, 4.031, 1e-12); // derived: piston + mean clearance = 4.0280 + 0.0030
    near(res.body.boreTo, 4.0285, 1e-12); // derived: finished − hone allowance
  });

  it('when deck flatness is asked, then the largest reading is judged against the material and gasket limit', async () => {
    const iron = await calc('deck-flatness', { unit: 'in', readings: [0.001, 0.0015, 0.003], material: 'cast-iron', gasket: 'composite' });
    expect(iron.status).toBe(200);
    expect(iron.body).toMatchObject({ outOfFlat: 0.003, limit: 0.004, pass: true }); // common practice (no published source): 0.004 in for cast iron with a composite gasket
    const alloy = await calc('deck-flatness', { unit: 'mm', readings: [0.02, 0.04], material: 'aluminium', gasket: 'mls' });
    expect(alloy.status).toBe(200);
    near(alloy.body.limit, 0.0254, 1e-12); // common practice (no published source): 0.001 in for aluminium with MLS, 1 in = 25.4 mm
    expect(alloy.body.pass).toBe(false);
  });

  it('when a roughness profile is sent, then Ra, Rq, Rz and the Rk family come back; a large profile is accepted', async () => {
    // A triangle wave of amplitude 1 µm over whole periods: Ra = A/2, Rq = A/√3, Rk = 2A (derived).
    const period = 400;
    const heightsUm = Array.from({ length: period * 250 }, (_, i) => {
      const phase = (i % period) / period;
      return phase < 0.5 ? -1 + 4 * phase : 3 - 4 * phase;
    });
    const res = await calc('roughness', { heightsUm, spacingUm: 0.5 });
    expect(res.status).toBe(200);
    near(res.body.ra, 0.5, 1e-3); // derived: triangle wave Ra = A/2
    near(res.body.rq, 1 / Math.sqrt(3), 1e-3); // derived: triangle wave Rq = A/√3
    near(res.body.rk, 2, 2e-3); // derived: triangle wave Rk = 2A
    for (const key of ['rz', 'rpk', 'rvk', 'mr1', 'mr2']) expect(typeof res.body[key]).toBe('number');
  });

  it('when a roughness request names no filter, then none is applied and the answer says so', async () => {
    const heightsUm = Array.from({ length: 1000 }, (_, i) => Math.sin((2 * Math.PI * i) / 100) + 0.001 * i);
    const res = await calc('roughness', { heightsUm, spacingUm: 1 });
    expect(res.status).toBe(200);
    expect(res.body.filter).toMatchObject({ kind: 'none', evaluatedPoints: 1000 });
    near(res.body.filter.evaluationLengthMm, 0.999, 1e-12); // derived: (1000 − 1) × 1 µm
    near(res.body.ra, roughness(heightsUm, 1).ra, 1e-12); // derived: the shared library unfiltered, as before the filter choice
  });

  it('when a roughness request asks for the Gaussian filter, then the tilt is removed and the filter is echoed with its lengths', async () => {
    // A sine of λc/10 on a steep tilt, 0.25 mm cut-off at 1 µm spacing over 2 mm.
    const heightsUm = Array.from({ length: 2000 }, (_, i) => Math.sin((2 * Math.PI * i) / 25) + 30 - 0.02 * i);
    const res = await calc('roughness', { heightsUm, spacingUm: 1, filter: { kind: 'gaussian', cutoffMm: 0.25 } });
    expect(res.status).toBe(200);
    const plainSine = roughness(Array.from({ length: 2000 }, (_, i) => Math.sin((2 * Math.PI * i) / 25)), 1);
    near(res.body.ra, plainSine.ra, 1e-4); // source: ISO 16610-21 transmission 1 − exp(−π(αλc/λ)²) ≈ 1 at λ = λc/10; derived: the least-squares line takes the tilt
    expect(res.body.filter).toMatchObject({ kind: 'gaussian', cutoffMm: 0.25, formRemoval: 'least-squares line', samplingLengths: 7, evaluatedPoints: 1750, rkFilter: 'ISO 13565-1 valley suppression' });
    near(res.body.filter.evaluationLengthMm, 1.75, 1e-12); // derived: 7 whole cut-offs of 0.25 mm after half a cut-off at each end
    expect(res.body.filter.trimmedStartMm).toBeGreaterThanOrEqual(0.125);
    expect(res.body.filter.trimmedEndMm).toBeGreaterThanOrEqual(0.124);
    expect(res.body.filter.method).toContain('ISO 16610-21');
  });

  it('when ring gap guidance is asked, then top and second ring gaps come back in the request unit', async () => {
    const res = await calc('ring-gap', { unit: 'mm', bore: 101.6, application: 'street' });
    expect(res.status).toBe(200);
    near(res.body.topRing, 0.4064, 1e-12); // common practice (no published source): 0.004 per unit of bore for a street top ring
    expect(res.body.secondRing).toBeGreaterThan(res.body.topRing);
  });

  it('when dynamic compression is asked with the intake closing at bottom dead centre, then it equals the static ratio; later closing lowers it', async () => {
    const atBdc = await calc('dynamic-compression', { ...circleTrack, rodLength: 5.7, intakeClosingDegAbdc: 0 });
    expect(atBdc.status).toBe(200);
    expect(atBdc.body.unit).toBe('in');
    expect(Math.abs(atBdc.body.staticRatio - 9.01)).toBeLessThan(0.01); // source: Circle Track, "Compression Ratio Rules" (worked example, 9.01)
    near(atBdc.body.dynamicRatio, atBdc.body.staticRatio, 1e-12); // derived: Heywood §2.2, x(180°) = stroke
    near(atBdc.body.effectiveStroke, 3.48, 1e-12);
    const late = await calc('dynamic-compression', { ...circleTrack, rodLength: 5.7, intakeClosingDegAbdc: 60 });
    expect(late.status).toBe(200);
    const r = 1.74;
    const theta = (240 * Math.PI) / 180;
    near(late.body.effectiveStroke, r * (1 - Math.cos(theta)) + 5.7 - Math.sqrt(5.7 ** 2 - r ** 2 * Math.sin(theta) ** 2), 1e-12); // derived: Heywood §2.2 slider-crank
    expect(late.body.dynamicRatio).toBeLessThan(late.body.staticRatio);
  });

  it('when a balance tolerance is asked for G 2.5, 20 kg at 7000 rev/min, then about 68.2 g·mm, half in each plane', async () => {
    const res = await calc('balance-tolerance', { rotorMassKg: 20, serviceRpm: 7000, grade: 2.5 });
    expect(res.status).toBe(200);
    near(res.body.specificUnbalanceGmmPerKg, 3.41, 0.0005); // derived: ISO 21940-11 e_per = 9549 · G / n
    near(res.body.permissibleUnbalanceGmm, 68.2, 0.05); // derived: ISO 21940-11 U_per = e_per · m
    near(res.body.perPlaneGmm, res.body.permissibleUnbalanceGmm / 2, 1e-12);
  });

  it('when a bob weight is asked without a factor, then the 90° V8 share of 0.5 is used and named', async () => {
    const res = await calc('bob-weight', { rotatingGrams: 1100, reciprocatingGrams: 1400 });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ bobWeightGrams: 1800, reciprocatingFactor: 0.5 }); // common practice: 100 % rotating + 50 % reciprocating for a 90° V8
    const withOil = await calc('bob-weight', { rotatingGrams: 1100, reciprocatingGrams: 1400, reciprocatingFactor: 0.52, oilGrams: 4 });
    near(withOil.body.bobWeightGrams, 1832, 1e-9); // derived: 1100 + 0.52 · 1400 + 4
  });

  it('when deck clearance is asked, then quench comes back only with a gasket', async () => {
    const stack = { unit: 'in', deckHeight: 9.025, stroke: 3.48, rodLength: 5.7, compressionHeight: 1.56 };
    const withGasket = await calc('deck-clearance', { ...stack, gasketThickness: 0.015 });
    expect(withGasket.status).toBe(200);
    near(withGasket.body.pistonDeckClearance, 0.025, 1e-12); // derived: 9.025 − (1.74 + 5.7 + 1.56)
    near(withGasket.body.quench, 0.04, 1e-12); // derived: deck clearance + compressed gasket
    const bare = await calc('deck-clearance', stack);
    expect(bare.status).toBe(200);
    expect(bare.body).not.toHaveProperty('quench');
  });

  it('when bearing clearance is asked in millimetres, then the clearance is in millimetres and the ratio is unit-free', async () => {
    const res = await calc('bearing-clearance', { unit: 'mm', housingBore: 68.3, journalDiameter: 63.5, shellWall: 2.375 });
    expect(res.status).toBe(200);
    expect(res.body.unit).toBe('mm');
    near(res.body.clearance, 0.05, 1e-9); // derived: 68.3 − 63.5 − 2 × 2.375
    near(res.body.clearancePerInchOfJournal, 0.05 / 63.5, 1e-12); // derived: clearance ÷ journal
  });
});

describe('calculation API: bad input', () => {
  const cases: Array<[string, unknown, string[]]> = [
    ['displacement', { unit: 'in', bore: -4, stroke: 0, cylinders: 2.5 }, ['bore', 'cylinders', 'stroke']],
    ['displacement', { unit: 'furlong', bore: 4, stroke: 3, cylinders: 4 }, ['unit']],
    ['compression-ratio', { unit: 'in', bore: 4, stroke: 3.48, chamberCc: 10, pistonCc: -40, deckClearance: 0, gasketBore: 4, gasketThickness: 0 }, ['pistonCc']],
    ['crosshatch', { unit: 'in', bore: 4, spindleRpm: 0, strokeLength: 4, cyclesPerMinute: 30 }, ['spindleRpm']],
    ['crosshatch-rate', { unit: 'in', bore: 4, spindleRpm: 200, strokeLength: 4, includedAngleDeg: 180 }, ['includedAngleDeg']],
    ['bore-inspection', { unit: 'in', cylinders: [] }, ['cylinders']],
    ['bore-inspection', { unit: 'in', cylinders: [{ top: { thrust: 4, axial: -1 }, middle: { thrust: 4, axial: 4 } }] }, ['cylinders.0.bottom', 'cylinders.0.top.axial']],
    ['bore-size', { unit: 'in', pistonDiameter: 4, clearanceMin: 0.004, clearanceMax: 0.002, honeAllowance: 0.002 }, ['clearanceMax']],
    ['deck-flatness', { unit: 'in', readings: [], material: 'granite', gasket: 'mls' }, ['material', 'readings']],
    ['roughness', { heightsUm: [], spacingUm: 1 }, ['heightsUm']],
    ['roughness', { heightsUm: [1, 2, 3, 4, 5, 6, 7, 8, 9, 'ten'], spacingUm: 0 }, ['heightsUm.9', 'spacingUm']],
    ['ring-gap', { unit: 'in', bore: 4, application: 'lawnmower' }, ['application']],
    ['dynamic-compression', { ...circleTrack, rodLength: 1.5, intakeClosingDegAbdc: -5 }, ['intakeClosingDegAbdc', 'rodLength']],
    ['balance-tolerance', { rotorMassKg: 0, serviceRpm: 7000, grade: 3 }, ['grade', 'rotorMassKg']],
    ['bob-weight', { rotatingGrams: -1, reciprocatingGrams: 1400, reciprocatingFactor: 2 }, ['reciprocatingFactor', 'rotatingGrams']],
    ['deck-clearance', { unit: 'in', deckHeight: 9, stroke: 0, rodLength: 5.7, compressionHeight: 1.5, gasketThickness: -0.01 }, ['gasketThickness', 'stroke']],
    ['bearing-clearance', { unit: 'in', housingBore: 2.5, journalDiameter: 2.6, shellWall: 0.09 }, ['journalDiameter']],
  ];

  it.each(cases)('when %s gets impossible input %j, then 400 names each field', async (route, body, fields) => {
    const res = await calc(route, body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(fields);
    for (const message of Object.values(res.body.error.fields)) expect(String(message).length).toBeGreaterThan(5);
  });

  it.each([
    ['a trace too short for the cut-off', { heightsUm: new Array(400).fill(0.5), spacingUm: 1, filter: { kind: 'gaussian', cutoffMm: 0.25 } }, ['heightsUm']],
    ['too few heights per cut-off', { heightsUm: new Array(4000).fill(0.5), spacingUm: 10, filter: { kind: 'gaussian', cutoffMm: 0.25 } }, ['filter.cutoffMm']],
    ['an unknown filter', { heightsUm: new Array(4000).fill(0.5), spacingUm: 1, filter: { kind: 'sharp' } }, ['filter.kind']],
    ['no cut-off', { heightsUm: new Array(4000).fill(0.5), spacingUm: 1, filter: { kind: 'gaussian' } }, ['filter.cutoffMm']],
  ])('when a roughness request has %s, then 400 names %j', async (_case, body, fields) => {
    const res = await calc('roughness', body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(fields);
  });

  it('when a trace is too short for the Gaussian cut-off, then the 400 says how long it must be', async () => {
    const res = await calc('roughness', { heightsUm: new Array(400).fill(0.5), spacingUm: 1, filter: { kind: 'gaussian', cutoffMm: 0.25 } });
    expect(res.status).toBe(400);
    // derived: half a cut-off (125 heights) at each end and one cut-off (250) = 500 heights, spanning 499 µm
    expect(res.body.error.fields.heightsUm).toBe(
      'A cut-off of 0.25 mm needs a trace of at least 0.499 mm (500 heights at 1 µm): half a cut-off dropped at each end and one whole cut-off evaluated. This trace is 0.399 mm. Send a longer trace or choose a shorter cut-off.',
    );
  });

  it('when the body is not an object at all, then 400 rather than 500', async () => {
    for (const body of ['"text"', '[1,2]', 'null', '42']) {
      const res = await supertest(ctx.app).post('/api/calculations/displacement').set('Content-Type', 'application/json').send(body);
      expect(res.status).toBe(400);
      expect(res.body.error).toBeDefined();
    }
  });

  it('when a roughness profile is larger than the body limit, then 413', async () => {
    const huge = `{"spacingUm":1,"heightsUm":[${'1.234567890123,'.repeat(1_000_000)}1]}`;
    const res = await supertest(ctx.app).post('/api/calculations/roughness').set('Content-Type', 'application/json').send(huge);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
  });

  it('when another route gets a body over 200 kB, then 413', async () => {
    const res = await calc('displacement', { unit: 'in', bore: 4, stroke: 3, cylinders: 8, padding: 'x'.repeat(300_000) });
    expect(res.status).toBe(413);
  });
});

describe('calculation API: rate limit', () => {
  it('when one address sends more than the limit in a minute, then 429', async () => {
    const limited = await setupTestApp({ RATE_LIMIT_CALCULATIONS_PER_MINUTE: '3' });
    try {
      const body = { unit: 'in', bore: 4, application: 'race' };
      for (let i = 0; i < 3; i += 1) expect((await supertest(limited.app).post('/api/calculations/ring-gap').send(body)).status).toBe(200);
      const res = await supertest(limited.app).post('/api/calculations/ring-gap').send(body);
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('too_many_attempts');
    } finally {
      await limited.close();
    }
  });

  it('when one address spreads its calculations over several routes, then they count against one limit', async () => {
    const limited = await setupTestApp({ RATE_LIMIT_CALCULATIONS_PER_MINUTE: '3' });
    try {
      const post = (route: string, body: object) => supertest(limited.app).post(`/api/calculations/${route}`).send(body);
      expect((await post('ring-gap', { unit: 'in', bore: 4, application: 'race' })).status).toBe(200);
      expect((await post('displacement', { unit: 'in', bore: 4, stroke: 3.48, cylinders: 8 })).status).toBe(200);
      expect((await post('bore-size', { unit: 'in', pistonDiameter: 4.028, clearanceMin: 0.0025, clearanceMax: 0.0035, honeAllowance: 0.003 })).status).toBe(200);
      const res = await post('crosshatch', { unit: 'in', bore: 4, spindleRpm: 150, strokeLength: 4, cyclesPerMinute: 31 });
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('too_many_attempts');
    } finally {
      await limited.close();
    }
  });
});
