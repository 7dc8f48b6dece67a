import { describe, it, expect } from 'vitest';
import { CalculationError } from '../../../shared/calc/errors';
import {
  GAUSSIAN_ALPHA,
  MIN_POINTS_PER_CUTOFF,
  gaussianFilterProblem,
  roughness,
  roughnessProfiles,
} from '../../../shared/calc/roughness';
import { roughnessRequestSchema } from '../../../shared/schemas/calculations';
import { evaluateInspection } from '../../../shared/calc/inspection-record';
import { finishInputSchema, inspectionInputSchema } from '../../../shared/schemas/inspection';
import { jobInput } from '../../factories';
import { expectWithin } from './expectations';

// Labels, as in shared/references.md ("Roughness filtering"):
// ISO 16610-21 Gaussian profile filter: weighting s(x) = (1/(αλc))·exp(−π(x/(αλc))²), α = √(ln 2/π);
// a sine of wavelength λ passes into the mean line with amplitude ratio a1/a0 = exp(−π(αλc/λ)²),
// so the roughness profile keeps 1 − exp(−π(αλc/λ)²) of it.

/** Share of a sine's amplitude left in the roughness profile. derived: 1 − exp(−π(αλc/λ)²) from the weighting function. */
function roughnessTransmission(wavelength: number, cutoff: number): number {
  return 1 - Math.exp(-Math.PI * ((GAUSSIAN_ALPHA * cutoff) / wavelength) ** 2);
}

/** A·sin(2πx/λ) sampled every `spacingUm` µm; λ in µm. */
function sine(n: number, spacingUm: number, wavelengthUm: number, amplitude: number): number[] {
  return Array.from({ length: n }, (_, j) => amplitude * Math.sin((2 * Math.PI * j * spacingUm) / wavelengthUm));
}

// A 0.25 mm cut-off sampled every 1 µm: 250 heights per cut-off; 8 cut-offs of trace (2 mm).
const SPACING = 1;
const CUTOFF_MM = 0.25;
const CUTOFF_UM = 250;
const N = 8 * CUTOFF_UM;
const gaussian = { kind: 'gaussian', cutoffMm: CUTOFF_MM } as const;

