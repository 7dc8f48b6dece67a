import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { defaultQuantity, findOperation, lineAmountCents, operationCodes, operations, prefillBidLines } from '../../shared/catalogue';

describe('operations catalogue', () => {
  it('when listed, then every code is unique and each says how it is priced', () => {
    expect(new Set(operationCodes).size).toBe(operations.length);
    for (const op of operations) expect(['cylinder', 'part', 'job']).toContain(op.pricedPer);
    // common practice (no published source): boring and honing are priced per cylinder, decking per block, balancing per job
    expect(findOperation('bore')?.pricedPer).toBe('cylinder');
    expect(findOperation('deck')?.pricedPer).toBe('part');
    expect(findOperation('balance')?.pricedPer).toBe('job');
  });

  it('when a quantity is suggested, then per-cylinder work counts cylinders and per-job work counts once', () => {
    expect(defaultQuantity('hone', { cylinders: 6 })).toBe(6);
    expect(defaultQuantity('head-resurface', { cylinders: 8, parts: 2 })).toBe(2);
    expect(defaultQuantity('balance', { cylinders: 8 })).toBe(1);
    expect(defaultQuantity('no-such-work', { cylinders: 8 })).toBe(1);
  });

  it('when a bid is prefilled, then each job operation gets the shop’s price, or 0 where it has none', () => {
    const lines = prefillBidLines(
      [
        { code: 'bore', quantity: 8 },
        { code: 'line-hone', quantity: 1 },
      ],
      [{ operation: 'bore', priceCents: 3500 }],
    );
    expect(lines).toEqual([
      { operation: 'bore', description: 'Bore', quantity: 8, unitPriceCents: 3500 },
      { operation: 'line-hone', description: 'Line hone', quantity: 1, unitPriceCents: 0 },
    ]);
  });

  it('when a line is priced, then the amount is exact integer cents, and fractions are refused', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1000 }), fc.integer({ min: 0, max: 1_000_000 }), (quantity, cents) => {
        const amount = lineAmountCents(quantity, cents);
        expect(Number.isSafeInteger(amount)).toBe(true);
        expect(amount).toBe(quantity * cents);
      }),
    );
    expect(() => lineAmountCents(2, 10.5)).toThrow();
  });
});
