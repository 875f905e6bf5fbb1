import { homogeneityCheck, homogeneityFactors, stabilityCheck } from './homogeneity';

describe('homogeneityFactors', () => {
  it('g = 10: F1 = 1.88, F2 = 1.01 (ISO 13528:2015 Table B.1 as quoted in docs/STATISTICS.md, from memory)', () => {
    const { f1, f2 } = homogeneityFactors(10);
    expect(f1).toBeCloseTo(1.88, 2);
    expect(f2).toBeCloseTo(1.01, 2);
  });
  it('g = 7 and g = 20 (ISO 13528:2015 Table B.1: 2.10/1.43 and 1.59/0.57, from memory)', () => {
    expect(homogeneityFactors(7).f1).toBeCloseTo(2.1, 2);
    expect(homogeneityFactors(7).f2).toBeCloseTo(1.43, 2);
    expect(homogeneityFactors(20).f1).toBeCloseTo(1.59, 2);
    expect(homogeneityFactors(20).f2).toBeCloseTo(0.57, 2);
  });
  it('built from the tabulated quantiles χ²(0.95; 9) = 16.919, F(0.95; 9, 10) = 3.020 (NIST/SEMATECH e-Handbook §1.3.6.7.4 and §1.3.6.7.2 tables, from memory)', () => {
    const { f1, f2 } = homogeneityFactors(10);
    expect(f1 * 9).toBeCloseTo(16.919, 3);
    expect(2 * f2 + 1).toBeCloseTo(3.02, 3);
  });
});

describe('homogeneityCheck (ISO 13528 Annex B formulas, hand-computed invented data)', () => {
  // 3 items × 2 replicates: means 10.1, 10.3, 10.0; ranges 0.2, 0.2, 0.4
  const items = [
    [10.0, 10.2],
    [10.2, 10.4],
    [9.8, 10.2],
  ];
  it('s_x, s_w, s_s', () => {
    const r = homogeneityCheck(items, 1);
    expect(r.itemMeans[0]).toBeCloseTo(10.1, 12);
    expect(r.sx).toBeCloseTo(Math.sqrt(0.0233333333333333), 12); // SD of 10.1, 10.3, 10.0
    // s_w² = Σw²/(2g) = (0.04 + 0.04 + 0.16)/6 = 0.04
    expect(r.sw).toBeCloseTo(0.2, 12);
    // s_s² = 0.0233333 − 0.04/2 = 0.0033333
    expect(r.ss).toBeCloseTo(Math.sqrt(0.0033333333333333), 12);
    expect(r.passes).toBe(true); // 0.0577 ≤ 0.3
    expect(r.widenedSigmaPt).toBeCloseTo(Math.sqrt(1 + 0.0033333333333333), 12);
  });
  it('fails the simple criterion with a small σ_pt and then applies the extended one', () => {
    const r = homogeneityCheck(items, 0.15);
    expect(r.limit).toBeCloseTo(0.045, 14);
    expect(r.passes).toBe(false); // 0.0577 > 0.045
    // extended: F1(g=3)·0.045² + F2(g=3)·0.04
    expect(r.extendedLimitSquared).toBeCloseTo(r.f1 * 0.045 ** 2 + r.f2 * 0.04, 14);
    expect(r.passesExtended).toBe(true);
  });
  it('s_s is 0 when the item means scatter less than the replicates', () => {
    const r = homogeneityCheck(
      [
        [1, 2],
        [2, 1],
        [1.5, 1.5],
      ],
      1,
    );
    expect(r.ss).toBe(0);
  });
  it('rejects unequal replicates and σ_pt ≤ 0', () => {
    expect(() => homogeneityCheck([[1, 2], [1]], 1)).toThrow(/item 2/);
    expect(() => homogeneityCheck(items, 0)).toThrow(RangeError);
  });
});

describe('stabilityCheck (ISO 13528 B.5, from memory; invented data)', () => {
  it('simple and extended criteria', () => {
    const r = stabilityCheck([100, 101, 102], [101.5, 102.5, 103.5], 3);
    expect(r.difference).toBeCloseTo(1.5, 12);
    expect(r.limit).toBeCloseTo(0.9, 12);
    expect(r.passes).toBe(false);
    // u = 1/√3 each → 2·√(2/3) = 1.63299
    expect(r.extendedLimit).toBeCloseTo(0.9 + 2 * Math.sqrt(2 / 3), 12);
    expect(r.passesExtended).toBe(true);
  });
});
