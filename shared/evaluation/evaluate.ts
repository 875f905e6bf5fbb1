/**
 * The round evaluation as a pure function: stored replicates + the measurands' rules + the
 * coordinator's settings (σ_pt overrides, exclusions) → the record per item × measurand.
 * The server stores its output; the browser runs the same code for the σ_pt preview.
 *
 * Sources (via shared/stats): ISO 13528:2015 §7 (x_pt, u(x_pt)), §8 (σ_pt), §9 (z, z′, ζ, En,
 * D, D%, signals). For the consensus rule the numbers come from shared/stats `evaluateRound`,
 * the same function the offline evaluate command runs, so the command reproduces them from the
 * exported replicates.
 */
import type {
  AssignedValueRuleInput,
  EvaluationSettings,
  ItemMeasurandEvaluation,
  ParticipantScore,
  SigmaPtRuleInput,
} from '../contracts/evaluation';
import { RANGES, type NumberRange } from '../contracts/ranges';
import { replicateRange } from '../contracts/submission';
import { algorithmA } from '../stats/algorithm-a';
import {
  assignedValue as assignedValueByRule,
  isUncertaintyNegligible,
} from '../stats/assigned-value';
import { blunderHints } from '../stats/blunder-hints';
import { evaluateRound, type ResultRow } from '../stats/evaluate-round';
import { enNumber, signalFor, zetaScore } from '../stats/scores';
import { sigmaPt as sigmaPtByRule, type SigmaPtRule } from '../stats/sigma-pt';

/** Coverage factor used for U(x_pt) = k·u(x_pt) in En (common practice: k = 2, about 95 %). */
export const ASSIGNED_COVERAGE_FACTOR = 2;

/** Constants stored with every record so it can be reproduced and explained. */
export const EVALUATION_CONSTANTS = {
  algorithmA: {
    winsorizeFactor: 1.5,
    sdFactor: 1.134,
    madeFactor: 1.483,
    relativeTolerance: 1e-12,
    maxIterations: 1000,
  },
  consensusUncertaintyFactor: 1.25,
  negligibleRatio: 0.3,
  assignedCoverageFactor: ASSIGNED_COVERAGE_FACTOR,
  signalLimits: { warning: 2, action: 3, en: 1 },
  source: 'ISO 13528:2015 §7–9; ISO/IEC 17043',
} as const;

export interface ItemInfo {
  readonly id: string;
  readonly code: string;
}

export interface MeasurandInfo {
  readonly id: string;
  readonly key: string;
  readonly name: string;
  readonly unit: string;
  readonly decimals: number;
  readonly sigmaPtRule: SigmaPtRuleInput;
  readonly assignedValueRule: AssignedValueRuleInput;
  readonly minParticipants: number;
}

export interface ReplicateUncertainty {
  readonly kind: 'standard' | 'expanded';
  readonly value: number;
  readonly k: number | null;
}

/** One participant's replicates for one item × measurand (values in the measurand's unit). */
export interface ReplicateInput {
  readonly code: string;
  readonly testItemId: string;
  readonly measurandId: string;
  readonly values: readonly number[];
  readonly uncertainty: ReplicateUncertainty | null;
}

export interface EvaluationInput {
  readonly items: readonly ItemInfo[];
  readonly measurands: readonly MeasurandInfo[];
  readonly replicates: readonly ReplicateInput[];
  readonly settings?: Partial<EvaluationSettings>;
}

/** Mean and SD of replicates exactly as shared/stats evaluateRound computes them. */
export function replicateStats(vs: readonly number[]): { mean: number; sd: number | null } {
  const m = vs.length;
  const x0 = vs[0]!;
  let s = 0;
  for (let j = 0; j < m; j++) s += vs[j]! - x0;
  const dm = s / m;
  if (m < 2) return { mean: x0 + dm, sd: null };
  let ss = 0;
  for (let j = 0; j < m; j++) {
    const d = vs[j]! - x0 - dm;
    ss += d * d;
  }
  return { mean: x0 + dm, sd: Math.sqrt(ss / (m - 1)) };
}

