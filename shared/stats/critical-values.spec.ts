import {
  cochranCritical,
  grubbsDoubleCritical,
  grubbsSingleCritical,
  GRUBBS_DOUBLE_TABLE,
  mandelHIndicator,
  mandelKIndicator,
} from './critical-values';
import tables from './fixtures/critical-values-tables.json';

describe('Grubbs single critical values vs published table (source: Grubbs 1950, Grubbs & Beck 1972; fixtures/critical-values-tables.json)', () => {
  // The printed table rounds (sometimes truncates) the 4th decimal, e.g. p = 8, 5 %: computed
  // 2.12665, printed 2.126; p = 15, 5 %: computed 2.54831, printed 2.549 → ±0.0011.
  it.each(tables.grubbs.rows.map((r) => [r.p, r.single1, r.single5]))(
    'p = %i: 1 %% %f, 5 %% %f',
    (p, one, five) => {
      expect(Math.abs(grubbsSingleCritical(p, 0.01) - one)).toBeLessThanOrEqual(0.0011);
      expect(Math.abs(grubbsSingleCritical(p, 0.05) - five)).toBeLessThanOrEqual(0.0011);
    },
  );

  it('p = 3 reaches the upper bound (p − 1)/√p (the largest possible G)', () => {
    expect(grubbsSingleCritical(3, 0.05)).toBeLessThanOrEqual(2 / Math.sqrt(3));
    expect(grubbsSingleCritical(3, 0.05)).toBeCloseTo(2 / Math.sqrt(3), 3);
  });

  it('one-sided 5 %, p = 8 → 2.032 (source: NIST/SEMATECH e-Handbook §1.3.5.17.1)', () => {
    expect(grubbsSingleCritical(8, 0.05, 1)).toBeCloseTo(2.032, 3);
  });

  it('rejects p < 3 and bad levels', () => {
    expect(() => grubbsSingleCritical(2, 0.05)).toThrow(RangeError);
    expect(() => grubbsSingleCritical(5, 0)).toThrow(RangeError);
    expect(() => grubbsSingleCritical(4.5, 0.05)).toThrow(RangeError);
  });
});

describe('Cochran critical values vs published tables (source: fixtures/critical-values-tables.json, see its "source")', () => {
  it.each(tables.cochran.rows.map((r) => [r.p, r.n2_1, r.n2_5, r.n3_1, r.n3_5]))(
    'p = %i',
    (p, n2one, n2five, n3one, n3five) => {
      // Printed to 4 decimals.
      expect(Math.abs(cochranCritical(p, 2, 0.01) - n2one)).toBeLessThanOrEqual(0.00006);
      expect(Math.abs(cochranCritical(p, 2, 0.05) - n2five)).toBeLessThanOrEqual(0.00006);
      expect(Math.abs(cochranCritical(p, 3, 0.01) - n3one)).toBeLessThanOrEqual(0.00006);
      expect(Math.abs(cochranCritical(p, 3, 0.05) - n3five)).toBeLessThanOrEqual(0.00006);
    },
  );

  it('rejects n < 2', () => {
    expect(() => cochranCritical(5, 1, 0.05)).toThrow(RangeError);
  });
});

describe('Grubbs double table as held (source: Grubbs & Beck 1972 via fixtures/critical-values-tables.json)', () => {
  it('every row of the reference table is copied exactly', () => {
    for (const row of tables.grubbs.rows) {
      if (row.double1 === null || row.double5 === null) {
        expect(grubbsDoubleCritical(row.p, 0.01)).toBeNull();
        continue;
      }
      expect(grubbsDoubleCritical(row.p, 0.01)).toBe(row.double1);
      expect(grubbsDoubleCritical(row.p, 0.05)).toBe(row.double5);
    }
    expect(Object.keys(GRUBBS_DOUBLE_TABLE)).toHaveLength(17);
  });

  it('5 % values lie above 1 % values and grow with p (the statistic is a ratio in [0, 1])', () => {
    for (let p = 5; p <= 20; p++) {
      expect(grubbsDoubleCritical(p, 0.05)!).toBeGreaterThan(grubbsDoubleCritical(p, 0.01)!);
      expect(grubbsDoubleCritical(p, 0.05)!).toBeGreaterThan(grubbsDoubleCritical(p - 1, 0.05)!);
    }
  });

  it('outside p = 4…20: null, never extrapolated', () => {
    expect(grubbsDoubleCritical(3, 0.05)).toBeNull();
    expect(grubbsDoubleCritical(21, 0.01)).toBeNull();
  });
});

describe('Mandel indicator values', () => {
  // ISO 5725-2:1994 Table 6, values recalled from memory (not checked against the printed text):
  // h: p = 3 → 1.15/1.15, p = 4 → 1.49/1.42, p = 5 → 1.72/1.57, p = 10 → 2.18/1.80 (1 %/5 %);
  // k (n = 2): p = 3 → 1.71/1.65.
  it.each([
    [3, 1.15, 1.15],
    [4, 1.49, 1.42],
    [5, 1.72, 1.57],
    [10, 2.18, 1.8],
  ])('h, p = %i: %f / %f (from memory, ISO 5725-2 Table 6)', (p, one, five) => {
    // Printed to 2 decimals (p = 4, 1 %: computed 1.48500000 → 1.49).
    expect(Math.abs(mandelHIndicator(p, 0.01) - one)).toBeLessThanOrEqual(0.00501);
    expect(Math.abs(mandelHIndicator(p, 0.05) - five)).toBeLessThanOrEqual(0.00501);
  });

  it('k, p = 3, n = 2: 1.71 / 1.65 (from memory, ISO 5725-2 Table 6)', () => {
    expect(Math.abs(mandelKIndicator(3, 2, 0.01) - 1.71)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(mandelKIndicator(3, 2, 0.05) - 1.65)).toBeLessThanOrEqual(0.005);
  });

  // Exact identities between the closed forms (derivation, no source needed): the h indicator is
  // the Grubbs single bound at p·α, and k²/p is Cochran's bound at p·α.
  it('h(p, α) = G_single(p, p·α); k(p, n, α)²/p = C(p, n, p·α)', () => {
    for (const p of [3, 5, 8, 13]) {
      expect(mandelHIndicator(p, 0.01)).toBeCloseTo(grubbsSingleCritical(p, 0.01 * p), 12);
      for (const n of [2, 3, 5]) {
        expect(mandelKIndicator(p, n, 0.05) ** 2 / p).toBeCloseTo(
          cochranCritical(p, n, 0.05 * p),
          12,
        );
      }
    }
  });
});
