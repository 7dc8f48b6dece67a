import { describe, it, expect } from 'vitest';
import type { z } from 'zod';
import {
  balanceToleranceRequestSchema,
  bearingClearanceRequestSchema,
  bobWeightRequestSchema,
  deckClearanceRequestSchema,
  dynamicCompressionRequestSchema,
  boreInspectionRequestSchema,
  boreSizeRequestSchema,
  calculationRequestSchemas,
  compressionRatioRequestSchema,
  crosshatchRateRequestSchema,
  crosshatchRequestSchema,
  deckFlatnessRequestSchema,
  displacementRequestSchema,
  ringGapRequestSchema,
  roughnessRequestSchema,
} from '../../../shared/schemas/calculations';
import { circleTrack } from './expectations';

/** The message for each failing path, joined with dots, e.g. { 'cylinders.0.top.thrust': '…' }. */
function fieldMessages(schema: z.ZodType, input: unknown): Record<string, string> {
  const result = schema.safeParse(input);
  expect(result.success).toBe(false);
  const messages: Record<string, string> = {};
  for (const issue of result.error?.issues ?? []) {
    const key = issue.path.join('.');
    messages[key] ??= issue.message;
  }
  return messages;
}

const pair = { thrust: 4.0301, axial: 4.03 };
const cylinder = { top: pair, middle: pair, bottom: pair, piston: 4.0265 };
const tenHeights = [0.1, -0.2, 0.3, -0.1, 0.2, -0.3, 0.1, 0, -0.1, 0.2];

const valid = {
  displacement: { unit: 'in', bore: 4, stroke: 3.48, cylinders: 8 },
  'compression-ratio': { unit: 'in', bore: 4, stroke: 3.48, chamberCc: 70, pistonCc: 5, deckClearance: 0.05, gasketBore: 4, gasketThickness: 0.02 },
  crosshatch: { unit: 'in', bore: 4, spindleRpm: 150, strokeLength: 4, cyclesPerMinute: 31 },
  'crosshatch-rate': { unit: 'mm', bore: 101.6, spindleRpm: 150, strokeLength: 101.6, includedAngleDeg: 45 },
  'bore-inspection': { unit: 'in', cylinders: [cylinder, cylinder], spec: { targetBore: 4.03, maxTaper: 0.0005 } },
  'bore-size': { unit: 'in', pistonDiameter: 3.9975, clearanceMin: 0.0025, clearanceMax: 0.0035, honeAllowance: 0.0025 },
  'deck-flatness': { unit: 'in', readings: [0.001, 0.002], material: 'aluminium', gasket: 'mls' },
  roughness: { heightsUm: tenHeights, spacingUm: 0.5 },
  'ring-gap': { unit: 'mm', bore: 100, application: 'boost' },
  'dynamic-compression': { ...circleTrack, rodLength: 5.7, intakeClosingDegAbdc: 60 },
  'balance-tolerance': { rotorMassKg: 20, serviceRpm: 7000, grade: 2.5 },
  'bob-weight': { rotatingGrams: 1100, reciprocatingGrams: 1400, reciprocatingFactor: 0.5, oilGrams: 4 },
  'deck-clearance': { unit: 'in', deckHeight: 9.025, stroke: 3.48, rodLength: 5.7, compressionHeight: 1.56, gasketThickness: 0.015 },
  'bearing-clearance': { unit: 'mm', housingBore: 68.3, journalDiameter: 63.5, shellWall: 2.375 },
} as const;

