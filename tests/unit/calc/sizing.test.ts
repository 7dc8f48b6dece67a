import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import type { CylinderReadings } from '../../../shared/calc/bore';
import { OVERSIZE_STEPS, boreSize, chooseOversize } from '../../../shared/calc/sizing';
import { inchesToMm } from '../../../shared/calc/units';
import { expectCalculationError, expectWithin } from './expectations';

const expectNear = (actual: number | null | undefined, expected: number, abs = 1e-9) => expectWithin(actual, expected, abs);

/** Six equal readings except the top thrust one. */
function cylinder(all: number, topThrust = all): CylinderReadings {
  return {
    top: { thrust: topThrust, axial: all },
    middle: { thrust: all, axial: all },
    bottom: { thrust: all, axial: all },
  };
}

describe('boreSize', () => {
  it.each([
    // piston + mean clearance, then minus the hone allowance: common practice per references.md (Honing)
    { unit: 'in', pistonDiameter: 3.9975, clearanceMin: 0.0025, clearanceMax: 0.0035, honeAllowance: 0.0025, finished: 4.0005, boreTo: 3.998 },
    { unit: 'mm', pistonDiameter: 101.54, clearanceMin: 0.06, clearanceMax: 0.08, honeAllowance: 0.06, finished: 101.61, boreTo: 101.55 },
  ] as const)('when a $unit piston measures $pistonDiameter, then the bore finishes at $finished and is bored to $boreTo', (row) => {
    const result = boreSize(row);
    expectNear(result.finishedBore, row.finished); // derived: piston + (clearanceMin + clearanceMax) / 2
    expectNear(result.boreTo, row.boreTo); // derived: finished − hone allowance
    expectNear(result.targetClearance, (row.clearanceMin + row.clearanceMax) / 2); // derived: mean of the clearance range
  });

  it('when there is no hone allowance, then the bore-to size is the finished size', () => {
    const result = boreSize({ pistonDiameter: 4, clearanceMin: 0.001, clearanceMax: 0.001, honeAllowance: 0 });
    expect(result.boreTo).toBe(result.finishedBore); // derived: finished − 0
    expectNear(result.finishedBore, 4.001); // derived: 4.000 + 0.001
  });

  it.each([
    { input: { pistonDiameter: 0, clearanceMin: 0.001, clearanceMax: 0.002, honeAllowance: 0.002 }, field: 'pistonDiameter' },
    { input: { pistonDiameter: 4, clearanceMin: -0.001, clearanceMax: 0.002, honeAllowance: 0.002 }, field: 'clearanceMin' },
    { input: { pistonDiameter: 4, clearanceMin: 0.003, clearanceMax: 0.002, honeAllowance: 0.002 }, field: 'clearanceMax' },
    { input: { pistonDiameter: 4, clearanceMin: 0.001, clearanceMax: 0.002, honeAllowance: Number.NaN }, field: 'honeAllowance' },
    { input: { pistonDiameter: 4, clearanceMin: 0.001, clearanceMax: 0.002, honeAllowance: 5 }, field: 'honeAllowance' },
  ])('when $field is impossible, then a CalculationError names it', ({ input, field }) => {
    expectCalculationError(() => boreSize(input), field);
  });

  it('when all sizes are converted from inches to millimetres, then the results scale by 25.4', () => {
    const small = fc.double({ min: 0, max: 0.005, noNaN: true });
    fc.assert(
      fc.property(fc.double({ min: 2, max: 6, noNaN: true }), small, small, small, (piston, a, b, hone) => {
        const inches = boreSize({ pistonDiameter: piston, clearanceMin: Math.min(a, b), clearanceMax: Math.max(a, b), honeAllowance: hone });
        const mm = boreSize({
          pistonDiameter: inchesToMm(piston),
          clearanceMin: inchesToMm(Math.min(a, b)),
          clearanceMax: inchesToMm(Math.max(a, b)),
          honeAllowance: inchesToMm(hone),
        });
        expectNear(mm.finishedBore, inchesToMm(inches.finishedBore), 1e-10); // derived: 1 in = 25.4 mm exactly
        expectNear(mm.boreTo, inchesToMm(inches.boreTo), 1e-10); // derived: 1 in = 25.4 mm exactly
      }),
    );
  });
});

