import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  type CompressionInput,
  clearanceVolume,
  compressionRatio,
  cylinderVolumeCc,
  displacement,
  dynamicCompression,
  machiningEffect,
  pistonPosition,
} from '../../../shared/calc/engine';
import { CalculationError } from '../../../shared/calc/errors';
import { inchesToMm } from '../../../shared/calc/units';
import { circleTrack, expectCalculationError, expectRelativelyNear } from './expectations';

function toMillimetres(input: CompressionInput): CompressionInput {
  return {
    ...input,
    unit: 'mm',
    bore: inchesToMm(input.bore),
    stroke: inchesToMm(input.stroke),
    deckClearance: inchesToMm(input.deckClearance),
    gasketBore: inchesToMm(input.gasketBore),
    gasketThickness: inchesToMm(input.gasketThickness),
  };
}

describe('cylinderVolumeCc', () => {
  it('when the cylinder holds one cubic inch, then it is 16.387064 cc', () => {
    // A 1 in diameter cylinder 4/π in tall holds π/4 · 1 · 4/π = 1 in³.
    expectRelativelyNear(cylinderVolumeCc(1, 4 / Math.PI, 'in'), 16.387064); // derived: π/4 · d² · h with d = 1, h = 4/π; 1 in³ = 16.387064 cc
  });

  it('when lengths are in millimetres, then cubic millimetres become cc', () => {
    expectRelativelyNear(cylinderVolumeCc(10, 40 / Math.PI, 'mm'), 1); // derived: π/4 · 10² · 40/π = 1000 mm³ = 1 cc
  });
});

describe('displacement', () => {
  it('when the bore is 10 cm, the stroke 5 cm and there are four cylinders, then it is about 1,570 cc', () => {
    const result = displacement({ unit: 'mm', bore: 100, stroke: 50, cylinders: 4 });
    expect(Math.abs(result.cc - 1570)).toBeLessThan(1); // source: Wikipedia, "Engine displacement", Definition section (worked example, rounded to 1,570 cc)
    expect(Math.abs(result.litres - 1.57)).toBeLessThan(0.001); // source: Wikipedia, "Engine displacement", Definition section (worked example, 1.57 litres)
    expectRelativelyNear(result.cc, 1570.7963267948965); // derived: π/4 · 100² · 50 · 4 mm³ / 1000
  });

  it('when the bore is 4.000 in, the stroke 3.48 in and there are eight cylinders, then the three units agree', () => {
    const result = displacement({ unit: 'in', bore: 4, stroke: 3.48, cylinders: 8 });
    expectRelativelyNear(result.cubicInches, 349.8477579037594); // derived: π/4 · 4² · 3.48 · 8
    expectRelativelyNear(result.cc, 5732.97759902541); // derived: 349.8477579 in³ × 16.387064
    expectRelativelyNear(result.litres, 5.73297759902541); // derived: cc / 1000
  });

  it.each([
    { bore: 0, stroke: 3, cylinders: 4, field: 'bore' },
    { bore: -4, stroke: 3, cylinders: 4, field: 'bore' },
    { bore: 4, stroke: Number.NaN, cylinders: 4, field: 'stroke' },
    { bore: 4, stroke: 3, cylinders: 0, field: 'cylinders' },
    { bore: 4, stroke: 3, cylinders: 2.5, field: 'cylinders' },
  ])('when $field is impossible ($bore, $stroke, $cylinders), then a CalculationError names it', ({ field, ...rest }) => {
    expectCalculationError(() => displacement({ unit: 'in', ...rest }), field);
  });

  it('when every length is converted from inches to millimetres, then the volume is unchanged', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 10, noNaN: true }),
        fc.double({ min: 0.5, max: 10, noNaN: true }),
        fc.integer({ min: 1, max: 16 }),
        (bore, stroke, cylinders) => {
          const inches = displacement({ unit: 'in', bore, stroke, cylinders });
          const mm = displacement({ unit: 'mm', bore: inchesToMm(bore), stroke: inchesToMm(stroke), cylinders });
          expectRelativelyNear(mm.cc, inches.cc, 1e-12); // derived: 1 in = 25.4 mm exactly, so in³ and mm³ describe the same volume
        },
      ),
    );
  });
});

