import { mulberry32, syntheticRound } from './synthetic-round';

describe('syntheticRound', () => {
  it('is deterministic for a seed and has the requested shape', () => {
    const spec = { participants: 10, items: 2, measurands: 2, replicates: 3, seed: 1 };
    const a = syntheticRound(spec);
    expect(a).toHaveLength(10 * 2 * 2 * 3);
    expect(syntheticRound(spec)).toEqual(a);
    expect(syntheticRound({ ...spec, seed: 2 })[0].value).not.toBe(a[0].value);
  });
  it('mulberry32 yields uniform numbers in [0, 1) (mean of 10^5 draws ≈ 0.5)', () => {
    const r = mulberry32(123);
    let s = 0;
    for (let i = 0; i < 1e5; i++) {
      const u = r();
      expect(u >= 0 && u < 1).toBe(true);
      s += u;
    }
    expect(s / 1e5).toBeCloseTo(0.5, 2);
  });
});
