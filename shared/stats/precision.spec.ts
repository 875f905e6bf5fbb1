import fc from 'fast-check';
import { precisionAnalysis, type PrecisionCellInput, type PrecisionResult } from './precision';
import {
  cochranCritical,
  grubbsDoubleCritical,
  grubbsSingleCritical,
  mandelHIndicator,
  mandelKIndicator,
} from './critical-values';
import nistAnova from './fixtures/precision-nist-anova.json';
import uranium from './fixtures/precision-grubbs-uranium.json';

/** |a − b| / |b| */
function relErr(a: number | null, b: number): number {
  if (a === null) return Infinity;
  return Math.abs(a - b) / Math.abs(b);
}

function cellsOf(groups: string[][]): PrecisionCellInput[] {
  // Parsed from the certified decimal strings of the data file.
  return groups.map((g, i) => ({ code: `L${i + 1}`, values: g.map((v) => Number(v)) }));
}

type AnovaSet = {
  groups: string[][];
  certified: { msBetween: string; msWithin: string; residualSd: string };
};
const sets = nistAnova.sets as Record<string, AnovaSet>;

describe('precisionAnalysis against NIST StRD ANOVA (source: NIST Statistical Reference Datasets, ANOVA, certified values; fixtures/precision-nist-anova.json)', () => {
  it('SiRstv as 5 labs × 5 replicates: s_r = 0.104076068334656, s_d² = 0.0127865654 (certified residual SD and between-groups mean square)', () => {
    const r = precisionAnalysis(cellsOf(sets.SiRstv.groups));
    expect(r.p).toBe(5);
    expect(r.nBar).toBe(5);
    expect(relErr(r.sr, 0.104076068334656)).toBeLessThan(1e-12);
    expect(relErr(r.betweenMeanSquare, 0.0127865654)).toBeLessThan(1e-12);
    // Derived quantities from the same certified values: s_L² = (s_d² − s_r²)/n.
    const sL2 = (0.0127865654 - 0.010831828) / 5;
    expect(relErr(r.sL, Math.sqrt(sL2))).toBeLessThan(1e-10);
    expect(relErr(r.sR, Math.sqrt(sL2 + 0.010831828))).toBeLessThan(1e-11);
    expect(relErr(r.repeatabilityLimit, 2.8 * 0.104076068334656)).toBeLessThan(1e-12);
    expect(r.isSLTruncated).toBe(false);
  });

  // Certified values are for the decimal data. Binary64 parsing of values such as 1000000.4 or
  // 107.8681568 already moves the exact answer in its 10th–11th digit; the second check compares
  // with the exact answer for the parsed inputs (exact rational arithmetic, Python fractions,
  // computed for this project), which shows the algorithm itself loses no digits.
  const cases: Array<[string, number, number, number]> = [
    // name, digits vs certified, exact s_d² of parsed inputs, exact s_r² of parsed inputs
    ['SmLs01', 1e-13, 0.21000000000000013, 0.010000000000000005], // lower difficulty
    ['AtmWtAg', 1e-10, 3.6383418747907132e-9, 2.2815593297385806e-10], // average difficulty
    ['SmLs04', 1e-9, 0.21000000001862645, 0.0100000000005174], // average, offset 1e6
  ];
  it.each(cases)(
    '%s: certified residual SD and between mean square',
    (name, tol, exactMsb, exactMsw) => {
      const set = sets[name];
      const r = precisionAnalysis(cellsOf(set.groups));
      expect(relErr(r.sr, Number(set.certified.residualSd))).toBeLessThan(tol);
      expect(relErr(r.betweenMeanSquare, Number(set.certified.msBetween))).toBeLessThan(tol);
      expect(relErr(r.sr! ** 2, Number(set.certified.msWithin))).toBeLessThan(tol);
      expect(relErr(r.betweenMeanSquare, exactMsb)).toBeLessThan(1e-13);
      expect(relErr(r.sr! ** 2, exactMsw)).toBeLessThan(1e-13);
    },
  );

  it('keeps the digits when SiRstv is moved onto a 1e6 offset (numerical care, docs/STATISTICS.md)', () => {
    const shifted = sets.SiRstv.groups.map((g) => g.map((v) => String(Number(v) + 1e6)));
    const r = precisionAnalysis(cellsOf(shifted));
    expect(relErr(r.sr, 0.104076068334656)).toBeLessThan(1e-8);
    expect(relErr(r.betweenMeanSquare, 0.0127865654)).toBeLessThan(1e-8);
  });
});

