import { describe, expect, expectTypeOf, it } from 'vitest';
import * as calc from '../../../shared/calc';
import type {
  BalanceToleranceResult,
  BearingClearanceResult,
  BobWeightResult,
  DeckClearanceResult,
  DynamicCompressionResult,
  BoreInspection,
  BoreSize,
  CompressionResult,
  CrosshatchRateResult,
  CrosshatchResult,
  DeckFlatnessResult,
  DisplacementResult,
  LengthUnit,
  RingGapResult,
  RoughnessResult,
} from '../../../shared/calc';
import {
  balanceToleranceAnswerSchema,
  bearingClearanceAnswerSchema,
  bobWeightAnswerSchema,
  deckClearanceAnswerSchema,
  dynamicCompressionAnswerSchema,
  type BalanceToleranceAnswer,
  type BearingClearanceAnswer,
  type BobWeightAnswer,
  type DeckClearanceAnswer,
  type DynamicCompressionAnswer,
  boreInspectionAnswerSchema,
  boreSizeAnswerSchema,
  compressionRatioAnswerSchema,
  crosshatchAnswerSchema,
  crosshatchRateAnswerSchema,
  deckFlatnessAnswerSchema,
  displacementAnswerSchema,
  ringGapAnswerSchema,
  roughnessAnswerSchema,
  type BoreInspectionAnswer,
  type BoreSizeAnswer,
  type CompressionRatioAnswer,
  type CrosshatchAnswer,
  type CrosshatchRateAnswer,
  type DeckFlatnessAnswer,
  type DisplacementAnswer,
  type RingGapAnswer,
  type RoughnessAnswer,
} from '../../../shared/schemas/calculations';
import { responseMismatch } from '../../../server/lib/http/routes';

/** A result with the request's unit added, as one object type. */
type Flat<T> = { [K in keyof T]: T[K] };
type WithUnit<T> = Flat<T & { unit: LengthUnit }>;

