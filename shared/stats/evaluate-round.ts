/**
 * Evaluation of one PT round: per item × measurand, each participant's result (mean of its
 * replicates), the consensus assigned value by ISO 13528 Algorithm A, u(x_pt), σ_pt, z, z′ and
 * the signal.
 *
 * Sources: ISO 13528:2015 §7 (x_pt, u(x_pt) = 1.25 s* / √p), §8 (σ_pt), §9 (z, z′, signals),
 * as summarised in docs/STATISTICS.md. Pure and fast: one pass to group the rows, no sort
 * in the hot path except the two Algorithm A starts per group.
 */
import { algorithmAUnchecked, type AlgorithmAOutcome } from './algorithm-a';
import { consensusUncertainty, isUncertaintyNegligible } from './assigned-value';
import { signalFor, type Signal } from './scores';
import { sigmaPt as sigmaPtByRule, type SigmaPtRule } from './sigma-pt';

/** One reported replicate, as uploaded. Units: those of the measurand. */
export interface ResultRow {
  readonly participant: string;
  readonly item: string;
  readonly measurand: string;
  readonly replicate: number | string;
  readonly value: number;
  /** Reported standard or expanded uncertainty (see k), optional. */
  readonly uncertainty?: number;
  /** Coverage factor of `uncertainty`, optional. */
  readonly k?: number;
}

export interface EvaluateOptions {
  /**
   * σ_pt rule, for all groups or per item × measurand. Default: the robust SD s* of the round
   * (ISO 13528 §8.6).
   */
  readonly sigmaPt?: SigmaPtRule | ((item: string, measurand: string) => SigmaPtRule);
  /**
   * Fewer results than this raise a `few-results` warning (common practice: about 12 for a
   * robust consensus; from memory). Default 12.
   */
  readonly minResults?: number;
}

export interface ParticipantEvaluation {
  readonly code: string;
  /** Mean of the participant's replicates, unit of the measurand. */
  readonly result: number;
  readonly replicates: number;
  /** SD (n − 1) of the replicates; null for a single replicate. */
  readonly replicateSd: number | null;
  /** z = (x − x_pt)/σ_pt; null when σ_pt could not be set. */
  readonly z: number | null;
  /** z′ = (x − x_pt)/√(σ_pt² + u²(x_pt)); null when σ_pt could not be set. */
  readonly zPrime: number | null;
  /**
   * Signal of the score that applies: z when u(x_pt) is negligible (≤ 0.3 σ_pt), else z′
   * (ISO 13528 §9.2.1, from memory). Null when there is no score.
   */
  readonly signal: Signal | null;
}

export type EvaluationWarning =
  | 'few-results'
  | 'too-few-values'
  | 'zero-spread'
  | 'not-converged'
  | 'sigma-pt-unavailable'
  | 'u-not-negligible';

export interface ItemEvaluation {
  readonly item: string;
  readonly measurand: string;
  /** Number of participants p with a result. */
  readonly n: number;
  readonly method: 'algorithm-a';
  readonly iterations: number;
  readonly outcome: AlgorithmAOutcome;
  /** x_pt = x*, unit of the measurand. */
  readonly assignedValue: number;
  /** s*, unit of the measurand. */
  readonly robustSd: number;
  /** u(x_pt) = 1.25 s* / √p, unit of the measurand. */
  readonly uAssigned: number;
  /** σ_pt, unit of the measurand; null if the rule gave no usable value (e.g. s* = 0). */
  readonly sigmaPt: number | null;
  /** u(x_pt) ≤ 0.3 σ_pt; null when σ_pt is unavailable. */
  readonly uNegligible: boolean | null;
  readonly sigmaPtRule: SigmaPtRule;
  readonly warnings: readonly EvaluationWarning[];
  readonly participants: readonly ParticipantEvaluation[];
}

export interface RoundEvaluation {
  readonly evaluations: readonly ItemEvaluation[];
}

interface ParticipantAcc {
  code: string;
  values: number[];
}
interface GroupAcc {
  item: string;
  measurand: string;
  byCode: Map<string, ParticipantAcc>;
  list: ParticipantAcc[];
}

const ROBUST_SD: SigmaPtRule = { kind: 'robust-sd' };