describe('Grubbs on cell means: NIST/SEMATECH e-Handbook §1.3.5.17.1 uranium example (fixtures/precision-grubbs-uranium.json)', () => {
  const r = precisionAnalysis(uranium.values.map((v, i) => ({ code: `U${i + 1}`, values: [v] })));

  it('G = 2.4687 for the maximum (full precision 2.468764611)', () => {
    expect(r.grubbs.singleHigh!.G).toBeCloseTo(2.468764611, 8);
    expect(r.grubbs.singleHigh!.cellCodes).toEqual(['U8']);
  });

  it('exceeds the one-sided 5 % critical value 2.032 printed there, and ISO two-sided 1 % → outlier', () => {
    expect(grubbsSingleCritical(8, uranium.alpha, 1)).toBeCloseTo(uranium.criticalOneSidedUpper, 3);
    expect(r.grubbs.singleHigh!.G).toBeGreaterThan(uranium.criticalOneSidedUpper);
    expect(r.grubbs.singleHigh!.classification).toBe('outlier');
    expect(r.grubbs.singleLow!.classification).toBe('accepted');
  });

  it('single results per lab: no repeatability, clear warning, never NaN', () => {
    expect(r.sr).toBeNull();
    expect(r.sR).toBeNull();
    expect(r.cochran).toBeNull();
    expect(r.cells.every((c) => c.sd === null && c.k === null)).toBe(true);
    expect(r.warnings.join(' ')).toMatch(/repeatability/);
    expect(r.betweenMeanSquare).toBeCloseTo(
      // s_d² with n_i = 1 is the variance of the values: computed here from the e-Handbook data.
      uranium.values.reduce((a, x, _i, xs) => a + (x - xs.reduce((s, y) => s + y, 0) / 8) ** 2, 0) /
        7,
      9,
    );
  });
});

describe('precisionAnalysis by hand (unequal n; ISO 5725-2 formulas as in docs/STATISTICS.md)', () => {
  // Cells: A = [1, 2, 3], B = [4, 6], C = [5]. Means 2, 5, 5; N = 6; ŷ = 3.5.
  // s_d² = [3·2.25 + 2·2.25 + 2.25]/2 = 6.75; s_r² = (2·1 + 1·2)/3 = 4/3;
  // n̄ = (6 − 14/6)/2 = 11/6; s_L² = (6.75 − 4/3)/(11/6) = 65/22; s_R² = 283/66.
  const r = precisionAnalysis([
    { code: 'A', values: [1, 2, 3] },
    { code: 'B', values: [4, 6] },
    { code: 'C', values: [5] },
  ]);

  it('variance components', () => {
    expect(r.generalMean).toBeCloseTo(3.5, 14);
    expect(r.betweenMeanSquare).toBeCloseTo(6.75, 13);
    expect(r.sr).toBeCloseTo(Math.sqrt(4 / 3), 14);
    expect(r.nBar).toBeCloseTo(11 / 6, 14);
    expect(r.sL).toBeCloseTo(Math.sqrt(65 / 22), 13);
    expect(r.sR).toBeCloseTo(Math.sqrt(283 / 66), 13);
    expect(r.reproducibilityLimit).toBeCloseTo(2.8 * Math.sqrt(283 / 66), 12);
  });

  it('Mandel h and k (k over the cells with two or more results)', () => {
    const [a, b, c] = r.cells;
    expect(a.h).toBeCloseTo(-2 / Math.sqrt(3), 13);
    expect(b.h).toBeCloseTo(1 / Math.sqrt(3), 13);
    expect(c.h).toBeCloseTo(1 / Math.sqrt(3), 13);
    expect(a.k).toBeCloseTo(Math.sqrt(2 / 3), 13);
    expect(b.k).toBeCloseTo(Math.sqrt(4 / 3), 13);
    expect(c.k).toBeNull();
    expect(r.mandel.h!.indicator5).toBeCloseTo(mandelHIndicator(3, 0.05), 14);
    expect(r.mandel.k).toMatchObject({ p: 2, n: 2 });
  });

  it('Cochran uses the most frequent n (tie → smaller n) and says so', () => {
    expect(r.cochran!.C).toBeCloseTo(2 / 3, 14);
    expect(r.cochran!.cellCode).toBe('B');
    expect(r.cochran!.critical5).toBeCloseTo(cochranCritical(2, 2, 0.05), 14);
    expect(r.warnings.join(' ')).toMatch(/different numbers of results/);
  });

  it('p = 3 with two equal means: G = (p − 1)/√p, the largest possible value, beyond both computed critical values', () => {
    // G_crit(3, 1 %) = (2/√3)·t/√(1 + t²), t = t(1 − 0.01/6; 1) ≈ 190.98 → 1.154684 < 1.154701.
    expect(r.grubbs.singleLow!.G).toBeCloseTo(2 / Math.sqrt(3), 13);
    expect(r.grubbs.singleLow!.critical1).toBeLessThan(2 / Math.sqrt(3));
    expect(r.grubbs.singleLow!.classification).toBe('outlier');
    expect(r.warnings.join(' ')).toMatch(/3 laboratories/);
    expect(r.grubbs.doubleHigh).toBeNull(); // table starts at p = 4
  });
});

