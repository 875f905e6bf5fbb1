/**
 * Text and number helpers shared by every report builder (workbook, PDFs, evidence pack).
 * Pure functions: no I/O.
 */

/**
 * Neutralises spreadsheet formulas in user text: a value starting with = + - @ (or a tab or
 * carriage return, which some spreadsheet programs strip before reading a formula) gets a
 * leading apostrophe, so it stays text and no formula runs when the file is opened
 * (OWASP "CSV injection" guidance; common practice). Numbers are never passed through here.
 */
export function neutraliseFormula(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/** A value rounded to the measurand's decimals for display (`—` for none). */
export function fixed(v: number | null | undefined, decimals: number): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  return v.toFixed(Math.max(0, Math.min(10, decimals)));
}

/** exceljs number format for a number of decimals: `0`, `0.0`, `0.000` … */
export function numberFormat(decimals: number): string {
  const d = Math.max(0, Math.min(10, decimals));
  return d === 0 ? '0' : `0.${'0'.repeat(d)}`;
}

/** Scores (z, z′, ζ, En) are shown with two decimals (common practice). */
export const SCORE_DECIMALS = 2;

/** Signal words, colours and the palette: defined once in shared/charts/signals.ts. */
export { PALETTE, SIGNAL_COLOURS, SIGNAL_RULE_TEXT, SIGNAL_WORDS } from '../shared/charts/signals';

/**
 * Blunder hints described in general words for reports (the Lab bench shows each lab its own
 * specific message). Keys are shared/stats BlunderCode values.
 */
export const HINT_WORDS: Record<string, string> = {
  'radius-diameter':
    'result about half or twice the assigned value: a radius may have been reported as a diameter, or the reverse',
  'unit-slip': 'result off by a power of ten: a unit may have slipped (nm, µm)',
  'viscosity-temperature':
    'result off by the ratio of water viscosities at two temperatures: the dispersant viscosity or the temperature may not match the measurement',
  'dust-aggregates':
    'result above the assigned value with a high PDI: dust or aggregates may have been in the sample',
};

export function hintWords(code: string): string {
  return HINT_WORDS[code] ?? 'a pattern that often points to a preparation or data-entry slip';
}

/** A short label for a score kind. */
export const SCORE_LABEL: Record<string, string> = { z: 'z', zPrime: 'z′', zeta: 'ζ', en: 'En' };

/** Safe file-name part: letters, digits, dot, dash and underscore only. */
export function fileSafe(s: string): string {
  return s.replace(/[^A-Za-z0-9._-]+/g, '_').replace(/^_+|_+$/g, '') || 'file';
}
