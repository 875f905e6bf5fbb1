import * as dls from './index';

describe('shared/dls index', () => {
  it('re-exports the physics', () => {
    expect(typeof dls.cumulantsFit).toBe('function');
    expect(typeof dls.parseCorrelationCsv).toBe('function');
    expect(typeof dls.waterViscosity).toBe('function');
    expect(typeof dls.diameterFromDiffusion).toBe('function');
    expect(dls.BOLTZMANN_J_PER_K).toBe(1.380649e-23);
  });

  it('end to end: CSV text → cumulants mean of a 100 nm decay in water at 25 °C, 173°, 633 nm', () => {
    const n = dls.waterRefractiveIndex(25, 633);
    const eta = dls.waterViscosity(25);
    const q = dls.scatteringVector(n, 633e-9, 173);
    const gamma = dls.decayRate(dls.diffusionFromDiameter(100e-9, 298.15, eta), q);
    const rows = Array.from({ length: 150 }, (_, i) => {
      const t = 1e-6 * Math.pow(1e5, i / 149);
      return `${t.toExponential(6)};${(0.9 * Math.exp(-2 * gamma * t)).toFixed(6)}`;
    });
    const data = dls.parseCorrelationCsv(`tau_s;g2_minus_1\n${rows.join('\n')}`);
    const r = dls.cumulantsFit({
      ...data,
      temperatureC: 25,
      viscosityPaS: eta,
      refractiveIndex: n,
      wavelengthNm: 633,
      angleDeg: 173,
    });
    expect(r.zAverageNm).toBeCloseTo(100, 1); // rounding of the text export only
    expect(Math.abs(r.pdi)).toBeLessThan(0.002);
  });
});
