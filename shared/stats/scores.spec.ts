import gear from './fixtures/gear.json';
import { sd } from './descriptive';
import {
  difference,
  enNumber,
  percentDifference,
  signalFor,
  zetaScore,
  zPrimeScore,
  zScore,
} from './scores';

// NIST/SEMATECH e-Handbook gear diameter data with score values printed in the NIST Dataplot
// Reference Manual (zscore, zprime, zetascor, enscore pages); source text in fixtures/gear.json.
// x_pt = 1, σ_pt = SD (n − 1) of all 100 values, u(x_pt) = 0.001 for z′. Dataplot prints three
// decimals, some truncated: compare at ±0.001.
describe('scores: NIST GEAR data, Dataplot printed values', () => {
  const all = gear.batches.flat();
  const sigmaPt = sd(all);
  const uRef = gear.scoreExample.uAssignedForZPrime;
  const uLab = sd(gear.batches[0]); // "u(x) = SD of batch 1"
  const within = (got: number, printed: number) =>
    expect(Math.abs(got - printed)).toBeLessThanOrEqual(0.001 + 1e-12);

  it('z and z′ for y = 1.006 (Dataplot zscore/zprime: 0.955, 0.943)', () => {
    within(zScore(1.006, 1, sigmaPt), 0.955);
    within(zPrimeScore(1.006, 1, sigmaPt, uRef), 0.943);
  });
  it('z and z′ for y = 0.996 (Dataplot zscore/zprime: −0.637, −0.629)', () => {
    within(zScore(0.996, 1, sigmaPt), -0.637);
    within(zPrimeScore(0.996, 1, sigmaPt, uRef), -0.629);
  });
  it('all printed z, z′, ζ, En values (Dataplot zscore, zprime, zetascor, enscore pages)', () => {
    let checked = 0;
    for (const row of gear.scoreExample.printedToThreeDecimals as {
      y: number;
      z: number;
      zPrime?: number;
      zeta?: number;
      En?: number;
    }[]) {
      within(zScore(row.y, 1, sigmaPt), row.z);
      checked++;
      if (row.zPrime !== undefined) {
        within(zPrimeScore(row.y, 1, sigmaPt, uRef), row.zPrime);
        checked++;
      }
      // Dataplot zetascor: u(x) = SD of batch 1, u(x_pt) = σ_pt
      if (row.zeta !== undefined) {
        within(zetaScore(row.y, 1, uLab, sigmaPt), row.zeta);
        checked++;
      }
      // Dataplot enscore: U = 2u for both
      if (row.En !== undefined) {
        within(enNumber(row.y, 1, 2 * uLab, 2 * sigmaPt), row.En);
        checked++;
      }
    }
    expect(checked).toBe(14);
  });
});

describe('scores: definitions (ISO 13528:2015 §9)', () => {
  it('D and D%', () => {
    expect(difference(105, 100)).toBe(5);
    expect(percentDifference(95, 100)).toBeCloseTo(-5, 12);
    expect(() => percentDifference(1, 0)).toThrow(RangeError);
  });
  it('z′ ≤ z in magnitude and equals z when u(x_pt) = 0', () => {
    expect(zPrimeScore(3, 0, 1, 0)).toBe(3);
    expect(zPrimeScore(3, 0, 1, 0.5)).toBeCloseTo(3 / Math.sqrt(1.25), 14);
  });
  it('rejects σ_pt ≤ 0 and zero denominators instead of returning Infinity/NaN', () => {
    expect(() => zScore(1, 0, 0)).toThrow(RangeError);
    expect(() => zetaScore(1, 0, 0, 0)).toThrow(RangeError);
    expect(() => enNumber(1, 0, 0, 0)).toThrow(RangeError);
    expect(() => zScore(NaN, 0, 1)).toThrow(RangeError);
  });
});

describe('signals (ISO 13528:2015 §9; thresholds in docs/STATISTICS.md)', () => {
  it.each([
    [0, 'acceptable'],
    [2, 'acceptable'],
    [-2, 'acceptable'],
    [2.0001, 'warning'],
    [-2.99, 'warning'],
    [3, 'action'],
    [-3.5, 'action'],
  ] as const)('z = %p → %s', (z, s) => {
    expect(signalFor(z, 'z')).toBe(s);
    expect(signalFor(z, 'zPrime')).toBe(s);
  });
  it('En: |En| ≤ 1 acceptable, > 1 action, never warning', () => {
    expect(signalFor(1, 'En')).toBe('acceptable');
    expect(signalFor(-1.01, 'En')).toBe('action');
    expect(signalFor(2.5, 'En')).toBe('action');
  });
});
