import { cumulantsFit, type CumulantsInput } from './cumulants';
import { celsiusToKelvin } from './constants';
import { decayRate, diffusionFromDiameter, scatteringVector } from './stokes-einstein';

// Conditions of the worked example in docs/DLS.md: 25 °C, η = 0.890023 mPa s, n = 1.332, 633 nm.
const T_C = 25;
const ETA = 0.890023e-3;
const N = 1.332;
const LAMBDA_NM = 633;

/** 200 lag times, log-spaced from 0.5 µs to 1 s (typical correlator range; common practice). */
const LAGS = Array.from({ length: 200 }, (_, i) => 0.5e-6 * Math.pow(2e6, i / 199));

function gammaOf(dNm: number, angleDeg: number): number {
  const q = scatteringVector(N, LAMBDA_NM * 1e-9, angleDeg);
  return decayRate(diffusionFromDiameter(dNm * 1e-9, celsiusToKelvin(T_C), ETA), q);
}

function input(
  g2Minus1: number[],
  angleDeg: number,
  extra: Partial<CumulantsInput> = {},
): CumulantsInput {
  return {
    lagTimesS: LAGS,
    g2Minus1,
    temperatureC: T_C,
    viscosityPaS: ETA,
    refractiveIndex: N,
    wavelengthNm: LAMBDA_NM,
    angleDeg,
    ...extra,
  };
}

