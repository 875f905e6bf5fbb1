/**
 * Homogeneity and stability checks of PT items, ISO 13528:2015 Annex B (from memory, with the
 * 2022 corrections; formulas as in docs/STATISTICS.md). Units: those of the measurand.
 */
import { jStat } from 'jstat';
import { meanUnchecked, varianceAbout, assertFiniteSample } from './descriptive';

export interface HomogeneityResult {
  /** Number of items g. */
  readonly g: number;
  /** Replicates per item m. */
  readonly m: number;
  /** Item means x̄_t. */
  readonly itemMeans: readonly number[];
  /** General mean of the item means. */
  readonly generalMean: number;
  /** s_x, SD (n − 1) of the item means. */
  readonly sx: number;
  /** s_w, within-item SD: s_w² = Σs_t²/g (m = 2: Σw_t²/(2g)). */
  readonly sw: number;
  /** s_s, between-item SD: s_s² = max(0, s_x² − s_w²/m). */
  readonly ss: number;
  readonly sigmaPt: number;
  /** 0.3 · σ_pt. */
  readonly limit: number;
  /** Criterion s_s ≤ 0.3 σ_pt (ISO 13528 B.2.2). */
  readonly passes: boolean;
  /** F1 = χ²_{0.95; g−1}/(g − 1). */
  readonly f1: number;
  /** F2 = (F_{0.95; g−1, g(m−1)} − 1)/2. */
  readonly f2: number;
  /** Right-hand side of the extended criterion, F1·(0.3σ_pt)² + F2·s_w² (unit²). */
  readonly extendedLimitSquared: number;
  /** Extended criterion s_s² ≤ F1·(0.3σ_pt)² + F2·s_w² (ISO 13528 B.2.3). */
  readonly passesExtended: boolean;
  /** σ_pt′ = √(σ_pt² + s_s²), the widened σ_pt the coordinator may use if the item fails. */
  readonly widenedSigmaPt: number;
}

/**
 * The factors of the extended homogeneity criterion, dimensionless:
 * F1 = χ²_{0.95; g−1}/(g − 1), F2 = (F_{0.95; g−1, g(m−1)} − 1)/2, from jStat quantiles.
 * Source: ISO 13528:2015 B.2.3 (from memory; docs/STATISTICS.md). With m = 2 the F
 * denominator degrees of freedom are g, as in the standard's table (g = 10: F1 = 1.88, F2 = 1.01).
 */
export function homogeneityFactors(g: number, m = 2): { f1: number; f2: number } {
  if (!Number.isInteger(g) || g < 2)
    throw new RangeError(`homogeneity: g must be an integer ≥ 2, got ${g}`);
  if (!Number.isInteger(m) || m < 2)
    throw new RangeError(`homogeneity: m must be an integer ≥ 2, got ${m}`);
  const f1 = jStat.chisquare.inv(0.95, g - 1) / (g - 1);
  const f2 = (jStat.centralF.inv(0.95, g - 1, g * (m - 1)) - 1) / 2;
  return { f1, f2 };
}

/**
 * Homogeneity check of g items with m ≥ 2 replicates each (ISO 13528:2015 B.2, from memory):
 * s_x = SD(x̄_t), s_w² = Σs_t²/g, s_s² = max(0, s_x² − s_w²/m); pass if s_s ≤ 0.3σ_pt;
 * extended pass if s_s² ≤ F1·(0.3σ_pt)² + F2·s_w².
 * @param items one array of replicate results per item, equal lengths, unit of the measurand
 * @param sigmaPt σ_pt, > 0, same unit
 * @throws RangeError on fewer than 2 items, unequal or < 2 replicates, non-finite values, σ_pt ≤ 0
 */
