import { sigmaPt, widenSigmaPt } from './sigma-pt';

describe('sigmaPt rules (ISO 13528 §8, from memory)', () => {
  const ctx = { assignedValue: 80, robustSd: 1.7 };
  it('fixed, percent of x_pt, robust SD', () => {
    expect(sigmaPt({ kind: 'fixed', value: 0.8 }, ctx)).toBe(0.8);
    expect(sigmaPt({ kind: 'percent', percent: 3 }, ctx)).toBeCloseTo(2.4, 14);
    expect(sigmaPt({ kind: 'robust-sd' }, ctx)).toBe(1.7);
  });
  it('precision study: σ_R, or √(σ_R² − σ_r²(1 − 1/m))', () => {
    expect(sigmaPt({ kind: 'precision', sigmaR: 2 }, ctx)).toBe(2);
    expect(
      sigmaPt({ kind: 'precision', sigmaR: 2, sigmaRepeatability: 1, replicates: 2 }, ctx),
    ).toBeCloseTo(Math.sqrt(3.5), 14);
  });
  it('refuses σ_pt ≤ 0 (e.g. s* = 0) with a clear error', () => {
    expect(() => sigmaPt({ kind: 'robust-sd' }, { assignedValue: 1, robustSd: 0 })).toThrow(
      /robust-sd/,
    );
    expect(() => sigmaPt({ kind: 'percent', percent: 5 }, { assignedValue: 0 })).toThrow(
      RangeError,
    );
    expect(() => sigmaPt({ kind: 'fixed', value: NaN }, ctx)).toThrow(RangeError);
  });
  it('widening for inhomogeneity: √(σ² + s_s²)', () => {
    expect(widenSigmaPt(3, 4)).toBe(5);
  });
});
