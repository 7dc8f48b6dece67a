/**
 * Stack-ups: where the piston sits against the deck, and the oil clearance a
 * bearing shell leaves round a journal. Lengths arrive and leave in the
 * caller's unit (inch or millimetre).
 *
 * - Piston deck clearance = deck height (crank centreline to deck) −
 *   (stroke/2 + rod length + compression height); positive when the piston
 *   sits below the deck at top dead centre, negative when it stands proud.
 *   Quench (squish) = deck clearance + compressed gasket thickness.
 * - Bearing oil clearance = housing bore − journal diameter − 2 · shell wall;
 *   divided by the journal diameter it is the clearance per inch (or per
 *   millimetre) of journal, a ratio that does not depend on the unit.
 *
 * Impossible input throws CalculationError (see ./errors).
 */
import { CalculationError, requireNonNegative, requirePositive } from './errors';
import type { LengthUnit } from './units';

export interface DeckClearanceInput {
  unit: LengthUnit;
  /** Crank centreline to the deck surface. */
  deckHeight: number;
  stroke: number;
  /** Centre to centre. */
  rodLength: number;
  /** Pin centre to the crown. */
  compressionHeight: number;
  /** Compressed (installed) head gasket thickness; quench is given only with it. */
  gasketThickness?: number;
}

export interface DeckClearanceResult {
  /** Piston below the deck at top dead centre positive, proud of it negative. */
  pistonDeckClearance: number;
  /** Deck clearance + gasket thickness; there only when the gasket was given. */
  quench?: number;
}

export function deckClearance(input: DeckClearanceInput): DeckClearanceResult {
  const deckHeight = requirePositive(input.deckHeight, 'deckHeight', 'Deck height');
  const stroke = requirePositive(input.stroke, 'stroke', 'Stroke');
  const rod = requirePositive(input.rodLength, 'rodLength', 'Rod length');
  const compressionHeight = requirePositive(input.compressionHeight, 'compressionHeight', 'Compression height');
  const pistonDeckClearance = deckHeight - (stroke / 2 + rod + compressionHeight);
  if (input.gasketThickness === undefined) return { pistonDeckClearance };
  const gasket = requireNonNegative(input.gasketThickness, 'gasketThickness', 'Gasket thickness');
  return { pistonDeckClearance, quench: pistonDeckClearance + gasket };
}

export interface BearingClearanceInput {
  unit: LengthUnit;
  housingBore: number;
  journalDiameter: number;
  /** Wall thickness of one shell, measured at the crown. */
  shellWall: number;
}

export interface BearingClearanceResult {
  /** Oil clearance on the diameter; negative means the shells pinch the journal. */
  clearance: number;
  /** clearance ÷ journal diameter: the same in inches per inch and millimetres per millimetre. */
  clearancePerInchOfJournal: number;
}

export function bearingClearance(input: BearingClearanceInput): BearingClearanceResult {
  const housing = requirePositive(input.housingBore, 'housingBore', 'Housing bore');
  const journal = requirePositive(input.journalDiameter, 'journalDiameter', 'Journal diameter');
  const wall = requirePositive(input.shellWall, 'shellWall', 'Shell wall');
  if (journal >= housing) throw new CalculationError('Journal diameter must be smaller than the housing bore.', 'journalDiameter');
  const clearance = housing - journal - 2 * wall;
  const clearancePerInchOfJournal = clearance / journal;
  // A journal so small that the ratio overflows is no journal a bearing runs on.
  if (!Number.isFinite(clearancePerInchOfJournal)) throw new CalculationError('The journal diameter is too small to work out a clearance per inch.', 'journalDiameter');
  return { clearance, clearancePerInchOfJournal };
}
