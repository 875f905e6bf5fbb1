import { formatBytes, formatCount, type SheetLimit } from '../../../shared/contracts/upload-limits';
import { FileRefusal } from './refusal';
import { inflateEntry, listZipEntries, ZipError, type ZipEntry } from './zip';

/**
 * The cheap check before a spreadsheet is parsed: unpacks every part of the XLSX as a stream
 * (memory: one 64 KB chunk), counts the bytes it unpacks to and the rows and cells of each
 * worksheet, and refuses the file with a 413 naming the limit as soon as one is passed.
 */
export async function scanXlsx(
  buf: Buffer,
  limit: SheetLimit,
): Promise<{ rows: number; cells: number; unpackedBytes: number }> {
  let entries: ZipEntry[];
  try {
    entries = listZipEntries(buf);
  } catch (err) {
    throw unreadable(err);
  }
  const declared = entries.reduce((s, e) => s + e.uncompressedSize, 0);
  if (declared > limit.maxUnpackedBytes) throw tooBigUnpacked(limit);
  const names = await sheetNames(buf, entries);

  let unpacked = 0;
  let totalRows = 0;
  let totalCells = 0;
  for (const e of entries) {
    const isSheet = /^xl\/worksheets\/[^/]+\.xml$/.test(e.name);
    const counter = isSheet ? new TagCounter() : null;
    // Set inside the callback; the cast stops TypeScript narrowing it to `null` after the await.
    let refusal = null as FileRefusal | null;
    try {
      await inflateEntry(buf, e, (chunk) => {
        unpacked += chunk.length;
        if (unpacked > limit.maxUnpackedBytes) {
          refusal = tooBigUnpacked(limit);
          return false;
        }
        if (counter) {
          counter.add(chunk);
          if (counter.rows > limit.maxRows) {
            refusal = tooManyRows(limit, names.get(e.name) ?? e.name);
            return false;
          }
          if (totalCells + counter.cells > limit.maxCells) {
            refusal = tooManyCells(limit);
            return false;
          }
        }
        return true;
      });
    } catch (err) {
      throw unreadable(err);
    }
    if (refusal) throw refusal;
    if (counter) {
      counter.finish();
      if (counter.rows > limit.maxRows) throw tooManyRows(limit, names.get(e.name) ?? e.name);
      totalRows += counter.rows;
      totalCells += counter.cells;
      if (totalCells > limit.maxCells) throw tooManyCells(limit);
    }
  }
  return { rows: totalRows, cells: totalCells, unpackedBytes: unpacked };
}

const ROW = /<(?:[A-Za-z_][\w.-]*:)?row[\s>/]/g;
const CELL = /<(?:[A-Za-z_][\w.-]*:)?c[\s>/]/g;
const TAIL = 40;

/** Counts `<row` and `<c` start tags across chunk boundaries (each tag counted once). */
class TagCounter {
  rows = 0;
  cells = 0;
  private carry = '';

  add(chunk: Buffer): void {
    const text = this.carry + chunk.toString('latin1');
    const stop = Math.max(0, text.length - TAIL);
    this.count(text, stop);
    this.carry = text.slice(stop);
  }

  finish(): void {
    this.count(this.carry, this.carry.length);
    this.carry = '';
  }

  /** Counts tags that start before `stop`; later ones are counted with the next chunk. */
  private count(text: string, stop: number): void {
    for (const re of [ROW, CELL]) {
      re.lastIndex = 0;
      let m: RegExpExecArray | null;
      let n = 0;
      while ((m = re.exec(text)) && m.index < stop) n++;
      if (re === ROW) this.rows += n;
      else this.cells += n;
    }
  }
}

/** Worksheet part → the sheet's name a person sees, from xl/workbook.xml and its relationships. */
async function sheetNames(buf: Buffer, entries: ZipEntry[]): Promise<Map<string, string>> {
  const read = async (name: string, max: number): Promise<string> => {
    const e = entries.find((x) => x.name === name);
    if (!e) return '';
    const parts: Buffer[] = [];
    let n = 0;
    await inflateEntry(buf, e, (c) => {
      parts.push(c);
      n += c.length;
      return n < max;
    });
    return Buffer.concat(parts).toString('utf8');
  };
  const names = new Map<string, string>();
  try {
    const wb = await read('xl/workbook.xml', 1024 * 1024);
    const rels = await read('xl/_rels/workbook.xml.rels', 1024 * 1024);
    const targets = new Map<string, string>();
    for (const m of rels.matchAll(/<Relationship\b[^>]*>/g)) {
      const id = /\bId="([^"]+)"/.exec(m[0])?.[1];
      const target = /\bTarget="([^"]+)"/.exec(m[0])?.[1];
      if (id && target) targets.set(id, target.replace(/^\/?(xl\/)?/, 'xl/'));
    }
    for (const m of wb.matchAll(/<(?:\w+:)?sheet\b[^>]*>/g)) {
      const name = /\bname="([^"]+)"/.exec(m[0])?.[1];
      const id = /\br:id="([^"]+)"/.exec(m[0])?.[1];
      const target = id ? targets.get(id) : undefined;
      if (name && target)
        names.set(
          target,
          `"${name
            .replace(/&amp;/g, '&')
            .replace(/&quot;/g, '"')
            .replace(/&lt;/g, '<')
            .replace(/&gt;/g, '>')}"`,
        );
    }
  } catch {
    // names are for messages only
  }
  return names;
}

function unreadable(err: unknown): FileRefusal {
  const why = err instanceof ZipError ? ` (${err.message})` : '';
  return new FileRefusal(
    400,
    'workbook_unreadable',
    `file: the workbook could not be read${why}. Save it again as .xlsx and upload that file.`,
  );
}

function tooBigUnpacked(limit: SheetLimit): FileRefusal {
  return new FileRefusal(
    413,
    'file_too_large',
    `file: the ${limit.label} unpacks to more than ${formatBytes(limit.maxUnpackedBytes)}; the limit is ${formatBytes(limit.maxUnpackedBytes)} unpacked.`,
    [{ path: 'file', message: `At most ${formatBytes(limit.maxUnpackedBytes)} unpacked.` }],
  );
}

function tooManyRows(limit: SheetLimit, sheet: string): FileRefusal {
  return new FileRefusal(
    413,
    'too_many_rows',
    `file: sheet ${sheet} has more than ${formatCount(limit.maxRows)} rows; a ${limit.label} has at most ${formatCount(limit.maxRows)} rows per sheet.`,
    [{ path: 'file', message: `At most ${formatCount(limit.maxRows)} rows per sheet.` }],
  );
}

function tooManyCells(limit: SheetLimit): FileRefusal {
  return new FileRefusal(
    413,
    'too_many_cells',
    `file: the ${limit.label} has more than ${formatCount(limit.maxCells)} cells; the limit is ${formatCount(limit.maxCells)} cells.`,
    [{ path: 'file', message: `At most ${formatCount(limit.maxCells)} cells.` }],
  );
}
