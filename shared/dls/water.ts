/**
 * Properties of liquid water, the usual DLS dispersant: density (Tanaka et al. 2001), viscosity
 * (IAPWS 2008) and refractive index (IAPWS 1997). Pure functions, no I/O.
 */
import { celsiusToKelvin } from './constants';

function assertRange(value: number, min: number, max: number, what: string, fn: string): void {
  if (!Number.isFinite(value) || value < min || value > max) {
    throw new RangeError(`${fn}: ${what} must be between ${min} and ${max}, got ${value}`);
  }
}

/**
 * Density of air-free water (standard mean ocean water isotopic composition) at 101.325 kPa.
 *
 * ρ = a5·[1 − (t + a1)²·(t + a2) / (a3·(t + a4))], a1 = −3.983035 °C, a2 = 301.797 °C,
 * a3 = 522528.9 °C², a4 = 69.34881 °C, a5 = 999.974950 kg/m³.
 * Source: Tanaka, Girard, Davis, Peuto & Bignell, "Recommended table for the density of water
 * between 0 °C and 40 °C based on recent experimental reports", Metrologia 38, 301–309 (2001).
 * @param celsius temperature t, °C (valid 0–40 °C)
 * @returns density, kg/m³
 * @throws RangeError outside 0–40 °C
 */
export function waterDensity(celsius: number): number {
  assertRange(celsius, 0, 40, 'temperature (°C)', 'waterDensity');
  const a1 = -3.983035;
  const a2 = 301.797;
  const a3 = 522528.9;
  const a4 = 69.34881;
  const a5 = 999.97495;
  return a5 * (1 - ((celsius + a1) ** 2 * (celsius + a2)) / (a3 * (celsius + a4)));
}

// IAPWS R12-08 reference constants and coefficients (Tables 1 and 2 of the release).
const T_STAR_K = 647.096;
const RHO_STAR = 322.0; // kg/m³
const MU_STAR_PA_S = 1e-6;
const H0 = [1.67752, 2.20462, 0.6366564, -0.241605];
/** H[i][j] multiplies (1/T̄ − 1)^i (ρ̄ − 1)^j. */
const H: readonly (readonly number[])[] = [
  [5.20094e-1, 2.22531e-1, -2.81378e-1, 1.61913e-1, -3.25372e-2, 0, 0],
  [8.50895e-2, 9.99115e-1, -9.06851e-1, 2.57399e-1, 0, 0, 0],
  [-1.08374, 1.88797, -7.72479e-1, 0, 0, 0, 0],
  [-2.89555e-1, 1.26613, -4.89837e-1, 0, 6.98452e-2, 0, -4.35673e-3],
  [0, 0, -2.5704e-1, 0, 0, 8.72102e-3, 0],
  [0, 1.20573e-1, 0, 0, 0, 0, -5.93264e-4],
];

/**
 * Dynamic viscosity of water from temperature and density, IAPWS 2008 formulation:
 * η = η* · μ̄0(T̄) · μ̄1(T̄, ρ̄) · μ̄2, with T̄ = T/647.096 K, ρ̄ = ρ/(322 kg/m³), η* = 1 µPa s,
 * μ̄0 = 100·√T̄ / Σ_{i=0..3} H_i/T̄^i, μ̄1 = exp[ρ̄ Σ_i Σ_j H_ij (1/T̄ − 1)^i (ρ̄ − 1)^j].
 * The critical enhancement μ̄2 is taken as 1: the release states it is significant only very
 * close to the critical point (647 K), far from any DLS measurement.
 * Source: IAPWS R12-08, "Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary Water
 * Substance"; Huber et al., J. Phys. Chem. Ref. Data 38, 101–125 (2009). Check point of the
 * release (ρ = 998 kg/m³, T = 298.15 K → 889.735100 µPa s) reproduced in water.spec.ts.
 * @param kelvin temperature T, K (liquid range used here: 253.15–423.15 K)
 * @param densityKgM3 density ρ, kg/m³
 * @returns viscosity, Pa s
 */
