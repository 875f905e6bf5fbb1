/**
 * σ_pt, the standard deviation for proficiency assessment, by the coordinator's rule.
 * Source: ISO 13528:2015 §8 (from memory, as summarised in docs/STATISTICS.md).
 */

/** The coordinator's rule for σ_pt for one measurand. */
export type SigmaPtRule =
  /** A fixed value (fitness for purpose), unit of the measurand (ISO 13528 §8.2). */
  | { readonly kind: 'fixed'; readonly value: number }
  /** A percentage of x_pt (ISO 13528 §8.2): σ_pt = percent/100 · |x_pt|. */
  | { readonly kind: 'percent'; readonly percent: number }
  /** The robust SD s* of this round's results (ISO 13528 §8.6). */
  | { readonly kind: 'robust-sd' }
  /**
   * From a precision study (ISO 13528 §8.4, from memory): σ_pt = √(σ_R² − σ_r²·(1 − 1/m)) when
   * the repeatability σ_r and the number m of replicates averaged are given; else σ_pt = σ_R.
   */
  | {
      readonly kind: 'precision';
      readonly sigmaR: number;
      readonly sigmaRepeatability?: number;
      readonly replicates?: number;
      readonly source?: string;
    };

/** What the round provides for rules that depend on it. */
export interface SigmaPtContext {
  /** x_pt, unit of the measurand. */
  readonly assignedValue: number;
  /** s* of this round, unit of the measurand (needed by the robust-sd rule). */
  readonly robustSd?: number;
}

/**
 * σ_pt by rule, unit of the measurand. Always returns a finite positive number.
 * @throws RangeError if the rule yields σ_pt ≤ 0 or non-finite (e.g. s* = 0 in a round where
 *   half the results are identical: the coordinator must choose another rule).
 */
export function sigmaPt(rule: SigmaPtRule, ctx: SigmaPtContext): number {
  let v: number;
  switch (rule.kind) {
    case 'fixed':
      v = rule.value;
      break;
    case 'percent':
      v = (rule.percent / 100) * Math.abs(ctx.assignedValue);
      break;
    case 'robust-sd':
      if (ctx.robustSd === undefined) throw new RangeError('σ_pt from s*: no robust SD given');
      v = ctx.robustSd;
      break;
    case 'precision': {
      const { sigmaR, sigmaRepeatability: sr, replicates: m } = rule;
      v =
        sr !== undefined && m !== undefined
          ? Math.sqrt(sigmaR * sigmaR - sr * sr * (1 - 1 / m))
          : sigmaR;
      break;
    }
  }
  if (!(v > 0) || !Number.isFinite(v)) {
    throw new RangeError(
      `σ_pt by rule "${rule.kind}" is ${v}; it must be a finite positive number`,
    );
  }
  return v;
}

/**
 * σ_pt widened for an inhomogeneous item: σ_pt′ = √(σ_pt² + s_s²), unit of the measurand.
 * Source: ISO 13528:2015 B.2 (from memory; docs/STATISTICS.md "Homogeneity and stability").
 */
export function widenSigmaPt(sigma: number, betweenSampleSd: number): number {
  return Math.hypot(sigma, betweenSampleSd);
}
