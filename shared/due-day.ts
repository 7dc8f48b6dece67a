/**
 * When a shop's work is due: the one rule behind My bids, the work queue,
 * "coming due" in Needs you and the shop's right to open a dispute over
 * silence. A bid's turnaround is in working days (Monday to Friday; public
 * holidays are not known here) counted from the day the parts arrive, or from
 * the award until they do. Days are UTC calendar days (YYYY-MM-DD).
 */

const DAY_MS = 86_400_000;

/** The UTC day (YYYY-MM-DD) `workingDays` Monday-to-Friday days after `start`'s day. */
export function addWorkingDays(start: Date, workingDays: number): string {
  let day = Date.UTC(start.getUTCFullYear(), start.getUTCMonth(), start.getUTCDate());
  let left = Math.max(0, Math.trunc(workingDays));
  while (left > 0) {
    day += DAY_MS;
    const weekday = new Date(day).getUTCDay();
    if (weekday !== 0 && weekday !== 6) left -= 1;
  }
  return new Date(day).toISOString().slice(0, 10);
}

/** The day an accepted bid's work is due, or null before it is awarded. */
export function dueDayOf(bid: { turnaroundDays: number; awardedAt: Date | null }, partsReceivedAt?: Date | null): string | null {
  const start = partsReceivedAt ?? bid.awardedAt;
  return start ? addWorkingDays(start, bid.turnaroundDays) : null;
}

/** The end of the due day (UTC): the work is late only once the whole day has passed. */
export function dueDayEnd(dueDay: string): Date {
  return new Date(Date.parse(dueDay) + DAY_MS - 1);
}

/** Whole calendar days from `now`'s UTC day to the due day; negative once it has passed. */
export function daysUntil(dueDay: string, now: Date): number {
  return Math.round((Date.parse(dueDay) - Date.parse(now.toISOString().slice(0, 10))) / DAY_MS);
}