/** The σ_pt rule in force for an item × measurand: the most specific override, else the measurand's. */
export function sigmaRuleFor(
  m: MeasurandInfo,
  itemCode: string,
  settings: Partial<EvaluationSettings> | undefined,
): SigmaPtRuleInput {
  const overrides = settings?.sigmaPtOverrides ?? [];
  const exact = overrides.find((o) => o.measurandKey === m.key && o.itemCode === itemCode);
  const any = overrides.find(
    (o) => o.measurandKey === m.key && (o.itemCode === null || o.itemCode === undefined),
  );
  return (exact ?? any)?.rule ?? m.sigmaPtRule;
}

function standardU(u: ReplicateUncertainty | null): { u: number; U: number } | null {
  if (!u || !(u.value > 0)) return null;
  if (u.kind === 'standard') return { u: u.value, U: ASSIGNED_COVERAGE_FACTOR * u.value };
  const k = u.k && u.k > 0 ? u.k : ASSIGNED_COVERAGE_FACTOR;
  return { u: u.value / k, U: u.value };
}

/** Why a participant's stored data cannot be scored (shown with the participant, never a 500). */
export type NotScored = NonNullable<ParticipantScore['notScored']>;

const fmtValue = (v: number): string =>
  Number.isFinite(v) && Math.abs(v) < 1e6 && Math.abs(v) >= 1e-3 ? String(v) : v.toExponential(3);
const inRange = (v: number, r: NumberRange): boolean =>
  Number.isFinite(v) && v <= r.max && (r.minExclusive ? v > r.min : v >= r.min);
const finiteOrNull = (v: number | null | undefined): number | null =>
  typeof v === 'number' && Number.isFinite(v) ? v : null;

/**
 * The stored replicates of one participant that cannot enter the evaluation: a value outside the
 * measurand's plausible range (shared/contracts/ranges.ts), e.g. data stored before a bound existed.
 */
function valueProblem(values: readonly number[], m: MeasurandInfo): NotScored | null {
  const range = replicateRange(m) ?? RANGES.measuredValue;
  const bad = values.find((v) => !inRange(v, range));
  if (bad === undefined) return null;
  return {
    code: 'value-out-of-range',
    message: `Not scored: the result ${fmtValue(bad)}${m.unit ? ' ' + m.unit : ''} is outside the plausible range (${range.label} ${range.min}–${range.max}); it is kept out of the assigned value.`,
  };
}

/** The lab's uncertainty when it can enter ζ and En; otherwise why not. */
function labUncertainty(u: ReplicateUncertainty | null): {
  lab: { u: number; U: number } | null;
  problem: NotScored | null;
} {
  if (!u) return { lab: null, problem: null };
  const lab = standardU(u);
  const r = RANGES.uncertainty;
  if (
    !lab ||
    !inRange(u.value, r) ||
    !Number.isFinite(lab.U) ||
    !Number.isFinite(lab.u) ||
    (u.k !== null && !inRange(u.k, RANGES.coverageFactor))
  ) {
    return {
      lab: null,
      problem: {
        code: 'uncertainty-out-of-range',
        message: `ζ and En not computed: the reported uncertainty ${fmtValue(u.value)}${u.k !== null ? ` (k = ${fmtValue(u.k)})` : ''} is outside the plausible range (above 0, at most ${r.max.toExponential()}).`,
      },
    };
  }
  return { lab, problem: null };
}

/** A score that is a finite number, else null (with the reason recorded by the caller). */
function safeScore(f: () => number): number | null {
  try {
    return finiteOrNull(f());
  } catch {
    return null;
  }
}

const NONE_CORE = (warning: string): Core => ({
  method: 'none',
  iterations: 0,
  assignedValue: null,
  robustSd: null,
  uAssigned: null,
  sigmaPt: null,
  uNegligible: null,
  warnings: [warning],
});

