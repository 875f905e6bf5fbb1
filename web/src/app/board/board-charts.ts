/** Turns board data into the shared chart builders' inputs (shared/charts), with table views. */
import type { BoardData } from '@ringlet/shared/contracts/evaluation';
import {
  densityOption,
  densityText,
  uncertaintyOption,
  uncertaintyText,
  youdenOption,
  youdenText,
  zBarsOption,
  zBarsText,
} from '@ringlet/shared/charts/board-charts';
import type { PanelChart } from './chart-panel';

export type BoardChart = PanelChart;

/** The charts of one item × measurand (group index gi) of a board. */
export function chartsFor(board: BoardData, gi: number): BoardChart[] {
  const g = board.groups[gi];
  if (!g || g.assignedValue === null || g.sigmaPt === null) return [];
  const own = new Set(board.ownCodes);
  const title = `${g.itemCode} · ${g.measurandName}`;
  const scoreName = g.scoreKind === 'z' ? 'z' : 'z′';
  const cells = board.rows
    .map((r) => ({ code: r.code, c: r.cells[gi] }))
    .filter((x): x is { code: string; c: NonNullable<typeof x.c> } => !!x.c);
  const d = g.decimals;
  const out: BoardChart[] = [];

  const bars = cells
    .filter((x) => x.c.signal !== null && (g.scoreKind === 'z' ? x.c.z : x.c.zPrime) !== null)
    .map((x) => ({
      code: x.code,
      score: (g.scoreKind === 'z' ? x.c.z : x.c.zPrime)!,
      signal: x.c.signal!,
      own: own.has(x.code),
    }));
  out.push({
    name: 'z-bars',
    caption: `${title}: ${scoreName}-scores`,
    option: zBarsOption(bars, `${title}: ${scoreName}-scores`, scoreName),
    text: zBarsText(bars, `${title}`, scoreName),
    table: {
      columns: ['code', scoreName, 'signal'],
      rows: [...bars]
        .sort((a, b) => a.score - b.score)
        .map((b) => [b.code, Number(b.score.toFixed(2)), b.signal]),
    },
  });

  const results = cells.map((x) => x.c.result);
  const ownResult = cells.find((x) => own.has(x.code))?.c.result;
  const dens = {
    results,
    assignedValue: g.assignedValue,
    sigmaPt: g.sigmaPt,
    unit: g.unit,
    own: ownResult,
  };
  out.push({
    name: 'density',
    caption: `${title}: distribution of results`,
    option: densityOption(dens, `${title}: kernel density`),
    text: densityText(dens, title),
    table: {
      columns: ['', `value${g.unit ? ' (' + g.unit + ')' : ''}`],
      rows: [
        ['x_pt', Number(g.assignedValue.toFixed(d + 1))],
        ['σ_pt', Number(g.sigmaPt.toFixed(d + 2))],
        ['x_pt − 3σ_pt', Number((g.assignedValue - 3 * g.sigmaPt).toFixed(d + 1))],
        ['x_pt − 2σ_pt', Number((g.assignedValue - 2 * g.sigmaPt).toFixed(d + 1))],
        ['x_pt + 2σ_pt', Number((g.assignedValue + 2 * g.sigmaPt).toFixed(d + 1))],
        ['x_pt + 3σ_pt', Number((g.assignedValue + 3 * g.sigmaPt).toFixed(d + 1))],
        ['results', results.length],
      ],
    },
  });

  if (cells.some((x) => x.c.u !== null)) {
    const pts = cells.map((x) => ({
      code: x.code,
      result: x.c.result,
      expandedU: x.c.u === null ? null : 2 * x.c.u,
      signal: x.c.signal ?? 'acceptable',
      own: own.has(x.code),
    }));
    out.push({
      name: 'uncertainty',
      caption: `${title}: results with uncertainty`,
      option: uncertaintyOption(
        pts,
        g.assignedValue,
        g.sigmaPt,
        g.unit,
        `${title}: results ± U (k = 2)`,
      ),
      text: uncertaintyText(pts, g.assignedValue, g.sigmaPt, g.unit, title),
      table: {
        columns: ['code', 'result', 'U (k = 2)'],
        rows: [...pts]
          .sort((a, b) => a.result - b.result)
          .map((p) => [
            p.code,
            Number(p.result.toFixed(d)),
            p.expandedU === null ? '—' : Number(p.expandedU.toFixed(d)),
          ]),
      },
    });
  }

  // Youden plot: the same measurand on the first two items (paired items).
  const pair = board.groups
    .map((x, i) => ({ x, i }))
    .filter(({ x }) => x.measurandKey === g.measurandKey);
  if (pair.length >= 2) {
    const [a, b] = [pair[0]!, pair[1]!];
    if (
      a.x.assignedValue !== null &&
      b.x.assignedValue !== null &&
      a.x.sigmaPt !== null &&
      b.x.sigmaPt !== null
    ) {
      const pts = board.rows
        .filter((r) => r.cells[a.i] && r.cells[b.i])
        .map((r) => ({
          code: r.code,
          a: r.cells[a.i]!.result,
          b: r.cells[b.i]!.result,
          own: own.has(r.code),
        }));
      const labels: [string, string] = [`item ${a.x.itemCode}`, `item ${b.x.itemCode}`];
      const t = `${g.measurandName}: Youden plot`;
      out.push({
        name: 'youden',
        caption: t,
        option: youdenOption(
          pts,
          a.x.assignedValue,
          b.x.assignedValue,
          a.x.sigmaPt,
          b.x.sigmaPt,
          labels,
          g.unit,
          t,
        ),
        text: youdenText(
          pts,
          a.x.assignedValue,
          b.x.assignedValue,
          a.x.sigmaPt,
          b.x.sigmaPt,
          labels,
          t,
        ),
        table: {
          columns: ['code', labels[0], labels[1]],
          rows: pts.map((p) => [p.code, Number(p.a.toFixed(d)), Number(p.b.toFixed(d))]),
        },
      });
    }
  }
  return out;
}
