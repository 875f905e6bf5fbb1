/**
 * Pure helpers of the precision study page: rebuild the shared function's input from the server's
 * answer, add the coordinator's decisions that are not stored yet (so the browser recomputes at
 * once with `analysePrecisionStudy`), group the open flags per cell, and map results to charts.
 */
import type {
  PrecisionAnalysis,
  PrecisionCellResult,
  PrecisionClassification,
  PrecisionDecisionInput,
  PrecisionExclusion,
  PrecisionFitCandidate,
  PrecisionLevelResult,
  PrecisionPending,
  PrecisionStudyInput,
  PrecisionTest,
} from '@ringlet/shared/contracts/precision';
import { PRECISION_TEST_LABELS } from '@ringlet/shared/contracts/precision';
import type { FittedCurve, MandelBar } from '@ringlet/shared/charts/precision-level-charts';
import type { SignalKind } from '../core/signal-badge';

/**
 * The input of `analysePrecisionStudy` as the server built it: every replicate the labs submitted
 * is in the answer's cells (set-aside ones too), so the analysis can be recomputed from it alone.
 */
export function inputFromAnalysis(a: PrecisionAnalysis): PrecisionStudyInput {
  const levels = new Map<string, string>();
  const cells: PrecisionStudyInput['cells'] = [];
  for (const m of a.measurands) {
    for (const l of m.levels) {
      levels.set(l.itemCode, l.itemLabel);
      for (const c of l.cells) {
        cells.push({
          itemCode: l.itemCode,
          measurandKey: m.key,
          participantCode: c.participantCode,
          values: c.replicates.map((r) => r.value),
        });
      }
    }
  }
  return {
    round: a.round,
    decisionsOpen: a.decisionsOpen,
    levels: [...levels].map(([itemCode, label]) => ({ itemCode, label })),
    measurands: a.measurands.map((m) => ({
      key: m.key,
      label: m.label,
      unit: m.unit,
      decimals: m.decimals,
      replicatesRequired: m.replicatesRequired,
    })),
    cells,
    references: a.references,
    exclusions: a.exclusions,
  };
}

/** Id prefix of decisions the browser added and the server has not stored yet. */
export const LOCAL_ID_PREFIX = '00000000-0000-4000-8000-';

/**
 * Adds decisions not stored yet as decisions in force. Their time is after every stored one (the
 * browser's clock may lag the server's), so each replaces a stored decision on the same target.
 */
export function withDecisions(
  input: PrecisionStudyInput,
  decisions: readonly PrecisionDecisionInput[],
  now: Date = new Date(),
): PrecisionStudyInput {
  const latest = Math.max(now.getTime(), ...input.exclusions.map((e) => Date.parse(e.at) || 0));
  const added: PrecisionExclusion[] = decisions.map((d, i) => ({
    id: `${LOCAL_ID_PREFIX}${String(i + 1).padStart(12, '0')}`,
    itemCode: d.itemCode,
    measurandKey: d.measurandKey,
    participantCode: d.participantCode,
    replicate: d.replicate ?? null,
    kind: d.kind,
    decision: d.decision,
    reason: d.reason,
    actorName: null,
    at: new Date(latest + 1 + i).toISOString(),
    withdrawnAt: null,
    withdrawnByName: null,
    withdrawnReason: null,
  }));
  return { ...input, exclusions: [...input.exclusions, ...added] };
}

/** Open flags of one cell: what the coordinator decides on in one dialog. */
export interface PendingCell {
  readonly itemCode: string;
  readonly itemLabel: string;
  readonly measurandKey: string;
  readonly measurandLabel: string;
  readonly participantCode: string;
  /** The worst classification among the cell's open flags. */
  readonly classification: Exclude<PrecisionClassification, 'accepted'>;
  readonly tests: readonly PrecisionTest[];
  /** Cochran's candidate replicate (the one farthest from the cell mean), or null. */
  readonly suspectReplicate: number | null;
}

/** Groups the open flags per cell, in the order the analysis lists them. */
export function pendingCells(a: PrecisionAnalysis): PendingCell[] {
  const out = new Map<string, PendingCell>();
  const labels = (p: PrecisionPending) => {
    const m = a.measurands.find((x) => x.key === p.measurandKey);
    const l = m?.levels.find((x) => x.itemCode === p.itemCode);
    return { measurandLabel: m?.label ?? p.measurandKey, itemLabel: l?.itemLabel ?? p.itemCode };
  };
  for (const p of a.pending) {
    const key = JSON.stringify([p.itemCode, p.measurandKey, p.participantCode]);
    const was = out.get(key);
    if (!was) {
      out.set(key, {
        itemCode: p.itemCode,
        measurandKey: p.measurandKey,
        participantCode: p.participantCode,
        ...labels(p),
        classification: p.classification,
        tests: [p.test],
        suspectReplicate: p.suspectReplicate,
      });
    } else {
      out.set(key, {
        ...was,
        classification: was.classification === 'outlier' ? 'outlier' : p.classification,
        tests: was.tests.includes(p.test) ? was.tests : [...was.tests, p.test],
        suspectReplicate: was.suspectReplicate ?? p.suspectReplicate,
      });
    }
  }
  return [...out.values()];
}

/** Test names for a list, e.g. "Cochran's C, Grubbs (single)". */
export function testNames(tests: readonly PrecisionTest[]): string {
  return tests.map((t) => PRECISION_TEST_LABELS[t]).join(', ');
}

/** ISO 5725 classes shown with the signal look: accepted teal circle, straggler saffron triangle, outlier carmine diamond. */
export const CLASS_SIGNAL: Readonly<Record<PrecisionClassification, SignalKind>> = {
  accepted: 'acceptable',
  straggler: 'warning',
  outlier: 'action',
};
export const CLASS_WORDS: Readonly<Record<PrecisionClassification, string>> = {
  accepted: 'Accepted',
  straggler: 'Straggler',
  outlier: 'Outlier',
};

/** A number with fixed decimals, or an em dash. */
export function fix(v: number | null | undefined, decimals: number): string {
  return v === null || v === undefined || !Number.isFinite(v)
    ? '—'
    : v.toFixed(Math.min(10, Math.max(0, decimals)));
}

/** Mandel's h or k per cell for the charts (cells set aside are left out). */
export function mandelBars(level: PrecisionLevelResult, statistic: 'h' | 'k'): MandelBar[] {
  return level.cells
    .filter((c) => !c.excluded)
    .map((c) => ({ code: c.participantCode, value: c[statistic] }));
}

/** The replicates of a cell as text; set-aside values in brackets. */
export function replicatesText(c: PrecisionCellResult, decimals: number): string {
  return c.replicates
    .map((r) => (r.excluded ? `[${fix(r.value, decimals)}]` : fix(r.value, decimals)))
    .join(' · ');
}

/** The fitted relation as a function of m (lg = log10), for drawing. */
export function curveOf(c: PrecisionFitCandidate): FittedCurve {
  const p = c.parameters;
  const at = (name: string) => p[name] ?? Number.NaN;
  switch (c.relation) {
    case 'constant':
      return { name: c.equation, fn: () => at('c') };
    case 'proportional':
      return { name: c.equation, fn: (m) => at('b') * m };
    case 'linear':
      return { name: c.equation, fn: (m) => at('a') + at('b') * m };
    case 'log-linear':
      return { name: c.equation, fn: (m) => 10 ** (at('c') + at('d') * Math.log10(m)) };
  }
}
