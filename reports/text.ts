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

/** Words for a signal, ISO 13528 thresholds (see docs/STATISTICS.md; words: docs/GLOSSARY.md). */
export const SIGNAL_WORDS: Record<'acceptable' | 'warning' | 'action', string> = {
  acceptable: 'acceptable',
  warning: 'warning signal',
  action: 'action signal',
};

/** Our palette (docs/QUALITY.md "Look"). */
export const PALETTE = {
  ink: '#1f3a5f',
  teal: '#1b7f79',
  saffron: '#b7791f',
  carmine: '#a4262c',
  grey: '#5b6470',
  rule: '#c9cfd6',
} as const;

export const SIGNAL_COLOURS: Record<'acceptable' | 'warning' | 'action', string> = {
  acceptable: PALETTE.teal,
  warning: PALETTE.saffron,
  action: PALETTE.carmine,
};

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
