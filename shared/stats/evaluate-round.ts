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

/**
 * The per-participant numbers of one item × measurand as columns, index i = the i-th
 * participant in code order. The engine fills these; `ItemEvaluation.participants` builds its
 * objects from them only when a caller reads it.
 *
 * Up to 16,000 participants the columns are plain number arrays, above that typed arrays. Plain
 * arrays live on the JavaScript heap, whose pages V8 keeps and reuses; a fresh typed array over
 * about 128 kB is memory the C allocator maps afresh until the garbage collector frees it, so
 * every evaluation paid a page fault per 4 kB of results (about 400 at 10,000 participants; see
 * docs/QUALITY.md). Above 16,000 a plain array is mapped afresh too and takes more room.
 */
export interface ParticipantColumns {
  /** Index into the round's participant codes (`ResultColumns.codes`). */
  readonly code: ArrayLike<number>;
  /** Mean of the participant's replicates, unit of the measurand. */
  readonly result: ArrayLike<number>;
  readonly replicates: ArrayLike<number>;
  /** SD (n − 1) of the replicates; NaN for a single replicate. */
  readonly replicateSd: ArrayLike<number>;
  /** z per participant; null when σ_pt could not be set. */
  readonly z: ArrayLike<number> | null;
  /** z′ per participant; null when σ_pt could not be set. */
  readonly zPrime: ArrayLike<number> | null;
}

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
  /** The participants' numbers as columns (what the engine computes). */
  readonly columns: ParticipantColumns;
  /**
   * The same numbers as one object per participant, in code order. Built from `columns` on
   * first read and kept (an own enumerable getter, so spreading and JSON include it).
   */
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

/** Work buffers for the rows in (group, code) order (only when rows arrive out of code order). */
let scratchValue = new Float64Array(0);
let scratchCode = new Int32Array(0);
let scratchGroup = new Int32Array(0);

/**
 * Evaluates a round given as columns. Linear in the number of rows and free of per-participant
 * objects: one pass checks the rows and counts each group's participants, a second computes every
 * participant's replicate mean and SD straight from the rows into the output columns. That holds
 * when each group's rows arrive in code order (as uploads and the database give them); otherwise
 * the rows are first put in (group, code) order by stable counting passes over integer indices.
 * Per-participant numbers stay in columns (`ItemEvaluation.columns`), and Algorithm A finds
 * its medians by selection.
 * @throws RangeError when a column's length or an index is out of step with the others.
 */
export function evaluateColumns(
  cols: ResultColumns,
  options: EvaluateOptions = {},
): RoundEvaluation {
  const minResults = options.minResults ?? 12;
  const { codes, groups } = cols;
  const nRows = cols.value.length;
  const nGroups = groups.length;
  if (cols.participant.length !== nRows || cols.group.length !== nRows) {
    throw new RangeError('columns: participant, group and value must have the same length');
  }
  const rank = codeRanks(codes);
  // perGroup[g + 1]: number of participants of group g.
  const perGroup = new Int32Array(nGroups + 1);
  const stream = participantStream(nRows);
  let entries = replicateMeans(cols, codes.length, rank, perGroup, stream);
  if (entries < 0) {
    checkRows(cols);
    perGroup.fill(0);
    entries = replicateMeans(inGroupCodeOrder(cols, rank), codes.length, rank, perGroup, stream);
  }
  const out: GroupColumns[] = [];
  for (let g = 0; g < nGroups; g++) out.push(groupColumns(perGroup[g + 1]));
  distribute(stream, entries, out);
  const evaluations: ItemEvaluation[] = [];
  for (let g = 0; g < nGroups; g++) {
    evaluations.push(
      evaluateGroup(groups[g].item, groups[g].measurand, out[g], codes, options, minResults),
    );
  }
  return { evaluations };
}

/*
 * The loops below each sit in a small function of their own: V8 optimises each on its own
 * feedback, and one large function with many loops was deoptimised again and again (its
 * doubles then went through the heap as garbage).
 */

/** The row columns the passes below read (a round's, or the same rows reordered). */
interface RowColumns {
  readonly participant: Int32Array;
  readonly group: Int32Array;
  readonly value: Float64Array;
}

/** Checks the indices and values of every row. @throws RangeError naming the first bad row. */
function checkRows(cols: ResultColumns): void {
  const { participant, group, value } = cols;
  const nCodes = cols.codes.length;
  const nGroups = cols.groups.length;
  for (let r = 0; r < value.length; r++)
    checkRow(r, participant[r], group[r], value[r], nCodes, nGroups);
}

/** @throws RangeError naming row r when an index is out of range or the value not finite. */
function checkRow(
  r: number,
  p: number,
  g: number,
  v: number,
  nCodes: number,
  nGroups: number,
): void {
  if (!(p >= 0 && p < nCodes && g >= 0 && g < nGroups))
    throw new RangeError(`row ${r}: participant or group index out of range`);
  if (!Number.isFinite(v)) throw new RangeError(`row ${r}: value is not a finite number (${v})`);
}

