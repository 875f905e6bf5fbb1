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

const ROBUST_SD: SigmaPtRule = { kind: 'robust-sd' };

/**
 * A round's results as columns, one entry per replicate row: the form the engine works on.
 * Participants and groups (item × measurand) are numbered; `toColumns` builds it from rows, and
 * a caller that reads from a database can fill it directly.
 */
export interface ResultColumns {
  /** Participant codes; `participant[r]` indexes this list. */
  readonly codes: readonly string[];
  /** Item × measurand groups, in the order the evaluations are returned. */
  readonly groups: readonly { readonly item: string; readonly measurand: string }[];
  readonly participant: Int32Array;
  readonly group: Int32Array;
  /** Reported value, unit of the measurand. */
  readonly value: Float64Array;
}

/**
 * Rows to columns: one map lookup per row for the group (no string key is built) and one per
 * change of participant. Groups are numbered in order of first appearance.
 * @throws RangeError naming the row (0-based index) when a value is not a finite number.
 */
export function toColumns(rows: readonly ResultRow[]): ResultColumns {
  const nRows = rows.length;
  const groupsByItem = new Map<string, Map<string, number>>();
  const groups: { item: string; measurand: string }[] = [];
  const codeIndex = new Map<string, number>();
  const codes: string[] = [];
  const group = new Int32Array(nRows);
  const participant = new Int32Array(nRows);
  const value = new Float64Array(nRows);
  let lastCode: string | undefined;
  let lastCodeIdx = -1;
  for (let r = 0; r < nRows; r++) {
    const row = rows[r];
    const v = row.value;
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new RangeError(`row ${r}: value is not a finite number (${String(v)})`);
    }
    let byMeasurand = groupsByItem.get(row.item);
    if (byMeasurand === undefined)
      groupsByItem.set(row.item, (byMeasurand = new Map<string, number>()));
    let g = byMeasurand.get(row.measurand);
    if (g === undefined) {
      g = groups.length;
      byMeasurand.set(row.measurand, g);
      groups.push({ item: row.item, measurand: row.measurand });
    }
    group[r] = g;
    value[r] = v;
    const code = row.participant;
    if (code !== lastCode) {
      let c = codeIndex.get(code);
      if (c === undefined) {
        c = codes.length;
        codeIndex.set(code, c);
        codes.push(code);
      }
      lastCode = code;
      lastCodeIdx = c;
    }
    participant[r] = lastCodeIdx;
  }
  return { codes, groups, participant, group, value };
}

/**
 * Evaluates a round given as rows (see the file comment for the formulas): `toColumns`, then
 * `evaluateColumns`. Groups appear in order of first appearance; participants within a group are
 * sorted by code. Results are never changed.
 * @throws RangeError naming the row (0-based index) when a value is not a finite number.
 */
export function evaluateRound(
  rows: readonly ResultRow[],
  options: EvaluateOptions = {},
): RoundEvaluation {
  return evaluateColumns(toColumns(rows), options);
}

/**
 * Evaluates a round given as columns. Linear in the number of rows: codes are ranked once for
 * the whole round, the rows are put in (group, code) order by two stable counting passes instead
 * of a comparison sort, and Algorithm A finds its medians by selection.
 * @throws RangeError when a column's length or an index is out of step with the others.
 */
export function evaluateColumns(
  cols: ResultColumns,
  options: EvaluateOptions = {},
): RoundEvaluation {
  const minResults = options.minResults ?? 12;
  const { codes, groups } = cols;
  const nRows = cols.value.length;
  const nCodes = codes.length;
  const nGroups = groups.length;
  if (cols.participant.length !== nRows || cols.group.length !== nRows) {
    throw new RangeError('columns: participant, group and value must have the same length');
  }
  for (let r = 0; r < nRows; r++) {
    const p = cols.participant[r];
    const g = cols.group[r];
    if (!(p >= 0 && p < nCodes && g >= 0 && g < nGroups))
      throw new RangeError(`row ${r}: participant or group index out of range`);
    if (!Number.isFinite(cols.value[r]))
      throw new RangeError(`row ${r}: value is not a finite number (${String(cols.value[r])})`);
  }

  // Rank the codes once (TimSort is linear when codes arrive in order, as they usually do).
  const byRank = Array.from({ length: nCodes }, (_, i) => i).sort((a, b) =>
    codes[a] < codes[b] ? -1 : codes[a] > codes[b] ? 1 : 0,
  );
  const rank = new Int32Array(nCodes);
  for (let k = 0; k < nCodes; k++) rank[byRank[k]] = k;

  // Two stable counting passes: rows by code rank, then by group. Values and participant numbers
  // are then copied in that order, so each group below is read front to back.
  const byCodeRank = countingOrder(nRows, nCodes, rank, cols.participant, null);
  const groupStart = new Int32Array(nGroups + 1);
  const order = countingOrder(nRows, nGroups, null, cols.group, byCodeRank, groupStart);
  const value = new Float64Array(nRows);
  const code = new Int32Array(nRows);
  for (let i = 0; i < nRows; i++) {
    const r = order[i];
    value[i] = cols.value[r];
    code[i] = cols.participant[r];
  }

  const evaluations: ItemEvaluation[] = [];
  for (let g = 0; g < nGroups; g++) {
    evaluations.push(
      evaluateGroup(
        groups[g].item,
        groups[g].measurand,
        value,
        code,
        groupStart[g],
        groupStart[g + 1],
        codes,
        options,
        minResults,
      ),
    );
  }
  return { evaluations };
}

