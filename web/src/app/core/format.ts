import { formatNumber } from '@angular/common';

/**
 * Dates and money on screens, in one place. Dates on the wire are ISO 8601 (UTC timestamps or
 * calendar dates); a screen shows them in the user's own locale (the browser's languages), with
 * `Intl.DateTimeFormat` — Angular's `formatDate` would need the locale data of every possible
 * user locale bundled, and the app ships en-US only. Money amounts use Angular's `formatNumber`
 * with the app's locale and two decimals, followed by the ISO 4217 code ("450.00 EUR").
 */

const DATE = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });
const DATE_TIME = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** A calendar date ("2025-03-14") is midnight local time, never the day before in UTC−x. */
function toDate(iso: string): Date {
  return new Date(iso.length === 10 ? `${iso}T00:00:00` : iso);
}

/** ISO 8601 → the user's locale; the date only unless `withTime`; `—` for none. */
export function formatDate(iso: string | null | undefined, withTime = false): string {
  if (!iso) return '—';
  const d = toDate(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return (withTime ? DATE_TIME : DATE).format(d);
}

/** ISO 8601 timestamp → date and time in the user's locale. */
export function formatDateTime(iso: string | null | undefined): string {
  return formatDate(iso, true);
}

/** Money in minor units → "450.00 EUR" (2 decimals; the app's locale for digits and grouping). */
export function formatMoney(minor: number, currency: string, locale = 'en-US'): string {
  return `${formatNumber(minor / 100, locale, '1.2-2')} ${currency}`;
}