/**
 * Evaluates a round (see the file comment for the formulas). Groups appear in order of first
 * appearance; participants within a group are sorted by code. Results are never changed.
 * @throws RangeError naming the row (0-based index) when a value is not a finite number.
 */
export function evaluateRound(rows: readonly ResultRow[], options: EvaluateOptions = {}): RoundEvaluation {
  const minResults = options.minResults ?? 12;
  const groups = new Map<string, GroupAcc>();
  const groupList: GroupAcc[] = [];
  for (let r = 0; r < rows.length; r++) {
    const row = rows[r];
    const v = row.value;
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new RangeError(`row ${r}: value is not a finite number (${String(v)})`);
    }
    const key = row.item + '\u0000' + row.measurand;
    let g = groups.get(key);
    if (g === undefined) {
      g = { item: row.item, measurand: row.measurand, byCode: new Map(), list: [] };
      groups.set(key, g);
      groupList.push(g);
    }
    let p = g.byCode.get(row.participant);
    if (p === undefined) {
      p = { code: row.participant, values: [] };
      g.byCode.set(row.participant, p);
      g.list.push(p);
    }
    p.values.push(v);
  }

  const evaluations: ItemEvaluation[] = [];
  for (const g of groupList) {
    evaluations.push(evaluateGroup(g, options, minResults));
  }
  return { evaluations };
}

function evaluateGroup(g: GroupAcc, options: EvaluateOptions, minResults: number): ItemEvaluation {
  const list = g.list.sort(byCode);
  const p = list.length;
  const results = new Float64Array(p);
  const sds: (number | null)[] = new Array(p);
  for (let i = 0; i < p; i++) {
    const vs = list[i].values;
    const m = vs.length;
    // Two-pass mean and SD of a handful of replicates, centred on the first one.
    const x0 = vs[0];
    let s = 0;
    for (let j = 0; j < m; j++) s += vs[j] - x0;
    const dm = s / m;
    results[i] = x0 + dm;
    if (m > 1) {
      let ss = 0;
      for (let j = 0; j < m; j++) {
        const d = vs[j] - x0 - dm;
        ss += d * d;
      }
      sds[i] = Math.sqrt(ss / (m - 1));
    } else {
      sds[i] = null;
    }
  }

  const a = algorithmAUnchecked(results);
  const warnings: EvaluationWarning[] = [];
  if (p < minResults) warnings.push('few-results');
  if (a.outcome !== 'converged') warnings.push(a.outcome);
  const uAssigned = consensusUncertainty(a.robustSd, p);

  const opt = options.sigmaPt;
  const rule: SigmaPtRule = opt === undefined ? ROBUST_SD : typeof opt === 'function' ? opt(g.item, g.measurand) : opt;
  let sigma: number | null = null;
  try {
    sigma = sigmaPtByRule(rule, { assignedValue: a.robustMean, robustSd: a.robustSd });
  } catch {
    warnings.push('sigma-pt-unavailable');
  }
  const uNegligible = sigma === null ? null : isUncertaintyNegligible(uAssigned, sigma);
  if (uNegligible === false) warnings.push('u-not-negligible');

  const xpt = a.robustMean;
  const zDen = sigma;
  const zpDen = sigma === null ? null : Math.sqrt(sigma * sigma + uAssigned * uAssigned);
  const participants: ParticipantEvaluation[] = new Array(p);
  for (let i = 0; i < p; i++) {
    const x = results[i];
    const z = zDen === null ? null : (x - xpt) / zDen;
    const zPrime = zpDen === null ? null : (x - xpt) / zpDen;
    const governing = uNegligible ? z : zPrime;
    participants[i] = {
      code: list[i].code,
      result: x,
      replicates: list[i].values.length,
      replicateSd: sds[i],
      z,
      zPrime,
      signal: governing === null ? null : signalFor(governing, uNegligible ? 'z' : 'zPrime'),
    };
  }

  return {
    item: g.item,
    measurand: g.measurand,
    n: p,
    method: 'algorithm-a',
    iterations: a.iterations,
    outcome: a.outcome,
    assignedValue: xpt,
    robustSd: a.robustSd,
    uAssigned,
    sigmaPt: sigma,
    uNegligible,
    sigmaPtRule: rule,
    warnings,
    participants,
  };
}

function byCode(a: ParticipantAcc, b: ParticipantAcc): number {
  return a.code < b.code ? -1 : a.code > b.code ? 1 : 0;
}
