import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { BALANCE_GRADES, balanceTolerance, bobWeight } from '../../../shared/calc/balance';
import { expectCalculationError, expectRelativelyNear, expectWithin } from './expectations';

describe('balanceTolerance', () => {
  it('when the grade is G 2.5, the rotor 20 kg and the speed 7000 rev/min, then e_per is 3.410 g·mm/kg and U_per 68.2 g·mm', () => {
    const result = balanceTolerance({ rotorMassKg: 20, serviceRpm: 7000, grade: 2.5 });
    expectWithin(result.specificUnbalanceGmmPerKg, 3.41, 0.0005); // derived: ISO 21940-11 e_per = 9549 · G / n = 9549 · 2.5 / 7000
    expectWithin(result.permissibleUnbalanceGmm, 68.2, 0.05); // derived: ISO 21940-11 U_per = e_per · m = 3.410 · 20
    expectRelativelyNear(result.specificUnbalanceGmmPerKg, (9549 * 2.5) / 7000); // derived: ISO 21940-11 formula, exactly
    expectRelativelyNear(result.perPlaneGmm, result.permissibleUnbalanceGmm / 2); // derived: ISO 21940-11, rotor symmetric between two planes
  });

  it('when the grade list is read, then it holds the ISO 21940-11 grades an engine shop uses', () => {
    expect(BALANCE_GRADES).toEqual(expect.arrayContaining([0.4, 1, 2.5, 6.3, 16, 40])); // source: ISO 21940-11, table of balance quality grades
  });

  it.each([
    { change: { rotorMassKg: 0 }, field: 'rotorMassKg' },
    { change: { serviceRpm: -1 }, field: 'serviceRpm' },
    { change: { serviceRpm: Number.NaN }, field: 'serviceRpm' },
    { change: { grade: 3 }, field: 'grade' },
  ])('when $field is impossible, then a CalculationError names it', ({ change, field }) => {
    expectCalculationError(() => balanceTolerance({ rotorMassKg: 20, serviceRpm: 7000, grade: 2.5, ...change }), field);
  });

  const grade = fc.constantFrom(...BALANCE_GRADES);
  const mass = fc.double({ min: 0.1, max: 500, noNaN: true });
  const rpm = fc.double({ min: 100, max: 20_000, noNaN: true });
  const scale = fc.double({ min: 0.1, max: 10, noNaN: true });

  it('when the mass is scaled, then the permissible unbalance scales with it and e_per does not change', () => {
    fc.assert(
      fc.property(grade, mass, rpm, scale, (g, m, n, k) => {
        const a = balanceTolerance({ rotorMassKg: m, serviceRpm: n, grade: g });
        const b = balanceTolerance({ rotorMassKg: m * k, serviceRpm: n, grade: g });
        expectRelativelyNear(b.permissibleUnbalanceGmm, a.permissibleUnbalanceGmm * k, 1e-12); // derived: U_per = e_per · m
        expectRelativelyNear(b.specificUnbalanceGmmPerKg, a.specificUnbalanceGmmPerKg, 1e-12); // derived: e_per does not depend on m
      }),
    );
  });

  it('when the speed is scaled, then the unbalance falls in inverse proportion; each plane takes half', () => {
    fc.assert(
      fc.property(grade, mass, rpm, scale, (g, m, n, k) => {
        const a = balanceTolerance({ rotorMassKg: m, serviceRpm: n, grade: g });
        const b = balanceTolerance({ rotorMassKg: m, serviceRpm: n * k, grade: g });
        expectRelativelyNear(b.permissibleUnbalanceGmm * k, a.permissibleUnbalanceGmm, 1e-12); // derived: e_per = 9549 · G / n
        expectRelativelyNear(b.perPlaneGmm * 2, b.permissibleUnbalanceGmm, 1e-15); // derived: ISO 21940-11, two symmetric planes
      }),
    );
  });
});

describe('bobWeight', () => {
  it('when a 90° V8 throw carries 1,100 g rotating and 1,400 g reciprocating, then the bob weighs 1,800 g at the 50 % factor', () => {
    // common practice (90° V8: 100 % rotating + 50 % reciprocating per throw); figures invented for the example
    const result = bobWeight({ rotatingGrams: 1100, reciprocatingGrams: 1400 });
    expectRelativelyNear(result.bobWeightGrams, 1800); // derived: 1100 + 0.5 · 1400
    expect(result.reciprocatingFactor).toBe(0.5); // common practice: the 90° V8 factor is the default
  });

  it('when a factor and an oil allowance are given, then both are used', () => {
    const result = bobWeight({ rotatingGrams: 1100, reciprocatingGrams: 1400, reciprocatingFactor: 0.52, oilGrams: 4 });
    expectRelativelyNear(result.bobWeightGrams, 1832); // derived: 1100 + 0.52 · 1400 + 4
    expect(result.reciprocatingFactor).toBe(0.52);
  });

  it.each([
    { change: { rotatingGrams: -1 }, field: 'rotatingGrams' },
    { change: { reciprocatingGrams: Number.POSITIVE_INFINITY }, field: 'reciprocatingGrams' },
    { change: { reciprocatingFactor: 1.2 }, field: 'reciprocatingFactor' },
    { change: { reciprocatingFactor: -0.1 }, field: 'reciprocatingFactor' },
    { change: { oilGrams: -2 }, field: 'oilGrams' },
  ])('when $field is impossible, then a CalculationError names it', ({ change, field }) => {
    expectCalculationError(() => bobWeight({ rotatingGrams: 1100, reciprocatingGrams: 1400, ...change }), field);
  });
});

describe('figures too extreme to work out', () => {
  it('refuses a service speed so small that the tolerance overflows, naming the field (found by the API fuzz test)', () => {
    expectCalculationError(() => balanceTolerance({ rotorMassKg: 20, serviceRpm: 5e-324, grade: 2.5 }), 'serviceRpm');
  });
});