/** Deterministic PRNG (mulberry32) and Box–Muller normal deviates, for reproducible noise. */
function normalNoise(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

describe('monodisperse 100 nm (Γ from the docs/DLS.md worked example)', () => {
  it.each([
    [173, 3418.6],
    [90, 1715.7],
  ])('θ = %i°: Γ̄ = %f 1/s, x = 100 nm, PDI ≈ 0, β recovered', (angle, gammaPrinted) => {
    // Siegert: g2 − 1 = β·exp(−2Γτ) — the intensity correlation decays with 2Γ.
    const gamma = gammaOf(100, angle);
    const r = cumulantsFit(
      input(
        LAGS.map((t) => 0.8 * Math.exp(-2 * gamma * t)),
        angle,
      ),
    );
    expect(Math.abs(r.gammaBar / gammaPrinted - 1)).toBeLessThan(2e-5); // printed to 5 figures
    expect(r.zAverageNm).toBeCloseTo(100, 8);
    expect(Math.abs(r.pdi)).toBeLessThan(1e-9);
    expect(r.intercept).toBeCloseTo(0.8, 10);
    expect(r.order).toBe(2);
    expect(r.warnings).toEqual([]);
    // Cut-off at 10 % of β: the last point used has g2 − 1 ≥ 0.08, the next one is below.
    const last = r.pointsUsed - 1;
    expect(0.8 * Math.exp(-2 * gamma * LAGS[last])).toBeGreaterThanOrEqual(0.08);
    expect(0.8 * Math.exp(-2 * gamma * LAGS[last + 1])).toBeLessThan(0.08);
    expect(r.cutoff).toEqual({ fraction: 0.1, lagTimeS: LAGS[last] });
  });
});

describe('exact test vector: equal-intensity 60/100 nm mix → 75 nm, PDI 0.0625 (docs/DLS.md, derivation)', () => {
  // g1 = ½e^(−Γ60τ) + ½e^(−Γ100τ); Γ̄ = (Γ60 + Γ100)/2; x = 2/(1/60 + 1/100) = 75 nm;
  // PDI = ((100 − 60)/(100 + 60))² = 0.0625, whatever T, η, n, λ, θ. Truncation of the cumulant
  // series biases a finite fit: tolerances 0.1 % on Γ̄ and x, 10 % on PDI (docs/DLS.md).
  it.each([
    [173, 2],
    [173, 3],
    [90, 2],
    [90, 3],
  ] as const)('θ = %i°, order %i', (angle, order) => {
    const g60 = gammaOf(60, angle);
    const g100 = gammaOf(100, angle);
    const g2 = LAGS.map((t) => 0.8 * (0.5 * Math.exp(-g60 * t) + 0.5 * Math.exp(-g100 * t)) ** 2);
    const r = cumulantsFit(input(g2, angle, { order }));
    expect(Math.abs(r.gammaBar / ((g60 + g100) / 2) - 1)).toBeLessThan(1e-3);
    expect(Math.abs(r.zAverageNm / 75 - 1)).toBeLessThan(1e-3);
    expect(Math.abs(r.pdi / 0.0625 - 1)).toBeLessThan(0.1);
    // The fit over g1 ≥ 0.32 lands where docs/DLS.md says: PDI ≈ 0.061–0.064.
    expect(r.pdi).toBeGreaterThan(0.061);
    expect(r.pdi).toBeLessThan(0.064);
    expect(r.mu3 === null).toBe(order === 2);
    expect(r.warnings).toEqual([]);
  });
});

describe('noisy data and quality warnings', () => {
  const gamma = gammaOf(100, 173);
  const clean = LAGS.map((t) => 0.8 * Math.exp(-2 * gamma * t));

  it('0.2 % noise (of β): size within 1 %, no warnings', () => {
    const noise = normalNoise(7);
    const r = cumulantsFit(
      input(
        clean.map((v) => v + 0.0016 * noise()),
        173,
      ),
    );
    expect(Math.abs(r.zAverageNm / 100 - 1)).toBeLessThan(0.01);
    expect(Math.abs(r.pdi)).toBeLessThan(0.05);
    expect(r.residualRms).toBeLessThan(0.005);
    expect(r.warnings).toEqual([]);
  });

  it('low intercept β = 0.05 → intercept warning', () => {
    const r = cumulantsFit(
      input(
        clean.map((v) => v / 16),
        173,
      ),
    );
    expect(r.intercept).toBeCloseTo(0.05, 8);
    expect(r.warnings.join(' ')).toMatch(/Intercept/);
  });

  it('intercept above 1 → intercept warning', () => {
    const r = cumulantsFit(
      input(
        clean.map((v) => v * 1.5),
        173,
      ),
    );
    expect(r.warnings.join(' ')).toMatch(/Intercept/);
  });

  it('baseline offset of 5 % of β → baseline drift warning', () => {
    const r = cumulantsFit(
      input(
        clean.map((v) => v + 0.04),
        173,
      ),
    );
    expect(r.warnings.join(' ')).toMatch(/Baseline drift/);
  });

  it('5 % noise → poor-fit warning', () => {
    const noise = normalNoise(11);
    const r = cumulantsFit(
      input(
        clean.map((v) => v + 0.04 * noise()),
        173,
      ),
    );
    expect(r.residualRms).toBeGreaterThan(0.02);
    expect(r.warnings.join(' ')).toMatch(/Poor fit/);
  });

  it('decay not captured by the lag range → warning', () => {
    const slow = LAGS.map((t) => 0.8 * Math.exp(-2 * 0.5 * t));
    const r = cumulantsFit(input(slow, 173));
    expect(r.pointsUsed).toBe(LAGS.length);
    expect(r.warnings.join(' ')).toMatch(/never fell below the cut-off/);
  });

  it('clear errors on bad input', () => {
    expect(() => cumulantsFit(input(clean.slice(1), 173))).toThrow(/pair up/);
    expect(() => cumulantsFit(input(clean, 173, { lagTimesS: [...LAGS].reverse() }))).toThrow(
      /must increase/,
    );
    expect(() =>
      cumulantsFit(
        input(
          clean.map(() => 0),
          173,
        ),
      ),
    ).toThrow(/not positive/);
    expect(() => cumulantsFit(input(clean, 173, { viscosityPaS: 0 }))).toThrow(/viscosity/);
    // A decay so fast that only 2 points lie above the cut-off.
    const fast = LAGS.map((t) => 0.8 * Math.exp(-2 * 2e6 * t));
    expect(() => cumulantsFit(input(fast, 173))).toThrow(/at least 4/);
  });
});

describe('weighted least squares, weights ∝ (g2 − 1)² (documented in cumulants.ts)', () => {
  it('equals the weighted normal-equation solution computed independently on 8 points', () => {
    const tau = [1e-5, 2e-5, 4e-5, 7e-5, 1e-4, 1.5e-4, 2e-4, 3e-4];
    const wobble = [0.01, -0.02, 0.015, -0.01, 0.03, -0.025, 0.02, -0.03];
    const g = tau.map((t, i) => 0.7 * Math.exp(-2 * 3000 * t) * (1 + wobble[i]));
    const r = cumulantsFit({
      lagTimesS: tau,
      g2Minus1: g,
      temperatureC: 25,
      viscosityPaS: ETA,
      refractiveIndex: N,
      wavelengthNm: LAMBDA_NM,
      angleDeg: 173,
      cutoffFraction: 0.01,
    });
    expect(r.pointsUsed).toBe(8);
    // Normal equations Σw·x_k·x_l·a = Σw·x_k·y with x = (1, s, s²), s = τ/1e-4, w = g², y = ½ ln g.
    const M = [0, 1, 2].map(() => [0, 0, 0]);
    const v = [0, 0, 0];
    tau.forEach((t, i) => {
      const s = t / 1e-4;
      const x = [1, s, s * s];
      const w = g[i] ** 2;
      const y = 0.5 * Math.log(g[i]);
      for (let k = 0; k < 3; k++) {
        v[k] += w * x[k] * y;
        for (let l = 0; l < 3; l++) M[k][l] += w * x[k] * x[l];
      }
    });
    const det = (m: number[][]) =>
      m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) -
      m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
      m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
    const cramer = (k: number) =>
      det(M.map((row, i) => row.map((c, j) => (j === k ? v[i] : c)))) / det(M);
    const a0 = cramer(0);
    const a1 = cramer(1) / 1e-4;
    const a2 = cramer(2) / 1e-8;
    expect(r.intercept).toBeCloseTo(Math.exp(2 * a0), 10);
    expect(r.gammaBar / -a1).toBeCloseTo(1, 9);
    expect(r.mu2 / (2 * a2)).toBeCloseTo(1, 7);
  });
});
