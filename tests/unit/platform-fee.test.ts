import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { feeFor, feeRateWords, netOf } from '../../shared/money';

describe('the platform fee and the shop’s net', () => {
  it.each([
    // [amount in cents, rate in basis points, fee in cents]; a basis point is 1/100 of a percent (common practice)
    [50_000, 800, 4_000], // 8 % of $500.00
    [18_000, 800, 1_440], // 8 % of $180.00
    [12_345, 800, 988], // 987.6 cents rounds half up to 988 (common practice for money: to the nearest cent, halves up)
    [10_006, 750, 750], // 750.45 rounds down
    [10_007, 750, 751], // 750.525 rounds up
    [1, 5_000, 1], // 0.5 cent rounds up
    [99, 0, 0],
  ])('when %i cents are charged at %i basis points, then the fee is %i cents', (amount, bps, fee) => {
    expect(feeFor(amount, bps)).toBe(fee);
  });

  it('when any amount is split, then the fee and the net add back to the amount, and the net is never negative', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2_000_000_000 }), fc.integer({ min: 0, max: 5_000 }), (amount, bps) => {
        const { feeCents, netCents } = netOf(amount, bps);
        expect(feeCents + netCents).toBe(amount);
        expect(netCents).toBeGreaterThanOrEqual(0);
        expect(Number.isInteger(feeCents)).toBe(true);
      }),
    );
  });

  it('when a rate is shown, then it reads as a percentage without trailing zeros', () => {
    expect(feeRateWords(800)).toBe('8%');
    expect(feeRateWords(750)).toBe('7.5%');
    expect(feeRateWords(1_234)).toBe('12.34%');
  });
});
