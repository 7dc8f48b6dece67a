/**
 * How Tenthmark writes moments and days, the same on screens, e-mails and
 * documents: a moment is "5 Dec 2026, 14:03 UTC" (always with its time zone),
 * a day is "5 Dec 2026". The server writes in UTC and says so; the client
 * passes the viewer's own zone (client/lib/dates.ts).
 */

/** The zone the server writes e-mails and documents in. */
export const SERVER_TIME_ZONE = 'UTC';

type Parts = { weekday: string; day: string; month: string; year: string; hour: string; minute: string; timeZoneName: string };

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let formatter = formatters.get(timeZone);
  if (!formatter) {
    // en-US for the names ("Sep", "EST"); the order and the 24-hour clock are ours.
    formatter = new Intl.DateTimeFormat('en-US', {
      timeZone, weekday: 'short', day: 'numeric', month: 'short', year: 'numeric',
      hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZoneName: 'short',
    });
    formatters.set(timeZone, formatter);
  }
  return formatter;
}

/** A moment's pieces as they read in `timeZone`, or null when it is not a date. */
export function momentParts(at: Date | string, timeZone: string = SERVER_TIME_ZONE): Parts | null {
  const date = typeof at === 'string' ? new Date(at) : at;
  if (Number.isNaN(date.getTime())) return null;
  const parts = Object.fromEntries(formatterFor(timeZone).formatToParts(date).map((p) => [p.type, p.value]));
  return parts as Parts;
}

const dayOf = (p: Parts) => `${p.day} ${p.month} ${p.year}`;
const clockOf = (p: Parts) => `${p.hour}:${p.minute} ${p.timeZoneName}`;

/** "5 Dec 2026, 14:03 UTC": date, 24-hour time and the zone's short name. */
export function formatDateTime(at: Date | string, timeZone: string = SERVER_TIME_ZONE): string {
  const p = momentParts(at, timeZone);
  return p ? `${dayOf(p)}, ${clockOf(p)}` : String(at);
}

/** "14:03 UTC": the time of day with its zone. */
export function formatTime(at: Date | string, timeZone: string = SERVER_TIME_ZONE): string {
  const p = momentParts(at, timeZone);
  return p ? clockOf(p) : String(at);
}

/** "5 Dec 2026": the day a moment falls on in `timeZone`. */
export function formatDate(at: Date | string, timeZone: string = SERVER_TIME_ZONE): string {
  const p = momentParts(at, timeZone);
  return p ? dayOf(p) : String(at);
}

/** A calendar day (YYYY-MM-DD, no time) as "4 Mar 2026", never shifted by a time zone. */
export function formatCalendarDay(isoDate: string): string {
  const [y, m, d] = isoDate.slice(0, 10).split('-').map(Number);
  if (!y || !m || !d) return isoDate;
  return formatDate(new Date(Date.UTC(y, m - 1, d)), 'UTC');
}
