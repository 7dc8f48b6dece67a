import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { unit as mathUnit } from 'mathjs';
import {
  CC_PER_CUBIC_INCH,
  CC_PER_LITRE,
  MICROMETRES_PER_MICROINCH,
  MM_PER_INCH,
  ccToCubicInches,
  ccToLitres,
  convertLength,
  cubicInchesToCc,
  cubicLengthToCc,
  fromMm,
  inchesToMm,
  litresToCc,
  micrometresToMicroinches,
  microinchesToMicrometres,
  mmToInches,
  toMm,
} from '../../../shared/calc/units';

describe('length', () => {
  it('when one inch is converted, then it is exactly 25.4 mm', () => {
    expect(MM_PER_INCH).toBe(25.4); // source: NIST, "SI Units – Length" (Federal Register notice of 30 June 1959)
    expect(inchesToMm(1)).toBe(25.4); // source: NIST, "SI Units – Length" (Federal Register notice of 30 June 1959)
    expect(mmToInches(25.4)).toBe(1); // source: NIST, "SI Units – Length" (Federal Register notice of 30 June 1959)
  });

  it('when a +0.010 in oversize is converted, then it is 0.254 mm, not 0.25 mm', () => {
    expect(inchesToMm(0.01)).toBeCloseTo(0.254, 12); // derived: 0.010 × 25.4
    expect(inchesToMm(0.01)).not.toBeCloseTo(0.25, 3); // derived: 0.010 × 25.4 = 0.254 ≠ 0.25
  });

  it.each([
    { value: 4, from: 'in', to: 'mm', expected: 101.6 }, // derived: 4 × 25.4
    { value: 101.6, from: 'mm', to: 'in', expected: 4 }, // derived: 101.6 / 25.4
    { value: 3.5, from: 'in', to: 'in', expected: 3.5 }, // derived: same unit, unchanged
    { value: 86, from: 'mm', to: 'mm', expected: 86 }, // derived: same unit, unchanged
  ] as const)('when $value $from is expressed in $to, then it is $expected', ({ value, from, to, expected }) => {
    expect(convertLength(value, from, to)).toBeCloseTo(expected, 12); // derived: see the row's label
  });

  it('when toMm and fromMm are used, then they follow the unit given', () => {
    expect(toMm(2, 'in')).toBeCloseTo(50.8, 12); // derived: 2 × 25.4
    expect(toMm(2, 'mm')).toBe(2); // derived: millimetres unchanged
    expect(fromMm(50.8, 'in')).toBeCloseTo(2, 12); // derived: 50.8 / 25.4
    expect(fromMm(50.8, 'mm')).toBe(50.8); // derived: millimetres unchanged
  });

  it('when any length goes to millimetres and back, then it is unchanged', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e6, noNaN: true }), (inches) => {
        expect(Math.abs(mmToInches(inchesToMm(inches)) - inches)).toBeLessThanOrEqual(1e-15 * inches); // derived: (x × 25.4) / 25.4 = x, to floating-point precision
      }),
    );
  });
});

describe('volume', () => {
  it('when one cubic inch is converted, then it is exactly 16.387064 cc', () => {
    expect(CC_PER_CUBIC_INCH).toBe(16.387064); // derived: 25.4³ mm³ = 16387.064 mm³
    expect(cubicInchesToCc(1)).toBe(16.387064); // derived: 25.4³ mm³ = 16387.064 mm³
    expect(ccToCubicInches(16.387064)).toBe(1); // derived: 25.4³ mm³ = 16387.064 mm³
  });

  it('when one litre is converted, then it is 1000 cc and 61.0237441 cubic inches', () => {
    expect(CC_PER_LITRE).toBe(1000); // source: BIPM, SI Brochure (9th ed.), non-SI units accepted for use with the SI: 1 L = 1 dm³
    expect(litresToCc(1)).toBe(1000); // source: BIPM, SI Brochure (9th ed.), non-SI units accepted for use with the SI: 1 L = 1 dm³
    expect(ccToLitres(1500)).toBe(1.5); // derived: 1500 / 1000
    expect(ccToCubicInches(litresToCc(1))).toBeCloseTo(61.0237441, 7); // derived: 1000 / 16.387064
  });

  it('when a volume is given in the cube of a length unit, then it is expressed in cc', () => {
    expect(cubicLengthToCc(1, 'in')).toBe(16.387064); // derived: 25.4³ mm³ / 1000
    expect(cubicLengthToCc(1000, 'mm')).toBe(1); // derived: 1000 mm³ = 1 cm³
  });
});

describe('mathjs as an independent reference', () => {
  it('when mathjs converts a cubic inch, then it matches 0.0254³ m³ and our constant', () => {
    const mathjsCubicInchInM3 = mathUnit(1, 'cuin').toNumber('m3');
    // First check the library is not storing a rounded constant (references.md warns of this).
    expect(mathjsCubicInchInM3).toBeCloseTo(0.0254 ** 3, 18); // derived: (25.4 mm)³ = 0.0254³ m³
    expect(Math.abs(mathjsCubicInchInM3 / 0.0254 ** 3 - 1)).toBeLessThan(1e-12); // derived: (25.4 mm)³ = 0.0254³ m³
    // Then use it as the reference for ours.
    const mathjsCubicInchInCc = mathUnit(1, 'cuin').toNumber('cm3');
    expect(Math.abs(CC_PER_CUBIC_INCH / mathjsCubicInchInCc - 1)).toBeLessThan(1e-12); // source: mathjs 15 unit table (cuin), checked above
  });

  it('when mathjs converts an inch, then it matches our millimetres per inch', () => {
    expect(mathUnit(1, 'in').toNumber('mm')).toBeCloseTo(MM_PER_INCH, 12); // source: mathjs 15 unit table (in)
  });
});

describe('microinch and micrometre', () => {
  it('when one microinch is converted, then it is exactly 0.0254 µm', () => {
    expect(MICROMETRES_PER_MICROINCH).toBe(0.0254); // derived: 25.4 mm × 10⁻⁶ = 0.0254 µm
    expect(microinchesToMicrometres(1)).toBe(0.0254); // derived: 25.4 mm × 10⁻⁶ = 0.0254 µm
  });

  it('when 32 µin is converted, then it is 0.8128 µm (the exact value, not the nominal 0.8)', () => {
    expect(microinchesToMicrometres(32)).toBeCloseTo(0.8128, 12); // derived: 32 × 0.0254
    expect(micrometresToMicroinches(0.8128)).toBeCloseTo(32, 10); // derived: 0.8128 / 0.0254
    expect(micrometresToMicroinches(0.8)).not.toBeCloseTo(32, 3); // derived: 0.8 / 0.0254 = 31.496
  });

  it('when a deck finish of Ra 50 µin is converted, then it is 1.27 µm', () => {
    expect(microinchesToMicrometres(50)).toBeCloseTo(1.27, 12); // derived: 50 × 0.0254
  });
});