describe('compressionRatio', () => {
  it('when given the Circle Track worked example, then the ratio is 9.01', () => {
    const result = compressionRatio(circleTrack);
    expect(Math.abs(result.ratio - 9.01)).toBeLessThan(0.01); // source: Circle Track, "Compression Ratio Rules" (worked example, 9.01)
  });

  it('when given the Circle Track inputs, then each volume follows from π/4 · d² · h', () => {
    const result = compressionRatio(circleTrack);
    expectRelativelyNear(result.sweptCc, 716.6221998781763); // derived: π/4 · 4² · 3.48 in³ × 16.387064
    expectRelativelyNear(result.gasketCc, 4.1185183901044615); // derived: π/4 · 4² · 0.020 in³ × 16.387064
    expectRelativelyNear(result.deckCc, 10.296295975261152); // derived: π/4 · 4² · 0.050 in³ × 16.387064
    expectRelativelyNear(result.clearanceCc, 89.4148143653656); // derived: 70 + 5 + 4.1185 + 10.2963
    expectRelativelyNear(result.ratio, 9.014580189697922); // derived: (716.6222 + 89.4148) / 89.4148
  });

  it('when the piston has a 5 cc dome instead of a 5 cc dish, then the clearance falls by 10 cc and the ratio rises', () => {
    const result = compressionRatio({ ...circleTrack, pistonCc: -5 });
    expectRelativelyNear(result.clearanceCc, 79.4148143653656); // derived: 70 − 5 + 4.1185 + 10.2963
    expectRelativelyNear(result.ratio, 10.023784864385576); // derived: (716.6222 + 79.4148) / 79.4148
  });

  it('when the piston stands above the deck, then the deck volume is negative', () => {
    const result = compressionRatio({ ...circleTrack, deckClearance: -0.005 });
    expectRelativelyNear(result.deckCc, -1.0296295975261152); // derived: π/4 · 4² · (−0.005) in³ × 16.387064
    expect(result.ratio).toBeGreaterThan(9.0146); // derived: smaller clearance than the 9.0146 example gives a higher ratio
  });

  it('when the volumes leave no space above the piston, then a CalculationError names the dome', () => {
    const domed = { ...circleTrack, pistonCc: -100 };
    expect(clearanceVolume(domed).clearanceCc).toBeLessThan(0); // derived: 70 − 100 + 4.1185 + 10.2963 = −15.585
    expect(() => compressionRatio(domed)).toThrow(/no space above the piston/);
    expectCalculationError(() => compressionRatio(domed), 'pistonCc');
  });

  it('when every clearance volume is zero, then it is rejected rather than divided by zero', () => {
    const none = { ...circleTrack, chamberCc: 0, pistonCc: 0, deckClearance: 0, gasketThickness: 0 };
    expect(clearanceVolume(none).clearanceCc).toBe(0); // derived: 0 + 0 + π/4 · d² · 0 + π/4 · d² · 0
    expectCalculationError(() => compressionRatio(none), 'deckClearance');
  });

  it.each([
    { change: { bore: 0 }, field: 'bore' },
    { change: { stroke: -1 }, field: 'stroke' },
    { change: { chamberCc: -1 }, field: 'chamberCc' },
    { change: { pistonCc: Number.POSITIVE_INFINITY }, field: 'pistonCc' },
    { change: { deckClearance: Number.NaN }, field: 'deckClearance' },
    { change: { gasketBore: 0 }, field: 'gasketBore' },
    { change: { gasketThickness: -0.01 }, field: 'gasketThickness' },
  ])('when $field is impossible, then a CalculationError names it', ({ change, field }) => {
    expectCalculationError(() => compressionRatio({ ...circleTrack, ...change }), field);
  });

  it('when every length is converted from inches to millimetres, then the ratio and volumes are unchanged', () => {
    fc.assert(
      fc.property(
        fc.record({
          bore: fc.double({ min: 2, max: 6, noNaN: true }),
          stroke: fc.double({ min: 2, max: 6, noNaN: true }),
          chamberCc: fc.double({ min: 30, max: 120, noNaN: true }),
          pistonCc: fc.double({ min: -10, max: 30, noNaN: true }),
          deckClearance: fc.double({ min: -0.02, max: 0.06, noNaN: true }),
          gasketThickness: fc.double({ min: 0, max: 0.08, noNaN: true }),
        }),
        (values) => {
          const inches: CompressionInput = { unit: 'in', gasketBore: values.bore + 0.03, ...values };
          const a = compressionRatio(inches);
          const b = compressionRatio(toMillimetres(inches));
          expectRelativelyNear(b.ratio, a.ratio, 1e-10); // derived: 1 in = 25.4 mm exactly; the ratio is unitless
          expectRelativelyNear(b.clearanceCc, a.clearanceCc, 1e-10); // derived: 1 in³ = 16.387064 cc exactly
        },
      ),
    );
  });
});

