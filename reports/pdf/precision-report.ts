/**
 * The precision study report (PDF, ISO 5725-2): cover under the provider's identity, study
 * design, the data by participant code, the decisions on stragglers and outliers with reasons,
 * per level the consistency tests (Cochran, Grubbs) and s_r, s_L, s_R, r, R, Mandel's h and k
 * charts (ECharts SVG), the fitted level dependence (ISO 5725-2 §7.5), the bias against accepted
 * reference values (ISO 5725-4) and the references. Codes only: no lab name is read here.
 *
 * All numbers come from the stored analysis answer (shared/evaluation/precision-study.ts).
 */
import { createHash } from 'node:crypto';
import { mandelAlt, mandelOption } from '../../shared/charts/precision-charts';
import {
  PRECISION_DECISION_LABELS,
  PRECISION_EXCLUSION_KIND_LABELS,
  PRECISION_RELATION_LABELS,
  PRECISION_TEST_LABELS,
  type PrecisionAnalysis,
  type PrecisionFit,
  type PrecisionGrubbs,
  type PrecisionLevelResult,
  type PrecisionMeasurandResult,
  type PrecisionTest,
} from '../../shared/contracts/precision';
import type { ReportProviderInfo } from '../model';
import { fixed, PALETTE } from '../text';
import {
  banner,
  createDoc,
  ensureSpace,
  finishDoc,
  heading,
  MARGIN,
  table,
  wrapTable,
  write,
  type Doc,
} from './document';
import { authoriserWords, coverFacts, coverHead } from './round-report';
import { chartFigure } from './chart-figure';

export interface PrecisionReportInput {
  analysis: PrecisionAnalysis;
  provider: ReportProviderInfo;
  schemeName: string;
  items: { code: string; material: string; nominalSizeNm: number | null }[];
  instructions: string;
  protocolTemperatureC: number;
  resultsDueAt: string | null;
  /** When the study was finished (closed → evaluated), null while it is not. */
  finishedAt: string | null;
  enrolled: number;
  generatedAt: string;
  softwareVersion: string;
}

/** Literature the report cites. */
export const PRECISION_REFERENCES = [
  'ISO 5725-1:1994 (confirmed 2018), Accuracy (trueness and precision) of measurement methods and results — Part 1: General principles and definitions.',
  'ISO 5725-2:1994 (confirmed 2019; revised as ISO 5725-2:2019), Part 2: Basic method for the determination of repeatability and reproducibility of a standard measurement method. §7.3 consistency and outlier tests, §7.4 s_r, s_L, s_R, §7.5 dependence on the level.',
  'ISO 5725-4:1994 (confirmed 2020), Part 4: Basic methods for the determination of the trueness of a standard measurement method. §5.5 bias of the measurement method.',
  'ISO 5725-6:1994, Part 6: Use in practice of accuracy values. r = 2.8·s_r and R = 2.8·s_R.',
  'Grubbs, F. E. (1950); Grubbs, F. E. and Beck, G. (1972), Technometrics 14, 847–854: critical values of the Grubbs tests.',
  'ISO 22412:2017, Particle size analysis — Dynamic light scattering (DLS): the measurement method of the study.',
];

/** SHA-256 of the analysis the report prints (its record checksum). */
export function precisionChecksum(a: PrecisionAnalysis): string {
  return createHash('sha256').update(JSON.stringify(a)).digest('hex');
}

const day = (iso: string | null) => (iso ? iso.slice(0, 10) : '—');
const g = (v: number | null | undefined, d = 3) =>
  v === null || v === undefined || !Number.isFinite(v)
    ? '—'
    : Number(v.toPrecision(d + 1)).toString();
const CLASS_WORDS = { accepted: 'accepted', straggler: 'straggler', outlier: 'outlier' } as const;
const CLASS_COLOURS = {
  accepted: '#1a1f26',
  straggler: PALETTE.saffron,
  outlier: PALETTE.carmine,
} as const;

/** Test names short enough for the Flags column. */
const SHORT_TEST: Record<PrecisionTest, string> = {
  cochran: 'Cochran',
  'grubbs-single': 'Grubbs',
  'grubbs-double': 'Grubbs double',
  'mandel-h': 'h',
  'mandel-k': 'k',
};

