/** Calendar days (YYYY-MM-DD) as the screen shows them. */

/** A calendar date (YYYY-MM-DD) read as a local day, so it never shifts by a time zone: "Mar 4, 2026". */
export function formatDay(isoDate: string): string {
  const [y, m, d] = isoDate.slice(0, 10).split('-').map(Number);
  if (!y || !m || !d) return isoDate;
  return new Intl.DateTimeFormat('en-US', { day: 'numeric', month: 'short', year: 'numeric' }).format(new Date(y, m - 1, d));
}

/** Today as YYYY-MM-DD in the viewer's own time zone. */
export function todayIso(): string {
  const now = new Date();
  return `${now.getFullYear()}-${String(now.getMonth() + 1).padStart(2, '0')}-${String(now.getDate()).padStart(2, '0')}`;
}
