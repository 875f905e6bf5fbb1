/**
 * ISO 13528 Algorithm A: robust mean x* and robust standard deviation s*.
 *
 * Source: ISO 13528:2015 Annex C.3 (2005 edition eqs C.1–C.6), as summarised in
 * docs/STATISTICS.md. Constants 1.483 (MAD → SD) and 1.134 (correction for winsorizing at
 * 1.5 s*). Ringlet iterates to full convergence instead of the standard's "third significant
 * figure" stop, and reports the iteration count.
 */
import { assertFiniteSample, medianInPlace } from './descriptive';

/** Constants of Algorithm A, stored with every result so it can be reproduced. */
export interface AlgorithmAConstants {
  /** MAD scale factor (ISO 13528 C.3): s* = 1.483 · median|x_i − x*| at the start. */
  readonly madFactor: number;
  /** SD inflation after winsorizing (ISO 13528 C.3): s* = 1.134 · SD(winsorized). */
  readonly sdFactor: number;
  /** Winsorizing half-width in units of s*: δ = 1.5 · s* (ISO 13528 C.3). */
  readonly k: number;
  /** Stop when the relative change of x* and s* (relative to s*) is below this. */
  readonly tolerance: number;
  /** Give up after this many update steps. */
  readonly maxIterations: number;
}

export const ALGORITHM_A_DEFAULTS: AlgorithmAConstants = {
  madFactor: 1.483,
  sdFactor: 1.134,
  k: 1.5,
  tolerance: 1e-12,
  maxIterations: 1000,
};

/**
 * How the run ended:
 * - `converged`: x* and s* stopped changing (relative change < tolerance);
 * - `not-converged`: maxIterations reached; the last values are returned;
 * - `too-few-values`: n < 3; x* = median, s* = MADe (0 for n = 1), no iteration;
 * - `zero-spread`: s* = 0 at the start (half or more of the values identical, or all equal);
 *   x* = median, s* = 0. σ_pt must then come from another rule (the coordinator's choice).
 */
export type AlgorithmAOutcome = 'converged' | 'not-converged' | 'too-few-values' | 'zero-spread';

export interface AlgorithmAResult {
  /** Robust mean x*, unit of the data. */
  readonly robustMean: number;
  /** Robust standard deviation s*, unit of the data. */
  readonly robustSd: number;
  /** Number of winsorize-and-update steps performed (0 if none). */
  readonly iterations: number;
  readonly converged: boolean;
  readonly outcome: AlgorithmAOutcome;
  /** Number of values used. */
  readonly n: number;
  readonly constants: AlgorithmAConstants;
}

/**
 * ISO 13528 Algorithm A (Annex C.3): robust mean and SD, same unit as the data.
 *
 * 1. x* = median(x), s* = 1.483 · median|x_i − x*|;
 * 2. δ = 1.5 · s*, winsorize every x_i to [x* − δ, x* + δ];
 * 3. x* = mean of the winsorized values, s* = 1.134 · SD(winsorized) (n − 1);
 * 4. repeat 2–3 until the change of x* and s* is below `tolerance` · s* (default 1e-12),
 *    at most `maxIterations` (default 1000) steps.
 *
 * The data are centred on the starting median and scaled by the starting s* before iterating,
 * so large offsets do not turn rounding noise into endless iterations and extreme scales do not
 * underflow or overflow. Degenerate cases (n < 3, s* = 0) return a
 * clear `outcome` and finite numbers, never NaN.
 * @throws RangeError on empty input or non-finite values.
 */
export function algorithmA(
  xs: readonly number[],
  options: Partial<AlgorithmAConstants> = {},
): AlgorithmAResult {
  assertFiniteSample(xs, 'algorithmA');
  return algorithmAUnchecked(xs, { ...ALGORITHM_A_DEFAULTS, ...options });
}

/** Reused work buffers: evaluate-round calls this thousands of times per round. */
let sortBuf = new Float64Array(64);
let centred = new Float64Array(64);