describe('Gaussian profile filter (ISO 16610-21)', () => {
  it('α is √(ln 2 / π) ≈ 0.4697', () => {
    expectWithin(GAUSSIAN_ALPHA, Math.sqrt(Math.LN2 / Math.PI), 1e-15); // source: ISO 16610-21, α = √(ln 2/π)
    expectWithin(GAUSSIAN_ALPHA, 0.4697, 1e-4); // source: shared/references.md "Roughness filtering" (α ≈ 0.4697)
  });

  it('when a sine has the wavelength of the cut-off, then the roughness profile keeps 50 % of its amplitude', () => {
    const A = 2;
    const result = roughness(sine(N, SPACING, CUTOFF_UM, A), SPACING, gaussian);
    const kept = result.ra / ((2 * A) / Math.PI); // derived: Ra of a sine of amplitude a over whole periods = 2a/π
    expect(roughnessTransmission(CUTOFF_UM, CUTOFF_UM)).toBeCloseTo(0.5, 12); // derived: 1 − exp(−π·α²) = 1 − exp(−ln 2) = ½
    expectWithin(kept, 0.5, 2e-3); // source: ISO 16610-21 — the mean line transmits 50 % at λc, so the roughness profile keeps 50 %
    expectWithin(result.rq / (A / Math.SQRT2), 0.5, 2e-3); // source: ISO 16610-21 (same 50 % point); derived: Rq of a sine = a/√2
  });

  it('when a sine is ten times shorter than the cut-off, then the roughness profile keeps it all (> 99 %)', () => {
    const A = 1.5;
    const expected = roughnessTransmission(CUTOFF_UM / 10, CUTOFF_UM); // derived: 1 − exp(−π(10α)²) = 1 − 2⁻¹⁰⁰
    expect(expected).toBeGreaterThan(0.99);
    const wave = sine(N, SPACING, CUTOFF_UM / 10, A);
    const result = roughness(wave, SPACING, gaussian);
    // Reference amplitude: Ra of the same sampled sine unfiltered (25 heights a period sample |sin| a little above 2/π).
    const kept = result.ra / roughness(wave, SPACING).ra;
    expectWithin(kept, expected, 1e-4); // source: ISO 16610-21 transmission a1/a0 = exp(−π(αλc/λ)²) at λ = λc/10
    expect(kept).toBeGreaterThan(0.99);
  });

  it('when a sine is twice the cut-off, then the roughness profile keeps 1 − 2^(−1/4) ≈ 15.9 % of it', () => {
    const A = 3;
    const result = roughness(sine(N, SPACING, 2 * CUTOFF_UM, A), SPACING, gaussian);
    const expected = roughnessTransmission(2 * CUTOFF_UM, CUTOFF_UM); // derived: 1 − exp(−π α²/4) = 1 − 2^(−1/4)
    expectWithin(expected, 1 - 2 ** -0.25, 1e-12);
    expectWithin(result.ra / ((2 * A) / Math.PI), expected, 3e-3); // source: ISO 16610-21 transmission formula at λ = 2λc
  });

  it('when a straight tilted line carries a sine, then the tilt is removed and the result is that of the sine alone', () => {
    const A = 0.8;
    const wave = sine(N, SPACING, CUTOFF_UM / 10, A);
    const tilted = wave.map((z, j) => z + 40 - 0.01 * j); // 20 µm of fall over the 2 mm trace, far above the roughness
    const alone = roughness(wave, SPACING, gaussian);
    const withTilt = roughness(tilted, SPACING, gaussian);
    for (const key of ['ra', 'rq', 'rz', 'rk', 'rpk', 'rvk', 'mr1', 'mr2'] as const) {
      expectWithin(withTilt[key], alone[key], 1e-9 * (1 + Math.abs(alone[key]))); // derived: a least-squares line is removed exactly (form removal, ISO 16610-21 / ISO 4287 primary profile levelling)
    }
    expectWithin(withTilt.ra, roughness(wave, SPACING).ra, 1e-4 * A); // derived: the λc/10 sine passes whole (source: ISO 16610-21 transmission 1 − 2⁻¹⁰⁰), so Ra is the unfiltered sine's
    expect(roughness(tilted, SPACING).ra).toBeGreaterThan(4); // derived: unfiltered, the tilt's ±10 µm ramp dominates Ra (ramp Ra = 10/2)
  });

  it('when the filter is Gaussian, then the answer names the filter, the ends dropped and the evaluation length', () => {
    const result = roughness(sine(N, SPACING, 25, 1), SPACING, gaussian);
    expect(result.filter.kind).toBe('gaussian');
    if (result.filter.kind !== 'gaussian') return;
    expect(result.filter.cutoffMm).toBe(CUTOFF_MM);
    // derived: 2000 heights = 8 cut-offs of 250; half a cut-off (125 heights) dropped at each end leaves 7 whole cut-offs
    expect(result.filter.samplingLengths).toBe(7);
    expectWithin(result.filter.evaluationLengthMm, 7 * CUTOFF_MM, 1e-12);
    expect(result.filter.evaluatedPoints).toBe(7 * CUTOFF_UM);
    expect(result.filter.trimmedStartMm).toBeGreaterThanOrEqual(CUTOFF_MM / 2);
    expect(result.filter.trimmedEndMm).toBeGreaterThanOrEqual(CUTOFF_MM / 2 - SPACING / 1000);
    // derived: dropped + evaluated = the traced length (n − 1)·spacing, each evaluated height standing for one spacing
    expectWithin(result.filter.trimmedStartMm + result.filter.evaluationLengthMm - SPACING / 1000 + result.filter.trimmedEndMm, ((N - 1) * SPACING) / 1000, 1e-12);
    expect(result.filter.formRemoval).toBe('least-squares line');
    expect(result.filter.rkFilter).toBe('ISO 13565-1 valley suppression');
    expect(result.filter.method.length).toBeGreaterThan(20);
  });

  it('when the mean line is worked out by a direct weighted sum, then it matches the filter at the first, middle and last evaluated heights', () => {
    // A repeatable irregular trace on a tilt; 0.25 mm cut-off at 1 µm, 2,000 heights.
    let state = 7;
    const random = () => ((state = (state * 16807) % 2147483647) / 2147483647) - 0.5;
    const heights = Array.from({ length: N }, (_, j) => 3 * random() + Math.sin(j / 40) + 0.004 * j);
    const profiles = roughnessProfiles(heights, SPACING, CUTOFF_MM);
    // Levelled by the least-squares line (derived: slope = Σ(x − x̄)(z − z̄) / Σ(x − x̄)²).
    const meanX = (N - 1) / 2;
    const meanZ = heights.reduce((a, b) => a + b, 0) / N;
    let sxz = 0;
    let sxx = 0;
    heights.forEach((z, x) => {
      sxz += (x - meanX) * (z - meanZ);
      sxx += (x - meanX) ** 2;
    });
    const level = heights.map((z, x) => z - meanZ - (sxz / sxx) * (x - meanX));
    // source: ISO 16610-21 weighting s(x) = (1/(αλc))·exp(−π(x/(αλc))²), summed over the heights within ±λc and divided by the weights used
    const meanLine = (i: number) => {
      let sum = 0;
      let weights = 0;
      for (let j = Math.max(0, i - CUTOFF_UM); j <= Math.min(N - 1, i + CUTOFF_UM); j++) {
        const w = Math.exp(-Math.PI * ((j - i) / (GAUSSIAN_ALPHA * CUTOFF_UM)) ** 2);
        sum += w * level[j];
        weights += w;
      }
      return sum / weights;
    };
    const last = profiles.roughness.length - 1;
    for (const k of [0, Math.floor(last / 2), last]) {
      const i = profiles.start + k;
      expectWithin(profiles.roughness[k], level[i] - meanLine(i), 1e-9); // derived: direct sum of the same weights (checks the FFT and its alignment)
    }
  });

  it('when a plateau carries narrow deep valleys, then the ISO 13565-1 mean line sits much nearer the plateau than the Gaussian one', () => {
    // Flat plateau at 0 with a valley 5 µm deep over 1 in 10 heights, every 20 µm (far shorter than the cut-off).
    const D = 5;
    const f = 0.1;
    const heights = Array.from({ length: N }, (_, j) => (j % 20 < 2 ? -D : 0));
    const profiles = roughnessProfiles(heights, SPACING, CUTOFF_MM);
    const plateauIndex = 10 + 20 * Math.floor(profiles.roughness.length / 40); // a plateau height in the middle
    // A plain Gaussian mean line averages the valleys in: it runs f·D below the plateau.
    expectWithin(profiles.roughness[plateauIndex], f * D, 1e-3); // derived: mean of the periodic profile = −f·D (source: ISO 16610-21: a period ≪ λc leaves only the mean in the mean line)
    // ISO 13565-1: heights below the first mean line (−f·D) are set to it, filtered again: −(1 − f)·0 − f·f·D.
    expectWithin(profiles.plateau[plateauIndex], f * f * D, 1e-3); // source: ISO 13565-1:1996 §4 (valley suppression, two filter passes); derived: second mean line = −f²·D
  });

  it('when the filter is Gaussian, then Rk, Rpk and Rvk come from the valley-suppressed profile', () => {
    const heights = Array.from({ length: N }, (_, j) => (j % 20 < 2 ? -5 : 0.2 * Math.sin((2 * Math.PI * j) / 10)));
    const result = roughness(heights, SPACING, gaussian);
    const profiles = roughnessProfiles(heights, SPACING, CUTOFF_MM);
    const fromPlateau = roughness(profiles.plateau);
    // derived: Rk, Rpk, Rvk, Mr1, Mr2 do not depend on where the zero of heights lies, so the ISO 13565-2 step on the
    // evaluated valley-suppressed profile gives the same figures
    for (const key of ['rk', 'rpk', 'rvk', 'mr1', 'mr2'] as const) expectWithin(result[key], fromPlateau[key], 1e-9);
    const fromGaussian = roughness(profiles.roughness);
    expectWithin(result.ra, fromGaussian.ra, 0.01); // derived: Ra is taken on the Gaussian roughness profile (its own mean line)
  });
});

