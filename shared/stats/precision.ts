/**
 * ISO 5725-2 precision statistics for one level of a round-robin (interlaboratory) study:
 * repeatability and reproducibility standard deviations, Mandel's h and k, Cochran's and
 * Grubbs' tests.
 *
 * Pure functions, no I/O: this file runs on the server and in the browser.
 * Formulas: ISO 5725-2:1994 §7 (as summarised in docs/STATISTICS.md); critical values in
 * ./critical-values.ts. Numerical care: every sum of squares is taken about a mean (corrected
 * two-pass), so data sitting on a large offset keep their digits (checked against the NIST StRD
 * ANOVA sets in precision.spec.ts).
 */
import { mean, sd, variance } from './descriptive';
import {
  cochranCritical,
  grubbsDoubleCritical,
  grubbsSingleCritical,
  GRUBBS_DOUBLE_P_RANGE,
  mandelHIndicator,
  mandelKIndicator,
} from './critical-values';

/** Outcome of an ISO 5725-2 consistency or outlier test. */
export type OutlierClassification = 'accepted' | 'straggler' | 'outlier';

/** One laboratory's results at one level (a "cell" of ISO 5725-2). */
export interface PrecisionCellInput {
  /** Participant code (unique within the level). */
  code: string;
  /** The laboratory's replicate results, in the unit of the measurand. */
  values: number[];
}

/** Per-cell statistics. */
export interface PrecisionCell {
  code: string;
  /** Number of results n_i. */
  n: number;
  /** Cell mean ȳ_i, unit of the measurand. */
  mean: number;
  /** Cell standard deviation s_i (n − 1); null when n_i = 1. */
  sd: number | null;
  /** Mandel's h_i (dimensionless); null when fewer than 2 cells. */
  h: number | null;
  /** Mandel's k_i (dimensionless); null when n_i = 1 or fewer than 2 cells have a spread. */
  k: number | null;
}

/** Indicator values of one of Mandel's statistics at the 1 % and 5 % levels. */
export interface MandelIndicators {
  indicator1: number;
  indicator5: number;
}

/** Cochran's test on the largest cell variance. */
export interface CochranResult {
  /** C = s²_max / Σ s_i² (dimensionless). */
  C: number;
  critical5: number;
  critical1: number;
  classification: OutlierClassification;
  /** Code of the cell with the largest variance. */
  cellCode: string;
  /** Number of cells with a spread (n_i ≥ 2) that entered the test. */
  p: number;
  /** Replicates per cell used for the critical values (most frequent n_i). */
  n: number;
}

/** A Grubbs test on the cell means. */
export interface GrubbsResult {
  /**
   * Single: G = (x_max − x̄)/s or (x̄ − x_min)/s. Double: ratio of the sum of squares without the
   * two extreme means to the total sum of squares (small values are suspicious).
   */
  G: number;
  critical5: number;
  critical1: number;
  classification: OutlierClassification;
  /** Code(s) of the tested cell(s): one for the single test, two for the double test. */
  cellCodes: string[];
}

/** Result of {@link precisionAnalysis} for one level. */
export interface PrecisionResult {
  /** Number of laboratories (cells) p. */
  p: number;
  /** Total number of results Σ n_i. */
  totalResults: number;
  /** General mean ŷ = Σ n_i·ȳ_i / Σ n_i, unit of the measurand. */
  generalMean: number;
  cells: PrecisionCell[];
  /** Repeatability SD s_r; null when no cell has two or more results. */
  sr: number | null;
  /** Between-laboratory SD s_L (negative variance estimates are set to 0); null if undefined. */
  sL: number | null;
  /** Reproducibility SD s_R = √(s_L² + s_r²); null if undefined. */
  sR: number | null;
  /** True when s_d² < s_r² gave a negative s_L² that was set to 0 (ISO 5725-2 §7.4.5). */
  isSLTruncated: boolean;
  /** Repeatability limit r = 2.8·s_r. */
  repeatabilityLimit: number | null;
  /** Reproducibility limit R = 2.8·s_R. */
  reproducibilityLimit: number | null;
  /** s_d² = Σ n_i(ȳ_i − ŷ)²/(p − 1), the between-laboratory mean square; null when p < 2. */
  betweenMeanSquare: number | null;
  /** n̄ = [Σn_i − Σn_i²/Σn_i]/(p − 1) (equals n when all n_i = n); null when p < 2. */
  nBar: number | null;
  mandel: {
    /** Indicators for |h|; null when p < 3. */
    h: MandelIndicators | null;
    /** Indicators for k (with p and n as used); null when not computable. */
    k: (MandelIndicators & { p: number; n: number }) | null;
  };
  /** Null when not applicable (see warnings). */
  cochran: CochranResult | null;
  grubbs: {
    singleHigh: GrubbsResult | null;
    singleLow: GrubbsResult | null;
    doubleHigh: GrubbsResult | null;
    doubleLow: GrubbsResult | null;
  };
  /** Plain-language notes on every test or statistic that could not be computed, and why. */
  warnings: string[];
}

