/** Moments as the notices and the needs-you list show them, with the viewer's time zone named. */
const when = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short', timeZoneName: 'short' });

export const formatWhen = (iso: string) => when.format(new Date(iso));
