/**
 * A small RFC 4180 CSV reader: comma separated, double-quoted fields with "" escapes, CRLF or
 * LF line ends, optional UTF-8 byte-order mark. Returns records with their 1-based line number
 * (the row number a spreadsheet shows), skipping blank lines.
 */
export interface CsvRecord {
  readonly line: number;
  readonly fields: string[];
}

export function parseCsv(text: string): CsvRecord[] {
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const n = src.length;
  const out: CsvRecord[] = [];
  let fields: string[] = [];
  let field = '';
  let line = 1;
  let recordLine = 1;
  let inQuotes = false;
  let wasQuoted = false;
  const endRecord = () => {
    fields.push(field);
    if (!(fields.length === 1 && fields[0] === '' && !wasQuoted)) {
      out.push({ line: recordLine, fields });
    }
    fields = [];
    field = '';
    wasQuoted = false;
  };
  // Runs of plain characters are taken as one slice (not one string per character): a round of
  // 12,000 rows is parsed several times faster, with far less garbage.
  let i = 0;
  while (i < n) {
    if (inQuotes) {
      let j = i;
      while (j < n && src.charCodeAt(j) !== QUOTE) {
        if (src.charCodeAt(j) === LF) line++;
        j++;
      }
      field += src.slice(i, j);
      if (j >= n) break;
      if (src.charCodeAt(j + 1) === QUOTE) {
        field += '"';
        i = j + 2;
      } else {
        inQuotes = false;
        i = j + 1;
      }
      continue;
    }
    let j = i;
    let c = 0;
    while (j < n) {
      c = src.charCodeAt(j);
      if (c === COMMA || c === LF || c === CR || c === QUOTE) break;
      j++;
    }
    if (j > i) field = field === '' ? src.slice(i, j) : field + src.slice(i, j);
    if (j >= n) break;
    if (c === QUOTE) {
      inQuotes = true;
      wasQuoted = true;
      i = j + 1;
    } else if (c === COMMA) {
      fields.push(field);
      field = '';
      i = j + 1;
    } else {
      i = c === CR && src.charCodeAt(j + 1) === LF ? j + 2 : j + 1;
      endRecord();
      line++;
      recordLine = line;
    }
  }
  if (inQuotes) throw new SyntaxError(`line ${recordLine}: a quoted field is not closed`);
  if (field !== '' || fields.length > 0 || wasQuoted) endRecord();
  return out;
}

const QUOTE = 0x22;
const COMMA = 0x2c;
const LF = 0x0a;
const CR = 0x0d;
