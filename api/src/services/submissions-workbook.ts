import ExcelJS from 'exceljs';
import { Submission } from '../../../db/entities';
import type { SheetIssue, WorkbookUploadResult } from '../../../shared/contracts/bench';
import { SAFETY_CAUTIONS } from '../../../shared/contracts/bench';
import {
  type ItemResults,
  MeasurementConditions,
  readStoredSubmission,
  SubmissionData,
  Uncertainty,
} from '../../../shared/contracts/submission';
import { checkResults } from '../../../shared/bench/submission-checks';
import type { SessionUser } from '../auth/session-user';
import { conflict, ServiceError, ruleBroken } from './errors';
import { findEnrolment, lockState } from './bench';
import type { AppContext } from './context';
import { formatBytes, RESULTS_WORKBOOK_LIMIT } from '../../../shared/contracts/upload-limits';
import type { CellOut, SheetOut } from '../workers/file-jobs';
import { runInWorker, transferable } from '../workers/pool';
import { detectPackagedType } from './attachments';
import { lockSubmission, replaceDraft, roundRules } from './submissions';

/** Condition columns of the "Conditions" sheet, in order (B onwards; A is the item code). */
const CONDITION_COLUMNS: {
  key: keyof MeasurementConditions | 'methodNotes';
  header: string;
  numeric: boolean;
}[] = [
  { key: 'instrument', header: 'Instrument', numeric: false },
  { key: 'laserWavelengthNm', header: 'Laser wavelength (nm)', numeric: true },
  { key: 'scatteringAngleDeg', header: 'Scattering angle (°)', numeric: true },
  { key: 'temperatureC', header: 'Temperature (°C)', numeric: true },
  { key: 'equilibrationMin', header: 'Equilibration (min)', numeric: true },
  { key: 'dispersant', header: 'Dispersant', numeric: false },
  { key: 'viscosityMPas', header: 'Viscosity (mPa·s)', numeric: true },
  { key: 'refractiveIndex', header: 'Refractive index', numeric: true },
  { key: 'dilution', header: 'Dilution', numeric: false },
  { key: 'filterPoreUm', header: 'Filter pore size (µm)', numeric: true },
  { key: 'cuvette', header: 'Cuvette', numeric: false },
  { key: 'methodNotes', header: 'Method notes', numeric: false },
];

/** Spreadsheet formulas in user text are neutralised on export (docs/QUALITY.md). */
export function safeText(s: string): string {
  return /^[=+\-@\t\r]/.test(s) ? `'${s}` : s;
}

const colLetter = (n: number) => {
  let s = '';
  for (let c = n; c > 0; c = Math.floor((c - 1) / 26))
    s = String.fromCharCode(65 + ((c - 1) % 26)) + s;
  return s;
};