/**
 * Stable counting sort of row indices by an integer key in [0, nKeys): the key of row r is
 * `keys[r]`, mapped through `map` when given. Visits rows in the order of `input` (or 0…n−1).
 * Writes each key's first position into `starts` (length nKeys + 1) when given.
 */
function countingOrder(
  nRows: number,
  nKeys: number,
  map: Int32Array | null,
  keys: Int32Array,
  input: Int32Array | null,
  starts: Int32Array = new Int32Array(nKeys + 1),
): Int32Array {
  const next = new Int32Array(nKeys + 1);
  for (let r = 0; r < nRows; r++) next[(map === null ? keys[r] : map[keys[r]]) + 1]++;
  for (let k = 0; k < nKeys; k++) next[k + 1] += next[k];
  starts.set(next);
  const out = new Int32Array(nRows);
  for (let i = 0; i < nRows; i++) {
    const r = input === null ? i : input[i];
    const k = map === null ? keys[r] : map[keys[r]];
    out[next[k]++] = r;
  }
  return out;
}

function evaluateGroup(
  item: string,
  measurand: string,
  value: Float64Array,
  code: Int32Array,
  from: number,
  to: number,
  codes: readonly string[],
  options: EvaluateOptions,
  minResults: number,
): ItemEvaluation {
  // Participants of this group: runs of equal code in [from, to), already in code order.
  let p = 0;
  for (let i = from; i < to; i++) if (i === from || code[i] !== code[i - 1]) p++;
  const results = new Float64Array(p);
  const sdValues = new Float64Array(p);
  const counts = new Int32Array(p);
  const firstRow = new Int32Array(p);
  let i = from;
  for (let k = 0; k < p; k++) {
    const c = code[i];
    let j = i;
    while (j < to && code[j] === c) j++;
    const m = j - i;
    // Two-pass mean and SD of a handful of replicates, centred on the first one.
    const x0 = value[i];
    let s = 0;
    for (let q = i; q < j; q++) s += value[q] - x0;
    const dm = s / m;
    results[k] = x0 + dm;
    if (m > 1) {
      let ss = 0;
      for (let q = i; q < j; q++) {
        const d = value[q] - x0 - dm;
        ss += d * d;
      }
      sdValues[k] = Math.sqrt(ss / (m - 1));
    }
    counts[k] = m;
    firstRow[k] = i;
    i = j;
  }
  const g = { item, measurand };

  const a = algorithmAUnchecked(results);
  const warnings: EvaluationWarning[] = [];
  if (p < minResults) warnings.push('few-results');
  if (a.outcome !== 'converged') warnings.push(a.outcome);
  const uAssigned = consensusUncertainty(a.robustSd, p);

  const opt = options.sigmaPt;
  const rule: SigmaPtRule =
    opt === undefined ? ROBUST_SD : typeof opt === 'function' ? opt(g.item, g.measurand) : opt;
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
  const participants = new Array<ParticipantEvaluation>(p);
  for (let i = 0; i < p; i++) {
    const x = results[i];
    const z = zDen === null ? null : (x - xpt) / zDen;
    const zPrime = zpDen === null ? null : (x - xpt) / zpDen;
    const governing = uNegligible ? z : zPrime;
    participants[i] = {
      code: codes[code[firstRow[i]]],
      result: x,
      replicates: counts[i],
      replicateSd: counts[i] > 1 ? sdValues[i] : null,
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