function statusWords(input: PrecisionReportInput): string {
  return input.finishedAt
    ? `Finished study, ${day(input.finishedAt)}`
    : 'Preview: the study is not finished; figures may change';
}

function footer(input: PrecisionReportInput): string {
  const a = input.analysis;
  return `${input.provider.name || 'PT provider'} · Precision study report (${input.finishedAt ? 'final' : 'preview'}) · ${a.round.code} · record ${precisionChecksum(a).slice(0, 16)}`;
}

function cover(doc: Doc, input: PrecisionReportInput): void {
  const a = input.analysis;
  coverHead(doc, input, 'Precision study report', { ...a.round, schemeName: input.schemeName });
  coverFacts(
    doc,
    [
      ['Kind', 'Interlaboratory precision study (round robin) after ISO 5725-2'],
      ['Report status', statusWords(input)],
      [
        'Results due',
        input.resultsDueAt ? `${input.resultsDueAt.slice(0, 16).replace('T', ' ')} UTC` : '—',
      ],
      ['Authorised by', authoriserWords(input.provider)],
      [
        'This file made',
        `${input.generatedAt.slice(0, 16).replace('T', ' ')} UTC with Ringlet ${input.softwareVersion}`,
      ],
    ],
    precisionChecksum(a),
  );
  if (!input.finishedAt)
    banner(
      doc,
      'Preview: the coordinator has not finished this study. Decisions and figures may still change.',
    );
  doc.moveDown(0.6);
  banner(
    doc,
    'Confidentiality: laboratories appear in this report only by their participant codes. The provider keeps the link between codes and laboratories confidential.',
    PALETTE.ink,
  );
}

function designSection(doc: Doc, input: PrecisionReportInput): void {
  const a = input.analysis;
  heading(doc, '1 Study design');
  const width = doc.page.width - 2 * MARGIN;
  write(
    doc,
    `${a.design.levels} level(s) (test items) × ${a.design.measurands} measurand(s). ${input.enrolled} laboratories enrolled, ${a.design.participants} reported results. ` +
      `Replicates asked per level: ${a.measurands.map((m) => `${m.label} ${m.replicatesRequired}`).join(', ')}, under repeatability conditions. Protocol temperature ${input.protocolTemperatureC} °C.`,
    { gap: 6 },
  );
  wrapTable(
    doc,
    [
      { title: 'Level', width: 60 },
      { title: 'Material', width: 250 },
      { title: 'Nominal size (nm)', width: 80, align: 'right' },
      { title: 'Reference value', width: width - 390 },
    ],
    input.items.map((i) => {
      const refs = a.references
        .filter((r) => r.itemCode === i.code)
        .map(
          (r) => `${r.measurandKey}: ${r.value}${r.u !== null ? ` (u = ${r.u})` : ''}, ${r.source}`,
        );
      return [i.code, i.material, fixed(i.nominalSizeNm, 0), refs.join('; ') || 'none'];
    }),
    8,
  );
  if (input.instructions) {
    write(doc, 'Instructions given to participants:', { bold: true });
    write(doc, input.instructions, { size: 9, gap: 6 });
  }
}

function methodsSection(doc: Doc): void {
  heading(doc, '2 Statistical method');
  const lines = [
    'Cells: one laboratory at one level. Per cell the mean ȳ_i, the standard deviation s_i and the number of results n_i (ISO 5725-2 §7.4).',
    'Consistency: Mandel’s h (between laboratories) and k (within laboratories) with indicator lines at the 5 % and 1 % levels (§7.3.1). Outliers: Cochran’s C on the largest cell variance (§7.3.3) and Grubbs’ single and double tests on the cell means (§7.3.4). A statistic beyond its 5 % critical value marks a straggler, beyond its 1 % value an outlier. The double Grubbs test is used only when the single test flags nothing.',
    'Decisions: the coordinator sets aside a flagged cell or a single replicate (confirmed) or keeps it (rejected), each with a reason; outliers are set aside only for a cause or by decision, stragglers are normally kept (§7.3.2). Figures below use the data kept.',
    's_r² = Σ(n_i − 1)s_i² / Σ(n_i − 1); s_d² = Σn_i(ȳ_i − ŷ)²/(p − 1); s_L² = (s_d² − s_r²)/n̄ (set to 0 when negative, §7.4.5); s_R² = s_L² + s_r²; r = 2.8·s_r, R = 2.8·s_R (ISO 5725-6).',
    'Level dependence (§7.5): s = c, s = b·m, s = a + b·m and lg s = c + d·lg m fitted over the levels (weighted least squares with weights 1/ŝ², logarithms unweighted); the relation with the smallest relative residual standard deviation is chosen, the one with fewer parameters when they lie within 10 %.',
    'Bias (ISO 5725-4 §5.5): δ = m − µ at a level with an accepted reference value µ; u(δ) = √((s_R² − (1 − 1/n)·s_r²)/p + u(µ)²); the 95 % interval is δ ± 1.96·u(δ); the bias is significant when the interval excludes 0.',
  ];
  for (const l of lines) write(doc, l, { size: 9, gap: 4 });
}

