import { waterDensity, waterRefractiveIndex, waterViscosity, waterViscosityIapws } from './water';

describe('waterViscosityIapws (source: IAPWS R12-08 / Huber et al. 2009)', () => {
  it('check point of the release: ρ = 998 kg/m³, T = 298.15 K → η = 889.735100 µPa s', () => {
    expect(waterViscosityIapws(298.15, 998) * 1e6).toBeCloseTo(889.7351, 6);
  });
  it('rejects temperatures outside the liquid range used', () => {
    expect(() => waterViscosityIapws(500, 998)).toThrow(RangeError);
  });
});

describe('waterDensity (source: Tanaka et al., Metrologia 38, 301–309, 2001; values as quoted in docs/DLS.md)', () => {
  it.each([
    [15, 999.1026],
    [20, 998.2067],
    [25, 997.047],
    [30, 995.6488],
    [35, 994.0326],
    [40, 992.2152],
  ])('%i °C → %f kg/m³', (t, rho) => {
    expect(waterDensity(t)).toBeCloseTo(rho, 4);
  });
  it('maximum density near 3.98 °C (a1 of the formula): 999.9750 kg/m³', () => {
    expect(waterDensity(3.983035)).toBeCloseTo(999.97495, 5);
    expect(waterDensity(3.983035)).toBeGreaterThan(waterDensity(3));
    expect(waterDensity(3.983035)).toBeGreaterThan(waterDensity(5));
  });
  it('rejects temperatures outside 0–40 °C', () => {
    expect(() => waterDensity(41)).toThrow(/between 0 and 40/);
    expect(() => waterDensity(NaN)).toThrow(RangeError);
  });
});

describe('waterViscosity at atmospheric pressure (source: docs/DLS.md table, IAPWS 2008 with Tanaka density)', () => {
  it.each([
    [15, 1.1376],
    [20, 1.0016],
    [25, 0.89],
    [30, 0.7972],
    [35, 0.7191],
    [40, 0.6527],
  ])('%i °C → %f mPa s (4 decimals)', (t, eta) => {
    expect(waterViscosity(t) * 1e3).toBeCloseTo(eta, 4);
  });

  it('agrees with η = A·10^(B/(T − C)) within 0.2 % over 15–40 °C (docs/DLS.md plausibility correlation)', () => {
    for (let t = 15; t <= 40; t += 1) {
      const simple = 2.414e-5 * 10 ** (247.8 / (t + 273.15 - 140));
      expect(Math.abs(waterViscosity(t) / simple - 1)).toBeLessThan(0.002);
    }
  });

  it('20 °C sample analysed with the 25 °C viscosity: size ratio η20/η25 ≈ 1.1254 (docs/DLS.md)', () => {
    expect(waterViscosity(20) / waterViscosity(25)).toBeCloseTo(1.1254, 3);
  });
});

describe('waterRefractiveIndex (source: IAPWS R9-97; values quoted in docs/DLS.md, Daimon & Masumura 2007)', () => {
  it.each([
    [20, 633, 1.3321],
    [25, 633, 1.33161],
    [20, 532, 1.33538],
    [25, 532, 1.33488],
    [20, 658, 1.33147],
    [25, 658, 1.33099],
  ])('%i °C, %i nm → %f', (t, lambda, n) => {
    expect(Math.abs(waterRefractiveIndex(t, lambda) - n)).toBeLessThan(0.6e-5);
  });
  it('rejects wavelengths outside 200–1100 nm', () => {
    expect(() => waterRefractiveIndex(25, 1500)).toThrow(/wavelength/);
  });
});
