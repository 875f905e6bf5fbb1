/**
 * Assigned value x_pt and its standard uncertainty u(x_pt).
 *
 * Source: ISO 13528:2015 §7 (from memory, as summarised in docs/STATISTICS.md):
 * consensus x_pt = x* (Algorithm A) with u(x_pt) = 1.25 · s* / √p; a reference value with its
 * stated uncertainty; or the median with u(x_pt) = 1.25 · MADe / √p (§7.7.3, from memory).
 */
import { algorithmA, type AlgorithmAResult } from './algorithm-a';
import { madE, median } from './descriptive';

/** How the coordinator fixes x_pt for one item × measurand. */
export type AssignedValueRule =
  | { readonly kind: 'consensus' }
  | { readonly kind: 'median' }
  | {
      readonly kind: 'reference';
      /** Certified or formulated value, unit of the measurand. */
      readonly value: number;
      /** Its standard uncertainty u(x_pt), same unit. */
      readonly u: number;
      /** Where the value comes from (certificate, formulation record). */
      readonly source: string;
    };

export interface AssignedValue {
  /** x_pt, unit of the measurand. */
  readonly value: number;
  /** u(x_pt), standard uncertainty, unit of the measurand. */
  readonly u: number;
  readonly method: 'algorithm-a' | 'median' | 'reference';
  /** Number of results p that produced a consensus value (0 for a reference value). */
  readonly p: number;
  /** Robust SD of the results (s* or MADe), if computed from them. */
  readonly robustSd?: number;
  /** The Algorithm A run, kept so the record can be reproduced. */
  readonly algorithmA?: AlgorithmAResult;
  /** Source text of a reference value. */
  readonly source?: string;
}

/**
 * Standard uncertainty of a consensus value, u(x_pt) = 1.25 · s* / √p, unit of s*.
 * Source: ISO 13528:2015 §7.7.3 (from memory; docs/STATISTICS.md).
 * @param robustSd s* (or MADe for the median), ≥ 0.
 * @param p number of results, ≥ 1.
 */
export function consensusUncertainty(robustSd: number, p: number): number {
  if (!(robustSd >= 0) || !Number.isFinite(robustSd)) {
    throw new RangeError(`u(x_pt): robust SD must be finite and ≥ 0, got ${robustSd}`);
  }
  if (!(p >= 1) || !Number.isInteger(p)) {
    throw new RangeError(`u(x_pt): p must be a positive integer, got ${p}`);
  }
  return (1.25 * robustSd) / Math.sqrt(p);
}

/**
 * The "negligible" check u(x_pt) ≤ 0.3 · σ_pt (ISO 13528:2015 §9.2.1, from memory). When it
 * fails, score with z′ (or ζ) and say so in the report.
 */
export function isUncertaintyNegligible(uAssigned: number, sigmaPt: number): boolean {
  return uAssigned <= 0.3 * sigmaPt;
}

/**
 * x_pt and u(x_pt) from participants' results by the chosen rule, unit of the measurand.
 * Consensus uses ISO 13528 Algorithm A (see algorithm-a.ts); its outcome is kept in the result.
 * @throws RangeError on an empty result list (consensus, median) or a bad reference value.
 */
export function assignedValue(results: readonly number[], rule: AssignedValueRule): AssignedValue {
  switch (rule.kind) {
    case 'consensus': {
      const a = algorithmA(results);
      return {
        value: a.robustMean,
        u: consensusUncertainty(a.robustSd, results.length),
        method: 'algorithm-a',
        p: results.length,
        robustSd: a.robustSd,
        algorithmA: a,
      };
    }
    case 'median': {
      const s = madE(results);
      return {
        value: median(results),
        u: consensusUncertainty(s, results.length),
        method: 'median',
        p: results.length,
        robustSd: s,
      };
    }
    case 'reference': {
      if (!Number.isFinite(rule.value)) throw new RangeError('reference x_pt must be finite');
      if (!(rule.u >= 0) || !Number.isFinite(rule.u)) {
        throw new RangeError('reference u(x_pt) must be finite and ≥ 0');
      }
      return { value: rule.value, u: rule.u, method: 'reference', p: 0, source: rule.source };
    }
  }
}
