/**
 * Cumulants analysis of a measured intensity correlation function g2(τ) − 1: the cumulants mean
 * ("Z-average") diameter and the polydispersity index. Pure functions, no I/O.
 *
 * Method (ISO 22412:2017; earlier ISO 13321:1996; Koppel, J. Chem. Phys. 57, 4814, 1972):
 *   y(τ) = ln √(g2(τ) − 1) = ½·ln β − Γ̄·τ + (μ2/2)·τ² [− (μ3/6)·τ³]
 * fitted by weighted least squares over the early part of the decay.
 */
import { BOLTZMANN_J_PER_K, celsiusToKelvin } from './constants';
import { scatteringVector } from './stokes-einstein';

/** Input of {@link cumulantsFit}. */
export interface CumulantsInput {
  /** Lag times τ, s (strictly increasing, ≥ 0). */
  lagTimesS: readonly number[];
  /** Measured intensity correlation g2(τ) − 1 (dimensionless, baseline subtracted), same length. */
  g2Minus1: readonly number[];
  /** Sample temperature, °C. */
  temperatureC: number;
  /** Dispersant viscosity, Pa s. */
  viscosityPaS: number;
  /** Dispersant refractive index (dimensionless). */
  refractiveIndex: number;
  /** Vacuum laser wavelength, nm. */
  wavelengthNm: number;
  /** Scattering angle, degrees. */
  angleDeg: number;
  /** Polynomial order of the fit in τ: 2 (default) or 3. */
  order?: 2 | 3;
  /**
   * Fit only the leading points whose g2 − 1 is at least this fraction of the fitted intercept β.
   * Default 0.1 (g1 ≥ 0.32). Common practice: a few percent to 10 % (docs/DLS.md; the value
   * in ISO 22412 was not checked: from memory).
   */
  cutoffFraction?: number;
}

/** Result of {@link cumulantsFit}. */
export interface CumulantsResult {
  /** Cumulants mean diameter x = k_B·T·q²/(3π·η·Γ̄), nm (harmonic intensity-weighted mean). */
  zAverageNm: number;
  /** Polydispersity index μ2/Γ̄² (dimensionless). */
  pdi: number;
  /** Mean decay rate of the FIELD correlation g1, Γ̄ = −a1, 1/s. */
  gammaBar: number;
  /** Second cumulant μ2 = 2·a2, 1/s². */
  mu2: number;
  /** Third cumulant μ3 = −6·a3, 1/s³ (order 3 only, else null). */
  mu3: number | null;
  /** Fitted intercept β of g2 − 1 at τ = 0 (coherence factor), β = exp(2·a0). */
  intercept: number;
  order: 2 | 3;
  /** Number of leading points used in the fit. */
  pointsUsed: number;
  /** The cut-off: fraction of β and the last lag time used, s. */
  cutoff: { fraction: number; lagTimeS: number };
  /** RMS of (measured − fitted) g2 − 1 over the fitted points, as a fraction of β. */
  residualRms: number;
  /** Scattering vector used, 1/m. */
  qPerM: number;
  /** Quality warnings (each a flag for a person to look at, never a silent fix). */
  warnings: string[];
}

/** β outside this range is suspicious (common practice: the coherence factor of a working
 * instrument lies well inside (0, 1]; a very low β means weak signal or multiple scattering). */
export const INTERCEPT_RANGE = { min: 0.1, max: 1 } as const;
/** Residual RMS (fraction of β) above which the fit is called poor (project choice). */
export const POOR_FIT_RMS = 0.02;
/** |mean of the tail of g2 − 1| (fraction of β) above which the baseline is called drifting
 * (project choice; a settled baseline is within a fraction of a percent of zero). */
export const BASELINE_TOLERANCE = 0.02;

/** PDI below −this is reported as unphysical; smaller negative values are noise (project choice). */
export const NEGATIVE_PDI_TOLERANCE = 0.005;

/**
 * Cumulants fit of g2(τ) − 1.
 *
 * - Transform: y = ½·ln(g2 − 1), so that y = ln g1 + ½ ln β under the Siegert relation
 *   g2 − 1 = β·g1² (Berne & Pecora 2000). Γ̄ is therefore the decay rate of g1 (not of g2 − 1).
 * - Weights w ∝ (g2 − 1)²: if g2 − 1 carries noise of constant variance σ², then
 *   var(y) ≈ σ²/(4·(g2 − 1)²), and the inverse-variance weight is ∝ (g2 − 1)² (first-order error
 *   propagation; matches "weights falling as g1 falls", docs/DLS.md; the exact weights of
 *   ISO 22412 were not checked: from memory).
 * - Range: the leading points down to the first one whose g2 − 1 falls below
 *   `cutoffFraction`·β. β is first estimated from the first point and then re-estimated from the
 *   fit (up to 5 passes, until the range is stable). Non-positive g2 − 1 always ends the range.
 * - The least-squares problem is solved by Householder QR on the scaled design matrix
 *   (τ divided by the last lag used), which keeps it well conditioned.
 * - Outputs: Γ̄ = −a1, μ2 = 2a2, μ3 = −6a3, PDI = μ2/Γ̄², β = e^(2a0),
 *   x = k_B·T·q²/(3π·η·Γ̄) with q = (4πn/λ₀)·sin(θ/2) (ISO 22412:2017; docs/DLS.md).
 *
 * @throws RangeError on inconsistent input (lengths, non-finite values, lag times not increasing,
 *   non-positive physics) or when fewer than order + 2 usable points precede the cut-off.
 */
