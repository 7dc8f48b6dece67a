/**
 * Dates and times as the screen shows them, in the viewer's own time zone and
 * always naming it: the one place the client formats a date (the forms are in
 * shared/dates.ts, which the server's e-mails and documents use in UTC).
 */
import { formatCalendarDay, formatDate as dateIn, formatDateTime as dateTimeIn, formatTime as timeIn, momentParts } from '@shared/dates';

/** The viewer's time zone (IANA name), as the browser reports it. */
export const viewerTimeZone = (): string => Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';

/** A moment as "5 Dec 2026, 14:03 EST": the viewer's date, time and zone. */
export const formatDateTime = (at: string | Date) => dateTimeIn(at, viewerTimeZone());

/** The time of day with the zone: "14:03 EST". */
export const formatTime = (at: string | Date) => timeIn(at, viewerTimeZone());

/** The day a moment falls on for the viewer: "5 Dec 2026". */
export const formatDate = (at: string | Date) => dateIn(at, viewerTimeZone());

/** A moment's pieces in the viewer's zone (for compact forms such as a message list). */
export const viewerParts = (at: string | Date) => momentParts(at, viewerTimeZone());

/** A calendar date (YYYY-MM-DD) read as a day, so it never shifts by a time zone: "4 Mar 2026". */
export const formatDay = (isoDate: string) => formatCalendarDay(isoDate);

/** Today as YYYY-MM-DD in the viewer's own time zone. */
export function todayIso(): string {
  const now = new Date();
  return `${now.getFullYear()}-${String(now.getMonth() + 1).padStart(2, '0')}-${String(now.getDate()).padStart(2, '0')}`;
}
