/**
 * The evaluate command as a function: arguments in, output text and exit code out (the entry
 * point evaluate.ts only writes them), so specs can run it in-process.
 */
import { evaluateRound, type ResultRow } from '../../../shared/stats/evaluate-round';
import { precisionAnalysis } from '../../../shared/stats/precision';
import { CliInputError } from './cli-error';
import {
  precisionTable,
  ptJson,
  ptTable,
  ptWarnings,
  type PrecisionJson,
} from './evaluation-output';
import { parseArgs, USAGE } from './parse-args';
import { readTable, toResultRows } from './read-rows';

export interface CommandOutput {
  readonly exitCode: number;
  readonly stdout: string;
  readonly stderr: string;
}

/** Groups rows per item × measurand into ISO 5725-2 cells (one per participant), input order. */
export function precisionCells(
  rows: readonly ResultRow[],
): { item: string; measurand: string; cells: { code: string; values: number[] }[] }[] {
  const groups = new Map<
    string,
    { item: string; measurand: string; byCode: Map<string, number[]> }
  >();
  for (const r of rows) {
    const key = r.item + '\u0000' + r.measurand;
    let g = groups.get(key);
    if (!g) {
      g = { item: r.item, measurand: r.measurand, byCode: new Map() };
      groups.set(key, g);
    }
    let vs = g.byCode.get(r.participant);
    if (!vs) {
      vs = [];
      g.byCode.set(r.participant, vs);
    }
    vs.push(r.value);
  }
  return [...groups.values()].map((g) => ({
    item: g.item,
    measurand: g.measurand,
    cells: [...g.byCode].map(([code, values]) => ({ code, values })),
  }));
}

export async function runEvaluate(argv: readonly string[]): Promise<CommandOutput> {
  try {
    const args = parseArgs(argv);
    if (args.help) return { exitCode: 0, stdout: USAGE + '\n', stderr: '' };
    const rows = toResultRows(await readTable(args.file), args.file);
    if (args.mode === 'pt') {
      const round = evaluateRound(rows, args.sigmaPt ? { sigmaPt: args.sigmaPt } : {});
      const doc = ptJson(round);
      const warnings = ptWarnings(round);
      return {
        exitCode: 0,
        stdout: args.format === 'json' ? JSON.stringify(doc) + '\n' : ptTable(doc),
        stderr: warnings.map((w) => `warning: ${w}\n`).join(''),
      };
    }
    const doc: PrecisionJson = {
      precision: precisionCells(rows).map((g) => ({
        item: g.item,
        measurand: g.measurand,
        ...precisionAnalysis(g.cells),
      })),
    };
    return {
      exitCode: 0,
      stdout: args.format === 'json' ? JSON.stringify(doc) + '\n' : precisionTable(doc),
      stderr: '',
    };
  } catch (e) {
    if (e instanceof CliInputError)
      return { exitCode: 2, stdout: '', stderr: `evaluate: ${e.message}\n` };
    if (e instanceof RangeError)
      return { exitCode: 2, stdout: '', stderr: `evaluate: ${e.message}\n` };
    return {
      exitCode: 1,
      stdout: '',
      stderr: `evaluate: unexpected failure: ${(e as Error).stack ?? String(e)}\n`,
    };
  }
}
