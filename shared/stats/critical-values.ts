/**
 * Critical values of the ISO 5725-2 consistency and outlier tests (Grubbs, Cochran) and the
 * indicator values of Mandel's h and k statistics.
 *
 * Grubbs single, Cochran, Mandel h and Mandel k are computed from Student t and Fisher F
 * quantiles (jStat); only Grubbs double, which has no closed form, comes from a published table
 * (see {@link GRUBBS_DOUBLE_TABLE}). Pure functions, no I/O: runs on the server and in the browser.
 *
 * Significance levels follow ISO 5725-2: the "5 %" and "1 %" Grubbs values are two-sided
 * (each tail of the single test is checked at α/2).
 */
import { jStat } from 'jstat';

/** A significance level as used by ISO 5725-2 tables: 0.05 (5 %) or 0.01 (1 %). */
export type SignificanceLevel = 0.05 | 0.01;

function assertLevel(alpha: number, fn: string): void {
  if (!(alpha > 0 && alpha < 1)) {
    throw new RangeError(`${fn}: significance level must be in (0, 1), got ${alpha}`);
  }
}

function assertInteger(v: number, min: number, what: string, fn: string): void {
  if (!Number.isInteger(v) || v < min) {
    throw new RangeError(`${fn}: ${what} must be an integer ≥ ${min}, got ${v}`);
  }
}

/**
 * Critical value of Grubbs' single-outlier statistic G = (x_max − x̄)/s (or (x̄ − x_min)/s) for
 * p values (dimensionless).
 *
 * G_crit = ((p − 1)/√p)·√(t²/(p − 2 + t²)), t = t(1 − α/(tails·p); p − 2)
 * Source: Grubbs (1950), Technometrics; closed form as in the NIST/SEMATECH e-Handbook of
 * Statistical Methods §1.3.5.17.1 and docs/STATISTICS.md. `tails = 2` (default) gives the
 * two-sided levels tabulated in ISO 5725-2 Table 5; `tails = 1` gives the one-sided value the
 * e-Handbook uses for a test of the maximum only.
 * @param p number of values (cell means), ≥ 3
 * @param alpha significance level, e.g. 0.05
 * @throws RangeError for p < 3 or alpha outside (0, 1)
 */
export function grubbsSingleCritical(p: number, alpha: number, tails: 1 | 2 = 2): number {
  assertInteger(p, 3, 'p', 'grubbsSingleCritical');
  assertLevel(alpha, 'grubbsSingleCritical');
  const t = jStat.studentt.inv(1 - alpha / (tails * p), p - 2);
  return ((p - 1) / Math.sqrt(p)) * Math.sqrt((t * t) / (p - 2 + t * t));
}

/**
 * Critical value of Cochran's C = s²_max / Σ s_i² for p cells of n replicates (dimensionless).
 *
 * C_crit = 1/(1 + (p − 1)/F), F = F(1 − α/p; n − 1, (p − 1)(n − 1))
 * Source: the F-distribution form of Cochran's (1941) test, as given in docs/STATISTICS.md;
 * checked against the published tables (shared/stats/fixtures/critical-values-tables.json).
 * @param p number of cells, ≥ 2
 * @param n replicates per cell, ≥ 2
 * @param alpha significance level, e.g. 0.05
 * @throws RangeError for p < 2, n < 2 or alpha outside (0, 1)
 */
export function cochranCritical(p: number, n: number, alpha: number): number {
  assertInteger(p, 2, 'p', 'cochranCritical');
  assertInteger(n, 2, 'n', 'cochranCritical');
  assertLevel(alpha, 'cochranCritical');
  const f = jStat.centralF.inv(1 - alpha / p, n - 1, (p - 1) * (n - 1));
  return 1 / (1 + (p - 1) / f);
}

/**
 * Indicator (critical) value of Mandel's between-laboratory statistic h for p laboratories
 * (dimensionless, applies to |h|).
 *
 * h_crit = (p − 1)·t / √(p·(t² + p − 2)), t = t(1 − α/2; p − 2)
 * Source: ISO 5725-2:1994 §7.3.1 and Table 6 (formula from memory; it reproduces the Table 6
 * values recalled from memory, e.g. p = 10: 2.18 at 1 %, 1.80 at 5 % — see the spec).
 * It is the Grubbs-type bound obtained from t with p − 2 degrees of freedom, two-tailed α.
 * @param p number of laboratories, ≥ 3
 * @param alpha significance level, e.g. 0.05
 * @throws RangeError for p < 3 or alpha outside (0, 1)
 */
