import * as z from 'zod';

/**
 * The plausible range of every number and date a request may carry, declared once. Every request
 * schema builds its numeric and date fields from these, so validation (400 naming the field), the
 * web forms and the OpenAPI document (minimum/maximum and a description) agree.
 *
 * Bounds are deliberately wide: they refuse what cannot be a real DLS result (1e308 nm, 1e-300 nm,
 * a PDI of 7, a due date in 1900), never an unusual but real one. Where no published source fixes a
 * bound it is marked "common practice"; values recalled from memory say so.
 */

export interface NumberRange {
  /** Smallest allowed value (inclusive unless `minExclusive`). */
  readonly min: number;
  readonly max: number;
  readonly minExclusive?: boolean;
  readonly unit: string;
  /** Words a person reads in an error message (no field paths). */
  readonly label: string;
  /** Where the bound comes from. */
  readonly source: string;
}

export const RANGES = {
  /**
   * Hydrodynamic diameter by DLS: about 0.3 nm (small molecules) to 10 µm (sedimentation and number
   * fluctuations take over). Common practice; instrument data sheets quote similar spans (from memory).
   */
  diameterNm: {
    min: 0.3,
    max: 10_000,
    unit: 'nm',
    label: 'Diameter',
    source: 'common practice (DLS covers about 0.3 nm to 10 µm)',
  },
  /** Cumulants PDI = µ2/Γ² is a ratio between 0 and 1 (ISO 22412:2017 cumulants method; from memory). */
  pdi: {
    min: 0,
    max: 1,
    unit: '',
    label: 'PDI',
    source: 'definition of the cumulants PDI (ISO 22412:2017, from memory)',
  },
  /** Any measurand's value in its own unit (zeta potentials may be negative): a sanity bound only. */
  measuredValue: {
    min: -1e6,
    max: 1e6,
    unit: "measurand's unit",
    label: 'Value',
    source: 'common practice (sanity bound)',
  },
  /** A standard or expanded uncertainty in the measurand's unit: above 0 and at most 1e6. */
  uncertainty: {
    min: 0,
    minExclusive: true,
    max: 1e6,
    unit: "measurand's unit",
    label: 'Uncertainty',
    source: 'common practice (sanity bound)',
  },
  /** u of a reference value (may be 0 for a value treated as exact). */
  referenceUncertainty: {
    min: 0,
    max: 1e6,
    unit: "measurand's unit",
    label: 'Uncertainty u',
    source: 'common practice (sanity bound)',
  },
  /** σ_pt (and σ_R, σ_r from a precision study) in the measurand's unit. */
  sigmaPt: {
    min: 1e-6,
    max: 1e6,
    unit: "measurand's unit",
    label: 'σ_pt',
    source: 'common practice (sanity bound)',
  },
  /** σ_pt as a percentage of x_pt. */
  sigmaPtPercent: {
    min: 0,
    minExclusive: true,
    max: 100,
    unit: '%',
    label: 'Percentage of x_pt',
    source: 'common practice',
  },
  /** Coverage factor k of an expanded uncertainty (k = 2 is usual). */
  coverageFactor: {
    min: 1,
    max: 10,
    unit: '',
    label: 'Coverage factor k',
    source: 'common practice (k = 2 for about 95 %)',
  },
  /**
   * Sample temperature for DLS in aqueous dispersions: 0–95 °C (liquid water at ambient pressure,
   * within the usual Peltier range). Common practice.
   */
  temperatureC: {
    min: 0,
    max: 95,
    unit: '°C',
    label: 'Temperature',
    source: 'common practice (aqueous DLS)',
  },
  /** Tolerance on the set-point temperature of an instrument check. */
  temperatureToleranceC: {
    min: 0,
    minExclusive: true,
    max: 10,
    unit: '°C',
    label: 'Temperature tolerance',
    source: 'common practice',
  },
  /** Equilibration time before a measurement. */
  equilibrationMin: {
    min: 0,
    max: 240,
    unit: 'min',
    label: 'Equilibration time',
    source: 'common practice',
  },
  /**
   * Dispersant viscosity: acetone about 0.3 mPa·s to glycerol–water mixtures about 100 mPa·s at
   * 25 °C (handbook values, from memory). Common practice.
   */
  viscosityMPas: {
    min: 0.2,
    max: 100,
    unit: 'mPa·s',
    label: 'Viscosity',
    source: 'common practice (dispersant viscosities, from memory)',
  },
  /** Refractive index of the dispersant or material. */
  refractiveIndex: {
    min: 1,
    max: 2.5,
    unit: '',
    label: 'Refractive index',
    source: 'common practice',
  },
  /** Laser wavelength of a light-scattering instrument. */
  laserWavelengthNm: {
    min: 200,
    max: 2000,
    unit: 'nm',
    label: 'Laser wavelength',
    source: 'common practice',
  },
  /** Detection angle: strictly between 0° and 180°. */
  scatteringAngleDeg: {
    min: 0,
    minExclusive: true,
    max: 179.9,
    unit: '°',
    label: 'Scattering angle',
    source: 'geometry',
  },
  /** Filter pore size used in sample preparation. */
  filterPoreUm: {
    min: 0,
    minExclusive: true,
    max: 100,
    unit: 'µm',
    label: 'Filter pore size',
    source: 'common practice',
  },
  /** Tolerance of an instrument check around the reference value. */
  toleranceNm: {
    min: 0,
    minExclusive: true,
    max: 1000,
    unit: 'nm',
    label: 'Tolerance',
    source: 'common practice',
  },
  /** PDI limit of an instrument check. */
  pdiLimit: {
    min: 0,
    minExclusive: true,
    max: 1,
    unit: '',
    label: 'PDI limit',
    source: 'definition of the cumulants PDI',
  },
} as const satisfies Record<string, NumberRange>;