export function homogeneityCheck(
  items: readonly (readonly number[])[],
  sigmaPt: number,
): HomogeneityResult {
  const g = items.length;
  if (g < 2) throw new RangeError(`homogeneity: at least 2 items are needed, got ${g}`);
  const m = items[0].length;
  items.forEach((it, t) => {
    assertFiniteSample(it, `homogeneity item ${t + 1}`);
    if (it.length !== m || m < 2) {
      throw new RangeError(
        `homogeneity: every item needs the same number (≥ 2) of replicates; item ${t + 1} has ${it.length}`,
      );
    }
  });
  if (!(sigmaPt > 0) || !Number.isFinite(sigmaPt))
    throw new RangeError(`homogeneity: σ_pt must be > 0, got ${sigmaPt}`);

  // Centre on the first result so offsets do not cost digits.
  const c = items[0][0];
  const means: number[] = [];
  let sumWithinVar = 0;
  for (const it of items) {
    const centred = it.map((x) => x - c);
    const mt = meanUnchecked(centred);
    means.push(mt);
    sumWithinVar += varianceAbout(centred, mt);
  }
  const gm = meanUnchecked(means);
  const sx2 = varianceAbout(means, gm);
  const sw2 = sumWithinVar / g;
  const ss2 = Math.max(0, sx2 - sw2 / m);
  const ss = Math.sqrt(ss2);
  const limit = 0.3 * sigmaPt;
  const { f1, f2 } = homogeneityFactors(g, m);
  const extendedLimitSquared = f1 * limit * limit + f2 * sw2;
  return {
    g,
    m,
    itemMeans: means.map((x) => x + c),
    generalMean: gm + c,
    sx: Math.sqrt(sx2),
    sw: Math.sqrt(sw2),
    ss,
    sigmaPt,
    limit,
    passes: ss <= limit,
    f1,
    f2,
    extendedLimitSquared,
    passesExtended: ss2 <= extendedLimitSquared,
    widenedSigmaPt: Math.hypot(sigmaPt, ss),
  };
}

export interface StabilityResult {
  /** ȳ₁, mean before (e.g. at the homogeneity study), unit of the measurand. */
  readonly meanFirst: number;
  /** ȳ₂, mean after (e.g. at the end of the round). */
  readonly meanSecond: number;
  /** |ȳ₁ − ȳ₂|. */
  readonly difference: number;
  /** u(ȳ) = s/√n of each mean. */
  readonly uFirst: number;
  readonly uSecond: number;
  /** 0.3 · σ_pt. */
  readonly limit: number;
  /** 0.3 σ_pt + 2√(u²(ȳ₁) + u²(ȳ₂)). */
  readonly extendedLimit: number;
  /** |ȳ₁ − ȳ₂| ≤ 0.3 σ_pt (ISO 13528 B.5). */
  readonly passes: boolean;
  /** |ȳ₁ − ȳ₂| ≤ 0.3 σ_pt + 2√(u²(ȳ₁) + u²(ȳ₂)). */
  readonly passesExtended: boolean;
}

/**
 * Stability check (ISO 13528:2015 B.5, from memory): |ȳ₁ − ȳ₂| ≤ 0.3σ_pt; extended
 * |ȳ₁ − ȳ₂| ≤ 0.3σ_pt + 2√(u²(ȳ₁) + u²(ȳ₂)) with u(ȳ) = s/√n. Unit of the measurand.
 * @throws RangeError on fewer than 2 results in either set, non-finite values or σ_pt ≤ 0
 */
export function stabilityCheck(
  first: readonly number[],
  second: readonly number[],
  sigmaPt: number,
): StabilityResult {
  assertFiniteSample(first, 'stability (first)');
  assertFiniteSample(second, 'stability (second)');
  if (first.length < 2 || second.length < 2)
    throw new RangeError('stability: at least 2 results per occasion are needed');
  if (!(sigmaPt > 0) || !Number.isFinite(sigmaPt))
    throw new RangeError(`stability: σ_pt must be > 0, got ${sigmaPt}`);
  const m1 = meanUnchecked(first);
  const m2 = meanUnchecked(second);
  const u1 = Math.sqrt(varianceAbout(first, m1) / first.length);
  const u2 = Math.sqrt(varianceAbout(second, m2) / second.length);
  const difference = Math.abs(m1 - m2);
  const limit = 0.3 * sigmaPt;
  const extendedLimit = limit + 2 * Math.hypot(u1, u2);
  return {
    meanFirst: m1,
    meanSecond: m2,
    difference,
    uFirst: u1,
    uSecond: u2,
    limit,
    extendedLimit,
    passes: difference <= limit,
    passesExtended: difference <= extendedLimit,
  };
}
