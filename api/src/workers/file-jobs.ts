import ExcelJS from 'exceljs';
import { createHash } from 'node:crypto';
import { parseCorrelationCsv, type CorrelationData } from '../../../shared/dls';
import type { SheetLimit } from '../../../shared/contracts/upload-limits';
import { FileRefusal } from './refusal';
import { scanXlsx } from './sheet-scan';

/**
 * The heavy work on an uploaded file, run inside the upload worker thread (file-worker.ts) so the
 * server's event loop stays free. Inputs and outputs are plain data (structured clone).
 */

/** A cell as read: a value, or a formula with the result the spreadsheet last saved. */
export type CellOut =
  string | number | boolean | null | { formula: string; result: string | number | boolean | null };

export interface SheetOut {
  name: string;
  /** [row number (1-based), cells (index 0 = column A)] for each row that has any cell. */
  rows: [number, CellOut[]][];
}

export type FileJob =
  | { type: 'xlsx'; data: Uint8Array; limit: SheetLimit }
  | { type: 'text'; data: Uint8Array; maxCorrelationRows: number }
  /** Test hook: allocate without bound, to prove the memory limit ends the worker and not the server. */
  | { type: 'exhaust-memory' }
  /** Test hook: never finish, to prove the time limit. */
  | { type: 'spin' };

export type TextClass =
  | { kind: 'binary' }
  | { kind: 'text' }
  | { kind: 'correlation-csv'; data: CorrelationData }
  /** Looks like a correlation function but has more lines than the re-analysis reads. */
  | { kind: 'correlation-csv'; data: null; lines: number };

export interface TextJobResult {
  class: TextClass;
  sha256: string;
  /** The job's bytes, handed back. */
  bytes: Uint8Array;
}

export async function runJob(job: FileJob): Promise<unknown> {
  switch (job.type) {
    case 'xlsx':
      return readXlsx(
        Buffer.from(job.data.buffer, job.data.byteOffset, job.data.byteLength),
        job.limit,
      );
    case 'text': {
      // The bytes go back with the answer (transferred, not copied), with their checksum.
      const buf = Buffer.from(job.data.buffer, job.data.byteOffset, job.data.byteLength);
      const result: TextJobResult = {
        class: classifyText(buf, job.maxCorrelationRows),
        sha256: createHash('sha256').update(buf).digest('hex'),
        bytes: job.data,
      };
      return result;
    }
    case 'exhaust-memory': {
      const hold: number[][] = [];
      for (;;) hold.push(new Array<number>(1_000_000).fill(hold.length));
    }
    case 'spin':
      for (;;);
  }
}

function isDate(v: unknown): v is Date {
  return v instanceof Date;
}

function plain(v: unknown): string | number | boolean | null {
  if (v === null || v === undefined) return null;
  if (typeof v === 'string' || typeof v === 'number' || typeof v === 'boolean') return v;
  if (isDate(v)) return v.toISOString();
  if (typeof v === 'object') {
    if ('error' in v) return String((v as { error: string }).error);
    if ('richText' in v)
      return (v as ExcelJS.CellRichTextValue).richText.map((t) => t.text).join('');
    if ('text' in v) return plain((v as { text: unknown }).text);
    return JSON.stringify(v);
  }
  if (typeof v === 'bigint' || typeof v === 'symbol') return v.toString();
  return null; // a function is no cell content
}

function cellOut(cell: ExcelJS.Cell): CellOut {
  const v = cell.value;
  if (v && typeof v === 'object' && ('formula' in v || 'sharedFormula' in v)) {
    const f = v as ExcelJS.CellFormulaValue & { sharedFormula?: string };
    return { formula: `=${f.formula ?? f.sharedFormula ?? ''}`, result: plain(f.result) };
  }
  return plain(v);
}

/** Checks the limits on the packed file first (scanXlsx), then reads every worksheet into plain cells. */
export async function readXlsx(buf: Buffer, limit: SheetLimit): Promise<{ sheets: SheetOut[] }> {
  await scanXlsx(buf, limit);
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(buf as unknown as ArrayBuffer);
  } catch {
    throw new FileRefusal(
      400,
      'workbook_unreadable',
      'file: the workbook could not be read. Save it again as .xlsx and upload that file.',
    );
  }
  const sheets = wb.worksheets.map((ws) => {
    const rows: [number, CellOut[]][] = [];
    ws.eachRow((row, r) => {
      const cells: CellOut[] = [];
      row.eachCell({ includeEmpty: false }, (cell, c) => (cells[c - 1] = cellOut(cell)));
      for (let i = 0; i < cells.length; i++) if (cells[i] === undefined) cells[i] = null;
      rows.push([r, cells]);
    });
    return { name: ws.name, rows };
  });
  return { sheets };
}

/** Lines of a text file, counted on the bytes (no decoding). */
export function countLines(buf: Buffer): number {
  const nl = buf[buf.length - 1] === 0x0a ? 0 : 1;
  let n = 0;
  for (let i = buf.indexOf(0x0a); i >= 0; i = buf.indexOf(0x0a, i + 1)) n++;
  if (n === 0) for (let i = buf.indexOf(0x0d); i >= 0; i = buf.indexOf(0x0d, i + 1)) n++;
  return buf.length === 0 ? 0 : n + nl;
}

/**
 * Text or not, and whether it is a correlation function (two columns: lag time, g2 − 1). The
 * lines are counted before parsing: a file longer than the re-analysis reads is classified from
 * its first 200 lines and not parsed further.
 */
export function classifyText(buf: Buffer, maxCorrelationRows: number): TextClass {
  const text = new TextDecoder('utf-8', { fatal: false }).decode(buf);
  if (text.includes('\uFFFD')) return { kind: 'binary' }; // not valid UTF-8
  // eslint-disable-next-line no-control-regex -- looking for control bytes is the point
  if (/[\u0000-\u0008\u000B\u000E-\u001F\u007F]/.test(text)) return { kind: 'binary' };
  const lines = countLines(buf);
  if (lines > maxCorrelationRows) {
    const head = text.split(/\r\n|\r|\n/, 200).join('\n');
    try {
      parseCorrelationCsv(head);
      return { kind: 'correlation-csv', data: null, lines };
    } catch {
      return { kind: 'text' };
    }
  }
  try {
    return { kind: 'correlation-csv', data: parseCorrelationCsv(text) };
  } catch {
    return { kind: 'text' };
  }
}