export type RangeName = keyof typeof RANGES;

/**
 * An uncertainty larger than this many times the result is not a measurement uncertainty but a
 * typing error (common practice: an uncertainty is below the order of the value it belongs to).
 */
export const UNCERTAINTY_MAX_RATIO = 10;

/** Calendar dates a request may carry (YYYY-MM-DD), inclusive. */
export const DATE_MIN = '2000-01-01';
export const DATE_MAX = '2100-12-31';
/** An assessor's access runs for at most this many years (common practice: one accreditation cycle). */
export const GRANT_MAX_YEARS = 5;

const fmt = (v: number): string =>
  Math.abs(v) >= 1e5 || (v !== 0 && Math.abs(v) < 1e-3) ? v.toExponential() : String(v);

/** "between 0.3 and 10000 nm" / "above 0 and at most 100 %". */
export function rangeText(r: NumberRange): string {
  const unit = r.unit && !r.unit.includes(' ') ? ` ${r.unit}` : '';
  return r.minExclusive
    ? `above ${fmt(r.min)} and at most ${fmt(r.max)}${unit}`
    : `between ${fmt(r.min)} and ${fmt(r.max)}${unit}`;
}

/**
 * A number field with the named range: finite, within bounds, with a message naming the bound and
 * an OpenAPI description saying the range and its source.
 */
export function boundedNumber(
  name: RangeName,
  opts: { label?: string; required?: string; tooSmall?: string; tooLarge?: string } = {},
): z.ZodNumber {
  const r: NumberRange = RANGES[name];
  const label = opts.label ?? r.label;
  const message = `${label} must be ${rangeText(r)}.`;
  const empty = (v: unknown) => v === undefined || v === null || v === '';
  let s = z.number({
    error: (iss) =>
      empty(iss.input)
        ? (opts.required ?? `Enter the ${label.toLowerCase()}.`)
        : `${label} must be a number.`,
  });
  // A value at or below 0 for a strictly positive quantity reads best as "must be above 0".
  const small = opts.tooSmall ?? message;
  const tooSmall = (iss: { input?: unknown }) =>
    typeof iss.input === 'number' && iss.input <= 0 && r.min >= 0 && !opts.tooSmall
      ? `${label} must be above 0.`
      : small;
  s = r.minExclusive
    ? s.gt(r.min, { error: tooSmall })
    : s.min(r.min, { error: r.min > 0 ? tooSmall : small });
  s = s.max(r.max, { message: opts.tooLarge ?? message });
  return s.describe(
    `${label}${r.unit && !r.unit.includes(' ') ? ` in ${r.unit}` : r.unit ? ` in the ${r.unit}` : ''}, ${rangeText(r)} (${r.source}).`,
  );
}

const DATE_RE = /^\d{4}-\d{2}-\d{2}$/;

/** YYYY-MM-DD within DATE_MIN…DATE_MAX. */
export function dateOnly(label = 'Date'): z.ZodType<string, string> {
  return z.iso
    .date({ message: `${label}: use a date like 2026-03-31.` })
    .refine((d) => !DATE_RE.test(d) || (d >= DATE_MIN && d <= DATE_MAX), {
      message: `${label} must lie between ${DATE_MIN} and ${DATE_MAX}.`,
    })
    .meta({
      description: `${label} (YYYY-MM-DD), from ${DATE_MIN} to ${DATE_MAX}.`,
      'x-minimum': DATE_MIN,
      'x-maximum': DATE_MAX,
    });
}

