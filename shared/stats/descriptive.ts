/**
 * Descriptive statistics used throughout Ringlet: mean, variance, SD, median, quantiles and the
 * robust scale estimators MADe and nIQR.
 *
 * Pure functions, no I/O: this file runs on the server and in the browser.
 * Numerical care (see docs/STATISTICS.md, "Numerical care"): sums of squares are taken about
 * the mean (two-pass, with the corrected two-pass term of Chan, Golub & LeVeque 1983, "Algorithms
 * for computing the sample variance", Am. Stat. 37, 242-247), so large offsets do not cost digits.
 *
 * The checked entry points (`mean`, `variance`, `median`, `quantile`) use simple-statistics
 * (Kahan–Babuška summation for the mean, the two-pass sum of squared deviations for the
 * variance, R type 7 quantiles); they pass the NIST StRD certified values of descriptive.spec.ts
 * to the same tolerances. The unchecked variants below (`meanUnchecked`, `varianceAbout`,
 * `quantileOfSorted`, `medianInPlace`) stay hand-written for hot loops on validated data.
 */
import * as ss from 'simple-statistics';

/** Throws a RangeError unless `xs` is non-empty and every value is a finite number. */
export function assertFiniteSample(xs: readonly number[], what = 'sample'): void {
  if (xs.length === 0) {
    throw new RangeError(`${what}: empty input (at least one value is needed)`);
  }
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i];
    if (typeof x !== 'number' || !Number.isFinite(x)) {
      throw new RangeError(`${what}: value at index ${i} is not a finite number (${String(x)})`);
    }
  }
}

/**
 * Arithmetic mean, same unit as the data.
 * Two-pass: a first estimate, then the mean of the residuals is added as a correction
 * (recovers the digits lost to rounding when the data sit on a large offset).
 * Source: textbook definition; correction step as in Chan, Golub & LeVeque (1983).
 * @throws RangeError on empty input or non-finite values.
 */
export function mean(xs: readonly number[]): number {
  assertFiniteSample(xs, 'mean');
  return ss.mean(xs as number[]);
}

/** Mean without input checks, for hot loops whose callers already validated the data. */
export function meanUnchecked(xs: readonly number[]): number {
  const n = xs.length;
  let s = 0;
  for (let i = 0; i < n; i++) s += xs[i];
  const m0 = s / n;
  let c = 0;
  for (let i = 0; i < n; i++) c += xs[i] - m0;
  return m0 + c / n;
}

/**
 * Sample variance with the n − 1 denominator, unit² of the data.
 * Corrected two-pass algorithm: (Σd² − (Σd)²/n)/(n − 1), d = x − x̄
 * (Chan, Golub & LeVeque 1983, eq. 1.7).
 * @throws RangeError on fewer than 2 values or non-finite values.
 */
export function variance(xs: readonly number[]): number {
  assertFiniteSample(xs, 'variance');
  if (xs.length < 2) {
    throw new RangeError('variance: at least 2 values are needed for the n − 1 estimator');
  }
  return ss.sampleVariance(xs as number[]);
}

/** Corrected two-pass sum about `m`, divided by n − 1. No input checks (caller validated). */
export function varianceAbout(xs: readonly number[], m: number): number {
  const n = xs.length;
  let sd = 0;
  let sd2 = 0;
  for (let i = 0; i < n; i++) {
    const d = xs[i] - m;
    sd += d;
    sd2 += d * d;
  }
  const v = (sd2 - (sd * sd) / n) / (n - 1);
  return v > 0 ? v : 0;
}

/**
 * Sample standard deviation (n − 1 denominator), same unit as the data: √variance.
 * @throws RangeError on fewer than 2 values or non-finite values.
 */
export function sd(xs: readonly number[]): number {
  return Math.sqrt(variance(xs));
}

/** Ascending numeric copy of `xs` (Float64Array sort is numeric, no comparator needed). */
export function sortedCopy(xs: readonly number[]): Float64Array {
  const a = Float64Array.from(xs);
  a.sort();
  return a;
}

/**
 * Median of already sorted values (ascending). No input checks.
 * Even n: mean of the two middle values.
 */
export function medianOfSorted(a: ArrayLike<number>): number {
  const n = a.length;
  const h = n >> 1;
  return n % 2 === 1 ? a[h] : (a[h - 1] + a[h]) / 2;
}

/**
 * Median of `a` in linear expected time, reordering `a` in place (Floyd–Rivest selection). Same
 * value as `medianOfSorted` of the sorted values: even n gives the mean of the two middle values.
 * No input checks; `a` must not be empty.
 */
export function medianInPlace(a: Float64Array): number {
  const n = a.length;
  const h = n >> 1;
  selectInPlace(a, h, 0, n - 1);
  const upper = a[h];
  if (n % 2 === 1) return upper;
  // The lower middle value is the largest of a[0..h-1], all ≤ a[h] after selection.
  let lower = a[0];
  for (let i = 1; i < h; i++) if (a[i] > lower) lower = a[i];
  return (lower + upper) / 2;
}

