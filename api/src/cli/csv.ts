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
  for (let i = 0; i < src.length; i++) {
    const c = src[i];
    if (inQuotes) {
      if (c === '"') {
        if (src[i + 1] === '"') {
          field += '"';
          i++;
        } else {
          inQuotes = false;
        }
      } else {
        if (c === '\n') line++;
        field += c;
      }
      continue;
    }
    if (c === '"') {
      inQuotes = true;
      wasQuoted = true;
    } else if (c === ',') {
      fields.push(field);
      field = '';
    } else if (c === '\n' || c === '\r') {
      if (c === '\r' && src[i + 1] === '\n') i++;
      endRecord();
      line++;
      recordLine = line;
    } else {
      field += c;
    }
  }
  if (inQuotes) throw new SyntaxError(`line ${recordLine}: a quoted field is not closed`);
  if (field !== '' || fields.length > 0 || wasQuoted) endRecord();
  return out;
}
