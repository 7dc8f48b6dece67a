/**
 * Deck flatness: out-of-flat from straightedge readings, judged against a
 * limit chosen by deck material and gasket type.
 *
 * Readings are the thickest feeler leaf that passes under a precision
 * straightedge at each position (lengthwise along both edges and the centre,
 * crosswise, and on both diagonals); the out-of-flat is the largest of them.
 */
import { CalculationError, requireNonNegative, requirePositive } from './errors';
import { type LengthUnit, convertLength, microinchesToMicrometres } from './units';

export type DeckMaterial = 'cast-iron' | 'aluminium';
export type GasketType = 'mls' | 'composite';

export const DECK_MATERIALS: readonly DeckMaterial[] = ['cast-iron', 'aluminium'];
export const GASKET_TYPES: readonly GasketType[] = ['mls', 'composite'];

/** A limit table and the unit its figures are in. */
export interface DeckLimitTable {
  unit: LengthUnit;
  limits: Record<DeckMaterial, Record<GasketType, number>>;
}

/**
 * Default out-of-flat limits over the whole deck, inches: common practice (no
 * published source). Tighter for aluminium than cast iron, and for
 * multi-layer steel (mls) gaskets than composite ones. The gasket maker's
 * figure governs; a shop passes its own table or limit to override.
 */
export const DECK_FLATNESS_LIMITS: DeckLimitTable = {
  unit: 'in',
  limits: {
    'cast-iron': { composite: 0.004, mls: 0.002 },
    aluminium: { composite: 0.002, mls: 0.001 },
  },
};

/**
 * Deck finish for multi-layer steel gaskets: about Ra 50 µin (1.27 µm) or
 * finer: common practice (no published source).
 */
export const MLS_DECK_FINISH_MAX_RA_UM = microinchesToMicrometres(50);

/** The largest straightedge reading. */
export function deckOutOfFlat(readings: readonly number[]): number {
  if (!Array.isArray(readings) || readings.length === 0) {
    throw new CalculationError('Enter at least one straightedge reading.', 'readings');
  }
  readings.forEach((reading, index) => requireNonNegative(reading, `readings.${index}`, 'Each reading'));
  return Math.max(...readings);
}

/** The limit for a material and gasket, in `unit`, from `table` (default: the common-practice table). */
export function deckFlatnessLimit(
  material: DeckMaterial,
  gasket: GasketType,
  unit: LengthUnit,
  table: DeckLimitTable = DECK_FLATNESS_LIMITS,
): number {
  const row = Object.hasOwn(table.limits, material) ? table.limits[material] : undefined;
  const limit = row && Object.hasOwn(row, gasket) ? row[gasket] : undefined;
  if (limit === undefined) {
    throw new CalculationError('Choose a deck material and gasket type from the list.', 'material');
  }
  requirePositive(limit, 'table', 'Table limit');
  return convertLength(limit, table.unit, unit);
}

export interface DeckFlatnessInput {
  unit: LengthUnit;
  readings: readonly number[];
  material: DeckMaterial;
  gasket: GasketType;
  /**
   * A shop's own limit in `unit`; replaces the table's figure. Zero is a
   * limit too: no leaf may pass under the straightedge anywhere (every
   * reading 0), so a record with a gap fails it rather than being refused.
   */
  shopLimit?: number;
  /** A shop's own table; used when no shopLimit is given. */
  table?: DeckLimitTable;
}

export interface DeckFlatnessResult {
  outOfFlat: number;
  limit: number;
  pass: boolean;
  /** Where the limit came from. */
  limitSource: 'table' | 'shop';
}

const LIMIT_SLACK = 1e-9;

export function deckFlatness(input: DeckFlatnessInput): DeckFlatnessResult {
  const outOfFlat = deckOutOfFlat(input.readings);
  const fromShop = input.shopLimit !== undefined;
  const limit = fromShop
    ? requireNonNegative(input.shopLimit, 'shopLimit', 'Shop limit')
    : deckFlatnessLimit(input.material, input.gasket, input.unit, input.table);
  return { outOfFlat, limit, pass: outOfFlat <= limit + LIMIT_SLACK, limitSource: fromShop ? 'shop' : 'table' };
}
