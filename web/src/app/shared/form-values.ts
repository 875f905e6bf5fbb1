import { formatDate } from '@angular/common';

/**
 * A number input's value: empty stays null (the shared schema then says what to enter). Angular
 * gives a cleared number input as null, a typed one as a number; '' and strings are read as numbers.
 */
export function numberOrNull(v: number | string | null | undefined): number | null {
  if (v === null || v === undefined || v === '') return null;
  return typeof v === 'number' ? v : Number(v);
}

/** A local date-time input ("2026-03-31T12:00") → ISO 8601 UTC, or null when empty. */
export function localToIso(value: string): string | null {
  if (!value) return null;
  const d = new Date(value);
  return Number.isNaN(d.getTime()) ? value : d.toISOString();
}

/** ISO 8601 → the value a datetime-local input shows, in the user's time zone ("2026-06-30T14:00"). */
export function isoToLocal(iso: string | null): string {
  if (!iso) return '';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return '';
  // A fixed pattern, not a locale's: the input wants exactly this form.
  return formatDate(d, "yyyy-MM-dd'T'HH:mm", 'en-US');
}
