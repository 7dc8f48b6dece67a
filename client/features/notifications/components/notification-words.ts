/** Moments as the notices and the needs-you list show them, with the viewer's time zone named ("Mar 4, 2026, 3:05 PM UTC"). */
const when = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', hour: 'numeric', minute: '2-digit', timeZoneName: 'short' });

export const formatWhen = (iso: string) => when.format(new Date(iso));