describe('filter choice and refusals', () => {
  it('when no filter is given, then the result is that of { kind: none } and says so', () => {
    const heights = sine(1000, 1, 100, 1).map((z, j) => z + 0.001 * j);
    const plain = roughness(heights, 1);
    const none = roughness(heights, 1, { kind: 'none' });
    expect(none).toEqual(plain); // derived: the same computation
    expect(plain.filter.kind).toBe('none');
    expect(plain.filter.evaluatedPoints).toBe(1000);
  });

  it('when the trace is shorter than the cut-off needs, then a CalculationError says how long it must be', () => {
    // 1.5 cut-offs: less than half a cut-off at each end plus one whole cut-off (common practice: ISO 4288 traces a run-up and run-out beyond the evaluation length)
    const short = sine(375, SPACING, 25, 1);
    let caught: unknown;
    try {
      roughness(short, SPACING, gaussian);
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(CalculationError);
    expect((caught as CalculationError).field).toBe('heightsUm');
    expect((caught as CalculationError).message).toMatch(/cut-off of 0\.25 mm needs a trace of at least 0\.499 mm/); // derived: 125 + 250 + 125 heights at 1 µm span 499 µm
    expect((caught as CalculationError).message).toContain('This trace is 0.374 mm');
  });

  it('when the spacing gives too few heights per cut-off, then the cut-off is refused', () => {
    const problem = gaussianFilterProblem(10_000, 10, 0.25); // 25 heights per cut-off
    expect(problem?.field).toBe('filter.cutoffMm');
    expect(problem?.message).toContain(`at least ${MIN_POINTS_PER_CUTOFF}`);
    expect(gaussianFilterProblem(10_000, 1, 0.25)).toBeUndefined();
  });

  it('when a Gaussian filter has no spacing, then the spacing is asked for', () => {
    expect(() => roughness(sine(N, 1, 25, 1), undefined, gaussian)).toThrow(CalculationError);
  });

  it('when a request leaves the filter out, then it means none; a too-short trace is refused beside its field', () => {
    const heightsUm = sine(375, 1, 25, 1);
    const parsed = roughnessRequestSchema.parse({ heightsUm, spacingUm: 1 });
    expect(parsed.filter).toBeUndefined();
    expect(roughness(parsed.heightsUm, parsed.spacingUm, parsed.filter).filter.kind).toBe('none');
    const refused = roughnessRequestSchema.safeParse({ heightsUm, spacingUm: 1, filter: gaussian });
    expect(refused.success).toBe(false);
    expect(refused.error?.issues[0].path).toEqual(['heightsUm']);
    expect(refused.error?.issues[0].message).toMatch(/needs a trace of at least/);
    const badCutoff = roughnessRequestSchema.safeParse({ heightsUm, spacingUm: 1, filter: { kind: 'gaussian', cutoffMm: 0 } });
    expect(badCutoff.error?.issues[0].path).toEqual(['filter', 'cutoffMm']);
  });

  it('when an inspection trace asks for a Gaussian filter it is too short for, then finish.heightsUm is refused', () => {
    const refused = finishInputSchema.safeParse({ mode: 'profile', heightsUm: sine(375, 1, 25, 1), spacingUm: 1, filter: gaussian });
    expect(refused.success).toBe(false);
    expect(refused.error?.issues[0].path).toEqual(['heightsUm']);
  });

  it('when an inspection record carries a trace with the Gaussian filter, then its finish is the filtered one and names the filter', () => {
    const pair = (thrust: number, axial: number) => ({ thrust, axial });
    const cylinder = { top: pair(4.031, 4.031), middle: pair(4.031, 4.031), bottom: pair(4.031, 4.031), piston: 4.028 };
    const heightsUm = sine(N, SPACING, CUTOFF_UM / 10, 0.5).map((z, j) => z + 10 - 0.01 * j); // roughness on a tilt
    const record = (filter?: { kind: 'gaussian'; cutoffMm: number }) =>
      inspectionInputSchema.parse({
        conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 20, torquePlate: false },
        cylinders: [cylinder],
        finish: { mode: 'profile', heightsUm, spacingUm: SPACING, ...(filter ? { filter } : {}) },
        signedOffBy: 'Test Shop',
      });
    const spec = jobInput({ finishRaMaxUm: 0.5 });
    const filtered = evaluateInspection(record(gaussian), spec).finish!;
    expect(filtered.filter).toMatchObject({ kind: 'gaussian', cutoffMm: CUTOFF_MM, samplingLengths: 7 });
    expectWithin(filtered.raUm, roughness(heightsUm, SPACING, gaussian).ra, 1e-12); // derived: the same library call
    expectWithin(filtered.raUm, roughness(sine(N, SPACING, CUTOFF_UM / 10, 0.5), SPACING).ra, 1e-4); // source: ISO 16610-21 transmission ≈ 1 at λc/10; derived: the tilt removed
    const unfiltered = evaluateInspection(record(), spec).finish!;
    expect(unfiltered.filter?.kind).toBe('none'); // a record that does not say is worked unfiltered, as before
    expectWithin(unfiltered.raUm, roughness(heightsUm, SPACING).ra, 1e-12); // derived: the same library call, no filter
  });
});
