/**
 * The precision study workbook (exceljs): Summary (study, provider, status, precision by level
 * and measurand, references), Data (every replicate by participant code, with what was set aside),
 * Tests (Mandel h/k, Cochran, Grubbs per level), Decisions (with reasons), Level fit (ISO 5725-2
 * §7.5) and Bias (ISO 5725-4). Numbers stay numbers; user text goes through neutraliseFormula.
 */
import ExcelJS from 'exceljs';
import {
  PRECISION_DECISION_LABELS,
  PRECISION_EXCLUSION_KIND_LABELS,
  PRECISION_RELATION_LABELS,
  PRECISION_TEST_LABELS,
} from '../../shared/contracts/precision';
import {
  PRECISION_REFERENCES,
  precisionChecksum,
  type PrecisionReportInput,
} from '../pdf/precision-report';
import { neutraliseFormula as t, numberFormat } from '../text';

const HEADER_FILL: ExcelJS.Fill = {
  type: 'pattern',
  pattern: 'solid',
  fgColor: { argb: 'FF1F3A5F' },
};
const HEADER_FONT: Partial<ExcelJS.Font> = { bold: true, color: { argb: 'FFFFFFFF' } };

function sheet(
  wb: ExcelJS.Workbook,
  name: string,
  headers: string[],
  widths: number[],
): ExcelJS.Worksheet {
  const ws = wb.addWorksheet(name, { views: [{ state: 'frozen', ySplit: 1 }] });
  const row = ws.addRow(headers);
  row.font = HEADER_FONT;
  row.fill = HEADER_FILL;
  row.alignment = { vertical: 'middle', wrapText: true };
  widths.forEach((w, i) => (ws.getColumn(i + 1).width = w));
  return ws;
}

const num = (v: number | null | undefined): number | null =>
  v === null || v === undefined || !Number.isFinite(v) ? null : v;

