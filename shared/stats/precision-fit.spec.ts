import { fitLevelDependence } from './precision-fit';

/*
 * No published worked example of the ISO 5725-2 §7.5 fits is held in the repository, so these
 * checks use exact recovery (data built to follow one relation exactly must give back its
 * parameters and be chosen) and a hand calculation of the least-squares line on the logarithms.
 */
const m = [60, 100, 200, 400];

describe('fitLevelDependence (ISO 5725-2:1994 §7.5, relations recalled from memory)', () => {
  it('s = 0.02·m exactly: proportional, b = 0.02, zero residual, chosen', () => {
    const f = fitLevelDependence(
      m,
      m.map((x) => 0.02 * x),
    );
    const prop = f.candidates.find((c) => c.relation === 'proportional')!;
    expect(prop.parameters.b).toBeCloseTo(0.02, 14);
    expect(prop.relativeResidualSd).toBeLessThan(1e-12);
    expect(f.chosen).toBe('proportional');
  });

  it('s = 0.5 + 0.01·m exactly: linear recovers a and b (weighted iterations leave an exact line unchanged) and is chosen', () => {
    const f = fitLevelDependence(
      m,
      m.map((x) => 0.5 + 0.01 * x),
    );
    const lin = f.candidates.find((c) => c.relation === 'linear')!;
    expect(lin.parameters.a).toBeCloseTo(0.5, 12);
    expect(lin.parameters.b).toBeCloseTo(0.01, 14);
    expect(lin.degreesOfFreedom).toBe(2);
    expect(f.chosen).toBe('linear');
  });

  it('lg s = −1 + 0.6·lg m exactly: log-linear recovers c and d', () => {
    const f = fitLevelDependence(
      m,
      m.map((x) => 10 ** (-1 + 0.6 * Math.log10(x))),
    );
    const lg = f.candidates.find((c) => c.relation === 'log-linear')!;
    expect(lg.parameters.c).toBeCloseTo(-1, 12);
    expect(lg.parameters.d).toBeCloseTo(0.6, 12);
    expect(f.chosen).toBe('log-linear');
  });

  it('a constant SD is chosen as constant (fewest parameters on a tie with the two-parameter lines)', () => {
    const f = fitLevelDependence(m, [1.2, 1.2, 1.2, 1.2]);
    expect(f.chosen).toBe('constant');
    expect(f.candidates.find((c) => c.relation === 'constant')!.parameters.c).toBeCloseTo(1.2, 14);
  });

  it('log-linear by hand: m = 10, 100, s = 1, 10 and a third point (1000, 100) → d = 1, c = −1', () => {
    // hand calculation: lg m = 1, 2, 3 and lg s = 0, 1, 2 lie on lg s = −1 + 1·lg m.
    const f = fitLevelDependence([10, 100, 1000], [1, 10, 100]);
    const lg = f.candidates.find((c) => c.relation === 'log-linear')!;
    expect(lg.parameters.d).toBeCloseTo(1, 12);
    expect(lg.parameters.c).toBeCloseTo(-1, 12);
  });

  it('proportional b is the mean of s/m (ISO 5725-2 §7.5.6 weights W = 1/m², from memory): s/m = 0.01, 0.02, 0.03 → b = 0.02', () => {
    const f = fitLevelDependence(
      [100, 100, 100].map((x, i) => x * (i + 1)),
      [1, 4, 9],
    );
    expect(f.candidates.find((c) => c.relation === 'proportional')!.parameters.b).toBeCloseTo(
      (0.01 + 0.02 + 0.03) / 3,
      14,
    );
  });

  it('one level: nothing to choose, with a note; bad input throws', () => {
    const f = fitLevelDependence([100], [1]);
    expect(f.chosen).toBeNull();
    expect(f.note).toMatch(/Too few levels/);
    expect(() => fitLevelDependence([100, -1], [1, 1])).toThrow(RangeError);
    expect(() => fitLevelDependence([100, 200], [1, 0])).toThrow(RangeError);
  });
});