/** Algorithm A without input validation (callers in hot loops validated already). */
export function algorithmAUnchecked(
  xs: ArrayLike<number>,
  c: AlgorithmAConstants = ALGORITHM_A_DEFAULTS,
): AlgorithmAResult {
  const n = xs.length;
  if (sortBuf.length < n) {
    sortBuf = new Float64Array(Math.max(n, sortBuf.length * 2));
    centred = new Float64Array(sortBuf.length);
  }
  // Medians by selection, not sorting: linear in n. The winsorized sums come from a bucket
  // order with running sums (see bucketOrder), also linear.
  const a = sortBuf.subarray(0, n);
  for (let i = 0; i < n; i++) a[i] = xs[i];
  const m0 = medianInPlace(a);
  for (let i = 0; i < n; i++) a[i] = Math.abs(xs[i] - m0);
  let s = c.madFactor * medianInPlace(a);

  const base = { n, constants: c };
  if (n < 3) {
    return {
      ...base,
      robustMean: m0,
      robustSd: s,
      iterations: 0,
      converged: false,
      outcome: 'too-few-values',
    };
  }
  if (!(s > 0)) {
    return {
      ...base,
      robustMean: m0,
      robustSd: 0,
      iterations: 0,
      converged: false,
      outcome: 'zero-spread',
    };
  }

  // Iterate in centred and scaled coordinates, x = m0 + s0·d: no digits lost to an offset, and
  // no underflow or overflow of squares for data on extreme scales. x* = m0 + s0·mc.
  const s0 = s;
  const b = bucketOrder(xs, m0, s0);
  s = 1;
  let mc = 0;
  for (let it = 1; it <= c.maxIterations; it++) {
    const delta = c.k * s;
    const w = winsorizedSums(b, mc - delta, mc + delta);
    const m1 = w.sum / n;
    const varW = (w.squares - w.sum * m1) / (n - 1);
    const newMean = m1;
    const newS = c.sdFactor * Math.sqrt(varW > 0 ? varW : 0);
    const done =
      Math.abs(newMean - mc) <= c.tolerance * newS && Math.abs(newS - s) <= c.tolerance * newS;
    mc = newMean;
    s = newS;
    if (!(s > 0)) {
      // Cannot happen with δ > 0 and at least 3 values, but never hand back NaN.
      return {
        ...base,
        robustMean: m0 + s0 * mc,
        robustSd: 0,
        iterations: it,
        converged: false,
        outcome: 'zero-spread',
      };
    }
    if (done) {
      return {
        ...base,
        robustMean: m0 + s0 * mc,
        robustSd: s0 * s,
        iterations: it,
        converged: true,
        outcome: 'converged',
      };
    }
  }
  return {
    ...base,
    robustMean: m0 + s0 * mc,
    robustSd: s0 * s,
    iterations: c.maxIterations,
    converged: false,
    outcome: 'not-converged',
  };
}

/**
 * Half-width W of the binned range [−W, W] in units of the starting s* (values outside go to
 * two overflow bins, still exact, only scanned one by one). The winsorizing limits x* ± 1.5 s*
 * stay well inside it for any sample whose s* does not grow past about 3× its start.
 */
const BIN_HALF_WIDTH = 6;

/**
 * The centred and scaled values in bucket order (a counting sort by value bin: linear in n),
 * with running sums of the values and of their squares over the inner bins, so that the sums
 * of any run of whole inner bins are two subtractions.
 */
interface BucketOrder {
  readonly n: number;
  /** Number of inner bins; bin 0 holds v < −W, bin `bins + 1` holds v ≥ W. */
  readonly bins: number;
  /** Bins per unit of v. */
  readonly scale: number;
  /** The values, bin by bin (bins in increasing order; any order inside a bin). */
  readonly v: Float64Array;
  /** `start[k]` = index in `v` of bin k's first value; `start[bins + 2]` = n. */
  readonly start: Int32Array;
  /** Σ v and Σ v² over v[start[1] … i − 1] (0 at i = start[1]); defined for i ≥ start[1]. */
  readonly sum: Float64Array;
  readonly squares: Float64Array;
}