export function waterViscosityIapws(kelvin: number, densityKgM3: number): number {
  assertRange(kelvin, 253.15, 423.15, 'temperature (K)', 'waterViscosityIapws');
  assertRange(densityKgM3, 1, 1100, 'density (kg/m³)', 'waterViscosityIapws');
  const tb = kelvin / T_STAR_K;
  const rb = densityKgM3 / RHO_STAR;
  let den = 0;
  for (let i = 0; i < H0.length; i++) den += H0[i] / tb ** i;
  const mu0 = (100 * Math.sqrt(tb)) / den;
  const x = 1 / tb - 1;
  const y = rb - 1;
  let s = 0;
  for (let i = 0; i < H.length; i++) {
    let inner = 0;
    for (let j = 0; j < H[i].length; j++) inner += H[i][j] * y ** j;
    s += x ** i * inner;
  }
  const mu1 = Math.exp(rb * s);
  return MU_STAR_PA_S * mu0 * mu1;
}

/**
 * Dynamic viscosity of water at atmospheric pressure: IAPWS 2008 ({@link waterViscosityIapws})
 * evaluated at the Tanaka et al. (2001) density ({@link waterDensity}).
 * Values: docs/DLS.md table (15–40 °C), e.g. 25 °C → 0.8900 mPa s.
 * @param celsius temperature, °C (0–40 °C, the range of the density formula)
 * @returns viscosity, Pa s
 */
export function waterViscosity(celsius: number): number {
  return waterViscosityIapws(celsiusToKelvin(celsius), waterDensity(celsius));
}

// IAPWS R9-97 coefficients (Table 1 of the release).
const RI_A = [
  0.244257733, 9.74634476e-3, -3.73234996e-3, 2.68678472e-4, 1.5892057e-3, 2.45934259e-3,
  0.90070492, -1.66626219e-2,
];
const LAMBDA_UV = 0.229202;
const LAMBDA_IR = 5.432937;

/**
 * Refractive index of water (relative to vacuum) from temperature, wavelength and density.
 *
 * (n² − 1)/(n² + 2)·(1/ρ̄) = a0 + a1ρ̄ + a2T̄ + a3λ̄²T̄ + a4/λ̄² + a5/(λ̄² − λ̄_UV²)
 *   + a6/(λ̄² − λ̄_IR²) + a7ρ̄², with T̄ = T/273.15 K, ρ̄ = ρ/(1000 kg/m³), λ̄ = λ/0.589 µm,
 *   λ̄_UV = 0.229202, λ̄_IR = 5.432937.
 * Source: IAPWS R9-97, "Release on the Refractive Index of Ordinary Water Substance as a Function
 * of Wavelength, Temperature and Pressure" (Harvey, Gallagher & Levelt Sengers, J. Phys. Chem. Ref.
 * Data 27, 761, 1998). Coefficients from memory of the release, verified in water.spec.ts against
 * the values quoted in docs/DLS.md (633, 532, 658 nm at 20 and 25 °C, all six to 5 decimals).
 * @param celsius temperature, °C (−12…500 °C in the release; density default needs 0–40 °C)
 * @param wavelengthNm vacuum wavelength, nm (200–1100 nm)
 * @param densityKgM3 density, kg/m³ (default: Tanaka et al. 2001 at `celsius`)
 * @returns refractive index n (dimensionless)
 */
export function waterRefractiveIndex(
  celsius: number,
  wavelengthNm: number,
  densityKgM3: number = waterDensity(celsius),
): number {
  assertRange(celsius, -12, 500, 'temperature (°C)', 'waterRefractiveIndex');
  assertRange(wavelengthNm, 200, 1100, 'wavelength (nm)', 'waterRefractiveIndex');
  assertRange(densityKgM3, 0, 1060, 'density (kg/m³)', 'waterRefractiveIndex');
  const tb = celsiusToKelvin(celsius) / 273.15;
  const rb = densityKgM3 / 1000;
  const lb = wavelengthNm / 1000 / 0.589;
  const l2 = lb * lb;
  const rhs =
    rb *
    (RI_A[0] +
      RI_A[1] * rb +
      RI_A[2] * tb +
      RI_A[3] * l2 * tb +
      RI_A[4] / l2 +
      RI_A[5] / (l2 - LAMBDA_UV ** 2) +
      RI_A[6] / (l2 - LAMBDA_IR ** 2) +
      RI_A[7] * rb * rb);
  // (n² − 1)/(n² + 2) = rhs  ⇒  n² = (1 + 2·rhs)/(1 − rhs)
  return Math.sqrt((1 + 2 * rhs) / (1 - rhs));
}
