import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkFigures } from '../../../shared/calc/check-figures';
import { decimalsOf, figureAgainstLimit, fixed, lengthAgainstLimit, lengthDecimals } from '../../../shared/calc/figures';

describe('a figure printed beside its limit', () => {
  it('when 0.012704 mm is judged against a 0.0127 mm limit, then the print shows the difference (not "0.013 over 0.013")', () => {
    // derived: at 3 decimals both are 0.013; at 4 both 0.0127; at 5 both 0.01270; at 6 they are 0.012704 and 0.012700.
    expect(lengthAgainstLimit(0.012704, 0.0127, 'mm')).toEqual({ value: '0.012704 mm', limit: '0.012700 mm' });
  });

  it('when the figures differ at the usual decimals, then the usual decimals are kept', () => {
    expect(lengthAgainstLimit(0.0009, 0.0005, 'in')).toEqual({ value: '0.0009 in', limit: '0.0005 in' });
    expect(lengthAgainstLimit(0.021, 0.0127, 'mm')).toEqual({ value: '0.021 mm', limit: '0.013 mm' });
  });

  it('when the value equals the limit within the judging slack, then both print alike (a pass at the limit)', () => {
    expect(figureAgainstLimit(0.1 + 0.2, 0.3, 3)).toEqual({ value: '0.300', limit: '0.300', decimals: 3 });
  });

  it('when the gauge reads to 0.00005 in, then at least five decimals are shown', () => {
    expect(decimalsOf(0.00005)).toBe(5);
    expect(decimalsOf(0.001)).toBe(3);
    expect(decimalsOf(0.5)).toBe(1);
    expect(lengthDecimals('in', 0.00005)).toBe(5);
    expect(lengthDecimals('mm', 0.01)).toBe(3);
  });

  it('never prints "-0"', () => {
    expect(fixed(-0.00001, 3)).toBe('0.000');
  });

  it('never prints equal strings, or the wrong order, for a value and a limit whose difference changes the verdict', () => {
    // common practice (no published source): a reader compares the printed figures, so a judgement must be visible in them.
    const figure = fc.double({ min: -1000, max: 1000, noNaN: true, noDefaultInfinity: true });
    fc.assert(
      fc.property(figure, figure, fc.integer({ min: 0, max: 6 }), (value, limit, minDecimals) => {
        const pair = figureAgainstLimit(value, limit, minDecimals);
        expect(pair.decimals).toBeGreaterThanOrEqual(minDecimals);
        const over = value - limit > 1e-9;
        const under = limit - value > 1e-9;
        if (over || under) expect(pair.value).not.toBe(pair.limit);
        if (over) expect(Number(pair.value)).toBeGreaterThan(Number(pair.limit));
        if (under) expect(Number(pair.value)).toBeLessThan(Number(pair.limit));
      }),
      { numRuns: 2000 },
    );
  });

  it('when a value sits just past a limit, then the strings differ however close (down to the slack)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.0001, max: 10, noNaN: true }), fc.double({ min: 2e-9, max: 1e-4, noNaN: true }), (limit, excess) => {
        const pair = figureAgainstLimit(limit + excess, limit, 3);
        expect(pair.value).not.toBe(pair.limit);
      }),
    );
  });

  it('when a check is printed for the record view or the certificate, then its figure and limit show the verdict', () => {
    const ctx = { spec: { unit: 'mm' as const, maxTaper: 0.0127, finishRaMaxUm: 0.6, crosshatchMinDeg: 40, crosshatchMaxDeg: 50 }, results: { deck: { outOfFlat: 0.05, limit: 0.0508, pass: true, limitSource: 'table' } }, unit: 'mm' as const };
    // derived: 0.012704 mm over a 0.0127 mm limit needs six decimals to show it.
    expect(checkFigures({ what: 'cylinder 3 taper', value: 0.012704, allowed: '≤ 0.013 mm', pass: false }, ctx)).toEqual({ value: '0.012704 mm', allowed: '≤ 0.012700 mm', matched: true });
    expect(checkFigures({ what: 'bore Ra', value: 0.6004, allowed: '≤ 0.6 µm', pass: false }, ctx)).toMatchObject({ value: '0.6004 µm', allowed: '≤ 0.6000 µm' });
    expect(checkFigures({ what: 'crosshatch included angle', value: 50.04, allowed: '40° – 50°', pass: false }, ctx)).toMatchObject({ value: '50.04°', allowed: '40.00° – 50.00°' });
    expect(checkFigures({ what: 'deck out-of-flat', value: 0.05, allowed: '≤ 0.051 mm', pass: true }, ctx)).toMatchObject({ value: '0.050 mm', allowed: '≤ 0.051 mm' });
    // A check it does not know keeps its own limit text.
    expect(checkFigures({ what: 'something new', value: 1.5, allowed: 'as agreed', pass: true }, ctx)).toEqual({ value: '1.5', allowed: 'as agreed', matched: false });
  });
});