describe('calculation request schemas', () => {
  it.each(Object.keys(valid) as (keyof typeof valid)[])('when a sound %s request arrives, then it parses unchanged', (route) => {
    const schema = calculationRequestSchemas[route];
    expect(schema.parse(valid[route])).toEqual(valid[route]);
  });

  it('when the route list is read, then it names the fourteen routes of the API', () => {
    expect(Object.keys(calculationRequestSchemas).sort()).toEqual([
      'balance-tolerance',
      'bearing-clearance',
      'bob-weight',
      'bore-inspection',
      'bore-size',
      'compression-ratio',
      'crosshatch',
      'crosshatch-rate',
      'deck-clearance',
      'deck-flatness',
      'displacement',
      'dynamic-compression',
      'ring-gap',
      'roughness',
    ]);
  });

  it.each([
    { field: 'bore', value: -4, message: 'Bore must be greater than zero.' },
    { field: 'bore', value: 0, message: 'Bore must be greater than zero.' },
    { field: 'bore', value: Number.NaN, message: 'Bore must be a number.' },
    { field: 'bore', value: Number.POSITIVE_INFINITY, message: 'Bore must be a number.' },
    { field: 'bore', value: '4', message: 'Bore must be a number.' },
    { field: 'bore', value: undefined, message: 'Bore is required.' },
    { field: 'bore', value: 1e300, message: 'Bore must be at most 10,000.' },
    { field: 'stroke', value: -1, message: 'Stroke must be greater than zero.' },
    { field: 'cylinders', value: 0, message: 'Number of cylinders must be at least 1.' },
    { field: 'cylinders', value: 2.5, message: 'Number of cylinders must be a whole number.' },
    { field: 'unit', value: 'cm', message: 'Choose inches or millimetres.' },
  ])('when a displacement request has $field = $value, then $field reads "$message"', ({ field, value, message }) => {
    expect(fieldMessages(displacementRequestSchema, { ...valid.displacement, [field]: value })[field]).toBe(message);
  });

  it('when a compression request has a dome so large that no space is left, then pistonCc explains it', () => {
    const messages = fieldMessages(compressionRatioRequestSchema, { ...valid['compression-ratio'], pistonCc: -100 });
    expect(messages.pistonCc).toMatch(/no space above the piston/);
  });

  it('when a compression request leaves no space through a proud piston, then deckClearance explains it', () => {
    const messages = fieldMessages(compressionRatioRequestSchema, { ...valid['compression-ratio'], chamberCc: 0, pistonCc: 0, deckClearance: -0.05 });
    expect(messages.deckClearance).toMatch(/no space above the piston/);
  });

  it('when a compression request has a negative chamber and a zero gasket bore, then each field gets its own message', () => {
    const messages = fieldMessages(compressionRatioRequestSchema, { ...valid['compression-ratio'], chamberCc: -1, gasketBore: 0 });
    expect(messages.chamberCc).toBe('Chamber volume cannot be negative.');
    expect(messages.gasketBore).toBe('Gasket bore must be greater than zero.');
  });

  it('when a compression request has a dome and a proud piston that still leave space, then it parses', () => {
    expect(compressionRatioRequestSchema.safeParse({ ...valid['compression-ratio'], pistonCc: -8, deckClearance: -0.005 }).success).toBe(true);
  });

  it('when a crosshatch request has zero spindle speed or zero cycles, then each is named', () => {
    const messages = fieldMessages(crosshatchRequestSchema, { ...valid.crosshatch, spindleRpm: 0, cyclesPerMinute: 0 });
    expect(messages.spindleRpm).toBe('Spindle speed must be greater than zero.');
    expect(messages.cyclesPerMinute).toBe('Cycles per minute must be greater than zero.');
  });

  it.each([
    { value: 0, message: 'Included angle must be greater than 0 degrees.' },
    { value: 180, message: 'Included angle must be less than 180 degrees.' },
  ])('when a crosshatch-rate request asks for $value°, then the angle reads "$message"', ({ value, message }) => {
    expect(fieldMessages(crosshatchRateRequestSchema, { ...valid['crosshatch-rate'], includedAngleDeg: value }).includedAngleDeg).toBe(message);
  });

  it('when a bore inspection has no cylinders, then cylinders says so', () => {
    expect(fieldMessages(boreInspectionRequestSchema, { ...valid['bore-inspection'], cylinders: [] }).cylinders).toBe(
      'Enter the readings for at least one cylinder.',
    );
  });

  it('when a bore inspection has a negative reading in the second cylinder, then that reading is named', () => {
    const bad = { ...cylinder, middle: { thrust: -4.03, axial: 4.03 } };
    const messages = fieldMessages(boreInspectionRequestSchema, { ...valid['bore-inspection'], cylinders: [cylinder, bad] });
    expect(messages['cylinders.1.middle.thrust']).toBe('Thrust reading must be greater than zero.');
  });

  it('when a bore inspection lacks a depth or its spec has min above max, then each is named', () => {
    const { bottom: _unused, ...noBottom } = cylinder;
    const messages = fieldMessages(boreInspectionRequestSchema, {
      unit: 'in',
      cylinders: [noBottom],
      spec: { clearanceMin: 0.004, clearanceMax: 0.003, maxOutOfRound: -0.001 },
    });
    expect(messages['cylinders.0.bottom']).toBe('Enter a thrust and an axial reading.');
    expect(messages['spec.clearanceMax']).toBe('Maximum clearance cannot be smaller than minimum clearance.');
    expect(messages['spec.maxOutOfRound']).toBe('Maximum out-of-round cannot be negative.');
  });

  it('when a bore inspection has no spec, then it parses', () => {
    expect(boreInspectionRequestSchema.safeParse({ unit: 'mm', cylinders: [cylinder] }).success).toBe(true);
  });

  it('when a bore-size request has min clearance above max, then clearanceMax says so', () => {
    const messages = fieldMessages(boreSizeRequestSchema, { ...valid['bore-size'], clearanceMin: 0.004 });
    expect(messages.clearanceMax).toBe('Maximum clearance cannot be smaller than minimum clearance.');
  });

  it('when a bore-size hone allowance swallows the whole bore, then honeAllowance says so', () => {
    const messages = fieldMessages(boreSizeRequestSchema, { ...valid['bore-size'], pistonDiameter: 0.001, honeAllowance: 0.01 });
    expect(messages.honeAllowance).toBe('Hone allowance must be smaller than the finished bore.');
  });

  it('when a deck request has no readings, an unknown material and a negative shop limit, then each is named', () => {
    const messages = fieldMessages(deckFlatnessRequestSchema, { ...valid['deck-flatness'], readings: [], material: 'steel', shopLimit: -1 });
    expect(messages.readings).toBe('Enter at least one straightedge reading.');
    expect(messages.material).toBe('Choose cast iron or aluminium.');
    expect(messages.shopLimit).toBe('Shop limit must be greater than zero.');
  });

  it('when a deck reading is negative, then that reading is named', () => {
    const messages = fieldMessages(deckFlatnessRequestSchema, { ...valid['deck-flatness'], readings: [0.001, -0.001] });
    expect(messages['readings.1']).toBe('Each straightedge reading cannot be negative.');
  });

  it.each([
    { heightsUm: [], key: 'heightsUm', message: 'A profile needs at least 10 heights.' },
    { heightsUm: [1, 2, 3], key: 'heightsUm', message: 'A profile needs at least 10 heights.' },
    { heightsUm: 'none', key: 'heightsUm', message: 'Enter the profile heights as a list of numbers.' },
    { heightsUm: [...tenHeights.slice(0, 9), Number.NaN], key: 'heightsUm.9', message: 'Each height must be a number.' },
  ])('when a roughness profile is $heightsUm, then $key reads "$message"', ({ heightsUm, key, message }) => {
    expect(fieldMessages(roughnessRequestSchema, { heightsUm, spacingUm: 0.5 })[key]).toBe(message);
  });

  it('when a roughness request has zero spacing, then spacingUm says so', () => {
    expect(fieldMessages(roughnessRequestSchema, { heightsUm: tenHeights, spacingUm: 0 }).spacingUm).toBe('Sample spacing must be greater than zero.');
  });

  it('when a ring-gap request names an unknown use, then application lists the choices', () => {
    expect(fieldMessages(ringGapRequestSchema, { ...valid['ring-gap'], application: 'nitrous' }).application).toBe(
      'Choose street, performance, race or boost.',
    );
  });

  it('when a dynamic-compression request has a short rod and a closing angle past 180°, then each is named', () => {
    const messages = fieldMessages(dynamicCompressionRequestSchema, { ...valid['dynamic-compression'], rodLength: 1.7, intakeClosingDegAbdc: 181 });
    expect(messages.rodLength).toBe('Rod length must be longer than half the stroke.');
    expect(messages.intakeClosingDegAbdc).toBe('Intake closing angle must be at most 180 degrees after bottom dead centre.');
  });

  it('when a dynamic-compression request leaves no space above the piston, then pistonCc explains it as the static ratio does', () => {
    expect(fieldMessages(dynamicCompressionRequestSchema, { ...valid['dynamic-compression'], pistonCc: -100 }).pistonCc).toMatch(/no space above the piston/);
  });

  it('when a balance request names a grade outside ISO 21940-11, then grade lists the grades', () => {
    expect(fieldMessages(balanceToleranceRequestSchema, { ...valid['balance-tolerance'], grade: 3 }).grade).toMatch(/^Choose an ISO 21940-11 balance grade: G 0.4, G 1, G 2.5, G 6.3/);
  });

  it('when a bob-weight factor is above 1, then reciprocatingFactor says so; factor and oil may be left out', () => {
    expect(fieldMessages(bobWeightRequestSchema, { ...valid['bob-weight'], reciprocatingFactor: 1.5 }).reciprocatingFactor).toBe('Reciprocating factor must be at most 1.');
    expect(bobWeightRequestSchema.safeParse({ rotatingGrams: 1100, reciprocatingGrams: 1400 }).success).toBe(true);
  });

  it('when a deck-clearance request has no gasket, then it parses; a zero rod is named', () => {
    const { gasketThickness: _unused, ...noGasket } = valid['deck-clearance'];
    expect(deckClearanceRequestSchema.safeParse(noGasket).success).toBe(true);
    expect(fieldMessages(deckClearanceRequestSchema, { ...noGasket, rodLength: 0 }).rodLength).toBe('Rod length must be greater than zero.');
  });

  it('when a bearing journal is as large as its housing, then journalDiameter says so', () => {
    expect(fieldMessages(bearingClearanceRequestSchema, { ...valid['bearing-clearance'], journalDiameter: 68.3 }).journalDiameter).toBe(
      'Journal diameter must be smaller than the housing bore.',
    );
  });
});
