import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { TYPICAL_INCLUDED_ANGLES, crosshatchAngle, crosshatchRate } from '../../../shared/calc/crosshatch';
import { inchesToMm } from '../../../shared/calc/units';
import { expectCalculationError, expectWithin } from './expectations';

const expectNear = (actual: number, expected: number, abs = 1e-9) => expectWithin(actual, expected, abs);

describe('crosshatchAngle', () => {
  it('when a 4 in bore turns at 150 rev/min and a 4 in stroke runs 31 cycles/min, then the included angle is 14.99°', () => {
    const result = crosshatchAngle({ bore: 4, spindleRpm: 150, strokeLength: 4, cyclesPerMinute: 31 });
    expectNear(result.peripheralSpeed, 600 * Math.PI); // derived: vt = π · 4 · 150
    expectNear(result.axialSpeed, 248); // derived: va = 2 · 4 · 31
    expectNear(result.includedAngleDeg, 14.990491870623144); // derived: 2 · atan(248 / (600π)) in degrees
    expectNear(result.scratchAngleDeg, 7.495245935311572); // derived: atan(248 / (600π)) in degrees
  });

  it.each([
    { ratio: 1, expected: 90 }, // derived: 2 · atan(1) = 90°
    { ratio: Math.tan(Math.PI / 6), expected: 60 }, // derived: 2 · atan(tan 30°) = 60°
    { ratio: Math.tan(Math.PI / 8), expected: 45 }, // derived: 2 · atan(tan 22.5°) = 45°
  ])('when the axial speed is $ratio times the peripheral speed, then the included angle is $expected°', ({ ratio, expected }) => {
    const bore = 3.5;
    const spindleRpm = 200;
    const strokeLength = 3;
    // va = 2·L·f = ratio · π·D·n  ⇒  f = ratio · π·D·n / (2·L)
    const cyclesPerMinute = (ratio * Math.PI * bore * spindleRpm) / (2 * strokeLength);
    expectNear(crosshatchAngle({ bore, spindleRpm, strokeLength, cyclesPerMinute }).includedAngleDeg, expected, 1e-9); // derived: see the row's label
  });

  it('when the cycles per minute double, then the angle grows but less than doubles', () => {
    const slow = crosshatchAngle({ bore: 4, spindleRpm: 150, strokeLength: 4, cyclesPerMinute: 31 }).includedAngleDeg;
    const fast = crosshatchAngle({ bore: 4, spindleRpm: 150, strokeLength: 4, cyclesPerMinute: 62 }).includedAngleDeg;
    expectNear(fast, 29.48479770057859, 1e-9); // derived: 2 · atan(496 / (600π)) in degrees
    expect(fast).toBeLessThan(2 * slow); // derived: atan is concave for positive arguments
  });

  it.each([
    { change: { bore: 0 }, field: 'bore' },
    { change: { spindleRpm: 0 }, field: 'spindleRpm' },
    { change: { strokeLength: -1 }, field: 'strokeLength' },
    { change: { cyclesPerMinute: 0 }, field: 'cyclesPerMinute' },
    { change: { cyclesPerMinute: Number.POSITIVE_INFINITY }, field: 'cyclesPerMinute' },
  ])('when $field is impossible, then a CalculationError names it', ({ change, field }) => {
    expectCalculationError(() => crosshatchAngle({ bore: 4, spindleRpm: 150, strokeLength: 4, cyclesPerMinute: 31, ...change }), field);
  });

  it('when bore and stroke length are converted from inches to millimetres, then the angle is unchanged', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 8, noNaN: true }),
        fc.double({ min: 20, max: 500, noNaN: true }),
        fc.double({ min: 0.5, max: 8, noNaN: true }),
        fc.double({ min: 1, max: 300, noNaN: true }),
        (bore, spindleRpm, strokeLength, cyclesPerMinute) => {
          const a = crosshatchAngle({ bore, spindleRpm, strokeLength, cyclesPerMinute });
          const b = crosshatchAngle({ bore: inchesToMm(bore), spindleRpm, strokeLength: inchesToMm(strokeLength), cyclesPerMinute });
          expectNear(b.includedAngleDeg, a.includedAngleDeg, 1e-10); // derived: the angle depends on va/vt, a unitless ratio
        },
      ),
    );
  });
});

describe('crosshatchRate', () => {
  it('when a 4 in bore at 200 rev/min with a 4 in stroke should show 45°, then it needs 130.13 cycles/min', () => {
    const result = crosshatchRate({ bore: 4, spindleRpm: 200, strokeLength: 4, includedAngleDeg: 45 });
    expectNear(result.cyclesPerMinute, 130.1290284568573, 1e-9); // derived: f = π · 4 · 200 · tan(22.5°) / (2 · 4)
    expectNear(result.peripheralSpeed, 800 * Math.PI); // derived: vt = π · 4 · 200
  });

  it('when the rate is fed back into the angle, then the target angle returns', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 8, noNaN: true }),
        fc.double({ min: 20, max: 500, noNaN: true }),
        fc.double({ min: 0.5, max: 8, noNaN: true }),
        fc.double({ min: 1, max: 179, noNaN: true }),
        (bore, spindleRpm, strokeLength, includedAngleDeg) => {
          const { cyclesPerMinute } = crosshatchRate({ bore, spindleRpm, strokeLength, includedAngleDeg });
          const back = crosshatchAngle({ bore, spindleRpm, strokeLength, cyclesPerMinute });
          expectNear(back.includedAngleDeg, includedAngleDeg, 1e-9); // derived: crosshatchRate inverts crosshatchAngle
        },
      ),
    );
  });

  it.each([
    { includedAngleDeg: 0 },
    { includedAngleDeg: -10 },
    { includedAngleDeg: 180 },
    { includedAngleDeg: 200 },
    { includedAngleDeg: Number.NaN },
  ])('when the target angle is $includedAngleDeg°, then a CalculationError names the angle', ({ includedAngleDeg }) => {
    expectCalculationError(() => crosshatchRate({ bore: 4, spindleRpm: 200, strokeLength: 4, includedAngleDeg }), 'includedAngleDeg');
  });

  it('when the spindle is stopped, then a CalculationError names the speed', () => {
    expectCalculationError(() => crosshatchRate({ bore: 4, spindleRpm: 0, strokeLength: 4, includedAngleDeg: 45 }), 'spindleRpm');
  });
});

describe('TYPICAL_INCLUDED_ANGLES', () => {
  it('when the typical angles are read, then they match the common figures', () => {
    expect(TYPICAL_INCLUDED_ANGLES.general).toBe(45); // common practice (no published source)
    expect(TYPICAL_INCLUDED_ANGLES.castIron).toEqual({ min: 40, max: 60 }); // common practice (no published source)
    expect(TYPICAL_INCLUDED_ANGLES.race).toEqual({ min: 30, max: 45 }); // common practice (no published source)
  });
});
