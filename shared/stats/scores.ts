/**
 * Performance scores of ISO 13528:2015 §9 and their signals.
 *
 * Formulas as in docs/STATISTICS.md; the same formulas and thresholds are printed in the
 * NIST Dataplot Reference Manual (zscore, zprime, zetascor, enscore pages). All scores are
 * dimensionless; x, x_pt, σ_pt and the uncertainties share the unit of the measurand.
 */

/** ISO 13528 / ISO/IEC 17043 signal for a score. */
export type Signal = 'acceptable' | 'warning' | 'action';

/** Which score a number is: z-like scores share thresholds 2 and 3; En uses 1. */
export type ScoreKind = 'z' | 'zPrime' | 'zeta' | 'En';

function positive(v: number, what: string): number {
  if (!(v > 0) || !Number.isFinite(v)) {
    throw new RangeError(`${what} must be a finite positive number, got ${v}`);
  }
  return v;
}

function finite(v: number, what: string): number {
  if (!Number.isFinite(v)) throw new RangeError(`${what} must be a finite number, got ${v}`);
  return v;
}

/**
 * z = (x − x_pt)/σ_pt, dimensionless. Source: ISO 13528:2015 §9.4.
 * @throws RangeError if σ_pt ≤ 0 or any input is not finite.
 */
export function zScore(x: number, assignedValue: number, sigmaPt: number): number {
  return (finite(x, 'x') - finite(assignedValue, 'x_pt')) / positive(sigmaPt, 'σ_pt');
}

/**
 * z′ = (x − x_pt)/√(σ_pt² + u²(x_pt)), dimensionless. Source: ISO 13528:2015 §9.5.
 * @param uAssigned standard uncertainty u(x_pt), ≥ 0.
 * @throws RangeError if σ_pt ≤ 0, u(x_pt) < 0, or any input is not finite.
 */
export function zPrimeScore(
  x: number,
  assignedValue: number,
  sigmaPt: number,
  uAssigned: number,
): number {
  positive(sigmaPt, 'σ_pt');
  if (!(uAssigned >= 0)) throw new RangeError(`u(x_pt) must be ≥ 0, got ${uAssigned}`);
  return (finite(x, 'x') - finite(assignedValue, 'x_pt')) / Math.hypot(sigmaPt, uAssigned);
}

/**
 * ζ = (x − x_pt)/√(u²(x) + u²(x_pt)), dimensionless, standard uncertainties.
 * Source: ISO 13528:2015 §9.6.
 * @throws RangeError if both uncertainties are 0, either is negative, or input is not finite.
 */
export function zetaScore(x: number, assignedValue: number, u: number, uAssigned: number): number {
  if (!(u >= 0) || !(uAssigned >= 0)) throw new RangeError('ζ: uncertainties must be ≥ 0');
  const den = positive(Math.hypot(u, uAssigned), 'ζ denominator √(u²(x) + u²(x_pt))');
  return (finite(x, 'x') - finite(assignedValue, 'x_pt')) / den;
}

/**
 * En = (x − x_pt)/√(U²(x) + U²(x_pt)), dimensionless, EXPANDED uncertainties (U = k·u).
 * Source: ISO 13528:2015 §9.7.
 * @throws RangeError if both uncertainties are 0, either is negative, or input is not finite.
 */
export function enNumber(
  x: number,
  assignedValue: number,
  expandedU: number,
  expandedUAssigned: number,
): number {
  if (!(expandedU >= 0) || !(expandedUAssigned >= 0)) {
    throw new RangeError('En: expanded uncertainties must be ≥ 0');
  }
  const den = positive(
    Math.hypot(expandedU, expandedUAssigned),
    'En denominator √(U²(x) + U²(x_pt))',
  );
  return (finite(x, 'x') - finite(assignedValue, 'x_pt')) / den;
}

/** D = x − x_pt, unit of the measurand. Source: ISO 13528:2015 §9.3. */
export function difference(x: number, assignedValue: number): number {
  return finite(x, 'x') - finite(assignedValue, 'x_pt');
}

/**
 * D% = 100·(x − x_pt)/x_pt, percent. Source: ISO 13528:2015 §9.3.
 * @throws RangeError if x_pt = 0.
 */
export function percentDifference(x: number, assignedValue: number): number {
  if (assignedValue === 0)
    throw new RangeError('D%: x_pt = 0, the relative difference is undefined');
  return (100 * difference(x, assignedValue)) / assignedValue;
}

/**
 * The signal limits of ISO 13528:2015 §9 / ISO/IEC 17043, the one place they are written:
 * z, z′, ζ beyond `warning` (2) give a warning signal, from `action` (3) on an action signal;
 * |En| beyond `en` (1) gives an action signal. Everything else (run rules, explanations, chart
 * lines, report text) reads them from here.
 */
export const SIGNAL_LIMITS = { warning: 2, action: 3, en: 1 } as const;

/**
 * Signal for a score (ISO 13528:2015 §9; ISO/IEC 17043):
 * z, z′, ζ: |s| ≤ 2 acceptable, 2 < |s| < 3 warning, |s| ≥ 3 action;
 * En: |En| ≤ 1 acceptable, |En| > 1 action.
 * @throws RangeError on a non-finite score.
 */
export function signalFor(score: number, kind: ScoreKind = 'z'): Signal {
  const a = Math.abs(finite(score, 'score'));
  if (kind === 'En') return a <= SIGNAL_LIMITS.en ? 'acceptable' : 'action';
  if (a <= SIGNAL_LIMITS.warning) return 'acceptable';
  return a < SIGNAL_LIMITS.action ? 'warning' : 'action';
}
