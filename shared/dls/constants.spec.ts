import { BOLTZMANN_J_PER_K, celsiusToKelvin } from './constants';

describe('constants (source: SI Brochure, 9th ed., BIPM 2019)', () => {
  it('k_B = 1.380 649 × 10⁻²³ J/K exactly', () => {
    expect(BOLTZMANN_J_PER_K).toBe(1.380649e-23);
  });
  it('25 °C = 298.15 K', () => {
    expect(celsiusToKelvin(25)).toBeCloseTo(298.15, 12);
  });
});
