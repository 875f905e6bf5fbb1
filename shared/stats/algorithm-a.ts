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
  // Medians by selection, not sorting: linear in n. The sums below run in input order.
  const a = sortBuf.subarray(0, n);
  for (let i = 0; i < n; i++) a[i] = xs[i];
  const m0 = medianInPlace(a);
  const d = centred.subarray(0, n);
  for (let i = 0; i < n; i++) d[i] = xs[i] - m0;
  for (let i = 0; i < n; i++) a[i] = Math.abs(d[i]);
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
  for (let i = 0; i < n; i++) d[i] /= s0;
  s = 1;
  let mc = 0;
  for (let it = 1; it <= c.maxIterations; it++) {
    const delta = c.k * s;
    const lo = mc - delta;
    const hi = mc + delta;
    let sum = 0;
    for (let i = 0; i < n; i++) {
      const v = d[i];
      sum += v < lo ? lo : v > hi ? hi : v;
    }
    const m1 = sum / n;
    let sd1 = 0;
    let sd2 = 0;
    for (let i = 0; i < n; i++) {
      const v = d[i];
      const r = (v < lo ? lo : v > hi ? hi : v) - m1;
      sd1 += r;
      sd2 += r * r;
    }
    const newMean = m1 + sd1 / n;
    const varW = (sd2 - (sd1 * sd1) / n) / (n - 1);
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
