/**
 * Reads round rows from a CSV or xlsx file and validates them, naming the row and column of
 * every problem. Row numbers are those a spreadsheet shows (header = row 1).
 */
import { readFile } from 'node:fs/promises';
import { extname } from 'node:path';
import type { ResultRow } from '../../../shared/stats/evaluate-round';
import type { Cell } from 'exceljs';
import { CliInputError } from './cli-error';
import { readCsv } from '../../../shared/files/csv';

export const REQUIRED_COLUMNS = ['participant', 'item', 'measurand', 'replicate', 'value'] as const;
const OPTIONAL_NUMERIC = ['uncertainty', 'k'] as const;

/** One raw table row: its spreadsheet row number and cell texts or numbers. */
export interface RawRow {
  readonly row: number;
  readonly cells: readonly (string | number | null)[];
}

export interface RawTable {
  readonly header: readonly string[];
  readonly rows: readonly RawRow[];
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Reads a .csv or .xlsx file into a raw table (first worksheet for xlsx). */
export async function readTable(file: string): Promise<RawTable> {
  const ext = extname(file).toLowerCase();
  if (ext !== '.csv' && ext !== '.xlsx') {
    throw new CliInputError(
      `${file}: unsupported file type "${ext || '(none)'}" (use .csv or .xlsx)`,
    );
  }
  let bytes: Buffer;
  try {
    bytes = await readFile(file);
  } catch (e) {
    throw new CliInputError(
      `${file}: cannot be read (${(e as NodeJS.ErrnoException).code ?? String(e)})`,
    );
  }
  return ext === '.csv' ? csvTable(file, bytes.toString('utf8')) : xlsxTable(file, bytes);
}

function csvTable(file: string, text: string): RawTable {
  let records;
  try {
    records = readCsv(text);
  } catch (e) {
    throw new CliInputError(`${file}: ${(e as Error).message}`);
  }
  if (records.length === 0) throw new CliInputError(`${file}: the file is empty (no header row)`);
  const [head, ...body] = records;
  return { header: head.fields, rows: body.map((r) => ({ row: r.line, cells: r.fields })) };
}

async function xlsxTable(file: string, bytes: Buffer): Promise<RawTable> {
  // Loaded only for workbooks: exceljs takes longer to load than a CSV round takes to evaluate.
  const { default: ExcelJS } = await import('exceljs');
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(bytes as unknown as ArrayBuffer);
  } catch (e) {
    throw new CliInputError(`${file}: not a readable xlsx workbook (${(e as Error).message})`);
  }
  const ws = wb.worksheets[0];
  if (ws === undefined) throw new CliInputError(`${file}: the workbook has no worksheet`);
  let header: string[] | null = null;
  const rows: RawRow[] = [];
  ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
    const cells: (string | number | null)[] = [];
    for (let c = 1; c <= row.cellCount; c++) cells.push(cellContent(row.getCell(c)));
    if (header === null) header = cells.map((v) => (v === null ? '' : String(v)));
    else rows.push({ row: rowNumber, cells });
  });
  if (header === null)
    throw new CliInputError(`${file}: worksheet "${ws.name}" is empty (no header row)`);
  return { header, rows };
}

/** Numbers stay numbers; formulas give their cached result; everything else its text. */
function cellContent(cell: Cell): string | number | null {
  const v = cell.value;
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return v;
  if (typeof v === 'object' && 'result' in v) {
    const r = (v as { result?: unknown }).result;
    if (typeof r === 'number') return r;
    if (r === undefined || r === null) return null;
    return String(r);
  }
  return cell.text;
}

/**
 * Validates a raw table into result rows.
 * @throws CliInputError naming the row and column: missing column, empty code, non-numeric
 *   value, duplicate replicate.
 */
export function toResultRows(table: RawTable, file = 'input'): ResultRow[] {
  const norm = table.header.map((h) => h.trim().toLowerCase());
  const col = (name: string) => norm.indexOf(name);
  const missing = REQUIRED_COLUMNS.filter((c) => col(c) < 0);
  if (missing.length > 0) {
    throw new CliInputError(
      `${file}, row 1 (header): missing column${missing.length > 1 ? 's' : ''} ${missing
        .map((m) => `"${m}"`)
        .join(', ')} (found: ${table.header.map((h) => `"${h}"`).join(', ')})`,
    );
  }
  const idx = {
    participant: col('participant'),
    item: col('item'),
    measurand: col('measurand'),
    replicate: col('replicate'),
    value: col('value'),
    uncertainty: col(OPTIONAL_NUMERIC[0]),
    k: col(OPTIONAL_NUMERIC[1]),
  };
  const seen = new Map<string, number>();
  const out: ResultRow[] = [];
  for (const r of table.rows) {
    const text = (i: number): string => {
      const v = i < r.cells.length ? r.cells[i] : null;
      return v === null ? '' : String(v).trim();
    };
    const required = (name: 'participant' | 'item' | 'measurand' | 'replicate'): string => {
      const t = text(idx[name]);
      if (t === '') throw new CliInputError(`${file}, row ${r.row}, column "${name}": empty`);
      return t;
    };
    const num = (
      name: 'value' | 'uncertainty' | 'k',
      i: number,
      optional: boolean,
    ): number | undefined => {
      const raw = i < r.cells.length ? r.cells[i] : null;
      if (typeof raw === 'number') {
        if (Number.isFinite(raw)) return raw;
      } else {
        const t = raw === null ? '' : raw.trim();
        if (t === '' && optional) return undefined;
        if (NUMBER.test(t)) return Number(t);
      }
      throw new CliInputError(
        `${file}, row ${r.row}, column "${name}": ${raw === null || raw === '' ? 'empty' : `"${String(raw)}" is not a number`}`,
      );
    };
    const participant = required('participant');
    const item = required('item');
    const measurand = required('measurand');
    const replicate = required('replicate');
    const value = num('value', idx.value, false) as number;
    const key = [participant, item, measurand, replicate].join('\u0000');
    const earlier = seen.get(key);
    if (earlier !== undefined) {
      throw new CliInputError(
        `${file}, row ${r.row}, column "replicate": replicate ${replicate} of ${participant} / ${item} / ${measurand} already given in row ${earlier}`,
      );
    }
    seen.set(key, r.row);
    const row: { -readonly [K in keyof ResultRow]: ResultRow[K] } = {
      participant,
      item,
      measurand,
      replicate,
      value,
    };
    if (idx.uncertainty >= 0) {
      const u = num('uncertainty', idx.uncertainty, true);
      if (u !== undefined) {
        if (u < 0)
          throw new CliInputError(
            `${file}, row ${r.row}, column "uncertainty": must not be negative`,
          );
        row.uncertainty = u;
      }
    }
    if (idx.k >= 0) {
      const k = num('k', idx.k, true);
      if (k !== undefined) {
        if (!(k > 0))
          throw new CliInputError(`${file}, row ${r.row}, column "k": must be positive`);
        row.k = k;
      }
    }
    out.push(row);
  }
  if (out.length === 0) throw new CliInputError(`${file}: no data rows below the header`);
  return out;
}
