import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { CalculationError } from '../../../shared/calc/errors';
import { RING_GAP_FACTORS, ringGap } from '../../../shared/calc/ring-gap';
import { inchesToMm } from '../../../shared/calc/units';
import { expectWithin } from './expectations';

const expectNear = (actual: number, expected: number, abs = 1e-12) => expectWithin(actual, expected, abs);

describe('ringGap', () => {
  it.each([
    { application: 'street', top: 0.016, second: 0.018 }, // common practice (no published source): 0.004 × 4.000 in; second +0.0005/in
    { application: 'performance', top: 0.018, second: 0.02 }, // common practice (no published source): 0.0045 × 4.000 in
    { application: 'race', top: 0.02, second: 0.022 }, // common practice (no published source): 0.005 × 4.000 in
    { application: 'boost', top: 0.024, second: 0.026 }, // common practice (no published source): 0.006 × 4.000 in
  ] as const)('when a 4.000 in bore is for $application use, then the top gap is $top in and the second $second in', ({ application, top, second }) => {
    const result = ringGap({ bore: 4, application });
    expectNear(result.topRing, top); // common practice (no published source)
    expectNear(result.secondRing, second); // common practice (no published source)
  });

  it('when the bore is in millimetres, then the gap comes back in millimetres', () => {
    expectNear(ringGap({ bore: 100, application: 'street' }).topRing, 0.4); // common practice (no published source): 0.004 × 100 mm
  });

  it('when any application is chosen, then the top factor sits in the common range and the second ring is larger', () => {
    expect(RING_GAP_FACTORS.street.top).toBe(0.004); // common practice (no published source)
    for (const key of ['performance', 'race'] as const) {
      expect(RING_GAP_FACTORS[key].top).toBeGreaterThanOrEqual(0.0045); // common practice (no published source)
      expect(RING_GAP_FACTORS[key].top).toBeLessThanOrEqual(0.0055); // common practice (no published source)
    }
    expect(RING_GAP_FACTORS.boost.top).toBeGreaterThanOrEqual(0.006); // common practice (no published source)
    for (const factors of Object.values(RING_GAP_FACTORS)) {
      expect(factors.second).toBeGreaterThan(factors.top); // common practice (no published source): second ring somewhat larger
    }
  });

  it('when the bore is converted from inches to millimetres, then the gaps scale by 25.4', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 10, noNaN: true }),
        fc.constantFrom('street' as const, 'performance' as const, 'race' as const, 'boost' as const),
        (bore, application) => {
          const a = ringGap({ bore, application });
          const b = ringGap({ bore: inchesToMm(bore), application });
          expectNear(b.topRing, inchesToMm(a.topRing), 1e-12); // derived: gap ∝ bore, 1 in = 25.4 mm exactly
          expectNear(b.secondRing, inchesToMm(a.secondRing), 1e-12); // derived: gap ∝ bore, 1 in = 25.4 mm exactly
        },
      ),
    );
  });

  it.each([
    { bore: 0, application: 'street', field: 'bore' },
    { bore: -4, application: 'street', field: 'bore' },
    { bore: 4, application: 'drag', field: 'application' },
    { bore: 4, application: 'toString', field: 'application' },
  ])('when the bore is $bore and the use is $application, then a CalculationError names $field', ({ bore, application, field }) => {
    let caught: unknown;
    try {
      ringGap({ bore, application: application as never });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(CalculationError);
    expect((caught as CalculationError).field).toBe(field);
  });
});
