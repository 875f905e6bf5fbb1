/**
 * Parser for a measured correlation function exported as text: two columns, lag time (s) and
 * g2 − 1 (dimensionless). Pure function, no I/O (the caller reads the file). Quoting and line
 * ends through the shared CSV reader (shared/files/csv.ts).
 */

import { CsvSyntaxError, firstContentLine, readCsv } from '../files/csv';

/** A parsed correlation function, ready for cumulantsFit. */
export interface CorrelationData {
  /** Lag times τ, s (strictly increasing). */
  lagTimesS: number[];
  /** g2(τ) − 1, dimensionless. */
  g2Minus1: number[];
  /** The header line if the file had one (first non-comment line that is not numeric). */
  header: string | null;
}

/** Error naming the offending line (1-based, as an editor shows it). */
export class CorrelationCsvError extends Error {
  constructor(
    readonly line: number,
    message: string,
  ) {
    super(line > 0 ? `line ${line}: ${message}` : message);
    this.name = 'CorrelationCsvError';
  }
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

function parseNumber(field: string, allowDecimalComma: boolean): number | null {
  let s = field.trim();
  if (allowDecimalComma && !s.includes('.')) s = s.replace(',', '.');
  if (!NUMBER.test(s)) return null;
  return Number(s);
}

/**
 * Parses two-column correlation data: lag time in seconds, then g2 − 1.
 *
 * - Delimiter: tab, semicolon or comma, detected from the first data line (in that order of
 *   preference). With tab or semicolon delimiters a decimal comma is accepted ("1,5E-06").
 * - An optional header line (first non-empty, non-comment line that is not numeric) is kept.
 * - Empty lines and lines starting with `#` are skipped; a UTF-8 byte-order mark is ignored.
 * - Lag times must be finite, ≥ 0 and strictly increasing; values must be finite.
 * @param text file content
 * @returns lag times (s), g2 − 1, header
 * @throws CorrelationCsvError naming the line (1-based) of the first problem
 */
export function parseCorrelationCsv(text: string): CorrelationData {
  const records = read(text);
  const lagTimesS: number[] = [];
  const g2Minus1: number[] = [];
  let header: string | null = null;
  let delimiter: string | null = null;
  let seenContent = false;

  for (const { line: lineNo, fields: all, delimiter: delim, raw } of records) {
    const fields = [...all];
    // A trailing delimiter ("1e-6;0.8;") leaves an empty last field: tolerate it.
    if (fields.length === 3 && fields[2] === '') fields.pop();
    const allowComma = delim !== ',';
    const tau = fields.length === 2 ? parseNumber(fields[0]!, allowComma) : null;
    const g = fields.length === 2 ? parseNumber(fields[1]!, allowComma) : null;

    if (!seenContent) {
      seenContent = true;
      if (tau === null || g === null) {
        const looksNumeric = fields.some((f) => parseNumber(f, allowComma) !== null);
        if (!looksNumeric) {
          header = raw;
          continue;
        }
      }
    }
    delimiter = delim;
    if (fields.length !== 2) {
      throw new CorrelationCsvError(
        lineNo,
        `expected 2 columns (lag time in s, g2 − 1) separated by "${printable(delimiter)}", found ${fields.length}`,
      );
    }
    if (tau === null)
      throw new CorrelationCsvError(lineNo, `lag time "${fields[0]}" is not a number`);
    if (g === null)
      throw new CorrelationCsvError(lineNo, `g2 − 1 value "${fields[1]}" is not a number`);
    if (!Number.isFinite(tau) || tau < 0) {
      throw new CorrelationCsvError(
        lineNo,
        `lag time must be a finite number ≥ 0 s, got ${fields[0]}`,
      );
    }
    if (!Number.isFinite(g))
      throw new CorrelationCsvError(lineNo, `g2 − 1 must be finite, got ${fields[1]}`);
    const prev = lagTimesS[lagTimesS.length - 1];
    if (prev !== undefined && !(tau > prev)) {
      throw new CorrelationCsvError(lineNo, `lag times must increase (${fields[0]} after ${prev})`);
    }
    lagTimesS.push(tau);
    g2Minus1.push(g);
  }
  if (lagTimesS.length === 0)
    throw new CorrelationCsvError(
      0,
      'no data rows found (expected two columns: lag time in s, g2 − 1)',
    );
  return { lagTimesS, g2Minus1, header };
}

interface Row {
  readonly line: number;
  readonly fields: string[];
  readonly delimiter: string;
  /** The line as written (trimmed), kept for a header. */
  readonly raw: string;
}

/**
 * Records through the shared CSV reader. A first line that has no number in it is a header, read
 * with its own delimiter; the data use the delimiter of the first data line.
 */
function read(text: string): Row[] {
  const opts = { comment: '#', trim: true } as const;
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  const rows = (delimiter: string): Row[] => {
    try {
      return readCsv(text, { ...opts, delimiter }).map((r) => ({
        ...r,
        delimiter,
        raw: (lines[r.line - 1] ?? '').trim(),
      }));
    } catch (e) {
      if (e instanceof CsvSyntaxError)
        throw new CorrelationCsvError(e.line, 'a quoted field is not closed');
      throw e;
    }
  };
  const first = firstContentLine(text, '#');
  if (first === '') return [];
  const own = rows(detectDelimiter(first));
  const head = own[0]!;
  const isHeader = !head.fields.some((f) => parseNumber(f, head.delimiter !== ',') !== null);
  if (!isHeader || own.length < 2) return own;
  const data = rows(detectDelimiter(own[1]!.raw));
  return [head, ...data.filter((r) => r.line > head.line)];
}

function detectDelimiter(line: string): string {
  if (line.includes('\t')) return '\t';
  if (line.includes(';')) return ';';
  return ',';
}

function printable(delim: string): string {
  return delim === '\t' ? 'tab' : delim;
}
