import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  DECK_FLATNESS_LIMITS,
  MLS_DECK_FINISH_MAX_RA_UM,
  deckFlatness,
  deckFlatnessLimit,
  deckOutOfFlat,
} from '../../../shared/calc/deck';
import { inchesToMm } from '../../../shared/calc/units';
import { expectCalculationError, expectWithin } from './expectations';

const expectNear = (actual: number, expected: number, abs = 1e-12) => expectWithin(actual, expected, abs);

describe('deckOutOfFlat', () => {
  it('when six straightedge positions are read, then out-of-flat is the largest leaf', () => {
    expect(deckOutOfFlat([0.001, 0.0015, 0.0005, 0.002, 0.001, 0])).toBe(0.002); // derived: max of the readings
  });

  it('when every leaf is zero, then the deck is flat', () => {
    expect(deckOutOfFlat([0, 0, 0])).toBe(0); // derived: max of zeros
  });

  it.each([
    { readings: [], field: 'readings' },
    { readings: [0.001, -0.001], field: 'readings.1' },
    { readings: [Number.NaN], field: 'readings.0' },
  ])('when the readings are $readings, then a CalculationError names $field', ({ readings, field }) => {
    expectCalculationError(() => deckOutOfFlat(readings), field);
  });
});

describe('deckFlatnessLimit', () => {
  it.each([
    { material: 'cast-iron', gasket: 'composite', inches: 0.004 }, // common practice (no published source)
    { material: 'cast-iron', gasket: 'mls', inches: 0.002 }, // common practice (no published source)
    { material: 'aluminium', gasket: 'composite', inches: 0.002 }, // common practice (no published source)
    { material: 'aluminium', gasket: 'mls', inches: 0.001 }, // common practice (no published source)
  ] as const)('when the deck is $material with a $gasket gasket, then the limit is $inches in', ({ material, gasket, inches }) => {
    expect(deckFlatnessLimit(material, gasket, 'in')).toBe(inches); // common practice (no published source): see the row
    expectNear(deckFlatnessLimit(material, gasket, 'mm'), inchesToMm(inches)); // derived: × 25.4
  });

  it('when the table is read, then aluminium is tighter than cast iron and mls tighter than composite', () => {
    const { limits } = DECK_FLATNESS_LIMITS;
    expect(limits.aluminium.composite).toBeLessThan(limits['cast-iron'].composite); // common practice (no published source)
    expect(limits.aluminium.mls).toBeLessThan(limits['cast-iron'].mls); // common practice (no published source)
    expect(limits['cast-iron'].mls).toBeLessThan(limits['cast-iron'].composite); // common practice (no published source)
    expect(limits.aluminium.mls).toBeLessThan(limits.aluminium.composite); // common practice (no published source)
  });

  it('when a shop passes its own table in millimetres, then its figure is used and converted', () => {
    const table = {
      unit: 'mm' as const,
      limits: { 'cast-iron': { composite: 0.1, mls: 0.05 }, aluminium: { composite: 0.05, mls: 0.0254 } },
    };
    expect(deckFlatnessLimit('aluminium', 'mls', 'mm', table)).toBe(0.0254); // derived: the shop's figure, same unit
    expectNear(deckFlatnessLimit('aluminium', 'mls', 'in', table), 0.001); // derived: 0.0254 / 25.4
  });

  it('when the material is not in the table, then a CalculationError is thrown', () => {
    expectCalculationError(() => deckFlatnessLimit('granite' as never, 'mls', 'in'), 'material');
    expectCalculationError(() => deckFlatnessLimit('constructor' as never, 'mls', 'in'), 'material');
  });
});

describe('deckFlatness', () => {
  it('when an aluminium deck for an mls gasket is out 0.0015 in, then it fails the 0.001 in limit', () => {
    const result = deckFlatness({ unit: 'in', readings: [0.0005, 0.0015, 0.001], material: 'aluminium', gasket: 'mls' });
    expect(result.outOfFlat).toBe(0.0015); // derived: max of the readings
    expect(result.limit).toBe(0.001); // common practice (no published source)
    expect(result.pass).toBe(false);
    expect(result.limitSource).toBe('table');
  });

  it('when a cast-iron deck for a composite gasket is out 0.1 mm, then it passes the 0.1016 mm limit', () => {
    const result = deckFlatness({ unit: 'mm', readings: [0.05, 0.1], material: 'cast-iron', gasket: 'composite' });
    expectNear(result.limit, 0.1016); // derived: 0.004 in × 25.4 (common practice figure)
    expect(result.pass).toBe(true);
  });

  it('when the out-of-flat equals the limit, then it passes', () => {
    expect(deckFlatness({ unit: 'in', readings: [0.002], material: 'cast-iron', gasket: 'mls' }).pass).toBe(true); // derived: 0.002 ≤ 0.002
  });

  it('when the shop sets its own limit, then it replaces the table', () => {
    const result = deckFlatness({ unit: 'in', readings: [0.0015], material: 'aluminium', gasket: 'mls', shopLimit: 0.002 });
    expect(result.limit).toBe(0.002); // derived: the shop's figure
    expect(result.limitSource).toBe('shop');
    expect(result.pass).toBe(true);
  });

  it('when the shop limit is negative, then a CalculationError names it', () => {
    expectCalculationError(() => deckFlatness({ unit: 'in', readings: [0.001], material: 'aluminium', gasket: 'mls', shopLimit: -0.001 }), 'shopLimit');
  });

  it('when the shop limit is zero, then no leaf may pass: all-zero readings pass and any gap fails (never an error)', () => {
    expect(deckFlatness({ unit: 'in', readings: [0, 0, 0], material: 'aluminium', gasket: 'mls', shopLimit: 0 })).toMatchObject({ pass: true, limit: 0, limitSource: 'shop' });
    expect(deckFlatness({ unit: 'in', readings: [0, 0.0005], material: 'aluminium', gasket: 'mls', shopLimit: 0 })).toMatchObject({ pass: false, limit: 0 });
  });

  it('when readings are converted from inches to millimetres, then pass/fail is unchanged', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 0.01, noNaN: true }), { minLength: 1, maxLength: 12 }),
        fc.constantFrom('cast-iron' as const, 'aluminium' as const),
        fc.constantFrom('mls' as const, 'composite' as const),
        (readings, material, gasket) => {
          const a = deckFlatness({ unit: 'in', readings, material, gasket });
          const b = deckFlatness({ unit: 'mm', readings: readings.map(inchesToMm), material, gasket });
          expectNear(b.outOfFlat, inchesToMm(a.outOfFlat)); // derived: 1 in = 25.4 mm exactly
          expect(b.pass).toBe(a.pass);
        },
      ),
    );
  });
});

describe('MLS_DECK_FINISH_MAX_RA_UM', () => {
  it('when the finish figure for mls gaskets is read, then it is Ra 50 µin in micrometres', () => {
    expectNear(MLS_DECK_FINISH_MAX_RA_UM, 1.27); // common practice (no published source): Ra 50 µin; derived: 50 × 0.0254 µm
  });
});