describe('chooseOversize', () => {
  it('when the default steps are read, then they are the common inch and millimetre series', () => {
    expect(OVERSIZE_STEPS.in).toEqual([0.01, 0.02, 0.03, 0.04, 0.06]); // common practice (no published source)
    expect(OVERSIZE_STEPS.mm).toEqual([0.25, 0.5, 0.75, 1.0]); // common practice (no published source)
  });

  it('when the worst cylinder reads 4.0125 in and needs 0.005 in to clean up, then +0.020 in is chosen', () => {
    const result = chooseOversize({
      unit: 'in',
      standardBore: 4,
      cylinders: [cylinder(4.004, 4.006), cylinder(4.005, 4.0125)],
      minCleanup: 0.005,
    });
    expect(result.worstCylinder).toBe(1); // derived: 4.0125 in the second cylinder (index 1) is the largest reading
    expectNear(result.largestReading, 4.0125); // derived: largest of all readings
    expectNear(result.required, 4.0175); // derived: 4.0125 + 0.005
    expect(result.step).toBe(0.02); // derived: 4.010 < 4.0175 ≤ 4.020, the smallest step that reaches it
    expectNear(result.finishedBore, 4.02); // derived: 4.000 + 0.020
    expectNear(result.stock?.[0].least, 0.014); // derived: 4.020 − 4.0060
    expectNear(result.stock?.[0].most, 0.016); // derived: 4.020 − 4.0040
    expectNear(result.stock?.[1].least, 0.0075); // derived: 4.020 − 4.0125
    expectNear(result.stock?.[1].most, 0.015); // derived: 4.020 − 4.0050
  });

  it('when the required size falls exactly on a step, then that step is chosen, not the next', () => {
    const result = chooseOversize({ unit: 'in', standardBore: 4, cylinders: [cylinder(4.02, 4.025)], minCleanup: 0.005 });
    expect(result.step).toBe(0.03); // derived: 4.025 + 0.005 = 4.030 = 4.000 + 0.030
  });

  it('when the bores still clean up at standard size, then step 0 is chosen', () => {
    const result = chooseOversize({ unit: 'in', standardBore: 4, cylinders: [cylinder(3.998, 3.999)], minCleanup: 0.001 });
    expect(result.step).toBe(0); // derived: 3.999 + 0.001 = 4.000 = standard
    expectNear(result.finishedBore, 4); // derived: standard bore
  });

  it('when no step is large enough, then the step, size and stock are null', () => {
    const result = chooseOversize({ unit: 'in', standardBore: 4, cylinders: [cylinder(4.05, 4.07)], minCleanup: 0.005 });
    expect(result.step).toBeNull();
    expect(result.finishedBore).toBeNull();
    expect(result.stock).toBeNull();
    expectNear(result.required, 4.075); // derived: 4.070 + 0.005 > 4.000 + 0.060
  });

  it('when the unit is millimetres, then the millimetre steps are used', () => {
    const result = chooseOversize({ unit: 'mm', standardBore: 86, cylinders: [cylinder(86.1, 86.3)], minCleanup: 0.1 });
    expect(result.step).toBe(0.5); // derived: 86.00 + 0.25 < 86.40 ≤ 86.00 + 0.50
    expectNear(result.finishedBore, 86.5); // derived: 86.00 + 0.50
  });

  it('when the shop gives its own steps, then only those are considered', () => {
    const cylinders = [cylinder(4.005, 4.0125)];
    expect(chooseOversize({ unit: 'in', standardBore: 4, cylinders, minCleanup: 0.005, steps: [0.015, 0.005] }).step).toBeNull();
    expect(chooseOversize({ unit: 'in', standardBore: 4, cylinders, minCleanup: 0.005, steps: [0.025, 0.018] }).step).toBe(0.018); // derived: 4.018 ≥ 4.0175, the smaller of the two
  });

  it.each([
    { input: { standardBore: 0, cylinders: [cylinder(4)], minCleanup: 0 }, field: 'standardBore' },
    { input: { standardBore: 4, cylinders: [cylinder(4)], minCleanup: -1 }, field: 'minCleanup' },
    { input: { standardBore: 4, cylinders: [], minCleanup: 0 }, field: 'cylinders' },
    { input: { standardBore: 4, cylinders: [cylinder(4, -4)], minCleanup: 0 }, field: 'cylinders.0.top.thrust' },
    { input: { standardBore: 4, cylinders: [cylinder(4)], minCleanup: 0, steps: [0.01, -0.02] }, field: 'steps.1' },
  ])('when $field is impossible, then a CalculationError names it', ({ input, field }) => {
    expectCalculationError(() => chooseOversize({ unit: 'in', ...input }), field);
  });

  it('when readings, clean-up and steps are converted to millimetres, then the same step is chosen', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 3.99, max: 4.08, noNaN: true }), { minLength: 1, maxLength: 8 }),
        fc.double({ min: 0, max: 0.01, noNaN: true }),
        (tops, cleanup) => {
          const cylinders = tops.map((top) => cylinder(3.995, top));
          const steps = OVERSIZE_STEPS.in;
          const a = chooseOversize({ unit: 'in', standardBore: 4, cylinders, minCleanup: cleanup, steps });
          const b = chooseOversize({
            unit: 'mm',
            standardBore: inchesToMm(4),
            cylinders: tops.map((top) => cylinder(inchesToMm(3.995), inchesToMm(top))),
            minCleanup: inchesToMm(cleanup),
            steps: steps.map(inchesToMm),
          });
          expect(b.step === null).toBe(a.step === null);
          if (a.step !== null) expectNear(b.step, inchesToMm(a.step), 1e-12); // derived: 1 in = 25.4 mm exactly
          expect(b.worstCylinder).toBe(a.worstCylinder); // derived: converting every reading keeps their order
        },
      ),
    );
  });
});