/**
 * Factor turning a standard deviation into a 95 % limit for the difference of two results:
 * 2.8 ≈ 1.96·√2 (ISO 5725-6:1994 §4.1.4; value as in docs/STATISTICS.md).
 */
export const PRECISION_LIMIT_FACTOR = 2.8;

/**
 * Relative slack when comparing a statistic with a critical value, so that a statistic equal to
 * its critical value in exact arithmetic ("≤ critical → accepted") is not pushed over it by the
 * last bit of rounding.
 */
const BOUND_SLACK = 1e-12;

/**
 * ISO 5725-2 precision analysis of one level.
 *
 * - s_r² = Σ(n_i − 1)s_i² / Σ(n_i − 1); ŷ = Σn_iȳ_i/Σn_i; s_d² = Σn_i(ȳ_i − ŷ)²/(p − 1);
 *   n̄ = [Σn_i − Σn_i²/Σn_i]/(p − 1); s_L² = max(0, (s_d² − s_r²)/n̄); s_R² = s_L² + s_r²;
 *   r = 2.8·s_r, R = 2.8·s_R (ISO 5725-2:1994 §7.4, eqs as in docs/STATISTICS.md).
 * - Mandel h_i = (ȳ_i − ȳ)/SD(cell means), ȳ the unweighted mean of the cell means;
 *   k_i = s_i·√p/√Σs_j² over the cells with n ≥ 2 (ISO 5725-2 §7.3.1). Indicator values:
 *   h_crit = (p − 1)t/√(p(t² + p − 2)), t = t(1 − α/2; p − 2);
 *   k_crit = √(p/(1 + (p − 1)/F)), F = F(1 − α; n − 1, (p − 1)(n − 1)) (see ./critical-values).
 * - Cochran C = s²_max/Σs_i² (ISO 5725-2 §7.3.3), Grubbs single and double on the cell means
 *   (§7.3.4). Classification: statistic within its 5 % critical value → accepted; between 5 %
 *   and 1 % → straggler; beyond 1 % → outlier (for Grubbs double "beyond" means smaller).
 *
 * With unequal n_i the critical values of Cochran and Mandel k use the most frequent n_i
 * (ties: the smaller n, whose critical values are more lenient), as ISO 5725-2 suggests for
 * slightly unbalanced designs; a warning says so. Tests are reported independently; applying
 * Grubbs double only after single Grubbs found nothing (ISO 5725-2 §7.3.4) is the caller's rule.
 *
 * Degenerate inputs never give NaN: statistics that cannot be computed are null and a warning
 * explains why (fewer than 3 laboratories, single results, all values equal).
 *
 * @param cells one entry per laboratory; values in the unit of the measurand
 * @returns statistics in the unit of the measurand (h, k, C, G dimensionless)
 * @throws RangeError when there are no cells, a cell has no values or a non-finite value, or two
 *   cells share a code
 */
