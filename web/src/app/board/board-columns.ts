import type { ColDef, ColGroupDef } from 'ag-grid-community';
import type { BoardCell, BoardData, BoardRow } from '@ringlet/shared/contracts/evaluation';
import { SignalCell } from './signal-cell';

/** A board row as the grid shows it: the lab's name when revealed, and whether it is the user's. */
export interface BoardGridRow extends BoardRow {
  lab: string;
  own: boolean;
}

export type BoardColumn = ColDef<BoardGridRow> | ColGroupDef<BoardGridRow>;

const HINT_WORDS: Record<string, string> = {
  'radius-diameter': 'radius/diameter?',
  'unit-slip': 'unit?',
  'viscosity-temperature': 'viscosity/temperature?',
  'dust-aggregates': 'dust?',
};

/** The board's rows: one per participant code, the lab's name when revealed, the user's own marked. */
export function boardRows(b: BoardData): BoardGridRow[] {
  const own = new Set(b.ownCodes);
  return b.rows.map((r) => ({ ...r, lab: b.labNames[r.code] ?? '', own: own.has(r.code) }));
}

/** A cell's hints in words: why it is not scored, what the checks suspect, whether it is excluded. */
export function hintText(c: BoardCell | null): string {
  if (!c) return '';
  return [
    ...(c.notScored ? [c.notScored] : []),
    ...(c.hints ?? []).map((h) => HINT_WORDS[h] ?? h),
    ...(c.excluded ? ['excluded from x_pt'] : []),
  ].join('; ');
}

/** A number with the group's decimals, a dash when there is none. */
const fixed = (digits: number) => (p: { value: number | null | undefined }) =>
  p.value === null || p.value === undefined ? '—' : p.value.toFixed(digits);

/** The columns of one item × measurand: result, replicate SD, the scores, signal and hints. */
function groupColumns(g: BoardData['groups'][number], gi: number): ColGroupDef<BoardGridRow> {
  const unit = g.unit ? ` (${g.unit})` : '';
  const cell = (r: BoardGridRow | undefined) => r?.cells[gi] ?? null;
  const number = (
    key: string,
    headerName: string,
    digits: number,
    value: (c: BoardCell) => number | null | undefined,
    width?: number,
  ): ColDef<BoardGridRow> => ({
    colId: `g${gi}-${key}`,
    headerName,
    type: 'rightAligned',
    ...(width ? { width } : {}),
    valueGetter: (p) => {
      const c = cell(p.data);
      return c ? (value(c) ?? null) : null;
    },
    valueFormatter: fixed(digits),
  });
  return {
    headerName: `${g.itemCode} · ${g.measurandName}${unit}`,
    marryChildren: true,
    children: [
      number('result', `Result${unit}`, g.decimals, (c) => c.result),
      number('sd', 'Replicate SD', g.decimals + 1, (c) => c.sd),
      number('score', g.scoreKind === 'z' ? 'z' : 'z′', 2, (c) =>
        g.scoreKind === 'z' ? c.z : c.zPrime,
      ),
      number('zeta', 'ζ', 2, (c) => c.zeta, 74),
      number('en', 'En', 2, (c) => c.en, 74),
      {
        colId: `g${gi}-signal`,
        headerName: 'Signal',
        width: 122,
        filter: 'agTextColumnFilter',
        valueGetter: (p) => cell(p.data)?.signal ?? null,
        cellRenderer: SignalCell,
      },
      {
        colId: `g${gi}-hints`,
        headerName: 'Hints',
        width: 150,
        filter: 'agTextColumnFilter',
        valueGetter: (p) => hintText(cell(p.data)),
      },
    ],
  };
}

/** The board's columns: participant code (and lab when revealed) pinned, then one group per item × measurand. */
export function boardColumns(b: BoardData): BoardColumn[] {
  const cols: BoardColumn[] = [
    {
      field: 'code',
      headerName: 'Participant code',
      pinned: 'left',
      width: 160,
      filter: 'agTextColumnFilter',
      sort: 'asc',
      valueFormatter: (p) => (p.data?.own ? `${p.value} (your lab)` : String(p.value)),
    },
  ];
  if (Object.keys(b.labNames).length > 0) {
    cols.push({
      field: 'lab',
      headerName: 'Lab',
      pinned: 'left',
      width: 180,
      filter: 'agTextColumnFilter',
    });
  }
  b.groups.forEach((g, gi) => cols.push(groupColumns(g, gi)));
  return cols;
}
