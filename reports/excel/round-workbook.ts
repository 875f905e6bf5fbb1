/**
 * The round workbook (exceljs): a summary sheet, one sheet per test item × measurand with
 * participant codes, replicates, means, scores, signals and hints, and a homogeneity and
 * stability sheet. Numbers are stored as numbers with the measurand's decimals as the display
 * format (the cell keeps full precision); headers are frozen; every piece of user text goes
 * through neutraliseFormula so no formula runs when the file is opened.
 */
import { SIGNAL_RULE_TEXT } from '../../shared/charts/signals';
import { sigmaPtRuleWords } from '../../shared/contracts/rule-text';
import ExcelJS from 'exceljs';
import { EXCLUSION_RULE_LABELS } from '../../shared/contracts/evaluation';
import {
  HOMOGENEITY_DECISION_LABELS,
  STUDY_KIND_LABELS,
  type HomogeneityDecisionKind,
} from '../../shared/contracts/rounds';
import {
  METHOD_WORDS,
  recordChecksum,
  reportStatusWords,
  type ReportGroup,
  type RoundReportInput,
} from '../model';
import {
  hintWords,
  neutraliseFormula as t,
  numberFormat,
  SCORE_DECIMALS,
  SCORE_LABEL,
  SIGNAL_WORDS,
} from '../text';

const HEADER_FILL: ExcelJS.Fill = {
  type: 'pattern',
  pattern: 'solid',
  fgColor: { argb: 'FF1F3A5F' },
};
const HEADER_FONT: Partial<ExcelJS.Font> = { bold: true, color: { argb: 'FFFFFFFF' } };

/** Excel sheet names: at most 31 characters, none of : \ / ? * [ ], unique in the book. */
export function sheetName(raw: string, taken: Set<string>): string {
  const base =
    raw
      .replace(/[:\\/?*[\]]/g, ' ')
      .replace(/\s+/g, ' ')
      .trim()
      .slice(0, 28) || 'Sheet';
  let name = base;
  for (let i = 2; taken.has(name.toLowerCase()); i++) name = `${base.slice(0, 26)} ${i}`;
  taken.add(name.toLowerCase());
  return name;
}

function styleHeader(row: ExcelJS.Row): void {
  row.font = HEADER_FONT;
  row.fill = HEADER_FILL;
  row.alignment = { vertical: 'middle', wrapText: true };
}

function unitSuffix(unit: string): string {
  return unit ? ` (${unit})` : '';
}

/** Rows of the Summary's report block (label, value); dates are real dates. */
export const SUMMARY_INFO_ROWS = 12;

function summarySheet(wb: ExcelJS.Workbook, input: RoundReportInput): void {
  const ws = wb.addWorksheet('Summary', {
    views: [{ state: 'frozen', ySplit: SUMMARY_INFO_ROWS + 2 }],
  });
  const { round, evaluation, provider } = input;
  const date = (iso: string | null) => (iso ? new Date(iso) : '—');
  const info: [string, string | number | Date][] = [
    ['Round', t(`${round.code} · ${round.title}`)],
    ['Scheme', t(`${round.schemeCode} · ${round.schemeName}`)],
    ['PT provider', t(provider.name || 'not set in the provider profile')],
    ['Report status', reportStatusWords(evaluation)],
    ['Evaluation version', evaluation.version],
    [
      'Issue date (published)',
      evaluation.publishedAt ? new Date(evaluation.publishedAt) : 'not published',
    ],
    ['Reissue reason', t(evaluation.reissueReason ?? '—')],
    ['Test items dispatched', date(round.dispatchedAt)],
    ['Results due', date(round.resultsDueAt)],
    [
      'Authorised by',
      t([provider.authoriserName, provider.authoriserRole].filter(Boolean).join(', ') || '—'),
    ],
    [
      'Enrolled, did not report',
      input.nonReporters.map((n) => `${n.code}${n.withdrawn ? ' (withdrew)' : ''}`).join(', ') ||
        'none',
    ],
    ['Record checksum (SHA-256)', recordChecksum(input)],
  ];
  for (const [k, v] of info) {
    const r = ws.addRow([k, v]);
    r.getCell(1).font = { bold: true };
    if (v instanceof Date) r.getCell(2).numFmt = 'yyyy-mm-dd hh:mm';
    r.getCell(2).alignment = { horizontal: 'left' };
  }
  ws.addRow([]);
  const header = ws.addRow([
    'Item',
    'Material',
    'Measurand',
    'Unit',
    'Method',
    'x_pt',
    'u(x_pt)',
    'σ_pt',
    'σ_pt rule',
    'n',
    'Robust SD',
    'Score used',
    'Acceptable',
    'Warning signal',
    'Action signal',
    'Warnings',
  ]);
  styleHeader(header);
  const items = new Map(input.items.map((i) => [i.code, i]));
  for (const g of input.groups) {
    const count = (s: string) => g.participants.filter((p) => p.signal === s).length;
    const r = ws.addRow([
      t(g.itemCode),
      t(items.get(g.itemCode)?.material ?? ''),
      t(g.measurandName),
      t(g.unit),
      METHOD_WORDS[g.method] ?? g.method,
      g.assignedValue,
      g.uAssigned,
      g.sigmaPt,
      sigmaPtRuleWords(g.sigmaPtRule),
      g.n,
      g.robustSd,
      g.uNegligible === false ? 'z′' : 'z',
      count('acceptable'),
      count('warning'),
      count('action'),
      t(g.warnings.join(' · ')),
    ]);
    const fmt = numberFormat(g.decimals + 1);
    for (const c of [6, 7, 8, 11]) r.getCell(c).numFmt = fmt;
  }
  ws.columns.forEach(
    (c, i) => (c.width = [26, 30, 16, 8, 34, 12, 12, 12, 40, 6, 12, 10, 11, 14, 13, 40][i] ?? 12),
  );
  ws.autoFilter = {
    from: { row: header.number, column: 1 },
    to: { row: header.number, column: 16 },
  };
  printSetup(ws, header.number);
}