export function precisionAnalysis(cells: readonly PrecisionCellInput[]): PrecisionResult {
  validate(cells);
  const warnings: string[] = [];
  const p = cells.length;

  // Work on values shifted by one of them: differences of nearby floats are exact (Sterbenz),
  // so cell means and sums of squares do not lose digits to a large common offset.
  const shift = cells[0].values[0];
  const stats = cells.map((c) => {
    const n = c.values.length;
    const shifted = c.values.map((x) => x - shift);
    const v = n >= 2 ? variance(shifted) : null;
    return { code: c.code, n, shiftedMean: mean(shifted), mean: 0, variance: v };
  });
  for (const c of stats) c.mean = c.shiftedMean + shift;
  const withSpread = stats.filter((c) => c.variance !== null) as Array<{
    code: string;
    n: number;
    mean: number;
    variance: number;
  }>;

  // Totals and the general mean, centred on the first cell mean to keep digits on offsets.
  let totalN = 0;
  let sumN2 = 0;
  let sumNd = 0;
  for (const c of stats) {
    totalN += c.n;
    sumN2 += c.n * c.n;
    sumNd += c.n * c.shiftedMean;
  }
  const shiftedGeneralMean = sumNd / totalN;
  const generalMean = shiftedGeneralMean + shift;

  // Repeatability.
  let dfWithin = 0;
  let ssWithin = 0;
  for (const c of withSpread) {
    dfWithin += c.n - 1;
    ssWithin += (c.n - 1) * c.variance;
  }
  const sr2 = dfWithin > 0 ? ssWithin / dfWithin : null;
  if (sr2 === null) {
    warnings.push(
      'No laboratory reported two or more results: repeatability (s_r, r) and hence s_L, s_R and R cannot be estimated.',
    );
  }

  // Between-laboratory mean square s_d² and n̄ (corrected two-pass about ŷ).
  let betweenMeanSquare: number | null = null;
  let nBar: number | null = null;
  if (p >= 2) {
    let s1 = 0;
    let s2 = 0;
    for (const c of stats) {
      const d = c.shiftedMean - shiftedGeneralMean;
      s1 += c.n * d;
      s2 += c.n * d * d;
    }
    betweenMeanSquare = Math.max(0, (s2 - (s1 * s1) / totalN) / (p - 1));
    nBar = (totalN - sumN2 / totalN) / (p - 1);
  } else {
    warnings.push(
      'Only one laboratory: between-laboratory statistics (s_d², s_L, s_R, R, h, tests) need at least 2 laboratories.',
    );
  }

  let sL: number | null = null;
  let sR: number | null = null;
  let isSLTruncated = false;
  if (sr2 !== null && betweenMeanSquare !== null && nBar !== null && nBar > 0) {
    const sL2raw = (betweenMeanSquare - sr2) / nBar;
    isSLTruncated = sL2raw < 0;
    const sL2 = Math.max(0, sL2raw);
    sL = Math.sqrt(sL2);
    sR = Math.sqrt(sL2 + sr2);
    if (isSLTruncated) {
      warnings.push(
        's_d² < s_r²: the estimate of s_L² was negative and is set to 0 (ISO 5725-2 §7.4.5); s_R = s_r.',
      );
    }
  }
  const sr = sr2 === null ? null : Math.sqrt(sr2);

  // Mandel h on the (unweighted) cell means.
  const means = stats.map((c) => c.shiftedMean);
  const meanOfMeans = mean(means);
  const sdOfMeans = p >= 2 ? sd(means) : null;
  const allMeansEqual = sdOfMeans === 0;
  if (allMeansEqual) {
    warnings.push(
      'All laboratory means are equal: h = 0 for every laboratory; Grubbs tests not applicable.',
    );
  }
  const hOf = (m: number): number | null => {
    if (sdOfMeans === null) return null;
    if (sdOfMeans === 0) return 0;
    return (m - meanOfMeans) / sdOfMeans;
  };

  // Mandel k over the cells with a spread.
  const pk = withSpread.length;
  const sumVar = withSpread.reduce((a, c) => a + c.variance, 0);
  const nRef = referenceReplicates(withSpread.map((c) => c.n));
  if (pk >= 1 && new Set(withSpread.map((c) => c.n)).size > 1) {
    warnings.push(
      `Labs report different numbers of results: the critical values of Cochran's C and Mandel's k use n = ${nRef} (the most frequent).`,
    );
  }
  if (pk >= 2 && pk < p) {
    warnings.push(
      `${p - pk} laboratory(ies) reported a single result: Mandel's k and Cochran's C use the ${pk} laboratories with two or more results.`,
    );
  }
  if (pk >= 2 && sumVar === 0) {
    warnings.push(
      'Every laboratory repeated its result exactly: k = 0 for every laboratory; Cochran not applicable.',
    );
  }
  const kOf = (v: number | null): number | null => {
    if (v === null || pk < 2) return null;
    if (sumVar === 0) return 0;
    return Math.sqrt(v) * Math.sqrt(pk / sumVar);
  };

  const outCells: PrecisionCell[] = stats.map((c) => ({
    code: c.code,
    n: c.n,
    mean: c.mean,
    sd: c.variance === null ? null : Math.sqrt(c.variance),
    h: hOf(c.shiftedMean),
    k: kOf(c.variance),
  }));

  const mandelH =
    p >= 3
      ? { indicator1: mandelHIndicator(p, 0.01), indicator5: mandelHIndicator(p, 0.05) }
      : null;
  const mandelK =
    pk >= 2 && nRef >= 2
      ? {
          indicator1: mandelKIndicator(pk, nRef, 0.01),
          indicator5: mandelKIndicator(pk, nRef, 0.05),
          p: pk,
          n: nRef,
        }
      : null;
  if (p >= 2 && p < 3) {
    warnings.push('Fewer than 3 laboratories: Mandel h indicators and Grubbs tests need p ≥ 3.');
  }

  // Cochran.
  let cochran: CochranResult | null = null;
  if (pk >= 2 && sumVar > 0) {
    let top = withSpread[0];
    for (const c of withSpread) if (c.variance > top.variance) top = c;
    const C = top.variance / sumVar;
    const critical5 = cochranCritical(pk, nRef, 0.05);
    const critical1 = cochranCritical(pk, nRef, 0.01);
    cochran = {
      C,
      critical5,
      critical1,
      classification: classifyUpper(C, critical5, critical1),
      cellCode: top.code,
      p: pk,
      n: nRef,
    };
  } else if (pk < 2) {
    warnings.push("Cochran's test needs at least 2 laboratories with two or more results each.");
  }

  const grubbs = grubbsTests(stats, allMeansEqual, warnings);

  return {
    p,
    totalResults: totalN,
    generalMean,
    cells: outCells,
    sr,
    sL,
    sR,
    isSLTruncated,
    repeatabilityLimit: sr === null ? null : PRECISION_LIMIT_FACTOR * sr,
    reproducibilityLimit: sR === null ? null : PRECISION_LIMIT_FACTOR * sR,
    betweenMeanSquare,
    nBar,
    mandel: { h: mandelH, k: mandelK },
    cochran,
    grubbs,
    warnings,
  };
}