export function cumulantsFit(input: CumulantsInput): CumulantsResult {
  const order = input.order ?? 2;
  const fraction = input.cutoffFraction ?? 0.1;
  validate(input, order, fraction);
  const { lagTimesS: tau, g2Minus1: g } = input;
  const warnings: string[] = [];

  let beta = g[0];
  if (!(beta > 0)) {
    throw new RangeError(
      'cumulantsFit: g2 − 1 at the first lag time is not positive; no decay to fit',
    );
  }
  let used = 0;
  let coef: number[] = [];
  for (let pass = 0; pass < 5; pass++) {
    const m = countLeading(g, fraction * beta);
    if (m < order + 2) {
      throw new RangeError(
        `cumulantsFit: only ${m} point(s) lie above the cut-off (${fraction} × intercept); at least ${order + 2} are needed for an order-${order} fit`,
      );
    }
    coef = weightedPolyFit(tau, g, m, order);
    const newBeta = Math.exp(2 * coef[0]);
    const stable = m === used;
    used = m;
    beta = newBeta;
    if (stable) break;
  }

  const gammaBar = -coef[1];
  const mu2 = 2 * coef[2];
  const mu3 = order === 3 ? -6 * coef[3] : null;
  const q = scatteringVector(input.refractiveIndex, input.wavelengthNm * 1e-9, input.angleDeg);
  const T = celsiusToKelvin(input.temperatureC);

  if (!(gammaBar > 0)) {
    throw new RangeError(
      `cumulantsFit: the fitted mean decay rate is not positive (Γ̄ = ${gammaBar} 1/s); the data do not decay`,
    );
  }
  const zAverageM = (BOLTZMANN_J_PER_K * T * q * q) / (3 * Math.PI * input.viscosityPaS * gammaBar);
  const pdi = mu2 / (gammaBar * gammaBar);

  // Residuals on the g2 − 1 scale, relative to β.
  let ss = 0;
  for (let i = 0; i < used; i++) {
    const fitted = Math.exp(2 * poly(coef, tau[i]));
    ss += (g[i] - fitted) ** 2;
  }
  const residualRms = Math.sqrt(ss / used) / beta;

  if (beta < INTERCEPT_RANGE.min || beta > INTERCEPT_RANGE.max) {
    warnings.push(
      `Intercept β = ${beta.toPrecision(3)} is outside ${INTERCEPT_RANGE.min}–${INTERCEPT_RANGE.max}: check signal level, alignment or multiple scattering.`,
    );
  }
  if (residualRms > POOR_FIT_RMS) {
    warnings.push(
      `Poor fit: residual RMS is ${(100 * residualRms).toPrecision(2)} % of the intercept (limit ${100 * POOR_FIT_RMS} %).`,
    );
  }
  const tail = tailMean(g);
  if (tail === null) {
    warnings.push('Too few points after the cut-off to check the baseline.');
  } else if (Math.abs(tail) > BASELINE_TOLERANCE * beta) {
    warnings.push(
      `Baseline drift: the tail of g2 − 1 averages ${((100 * tail) / beta).toPrecision(2)} % of the intercept instead of ≈ 0 (dust, aggregation, sedimentation or too short a lag range).`,
    );
  }
  if (used === g.length) {
    warnings.push(
      'g2 − 1 never fell below the cut-off: the decay is not fully captured by the lag range.',
    );
  }
  if (pdi < -NEGATIVE_PDI_TOLERANCE) {
    warnings.push('Negative μ2 (PDI < 0) is unphysical: noisy data or too short a fit range.');
  } else if (pdi > 0.5) {
    warnings.push(
      'PDI above 0.5: the sample is too broad for a meaningful cumulants mean (common practice threshold).',
    );
  }

  return {
    zAverageNm: zAverageM * 1e9,
    pdi,
    gammaBar,
    mu2,
    mu3,
    intercept: beta,
    order,
    pointsUsed: used,
    cutoff: { fraction, lagTimeS: tau[used - 1] },
    residualRms,
    qPerM: q,
    warnings,
  };
}

