/**
 * The limits of every file upload, declared once: the server's upload rule enforces them, the error
 * messages and the API description quote them, and the browser can show them beside the picker.
 *
 * Sizes are project choices sized for the files these routes exist for (common practice, not from
 * a published source): a results workbook has one row per test item and measurand (at most 20 × 20
 * = 400 rows), a homogeneity study at most 100 items and a stability study at most 2 × 200 results
 * (shared/contracts/rounds.ts), and a DLS correlation function a few hundred lag times.
 */

const MB = 1024 * 1024;

export interface UploadLimit {
  /** What the file is, as a person reads it ("results workbook"). */
  label: string;
  /** The one multipart field that carries the file. */
  fileField: string;
  /** The other (text) fields the route knows; any other field name is refused. */
  textFields: readonly string[];
  /** Largest file, bytes. */
  maxBytes: number;
}

export interface SheetLimit extends UploadLimit {
  /** Most rows per worksheet (XLSX) or lines (CSV). */
  maxRows: number;
  /** Most cells in the whole workbook. */
  maxCells: number;
  /** Most bytes once the XLSX zip is unpacked (a small zip can unpack to gigabytes). */
  maxUnpackedBytes: number;
}

export const RESULTS_WORKBOOK_LIMIT: SheetLimit = {
  label: 'results workbook',
  fileField: 'file',
  textFields: ['labId'],
  maxBytes: 2 * MB,
  maxRows: 1000,
  maxCells: 50_000,
  maxUnpackedBytes: 32 * MB,
};

export const STUDY_FILE_LIMIT: SheetLimit = {
  label: 'homogeneity or stability file',
  fileField: 'file',
  textFields: ['kind', 'testItemId', 'measurandId', 'sigmaPt'],
  maxBytes: 2 * MB,
  maxRows: 500,
  maxCells: 25_000,
  maxUnpackedBytes: 32 * MB,
};

export interface AttachmentLimit extends UploadLimit {
  /** A correlation CSV with more lines is stored but not re-analysed. */
  maxCorrelationRows: number;
}

export const ATTACHMENT_LIMIT: AttachmentLimit = {
  label: 'raw-data file',
  fileField: 'file',
  textFields: ['testItemId', 'labId', 'laserWavelengthNm', 'scatteringAngleDeg'],
  maxBytes: 20 * MB,
  maxCorrelationRows: 10_000,
};

export const RECEIPT_PHOTO_LIMIT: UploadLimit = {
  label: 'receipt photo',
  fileField: 'photo',
  textFields: ['receivedOn', 'condition', 'notes', 'labId'],
  maxBytes: 8 * MB,
};

/** Longest text field in a multipart form (the receipt notes are at most 2,000 characters). */
export const MAX_TEXT_FIELD_BYTES = 16 * 1024;

/** Work on one uploaded file (unpacking, parsing, re-analysis) stops after this long. */
export const UPLOAD_WORK_TIMEOUT_MS = 20_000;

/** "2 MB", "20 MB", "512 KB". */
export function formatBytes(n: number): string {
  return n >= MB ? `${+(n / MB).toFixed(1)} MB` : `${Math.round(n / 1024)} KB`;
}

/** "1,000" (en-GB grouping, as the messages are written). */
export function formatCount(n: number): string {
  return n.toLocaleString('en-GB');
}

/** One line for the API description: "Limit 2 MB, 1,000 rows per sheet; multipart field `file`." */
export function describeLimit(limit: UploadLimit | SheetLimit): string {
  const rows =
    'maxRows' in limit
      ? `, ${formatCount(limit.maxRows)} rows per sheet, ${formatCount(limit.maxCells)} cells`
      : '';
  const other = limit.textFields.length
    ? `; other fields: ${limit.textFields.map((f) => `\`${f}\``).join(', ')}`
    : '';
  return `Limit ${formatBytes(limit.maxBytes)}${rows}. Multipart field \`${limit.fileField}\` (one file)${other}.`;
}
