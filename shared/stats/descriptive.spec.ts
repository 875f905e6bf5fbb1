import nist from './fixtures/nist-univariate.json';
import { mad, madE, mean, median, nIqr, quantile, sd, variance } from './descriptive';

/** Number of correct significant digits of `got` against a certified value (LRE, NIST StRD). */
function correctDigits(got: number, certified: number): number {
  if (got === certified) return 15;
  return certified === 0
    ? -Math.log10(Math.abs(got))
    : -Math.log10(Math.abs(got - certified) / Math.abs(certified));
}

interface NistSet {
  n: number;
  values: string[];
  certifiedMean: string;
  certifiedSd: string;
}
const sets = (nist as { sets: Record<string, NistSet> }).sets;

// NIST StRD, Univariate Summary Statistics (fixtures/nist-univariate.json names the source);
// difficulty classes as NIST lists them: Michelso, Mavro, NumAcc1 "lower"; NumAcc2 "average";
// NumAcc3 "higher".
const cases: [string, number][] = [
  ['Michelso', 12],
  ['Mavro', 12],
  ['NumAcc1', 12],
  ['NumAcc2', 12],
  ['NumAcc3', 9],
];

describe('descriptive: NIST StRD univariate certified values', () => {
  it.each(cases)('%s: certified mean and SD to the required digits', (name, digits) => {
    const set = sets[name];
    const xs = set.values.map(Number); // parsed from the decimal strings
    expect(xs).toHaveLength(set.n);
    // NIST StRD, <name>.dat, certified sample mean
    expect(correctDigits(mean(xs), Number(set.certifiedMean))).toBeGreaterThanOrEqual(digits);
    // NIST StRD, <name>.dat, certified sample standard deviation (n − 1)
    expect(correctDigits(sd(xs), Number(set.certifiedSd))).toBeGreaterThanOrEqual(digits);
  });

  it('variance is the square of the certified SD (NIST StRD, Michelso.dat)', () => {
    const xs = sets['Michelso'].values.map(Number);
    const s = Number(sets['Michelso'].certifiedSd);
    expect(correctDigits(variance(xs), s * s)).toBeGreaterThanOrEqual(12);
  });
});

describe('descriptive: order statistics', () => {
  it('median for odd and even n (definition)', () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([7])).toBe(7);
  });

  it('quantile is R type 7: quantile(1:10, c(.25,.5,.75,.1)) = 3.25, 5.5, 7.75, 1.9 (R documentation, ?quantile, default type 7; values computed by hand: h = 9p)', () => {
    const xs = [10, 9, 8, 7, 6, 5, 4, 3, 2, 1];
    expect(quantile(xs, 0.25)).toBeCloseTo(3.25, 14);
    expect(quantile(xs, 0.5)).toBeCloseTo(5.5, 14);
    expect(quantile(xs, 0.75)).toBeCloseTo(7.75, 14);
    expect(quantile(xs, 0.1)).toBeCloseTo(1.9, 14);
    expect(quantile(xs, 0)).toBe(1);
    expect(quantile(xs, 1)).toBe(10);
  });

  it('MAD, MADe and nIQR on a small set (hand computation)', () => {
    const xs = [1, 2, 3, 4, 100];
    // median 3; |x − 3| = 2,1,0,1,97 → median 1
    expect(mad(xs)).toBe(1);
    expect(madE(xs)).toBeCloseTo(1.483, 14);
    // type 7: Q1 = 2, Q3 = 4 → nIQR = 0.7413·2
    expect(nIqr(xs)).toBeCloseTo(1.4826, 14);
  });

  it('MADe and nIQR both estimate σ = 1 for a large normal-like sample (normal quantiles, common practice)', () => {
    // Deterministic normal scores Φ⁻¹((i − 0.5)/n), by bisection on an erf approximation.
    const n = 2001;
    const xs: number[] = [];
    for (let i = 1; i <= n; i++) xs.push(normalQuantile((i - 0.5) / n));
    expect(madE(xs)).toBeCloseTo(1.0, 2);
    expect(nIqr(xs)).toBeCloseTo(1.0, 2);
  });
});

describe('descriptive: bad input', () => {
  it('throws a RangeError on empty input, never NaN', () => {
    for (const f of [mean, variance, sd, median, mad, madE, nIqr]) {
      expect(() => f([])).toThrow(RangeError);
    }
    expect(() => quantile([], 0.5)).toThrow(/empty/);
  });
  it('throws on non-finite values and on n = 1 for the variance', () => {
    expect(() => mean([1, NaN])).toThrow(/index 1/);
    expect(() => sd([1, Infinity])).toThrow(RangeError);
    expect(() => variance([1])).toThrow(/at least 2/);
    expect(() => quantile([1, 2], 1.5)).toThrow(RangeError);
  });
});

/** Standard normal quantile by bisection on the CDF (test helper only). */
function normalQuantile(p: number): number {
  let lo = -10;
  let hi = 10;
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (normalCdf(mid) < p) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
function normalCdf(x: number): number {
  // Abramowitz & Stegun 7.1.26 erf approximation (|error| < 1.5e-7), enough for a 2-decimal check.
  const t = 1 / (1 + 0.3275911 * (Math.abs(x) / Math.SQRT2));
  const y =
    1 -
    t *
      (0.254829592 +
        t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429)))) *
      Math.exp(-(x * x) / 2);
  return x >= 0 ? 0.5 * (1 + y) : 0.5 * (1 - y);
}
