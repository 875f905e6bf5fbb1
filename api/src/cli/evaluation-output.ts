/**
 * Builds the command's JSON documents (the exact shapes the CLI promises) and the readable
 * text tables.
 */
import type { RoundEvaluation } from '../../../shared/stats/evaluate-round';
import type { PrecisionResult } from '../../../shared/stats/precision';

export interface PtParticipantJson {
  code: string;
  result: number;
  z: number | null;
  zPrime: number | null;
  signal: string | null;
}
export interface PtEvaluationJson {
  item: string;
  measurand: string;
  n: number;
  method: 'algorithm-a';
  iterations: number;
  assignedValue: number;
  robustSd: number;
  uAssigned: number;
  sigmaPt: number | null;
  uNegligible: boolean | null;
  participants: PtParticipantJson[];
}
export interface PtJson {
  evaluations: PtEvaluationJson[];
}

export type PrecisionEntryJson = { item: string; measurand: string } & PrecisionResult;
export interface PrecisionJson {
  precision: PrecisionEntryJson[];
}

/** The `--mode pt` document, keys in the documented order and nothing else. */
export function ptJson(round: RoundEvaluation): PtJson {
  return {
    evaluations: round.evaluations.map((e) => ({
      item: e.item,
      measurand: e.measurand,
      n: e.n,
      method: e.method,
      iterations: e.iterations,
      assignedValue: e.assignedValue,
      robustSd: e.robustSd,
      uAssigned: e.uAssigned,
      sigmaPt: e.sigmaPt,
      uNegligible: e.uNegligible,
      participants: e.participants.map((p) => ({
        code: p.code,
        result: p.result,
        z: p.z,
        zPrime: p.zPrime,
        signal: p.signal,
      })),
    })),
  };
}

/** Plain-language notes for stderr, one per evaluation warning. */
export function ptWarnings(round: RoundEvaluation): string[] {
  const text: Record<string, string> = {
    'few-results':
      'fewer than 12 results: a robust consensus is weak; consider a reference value or a fixed σ_pt',
    'too-few-values': 'fewer than 3 results: Algorithm A was not run (x* = median)',
    'zero-spread': 's* = 0 (half or more of the results identical): choose σ_pt with --sigma-pt',
    'not-converged': 'Algorithm A did not converge in 1000 iterations',
    'sigma-pt-unavailable': 'σ_pt could not be set by the chosen rule: no scores',
    'u-not-negligible': 'u(x_pt) > 0.3·σ_pt: the signal follows z′',
  };
  const out: string[] = [];
  for (const e of round.evaluations) {
    for (const w of e.warnings) out.push(`${e.item} / ${e.measurand}: ${text[w] ?? w}`);
  }
  return out;
}

/** Number for a text table: 6 significant digits, "–" for none. */
export function fmt(v: number | null | undefined, digits = 6): string {
  if (v === null || v === undefined) return '–';
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e-4 && a < 1e9) {
    const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(a)));
    return v.toFixed(Math.min(decimals, 12));
  }
  return v.toPrecision(digits);
}

/** Scores with two decimals (they are read against 2 and 3), "–" for none. */
export function fixed2(v: number | null): string {
  return v === null ? '–' : v.toFixed(2);
}

/** Left-aligned text columns, right-aligned number columns. */
export function textTable(head: string[], rows: string[][], numeric: boolean[]): string {
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) =>
    cells
      .map((c, i) => (numeric[i] ? c.padStart(widths[i]) : c.padEnd(widths[i])))
      .join('  ')
      .trimEnd();
  return [line(head), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

export function ptTable(doc: PtJson): string {
  const blocks = doc.evaluations.map((e) => {
    const title =
      `${e.item} / ${e.measurand}: p = ${e.n}, x_pt = ${fmt(e.assignedValue)} (Algorithm A, ${e.iterations} iterations), ` +
      `s* = ${fmt(e.robustSd)}, u(x_pt) = ${fmt(e.uAssigned)}, σ_pt = ${fmt(e.sigmaPt)}, ` +
      `u(x_pt) ${e.uNegligible === null ? '–' : e.uNegligible ? 'negligible' : 'NOT negligible (signal from z′)'}`;
    const rows = e.participants.map((p) => [
      p.code,
      fmt(p.result),
      fixed2(p.z),
      fixed2(p.zPrime),
      p.signal ?? '–',
    ]);
    return `${title}\n${textTable(['participant', 'result', 'z', 'z′', 'signal'], rows, [false, true, true, true, false])}`;
  });
  return blocks.join('\n\n') + '\n';
}

export function precisionTable(doc: PrecisionJson): string {
  const blocks = doc.precision.map((e) => {
    const lines = [
      `${e.item} / ${e.measurand}: p = ${e.p}, results = ${e.totalResults}, mean = ${fmt(e.generalMean)}`,
      `  s_r = ${fmt(e.sr)}, s_L = ${fmt(e.sL)}${e.isSLTruncated ? ' (s_L² < 0 set to 0)' : ''}, s_R = ${fmt(e.sR)}, r = ${fmt(
        e.repeatabilityLimit,
      )}, R = ${fmt(e.reproducibilityLimit)}, s_d² = ${fmt(e.betweenMeanSquare)}`,
    ];
    if (e.cochran) {
      lines.push(
        `  Cochran C = ${fmt(e.cochran.C, 4)} (cell ${e.cochran.cellCode}; 5 % ${fmt(e.cochran.critical5, 4)}, 1 % ${fmt(
          e.cochran.critical1,
          4,
        )}): ${e.cochran.classification}`,
      );
    }
    for (const [label, g] of [
      ['Grubbs single high', e.grubbs.singleHigh],
      ['Grubbs single low', e.grubbs.singleLow],
      ['Grubbs double high', e.grubbs.doubleHigh],
      ['Grubbs double low', e.grubbs.doubleLow],
    ] as const) {
      if (g) {
        lines.push(
          `  ${label} G = ${fmt(g.G, 4)} (${g.cellCodes.join(', ')}; 5 % ${fmt(g.critical5, 4)}, 1 % ${fmt(
            g.critical1,
            4,
          )}): ${g.classification}`,
        );
      }
    }
    for (const w of e.warnings) lines.push(`  note: ${w}`);
    const rows = e.cells.map((c) => [
      c.code,
      String(c.n),
      fmt(c.mean),
      fmt(c.sd),
      fmt(c.h, 3),
      fmt(c.k, 3),
    ]);
    lines.push(
      textTable(['participant', 'n', 'mean', 'sd', 'h', 'k'], rows, [
        false,
        true,
        true,
        true,
        true,
        true,
      ]),
    );
    return lines.join('\n');
  });
  return blocks.join('\n\n') + '\n';
}