function grubbsWords(name: string, gr: PrecisionGrubbs | null): string[] | null {
  if (!gr) return null;
  return [
    name,
    gr.participantCodes.join(', '),
    fixed(gr.G, 4),
    fixed(gr.critical5, 4),
    fixed(gr.critical1, 4),
    CLASS_WORDS[gr.classification],
  ];
}

function levelSection(
  doc: Doc,
  m: PrecisionMeasurandResult,
  l: PrecisionLevelResult,
  n: string,
): void {
  heading(doc, `${n} Level ${l.itemLabel}`, 3);
  const d = m.decimals;
  const maxReps = Math.max(1, ...l.cells.map((c) => c.replicates.length));
  const width = doc.page.width - 2 * MARGIN;
  const statW = 44;
  const repW = Math.min(44, (width - 60 - 4 * statW - 130) / maxReps);
  table(
    doc,
    [
      { title: 'Code', width: 60 },
      ...Array.from({ length: maxReps }, (_, i) => ({
        title: `#${i + 1}`,
        width: repW,
        align: 'right' as const,
      })),
      { title: 'Mean', width: statW, align: 'right' },
      { title: 'SD', width: statW, align: 'right' },
      { title: 'h', width: statW, align: 'right' },
      { title: 'k', width: statW, align: 'right' },
      { title: 'Flags', width: width - 60 - maxReps * repW - 4 * statW },
    ],
    l.cells.map((c) => {
      const colour = c.excluded ? PALETTE.grey : CLASS_COLOURS[c.classification];
      return [
        { text: c.participantCode, colour },
        ...Array.from({ length: maxReps }, (_, i) => {
          const r = c.replicates[i];
          if (!r) return '';
          return {
            text: fixed(r.value, d) + (r.excluded && !c.excluded ? '×' : ''),
            colour: r.excluded ? PALETTE.grey : '#1a1f26',
          };
        }),
        fixed(c.mean, d + 1),
        fixed(c.sd, d + 2),
        fixed(c.h, 2),
        fixed(c.k, 2),
        {
          text: c.excluded
            ? 'set aside (whole cell)'
            : c.flags
                .map((f) => `${SHORT_TEST[f.test]} ${CLASS_WORDS[f.classification]}`)
                .join('; '),
          colour,
        },
      ];
    }),
    7.5,
  );
  write(doc, '× = replicate set aside. Flags are computed on the data kept.', {
    size: 7.5,
    colour: PALETTE.grey,
    gap: 4,
  });
  const tests: string[][] = [];
  if (l.cochran)
    tests.push([
      "Cochran's C",
      l.cochran.participantCode,
      fixed(l.cochran.C, 4),
      fixed(l.cochran.critical5, 4),
      fixed(l.cochran.critical1, 4),
      CLASS_WORDS[l.cochran.classification],
    ]);
  for (const row of [
    grubbsWords('Grubbs single, high', l.grubbs.singleHigh),
    grubbsWords('Grubbs single, low', l.grubbs.singleLow),
    grubbsWords('Grubbs double, high', l.grubbs.doubleHigh),
    grubbsWords('Grubbs double, low', l.grubbs.doubleLow),
  ])
    if (row) tests.push(row);
  if (tests.length)
    wrapTable(
      doc,
      [
        { title: 'Test', width: 110 },
        { title: 'Code(s)', width: 90 },
        { title: 'Statistic', width: 70, align: 'right' },
        { title: '5 % critical', width: 70, align: 'right' },
        { title: '1 % critical', width: 70, align: 'right' },
        { title: 'Outcome', width: width - 410 },
      ],
      tests,
      8,
    );
  write(
    doc,
    `p = ${l.p} laboratories, ${l.n} results; m = ${fixed(l.mean, d + 1)} ${m.unit}; s_r = ${g(l.sr)}, s_L = ${g(l.sL)}, s_R = ${g(l.sR)}, r = ${g(l.r)}, R = ${g(l.R)} ${m.unit}.`,
    { size: 9, gap: 3 },
  );
  if (l.sLNegativeNote) write(doc, l.sLNegativeNote, { size: 9, colour: PALETTE.saffron, gap: 3 });
  for (const w of l.warnings) write(doc, `Note: ${w}`, { size: 8, colour: PALETTE.grey, gap: 2 });
}

