import { sniffFileType } from '../../../shared/files/file-type';
import { CsvSyntaxError, readCsv } from '../../../shared/files/csv';
import { formatCount, STUDY_FILE_LIMIT } from '../../../shared/contracts/upload-limits';
import { ServiceError, ruleBroken } from './errors';
import { countLines, type SheetOut } from '../workers/file-jobs';
import { runInWorker, transferable } from '../workers/pool';

/**
 * Rows of cells from an uploaded CSV or XLSX file (first worksheet). Limits first
 * (STUDY_FILE_LIMIT): a CSV's lines are counted on the bytes before it is split; an XLSX is checked
 * and read in an upload worker thread.
 */
export async function readRows(buffer: Buffer, filename: string): Promise<string[][]> {
  const isXlsx = sniffFileType(buffer) === 'zip';
  if (isXlsx) {
    const { sheets } = await runInWorker<{ sheets: SheetOut[] }>(
      { type: 'xlsx', data: transferable(buffer), limit: STUDY_FILE_LIMIT },
      STUDY_FILE_LIMIT.label,
    );
    const ws = sheets[0];
    if (!ws) throw ruleBroken('file_empty', 'file: the workbook has no worksheet.');
    return ws.rows.map(([, cells]) =>
      cells.map((v) =>
        v === null
          ? ''
          : typeof v === 'object'
            ? v.result === null
              ? ''
              : String(v.result)
            : String(v),
      ),
    );
  }
  if (buffer.includes(0))
    throw ruleBroken('file_type', `file: ${filename} is neither CSV text nor an XLSX workbook.`);
  const lines = countLines(buffer);
  if (lines > STUDY_FILE_LIMIT.maxRows) {
    throw new ServiceError(
      413,
      'too_many_rows',
      `file: ${formatCount(lines)} lines; a ${STUDY_FILE_LIMIT.label} has at most ${formatCount(STUDY_FILE_LIMIT.maxRows)} rows.`,
      [{ path: 'file', message: `At most ${formatCount(STUDY_FILE_LIMIT.maxRows)} rows.` }],
    );
  }
  const text = buffer.toString('utf8').replace(/^\uFEFF/, '');
  const sep =
    text.includes(';') && !text.includes(',')
      ? ';'
      : text.includes('\t') && !text.includes(',')
        ? '\t'
        : ',';
  try {
    return readCsv(text, { delimiter: sep, trim: true }).map((r) => r.fields);
  } catch (e) {
    if (e instanceof CsvSyntaxError) throw ruleBroken('file_value', `file: ${e.message}.`);
    throw e;
  }
}

const num = (s: string) => (s.trim() === '' ? NaN : Number(s.trim()));

/**
 * Homogeneity file: one row per item, the first cell labels the item, the following cells are its
 * replicate results (unit of the measurand). A first row whose result cells are not numbers is a
 * header and is skipped.
 */
export function homogeneityFromRows(rows: string[][]): { items: number[][] } {
  const body = rows.filter(
    (r, i) => !(i === 0 && r.slice(1).some((c) => c.trim() !== '' && Number.isNaN(num(c)))),
  );
  const items = body.map((r, i) => {
    const values = r
      .slice(1)
      .filter((c) => c.trim() !== '')
      .map(num);
    if (values.some((v) => !Number.isFinite(v)))
      throw ruleBroken(
        'file_value',
        `file: row ${i + 1} (${r[0] ?? ''}) has a value that is not a number.`,
      );
    return values;
  });
  return { items };
}

/**
 * Stability file: rows "occasion, result"; the occasion is "first"/"before"/"1" or
 * "second"/"after"/"2". A header row is skipped.
 */
export function stabilityFromRows(rows: string[][]): { first: number[]; second: number[] } {
  const first: number[] = [];
  const second: number[] = [];
  rows.forEach((r, i) => {
    const occasion = (r[0] ?? '').trim().toLowerCase();
    const value = num(r[1] ?? '');
    if (i === 0 && Number.isNaN(value)) return;
    if (!Number.isFinite(value))
      throw ruleBroken('file_value', `file: row ${i + 1} has a value that is not a number.`);
    if (['first', 'before', '1'].includes(occasion)) first.push(value);
    else if (['second', 'after', '2'].includes(occasion)) second.push(value);
    else
      throw ruleBroken(
        'file_value',
        `file: row ${i + 1}: occasion "${r[0]}" is not first/before/1 or second/after/2.`,
      );
  });
  return { first, second };
}