describe('classification of stragglers and outliers (ISO 5725-2 §7.3: ≤ 5 % accepted, 5–1 % straggler, > 1 % outlier)', () => {
  const base = [-1.2, -0.8, -0.5, -0.2, 0, 0.1, 0.4, 0.7, 1.1];
  const level = (extreme: number) =>
    precisionAnalysis(
      [...base, extreme].map((m, i) => ({
        code: `L${i + 1}`,
        values: [10 + m - 0.05, 10 + m + 0.05],
      })),
    );

  it.each([
    [3, 'straggler', 'accepted'],
    [3.8, 'straggler', 'straggler'],
    [4.5, 'outlier', 'straggler'],
    [6, 'outlier', 'outlier'],
  ] as const)('tenth lab mean at %s → single %s, double %s', (x, single, double) => {
    const r = level(x);
    const hi = r.grubbs.singleHigh!;
    // Statistic recomputed here from the definition, then compared with the table values
    // (p = 10: single 2.290 / 2.482; double 0.1864 / 0.1150; fixtures/critical-values-tables.json).
    const ms = [...base, x];
    const m = ms.reduce((a, v) => a + v, 0) / 10;
    const s = Math.sqrt(ms.reduce((a, v) => a + (v - m) ** 2, 0) / 9);
    expect(hi.G).toBeCloseTo((x - m) / s, 12);
    expect(hi.critical5).toBeCloseTo(2.29, 2);
    expect(hi.critical1).toBeCloseTo(2.482, 3);
    expect(hi.classification).toBe(single);
    expect(hi.cellCodes).toEqual(['L10']);
    expect(r.grubbs.doubleHigh!.classification).toBe(double);
    expect(r.grubbs.doubleHigh!.cellCodes).toEqual(['L9', 'L10']);
    expect(r.cells[9].h).toBeCloseTo(hi.G, 12);
  });

  it('Cochran flags one lab with a far larger spread as an outlier and its k exceeds the 1 % indicator', () => {
    const cells = base.map((m, i) => ({ code: `L${i + 1}`, values: [m - 0.05, m + 0.05, m] }));
    cells.push({ code: 'L10', values: [-1, 1, 0] });
    const r = precisionAnalysis(cells);
    // C = s²_max/Σs²: nine cells with s² = 0.0025, one with s² = 1.
    expect(r.cochran!.C).toBeCloseTo(1 / (1 + 9 * 0.0025), 13);
    expect(r.cochran!.cellCode).toBe('L10');
    expect(r.cochran!.classification).toBe('outlier');
    expect(r.cochran!.critical1).toBeCloseTo(0.5358, 4); // table: p = 10, n = 3, 1 %
    expect(r.cells[9].k!).toBeGreaterThan(r.mandel.k!.indicator1);
  });

  it('negative s_L² estimate is set to 0 and flagged', () => {
    const r = precisionAnalysis([
      { code: 'A', values: [0, 2] },
      { code: 'B', values: [0, 2] },
      { code: 'C', values: [0.1, 1.9] },
    ]);
    expect(r.isSLTruncated).toBe(true);
    expect(r.sL).toBe(0);
    expect(r.sR).toBeCloseTo(r.sr!, 15);
  });
});

