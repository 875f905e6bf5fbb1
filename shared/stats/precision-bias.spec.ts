import { biasFactorA, methodBias } from './precision-bias';

describe('methodBias (ISO 5725-4:1994 §5.5, formulas recalled from memory)', () => {
  it('the half-width equals A·s_R with A = 1.96·√((n(γ² − 1) + 1)/(γ²pn)), γ = s_R/s_r', () => {
    const sr = 0.8;
    const sR = 2.0;
    const p = 10;
    const n = 3;
    const b = methodBias({ mean: 101.5, reference: 100, sr, sR, p, n });
    expect(b.bias).toBeCloseTo(1.5, 12);
    expect(b.halfWidth95).toBeCloseTo(biasFactorA(sR / sr, p, n) * sR, 12);
    // hand calculation: (4 − (2/3)·0.64)/10 = 0.357333…; √ = 0.597774; ×1.96 = 1.171637
    expect(b.halfWidth95).toBeCloseTo(1.171637, 5);
    expect(b.significant).toBe(true);
    expect(b.relativeBiasPercent).toBeCloseTo(1.5, 12);
  });

  it('s_L = 0 and n = 1: u = s_r/√p (the mean of p independent results)', () => {
    const b = methodBias({ mean: 10, reference: 10.1, sr: 0.3, sR: 0.3, p: 9, n: 1 });
    expect(b.u).toBeCloseTo(0.1, 14);
    expect(b.significant).toBe(false);
  });

  it('the reference uncertainty adds in quadrature (common practice)', () => {
    const b = methodBias({
      mean: 10,
      reference: 10,
      referenceU: 0.4,
      sr: 0.3,
      sR: 0.3,
      p: 9,
      n: 1,
    });
    expect(b.u).toBeCloseTo(Math.hypot(0.1, 0.4), 14);
  });

  it('refuses s_R < s_r and p < 1', () => {
    expect(() => methodBias({ mean: 1, reference: 1, sr: 2, sR: 1, p: 3, n: 2 })).toThrow(
      RangeError,
    );
    expect(() => methodBias({ mean: 1, reference: 1, sr: 1, sR: 1, p: 0, n: 2 })).toThrow(
      RangeError,
    );
  });
});
