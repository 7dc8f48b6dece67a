import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  MIN_PROFILE_POINTS,
  amplitudeParameters,
  materialRatioCurve,
  materialRatioParameters,
  roughness,
} from '../../../shared/calc/roughness';
import { expectCalculationError, expectWithin } from './expectations';

/** A·sin(2πj/P): whole periods when n is a multiple of P; peaks sampled exactly when P is a multiple of 4. */
function sine(n: number, period: number, amplitude: number): number[] {
  return Array.from({ length: n }, (_, j) => amplitude * Math.sin((2 * Math.PI * j) / period));
}

/** A symmetric triangle wave of amplitude A, sampled mid-cell so no sample sits on a corner. */
function triangle(n: number, period: number, amplitude: number): number[] {
  return Array.from({ length: n }, (_, j) => {
    const t = ((j + 0.5) / period) % 1;
    return t < 0.5 ? -amplitude + 4 * amplitude * t : 3 * amplitude - 4 * amplitude * t;
  });
}

/**
 * A plateau-and-valley profile built so its material-ratio curve is known:
 * 100 samples, 10 peaks at +3 µm, a core of 80 samples on the line
 * z = 1 − 0.02·Mr (Mr in %), 10 valleys at −4 µm; mixed into a non-sorted order.
 */
function plateauProfile(): number[] {
  const sorted = Array.from({ length: 100 }, (_, i) => {
    if (i < 10) return 3;
    if (i >= 90) return -4;
    return 1 - 0.02 * (i + 0.5);
  });
  // A fixed shuffle: 37 is coprime with 100, so i ↦ 37·i mod 100 visits every sample once.
  return sorted.map((_, i) => sorted[(37 * i) % 100]);
}

describe('amplitudeParameters', () => {
  const A = 3;
  const sineProfile = sine(100_000, 1000, A);
  const triangleProfile = triangle(100_000, 1000, A);

  it('when the profile is a sine of amplitude A over whole periods, then Ra = 2A/π, Rq = A/√2 and Rz = 2A', () => {
    const result = amplitudeParameters(sineProfile);
    expectWithin(result.ra, (2 * A) / Math.PI, 1e-5 * A); // derived: Ra = (1/l)∫|A sin x| dx = 2A/π (sampling error ~ 1e-6)
    expectWithin(result.rq, A / Math.SQRT2, 1e-12 * A); // derived: Rq = √((1/l)∫A² sin² x dx) = A/√2 (exact for whole periods)
    expectWithin(result.rz, 2 * A, 1e-12 * A); // derived: each segment holds whole periods with the peak and trough sampled: Rz = A − (−A)
    expectWithin(result.mean, 0, 1e-12 * A); // derived: a sine over whole periods has zero mean
  });

  it('when the profile is a triangle wave of amplitude A, then Ra = A/2 and Rq = A/√3', () => {
    const result = amplitudeParameters(triangleProfile);
    expectWithin(result.ra, A / 2, 1e-5 * A); // derived: Ra of a linear ramp from −A to A = A/2
    expectWithin(result.rq, A / Math.sqrt(3), 1e-5 * A); // derived: Rq of a linear ramp from −A to A = A/√3
  });

  it('when the profile is shifted up by a constant, then Ra, Rq and Rz are unchanged', () => {
    const shifted = sineProfile.map((z) => z + 12.5);
    const a = amplitudeParameters(sineProfile);
    const b = amplitudeParameters(shifted);
    expectWithin(b.ra, a.ra, 1e-9); // derived: parameters are measured from the mean line
    expectWithin(b.rq, a.rq, 1e-9); // derived: parameters are measured from the mean line
    expectWithin(b.rz, a.rz, 1e-9); // derived: peak-to-valley ignores an offset
    expectWithin(b.mean, a.mean + 12.5, 1e-9); // derived: the mean line moves with the offset
  });

  it('when the five segments have different peak-to-valley heights, then Rz is their mean', () => {
    // Ten samples, two per segment: heights of segment k are 0 and k + 1.
    const profile = [0, 1, 0, 2, 0, 3, 0, 4, 0, 5];
    expectWithin(amplitudeParameters(profile).rz, 3, 1e-12); // derived: (1 + 2 + 3 + 4 + 5) / 5
  });
});

