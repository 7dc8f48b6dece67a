/** Moments as the notices and the needs-you list show them, with the viewer's time zone named ("4 Mar 2026, 15:05 UTC"). */
export { formatDateTime as formatWhen } from '@client/lib/dates';
