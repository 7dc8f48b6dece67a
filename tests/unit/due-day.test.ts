import { describe, expect, it } from 'vitest';
import { addWorkingDays, daysUntil, dueDayEnd, dueDayOf } from '../../shared/due-day';

// Weekdays of December 2026 checked against the Gregorian calendar (a general-purpose
// reference: JavaScript's Date, ECMA-262 §21.4): 4 Dec 2026 is a Friday, 5 Dec a Saturday.
// Working days are Monday to Friday: common practice for a turnaround quoted in working days.
const at = (iso: string) => new Date(`${iso}T10:00:00Z`);

describe('working days', () => {
  it('when the count crosses a weekend, then Saturday and Sunday are not counted', () => {
    expect(new Date('2026-12-04T00:00:00Z').getUTCDay()).toBe(5); // the calendar check above
    expect(addWorkingDays(at('2026-12-04'), 1)).toBe('2026-12-07'); // Friday + 1 → Monday
    expect(addWorkingDays(at('2026-12-04'), 5)).toBe('2026-12-11'); // Friday + 5 → next Friday
    expect(addWorkingDays(at('2026-12-02'), 10)).toBe('2026-12-16'); // Wednesday + 10 → Wednesday two weeks on
  });

  it('when the start is on a weekend, then the first working day counted is Monday', () => {
    expect(addWorkingDays(at('2026-12-05'), 1)).toBe('2026-12-07');
    expect(addWorkingDays(at('2026-12-06'), 3)).toBe('2026-12-09');
  });

  it('when the start is late in the UTC day, then its UTC day counts', () => {
    expect(addWorkingDays(new Date('2026-12-07T23:59:59Z'), 1)).toBe('2026-12-08');
  });
});

describe('the due day of an accepted bid', () => {
  it('when the parts arrived, then the turnaround counts from their arrival, else from the award', () => {
    const bid = { turnaroundDays: 3, awardedAt: at('2026-12-01') };
    expect(dueDayOf(bid)).toBe('2026-12-04');
    expect(dueDayOf(bid, at('2026-12-03'))).toBe('2026-12-08');
    expect(dueDayOf({ turnaroundDays: 3, awardedAt: null })).toBeNull();
  });

  it('when the due day is today, then it is not late until the day has ended', () => {
    expect(daysUntil('2026-12-07', at('2026-12-07'))).toBe(0);
    expect(daysUntil('2026-12-07', at('2026-12-04'))).toBe(3);
    expect(daysUntil('2026-12-07', at('2026-12-09'))).toBe(-2);
    expect(dueDayEnd('2026-12-07').toISOString()).toBe('2026-12-07T23:59:59.999Z');
  });
});
