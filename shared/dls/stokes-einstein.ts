/**
 * Stokes–Einstein relation, scattering vector and decay rate for dynamic light scattering.
 * SI units in and out (m, K, Pa s, m²/s, 1/m, 1/s); the scattering angle is in degrees.
 * Pure functions, no I/O.
 */
import { BOLTZMANN_J_PER_K } from './constants';

function assertPositive(value: number, what: string, fn: string): void {
  if (!Number.isFinite(value) || value <= 0) {
    throw new RangeError(`${fn}: ${what} must be a positive finite number, got ${value}`);
  }
}

/**
 * k_B·T / (3π·η·x) after checking its inputs for `fn`: the Stokes–Einstein relation gives D from
 * x = d_H and d_H from x = D by the same quotient (it is its own inverse).
 */
function stokesEinstein(
  fn: string,
  x: number,
  what: string,
  temperatureK: number,
  viscosityPaS: number,
): number {
  assertPositive(x, what, fn);
  assertPositive(temperatureK, 'temperature (K)', fn);
  assertPositive(viscosityPaS, 'viscosity (Pa s)', fn);
  return (BOLTZMANN_J_PER_K * temperatureK) / (3 * Math.PI * viscosityPaS * x);
}

/**
 * Translational diffusion coefficient of a sphere from its hydrodynamic DIAMETER:
 * D = k_B·T / (3π·η·d_H)  (the radius form is D = k_B·T/(6π·η·a), a = d_H/2).
 * Source: Stokes–Einstein relation (Einstein 1905; Berne & Pecora, Dynamic Light Scattering,
 * 2000); k_B exact (SI Brochure 2019).
 * @param diameterM hydrodynamic diameter d_H, m
 * @param temperatureK absolute temperature T, K
 * @param viscosityPaS dynamic viscosity of the medium η, Pa s
 * @returns diffusion coefficient D, m²/s
 */
export function diffusionFromDiameter(
  diameterM: number,
  temperatureK: number,
  viscosityPaS: number,
): number {
  return stokesEinstein(
    'diffusionFromDiameter',
    diameterM,
    'diameter (m)',
    temperatureK,
    viscosityPaS,
  );
}

/**
 * Hydrodynamic DIAMETER of a sphere from its diffusion coefficient: d_H = k_B·T / (3π·η·D).
 * Source: Stokes–Einstein relation (Berne & Pecora 2000); k_B exact (SI Brochure 2019).
 * @param diffusionM2PerS diffusion coefficient D, m²/s
 * @param temperatureK absolute temperature T, K
 * @param viscosityPaS dynamic viscosity of the medium η, Pa s
 * @returns hydrodynamic diameter d_H, m
 */
export function diameterFromDiffusion(
  diffusionM2PerS: number,
  temperatureK: number,
  viscosityPaS: number,
): number {
  return stokesEinstein(
    'diameterFromDiffusion',
    diffusionM2PerS,
    'diffusion coefficient (m²/s)',
    temperatureK,
    viscosityPaS,
  );
}

/**
 * Magnitude of the scattering vector: q = (4π·n/λ₀)·sin(θ/2).
 * Source: Berne & Pecora, Dynamic Light Scattering (2000), ch. 3; docs/DLS.md.
 * @param refractiveIndex refractive index of the medium n (dimensionless)
 * @param wavelengthM vacuum wavelength of the laser λ₀, m (e.g. 633e-9)
 * @param angleDeg scattering angle θ, degrees (0 < θ ≤ 180)
 * @returns q, 1/m
 */
export function scatteringVector(
  refractiveIndex: number,
  wavelengthM: number,
  angleDeg: number,
): number {
  assertPositive(refractiveIndex, 'refractive index', 'scatteringVector');
  assertPositive(wavelengthM, 'wavelength (m)', 'scatteringVector');
  if (!Number.isFinite(angleDeg) || angleDeg <= 0 || angleDeg > 180) {
    throw new RangeError(`scatteringVector: angle must be in (0, 180] degrees, got ${angleDeg}`);
  }
  return ((4 * Math.PI * refractiveIndex) / wavelengthM) * Math.sin((angleDeg * Math.PI) / 360);
}

/**
 * Decay rate of the FIELD autocorrelation g1(τ) = exp(−Γτ) of monodisperse spheres: Γ = D·q².
 * The intensity correlation g2 − 1 = β·g1² decays with 2Γ (Siegert relation): do not confuse them.
 * Source: Berne & Pecora (2000); docs/DLS.md.
 * @param diffusionM2PerS diffusion coefficient D, m²/s
 * @param qPerM scattering vector q, 1/m
 * @returns Γ, 1/s
 */
export function decayRate(diffusionM2PerS: number, qPerM: number): number {
  assertPositive(diffusionM2PerS, 'diffusion coefficient (m²/s)', 'decayRate');
  assertPositive(qPerM, 'scattering vector (1/m)', 'decayRate');
  return diffusionM2PerS * qPerM * qPerM;
}