describe('materialRatioParameters', () => {
  it('when the profile is a triangle wave of amplitude A, then Rk = 2A, Rpk = Rvk = 0, Mr1 = 0 % and Mr2 = 100 %', () => {
    const A = 3;
    const result = materialRatioParameters(triangle(100_000, 1000, A));
    expectWithin(result.rk, 2 * A, 1e-3 * A); // derived: the material-ratio curve is a straight line from A to −A
    expectWithin(result.rpk, 0, 1e-3 * A); // derived: no material above the core band
    expectWithin(result.rvk, 0, 1e-3 * A); // derived: no material below the core band
    expectWithin(result.mr1, 0, 0.1); // derived: the curve meets the band's top at 0 %
    expectWithin(result.mr2, 100, 0.1); // derived: the curve meets the band's bottom at 100 %
    expect(Number.isNaN(result.rpk) || Number.isNaN(result.rvk)).toBe(false);
  });

  it('when peaks and valleys sit outside a straight core, then Rk, Rpk, Rvk, Mr1 and Mr2 follow the equal-area construction', () => {
    const result = materialRatioParameters(plateauProfile());
    expectWithin(result.rk, 2, 1e-9); // derived: core line z = 1 − 0.02·Mr runs from 1 at 0 % to −1 at 100 %
    expectWithin(result.mr1, 10, 1e-9); // derived: 10 of 100 samples lie above the band's top
    expectWithin(result.mr2, 90, 1e-9); // derived: 10 of 100 samples lie below the band's bottom
    expectWithin(result.construction.a1, 20, 1e-9); // derived: A1 = 10 samples × (3 − 1) µm × 1 %
    expectWithin(result.construction.a2, 30, 1e-9); // derived: A2 = 10 samples × (−1 − (−4)) µm × 1 %
    expectWithin(result.rpk, 4, 1e-9); // derived: Rpk = 2·A1/Mr1 = 2·20/10
    expectWithin(result.rvk, 6, 1e-9); // derived: Rvk = 2·A2/(100 − Mr2) = 2·30/10
    expectWithin(result.construction.secantFrom, 10.5, 1e-9); // derived: first core sample at (10 + ½)/100; ties keep the first secant
    expectWithin(result.construction.secantTo, 50.5, 1e-9); // derived: 40 samples further on
    // Heights are from the mean line: mean = (10·3 + 0 + 10·(−4)) / 100 = −0.1, so the band is 1.1 to −0.9.
    expectWithin(result.construction.top, 1.1, 1e-9); // derived: 1 − (−0.1)
    expectWithin(result.construction.bottom, -0.9, 1e-9); // derived: −1 − (−0.1)
  });

  it('when half the profile is a plateau and half a deep valley, then Rk and Rpk are 0 and Rvk is twice the mean valley depth', () => {
    const profile = Array.from({ length: 100 }, (_, i) => (i % 2 === 0 ? 1 : -1));
    const result = materialRatioParameters(profile);
    expectWithin(result.rk, 0, 1e-12); // derived: the flattest 40 % secant lies on the plateau, gradient 0
    expectWithin(result.rpk, 0, 1e-12); // derived: Mr1 = 0 ⇒ Rpk = 0
    expectWithin(result.mr1, 0, 1e-12); // derived: nothing above the plateau
    expectWithin(result.mr2, 50, 1e-12); // derived: half the samples lie below the band
    expectWithin(result.rvk, 4, 1e-12); // derived: A2 = 50 × 2 µm × 1 % = 100; Rvk = 2·100/50
  });

  it('when the profile is flat, then every parameter is 0, Mr1 = 0 % and Mr2 = 100 %, with no NaN', () => {
    const result = roughness(new Array(50).fill(7.5));
    for (const key of ['ra', 'rq', 'rz', 'rk', 'rpk', 'rvk'] as const) {
      expect(result[key]).toBe(0); // derived: no height varies
    }
    expect(result.mr1).toBe(0); // derived: nothing above the band
    expect(result.mr2).toBe(100); // derived: nothing below the band
  });
});

