import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { operations } from '../../shared/catalogue';
import { boardQuerySchema } from '../../shared/schemas/jobs';
import { readBoardParam, type BoardFilterKey } from '../../client/features/jobs/board-filters';

/**
 * The board page reads its filters without zod (to keep the schema library
 * out of its first load); here its rules are held to the API's own schema:
 * for every key, a value is kept exactly when the API would accept it, and
 * kept as the API would read it.
 */
const keys: BoardFilterKey[] = ['operation', 'material', 'cylinders', 'country', 'region', 'logistics', 'neededBefore', 'within', 'unit', 'near', 'sort', 'page', 'pageSize'];
const shape = boardQuerySchema.shape;

function apiReads(key: BoardFilterKey, raw: string) {
  const parsed = shape[key].safeParse(raw.trim());
  return parsed.success ? parsed.data : undefined;
}

const interesting = fc.oneof(
  fc.constantFrom(...operations.map((op) => op.code), 'cast-iron', 'aluminium', 'ship', 'drop-off', 'newest', 'needed-soonest', 'fewest-bids', 'distance', 'mi', 'km', '45404', 'K1A 0B1', 'ab', '0.5', '5000', '5000.1', 'Infinity', 'NaN'),
  fc.constantFrom('0', '1', '16', '17', '100', '101', '10000', '10001', '007', '1.5', '-3', '1e2', ' 8 ', '2027-02-29', '2028-02-29', '2027-13-01', '2027-03-31', '27-03-31'),
  fc.integer({ min: -5, max: 20_000 }).map(String),
  fc.string({ maxLength: 70 }),
);

describe('board filters read from the address bar', () => {
  it('keep a value exactly when the API schema accepts it, with the same meaning', () => {
    fc.assert(
      fc.property(fc.constantFrom(...keys), interesting, (key, raw) => {
        if (!raw.trim()) return; // an empty value means "no filter" on both sides
        expect(readBoardParam(key, raw), `${key}=${JSON.stringify(raw)}`).toEqual(apiReads(key, raw));
      }),
      { numRuns: 3_000 },
    );
  });
});
