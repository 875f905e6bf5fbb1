import { celsiusToKelvin } from './constants';
import {
  decayRate,
  diameterFromDiffusion,
  diffusionFromDiameter,
  scatteringVector,
} from './stokes-einstein';

// Worked example of docs/DLS.md (computed there from the relations; 25 °C, η = 0.890023 mPa s,
// n = 1.332, λ₀ = 633 nm). Printed to 5 significant figures.
const T = celsiusToKelvin(25);
const ETA = 0.890023e-3;
const N = 1.332;
const LAMBDA = 633e-9;

function rel(a: number, b: number): number {
  return Math.abs(a / b - 1);
}

describe('Stokes–Einstein worked example (source: docs/DLS.md table)', () => {
  it.each([
    [100, 173, 4.9073e-12, 2.63937e7, 3418.6],
    [100, 90, 4.9073e-12, 1.8698e7, 1715.7],
    [60, 173, 8.1789e-12, 2.63937e7, 5697.6],
    [60, 90, 8.1789e-12, 1.8698e7, 2859.5],
  ])('d = %i nm, θ = %i° → D = %e m²/s, q = %e 1/m, Γ = %f 1/s', (d, theta, D, q, gamma) => {
    const dCalc = diffusionFromDiameter(d * 1e-9, T, ETA);
    const qCalc = scatteringVector(N, LAMBDA, theta);
    expect(rel(dCalc, D)).toBeLessThan(1e-4);
    expect(rel(qCalc, q)).toBeLessThan(2e-6);
    expect(rel(decayRate(dCalc, qCalc), gamma)).toBeLessThan(2e-5);
  });

  it('diameter form, not radius: D·d_H = k_B·T/(3πη), round trip exact', () => {
    const D = diffusionFromDiameter(100e-9, T, ETA);
    expect(diameterFromDiffusion(D, T, ETA)).toBeCloseTo(100e-9, 20);
    // Radius form D = k_B·T/(6π·η·a) with a = 50 nm gives the same D (docs/DLS.md).
    expect(rel(D, (1.380649e-23 * T) / (6 * Math.PI * ETA * 50e-9))).toBeLessThan(1e-15);
  });

  it('q at 180° is 4πn/λ₀; rejects angles outside (0, 180]', () => {
    expect(scatteringVector(1, 1, 180)).toBeCloseTo(4 * Math.PI, 12);
    expect(() => scatteringVector(N, LAMBDA, 0)).toThrow(RangeError);
    expect(() => scatteringVector(N, LAMBDA, 190)).toThrow(RangeError);
  });

  it('rejects non-positive inputs naming the quantity', () => {
    expect(() => diffusionFromDiameter(-1e-9, T, ETA)).toThrow(/diameter/);
    expect(() => diameterFromDiffusion(1e-12, T, 0)).toThrow(/viscosity/);
  });
});
