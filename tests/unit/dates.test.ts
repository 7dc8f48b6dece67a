import { describe, expect, it } from 'vitest';
import { formatCalendarDay, formatDate, formatDateTime, formatTime } from '../../shared/dates';

// One instant, 5 December 2026 at 14:03:27 UTC (a Saturday).
const INSTANT = '2026-12-05T14:03:27.000Z';

describe('shared/dates', () => {
  it('writes a fixed instant in UTC as day, month, year, 24-hour time and the zone', () => {
    expect(formatDateTime(INSTANT)).toBe('5 Dec 2026, 14:03 UTC');
    expect(formatDateTime(new Date(INSTANT), 'UTC')).toBe('5 Dec 2026, 14:03 UTC');
    expect(formatTime(INSTANT)).toBe('14:03 UTC');
    expect(formatDate(INSTANT)).toBe('5 Dec 2026');
  });

  it('names the zone whatever zone it is written in', () => {
    // New York is 5 hours behind UTC in December (Eastern Standard Time): 09:03 EST.
    expect(formatDateTime(INSTANT, 'America/New_York')).toBe('5 Dec 2026, 09:03 EST');
    // Summer time in New York is 4 hours behind: 10:03 EDT.
    expect(formatDateTime('2026-07-05T14:03:00Z', 'America/New_York')).toBe('5 Jul 2026, 10:03 EDT');
    for (const zone of ['UTC', 'Europe/Berlin', 'Asia/Tokyo', 'Australia/Adelaide', 'America/Los_Angeles']) {
      const text = formatDateTime(INSTANT, zone);
      expect(text, zone).toMatch(/^\d{1,2} [A-Z][a-z]{2} \d{4}, \d\d:\d\d \S+$/);
      expect(text.split(' ').at(-1), zone).toMatch(/^(UTC|GMT[+-][\d:]+|[A-Z]{2,5})$/);
      expect(formatTime(INSTANT, zone), zone).toMatch(/^\d\d:\d\d \S+$/);
    }
  });

  it('moves the day with the zone when the moment crosses midnight', () => {
    expect(formatDate('2026-12-05T02:00:00Z', 'America/Los_Angeles')).toBe('4 Dec 2026');
    expect(formatDateTime('2026-12-05T00:00:00Z')).toBe('5 Dec 2026, 00:00 UTC');
  });

  it('writes a calendar day without shifting it, and leaves what is not a date as it came', () => {
    expect(formatCalendarDay('2026-03-04')).toBe('4 Mar 2026');
    expect(formatCalendarDay('2026-09-30')).toBe('30 Sep 2026');
    expect(formatCalendarDay('soon')).toBe('soon');
    expect(formatDateTime('not a date')).toBe('not a date');
  });
});