/** An ISO 8601 timestamp with offset, whose UTC date lies within DATE_MIN…DATE_MAX. */
export function boundedTimestamp(label = 'Time'): z.ZodType<string, string> {
  return z.iso
    .datetime({ offset: true, message: `${label}: use a time like 2026-03-31T17:00:00Z.` })
    .refine(
      (t) => {
        const ms = Date.parse(t);
        if (!Number.isFinite(ms)) return false;
        const d = new Date(ms).toISOString().slice(0, 10);
        return d >= DATE_MIN && d <= DATE_MAX;
      },
      { message: `${label} must lie between ${DATE_MIN} and ${DATE_MAX}.` },
    )
    .meta({
      description: `${label} (ISO 8601 with offset), from ${DATE_MIN} to ${DATE_MAX}.`,
      'x-minimum': DATE_MIN,
      'x-maximum': DATE_MAX,
    });
}

/** Whole days from one YYYY-MM-DD to another. */
export function daysBetween(from: string, to: string): number {
  return Math.round(
    (Date.parse(to.slice(0, 10) + 'T00:00:00Z') - Date.parse(from.slice(0, 10) + 'T00:00:00Z')) /
      86_400_000,
  );
}

// ---------------------------------------------------------------- text

/**
 * Characters no text field accepts: C0 controls except tab, line feed and carriage return, DEL,
 * and UTF-16 surrogates without their partner (PostgreSQL cannot store them). The API refuses them
 * at the edge for every field (api/src/http/route.ts); the schemas say so too, for the web forms.
 */
export const FORBIDDEN_TEXT =
  // eslint-disable-next-line no-control-regex
  /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Why a string is refused, or null when it is clean. */
export function textProblem(s: string): string | null {
  const m = FORBIDDEN_TEXT.exec(s);
  if (!m) return null;
  const code = m[0].charCodeAt(0);
  const hex = 'U+' + code.toString(16).toUpperCase().padStart(4, '0');
  if (code >= 0xd800 && code <= 0xdfff)
    return `Contains an incomplete character (a lone surrogate, ${hex}); retype the text.`;
  return `Contains a control character (${hex}) that text may not hold; remove it.`;
}

/** Line breaks and tabs are allowed only in multi-line fields. */
const LINE_BREAK = /[\r\n\t]/;

/** One line of text, trimmed, at most `max` characters, no control characters. */
export function singleLine(
  max: number,
  opts: { min?: number; required?: string } = {},
): z.ZodString {
  let s = z.string().trim();
  if (opts.min)
    s = s.min(opts.min, {
      message: opts.required ?? `Enter at least ${opts.min} character${opts.min === 1 ? '' : 's'}.`,
    });
  return s
    .max(max, { message: `Use at most ${max} characters.` })
    .refine((v) => !LINE_BREAK.test(v), { message: 'Use one line (no line breaks or tabs).' })
    .refine((v) => textProblem(v) === null, {
      message: 'Contains a character that text may not hold.',
    })
    .describe(`One line of text, at most ${max} characters.`) as unknown as z.ZodString;
}

/** Text that may span lines, at most `max` characters, no control characters other than tab and line breaks. */
export function multiLine(max: number, opts: { trim?: boolean } = {}): z.ZodString {
  return (opts.trim ? z.string().trim() : z.string())
    .max(max, { message: `Use at most ${max} characters.` })
    .refine((v) => textProblem(v) === null, {
      message: 'Contains a character that text may not hold.',
    })
    .describe(`Text, at most ${max} characters; line breaks allowed.`) as unknown as z.ZodString;
}

/** An item code or measurand key that a request names (the server looks it up): one line, 1–100 characters. */
export const KeyText = singleLine(100, { min: 1 });

/** A participant code that a request names: one line, 1–50 characters. */
export const ParticipantCodeText = singleLine(50, { min: 1 });

/**
 * The path of the first duplicate in a list by key, as zod issue input, or null.
 * Used by the schemas that refuse a repeated item or measurand.
 */
export function firstDuplicate<T>(
  list: readonly T[],
  key: (t: T) => string,
): { index: number; key: string } | null {
  const seen = new Set<string>();
  for (let i = 0; i < list.length; i++) {
    const k = key(list[i]!);
    if (seen.has(k)) return { index: i, key: k };
    seen.add(k);
  }
  return null;
}