describe('machiningEffect', () => {
  const engine = { ...circleTrack, cylinders: 8 };

  it('when the bore is taken 0.030 in over, then displacement and ratio rise as π/4 · d² says', () => {
    const result = machiningEffect(engine, { overbore: 0.03 });
    expectRelativelyNear(result.after.bore, 4.03); // derived: 4.000 + 0.030
    expectRelativelyNear(result.after.displacement.cc, 5819.294743000736); // derived: π/4 · 4.030² · 3.48 · 8 in³ × 16.387064
    expectRelativelyNear(result.after.compression.clearanceCc, 89.56983797164314); // derived: 70 + 5 + 4.1185 + π/4 · 4.030² · 0.050 × 16.387064
    expectRelativelyNear(result.after.compression.ratio, 9.121169573907043); // derived: (727.4118 + 89.5698) / 89.5698
    expectRelativelyNear(result.before.compression.ratio, 9.014580189697922); // derived: the unchanged example
    expectRelativelyNear(result.change.cc, 5819.294743000736 - 5732.97759902541); // derived: after − before
    expect(result.boreExceedsGasket).toBe(true); // derived: 4.030 > 4.000 gasket bore
  });

  it('when the deck is cut 0.010 in, then the deck clearance falls by 0.010 in and the ratio rises', () => {
    const result = machiningEffect(engine, { deckCut: 0.01 });
    expectRelativelyNear(result.after.deckClearance, 0.04); // derived: 0.050 − 0.010
    expectRelativelyNear(result.after.compression.clearanceCc, 87.35555517031338); // derived: 89.4148 − π/4 · 4² · 0.010 × 16.387064
    expectRelativelyNear(result.after.compression.ratio, 9.203510337505252); // derived: (716.6222 + 87.3556) / 87.3556
    expectRelativelyNear(result.change.cc, 0); // derived: a deck cut does not change bore or stroke
    expect(result.boreExceedsGasket).toBe(false); // derived: 4.000 is not larger than the 4.000 gasket bore
  });

  it('when nothing is machined, then before and after are the same', () => {
    const result = machiningEffect(engine, {});
    expect(result.change.ratio).toBe(0); // derived: identical inputs
    expect(result.after).toEqual(result.before); // derived: identical inputs
  });

  it('when a deck cut leaves no clearance volume, then a CalculationError is thrown', () => {
    expect(() => machiningEffect({ ...engine, chamberCc: 5, pistonCc: -5, gasketThickness: 0 }, { deckCut: 0.06 })).toThrow(CalculationError);
  });

  it('when the overbore or deck cut is negative, then a CalculationError names it', () => {
    expect(() => machiningEffect(engine, { overbore: -0.01 })).toThrow(/Overbore/);
    expect(() => machiningEffect(engine, { deckCut: -0.01 })).toThrow(/Deck cut/);
  });

  it('when the inputs and cuts are converted to millimetres, then the ratios are unchanged', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 0.06, noNaN: true }),
        fc.double({ min: 0, max: 0.02, noNaN: true }),
        (overbore, deckCut) => {
          const a = machiningEffect(engine, { overbore, deckCut });
          const b = machiningEffect(
            { ...toMillimetres(engine), cylinders: 8 },
            { overbore: inchesToMm(overbore), deckCut: inchesToMm(deckCut) },
          );
          expectRelativelyNear(b.after.compression.ratio, a.after.compression.ratio, 1e-10); // derived: 1 in = 25.4 mm exactly
          expectRelativelyNear(b.after.displacement.cc, a.after.displacement.cc, 1e-10); // derived: 1 in³ = 16.387064 cc exactly
        },
      ),
    );
  });
});