function validate(input: CumulantsInput, order: number, fraction: number): void {
  const { lagTimesS: tau, g2Minus1: g } = input;
  if (tau.length !== g.length) {
    throw new RangeError(
      `cumulantsFit: ${tau.length} lag times but ${g.length} correlation values; they must pair up`,
    );
  }
  if (order !== 2 && order !== 3)
    throw new RangeError(`cumulantsFit: order must be 2 or 3, got ${order}`);
  if (!(fraction > 0 && fraction < 1)) {
    throw new RangeError(`cumulantsFit: cutoffFraction must be in (0, 1), got ${fraction}`);
  }
  for (let i = 0; i < tau.length; i++) {
    if (!Number.isFinite(tau[i]) || tau[i] < 0) {
      throw new RangeError(
        `cumulantsFit: lag time ${i + 1} is not a finite non-negative number (${tau[i]})`,
      );
    }
    if (i > 0 && !(tau[i] > tau[i - 1])) {
      throw new RangeError(
        `cumulantsFit: lag times must increase (point ${i + 1}: ${tau[i]} after ${tau[i - 1]})`,
      );
    }
    if (!Number.isFinite(g[i])) {
      throw new RangeError(
        `cumulantsFit: g2 − 1 at point ${i + 1} is not a finite number (${g[i]})`,
      );
    }
  }
  const positives: Array<[number, string]> = [
    [input.viscosityPaS, 'viscosity (Pa s)'],
    [input.refractiveIndex, 'refractive index'],
    [input.wavelengthNm, 'wavelength (nm)'],
  ];
  for (const [v, what] of positives) {
    if (!Number.isFinite(v) || v <= 0)
      throw new RangeError(`cumulantsFit: ${what} must be positive, got ${v}`);
  }
  if (!Number.isFinite(input.temperatureC) || input.temperatureC <= -273.15) {
    throw new RangeError(
      `cumulantsFit: temperature (°C) is not physical, got ${input.temperatureC}`,
    );
  }
}

/** Number of leading points with g2 − 1 ≥ threshold (and > 0). */
function countLeading(g: readonly number[], threshold: number): number {
  let m = 0;
  while (m < g.length && g[m] > 0 && g[m] >= threshold) m++;
  return m;
}

/** Mean of the last max(3, 10 %) points of g2 − 1, or null for very short series. */
function tailMean(g: readonly number[]): number | null {
  const k = Math.max(3, Math.floor(g.length / 10));
  if (g.length < 2 * k) return null;
  let s = 0;
  for (let i = g.length - k; i < g.length; i++) s += g[i];
  return s / k;
}

/** a0 + a1·τ + a2·τ² + … */
function poly(coef: readonly number[], t: number): number {
  let v = 0;
  for (let k = coef.length - 1; k >= 0; k--) v = v * t + coef[k];
  return v;
}

/**
 * Weighted least squares of y = ½ ln(g) on a polynomial in τ over the first m points, weights
 * w = g². Returns coefficients a0…a_order in SI (τ in s). Householder QR of √w·X with τ scaled
 * to [0, 1].
 */
function weightedPolyFit(
  tau: readonly number[],
  g: readonly number[],
  m: number,
  order: number,
): number[] {
  const cols = order + 1;
  const scale = tau[m - 1] > 0 ? tau[m - 1] : 1;
  const A: number[][] = [];
  const b: number[] = [];
  for (let i = 0; i < m; i++) {
    const sw = g[i]; // √w = g2 − 1
    const t = tau[i] / scale;
    const row: number[] = [];
    let tp = 1;
    for (let k = 0; k < cols; k++) {
      row.push(sw * tp);
      tp *= t;
    }
    A.push(row);
    b.push(sw * 0.5 * Math.log(g[i]));
  }
  const x = solveLeastSquaresQr(A, b, cols);
  return x.map((v, k) => v / scale ** k);
}

/** Least squares min‖Ax − b‖ by Householder QR (A is m × n, m ≥ n, full column rank). */
function solveLeastSquaresQr(A: number[][], b: number[], n: number): number[] {
  const m = A.length;
  for (let k = 0; k < n; k++) {
    let norm = 0;
    for (let i = k; i < m; i++) norm += A[i][k] * A[i][k];
    norm = Math.sqrt(norm);
    if (norm === 0) throw new RangeError('cumulantsFit: singular fit (lag times do not vary)');
    const alpha = A[k][k] > 0 ? -norm : norm;
    const v = new Array<number>(m).fill(0);
    v[k] = A[k][k] - alpha;
    for (let i = k + 1; i < m; i++) v[i] = A[i][k];
    let vv = 0;
    for (let i = k; i < m; i++) vv += v[i] * v[i];
    if (vv === 0) continue;
    for (let j = k; j < n; j++) {
      let s = 0;
      for (let i = k; i < m; i++) s += v[i] * A[i][j];
      const f = (2 * s) / vv;
      for (let i = k; i < m; i++) A[i][j] -= f * v[i];
    }
    let s = 0;
    for (let i = k; i < m; i++) s += v[i] * b[i];
    const f = (2 * s) / vv;
    for (let i = k; i < m; i++) b[i] -= f * v[i];
  }
  const x = new Array<number>(n).fill(0);
  for (let k = n - 1; k >= 0; k--) {
    let s = b[k];
    for (let j = k + 1; j < n; j++) s -= A[k][j] * x[j];
    x[k] = s / A[k][k];
  }
  return x;
}