describe('degenerate inputs give clear outcomes, never NaN', () => {
  function noNaN(r: PrecisionResult): void {
    const walk = (v: unknown): void => {
      if (typeof v === 'number') expect(Number.isNaN(v)).toBe(false);
      else if (v && typeof v === 'object') Object.values(v).forEach(walk);
    };
    walk(r);
  }

  it('one lab', () => {
    const r = precisionAnalysis([{ code: 'A', values: [1, 2, 3] }]);
    noNaN(r);
    expect(r.sr).toBeCloseTo(1, 15);
    expect(r.sL).toBeNull();
    expect(r.betweenMeanSquare).toBeNull();
    expect(r.cells[0].h).toBeNull();
    expect(r.warnings.length).toBeGreaterThan(0);
  });

  it('two labs: no h indicators, no Grubbs', () => {
    const r = precisionAnalysis([
      { code: 'A', values: [1, 2] },
      { code: 'B', values: [3, 5] },
    ]);
    noNaN(r);
    expect(r.mandel.h).toBeNull();
    expect(r.grubbs.singleHigh).toBeNull();
    expect(r.cochran).not.toBeNull();
  });

  it('all values equal', () => {
    const r = precisionAnalysis(['A', 'B', 'C', 'D'].map((code) => ({ code, values: [7, 7, 7] })));
    noNaN(r);
    expect(r.sr).toBe(0);
    expect(r.sL).toBe(0);
    expect(r.sR).toBe(0);
    expect(r.cells.every((c) => c.h === 0 && c.k === 0)).toBe(true);
    expect(r.cochran).toBeNull();
    expect(r.grubbs.singleHigh).toBeNull();
    expect(r.warnings.join(' ')).toMatch(/equal/);
  });

  it('more than 20 labs: Grubbs double not applied (no published value held), says so', () => {
    const r = precisionAnalysis(
      Array.from({ length: 21 }, (_, i) => ({ code: `L${i}`, values: [i % 5, (i % 5) + 1] })),
    );
    expect(r.grubbs.doubleHigh).toBeNull();
    expect(r.grubbs.singleHigh).not.toBeNull();
    expect(r.warnings.join(' ')).toMatch(/Grubbs double/);
  });

  it('rejects bad input naming the lab', () => {
    expect(() => precisionAnalysis([])).toThrow(/no laboratories/);
    expect(() => precisionAnalysis([{ code: 'A', values: [] }])).toThrow(/"A" has no results/);
    expect(() => precisionAnalysis([{ code: 'A', values: [1, NaN] }])).toThrow(/"A", result 2/);
    expect(() =>
      precisionAnalysis([
        { code: 'A', values: [1] },
        { code: 'A', values: [2] },
      ]),
    ).toThrow(/twice/);
  });

  it('property: any finite data → no NaN; h, k, C, G invariant under x → a·x + b (a > 0), s_r scales by a', () => {
    const cell = fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 1, maxLength: 5 });
    fc.assert(
      fc.property(
        fc.array(cell, { minLength: 1, maxLength: 12 }),
        fc.double({ min: 0.01, max: 100, noNaN: true }),
        fc.integer({ min: -1e6, max: 1e6 }),
        (groups, a, b) => {
          const base = groups.map((g, i) => ({ code: `L${i}`, values: g.map((v) => v / 10) }));
          const moved = base.map((c) => ({ code: c.code, values: c.values.map((v) => a * v + b) }));
          const r1 = precisionAnalysis(base);
          const r2 = precisionAnalysis(moved);
          noNaN(r1);
          noNaN(r2);
          if (r1.sr !== null && r1.sr > 1e-6) expect(r2.sr! / r1.sr).toBeCloseTo(a, 6);
          if (r1.cochran && r2.cochran) expect(r2.cochran.C).toBeCloseTo(r1.cochran.C, 6);
          if (r1.grubbs.singleHigh && r2.grubbs.singleHigh && r1.grubbs.singleHigh.G > 1e-6) {
            expect(r2.grubbs.singleHigh.G).toBeCloseTo(r1.grubbs.singleHigh.G, 5);
          }
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('indicator values used by precisionAnalysis come from ./critical-values', () => {
  it('h and k indicators at p = 5, n = 2', () => {
    const r = precisionAnalysis(
      [1, 2, 3, 4, 5].map((m, i) => ({ code: `L${i}`, values: [m, m + 0.1 * (i + 1)] })),
    );
    expect(r.mandel.h!.indicator1).toBeCloseTo(mandelHIndicator(5, 0.01), 14);
    expect(r.mandel.k!.indicator5).toBeCloseTo(mandelKIndicator(5, 2, 0.05), 14);
    expect(r.grubbs.doubleHigh!.critical5).toBe(grubbsDoubleCritical(5, 0.05));
  });
});