/**
 * The rows in (group, code) order: a stable counting pass by code rank, then a stable scatter by
 * group into reused work buffers.
 */
function inGroupCodeOrder(cols: ResultColumns, rank: Int32Array | null): RowColumns {
  const nRows = cols.value.length;
  const nGroups = cols.groups.length;
  if (scratchValue.length < nRows) {
    scratchValue = new Float64Array(nRows);
    scratchCode = new Int32Array(nRows);
    scratchGroup = new Int32Array(nRows);
  }
  const value = scratchValue.subarray(0, nRows);
  const code = scratchCode.subarray(0, nRows);
  const group = scratchGroup.subarray(0, nRows);
  const byCode = countingOrder(nRows, cols.codes.length, rank, cols.participant);
  const next = new Int32Array(nGroups + 1);
  for (let r = 0; r < nRows; r++) next[cols.group[r] + 1]++;
  for (let g = 0; g < nGroups; g++) {
    next[g + 1] += next[g];
    group.fill(g, next[g], next[g + 1]);
  }
  scatterByGroup(cols, byCode, next, value, code);
  return { participant: code, group, value };
}

/**
 * Stable scatter of the rows (in the order `order`) to their group's block: `next[g]` is the next
 * free position of group g.
 */
function scatterByGroup(
  cols: ResultColumns,
  order: Int32Array,
  next: Int32Array,
  value: Float64Array,
  code: Int32Array,
): void {
  const { participant, group } = cols;
  const values = cols.value;
  const nRows = values.length;
  for (let q = 0; q < nRows; q++) {
    const r = order[q];
    const i = next[group[r]]++;
    value[i] = values[r];
    code[i] = participant[r];
  }
}

/**
 * Rank of each code in code order, or null when the codes are already in strictly increasing
 * order (the usual case: one linear pass, no sort).
 */
function codeRanks(codes: readonly string[]): Int32Array | null {
  const n = codes.length;
  let sorted = true;
  for (let k = 1; k < n && sorted; k++) if (!(codes[k - 1] < codes[k])) sorted = false;
  if (sorted) return null;
  const byRank = Array.from({ length: n }, (_, i) => i).sort((a, b) =>
    codes[a] < codes[b] ? -1 : codes[a] > codes[b] ? 1 : 0,
  );
  const rank = new Int32Array(n);
  for (let k = 0; k < n; k++) rank[byRank[k]] = k;
  return rank;
}

/**
 * Stable counting sort of row indices 0…n−1 by an integer key in [0, nKeys): the key of row r
 * is `keys[r]`, mapped through `map` when given.
 */
function countingOrder(
  nRows: number,
  nKeys: number,
  map: Int32Array | null,
  keys: Int32Array,
): Int32Array {
  const next = new Int32Array(nKeys + 1);
  for (let r = 0; r < nRows; r++) next[(map === null ? keys[r] : map[keys[r]]) + 1]++;
  for (let k = 0; k < nKeys; k++) next[k + 1] += next[k];
  const out = new Int32Array(nRows);
  for (let r = 0; r < nRows; r++) out[next[map === null ? keys[r] : map[keys[r]]]++] = r;
  return out;
}

function evaluateGroup(
  item: string,
  measurand: string,
  cols: GroupColumns,
  codes: readonly string[],
  options: EvaluateOptions,
  minResults: number,
): ItemEvaluation {
  const { results, sdValues, counts, codeOf } = cols;
  const p = results.length;

  const a = algorithmAUnchecked(results);
  const warnings: EvaluationWarning[] = [];
  if (p < minResults) warnings.push('few-results');
  if (a.outcome !== 'converged') warnings.push(a.outcome);
  const uAssigned = consensusUncertainty(a.robustSd, p);

  const opt = options.sigmaPt;
  const rule: SigmaPtRule =
    opt === undefined ? ROBUST_SD : typeof opt === 'function' ? opt(item, measurand) : opt;
  let sigma: number | null = null;
  try {
    sigma = sigmaPtByRule(rule, { assignedValue: a.robustMean, robustSd: a.robustSd });
  } catch {
    warnings.push('sigma-pt-unavailable');
  }
  const uNegligible = sigma === null ? null : isUncertaintyNegligible(uAssigned, sigma);
  if (uNegligible === false) warnings.push('u-not-negligible');

  const xpt = a.robustMean;
  let z: Doubles | null = null;
  let zPrime: Doubles | null = null;
  if (sigma !== null) {
    const zpDen = Math.sqrt(sigma * sigma + uAssigned * uAssigned);
    z = freshDoubles(p);
    zPrime = freshDoubles(p);
    scores(results, xpt, sigma, zpDen, z, zPrime);
  }
  const columns: ParticipantColumns = {
    code: codeOf,
    result: results,
    replicates: counts,
    replicateSd: sdValues,
    z,
    zPrime,
  };
  const evaluation: Omit<ItemEvaluation, 'participants'> = {
    item,
    measurand,
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
    columns,
  };
  const source: ParticipantSource = { codes, built: undefined };
  return Object.defineProperties(evaluation as ItemEvaluation, {
    [PARTICIPANT_SOURCE]: { value: source },
    participants: { enumerable: true, get: participantsGetter },
  });
}