describe('roughness', () => {
  it('when a profile is given, then it combines the amplitude and material-ratio parameters', () => {
    const profile = plateauProfile();
    const all = roughness(profile, 0.5);
    const amplitude = amplitudeParameters(profile);
    const ratio = materialRatioParameters(profile);
    expect(all.ra).toBe(amplitude.ra); // derived: the same computation
    expect(all.rz).toBe(amplitude.rz); // derived: the same computation
    expect(all.rk).toBe(ratio.rk); // derived: the same computation
    expect(all.mr2).toBe(ratio.mr2); // derived: the same computation
    expect(all.points).toBe(100); // derived: the profile's length
    expect(all.lengthUm).toBe(49.5); // derived: (100 − 1) × 0.5 µm
  });

  it('when the spacing is left out, then no length is reported', () => {
    expect(roughness(plateauProfile()).lengthUm).toBeUndefined();
  });

  it('when the profile is accepted as a typed array, then it gives the same answer as a plain array', () => {
    const profile = plateauProfile();
    expect(roughness(Float64Array.from(profile))).toEqual(roughness(profile));
  });

  it.each([
    { case: 'empty', heights: [], field: 'heightsUm' },
    { case: 'one point too short', heights: new Array(MIN_PROFILE_POINTS - 1).fill(1), field: 'heightsUm' },
    { case: 'holding NaN', heights: [1, 2, 3, Number.NaN, 5, 6, 7, 8, 9, 10], field: 'heightsUm.3' },
    { case: 'holding Infinity', heights: [1, 2, 3, 4, 5, 6, 7, 8, 9, Number.POSITIVE_INFINITY], field: 'heightsUm.9' },
  ])('when the profile is $case, then a CalculationError names $field', ({ heights, field }) => {
    expectCalculationError(() => roughness(heights), field);
    expectCalculationError(() => amplitudeParameters(heights), field);
    expectCalculationError(() => materialRatioParameters(heights), field);
  });

  it('when the spacing is zero, then a CalculationError names it', () => {
    expectCalculationError(() => roughness(plateauProfile(), 0), 'spacingUm');
  });

  // Heights on a 0.01 nm grid within ±50 µm: finer than any instrument, and free of the
  // subnormal numbers (below 1e-300) whose squares underflow to zero.
  const height = fc.integer({ min: -5_000_000, max: 5_000_000 }).map((i) => i / 1e5);
  const profiles = fc.array(height, { minLength: MIN_PROFILE_POINTS, maxLength: 300 });
  const factors = fc.double({ min: 1e-3, max: 1e3, noNaN: true });

  it('when the profile amplitude is multiplied by a factor, then Ra, Rq, Rz, Rk, Rpk and Rvk scale by it and Mr1, Mr2 do not change', () => {
    fc.assert(
      fc.property(profiles, factors, (heights, factor) => {
        const a = roughness(heights);
        const b = roughness(heights.map((z) => z * factor));
        const tolerance = (value: number) => 1e-9 * factor * (Math.abs(value) + 100);
        for (const key of ['ra', 'rq', 'rz', 'rk', 'rpk', 'rvk'] as const) {
          expectWithin(b[key], factor * a[key], tolerance(a[key])); // derived: each is a height, linear in z
        }
        expectWithin(b.mr1, a.mr1, 1e-9); // derived: a material ratio is a share of samples, unchanged by scaling
        expectWithin(b.mr2, a.mr2, 1e-9); // derived: a material ratio is a share of samples, unchanged by scaling
      }),
    );
  });

  it('when two heights differ only in their last bits, then rescaling does not move a sample across the band edge', () => {
    // Found by the property above: the mean line turns the zeros and the −1e-25 into values one
    // rounding step apart, which a factor of 0.001 then merged. Mr1 must not jump by 1/11.
    const heights = [-1.0339757656912846e-25, 0, 0, 0, -2.0432363333194095e-8, 0, 0, 0, 0, 0, 0];
    const a = roughness(heights);
    const b = roughness(heights.map((z) => z * 0.001));
    expect(b.mr1).toBe(a.mr1); // derived: a material ratio is a share of samples, unchanged by scaling
    expect(b.mr2).toBe(a.mr2); // derived: a material ratio is a share of samples, unchanged by scaling
  });

  it('when any profile is given, then no parameter is NaN or negative and 0 ≤ Mr1 ≤ Mr2 ≤ 100', () => {
    fc.assert(
      fc.property(profiles, (heights) => {
        const result = roughness(heights);
        for (const key of ['ra', 'rq', 'rz', 'rk', 'rpk', 'rvk'] as const) {
          expect(result[key]).toBeGreaterThanOrEqual(0); // derived: heights and areas are non-negative
        }
        expect(result.mr1).toBeGreaterThanOrEqual(0); // derived: a share of samples
        expect(result.mr1).toBeLessThanOrEqual(result.mr2); // derived: the band's top lies above its bottom
        expect(result.mr2).toBeLessThanOrEqual(100); // derived: a share of samples
        expect(result.rq).toBeGreaterThanOrEqual(result.ra * (1 - 1e-12)); // derived: Rq ≥ Ra (quadratic mean ≥ arithmetic mean)
      }),
    );
  });
});

describe('materialRatioCurve', () => {
  it('when a curve of 5 points is asked for, then it runs from the highest height at 0 % to the lowest at 100 %', () => {
    const curve = materialRatioCurve(plateauProfile(), 5);
    expect(curve.map((point) => point.mr)).toEqual([0, 25, 50, 75, 100]); // derived: evenly spaced ratios
    expectWithin(curve[0].height, 3.1, 1e-12); // derived: peak 3 − mean (−0.1)
    expectWithin(curve[4].height, -3.9, 1e-12); // derived: valley −4 − mean (−0.1)
    expectWithin(curve[2].height, 1 - 0.02 * 50.5 + 0.1, 1e-12); // derived: sample 50 of the core line, from the mean line
  });

  it('when any profile is drawn, then the curve never rises', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -50, max: 50, noNaN: true }), { minLength: MIN_PROFILE_POINTS, maxLength: 200 }), (heights) => {
        const curve = materialRatioCurve(heights, 51);
        for (let i = 1; i < curve.length; i++) expect(curve[i].height).toBeLessThanOrEqual(curve[i - 1].height); // derived: heights sorted high to low
      }),
    );
  });

  it('when fewer than 2 chart points are asked for, then a CalculationError names samples', () => {
    expectCalculationError(() => materialRatioCurve(plateauProfile(), 1), 'samples');
  });
});
