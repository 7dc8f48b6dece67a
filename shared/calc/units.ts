/**
 * Unit conversions. Every factor here is exact by definition:
 * 1 in = 25.4 mm (international inch, 1959), so 1 in³ = 25.4³ mm³ =
 * 16.387064 cm³ and 1 µin = 0.0254 µm. Volumes are carried in cubic
 * centimetres (cc) throughout the library; roughness in micrometres.
 */

/** The two length units the product works in. */
export type LengthUnit = 'in' | 'mm';

export const LENGTH_UNITS: readonly LengthUnit[] = ['in', 'mm'];

/** Millimetres in one inch (exact). */
export const MM_PER_INCH = 25.4;
/** Cubic centimetres in one cubic inch (exact: 2.54³). */
export const CC_PER_CUBIC_INCH = 16.387064;
/** Cubic centimetres in one litre (exact). */
export const CC_PER_LITRE = 1000;
/** Micrometres in one microinch (exact: 25.4 mm / 10⁶ · 10³). */
export const MICROMETRES_PER_MICROINCH = 0.0254;
/** Cubic millimetres in one cubic centimetre. */
const CUBIC_MM_PER_CC = 1000;

export function inchesToMm(inches: number): number {
  return inches * MM_PER_INCH;
}

export function mmToInches(mm: number): number {
  return mm / MM_PER_INCH;
}

/** A length in `from` expressed in `to`. */
export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  if (from === to) return value;
  return from === 'in' ? inchesToMm(value) : mmToInches(value);
}

/** A length in `unit` expressed in millimetres. */
export function toMm(value: number, unit: LengthUnit): number {
  return convertLength(value, unit, 'mm');
}

/** A length in millimetres expressed in `unit`. */
export function fromMm(mm: number, unit: LengthUnit): number {
  return convertLength(mm, 'mm', unit);
}

export function ccToLitres(cc: number): number {
  return cc / CC_PER_LITRE;
}

export function litresToCc(litres: number): number {
  return litres * CC_PER_LITRE;
}

export function ccToCubicInches(cc: number): number {
  return cc / CC_PER_CUBIC_INCH;
}

export function cubicInchesToCc(cubicInches: number): number {
  return cubicInches * CC_PER_CUBIC_INCH;
}

/**
 * A volume given in the cube of a length unit (in³ or mm³) expressed in cc.
 * Used by the engine geometry, whose lengths arrive in the request's unit.
 */
export function cubicLengthToCc(volume: number, unit: LengthUnit): number {
  return unit === 'in' ? cubicInchesToCc(volume) : volume / CUBIC_MM_PER_CC;
}

export function microinchesToMicrometres(microinches: number): number {
  return microinches * MICROMETRES_PER_MICROINCH;
}

export function micrometresToMicroinches(micrometres: number): number {
  return micrometres / MICROMETRES_PER_MICROINCH;
}

/** Newtons in one pound-force (exact by definition: 0.45359237 kg × 9.80665 m/s²). */
export const NEWTONS_PER_POUND_FORCE = 4.4482216152605;