/** Key of what an evaluation's `participants` getter reads besides its columns (hidden). */
const PARTICIPANT_SOURCE = Symbol('participant source');

interface ParticipantSource {
  readonly codes: readonly string[];
  /** The objects, once built. */
  built: ParticipantEvaluation[] | undefined;
}

/**
 * The `participants` getter: one function shared by every evaluation, reading its state through
 * `this`. A closure per evaluation gave each result its own V8 hidden class (allocated in the old
 * generation) holding that closure, so every young-generation collection kept every result
 * alive until the next full collection and moved it to the old generation: at 10,000
 * participants about 6 MB copied per collection and fresh old-generation pages to fault in.
 */
function participantsGetter(
  this: ItemEvaluation & { readonly [PARTICIPANT_SOURCE]: ParticipantSource },
): readonly ParticipantEvaluation[] {
  const s = this[PARTICIPANT_SOURCE];
  return (s.built ??= participantObjects(this.columns, s.codes, this.uNegligible));
}

/** One group's output columns, filled by `distribute`. */
interface GroupColumns {
  readonly results: Doubles;
  readonly sdValues: Doubles;
  readonly counts: Integers;
  readonly codeOf: Integers;
}

/**
 * Longest column kept on the JavaScript heap: a longer array goes to V8's large-object space,
 * mapped afresh for each array like a typed array's memory, and a typed array is then the
 * smaller of the two (4 bytes per integer instead of 8). A packed double array of n elements
 * takes 16 + 8n bytes; V8's regular heap objects end at 128 kB.
 */
const HEAP_COLUMN_MAX = 16_000;

type Doubles = number[] | Float64Array;
type Integers = number[] | Int32Array;

/*
 * Fresh output arrays are copies of a template of the right element kind (slice copies the
 * backing store in one go): exact length, doubles stored unboxed (V8's packed-double arrays),
 * integers as small integers, and no change of element kind while they are filled.
 */
let doubleTemplate: number[] = [0.5];
let integerTemplate: number[] = [0];

function grownTemplate(t: number[], n: number, fill: number): number[] {
  const grown = t.slice();
  while (grown.length < n) grown.push(fill);
  return grown;
}

/** A fresh array of n doubles (values to be overwritten). */
function freshDoubles(n: number): Doubles {
  if (n > HEAP_COLUMN_MAX) return new Float64Array(n);
  if (doubleTemplate.length < n)
    doubleTemplate = grownTemplate(doubleTemplate, Math.max(n, 2 * doubleTemplate.length), 0.5);
  return doubleTemplate.slice(0, n);
}

/** A fresh array of n small integers (values to be overwritten). */
function freshIntegers(n: number): Integers {
  if (n > HEAP_COLUMN_MAX) return new Int32Array(n);
  if (integerTemplate.length < n)
    integerTemplate = grownTemplate(integerTemplate, Math.max(n, 2 * integerTemplate.length), 0);
  return integerTemplate.slice(0, n);
}

function groupColumns(p: number): GroupColumns {
  return {
    results: freshDoubles(p),
    sdValues: freshDoubles(p),
    counts: freshIntegers(p),
    codeOf: freshIntegers(p),
  };
}

/**
 * Each participant's numbers in the order the row pass completes them (any group), before they
 * are put in their group's output columns. Work buffers, reused from call to call.
 */
interface ParticipantStream {
  readonly group: Int32Array;
  readonly code: Int32Array;
  readonly count: Int32Array;
  readonly mean: Float64Array;
  readonly sd: Float64Array;
}

let streamBuffers: ParticipantStream = participantStreamOf(0);

function participantStreamOf(n: number): ParticipantStream {
  return {
    group: new Int32Array(n),
    code: new Int32Array(n),
    count: new Int32Array(n),
    mean: new Float64Array(n),
    sd: new Float64Array(n),
  };
}

/** Work buffers for up to `nRows` participant entries (a round has at most one per row). */
function participantStream(nRows: number): ParticipantStream {
  if (streamBuffers.mean.length < nRows) streamBuffers = participantStreamOf(nRows);
  return streamBuffers;
}

