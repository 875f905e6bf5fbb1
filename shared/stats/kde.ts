/**
 * Gaussian kernel density estimate for plots of participants' results.
 *
 * Bandwidth: Silverman's rule of thumb, h = 0.9 · min(s, IQR/1.34) · n^(−1/5)
 * (Silverman 1986, "Density Estimation for Statistics and Data Analysis", eq. 3.31; the same
 * rule as R's bw.nrd0), s the SD (n − 1), IQR from type-7 quartiles. If IQR = 0 the SD is used;
 * if both are 0 (all values equal), h = 0.1 % of |x| (or 1 for x = 0) so the plot still shows
 * a peak.
 */
import {
  assertFiniteSample,
  quantileOfSorted,
  sortedCopy,
  varianceAbout,
  meanUnchecked,
} from './descriptive';

export interface KdeResult {
  /** Grid points, unit of the data. */
  readonly x: number[];
  /** Density at each grid point, 1/unit (integrates to 1). */
  readonly density: number[];
  /** Bandwidth h, unit of the data. */
  readonly bandwidth: number;
}

export interface KdeOptions {
  /** Number of grid points (default 256, at least 2). */
  readonly points?: number;
  /** Bandwidth to use instead of Silverman's rule, unit of the data. */
  readonly bandwidth?: number;
  /** Grid extends this many bandwidths beyond the data (default 3). */
  readonly cut?: number;
}

/**
 * Silverman's rule-of-thumb bandwidth h = 0.9 · min(s, IQR/1.34) · n^(−1/5), unit of the data
 * (Silverman 1986, eq. 3.31). Fallbacks for zero spread as described in the file comment.
 * @throws RangeError on empty input or non-finite values.
 */
export function silvermanBandwidth(xs: readonly number[]): number {
  assertFiniteSample(xs, 'silvermanBandwidth');
  const n = xs.length;
  const a = sortedCopy(xs);
  const s = n > 1 ? Math.sqrt(varianceAbout(xs, meanUnchecked(xs))) : 0;
  const iqr = quantileOfSorted(a, 0.75) - quantileOfSorted(a, 0.25);
  const spread = iqr > 0 && s > 0 ? Math.min(s, iqr / 1.34) : s > 0 ? s : iqr / 1.34;
  if (spread > 0) return 0.9 * spread * Math.pow(n, -0.2);
  const scale = Math.abs(a[0]);
  return scale > 0 ? scale * 1e-3 : 1;
}

/**
 * Gaussian KDE f(x) = (1/(n·h)) Σ φ((x − x_i)/h) on an even grid from min − cut·h to
 * max + cut·h. Density in 1/unit of the data.
 * @throws RangeError on empty input, non-finite values, a bandwidth ≤ 0 or fewer than 2 points.
 */
export function kde(xs: readonly number[], options: KdeOptions = {}): KdeResult {
  assertFiniteSample(xs, 'kde');
  const h = options.bandwidth ?? silvermanBandwidth(xs);
  if (!(h > 0) || !Number.isFinite(h)) throw new RangeError(`kde: bandwidth must be > 0, got ${h}`);
  const points = options.points ?? 256;
  if (!Number.isInteger(points) || points < 2)
    throw new RangeError(`kde: points must be an integer ≥ 2`);
  const cut = options.cut ?? 3;
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of xs) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  lo -= cut * h;
  hi += cut * h;
  const step = (hi - lo) / (points - 1);
  const norm = 1 / (xs.length * h * Math.sqrt(2 * Math.PI));
  const x = new Array<number>(points);
  const density = new Array<number>(points);
  for (let i = 0; i < points; i++) {
    const g = lo + i * step;
    let s = 0;
    for (let j = 0; j < xs.length; j++) {
      const u = (g - xs[j]) / h;
      s += Math.exp(-0.5 * u * u);
    }
    x[i] = g;
    density[i] = s * norm;
  }
  return { x, density, bandwidth: h };
}