/** Landscape A4, fitted to the page width (as many pages down as needed), header row repeated. */
function printSetup(ws: ExcelJS.Worksheet, headerRow: number): void {
  ws.pageSetup = {
    paperSize: 9,
    orientation: 'landscape',
    fitToPage: true,
    fitToWidth: 1,
    fitToHeight: 0,
    printTitlesRow: `${headerRow}:${headerRow}`,
  };
}

/** The board's code for signals: shape, word and colour (teal circle, saffron triangle, carmine diamond). */
const SIGNAL_SHAPES = { acceptable: '●', warning: '▲', action: '◆' } as const;
const SIGNAL_ARGB = { acceptable: 'FF1B7F79', warning: 'FFB7791F', action: 'FFA4262C' } as const;

/** Colours the signal cells of a column by conditional formatting (the word decides the colour). */
function signalFormatting(
  ws: ExcelJS.Worksheet,
  column: number,
  fromRow: number,
  toRow: number,
): void {
  if (toRow < fromRow) return;
  const letter = ws.getColumn(column).letter;
  const ref = `${letter}${fromRow}:${letter}${toRow}`;
  ws.addConditionalFormatting({
    ref,
    rules: (['action', 'warning', 'acceptable'] as const).map((s, i) => ({
      type: 'expression',
      formulae: [`NOT(ISERROR(SEARCH("${SIGNAL_WORDS[s]}",${letter}${fromRow})))`],
      priority: i + 1,
      style: {
        font: { color: { argb: 'FFFFFFFF' }, bold: true },
        fill: { type: 'pattern', pattern: 'solid', bgColor: { argb: SIGNAL_ARGB[s] } },
      },
    })),
  });
}

function groupSheet(wb: ExcelJS.Workbook, g: ReportGroup, taken: Set<string>): void {
  const ws = wb.addWorksheet(sheetName(`${g.itemCode} ${g.measurandName}`, taken), {
    views: [{ state: 'frozen', xSplit: 1, ySplit: 4 }],
  });
  const reps = Math.max(1, ...Object.values(g.replicates).map((v) => v.length));
  const u = unitSuffix(g.unit);
  const vfmt = numberFormat(g.decimals);
  const sfmt = numberFormat(SCORE_DECIMALS);
  const r1 = ws.addRow([
    t(`Item ${g.itemCode} · ${g.measurandName}${u}`),
    null,
    'x_pt',
    g.assignedValue,
    'u(x_pt)',
    g.uAssigned,
    'σ_pt',
    g.sigmaPt,
    'n',
    g.n,
  ]);
  r1.font = { bold: true };
  for (const c of [4, 6, 8]) r1.getCell(c).numFmt = numberFormat(g.decimals + 1);
  ws.addRow([
    `Method: ${METHOD_WORDS[g.method] ?? g.method}`,
    null,
    null,
    null,
    null,
    null,
    null,
    null,
    null,
    null,
  ]);
  ws.addRow([
    `Signal follows ${g.uNegligible === false ? 'z′ (u(x_pt) not negligible)' : 'z'}; ${SIGNAL_RULE_TEXT} (ISO 13528:2015 §9)`,
  ]);
  const heads = [
    'Participant',
    ...Array.from({ length: reps }, (_, i) => `Replicate ${i + 1}${u}`),
    `Mean${u}`,
    `Replicate SD${u}`,
    `u(x)${u}`,
    'z',
    'z′',
    'ζ',
    'En',
    `D${u}`,
    'D %',
    'Score used',
    'Signal',
    'Hints',
    'Excluded from x_pt',
  ];
  styleHeader(ws.addRow(heads));
  const repStart = 2;
  const meanCol = repStart + reps;
  for (const p of g.participants) {
    const values = g.replicates[p.code] ?? [];
    const row = ws.addRow([
      t(p.code),
      ...Array.from({ length: reps }, (_, i) => values[i] ?? null),
      p.result,
      p.replicateSd,
      p.u,
      p.z,
      p.zPrime,
      p.zeta,
      p.en,
      p.d,
      p.dPct,
      SCORE_LABEL[p.scoreKind] ?? p.scoreKind,
      p.signal ? SIGNAL_WORDS[p.signal] : '—',
      t(p.hints.map((h) => hintWords(h.code)).join(' · ')),
      p.excluded
        ? t(`${EXCLUSION_RULE_LABELS[p.excluded.rule] ?? 'Other'}: ${p.excluded.reason}`)
        : '',
    ]);
    // The shape before the word, as on the board (a text format: the cell's value stays the word).
    if (p.signal) row.getCell(meanCol + 10).numFmt = `"${SIGNAL_SHAPES[p.signal]} "@`;
    for (let c = repStart; c <= meanCol + 2; c++) row.getCell(c).numFmt = vfmt;
    for (let c = meanCol + 3; c <= meanCol + 6; c++) row.getCell(c).numFmt = sfmt;
    row.getCell(meanCol + 7).numFmt = vfmt;
    row.getCell(meanCol + 8).numFmt = '0.0';
  }
  const headerRow = 4;
  ws.autoFilter = {
    from: { row: headerRow, column: 1 },
    to: { row: headerRow, column: heads.length },
  };
  signalFormatting(ws, meanCol + 10, headerRow + 1, headerRow + g.participants.length);
  printSetup(ws, headerRow);
  ws.getColumn(1).width = 13;
  for (let c = 2; c <= meanCol + 8; c++) ws.getColumn(c).width = 12;
  ws.getColumn(meanCol + 10).width = 16;
  ws.getColumn(meanCol + 11).width = 50;
  ws.getColumn(meanCol + 12).width = 30;
}

