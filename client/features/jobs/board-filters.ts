import { operations } from '@shared/catalogue';
import type { BoardQuery } from '@shared/schemas/jobs';
import type { BoardFilters } from '@client/lib/query-keys';

/**
 * The board's filters read from the address bar, keeping only values the API
 * accepts, so a hand-edited address never breaks the page. Written without
 * zod so the board's first load does not carry the schema library; a unit
 * test checks these rules agree with `boardQuerySchema`.
 */
type Sort = BoardQuery['sort'];

const oneOf =
  <T extends string>(values: readonly T[]) =>
  (raw: string): T | undefined =>
    (values as readonly string[]).includes(raw) ? (raw as T) : undefined;
/** A whole number as the API coerces it (Number(text), so 1e2 and 0x10 count too). */
const wholeIn = (min: number, max: number) => (raw: string) => {
  const value = Number(raw);
  return Number.isInteger(value) && value >= min && value <= max ? value : undefined;
};
const words = (max: number) => (raw: string) => (raw.length >= 1 && raw.length <= max ? raw : undefined);
const calendarDay = (raw: string) => {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(raw);
  if (!match) return undefined;
  const [year, month, day] = match.slice(1).map(Number);
  const date = new Date(Date.UTC(year, month - 1, day));
  return date.getUTCFullYear() === year && date.getUTCMonth() === month - 1 && date.getUTCDate() === day ? raw : undefined;
};

const readers = {
  operation: oneOf(operations.map((op) => op.code) as Array<NonNullable<BoardQuery['operation']>>),
  material: oneOf<NonNullable<BoardQuery['material']>>(['cast-iron', 'aluminium']),
  cylinders: wholeIn(1, 16),
  country: words(60),
  region: words(60),
  logistics: oneOf<NonNullable<BoardQuery['logistics']>>(['ship', 'drop-off']),
  neededBefore: calendarDay,
  sort: oneOf<Sort>(['newest', 'needed-soonest', 'fewest-bids', 'distance']),
  within: (raw: string) => {
    const value = Number(raw);
    return value > 0 && value <= 5000 ? value : undefined;
  },
  unit: oneOf<NonNullable<BoardQuery['unit']>>(['mi', 'km']),
  near: (raw: string) => (/^[A-Za-z0-9 -]{3,12}$/.test(raw) ? raw : undefined),
  page: wholeIn(1, 10_000),
  pageSize: wholeIn(1, 100),
};

export type BoardFilterKey = keyof typeof readers;

/** One address-bar value as the API would take it, or undefined when the API would refuse it. */
export function readBoardParam<K extends BoardFilterKey>(key: K, raw: string | null | undefined): ReturnType<(typeof readers)[K]> {
  const value = raw?.trim();
  if (!value) return undefined as ReturnType<(typeof readers)[K]>;
  return readers[key](value) as ReturnType<(typeof readers)[K]>;
}

export function readBoardFilters(params: URLSearchParams): BoardFilters & { sort: Sort; page: number; pageSize: number } {
  const pick = <K extends BoardFilterKey>(key: K) => readBoardParam(key, params.get(key));
  return {
    operation: pick('operation'),
    material: pick('material'),
    cylinders: pick('cylinders'),
    country: pick('country'),
    region: pick('region'),
    logistics: pick('logistics'),
    neededBefore: pick('neededBefore'),
    within: pick('within'),
    unit: pick('unit'),
    near: pick('near'),
    sort: pick('sort') ?? 'newest',
    page: pick('page') ?? 1,
    pageSize: pick('pageSize') ?? 20,
  };
}