let bucketValues = new Float64Array(64);
let bucketSum = new Float64Array(65);
let bucketSquares = new Float64Array(65);
let bucketStart = new Int32Array(64);
let bucketOf = new Int32Array(64);

/**
 * Bin of v: monotone in v (the same floating-point formula for data and limits), so a value in
 * a lower bin than a limit is below it and one in a higher bin is above it.
 */
function binOf(v: number, bins: number, scale: number): number {
  if (v < -BIN_HALF_WIDTH) return 0;
  if (v >= BIN_HALF_WIDTH) return bins + 1;
  const k = Math.floor((v + BIN_HALF_WIDTH) * scale);
  return 1 + (k < bins - 1 ? k : bins - 1);
}

/** Bucket order of the values (x − m0)/s0 of `xs`. */
function bucketOrder(xs: ArrayLike<number>, m0: number, s0: number): BucketOrder {
  const n = xs.length;
  const bins = Math.max(16, n >> 2);
  const scale = bins / (2 * BIN_HALF_WIDTH);
  if (bucketValues.length < n) {
    bucketValues = new Float64Array(n);
    bucketSum = new Float64Array(n + 1);
    bucketSquares = new Float64Array(n + 1);
    bucketOf = new Int32Array(n);
  }
  if (bucketStart.length < bins + 3) bucketStart = new Int32Array(bins + 3);
  const start = bucketStart.subarray(0, bins + 3);
  start.fill(0);
  const of = bucketOf;
  const d = centred;
  for (let i = 0; i < n; i++) {
    const x = (xs[i] - m0) / s0;
    d[i] = x;
    const k = binOf(x, bins, scale);
    of[i] = k;
    start[k + 1]++;
  }
  for (let k = 0; k < bins + 2; k++) start[k + 1] += start[k];
  const v = bucketValues;
  // start[k] is used as bin k's next free slot, then restored.
  for (let i = 0; i < n; i++) v[start[of[i]]++] = d[i];
  for (let k = bins + 2; k > 0; k--) start[k] = start[k - 1];
  start[0] = 0;
  const sum = bucketSum;
  const squares = bucketSquares;
  const first = start[1];
  const last = start[bins + 1];
  sum[first] = 0;
  squares[first] = 0;
  for (let i = first; i < last; i++) {
    const x = v[i];
    sum[i + 1] = sum[i] + x;
    squares[i + 1] = squares[i] + x * x;
  }
  return { n, bins, scale, v, start, sum, squares };
}

/**
 * Σ w and Σ w² of the values winsorized to [lo, hi]: values in bins below lo's bin count as lo,
 * above hi's bin as hi, whole bins in between from the running sums, and only the values of the
 * (at most two) bins that hold a limit one by one.
 */
function winsorizedSums(b: BucketOrder, lo: number, hi: number): { sum: number; squares: number } {
  const { n, bins, scale, v, start } = b;
  const kLo = binOf(lo, bins, scale);
  const kHi = binOf(hi, bins, scale);
  const a0 = start[kLo];
  const a1 = start[kLo + 1];
  const b0 = start[kHi];
  const b1 = start[kHi + 1];
  const nHi = n - b1;
  let sum = a0 * lo + nHi * hi;
  let squares = a0 * lo * lo + nHi * hi * hi;
  if (kLo === kHi) {
    for (let i = a0; i < a1; i++) {
      const x = v[i];
      const w = x < lo ? lo : x > hi ? hi : x;
      sum += w;
      squares += w * w;
    }
    return { sum, squares };
  }
  for (let i = a0; i < a1; i++) {
    const x = v[i];
    const w = x < lo ? lo : x; // below hi: its bin is below hi's
    sum += w;
    squares += w * w;
  }
  // Whole bins kLo + 1 … kHi − 1: inside [lo, hi]; inner bins only, as kLo < kHi.
  sum += b.sum[b0] - b.sum[a1];
  squares += b.squares[b0] - b.squares[a1];
  for (let i = b0; i < b1; i++) {
    const x = v[i];
    const w = x > hi ? hi : x;
    sum += w;
    squares += w * w;
  }
  return { sum, squares };
}