describe('pistonPosition', () => {
  const stroke = 3.48;
  const rodLength = 5.7;
  const r = stroke / 2;

  it('when the crank is at 0°, 90° and 180°, then the piston is at top, l + r − √(l² − r²), and a full stroke down', () => {
    expect(pistonPosition({ stroke, rodLength, crankAngleDeg: 0 })).toBe(0); // derived: Heywood §2.2, x(0) = r·0 + l − l
    expectRelativelyNear(pistonPosition({ stroke, rodLength, crankAngleDeg: 90 }), rodLength + r - Math.sqrt(rodLength ** 2 - r ** 2), 1e-12); // derived: Heywood §2.2 at θ = 90°
    expectRelativelyNear(pistonPosition({ stroke, rodLength, crankAngleDeg: 180 }), stroke, 1e-12); // derived: Heywood §2.2, x(180°) = 2r
  });

  it('when the rod is not longer than half the stroke, then a CalculationError names the rod', () => {
    expectCalculationError(() => pistonPosition({ stroke, rodLength: r, crankAngleDeg: 90 }), 'rodLength');
  });
});

describe('dynamicCompression', () => {
  const engine = { ...circleTrack, rodLength: 5.7 };

  it('when the intake closes at bottom dead centre, then the dynamic ratio is the static ratio', () => {
    const result = dynamicCompression({ ...engine, intakeClosingDegAbdc: 0 });
    expectRelativelyNear(result.staticRatio, compressionRatio(circleTrack).ratio); // derived: the same clearance and swept volume
    expectRelativelyNear(result.dynamicRatio, result.staticRatio, 1e-12); // derived: x(180°) = stroke
    expectRelativelyNear(result.effectiveStroke, circleTrack.stroke, 1e-12); // derived: Heywood §2.2, x(180°) = 2r
  });

  it('when the intake closes 60° after bottom dead centre, then the effective stroke follows the slider-crank equation', () => {
    const result = dynamicCompression({ ...engine, intakeClosingDegAbdc: 60 });
    const r = circleTrack.stroke / 2;
    const theta = (240 * Math.PI) / 180;
    const x = r * (1 - Math.cos(theta)) + 5.7 - Math.sqrt(5.7 ** 2 - r ** 2 * Math.sin(theta) ** 2);
    expectRelativelyNear(result.effectiveStroke, x, 1e-12); // derived: Heywood §2.2 at θ = 180° + 60°
    const clearance = compressionRatio(circleTrack).clearanceCc;
    expectRelativelyNear(result.dynamicRatio, (cylinderVolumeCc(4, x, 'in') + clearance) / clearance, 1e-12); // derived: (π/4 · d² · x + Vc) / Vc
    expect(result.dynamicRatio).toBeLessThan(result.staticRatio);
  });

  it.each([
    { change: { rodLength: 1.74 }, field: 'rodLength' },
    { change: { intakeClosingDegAbdc: -1 }, field: 'intakeClosingDegAbdc' },
    { change: { intakeClosingDegAbdc: 181 }, field: 'intakeClosingDegAbdc' },
    { change: { bore: 0 }, field: 'bore' },
  ])('when $field is impossible, then a CalculationError names it', ({ change, field }) => {
    expectCalculationError(() => dynamicCompression({ ...engine, intakeClosingDegAbdc: 60, ...change }), field);
  });

  it('when the intake closes later, then the dynamic ratio never rises above the static ratio and falls as the angle grows', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 180, noNaN: true }),
        fc.double({ min: 0, max: 180, noNaN: true }),
        fc.double({ min: 4.5, max: 7, noNaN: true }),
        (a, b, rodLength) => {
          const [early, late] = a <= b ? [a, b] : [b, a];
          const first = dynamicCompression({ ...circleTrack, rodLength, intakeClosingDegAbdc: early });
          const second = dynamicCompression({ ...circleTrack, rodLength, intakeClosingDegAbdc: late });
          // Near bottom centre the piston barely moves, so two angles a millionth of a degree apart may differ
          // in the last bits of a double (fast-check found 0° against 1.4e-6°): allow one part in 10¹².
          const roundOff = 1 + 1e-12;
          expect(first.dynamicRatio).toBeLessThanOrEqual(first.staticRatio * roundOff); // derived: x ≤ stroke for 180° ≤ θ ≤ 360°
          expect(second.dynamicRatio).toBeLessThanOrEqual(first.dynamicRatio * roundOff); // derived: x falls from 180° to 360°
        },
      ),
    );
  });
});