/** GET /rounds/{id}/submission/template.xlsx: the round's results sheet, prefilled with the draft. */
export async function buildTemplate(
  ctx: AppContext,
  labId: string,
  roundId: string,
): Promise<{ buffer: Buffer; fileName: string }> {
  const em = ctx.ds.manager;
  const { round, enrolment } = await findEnrolment(em, labId, roundId);
  const rules = await roundRules(em, roundId, round.protocolTemperatureC);
  const sub = await em.findOne(Submission, {
    select: { id: true, draft: true },
    where: { enrolmentId: enrolment.id },
  });
  const draft = readStoredSubmission(sub?.draft);
  const runs = Math.max(1, ...rules.measurands.map((m) => m.replicatesRequired));

  const wb = new ExcelJS.Workbook();
  wb.creator = 'Ringlet';
  const readme = wb.addWorksheet('Read me');
  readme.getColumn(1).width = 110;
  [
    `Round ${round.code}: ${round.title}. Participant code ${enrolment.participantCode}.`,
    `Protocol temperature ${round.protocolTemperatureC} °C. Results lock at ${(round.resultsDueAt ?? enrolment.extensionUntil)?.toISOString() ?? 'the round close'}.`,
    'Fill the "Results" sheet (one row per test item and measurand, one column per replicate) and the "Conditions" sheet, then upload this file on the Lab bench.',
    'Do not change the item codes, measurand file codes or sheet names. Uncertainty type: standard or expanded (give k for expanded).',
    '',
    'Safety:',
    ...SAFETY_CAUTIONS,
  ].forEach((line) => readme.addRow([line]));

  const results = wb.addWorksheet('Results');
  const header = [
    'Item',
    'Measurand file code',
    'Measurand',
    'Unit',
    ...Array.from({ length: runs }, (_, i) => `Replicate ${i + 1}`),
    'Uncertainty type',
    'Uncertainty',
    'k',
  ];
  results.addRow(header).font = { bold: true };
  for (const item of rules.items) {
    const di = draft.items.find((i) => i.testItemId === item.id);
    for (const m of rules.measurands) {
      const r = di?.results.find((x) => x.measurandId === m.id);
      const reps = Array.from({ length: runs }, (_, i) => r?.replicates[i] ?? null);
      results.addRow([
        item.code,
        m.key,
        m.name,
        m.unit,
        ...reps,
        r?.uncertainty?.kind ?? null,
        r?.uncertainty?.value ?? null,
        r?.uncertainty?.k ?? null,
      ]);
    }
  }
  results.columns.forEach((c, i) => (c.width = i < 4 ? 16 : 12));
  results.views = [{ state: 'frozen', xSplit: 4, ySplit: 1 }];

  const cond = wb.addWorksheet('Conditions');
  cond.addRow(['Item', ...CONDITION_COLUMNS.map((c) => c.header)]).font = { bold: true };
  for (const item of rules.items) {
    const di = draft.items.find((i) => i.testItemId === item.id);
    const c =
      di?.conditions ?? MeasurementConditions.parse({ temperatureC: round.protocolTemperatureC });
    cond.addRow([
      item.code,
      ...CONDITION_COLUMNS.map((col) => {
        const v = col.key === 'methodNotes' ? (di?.methodNotes ?? '') : c[col.key];
        return typeof v === 'string' ? safeText(v) : (v ?? null);
      }),
    ]);
  }
  cond.columns.forEach((c) => (c.width = 18));
  const buffer = Buffer.from(await wb.xlsx.writeBuffer());
  return { buffer, fileName: `${round.code}-${enrolment.participantCode}-results.xlsx` };
}

/** A worksheet as the upload worker read it, addressed by row and column (1-based). */
class Sheet {
  private readonly byRow = new Map<number, CellOut[]>();
  constructor(readonly data: SheetOut) {
    for (const [r, cells] of data.rows) this.byRow.set(r, cells);
  }
  get name(): string {
    return this.data.name;
  }
  cell(row: number, col: number): CellOut {
    return col < 1 ? null : (this.byRow.get(row)?.[col - 1] ?? null);
  }
  /** The header cells of row 1 as text, indexed by column (1-based). */
  headers(): string[] {
    const out: string[] = [];
    (this.byRow.get(1) ?? []).forEach(
      (v, i) => (out[i + 1] = asText(typeof v === 'object' && v !== null ? v.result : v)),
    );
    return out;
  }
  eachRow(fn: (r: number) => void): void {
    for (const [r] of this.data.rows) fn(r);
  }
}

/** A plain cell value (the worker hands over strings, numbers, booleans, dates or null). */
function cellString(v: unknown): string {
  if (v === null || v === undefined) return '';
  if (v instanceof Date) return v.toISOString();
  return typeof v === 'object' ? JSON.stringify(v) : String(v as string | number | boolean);
}

function asText(v: unknown): string {
  if (v === null) return '';
  const s = cellString(v).trim();
  return s.startsWith("'") ? s.slice(1) : s;
}

/**
 * POST /rounds/{id}/submission/upload.xlsx: reads the filled template into the draft, with the same
 * checks and messages as the form; every problem names its sheet, row and column.
 */