function studySheet(wb: ExcelJS.Workbook, input: RoundReportInput): void {
  const ws = wb.addWorksheet('Homogeneity and stability', {
    views: [{ state: 'frozen', ySplit: 2 }],
  });
  ws.addRow([
    'Criteria: homogeneity s_s ≤ 0.3 σ_pt (ISO 13528:2015 B.2.2); stability |ȳ₁ − ȳ₂| ≤ 0.3 σ_pt (B.5); extended criteria allow for the sampling error.',
  ]);
  styleHeader(
    ws.addRow([
      'Item',
      'Measurand',
      'Study',
      'σ_pt',
      'g',
      'm',
      'General mean',
      's_x',
      's_w',
      's_s',
      'Mean before',
      'Mean after',
      '|difference|',
      '0.3 σ_pt',
      'Result',
      'Decision',
      'Reason',
    ]),
  );
  const ms = new Map(input.measurands.map((m) => [m.key, m]));
  for (const s of input.studies) {
    const r = s.result;
    const num = (k: string) => (typeof r[k] === 'number' ? (r[k] as number) : null);
    const m = ms.get(s.measurandKey);
    const row = ws.addRow([
      t(s.itemCode),
      t(m?.name ?? s.measurandKey),
      STUDY_KIND_LABELS[s.kind],
      s.sigmaPt,
      num('g'),
      num('m'),
      num('generalMean'),
      num('sx'),
      num('sw'),
      num('ss'),
      num('meanFirst'),
      num('meanSecond'),
      num('difference'),
      num('limit'),
      s.passes ? 'Pass' : 'Fail',
      t(
        s.decision
          ? (HOMOGENEITY_DECISION_LABELS[s.decision as HomogeneityDecisionKind] ?? s.decision)
          : '—',
      ),
      t(s.decisionReason ?? ''),
    ]);
    const fmt = numberFormat((m?.decimals ?? 3) + 1);
    for (const c of [4, 7, 8, 9, 10, 11, 12, 13, 14]) row.getCell(c).numFmt = fmt;
  }
  if (input.studies.length === 0)
    ws.addRow([
      'No homogeneity study and no stability study is recorded for the test items of this round.',
    ]);
  ws.columns.forEach((c, i) => (c.width = i < 3 ? 18 : i >= 15 ? 30 : 12));
  ws.autoFilter = { from: { row: 2, column: 1 }, to: { row: 2, column: 17 } };
  printSetup(ws, 2);
}

/** Builds the round workbook; resolves to the .xlsx bytes. */
export async function buildRoundWorkbook(input: RoundReportInput): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = input.provider.name || 'Ringlet';
  wb.company = input.provider.name;
  wb.created = new Date(input.evaluation.publishedAt ?? input.generatedAt);
  wb.modified = new Date(input.generatedAt);
  wb.title = `Round ${input.round.code} v${input.evaluation.version}`;
  summarySheet(wb, input);
  const taken = new Set(['summary', 'homogeneity and stability']);
  for (const g of input.groups) groupSheet(wb, g, taken);
  studySheet(wb, input);
  return Buffer.from(await wb.xlsx.writeBuffer());
}
