/**
 * Engine geometry: displacement, compression ratio (static, and dynamic from
 * the intake closing angle), and what an overbore or a deck cut does to both.
 *
 * Lengths arrive in the caller's unit (inch or millimetre); volumes are
 * returned in cubic centimetres (cc). Formulas:
 * - swept volume per cylinder = π/4 · bore² · stroke (Math.PI, never 0.7854);
 * - compression ratio = (swept + clearance) / clearance, where clearance =
 *   chamber + gasket (π/4 · gasket bore² · compressed thickness)
 *   + deck (π/4 · bore² · deck clearance) + piston volume;
 * - piston position from top dead centre (slider-crank, Heywood §2.2):
 *   x = r(1 − cos θ) + l − √(l² − r² sin² θ), r = stroke/2, l = rod length;
 * - dynamic ratio = (π/4 · bore² · x at intake closing + clearance) / clearance.
 *
 * Sign conventions: piston volume is positive for a dish or valve reliefs
 * (space added above the piston) and negative for a dome (space taken away);
 * deck clearance is positive when the piston crown sits below the deck at top
 * dead centre and negative when it stands proud of the deck.
 *
 * Impossible input throws CalculationError (see ./errors), including a set of
 * volumes that leaves no room above the piston (clearance volume ≤ 0).
 */
import { CalculationError, requireFinite, requireNonNegative, requirePositive } from './errors';
import { type LengthUnit, ccToCubicInches, ccToLitres, cubicLengthToCc } from './units';

export interface DisplacementInput {
  unit: LengthUnit;
  bore: number;
  stroke: number;
  cylinders: number;
}

export interface DisplacementResult {
  cc: number;
  litres: number;
  cubicInches: number;
}

export interface CompressionInput {
  unit: LengthUnit;
  bore: number;
  stroke: number;
  /** Combustion chamber volume in the head, cc. */
  chamberCc: number;
  /** Dish or valve reliefs positive, dome negative, cc. */
  pistonCc: number;
  /** Piston below the deck at top dead centre positive, above negative. */
  deckClearance: number;
  gasketBore: number;
  /** Compressed (installed) thickness of the head gasket. */
  gasketThickness: number;
}

export interface ClearanceVolume {
  /** Total volume above the piston at top dead centre, cc. */
  clearanceCc: number;
  chamberCc: number;
  pistonCc: number;
  gasketCc: number;
  deckCc: number;
}

export interface CompressionResult extends ClearanceVolume {
  ratio: number;
  /** Swept volume of one cylinder, cc. */
  sweptCc: number;
}

/** Volume in cc of a right circular cylinder whose lengths are in `unit`. */
export function cylinderVolumeCc(diameter: number, height: number, unit: LengthUnit): number {
  return cubicLengthToCc((Math.PI / 4) * diameter * diameter * height, unit);
}

/** Total swept volume of the engine: π/4 · bore² · stroke · cylinders. */
export function displacement(input: DisplacementInput): DisplacementResult {
  requirePositive(input.bore, 'bore', 'Bore');
  requirePositive(input.stroke, 'stroke', 'Stroke');
  if (!Number.isInteger(input.cylinders) || input.cylinders < 1) {
    throw new CalculationError('Cylinders must be a whole number of at least 1.', 'cylinders');
  }
  const cc = cylinderVolumeCc(input.bore, input.stroke, input.unit) * input.cylinders;
  return { cc, litres: ccToLitres(cc), cubicInches: ccToCubicInches(cc) };
}

/**
 * The pieces of the clearance volume and their sum, without judging them.
 * Does not throw on a total ≤ 0, so a form or schema can test the sum and
 * word its own message; compressionRatio() is the function that rejects it.
 */
export function clearanceVolume(input: CompressionInput): ClearanceVolume {
  const gasketCc = cylinderVolumeCc(input.gasketBore, input.gasketThickness, input.unit);
  const deckCc = cylinderVolumeCc(input.bore, input.deckClearance, input.unit);
  const clearanceCc = input.chamberCc + gasketCc + deckCc + input.pistonCc;
  return { clearanceCc, chamberCc: input.chamberCc, pistonCc: input.pistonCc, gasketCc, deckCc };
}

/** Static compression ratio of one cylinder: (swept + clearance) / clearance. */
export function compressionRatio(input: CompressionInput): CompressionResult {
  requirePositive(input.bore, 'bore', 'Bore');
  requirePositive(input.stroke, 'stroke', 'Stroke');
  requireNonNegative(input.chamberCc, 'chamberCc', 'Chamber volume');
  requireFinite(input.pistonCc, 'pistonCc', 'Piston volume');
  requireFinite(input.deckClearance, 'deckClearance', 'Deck clearance');
  requirePositive(input.gasketBore, 'gasketBore', 'Gasket bore');
  requireNonNegative(input.gasketThickness, 'gasketThickness', 'Gasket thickness');

  const clearance = clearanceVolume(input);
  if (!(clearance.clearanceCc > 0)) {
    throw new CalculationError(
      'The chamber, gasket, deck and piston volumes leave no space above the piston; check the dome volume and deck clearance.',
      input.pistonCc < 0 ? 'pistonCc' : 'deckClearance',
    );
  }
  const sweptCc = cylinderVolumeCc(input.bore, input.stroke, input.unit);
  return { ...clearance, sweptCc, ratio: (sweptCc + clearance.clearanceCc) / clearance.clearanceCc };
}

