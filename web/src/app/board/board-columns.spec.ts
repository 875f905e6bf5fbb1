import type { ColDef, ColGroupDef } from 'ag-grid-community';
import type { BoardCell, BoardData } from '@ringlet/shared/contracts/evaluation';
import { type BoardGridRow, boardColumns, boardRows, hintText } from './board-columns';

// Invented demo numbers; only the board's layout is under test here.
const cell = (over: Partial<BoardCell> = {}): BoardCell => ({
  result: 101.234,
  sd: 0.41,
  u: 1.2,
  z: 0.5,
  zPrime: 0.45,
  zeta: 0.3,
  en: 0.2,
  signal: 'acceptable',
  ...over,
});
const board = (over: Partial<BoardData> = {}): BoardData => ({
  roundId: '0b6a7c1e-2d3f-4a5b-8c9d-0e1f2a3b4c5d',
  roundCode: 'R-07',
  roundTitle: 'Latex 100 nm',
  evaluationId: '5c4b3a29-1807-4f6e-9d5c-4b3a29180706',
  version: 1,
  state: 'draft',
  publishedAt: null,
  groups: [
    {
      itemCode: 'A',
      measurandName: 'Z-average',
      unit: 'nm',
      decimals: 1,
      n: 2,
      assignedValue: 100,
      uAssigned: 0.5,
      sigmaPt: 3,
      scoreKind: 'zPrime',
    } as BoardData['groups'][number],
  ],
  rows: [
    { code: 'P01', cells: [cell()] },
    { code: 'P02', cells: [null] },
  ],
  ownCodes: ['P02'],
  labNames: {},
  canRevealNames: false,
  ...over,
});

describe('board columns', () => {
  it('marks the own row and names labs only when revealed', () => {
    const rows = boardRows(board({ labNames: { P01: 'Lab North' } }));
    expect(rows.map((r) => [r.code, r.lab, r.own])).toEqual([
      ['P01', 'Lab North', false],
      ['P02', '', true],
    ]);
    expect(boardColumns(board()).map((c) => c.headerName)).toEqual([
      'Participant code',
      'A · Z-average (nm)',
    ]);
    expect(boardColumns(board({ labNames: { P01: 'Lab North' } }))[1]!.headerName).toBe('Lab');
  });

  it("heads the score column by the group's score kind and rounds by its decimals", () => {
    const group = boardColumns(board())[1] as ColGroupDef<BoardGridRow>;
    const children = group.children as ColDef<BoardGridRow>[];
    expect(children.map((c) => c.headerName)).toEqual([
      'Result (nm)',
      'Replicate SD',
      'z′',
      'ζ',
      'En',
      'Signal',
      'Hints',
    ]);
    const format = children[0]!.valueFormatter as (p: { value: number | null }) => string;
    expect(format({ value: 101.234 })).toBe('101.2');
    expect(format({ value: null })).toBe('—');
  });

  it('says in words why a cell is not scored, what is suspected and whether it is excluded', () => {
    expect(hintText(null)).toBe('');
    expect(hintText(cell({ hints: ['unit-slip', 'other'], excluded: true }))).toBe(
      'unit?; other; excluded from x_pt',
    );
  });
});