export function mandelHIndicator(p: number, alpha: number): number {
  assertInteger(p, 3, 'p', 'mandelHIndicator');
  assertLevel(alpha, 'mandelHIndicator');
  const t = jStat.studentt.inv(1 - alpha / 2, p - 2);
  return ((p - 1) * t) / Math.sqrt(p * (t * t + p - 2));
}

/**
 * Indicator (critical) value of Mandel's within-laboratory statistic k for p laboratories with
 * n replicates each (dimensionless, applies to k).
 *
 * k_crit = √(p / (1 + (p − 1)/F)), F = F(1 − α; n − 1, (p − 1)(n − 1))
 * Source: ISO 5725-2:1994 §7.3.1 and Table 6 (formula from memory; it reproduces the Table 6
 * values recalled from memory, e.g. p = 3, n = 2: 1.71 at 1 %, 1.65 at 5 % — see the spec).
 * @param p number of laboratories, ≥ 2
 * @param n replicates per laboratory, ≥ 2
 * @param alpha significance level, e.g. 0.05
 * @throws RangeError for p < 2, n < 2 or alpha outside (0, 1)
 */
export function mandelKIndicator(p: number, n: number, alpha: number): number {
  assertInteger(p, 2, 'p', 'mandelKIndicator');
  assertInteger(n, 2, 'n', 'mandelKIndicator');
  assertLevel(alpha, 'mandelKIndicator');
  const f = jStat.centralF.inv(1 - alpha, n - 1, (p - 1) * (n - 1));
  return Math.sqrt(p / (1 + (p - 1) / f));
}

/**
 * Published critical values of the Grubbs double-outlier statistic, p = 4…20, two-sided levels.
 * The test rejects when the statistic is SMALLER than the critical value.
 * Source: Grubbs (1950) and Grubbs & Beck (1972), "Extension of sample sizes and percentage
 * points for significance tests of outlying observations", Technometrics 14, 847–854; the same
 * values are tabulated in ISO 5725-2:1994 Table 5 (from memory). Copied from the project's
 * reference set shared/stats/fixtures/critical-values-tables.json.
 * Values beyond p = 20 are not in the table the project holds: see {@link grubbsDoubleCritical}.
 */
export const GRUBBS_DOUBLE_TABLE: Readonly<
  Record<number, { readonly one: number; readonly five: number }>
> = {
  4: { one: 0.0, five: 0.0002 },
  5: { one: 0.0018, five: 0.009 },
  6: { one: 0.0116, five: 0.0349 },
  7: { one: 0.0308, five: 0.0708 },
  8: { one: 0.0563, five: 0.1101 },
  9: { one: 0.0851, five: 0.1492 },
  10: { one: 0.115, five: 0.1864 },
  11: { one: 0.1448, five: 0.2213 },
  12: { one: 0.1738, five: 0.2537 },
  13: { one: 0.2016, five: 0.2836 },
  14: { one: 0.228, five: 0.3112 },
  15: { one: 0.253, five: 0.3367 },
  16: { one: 0.2767, five: 0.3603 },
  17: { one: 0.299, five: 0.3822 },
  18: { one: 0.32, five: 0.4025 },
  19: { one: 0.3398, five: 0.4214 },
  20: { one: 0.3585, five: 0.4391 },
};

/** Smallest and largest p with a tabulated Grubbs double critical value. */
export const GRUBBS_DOUBLE_P_RANGE = { min: 4, max: 20 } as const;

/**
 * Critical value of the Grubbs double-outlier statistic (dimensionless) from the published table
 * {@link GRUBBS_DOUBLE_TABLE}; `null` when p is outside the tabulated range 4…20 (the test is then
 * not applied: no value is invented by extrapolation).
 * @param p number of values (cell means)
 * @param alpha 0.05 or 0.01
 */
export function grubbsDoubleCritical(p: number, alpha: SignificanceLevel): number | null {
  const row = GRUBBS_DOUBLE_TABLE[p];
  if (!row) return null;
  return alpha === 0.01 ? row.one : row.five;
}
