import { describe, expect, it } from 'vitest';
import { judgeMax, judgeMin, judgeRange } from '../../../shared/calc/decision-rule';
import { celsiusToFahrenheit, fahrenheitToCelsius, toReferenceTemperature } from '../../../shared/calc/thermal';

describe('decision rules', () => {
  it('when guarded acceptance judges a value against a 0.0005 in maximum with 0.0001 in uncertainty, then 0.00035 conforms, 0.00045 is not proven and 0.00065 fails', () => {
    // source: ISO 14253-1 decision rules as summarised in references.md — conformance zone = limit − U (0.0004),
    // non-conformance only beyond limit + U (0.0006), the uncertainty range between is not proven.
    expect(judgeMax(0.00035, 0.0005, 'guarded', 0.0001)).toBe('conforms');
    expect(judgeMax(0.00045, 0.0005, 'guarded', 0.0001)).toBe('not-proven');
    expect(judgeMax(0.00065, 0.0005, 'guarded', 0.0001)).toBe('fails');
    // source: ISO 14253-1 — the zone boundaries themselves: exactly limit − U conforms, exactly limit + U is not yet proven to fail.
    expect(judgeMax(0.0004, 0.0005, 'guarded', 0.0001)).toBe('conforms');
    expect(judgeMax(0.0006, 0.0005, 'guarded', 0.0001)).toBe('not-proven');
  });

  it('when simple acceptance judges the same values, then anything within the limit conforms and anything over fails', () => {
    // source: ILAC-G8 "simple acceptance" as summarised in references.md (no guard band).
    expect(judgeMax(0.00045, 0.0005, 'simple', 0.0001)).toBe('conforms');
    expect(judgeMax(0.0005, 0.0005, 'simple', 0.0001)).toBe('conforms');
    expect(judgeMax(0.00051, 0.0005, 'simple', 0.0001)).toBe('fails');
  });

  it('when a minimum or a two-sided limit is judged, then the guard band works inward from each side', () => {
    // source: ISO 14253-1 (references.md) mirrored for a lower limit: conforms ≥ min + U, fails < min − U.
    expect(judgeMin(0.0027, 0.0025, 'guarded', 0.0001)).toBe('conforms');
    expect(judgeMin(0.00255, 0.0025, 'guarded', 0.0001)).toBe('not-proven');
    expect(judgeMin(0.0023, 0.0025, 'guarded', 0.0001)).toBe('fails');
    // derived: 4.031 ± 0.0005 with U = 0.0001 → conforms within 4.0306–4.0314
    expect(judgeRange(4.0314, 4.0305, 4.0315, 'guarded', 0.0001)).toBe('conforms');
    expect(judgeRange(4.03145, 4.0305, 4.0315, 'guarded', 0.0001)).toBe('not-proven');
    expect(judgeRange(4.0303, 4.0305, 4.0315, 'guarded', 0.0001)).toBe('fails');
  });
});

describe('reference temperature', () => {
  it('when a bore is read at 30 °C on grey cast iron, then the 20 °C size is Lt / (1 + α·10 K)', () => {
    // source: ISO 1 (reference temperature 20 °C); α = 10.8e-6/K, middle of 10.5–11e-6/K for grey cast iron
    // (Engineering ToolBox, "Thermal expansion – linear expansion coefficients").
    // derived: L20 = Lt / (1 + α·(t − 20)) = 4.0310 / 1.000108
    expect(toReferenceTemperature(4.031, 10.8e-6, 30)).toBeCloseTo(4.031 / 1.000108, 12);
    // derived: ΔL = α·L20·ΔT ≈ 10.8e-6 · 4.0306 · 10 ≈ 0.000435 in
    expect(4.031 - toReferenceTemperature(4.031, 10.8e-6, 30)).toBeCloseTo(10.8e-6 * (4.031 / 1.000108) * 10, 12);
    expect(toReferenceTemperature(4.031, 10.8e-6, 20)).toBe(4.031);
  });

  it('when a temperature is given in °F, then it converts exactly', () => {
    // source: NIST SP 811, "Guide for the Use of the International System of Units", temperature conversion t/°C = (t/°F − 32)/1.8 (section number from memory)
    expect(fahrenheitToCelsius(86)).toBeCloseTo(30, 12);
    expect(fahrenheitToCelsius(68)).toBeCloseTo(20, 12);
    expect(celsiusToFahrenheit(20)).toBeCloseTo(68, 12);
  });
});
