/**
 * Crosshatch from hone settings, and the reverse.
 *
 * Kinematics: peripheral (rotating) speed vt = π · D · n, with n in rev/min;
 * mean axial speed va = 2 · L · f, with f counted as FULL up-and-down cycles
 * per minute (one cycle is one stroke up plus one stroke down). The scratch
 * angle to the horizontal is atan(va / vt); the included angle is twice that,
 * 2 · atan(va / vt), measured ACROSS THE HORIZONTAL (the angle between the up
 * scratches and the down scratches that opens towards the sides of the bore,
 * not the top). It is a mid-stroke value: the stones slow down at each end.
 *
 * Bore and stroke length must be in the same unit (either); speeds come back
 * in that unit per minute and the angle does not depend on the unit.
 */
import { CalculationError, requirePositive } from './errors';

export interface CrosshatchInput {
  bore: number;
  spindleRpm: number;
  strokeLength: number;
  cyclesPerMinute: number;
}

export interface CrosshatchResult {
  /** 2 · atan(va / vt), degrees, across the horizontal. */
  includedAngleDeg: number;
  /** atan(va / vt), degrees from the horizontal. */
  scratchAngleDeg: number;
  /** π · D · n, length unit per minute. */
  peripheralSpeed: number;
  /** 2 · L · f, length unit per minute. */
  axialSpeed: number;
}

export interface CrosshatchRateInput {
  bore: number;
  spindleRpm: number;
  strokeLength: number;
  /** Target included angle, strictly between 0 and 180 degrees. */
  includedAngleDeg: number;
}

export interface CrosshatchRateResult {
  /** Full up-and-down cycles per minute. */
  cyclesPerMinute: number;
  peripheralSpeed: number;
  axialSpeed: number;
}

/**
 * Included angles in common use, degrees: common practice (no published
 * source). About 45° for general work; 40–60° for cast-iron bores; flatter,
 * 30–45°, for some race work.
 */
export const TYPICAL_INCLUDED_ANGLES = {
  general: 45,
  castIron: { min: 40, max: 60 },
  race: { min: 30, max: 45 },
} as const;

const DEGREES_PER_RADIAN = 180 / Math.PI;

export function crosshatchAngle(input: CrosshatchInput): CrosshatchResult {
  const bore = requirePositive(input.bore, 'bore', 'Bore');
  const rpm = requirePositive(input.spindleRpm, 'spindleRpm', 'Spindle speed');
  const stroke = requirePositive(input.strokeLength, 'strokeLength', 'Stroke length');
  const cycles = requirePositive(input.cyclesPerMinute, 'cyclesPerMinute', 'Cycles per minute');
  const peripheralSpeed = Math.PI * bore * rpm;
  const axialSpeed = 2 * stroke * cycles;
  const scratch = Math.atan(axialSpeed / peripheralSpeed);
  return {
    includedAngleDeg: 2 * scratch * DEGREES_PER_RADIAN,
    scratchAngleDeg: scratch * DEGREES_PER_RADIAN,
    peripheralSpeed,
    axialSpeed,
  };
}

/** Cycles per minute giving a target included angle: f = π·D·n·tan(θ/2) / (2·L). */
export function crosshatchRate(input: CrosshatchRateInput): CrosshatchRateResult {
  const bore = requirePositive(input.bore, 'bore', 'Bore');
  const rpm = requirePositive(input.spindleRpm, 'spindleRpm', 'Spindle speed');
  const stroke = requirePositive(input.strokeLength, 'strokeLength', 'Stroke length');
  const angle = requirePositive(input.includedAngleDeg, 'includedAngleDeg', 'Included angle');
  if (angle >= 180) {
    throw new CalculationError('Included angle must be less than 180 degrees.', 'includedAngleDeg');
  }
  const peripheralSpeed = Math.PI * bore * rpm;
  const axialSpeed = peripheralSpeed * Math.tan(angle / 2 / DEGREES_PER_RADIAN);
  return { cyclesPerMinute: axialSpeed / (2 * stroke), peripheralSpeed, axialSpeed };
}