/** Builds the precision study workbook (XLSX). */
export async function buildPrecisionWorkbook(input: PrecisionReportInput): Promise<Buffer> {
  const a = input.analysis;
  const wb = new ExcelJS.Workbook();
  wb.creator = input.provider.name || 'PT provider';
  wb.created = new Date(input.generatedAt);

  const sum = wb.addWorksheet('Summary');
  const info: [string, string | number][] = [
    ['Precision study', t(`${a.round.code} · ${a.round.title}`)],
    ['Scheme', t(`${a.round.schemeCode} · ${input.schemeName}`)],
    ['Provider', t(input.provider.name || 'not set in the provider profile')],
    [
      'Status',
      input.finishedAt ? `finished ${input.finishedAt.slice(0, 10)}` : 'preview (not finished)',
    ],
    ['Levels', a.design.levels],
    ['Labs reporting', a.design.participants],
    ['Labs enrolled', input.enrolled],
    ['Record checksum (SHA-256)', precisionChecksum(a)],
    [
      'File made',
      `${input.generatedAt.slice(0, 16).replace('T', ' ')} UTC, Ringlet ${input.softwareVersion}`,
    ],
  ];
  for (const [k, v] of info) sum.addRow([k, v]).getCell(1).font = { bold: true };
  sum.addRow([]);
  const head = sum.addRow([
    'Measurand',
    'Unit',
    'Level',
    'p',
    'n',
    'm̂',
    's_r',
    's_L',
    's_R',
    'r',
    'R',
    's_r %',
    's_R %',
    'Note',
  ]);
  head.font = HEADER_FONT;
  head.fill = HEADER_FILL;
  for (const m of a.measurands)
    for (const l of m.levels) {
      const r = sum.addRow([
        t(m.label),
        t(m.unit),
        t(l.itemCode),
        l.p,
        l.n,
        num(l.mean),
        num(l.sr),
        num(l.sL),
        num(l.sR),
        num(l.r),
        num(l.R),
        num(l.srPercent),
        num(l.sRPercent),
        l.sLNegativeNote ?? '',
      ]);
      for (let c = 6; c <= 11; c++) r.getCell(c).numFmt = numberFormat(m.decimals + 2);
      r.getCell(12).numFmt = '0.00';
      r.getCell(13).numFmt = '0.00';
    }
  sum.addRow([]);
  sum.addRow(['References']).getCell(1).font = { bold: true };
  for (const ref of PRECISION_REFERENCES) sum.addRow([ref]);
  sum.getColumn(1).width = 28;
  sum.getColumn(2).width = 40;

  const maxReps = Math.max(
    1,
    ...a.measurands.flatMap((m) =>
      m.levels.flatMap((l) => l.cells.map((c) => c.replicates.length)),
    ),
  );
  const data = sheet(
    wb,
    'Data',
    [
      'Measurand',
      'Level',
      'Code',
      ...Array.from({ length: maxReps }, (_, i) => `Replicate ${i + 1}`),
      'Set aside',
      'n kept',
      'Mean',
      'SD',
    ],
    [16, 10, 10, ...Array.from({ length: maxReps }, () => 12), 22, 8, 12, 12],
  );
  for (const m of a.measurands)
    for (const l of m.levels)
      for (const c of l.cells) {
        const reps = Array.from({ length: maxReps }, (_, i) => c.replicates[i]?.value ?? null);
        const aside = c.excluded
          ? 'whole cell'
          : c.replicates
              .filter((r) => r.excluded)
              .map((r) => `#${r.replicate}`)
              .join(', ');
        const row = data.addRow([
          t(m.key),
          t(l.itemCode),
          t(c.participantCode),
          ...reps,
          aside,
          c.n,
          num(c.mean),
          num(c.sd),
        ]);
        for (let i = 0; i < maxReps; i++) row.getCell(4 + i).numFmt = numberFormat(m.decimals);
      }

  const tests = sheet(
    wb,
    'Tests',
    [
      'Measurand',
      'Level',
      'Code',
      'h',
      'k',
      'Flags',
      'h 5 %',
      'h 1 %',
      'k 5 %',
      'k 1 %',
      'Cochran C',
      'C 5 %',
      'C 1 %',
      'Grubbs high G',
      'Grubbs low G',
      'G 5 %',
      'G 1 %',
    ],
    [16, 10, 10, 9, 9, 40, 9, 9, 9, 9, 10, 9, 9, 12, 12, 9, 9],
  );
  for (const m of a.measurands)
    for (const l of m.levels)
      for (const c of l.cells) {
        const isCochran = l.cochran?.participantCode === c.participantCode;
        const row = tests.addRow([
          t(m.key),
          t(l.itemCode),
          t(c.participantCode),
          num(c.h),
          num(c.k),
          c.flags.map((f) => `${PRECISION_TEST_LABELS[f.test]} ${f.classification}`).join('; '),
          num(l.mandel.h?.indicator5),
          num(l.mandel.h?.indicator1),
          num(l.mandel.k?.indicator5),
          num(l.mandel.k?.indicator1),
          isCochran ? num(l.cochran?.C) : null,
          isCochran ? num(l.cochran?.critical5) : null,
          isCochran ? num(l.cochran?.critical1) : null,
          l.grubbs.singleHigh?.participantCodes[0] === c.participantCode
            ? num(l.grubbs.singleHigh.G)
            : null,
          l.grubbs.singleLow?.participantCodes[0] === c.participantCode
            ? num(l.grubbs.singleLow.G)
            : null,
          num(l.grubbs.singleHigh?.critical5),
          num(l.grubbs.singleHigh?.critical1),
        ]);
        for (const i of [4, 5, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17])
          row.getCell(i).numFmt = '0.000';
      }

  const dec = sheet(
    wb,
    'Decisions',
    ['Measurand', 'Level', 'Code', 'Replicate', 'Flag', 'Decision', 'Reason', 'By', 'At (UTC)'],
    [16, 10, 10, 10, 12, 12, 60, 20, 18],
  );
  for (const e of a.exclusions)
    dec.addRow([
      t(e.measurandKey),
      t(e.itemCode),
      t(e.participantCode),
      e.replicate ?? 'whole cell',
      PRECISION_EXCLUSION_KIND_LABELS[e.kind],
      PRECISION_DECISION_LABELS[e.decision],
      t(e.reason),
      t(e.actorName ?? ''),
      e.at.slice(0, 16).replace('T', ' '),
    ]);

  const fit = sheet(
    wb,
    'Level fit',
    ['Measurand', 'SD', 'Relation', 'Equation', 'Relative residual SD', 'df', 'Chosen'],
    [16, 6, 22, 36, 16, 6, 8],
  );
  for (const m of a.measurands)
    for (const [name, f] of [
      ['s_r', m.fit.sr],
      ['s_R', m.fit.sR],
    ] as const)
      for (const c of f?.candidates ?? [])
        fit.addRow([
          t(m.key),
          name,
          PRECISION_RELATION_LABELS[c.relation],
          c.equation,
          num(c.relativeResidualSd),
          c.degreesOfFreedom,
          f!.chosen === c.relation ? 'yes' : '',
        ]);

  const bias = sheet(
    wb,
    'Bias',
    [
      'Measurand',
      'Level',
      'µ',
      'u(µ)',
      'm̂',
      'δ̂',
      'δ̂ %',
      'u(δ̂)',
      'Lower 95 %',
      'Upper 95 %',
      'Significant',
      'Source of µ',
    ],
    [16, 10, 10, 10, 10, 10, 8, 10, 12, 12, 10, 40],
  );
  for (const m of a.measurands)
    for (const l of m.levels)
      if (l.bias)
        bias.addRow([
          t(m.key),
          t(l.itemCode),
          l.bias.referenceValue,
          l.bias.referenceU,
          num(l.mean),
          l.bias.bias,
          num(l.bias.relativeBiasPercent),
          l.bias.u,
          l.bias.lower95,
          l.bias.upper95,
          l.bias.significant ? 'yes' : 'no',
          t(l.bias.referenceSource),
        ]);

  return Buffer.from(await wb.xlsx.writeBuffer());
}