function fitRows(fit: PrecisionFit | null, name: string): string[][] {
  if (!fit) return [[name, '—', 'fewer than two levels', '', '']];
  if (fit.candidates.length === 0) return [[name, '—', fit.note ?? '', '', '']];
  return fit.candidates.map((c) => [
    name,
    PRECISION_RELATION_LABELS[c.relation],
    c.equation,
    c.relativeResidualSd === null
      ? `— (${c.degreesOfFreedom} df)`
      : `${g(c.relativeResidualSd)} (${c.degreesOfFreedom} df)`,
    fit.chosen === c.relation ? 'chosen' : '',
  ]);
}

function chart(doc: Doc, m: PrecisionMeasurandResult, stat: 'h' | 'k'): void {
  const width = doc.page.width - 2 * MARGIN;
  const svg = { w: 600, h: 260 };
  ensureSpace(doc, (width / svg.w) * svg.h + 10);
  const y = doc.y;
  const h = chartFigure(doc, mandelOption(m, stat), mandelAlt(m, stat), svg, {
    x: MARGIN,
    y,
    width,
  });
  doc.y = y + h + 6;
  doc.x = MARGIN;
}

function measurandSection(
  doc: Doc,
  input: PrecisionReportInput,
  m: PrecisionMeasurandResult,
  n: number,
): void {
  const a = input.analysis;
  const width = doc.page.width - 2 * MARGIN;
  doc.addPage();
  heading(doc, `${n} ${m.label}${m.unit ? ` (${m.unit})` : ''}`);
  heading(doc, `${n}.1 Precision by level`, 2);
  wrapTable(
    doc,
    [
      { title: 'Level', width: 50 },
      { title: 'p', width: 25, align: 'right' },
      { title: 'n', width: 30, align: 'right' },
      { title: 'm', width: 55, align: 'right' },
      { title: 's_r', width: 50, align: 'right' },
      { title: 's_L', width: 50, align: 'right' },
      { title: 's_R', width: 50, align: 'right' },
      { title: 'r', width: 50, align: 'right' },
      { title: 'R', width: 50, align: 'right' },
      { title: 's_r %', width: 40, align: 'right' },
      { title: 's_R %', width: width - 450, align: 'right' },
    ],
    m.levels.map((l) => [
      l.itemCode + (l.sLNegativeNote ? ' *' : ''),
      String(l.p),
      String(l.n),
      fixed(l.mean, m.decimals + 1),
      g(l.sr),
      g(l.sL),
      g(l.sR),
      g(l.r),
      g(l.R),
      fixed(l.srPercent, 2),
      fixed(l.sRPercent, 2),
    ]),
    8,
  );
  if (m.levels.some((l) => l.sLNegativeNote))
    write(doc, '* s_L² came out negative and is set to 0 (ISO 5725-2 §7.4.5): s_R = s_r.', {
      size: 8,
      gap: 4,
    });

  heading(doc, `${n}.2 Decisions on stragglers and outliers`, 2);
  const decisions = a.exclusions.filter((e) => e.measurandKey === m.key);
  if (decisions.length === 0) write(doc, 'No decision recorded.', { size: 9, gap: 4 });
  else
    wrapTable(
      doc,
      [
        { title: 'Level', width: 40 },
        { title: 'Code', width: 50 },
        { title: 'Replicate', width: 45 },
        { title: 'Flag', width: 55 },
        { title: 'Decision', width: 55 },
        { title: 'Reason', width: width - 345 },
        { title: 'By, on', width: 100 },
      ],
      decisions.map((e) => [
        e.itemCode,
        e.participantCode,
        e.replicate === null ? 'whole cell' : `#${e.replicate}`,
        PRECISION_EXCLUSION_KIND_LABELS[e.kind],
        PRECISION_DECISION_LABELS[e.decision],
        e.reason,
        `${e.actorName ?? '—'}, ${day(e.at)}`,
      ]),
      8,
    );
  const open = a.pending.filter((p) => p.measurandKey === m.key);
  if (open.length)
    banner(
      doc,
      `Undecided flags: ${open.map((p) => `${p.participantCode} at ${p.itemCode} (${PRECISION_TEST_LABELS[p.test]}, ${p.classification})`).join('; ')}.`,
      PALETTE.saffron,
    );

  heading(doc, `${n}.3 Mandel's h and k`, 2);
  chart(doc, m, 'h');
  chart(doc, m, 'k');

  heading(doc, `${n}.4 Data and tests by level`, 2);
  m.levels.forEach((l, i) => levelSection(doc, m, l, `${n}.4.${i + 1}`));

  heading(doc, `${n}.5 Dependence on the level (ISO 5725-2 §7.5)`, 2);
  wrapTable(
    doc,
    [
      { title: 'SD', width: 35 },
      { title: 'Relation', width: 110 },
      { title: 'Fitted', width: 170 },
      { title: 'Relative residual SD', width: 100 },
      { title: '', width: width - 415 },
    ],
    [...fitRows(m.fit.sr, 's_r'), ...fitRows(m.fit.sR, 's_R')],
    8,
  );
  for (const f of [m.fit.sr, m.fit.sR])
    if (f?.note) write(doc, `Note: ${f.note}`, { size: 8, colour: PALETTE.grey });

  heading(doc, `${n}.6 Bias against reference values (ISO 5725-4)`, 2);
  const withBias = m.levels.filter((l) => l.bias);
  if (withBias.length === 0)
    write(doc, 'No level of this measurand has an accepted reference value.', { size: 9 });
  else
    wrapTable(
      doc,
      [
        { title: 'Level', width: 45 },
        { title: 'µ (u)', width: 70, align: 'right' },
        { title: 'm', width: 55, align: 'right' },
        { title: 'δ', width: 50, align: 'right' },
        { title: 'δ %', width: 40, align: 'right' },
        { title: '95 % interval', width: 95, align: 'right' },
        { title: 'Significant', width: 55 },
        { title: 'Source of µ', width: width - 410 },
      ],
      withBias.map((l) => {
        const b = l.bias!;
        return [
          l.itemCode,
          `${fixed(b.referenceValue, m.decimals + 1)}${b.referenceU !== null ? ` (${g(b.referenceU)})` : ''}`,
          fixed(l.mean, m.decimals + 1),
          g(b.bias),
          fixed(b.relativeBiasPercent, 2),
          `${g(b.lower95)} … ${g(b.upper95)}`,
          b.significant ? 'yes' : 'no',
          b.referenceSource,
        ];
      }),
      8,
    );
}

/** Builds the precision study report (PDF). */
export async function buildPrecisionReportPdf(input: PrecisionReportInput): Promise<Buffer> {
  const a = input.analysis;
  const { doc, done } = createDoc({
    title: `Precision study report ${a.round.code}`,
    subject: `ISO 5725-2 precision study ${a.round.code}: ${a.round.title}`,
    footer: footer(input),
    author: input.provider.name || undefined,
    keywords:
      'precision study, round robin, ISO 5725-2, repeatability, reproducibility, dynamic light scattering',
    createdAt: input.finishedAt ? new Date(input.finishedAt) : new Date(input.generatedAt),
    modifiedAt: new Date(input.generatedAt),
  });
  cover(doc, input);
  doc.addPage();
  designSection(doc, input);
  methodsSection(doc);
  a.measurands.forEach((m, i) => measurandSection(doc, input, m, i + 3));
  heading(doc, `${a.measurands.length + 3} References`);
  for (const r of PRECISION_REFERENCES) write(doc, r, { size: 9, gap: 3 });
  finishDoc(doc);
  return done;
}