/**
 * One pass over the rows: checks each row and, per participant (a run of equal code within a
 * group), computes the mean and SD (n − 1; NaN for one replicate) of its replicates from the sums
 * of the deviations from its first replicate and of their squares (shifted data: mean =
 * x₀ + Σd/m, SD² = (Σd² − (Σd)²/m)/(m − 1)), appended to `stream` with its group, code and
 * replicate count; `perGroup[g + 1]` counts group g's participants. Returns the number of
 * entries, or −1 as soon as a group's rows leave code order (by `rank`, or by index when null):
 * the rows must then be reordered and the pass run again.
 * @throws RangeError naming the first bad row.
 */
function replicateMeans(
  rows: RowColumns,
  nCodes: number,
  rank: Int32Array | null,
  perGroup: Int32Array,
  stream: ParticipantStream,
): number {
  const { participant, group, value } = rows;
  const nRows = value.length;
  const nGroups = perGroup.length - 1;
  const cur = new Int32Array(nGroups).fill(-1);
  const m = new Int32Array(nGroups);
  const x0 = new Float64Array(nGroups);
  const sum = new Float64Array(nGroups);
  const squares = new Float64Array(nGroups);
  let e = 0;
  for (let r = 0; r < nRows; r++) {
    const p = participant[r];
    const g = group[r];
    const v = value[r];
    if (!(p >= 0 && p < nCodes && g >= 0 && g < nGroups && Number.isFinite(v)))
      checkRow(r, p, g, v, nCodes, nGroups);
    const c = cur[g];
    if (p === c) {
      const d = v - x0[g];
      sum[g] += d;
      squares[g] += d * d;
      m[g]++;
      continue;
    }
    if (c >= 0) {
      if (rank === null ? p < c : rank[p] < rank[c]) return -1;
      writeParticipant(stream, e++, g, c, m[g], x0[g], sum[g], squares[g]);
      perGroup[g + 1]++;
    }
    cur[g] = p;
    m[g] = 1;
    x0[g] = v;
    sum[g] = 0;
    squares[g] = 0;
  }
  for (let g = 0; g < nGroups; g++) {
    if (cur[g] < 0) continue;
    writeParticipant(stream, e++, g, cur[g], m[g], x0[g], sum[g], squares[g]);
    perGroup[g + 1]++;
  }
  return e;
}

/** Writes one participant's group, code, count, mean and replicate SD at entry e of `s`. */
function writeParticipant(
  s: ParticipantStream,
  e: number,
  g: number,
  code: number,
  m: number,
  x0: number,
  sum: number,
  squares: number,
): void {
  const dm = sum / m;
  const ss = squares - sum * dm;
  s.group[e] = g;
  s.code[e] = code;
  s.count[e] = m;
  s.mean[e] = x0 + dm;
  s.sd[e] = m > 1 ? Math.sqrt((ss > 0 ? ss : 0) / (m - 1)) : NaN;
}

/** Puts the stream's entries in their group's output columns, in stream order. */
function distribute(s: ParticipantStream, entries: number, out: readonly GroupColumns[]): void {
  const next = new Int32Array(out.length);
  const { group, code, count, mean, sd } = s;
  for (let e = 0; e < entries; e++) {
    const g = group[e];
    const k = next[g]++;
    const c = out[g];
    c.results[k] = mean[e];
    c.sdValues[k] = sd[e];
    c.counts[k] = count[e];
    c.codeOf[k] = code[e];
  }
}

/** z = (x − x_pt)/σ_pt and z′ = (x − x_pt)/√(σ_pt² + u²(x_pt)) per participant. */
function scores(
  results: Doubles,
  xpt: number,
  sigma: number,
  zpDen: number,
  z: Doubles,
  zPrime: Doubles,
): void {
  for (let k = 0; k < results.length; k++) {
    const x = results[k];
    z[k] = (x - xpt) / sigma;
    zPrime[k] = (x - xpt) / zpDen;
  }
}

/** One object per participant from the columns (the form reports and the API read). */
function participantObjects(
  c: ParticipantColumns,
  codes: readonly string[],
  uNegligible: boolean | null,
): ParticipantEvaluation[] {
  const p = c.result.length;
  const kind = uNegligible ? 'z' : 'zPrime';
  const out = new Array<ParticipantEvaluation>(p);
  for (let k = 0; k < p; k++) {
    const z = c.z === null ? null : c.z[k];
    const zPrime = c.zPrime === null ? null : c.zPrime[k];
    const governing = uNegligible ? z : zPrime;
    out[k] = {
      code: codes[c.code[k]],
      result: c.result[k],
      replicates: c.replicates[k],
      replicateSd: c.replicates[k] > 1 ? c.replicateSd[k] : null,
      z,
      zPrime,
      signal: governing === null ? null : signalFor(governing, kind),
    };
  }
  return out;
}