/**
 * Puts the k-th smallest value (0-based) of a[left..right] at a[k], smaller or equal ones before
 * it and larger or equal ones after it. Floyd & Rivest's SELECT (CACM 18(3), 1975, Algorithm
 * 489): on a long range it first selects within a sample around k of about n^(2/3) values, so
 * that a[k] is a pivot close to the k-th value and one partition of the range leaves few values
 * to look at (about n + min(k, n − k) comparisons instead of about 3.4 n for the median by
 * median-of-three quickselect).
 */
function selectInPlace(a: Float64Array, k: number, left: number, right: number): void {
  while (right > left) {
    if (right - left > 600) {
      const n = right - left + 1;
      const m = k - left + 1;
      const z = Math.log(n);
      const s = 0.5 * Math.exp((2 * z) / 3);
      const sd = 0.5 * Math.sqrt((z * s * (n - s)) / n) * (m - n / 2 < 0 ? -1 : 1);
      const sampleLeft = Math.max(left, Math.floor(k - (m * s) / n + sd));
      const sampleRight = Math.min(right, Math.floor(k + ((n - m) * s) / n + sd));
      selectInPlace(a, k, sampleLeft, sampleRight);
    }
    const t = a[k];
    let i = left;
    let j = right;
    swap(a, left, k);
    if (a[right] > t) swap(a, left, right);
    while (i < j) {
      swap(a, i, j);
      i++;
      j--;
      while (a[i] < t) i++;
      while (a[j] > t) j--;
    }
    if (a[left] === t) swap(a, left, j);
    else {
      j++;
      swap(a, j, right);
    }
    if (j <= k) left = j + 1;
    if (k <= j) right = j - 1;
  }
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/**
 * Median, same unit as the data. Even n: mean of the two middle values
 * (equals the type-7 quantile at p = 0.5).
 * @throws RangeError on empty input or non-finite values.
 */
export function median(xs: readonly number[]): number {
  assertFiniteSample(xs, 'median');
  return ss.medianSorted(Array.from(sortedCopy(xs)));
}

/**
 * Quantile of already sorted values by linear interpolation, R type 7 (Hyndman & Fan 1996,
 * "Sample quantiles in statistical packages", Am. Stat. 50, 361-365, definition 7):
 * h = (n − 1)·p, Q(p) = x₍⌊h⌋₎ + (h − ⌊h⌋)·(x₍⌊h⌋+1₎ − x₍⌊h⌋₎), zero-based order statistics.
 */
export function quantileOfSorted(a: ArrayLike<number>, p: number): number {
  const n = a.length;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  if (lo >= n - 1) return a[n - 1];
  const frac = h - lo;
  return frac === 0 ? a[lo] : a[lo] + frac * (a[lo + 1] - a[lo]);
}

/**
 * p-quantile, same unit as the data, by linear interpolation between order statistics:
 * R type 7 (Hyndman & Fan 1996, definition 7; the default of R and of most spreadsheets'
 * QUARTILE.INC). p must lie in [0, 1].
 * @throws RangeError on empty input, non-finite values or p outside [0, 1].
 */
export function quantile(xs: readonly number[], p: number): number {
  assertFiniteSample(xs, 'quantile');
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantile: p must be in [0, 1], got ${p}`);
  return ss.quantileSorted(Array.from(sortedCopy(xs)), p);
}

/**
 * Median absolute deviation (unscaled): median|x_i − median(x)|, same unit as the data.
 * @throws RangeError on empty input or non-finite values.
 */
export function mad(xs: readonly number[]): number {
  assertFiniteSample(xs, 'mad');
  const a = sortedCopy(xs);
  const m = medianOfSorted(a);
  for (let i = 0; i < a.length; i++) a[i] = Math.abs(a[i] - m);
  a.sort();
  return medianOfSorted(a);
}

/** Scale factor turning MAD into a normal-consistent SD (ISO 13528:2015 C.2; ≈ 1/Φ⁻¹(0.75)). */
export const MADE_FACTOR = 1.483;
/** Scale factor turning the IQR into a normal-consistent SD (ISO 13528:2015 C.2; ≈ 1/1.349). */
export const NIQR_FACTOR = 0.7413;

/**
 * Scaled MAD, MADe = 1.483 · median|x_i − median(x)|, same unit as the data.
 * Source: ISO 13528:2015 Annex C.2 (from memory; constant as in docs/STATISTICS.md).
 * @throws RangeError on empty input or non-finite values.
 */
export function madE(xs: readonly number[]): number {
  return MADE_FACTOR * mad(xs);
}

/**
 * Normalised interquartile range, nIQR = 0.7413 · (Q3 − Q1), same unit as the data.
 * Quartiles by linear interpolation, R type 7 (see {@link quantile}).
 * Source: ISO 13528:2015 Annex C.2 (from memory; constant as in docs/STATISTICS.md).
 * @throws RangeError on empty input or non-finite values.
 */
export function nIqr(xs: readonly number[]): number {
  assertFiniteSample(xs, 'nIqr');
  const a = sortedCopy(xs);
  return NIQR_FACTOR * (quantileOfSorted(a, 0.75) - quantileOfSorted(a, 0.25));
}