describe('calculation answer schemas', () => {
  it('when compiled, then each answer type is its shared/calc result, optional fields and unions alike, plus the unit where the route adds it', () => {
    // Checked by tsc: a field added to, dropped from or retyped in a result interface breaks the build here.
    expectTypeOf<DisplacementAnswer>().toEqualTypeOf<DisplacementResult>();
    expectTypeOf<CompressionRatioAnswer>().toEqualTypeOf<CompressionResult>();
    expectTypeOf<CrosshatchAnswer>().toEqualTypeOf<CrosshatchResult>();
    expectTypeOf<CrosshatchRateAnswer>().toEqualTypeOf<CrosshatchRateResult>();
    expectTypeOf<BoreInspectionAnswer>().toEqualTypeOf<WithUnit<BoreInspection>>();
    expectTypeOf<BoreSizeAnswer>().toEqualTypeOf<WithUnit<BoreSize>>();
    expectTypeOf<DeckFlatnessAnswer>().toEqualTypeOf<WithUnit<DeckFlatnessResult>>();
    expectTypeOf<RoughnessAnswer>().toEqualTypeOf<RoughnessResult>();
    expectTypeOf<RingGapAnswer>().toEqualTypeOf<WithUnit<RingGapResult>>();
    expectTypeOf<DynamicCompressionAnswer>().toEqualTypeOf<WithUnit<DynamicCompressionResult>>();
    expectTypeOf<BalanceToleranceAnswer>().toEqualTypeOf<BalanceToleranceResult>();
    expectTypeOf<BobWeightAnswer>().toEqualTypeOf<BobWeightResult>();
    expectTypeOf<DeckClearanceAnswer>().toEqualTypeOf<WithUnit<DeckClearanceResult>>();
    expectTypeOf<BearingClearanceAnswer>().toEqualTypeOf<WithUnit<BearingClearanceResult>>();
  });

  const pair = { thrust: 4.0301, axial: 4.03 };
  const measured = { top: pair, middle: { thrust: 4.0306, axial: 4.0302 }, bottom: pair, piston: 4.0265 };
  const unmeasured = { top: pair, middle: pair, bottom: pair };
  const wave = Array.from({ length: 400 }, (_, i) => Math.sin(i / 7) + 0.3 * Math.sin(i / 2));

  it.each([
    ['displacement', displacementAnswerSchema, calc.displacement({ unit: 'in', bore: 4.03, stroke: 3.48, cylinders: 8 })],
    [
      'compression-ratio',
      compressionRatioAnswerSchema,
      calc.compressionRatio({ unit: 'in', bore: 4, stroke: 3.48, chamberCc: 70, pistonCc: -5, deckClearance: 0.01, gasketBore: 4.1, gasketThickness: 0.04 }),
    ],
    ['crosshatch', crosshatchAnswerSchema, calc.crosshatchAngle({ bore: 4, spindleRpm: 150, strokeLength: 4, cyclesPerMinute: 31 })],
    ['crosshatch-rate', crosshatchRateAnswerSchema, calc.crosshatchRate({ bore: 4, spindleRpm: 150, strokeLength: 4, includedAngleDeg: 45 })],
    [
      'bore-inspection with pistons, a target and failures',
      boreInspectionAnswerSchema,
      { unit: 'in', ...calc.inspectBores({ cylinders: [measured, unmeasured], spec: { targetBore: 4.0, targetTolerance: 0.001, clearanceMin: 0.01, maxTaper: 0.0001 } }) },
    ],
    ['bore-inspection without a spec', boreInspectionAnswerSchema, { unit: 'mm', ...calc.inspectBores({ cylinders: [unmeasured] }) }],
    ['bore-size', boreSizeAnswerSchema, { unit: 'in', ...calc.boreSize({ pistonDiameter: 3.9975, clearanceMin: 0.0025, clearanceMax: 0.0035, honeAllowance: 0.0025 }) }],
    ['deck-flatness by the table', deckFlatnessAnswerSchema, { unit: 'in', ...calc.deckFlatness({ unit: 'in', readings: [0.001, 0.003], material: 'aluminium', gasket: 'mls' }) }],
    ['deck-flatness by a shop limit', deckFlatnessAnswerSchema, { unit: 'mm', ...calc.deckFlatness({ unit: 'mm', readings: [0.02], material: 'cast-iron', gasket: 'composite', shopLimit: 0.05 }) }],
    ['roughness without spacing', roughnessAnswerSchema, calc.roughness(wave)],
    ['roughness with spacing, unfiltered', roughnessAnswerSchema, calc.roughness(wave, 0.5)],
    ['roughness, Gaussian-filtered', roughnessAnswerSchema, calc.roughness(wave, 0.5, { kind: 'gaussian', cutoffMm: 0.08 })],
    ['ring-gap', ringGapAnswerSchema, { unit: 'in', ...calc.ringGap({ bore: 4.03, application: 'race' }) }],
    [
      'dynamic-compression',
      dynamicCompressionAnswerSchema,
      {
        unit: 'in',
        ...calc.dynamicCompression({ unit: 'in', bore: 4, stroke: 3.48, chamberCc: 70, pistonCc: 5, deckClearance: 0.05, gasketBore: 4, gasketThickness: 0.02, rodLength: 5.7, intakeClosingDegAbdc: 60 }),
      },
    ],
    ['balance-tolerance', balanceToleranceAnswerSchema, calc.balanceTolerance({ rotorMassKg: 20, serviceRpm: 7000, grade: 2.5 })],
    ['bob-weight', bobWeightAnswerSchema, calc.bobWeight({ rotatingGrams: 1100, reciprocatingGrams: 1400 })],
    ['deck-clearance with a gasket', deckClearanceAnswerSchema, { unit: 'in', ...calc.deckClearance({ unit: 'in', deckHeight: 9.025, stroke: 3.48, rodLength: 5.7, compressionHeight: 1.56, gasketThickness: 0.015 }) }],
    ['deck-clearance without a gasket', deckClearanceAnswerSchema, { unit: 'mm', ...calc.deckClearance({ unit: 'mm', deckHeight: 229, stroke: 88, rodLength: 145, compressionHeight: 39 }) }],
    ['bearing-clearance', bearingClearanceAnswerSchema, { unit: 'in', ...calc.bearingClearance({ unit: 'in', housingBore: 2.689, journalDiameter: 2.4995, shellWall: 0.0935 }) }],
  ] as const)('when the %s answer is sent as JSON, then its schema takes it whole', (_name, schema, answer) => {
    expect(responseMismatch(schema, answer)).toBeNull();
  });

  it('when an answer carries a field its result does not have, then the schema says so', () => {
    const answer = { ...calc.displacement({ unit: 'mm', bore: 100, stroke: 90, cylinders: 4 }), unit: 'mm' };
    expect(responseMismatch(displacementAnswerSchema, answer)).toBe('the answer has fields the schema does not declare');
  });
});
