/**
 * Property tests (fast-check) of the invariances the ISO 13528 definitions imply:
 * scores are odd in the deviation x − x_pt; Algorithm A is shift- and scale-equivariant;
 * a single wild outlier moves x* by less than δ = 1.5 s* (bounded influence of winsorizing),
 * for samples not already at their breakdown point.
 */
import fc from 'fast-check';
import { algorithmA } from './algorithm-a';
import { enNumber, zetaScore, zPrimeScore, zScore } from './scores';

// Reported results: decimals with up to 6 places in ±1000 (real results are written in decimals;
// subnormal doubles would only test floating-point underflow).
const value = fc.integer({ min: -1e9, max: 1e9 }).map((i) => i / 1e6);
const positive = fc.integer({ min: 1, max: 1e9 }).map((i) => i / 1e6);
const nonNegative = fc.integer({ min: 0, max: 1e9 }).map((i) => i / 1e6);
const sample = fc.array(value, { minLength: 5, maxLength: 60 });

describe('scores change sign with the deviation', () => {
  it('z, z′, ζ, En: sign(score) = sign(x − x_pt) and score(x_pt + d) = −score(x_pt − d)', () => {
    fc.assert(
      fc.property(value, value, positive, nonNegative, positive, (xpt, d, sigma, uA, u) => {
        const fs = [
          (x: number) => zScore(x, xpt, sigma),
          (x: number) => zPrimeScore(x, xpt, sigma, uA),
          (x: number) => zetaScore(x, xpt, u, uA),
          (x: number) => enNumber(x, xpt, 2 * u, 2 * uA),
        ];
        for (const f of fs) {
          const up = f(xpt + d);
          const down = f(xpt - d);
          // x_pt ± d is rounded, so compare signs of the realised deviations
          if (Math.sign(up) !== Math.sign(xpt + d - xpt)) return false;
          if (Math.sign(down) !== Math.sign(xpt - d - xpt)) return false;
          if (Math.abs(up + down) > 1e-9 * (Math.abs(up) + 1)) return false;
        }
        return true;
      }),
      { numRuns: 300 },
    );
  });
});

describe('Algorithm A equivariance (ISO 13528 C.3 definition)', () => {
  it('shift: x* (x + c) = x*(x) + c, s*(x + c) = s*(x)', () => {
    fc.assert(
      fc.property(
        sample,
        fc.integer({ min: -1e10, max: 1e10 }).map((i) => i / 1e6),
        (xs, c) => {
          const a = algorithmA(xs);
          const b = algorithmA(xs.map((x) => x + c));
          if (a.outcome !== b.outcome)
            return a.outcome !== 'converged' && b.outcome !== 'converged';
          const scale = Math.max(...xs.map(Math.abs)) + Math.abs(c);
          return (
            Math.abs(b.robustMean - (a.robustMean + c)) <= 1e-9 * scale &&
            Math.abs(b.robustSd - a.robustSd) <= 1e-9 * scale
          );
        },
      ),
      { numRuns: 300 },
    );
  });

  it('scale: x*(a·x) = a·x*(x), s*(a·x) = |a|·s*(x), also for a < 0', () => {
    fc.assert(
      fc.property(
        sample,
        fc.double({ min: 1e-200, max: 1e200, noNaN: true }),
        fc.boolean(),
        (xs, m, flip) => {
          const k = flip ? -m : m;
          const a = algorithmA(xs);
          const b = algorithmA(xs.map((x) => k * x));
          if (a.outcome !== b.outcome)
            return a.outcome !== 'converged' && b.outcome !== 'converged';
          const scale = (Math.max(...xs.map(Math.abs)) + 1e-300) * m;
          return (
            Math.abs(b.robustMean - k * a.robustMean) <= 1e-9 * scale &&
            Math.abs(b.robustSd - m * a.robustSd) <= 1e-9 * scale
          );
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('Algorithm A bounded influence', () => {
  it('one wild outlier moves x* by less than δ = 1.5·s*', () => {
    fc.assert(
      fc.property(
        sample,
        fc.double({ min: 1e3, max: 1e12, noNaN: true }),
        fc.boolean(),
        (xs, far, low) => {
          const a = algorithmA(xs);
          fc.pre(a.outcome === 'converged' && a.robustSd > 0);
          // Stated for samples away from breakdown: with the new outlier at most 20 % of the values
          // lie outside x* ± δ. (With about a third winsorized, 1.134·SD of the winsorized values
          // exceeds s*, so s* grows each iteration until the outliers are inside: no robust centre
          // is left to protect. Found by this test with 2 far values out of 6.)
          const delta = 1.5 * a.robustSd;
          const outside = xs.filter((x) => Math.abs(x - a.robustMean) > delta).length;
          fc.pre((outside + 1) / (xs.length + 1) <= 0.2);
          const outlier = a.robustMean + (low ? -1 : 1) * far * (a.robustSd + 1);
          const b = algorithmA([...xs, outlier]);
          return Math.abs(b.robustMean - a.robustMean) < 1.5 * a.robustSd;
        },
      ),
      { numRuns: 300 },
    );
  });
});
