/**
 * The Consensus board (codes only) built from an evaluation record: one row per participant
 * code, one cell per item × measurand. Numbers are rounded to 6 significant digits for the
 * screen; the stored record keeps full precision.
 */
import type {
  BoardCell,
  BoardGroup,
  BoardRow,
  ItemMeasurandEvaluation,
} from '../contracts/evaluation';

/** Rounds to `digits` significant digits (null stays null). */
export function sig(v: number | null, digits = 6): number | null {
  if (v === null || !Number.isFinite(v) || v === 0) return v;
  return Number(v.toPrecision(digits));
}

export interface BoardBody {
  groups: BoardGroup[];
  rows: BoardRow[];
}

export function buildBoard(results: readonly ItemMeasurandEvaluation[]): BoardBody {
  const groups: BoardGroup[] = results.map((r) => ({
    itemCode: r.itemCode,
    measurandKey: r.measurandKey,
    measurandName: r.measurandName,
    unit: r.unit,
    decimals: r.decimals,
    n: r.n,
    assignedValue: sig(r.assignedValue),
    uAssigned: sig(r.uAssigned),
    sigmaPt: sig(r.sigmaPt),
    scoreKind: r.uNegligible === false ? 'zPrime' : 'z',
  }));
  const rowsByCode = new Map<string, BoardRow>();
  results.forEach((r, gi) => {
    for (const p of r.participants) {
      let row = rowsByCode.get(p.code);
      if (!row)
        rowsByCode.set(
          p.code,
          (row = { code: p.code, cells: new Array<BoardCell | null>(results.length).fill(null) }),
        );
      const cell: BoardCell = {
        result: sig(p.result)!,
        sd: sig(p.replicateSd),
        u: sig(p.u),
        z: sig(p.z, 4),
        zPrime: sig(p.zPrime, 4),
        zeta: sig(p.zeta, 4),
        en: sig(p.en, 4),
        signal: p.signal,
      };
      if (p.hints.length > 0) cell.hints = p.hints.map((h) => h.code);
      if (p.excluded !== null) cell.excluded = true;
      if (p.notScored) cell.notScored = p.notScored.message;
      row.cells[gi] = cell;
    }
  });
  const rows = [...rowsByCode.values()].sort((a, b) =>
    a.code < b.code ? -1 : a.code > b.code ? 1 : 0,
  );
  return { groups, rows };
}