/** Array.isArray without narrowing: as a type guard it turns a readonly array into any[]. */
function isList(v: unknown): boolean {
  return Array.isArray(v);
}

function validate(cells: readonly PrecisionCellInput[]): void {
  if (!isList(cells) || cells.length === 0) {
    throw new RangeError('precisionAnalysis: no laboratories (cells) given');
  }
  const seen = new Set<string>();
  for (const c of cells) {
    if (seen.has(c.code)) {
      throw new RangeError(`precisionAnalysis: laboratory code "${c.code}" appears twice`);
    }
    seen.add(c.code);
    if (!isList(c.values) || c.values.length === 0) {
      throw new RangeError(`precisionAnalysis: laboratory "${c.code}" has no results`);
    }
    const values: readonly unknown[] = c.values;
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      if (typeof v !== 'number' || !Number.isFinite(v)) {
        throw new RangeError(
          `precisionAnalysis: laboratory "${c.code}", result ${i + 1} is not a finite number (${String(v)})`,
        );
      }
    }
  }
}

/** Most frequent n (ties → smaller n); 0 when the list is empty. */
function referenceReplicates(ns: readonly number[]): number {
  const counts = new Map<number, number>();
  for (const n of ns) counts.set(n, (counts.get(n) ?? 0) + 1);
  let best = 0;
  let bestCount = 0;
  for (const [n, count] of counts) {
    if (count > bestCount || (count === bestCount && n < best)) {
      best = n;
      bestCount = count;
    }
  }
  return best;
}

/** Large statistic is suspicious (Cochran, Grubbs single). */
function classifyUpper(stat: number, critical5: number, critical1: number): OutlierClassification {
  if (stat <= critical5 * (1 + BOUND_SLACK)) return 'accepted';
  if (stat <= critical1 * (1 + BOUND_SLACK)) return 'straggler';
  return 'outlier';
}