/** core() that never throws: a failure of the statistics leaves the group without x_pt and says so. */
function safeCore(...args: Parameters<typeof core>): Core {
  try {
    const c = core(...args);
    const xpt = finiteOrNull(c.assignedValue);
    const sigma = finiteOrNull(c.sigmaPt);
    return {
      ...c,
      assignedValue: xpt,
      robustSd: finiteOrNull(c.robustSd),
      uAssigned: finiteOrNull(c.uAssigned),
      sigmaPt: sigma !== null && inRange(sigma, RANGES.sigmaPt) ? sigma : null,
      warnings: [
        ...c.warnings,
        ...(c.assignedValue !== null && xpt === null ? ['assigned-value-not-finite'] : []),
        ...(c.sigmaPt !== null && (sigma === null || !inRange(sigma, RANGES.sigmaPt))
          ? ['sigma-pt-out-of-range']
          : []),
      ],
    };
  } catch {
    return NONE_CORE('evaluation-failed');
  }
}

interface Core {
  method: ItemMeasurandEvaluation['method'];
  iterations: number;
  assignedValue: number | null;
  robustSd: number | null;
  uAssigned: number | null;
  sigmaPt: number | null;
  uNegligible: boolean | null;
  warnings: string[];
}

/** x_pt, u(x_pt), s*, σ_pt for the included results by the measurand's rules. */
function core(
  codes: readonly string[],
  valuesByCode: ReadonlyMap<string, readonly number[]>,
  av: AssignedValueRuleInput,
  sigmaRule: SigmaPtRuleInput,
  minResults: number,
): Core {
  const p = codes.length;
  if (av.kind === 'consensus') {
    if (p === 0) {
      return {
        method: 'none',
        iterations: 0,
        assignedValue: null,
        robustSd: null,
        uAssigned: null,
        sigmaPt: null,
        uNegligible: null,
        warnings: ['no-results'],
      };
    }
    const rows: ResultRow[] = [];
    for (const code of codes) {
      const vs = valuesByCode.get(code)!;
      for (let r = 0; r < vs.length; r++)
        rows.push({
          participant: code,
          item: 'i',
          measurand: 'm',
          replicate: r + 1,
          value: vs[r]!,
        });
    }
    const e = evaluateRound(rows, { sigmaPt: sigmaRule as SigmaPtRule, minResults })
      .evaluations[0]!;
    return {
      method: 'algorithm-a',
      iterations: e.iterations,
      assignedValue: e.assignedValue,
      robustSd: e.robustSd,
      uAssigned: e.uAssigned,
      sigmaPt: e.sigmaPt,
      uNegligible: e.uNegligible,
      warnings: [...e.warnings],
    };
  }
  const results = codes.map((c) => replicateStats(valuesByCode.get(c)!).mean);
  const warnings: string[] = [];
  if (av.kind !== 'reference' && p === 0) {
    return {
      method: 'none',
      iterations: 0,
      assignedValue: null,
      robustSd: null,
      uAssigned: null,
      sigmaPt: null,
      uNegligible: null,
      warnings: ['no-results'],
    };
  }
  if (p < minResults) warnings.push('few-results');
  const a = assignedValueByRule(results, av);
  // s* of the round for the robust-sd σ_pt rule: MADe for the median rule, Algorithm A otherwise.
  const robustSd = a.robustSd ?? (results.length > 0 ? algorithmA(results).robustSd : undefined);
  let sigma: number | null = null;
  try {
    sigma = sigmaPtByRule(sigmaRule as SigmaPtRule, { assignedValue: a.value, robustSd });
  } catch {
    warnings.push('sigma-pt-unavailable');
  }
  const uNegligible = sigma === null ? null : isUncertaintyNegligible(a.u, sigma);
  if (uNegligible === false) warnings.push('u-not-negligible');
  return {
    method: a.method,
    iterations: a.algorithmA?.iterations ?? 0,
    assignedValue: a.value,
    robustSd: robustSd ?? null,
    uAssigned: a.u,
    sigmaPt: sigma,
    uNegligible,
    warnings,
  };
}

/**
 * Evaluates a round (see the file comment). Groups in item order × measurand order;
 * participants sorted by code. Excluded results are kept out of x_pt and s* but still scored
 * against them and marked. Values that are not finite numbers are ignored (a draft never
 * reaches here: only submitted versions are evaluated).
 */
