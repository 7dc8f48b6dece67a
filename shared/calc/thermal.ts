/**
 * Lengths corrected to the standard reference temperature of ISO 1 (20 °C).
 *
 * A length L₂₀ at 20 °C measures Lt = L₂₀ · (1 + α · (t − 20)) at t °C, so
 * L₂₀ = Lt / (1 + α · (t − 20)). Bore and piston are different materials and
 * grow by different amounts, so a clearance measured warm is not the
 * clearance at 20 °C: each is corrected with its own coefficient first.
 */
import { requirePositive } from './errors';

/** ISO 1: the standard reference temperature for geometrical product specification. */
export const REFERENCE_TEMPERATURE_C = 20;

export type ExpansionMaterial = 'cast-iron' | 'aluminium';

export interface ExpansionCoefficient {
  /** Linear expansion coefficient, per kelvin. */
  alpha: number;
  /** The material in words, with the published range the value was taken from. */
  words: string;
}

/**
 * Where the coefficients come from. The handbooks give ranges (grey cast iron
 * 10.5–11 × 10⁻⁶/K, aluminium alloys 21–23 × 10⁻⁶/K); the middle of each range
 * is used. A single alloy's own figure, when known, is better.
 */
export const EXPANSION_SOURCE = 'Engineering ToolBox, “Thermal expansion – linear expansion coefficients” (also Machinery’s Handbook tables); middle of the published range';

export const EXPANSION_COEFFICIENTS: Record<ExpansionMaterial, ExpansionCoefficient> = {
  'cast-iron': { alpha: 10.8e-6, words: 'grey cast iron, 10.8 × 10⁻⁶/K (published 10.5–11 × 10⁻⁶/K)' },
  aluminium: { alpha: 22e-6, words: 'aluminium alloy, 22 × 10⁻⁶/K (published 21–23 × 10⁻⁶/K)' },
};

/** Pistons of every type the job form offers (cast, hypereutectic, forged) are aluminium alloys. */
export const PISTON_MATERIAL: ExpansionMaterial = 'aluminium';

/** A length read at `temperatureC` expressed at 20 °C: L₂₀ = Lt / (1 + α · (t − 20)). */
export function toReferenceTemperature(length: number, alpha: number, temperatureC: number): number {
  requirePositive(length, 'length', 'Length');
  return length / (1 + alpha * (temperatureC - REFERENCE_TEMPERATURE_C));
}

/** °F to °C, exact: (F − 32) · 5/9. */
export function fahrenheitToCelsius(fahrenheit: number): number {
  return ((fahrenheit - 32) * 5) / 9;
}

/** °C to °F, exact: C · 9/5 + 32. */
export function celsiusToFahrenheit(celsius: number): number {
  return (celsius * 9) / 5 + 32;
}