export async function uploadWorkbook(
  ctx: AppContext,
  actor: SessionUser,
  labId: string,
  roundId: string,
  file: Buffer | undefined,
): Promise<WorkbookUploadResult> {
  if (!file)
    throw new ServiceError(
      400,
      'validation_failed',
      'file: attach the filled workbook (multipart field "file").',
      [{ path: 'file', message: 'Attach a file.' }],
    );
  if (file.length > RESULTS_WORKBOOK_LIMIT.maxBytes) {
    throw new ServiceError(
      413,
      'file_too_large',
      `file: the limit is ${formatBytes(RESULTS_WORKBOOK_LIMIT.maxBytes)} for a ${RESULTS_WORKBOOK_LIMIT.label}.`,
      [{ path: 'file', message: 'Too large.' }],
    );
  }
  if (detectPackagedType(file)?.kind !== 'xlsx') {
    throw new ServiceError(
      415,
      'file_type_refused',
      'file: upload the .xlsx workbook downloaded from this round.',
      [{ path: 'file', message: 'XLSX only.' }],
    );
  }
  const em = ctx.ds.manager;
  const { round } = await findEnrolment(em, labId, roundId);
  const rules = await roundRules(em, roundId, round.protocolTemperatureC);
  // Row, cell and unpacked-size limits first, then the reading: both in an upload worker thread.
  const { sheets } = await runInWorker<{ sheets: SheetOut[] }>(
    { type: 'xlsx', data: transferable(file), limit: RESULTS_WORKBOOK_LIMIT },
    RESULTS_WORKBOOK_LIMIT.label,
  );
  const issues: SheetIssue[] = [];
  /** Where each value of the results came from, to name the cell of a check's message. */
  const cells = new Map<string, { sheet: string; row: number; column: string }>();
  const at = (sheet: string, row: number, col: number) => ({
    sheet,
    row,
    column: `${colLetter(col)}`,
  });
  const sheetNamed = (name: string) => {
    const data = sheets.find((x) => x.name === name);
    return data ? new Sheet(data) : undefined;
  };
  const resultsWs = sheetNamed('Results');
  const condWs = sheetNamed('Conditions');
  if (!resultsWs)
    throw ruleBroken(
      'workbook_invalid',
      'file: the workbook has no "Results" sheet; start from the template.',
      [{ sheet: 'Results', row: 0, column: '', message: 'Sheet missing.' }],
    );

  const headers = resultsWs.headers();
  /** A cell's value; a formula is refused with a message naming the cell (results are typed, never computed here). */
  const value = (ws: Sheet, r: number, c: number, header: string | undefined): unknown => {
    const v = ws.cell(r, c);
    if (v !== null && typeof v === 'object') {
      issues.push({
        ...at(ws.name, r, c),
        message: `${ws.name} row ${r}, column ${colLetter(c)}${header ? ` (${header})` : ''}: the cell holds a formula (${v.formula.slice(0, 60)}); type the value itself.`,
      });
      return null;
    }
    return v;
  };
  const runCols = headers
    .map((h, i) => (/^(Replicate|Run) \d+$/.test(h ?? '') ? i : -1))
    .filter((i) => i > 0);
  // workbooks downloaded before the glossary say "Run n" instead of "Replicate n"; both are read
  const col = (name: string) => headers.indexOf(name);
  const items = rules.items.map((i) => ({
    testItemId: i.id,
    results: [] as ItemResults['results'],
    conditions: MeasurementConditions.parse({}),
    methodNotes: '',
  }));

  const num = (sheet: string, row: number, c: number, v: unknown): number | null => {
    if (v === null || v === '') return null;
    const n = typeof v === 'number' ? v : Number(cellString(v).replace(',', '.'));
    if (!Number.isFinite(n)) {
      issues.push({
        ...at(sheet, row, c),
        message: `${sheet} row ${row}, column ${colLetter(c)} (${headers[c] ?? ''}): "${cellString(v)}" is not a number.`,
      });
      return null;
    }
    return n;
  };

  resultsWs.eachRow((r) => {
    if (r === 1) return;
    const code = asText(value(resultsWs, r, 1, headers[1]));
    const key = asText(value(resultsWs, r, 2, headers[2]));
    if (!code && !key) return;
    const ii = rules.items.findIndex((i) => i.code === code);
    const m = rules.measurands.find((x) => x.key === key);
    if (ii < 0)
      return void issues.push({
        ...at('Results', r, 1),
        message: `Results row ${r}, column A: "${code}" is not a test item of this round.`,
      });
    if (!m)
      return void issues.push({
        ...at('Results', r, 2),
        message: `Results row ${r}, column B: "${key}" is not a measurand of this round.`,
      });
    const target = items[ii]!;
    const ri = target.results.length;
    const replicates = runCols
      .slice(0, Math.max(m.replicatesRequired, runCols.length))
      .map((c, k) => {
        cells.set(`items.${ii}.results.${ri}.replicates.${k}`, at('Results', r, c));
        return num('Results', r, c, value(resultsWs, r, c, headers[c]));
      });
    while (
      replicates.length &&
      replicates[replicates.length - 1] === null &&
      replicates.length > m.replicatesRequired
    )
      replicates.pop();
    cells.set(`items.${ii}.results.${ri}.replicates`, at('Results', r, runCols[0] ?? 5));
    let uncertainty: Uncertainty | null = null;
    const kindRaw = asText(
      value(resultsWs, r, col('Uncertainty type'), 'Uncertainty type'),
    ).toLowerCase();
    const uVal = num(
      'Results',
      r,
      col('Uncertainty'),
      value(resultsWs, r, col('Uncertainty'), 'Uncertainty'),
    );
    const kVal = num('Results', r, col('k'), value(resultsWs, r, col('k'), 'k'));
    if (kindRaw || uVal !== null) {
      const parsed = Uncertainty.safeParse({ kind: kindRaw || 'standard', value: uVal, k: kVal });
      if (parsed.success) uncertainty = parsed.data;
      else {
        const issue = parsed.error.issues[0]!;
        const c =
          issue.path[0] === 'kind'
            ? col('Uncertainty type')
            : issue.path[0] === 'k'
              ? col('k')
              : col('Uncertainty');
        issues.push({
          ...at('Results', r, c),
          message: `Results row ${r}, column ${colLetter(c)} (${headers[c]}): ${issue.path[0] === 'kind' ? 'use standard or expanded.' : issue.message}`,
        });
      }
    }
    target.results.push({ measurandId: m.id, replicates, uncertainty });
  });

  if (condWs) {
    const condHeaders = condWs.headers();
    condWs.eachRow((r) => {
      if (r === 1) return;
      const code = asText(value(condWs, r, 1, condHeaders[1]));
      if (!code) return;
      const ii = rules.items.findIndex((i) => i.code === code);
      if (ii < 0)
        return void issues.push({
          ...at('Conditions', r, 1),
          message: `Conditions row ${r}, column A: "${code}" is not a test item of this round.`,
        });
      const raw: Record<string, unknown> = {};
      CONDITION_COLUMNS.forEach((cc, k) => {
        const c = condHeaders.indexOf(cc.header) > 0 ? condHeaders.indexOf(cc.header) : k + 2;
        cells.set(`items.${ii}.conditions.${cc.key}`, at('Conditions', r, c));
        const v = value(condWs, r, c, condHeaders[c]);
        raw[cc.key] = cc.numeric ? num('Conditions', r, c, v) : asText(v);
      });
      const { methodNotes, ...conditions } = raw;
      const parsed = MeasurementConditions.safeParse(conditions);
      if (!parsed.success) {
        for (const issue of parsed.error.issues) {
          const where = cells.get(`items.${ii}.conditions.${String(issue.path[0])}`)!;
          issues.push({
            ...where,
            message: `Conditions row ${r}, column ${where.column} (${condHeaders[CONDITION_COLUMNS.findIndex((x) => x.key === issue.path[0]) + 2] ?? ''}): ${issue.message}`,
          });
        }
      } else items[ii]!.conditions = parsed.data;
      items[ii]!.methodNotes = cellString(methodNotes ?? '').slice(0, 4000);
    });
  }

  return ctx.ds.transaction(async (tx) => {
    const { round: r2, enrolment } = await findEnrolment(tx, labId, roundId);
    const lock = lockState(r2, enrolment);
    if (!lock.isOpen)
      throw conflict('submission_locked', `Results can no longer change: ${lock.reason}`);
    const sub = await lockSubmission(tx, enrolment.id);
    const previous = readStoredSubmission(sub.draft);
    const data: SubmissionData = SubmissionData.parse({
      items: items.filter((i) => i.results.length > 0),
      acknowledgedWarnings: previous.acknowledgedWarnings,
      explanation: previous.explanation,
    });
    const outcome = checkResults(data, rules, false);
    for (const e of outcome.errors) {
      // Paths in the checks index data.items, which kept only items with results: map back by id.
      const ii = rules.items.findIndex(
        (i) => i.id === data.items[Number(e.path.split('.')[1])]?.testItemId,
      );
      const path = e.path.replace(/^items\.\d+/, `items.${ii}`);
      const where = cells.get(path) ??
        cells.get(path.replace(/\.\d+$/, '')) ?? { sheet: 'Results', row: 0, column: '' };
      issues.push({
        ...where,
        message: `${where.sheet} row ${where.row}, column ${where.column}: ${e.message}`,
      });
    }
    if (issues.length) {
      throw ruleBroken(
        'workbook_invalid',
        `${issues[0]!.message}${issues.length > 1 ? ` (and ${issues.length - 1} more)` : ''}`,
        issues,
      );
    }
    const draftRevision = await replaceDraft(tx, actor, sub.id, data, 'workbook');
    return {
      draftRevision,
      data,
      warnings: outcome.warnings.map((w) => ({ code: w.code, path: w.path, message: w.message })),
    };
  });
}
