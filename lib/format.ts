/**
 * Dates and counts as every screen, mail and export writes them. One fixed time zone (UTC)
 * and one locale, so the server's render and the browser's hydration give the same text
 * whatever the machine's zone is.
 */
export const DISPLAY_TIME_ZONE = 'UTC';

const dateTimeFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: DISPLAY_TIME_ZONE });
const dayFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeZone: DISPLAY_TIME_ZONE });

/** "2 Dec 2026, 03:51 UTC". */
export function formatDateTime(d: Date | string | number): string {
  return `${dateTimeFormat.format(new Date(d))} UTC`;
}

/** "2026-12-02" — for file names and compact tables. */
export function formatIsoDay(d: Date | string | number): string {
  return new Date(d).toISOString().slice(0, 10);
}

/** "2026-12-02 03:51 UTC" — for reports (sorts as text). */
export function formatIsoMinute(d: Date | string | number): string {
  return `${new Date(d).toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/** "12,345". */
export function formatCount(n: number): string {
  return n.toLocaleString('en');
}