export function evaluateRecord(input: EvaluationInput): ItemMeasurandEvaluation[] {
  const settings = input.settings;
  const excluded = new Map<
    string,
    { rule: NonNullable<ParticipantScore['excluded']>['rule']; reason: string }
  >();
  for (const x of settings?.exclusions ?? []) {
    excluded.set(`${x.participantCode}\u0000${x.itemCode}\u0000${x.measurandKey}`, {
      rule: x.rule,
      reason: x.reason,
    });
  }
  const byGroup = new Map<string, ReplicateInput[]>();
  for (const r of input.replicates) {
    const key = r.testItemId + '\u0000' + r.measurandId;
    let list = byGroup.get(key);
    if (!list) byGroup.set(key, (list = []));
    list.push(r);
  }

  const out: ItemMeasurandEvaluation[] = [];
  for (const item of input.items) {
    for (const m of input.measurands) {
      const seen = new Set<string>();
      let duplicates = 0;
      const rows = (byGroup.get(item.id + '\u0000' + m.id) ?? [])
        .map((r) => ({
          ...r,
          values: r.values.filter((v) => typeof v === 'number' && Number.isFinite(v)),
        }))
        .filter((r) => r.values.length > 0)
        .sort((a, b) => (a.code < b.code ? -1 : a.code > b.code ? 1 : 0))
        // One result per participant: a repeated item or measurand in old stored data counts once (the first).
        .filter((r) => (seen.has(r.code) ? (duplicates++, false) : (seen.add(r.code), true)));
      const valuesByCode = new Map(rows.map((r) => [r.code, r.values] as const));
      const problems = new Map<string, NotScored>();
      for (const r of rows) {
        const p = valueProblem(r.values, m);
        if (p) problems.set(r.code, p);
      }
      const included = rows
        .filter(
          (r) =>
            !excluded.has(`${r.code}\u0000${item.code}\u0000${m.key}`) && !problems.has(r.code),
        )
        .map((r) => r.code);
      const sigmaRule = sigmaRuleFor(m, item.code, settings);
      const c = safeCore(included, valuesByCode, m.assignedValueRule, sigmaRule, m.minParticipants);
      if (duplicates > 0) c.warnings.push('duplicate-results-ignored');
      const xpt = c.assignedValue;
      const sigma = c.sigmaPt;
      const u = c.uAssigned;
      const scoreKind: ParticipantScore['scoreKind'] = c.uNegligible === false ? 'zPrime' : 'z';
      const zpDen = sigma === null || u === null ? null : Math.sqrt(sigma * sigma + u * u);
      /** z, z′, ζ, En, D, D%, the signal and why a score is missing, for a result x. */
      const scoresOf = (
        x: number,
        lab: { u: number; U: number } | null,
        uIssue: NotScored | null,
      ) => {
        const z = xpt === null || sigma === null ? null : safeScore(() => (x - xpt) / sigma);
        const zPrime = xpt === null || zpDen === null ? null : safeScore(() => (x - xpt) / zpDen);
        let zeta: number | null = null;
        let en: number | null = null;
        if (lab && xpt !== null && u !== null) {
          zeta = safeScore(() => zetaScore(x, xpt, lab.u, u));
          en = safeScore(() => enNumber(x, xpt, lab.U, ASSIGNED_COVERAGE_FACTOR * u));
        }
        let notScored: NotScored | null = uIssue;
        if (!notScored && lab && xpt !== null && u !== null && (zeta === null || en === null)) {
          notScored = {
            code: 'score-not-computable',
            message: 'ζ and En not computed: the uncertainties give no finite score.',
          };
        }
        const governing = scoreKind === 'z' ? z : zPrime;
        if (
          !notScored &&
          xpt !== null &&
          sigma === null &&
          c.warnings.includes('sigma-pt-out-of-range')
        ) {
          notScored = {
            code: 'sigma-pt-out-of-range',
            message: `Not scored: σ_pt is outside the plausible range (${RANGES.sigmaPt.min}–${RANGES.sigmaPt.max}); check the σ_pt rule.`,
          };
        }
        if (
          !notScored &&
          xpt !== null &&
          (scoreKind === 'z' ? sigma : zpDen) !== null &&
          governing === null
        ) {
          notScored = {
            code: 'score-not-computable',
            message: 'Not scored: the result and σ_pt give no finite score.',
          };
        }
        const d = xpt === null ? null : finiteOrNull(x - xpt);
        return {
          z,
          zPrime,
          zeta,
          en,
          d,
          dPct: xpt === null || xpt === 0 || d === null ? null : finiteOrNull((100 * d) / xpt),
          signal: governing === null ? null : signalFor(governing, scoreKind),
          notScored,
        };
      };
      const participants: ParticipantScore[] = rows.map((r) => {
        const stats = replicateStats(r.values);
        const x = Number.isFinite(stats.mean) ? stats.mean : r.values[0]!;
        const sd = finiteOrNull(stats.sd);
        const ex = excluded.get(`${r.code}\u0000${item.code}\u0000${m.key}`) ?? null;
        const valueIssue = problems.get(r.code) ?? null;
        const { lab, problem: uIssue } = labUncertainty(r.uncertainty);
        // A result outside its plausible range gets no scores, only the reason.
        const scored = valueIssue ? null : scoresOf(x, lab, uIssue);
        // One plain literal with every field in one order (no spreads): V8 then gives all
        // scores one hidden class and builds them on its fast path.
        const score: ParticipantScore = {
          code: r.code,
          result: x,
          replicates: r.values.length,
          replicateSd: sd,
          scoreKind,
          hints: [],
          excluded: ex,
          u: lab?.u ?? null,
          z: scored?.z ?? null,
          zPrime: scored?.zPrime ?? null,
          zeta: scored?.zeta ?? null,
          en: scored?.en ?? null,
          d: scored?.d ?? null,
          dPct: scored?.dPct ?? null,
          signal: scored?.signal ?? null,
        };
        const notScored = valueIssue ?? scored?.notScored ?? null;
        if (notScored) score.notScored = notScored;
        return score;
      });
      out.push({
        testItemId: item.id,
        itemCode: item.code,
        measurandId: m.id,
        measurandKey: m.key,
        measurandName: m.name,
        unit: m.unit,
        decimals: m.decimals,
        n: included.length,
        method: c.method,
        iterations: c.iterations,
        assignedValue: xpt,
        robustSd: c.robustSd,
        uAssigned: u,
        sigmaPt: sigma,
        uNegligible: c.uNegligible,
        sigmaPtRule: sigmaRule,
        assignedValueRule: m.assignedValueRule,
        constants: { ...EVALUATION_CONSTANTS, minResults: m.minParticipants },
        warnings: c.warnings,
        participants,
      });
    }
  }
  addHints(out);
  return out;
}

/**
 * Blunder hints (shared/stats blunderHints) for size measurands (unit nm), with the lab's PDI
 * and the consensus PDI of the same item where the round has a 'pdi' measurand.
 */
function addHints(groups: ItemMeasurandEvaluation[]): void {
  for (const g of groups) {
    if (g.unit !== 'nm' || g.assignedValue === null) continue;
    const pdiGroup = groups.find((o) => o.testItemId === g.testItemId && o.measurandKey === 'pdi');
    const pdiByCode = new Map(pdiGroup?.participants.map((p) => [p.code, p.result]) ?? []);
    for (const p of g.participants) {
      if (p.notScored?.code === 'value-out-of-range') continue;
      let hints: ReturnType<typeof blunderHints> = [];
      try {
        hints = blunderHints({
          result: p.result,
          assignedValue: g.assignedValue,
          sigmaPt: g.sigmaPt ?? undefined,
          pdi: pdiByCode.get(p.code),
          assignedPdi: pdiGroup?.assignedValue ?? undefined,
        });
      } catch {
        hints = [];
      }
      (p as { hints: ParticipantScore['hints'] }).hints = hints.map((h) => ({
        code: h.code,
        message: h.message,
      }));
    }
  }
}