export interface MachiningChange {
  /** Amount added to the bore diameter, in the input's unit (0 or more). */
  overbore?: number;
  /** Depth removed from the block deck, in the input's unit (0 or more). */
  deckCut?: number;
}

export interface EngineState {
  bore: number;
  deckClearance: number;
  displacement: DisplacementResult;
  compression: CompressionResult;
}

export interface MachiningEffect {
  before: EngineState;
  after: EngineState;
  /** after − before. */
  change: { cc: number; ratio: number };
  /** True when the new bore is larger than the gasket bore: a larger gasket is needed. */
  boreExceedsGasket: boolean;
}

/**
 * Displacement and compression ratio before and after an overbore and/or a
 * deck cut. Assumptions, stated so a screen can repeat them:
 * - an overbore adds to the bore diameter; the new pistons keep the same dish,
 *   relief or dome volume, and the gasket is unchanged;
 * - a deck cut lowers the deck by its depth, so the deck clearance falls by
 *   the same amount (and may go negative: piston proud of the deck);
 * - the head, stroke and rods are unchanged.
 * Throws CalculationError when the result leaves no clearance volume.
 */
export function machiningEffect(
  input: CompressionInput & { cylinders: number },
  change: MachiningChange,
): MachiningEffect {
  const overbore = requireNonNegative(change.overbore ?? 0, 'overbore', 'Overbore');
  const deckCut = requireNonNegative(change.deckCut ?? 0, 'deckCut', 'Deck cut');

  const state = (bore: number, deckClearance: number): EngineState => ({
    bore,
    deckClearance,
    displacement: displacement({ unit: input.unit, bore, stroke: input.stroke, cylinders: input.cylinders }),
    compression: compressionRatio({ ...input, bore, deckClearance }),
  });

  const before = state(input.bore, input.deckClearance);
  const after = state(input.bore + overbore, input.deckClearance - deckCut);
  return {
    before,
    after,
    change: {
      cc: after.displacement.cc - before.displacement.cc,
      ratio: after.compression.ratio - before.compression.ratio,
    },
    boreExceedsGasket: after.bore > input.gasketBore,
  };
}

export interface PistonPositionInput {
  stroke: number;
  /** Centre to centre, longer than half the stroke. */
  rodLength: number;
  /** Crank angle from top dead centre, degrees. */
  crankAngleDeg: number;
}

/**
 * Distance of the piston below top dead centre at a crank angle (slider-crank,
 * Heywood §2.2): x = r(1 − cos θ) + l − √(l² − r² sin² θ), r = stroke/2.
 */
export function pistonPosition(input: PistonPositionInput): number {
  const stroke = requirePositive(input.stroke, 'stroke', 'Stroke');
  const rod = requirePositive(input.rodLength, 'rodLength', 'Rod length');
  const theta = (requireFinite(input.crankAngleDeg, 'crankAngleDeg', 'Crank angle') * Math.PI) / 180;
  const r = stroke / 2;
  if (!(rod > r)) throw new CalculationError('Rod length must be longer than half the stroke.', 'rodLength');
  const sin = Math.sin(theta);
  const x = r * (1 - Math.cos(theta)) + rod - Math.sqrt(rod * rod - r * r * sin * sin);
  // Exactly 0 to stroke on paper; the clamp keeps rounding from reporting a hair outside.
  return Math.min(stroke, Math.max(0, x));
}

export interface DynamicCompressionInput extends CompressionInput {
  rodLength: number;
  /** Intake valve closing, degrees after bottom dead centre (0 to 180), at the lift the cam card times it. */
  intakeClosingDegAbdc: number;
}

export interface DynamicCompressionResult {
  staticRatio: number;
  /** (swept volume left when the intake closes + clearance volume) ÷ clearance volume. */
  dynamicRatio: number;
  /** Piston distance below top dead centre when the intake closes, in the input's unit. */
  effectiveStroke: number;
}

/**
 * Compression ratio counted from intake closing: the piston position at
 * θ = 180° + closing angle ABDC gives the stroke still to run, and the same
 * clearance volume as the static ratio closes the sum.
 */
export function dynamicCompression(input: DynamicCompressionInput): DynamicCompressionResult {
  const closing = requireFinite(input.intakeClosingDegAbdc, 'intakeClosingDegAbdc', 'Intake closing angle');
  if (closing < 0 || closing > 180) {
    throw new CalculationError('Intake closing angle must be between 0 and 180 degrees after bottom dead centre.', 'intakeClosingDegAbdc');
  }
  const compression = compressionRatio(input);
  const effectiveStroke = pistonPosition({ stroke: input.stroke, rodLength: input.rodLength, crankAngleDeg: 180 + closing });
  const effectiveSweptCc = cylinderVolumeCc(input.bore, effectiveStroke, input.unit);
  return {
    staticRatio: compression.ratio,
    dynamicRatio: (effectiveSweptCc + compression.clearanceCc) / compression.clearanceCc,
    effectiveStroke,
  };
}