/** Small statistic is suspicious (Grubbs double). */
function classifyLower(stat: number, critical5: number, critical1: number): OutlierClassification {
  if (stat >= critical5 * (1 - BOUND_SLACK)) return 'accepted';
  if (stat >= critical1 * (1 - BOUND_SLACK)) return 'straggler';
  return 'outlier';
}

/** Σ(x − x̄)² by the corrected two-pass formula. */
function sumOfSquares(xs: readonly number[]): number {
  if (xs.length < 2) return 0;
  const m = mean(xs);
  let s1 = 0;
  let s2 = 0;
  for (const x of xs) {
    const d = x - m;
    s1 += d;
    s2 += d * d;
  }
  return Math.max(0, s2 - (s1 * s1) / xs.length);
}

/**
 * Grubbs single (high, low) and double (two highest, two lowest) tests on the cell means
 * (ISO 5725-2:1994 §7.3.4; Grubbs 1950):
 * G_p = (x_(p) − x̄)/s, G_1 = (x̄ − x_(1))/s, s the SD of the p means (n − 1);
 * G_high,double = s²_(p−1,p)/s0², G_low,double = s²_(1,2)/s0², where s0² = Σ(x_i − x̄)² and
 * s²_(p−1,p) is the same sum over the means without the two largest (s²_(1,2): two smallest).
 */
function grubbsTests(
  stats: ReadonlyArray<{ code: string; shiftedMean: number }>,
  allMeansEqual: boolean,
  warnings: string[],
): PrecisionResult['grubbs'] {
  const none = { singleHigh: null, singleLow: null, doubleHigh: null, doubleLow: null };
  const p = stats.length;
  if (p < 3 || allMeansEqual) return none;

  const sorted = [...stats].sort((a, b) => a.shiftedMean - b.shiftedMean);
  const xs = sorted.map((c) => c.shiftedMean);
  const m = mean(xs);
  const s = sd(xs);
  if (p === 3) {
    warnings.push(
      'Grubbs single test with 3 laboratories: G cannot exceed (p − 1)/√p = 1.1547 and the computed critical values lie within 0.0005 of that bound, so a laboratory is flagged only when the other two means (nearly) coincide; the printed ISO table (1.155) never flags.',
    );
  }
  const c5 = grubbsSingleCritical(p, 0.05);
  const c1 = grubbsSingleCritical(p, 0.01);
  const gHigh = (xs[p - 1] - m) / s;
  const gLow = (m - xs[0]) / s;
  const singleHigh: GrubbsResult = {
    G: gHigh,
    critical5: c5,
    critical1: c1,
    classification: classifyUpper(gHigh, c5, c1),
    cellCodes: [sorted[p - 1].code],
  };
  const singleLow: GrubbsResult = {
    G: gLow,
    critical5: c5,
    critical1: c1,
    classification: classifyUpper(gLow, c5, c1),
    cellCodes: [sorted[0].code],
  };

  let doubleHigh: GrubbsResult | null = null;
  let doubleLow: GrubbsResult | null = null;
  const d5 = grubbsDoubleCritical(p, 0.05);
  const d1 = grubbsDoubleCritical(p, 0.01);
  if (d5 === null || d1 === null) {
    warnings.push(
      `Grubbs double test: published critical values are held for p = ${GRUBBS_DOUBLE_P_RANGE.min}…${GRUBBS_DOUBLE_P_RANGE.max} only (p = ${p}); not applied.`,
    );
  } else {
    const ss0 = sumOfSquares(xs);
    const gdHigh = sumOfSquares(xs.slice(0, p - 2)) / ss0;
    const gdLow = sumOfSquares(xs.slice(2)) / ss0;
    doubleHigh = {
      G: gdHigh,
      critical5: d5,
      critical1: d1,
      classification: classifyLower(gdHigh, d5, d1),
      cellCodes: [sorted[p - 2].code, sorted[p - 1].code],
    };
    doubleLow = {
      G: gdLow,
      critical5: d5,
      critical1: d1,
      classification: classifyLower(gdLow, d5, d1),
      cellCodes: [sorted[0].code, sorted[1].code],
    };
  }
  return { singleHigh, singleLow, doubleHigh, doubleLow };
}
