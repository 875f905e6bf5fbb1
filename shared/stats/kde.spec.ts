import { kde, silvermanBandwidth } from './kde';

describe('silvermanBandwidth: h = 0.9·min(s, IQR/1.34)·n^(−1/5) (Silverman 1986, eq. 3.31)', () => {
  it('1..5: s = 1.5811, IQR = 2 → h = 0.9·1.49254·5^(−0.2) (hand computation)', () => {
    expect(silvermanBandwidth([1, 2, 3, 4, 5])).toBeCloseTo(
      0.9 * (2 / 1.34) * Math.pow(5, -0.2),
      12,
    );
    expect(silvermanBandwidth([1, 2, 3, 4, 5])).toBeCloseTo(0.97355, 4);
  });
  it('uses s when s < IQR/1.34', () => {
    const xs = [0, 0, 1, 1];
    // s = 0.57735; IQR (type 7) = 1 → IQR/1.34 = 0.746 → s wins
    expect(silvermanBandwidth(xs)).toBeCloseTo(0.9 * Math.sqrt(1 / 3) * Math.pow(4, -0.2), 12);
  });
  it('zero spread falls back to a finite positive bandwidth', () => {
    expect(silvermanBandwidth([5, 5, 5])).toBeCloseTo(0.005, 12);
    expect(silvermanBandwidth([0])).toBe(1);
  });
});

describe('kde', () => {
  it('integrates to 1 and peaks at the single value (normal density 1/(h√2π))', () => {
    const r = kde([10], { bandwidth: 2, points: 801, cut: 8 });
    let area = 0;
    for (let i = 1; i < r.x.length; i++)
      area += ((r.density[i] + r.density[i - 1]) / 2) * (r.x[i] - r.x[i - 1]);
    expect(area).toBeCloseTo(1, 6);
    const peak = Math.max(...r.density);
    expect(peak).toBeCloseTo(1 / (2 * Math.sqrt(2 * Math.PI)), 6);
    expect(r.x[r.density.indexOf(peak)]).toBeCloseTo(10, 6);
  });
  it('returns the grid and the Silverman bandwidth by default', () => {
    const xs = [1, 2, 3, 4, 5];
    const r = kde(xs);
    expect(r.x).toHaveLength(256);
    expect(r.density).toHaveLength(256);
    expect(r.bandwidth).toBeCloseTo(silvermanBandwidth(xs), 14);
    expect(r.x[0]).toBeCloseTo(1 - 3 * r.bandwidth, 12);
  });
  it('rejects bad options and empty input', () => {
    expect(() => kde([])).toThrow(RangeError);
    expect(() => kde([1], { bandwidth: 0 })).toThrow(RangeError);
    expect(() => kde([1], { points: 1 })).toThrow(RangeError);
  });
});
