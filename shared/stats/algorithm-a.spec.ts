import creosote from './fixtures/creosote.json';
import { algorithmA } from './algorithm-a';

// ISO 5725-5:1998 creosote example, nine laboratory means (source text in fixtures/creosote.json);
// the converged values are computed from the ISO 13528 Algorithm A definition (regression values,
// no printed ISO answer: see the fixture's "provenance").
describe('algorithmA: ISO 5725-5 creosote data', () => {
  const xs = creosote.values;

  it('converges to x* = 20.4121428571, s* = 1.0698397030 (computed regression values)', () => {
    const r = algorithmA(xs);
    expect(r.outcome).toBe('converged');
    expect(r.converged).toBe(true);
    expect(r.robustMean).toBeCloseTo(20.4121428571, 9);
    expect(r.robustSd).toBeCloseTo(1.069839703, 9);
    // Slow convergence is expected (docs/STATISTICS.md: ~100 iterations).
    expect(r.iterations).toBeGreaterThan(20);
    expect(r.iterations).toBeLessThan(1000);
    expect(r.n).toBe(9);
  });

  it('first update steps match the published trace (fixtures/creosote.json firstIterations, computed)', () => {
    const trace = creosote.algorithmA.firstIterations;
    for (let k = 1; k < trace.length; k++) {
      const r = algorithmA(xs, { maxIterations: k });
      expect(r.outcome).toBe('not-converged');
      expect(r.robustMean).toBeCloseTo(trace[k][0], 5);
      expect(r.robustSd).toBeCloseTo(trace[k][1], 5);
    }
  });

  it('stopping early moves s* in its 3rd–4th figure (docs/STATISTICS.md)', () => {
    const early = algorithmA(xs, { maxIterations: 3 });
    const full = algorithmA(xs);
    expect(Math.abs(early.robustSd - full.robustSd)).toBeGreaterThan(0.01);
  });
});

describe('algorithmA: degenerate input', () => {
  it('n < 3 gives too-few-values with finite numbers', () => {
    const r = algorithmA([1, 3]);
    expect(r.outcome).toBe('too-few-values');
    expect(r.robustMean).toBe(2);
    expect(r.robustSd).toBeCloseTo(1.483, 12);
    const one = algorithmA([5]);
    expect(one.robustMean).toBe(5);
    expect(one.robustSd).toBe(0);
  });

  it('all equal, or more than half identical, gives zero-spread, never NaN', () => {
    const r = algorithmA([4, 4, 4, 4]);
    expect(r.outcome).toBe('zero-spread');
    expect(r.robustMean).toBe(4);
    expect(r.robustSd).toBe(0);
    const h = algorithmA([4, 4, 4, 5, 9]);
    expect(h.outcome).toBe('zero-spread');
    expect(Number.isNaN(h.robustMean)).toBe(false);
  });

  it('throws on empty input and non-finite values', () => {
    expect(() => algorithmA([])).toThrow(RangeError);
    expect(() => algorithmA([1, 2, NaN])).toThrow(RangeError);
  });

  it('large offsets still converge (centred iteration)', () => {
    const xs = creosote.values.map((v) => v + 1e7);
    const r = algorithmA(xs);
    expect(r.outcome).toBe('converged');
    expect(r.robustMean - 1e7).toBeCloseTo(20.4121428571, 6);
    expect(r.robustSd).toBeCloseTo(1.069839703, 6);
  });
});
