/**
 * Bias of a standard measurement method at one level with an accepted reference value µ
 * (ISO 5725-4:1994 §5.5, recalled from memory).
 *
 *   δ̂ = m̂ − µ
 *   A = 1.96·√((n(γ² − 1) + 1)/(γ²·p·n)),  γ = s_R/s_r
 *   95 % interval: δ̂ − A·s_R ≤ δ ≤ δ̂ + A·s_R
 *
 * A·s_R = 1.96·√((s_R² − (1 − 1/n)·s_r²)/p): the standard deviation of the mean of p lab means of
 * n results each. When the reference value has a standard uncertainty u(µ) it is added in
 * quadrature (ISO 5725-4 assumes a µ with negligible uncertainty; adding it is common practice).
 * The bias is significant when the interval excludes 0.
 *
 * Pure function, no I/O: runs on the server and in the browser.
 */

export interface MethodBiasInput {
  /** General mean m̂ of the level (unit of the measurand). */
  mean: number;
  /** Accepted reference value µ (same unit). */
  reference: number;
  /** Standard uncertainty of µ; null or 0 when negligible. */
  referenceU?: number | null;
  sr: number;
  sR: number;
  /** Laboratories p ≥ 1. */
  p: number;
  /** Results per laboratory n ≥ 1 (Σn_i/p when unequal). */
  n: number;
}

export interface MethodBias {
  bias: number;
  /** δ̂/µ·100; null when µ = 0. */
  relativeBiasPercent: number | null;
  /** Standard uncertainty of δ̂. */
  u: number;
  /** 1.96·u. */
  halfWidth95: number;
  lower95: number;
  upper95: number;
  significant: boolean;
}

/** Coverage factor of the 95 % interval (normal distribution), as in ISO 5725-4. */
export const BIAS_COVERAGE = 1.96;

/**
 * Estimated bias of the method at one level and its 95 % interval (ISO 5725-4 §5.5).
 * @throws RangeError for non-finite input, s_r < 0, s_R < s_r·(1 − 1e-12), p < 1 or n < 1
 */
export function methodBias(input: MethodBiasInput): MethodBias {
  const { mean, reference, sr, sR, p, n } = input;
  const uRef = input.referenceU ?? 0;
  for (const [k, v] of Object.entries({ mean, reference, sr, sR, p, n, uRef })) {
    if (!Number.isFinite(v)) throw new RangeError(`methodBias: ${k} must be finite, got ${v}`);
  }
  if (sr < 0 || uRef < 0) throw new RangeError('methodBias: s_r and u(µ) must be ≥ 0');
  if (sR < sr * (1 - 1e-12)) throw new RangeError('methodBias: s_R must be ≥ s_r');
  if (p < 1 || n < 1) throw new RangeError('methodBias: p and n must be ≥ 1');
  const bias = mean - reference;
  const varMean = Math.max(0, sR * sR - (1 - 1 / n) * sr * sr) / p;
  const u = Math.sqrt(varMean + uRef * uRef);
  const halfWidth95 = BIAS_COVERAGE * u;
  const lower95 = bias - halfWidth95;
  const upper95 = bias + halfWidth95;
  return {
    bias,
    relativeBiasPercent: reference === 0 ? null : (bias / reference) * 100,
    u,
    halfWidth95,
    lower95,
    upper95,
    significant: lower95 > 0 || upper95 < 0,
  };
}

/**
 * ISO 5725-4 §5.5.2 factor A (from memory): A = 1.96·√((n(γ² − 1) + 1)/(γ²·p·n)), γ = σ_R/σ_r.
 * Kept for the spec's check that A·s_R equals {@link methodBias}'s half-width.
 */
export function biasFactorA(gamma: number, p: number, n: number): number {
  const g2 = gamma * gamma;
  return BIAS_COVERAGE * Math.sqrt((n * (g2 - 1) + 1) / (g2 * p * n));
}
