/**
 * The round report (PDF): cover, scheme and round, test items with homogeneity and stability,
 * statistical methods with references, then per item × measurand the assigned value, σ_pt,
 * u(x_pt), two charts (ECharts SVG drawn into the PDF) and the table of participant codes and
 * scores; blunder hints in general words; the confidentiality statement. Codes only: no lab
 * name is ever read by this builder.
 */
import { distributionOption, scoreBarOption } from '../charts/options';
import { renderChartSvg } from '../charts/render';
import { METHOD_WORDS, recordChecksum, sigmaPtRuleWords, type ReportGroup, type RoundReportInput } from '../model';
import { fixed, hintWords, HINT_WORDS, PALETTE, SCORE_DECIMALS, SIGNAL_COLOURS, SIGNAL_WORDS } from '../text';
import { banner, createDoc, ensureSpace, finishDoc, heading, MARGIN, table, write, type Doc } from './document';
import { drawSvg } from './svg';
import { HOMOGENEITY_DECISION_LABELS, STUDY_KIND_LABELS, type HomogeneityDecisionKind } from '../../shared/contracts/rounds';

/** A study decision as a person reads it (docs/GLOSSARY.md: no raw code values). */
export const decisionLabel = (d: string | null): string => (d ? (HOMOGENEITY_DECISION_LABELS[d as HomogeneityDecisionKind] ?? d) : '—');

export const CONFIDENTIALITY =
  'Confidentiality: participants appear in this report only by their participant codes. The PT provider keeps the ' +
  'link between codes and laboratories confidential and discloses it only with the laboratory’s consent (ISO/IEC 17043). ' +
  'A laboratory may share its own code and results, for example with its accreditation body.';

export function footerText(input: RoundReportInput, kind: string): string {
  return `Ringlet · ${kind} · round ${input.round.code} · evaluation version ${input.evaluation.version} · record SHA-256 ${recordChecksum(input).slice(0, 16)}`;
}

export function reissueNotice(input: RoundReportInput): string | null {
  const r = input.evaluation.reissueReason;
  return r ? `Reissued report: evaluation version ${input.evaluation.version} replaces the earlier version. Reason: ${r}` : null;
}

export function cover(doc: Doc, input: RoundReportInput, kind: string, extra: string[] = []): void {
  const { round, evaluation } = input;
  doc.rect(0, 0, doc.page.width, 8).fillColor(PALETTE.ink, 1).fill();
  doc.y = 110;
  write(doc, 'Ringlet proficiency testing', { size: 12, colour: PALETTE.teal, bold: true });
  write(doc, kind, { size: 24, bold: true, colour: PALETTE.ink, gap: 8 });
  write(doc, `Round ${round.code}: ${round.title}`, { size: 14, gap: 4 });
  write(doc, `Scheme ${round.schemeCode}: ${round.schemeName}`, { size: 11, colour: PALETTE.grey, gap: 14 });
  for (const line of extra) write(doc, line, { size: 11, gap: 4 });
  doc.moveDown(1);
  write(doc, `Evaluation version ${evaluation.version}${evaluation.state === 'published' ? `, published ${evaluation.publishedAt?.slice(0, 10) ?? ''}` : ` (${evaluation.state}, not published)`}`, { size: 10 });
  write(doc, `Report made ${input.generatedAt.slice(0, 16).replace('T', ' ')} UTC with Ringlet ${evaluation.softwareVersion}`, { size: 10 });
  write(doc, `Record checksum (SHA-256): ${recordChecksum(input)}`, { size: 8, colour: PALETTE.grey, gap: 12 });
  const notice = reissueNotice(input);
  if (notice) banner(doc, notice);
  doc.moveDown(1);
  banner(doc, CONFIDENTIALITY, PALETTE.ink);
}

function schemeSection(doc: Doc, input: RoundReportInput): void {
  const { round } = input;
  heading(doc, '1 Scheme and round');
  if (round.schemeDescription) write(doc, round.schemeDescription, { gap: 6 });
  const n = new Set(input.groups.flatMap((g) => g.participants.map((p) => p.code))).size;
  write(doc, `Round ${round.code} (${round.kind === 'pt' ? 'proficiency test' : 'precision study'}): ${n} participants reported results. ` +
    `Protocol temperature ${round.protocolTemperatureC} °C.${round.resultsDueAt ? ` Results were due ${round.resultsDueAt.slice(0, 10)}.` : ''}`, { gap: 6 });
  if (round.instructions) {
    write(doc, 'Instructions given to participants:', { bold: true });
    write(doc, round.instructions, { size: 9, gap: 6 });
  }
}

function itemsSection(doc: Doc, input: RoundReportInput): void {
  heading(doc, '2 Test items, homogeneity and stability');
  table(
    doc,
    [
      { title: 'Item', width: 50 },
      { title: 'Material', width: 250 },
      { title: 'Nominal size (nm)', width: 90, align: 'right' },
      { title: 'Storage', width: 105 },
    ],
    input.items.map((i) => [i.code, i.material.slice(0, 60), fixed(i.nominalSizeNm, 0), i.storageNotes.slice(0, 28)]),
    8,
  );
  write(doc, 'Homogeneity was checked with the criterion s_s ≤ 0.3 σ_pt (ISO 13528:2015 B.2.2) and stability with |ȳ₁ − ȳ₂| ≤ 0.3 σ_pt (B.5); ' +
    'where the basic criterion failed, the extended criteria that allow for the sampling error were applied.', { size: 9, gap: 4 });
  if (input.studies.length === 0) {
    write(doc, 'No homogeneity or stability study is recorded for this round.', { size: 9 });
    return;
  }
  const ms = new Map(input.measurands.map((m) => [m.key, m]));
  table(
    doc,
    [
      { title: 'Item', width: 40 },
      { title: 'Measurand', width: 70 },
      { title: 'Study', width: 70 },
      { title: 'σ_pt', width: 55, align: 'right' },
      { title: 'Statistic', width: 80, align: 'right' },
      { title: '0.3 σ_pt', width: 55, align: 'right' },
      { title: 'Result', width: 55 },
      { title: 'Decision', width: 70 },
    ],
    input.studies.map((s) => {
      const d = (ms.get(s.measurandKey)?.decimals ?? 3) + 1;
      const stat = s.kind === 'homogeneity' ? `s_s ${fixed(s.result['ss'] as number, d)}` : `|Δ| ${fixed(s.result['difference'] as number, d)}`;
      return [
        s.itemCode,
        ms.get(s.measurandKey)?.name ?? s.measurandKey,
        STUDY_KIND_LABELS[s.kind],
        fixed(s.sigmaPt, d),
        stat,
        fixed(s.result['limit'] as number, d),
        { text: s.passes ? 'Pass' : 'Fail', colour: s.passes ? PALETTE.teal : PALETTE.carmine },
        decisionLabel(s.decision).slice(0, 28),
      ];
    }),
    8,
  );
  for (const s of input.studies.filter((x) => x.decisionReason)) write(doc, `Item ${s.itemCode}, ${STUDY_KIND_LABELS[s.kind].toLowerCase()}: ${s.decisionReason}`, { size: 9 });
}

function methodsSection(doc: Doc, input: RoundReportInput): void {
  heading(doc, '3 Statistical methods');
  const lines = [
    'Each participant’s result is the mean of its replicates. The assigned value x_pt and its standard uncertainty u(x_pt) follow ISO 13528:2015 §7: ' +
      'for a consensus value, the robust mean by Algorithm A (Annex C.3) with u(x_pt) = 1.25 s*/√p (§7.7); for a reference value, the value and uncertainty of its characterisation.',
    'The standard deviation for proficiency assessment σ_pt follows ISO 13528:2015 §8, by the rule named for each measurand below.',
    'Scores (ISO 13528:2015 §9): z = (x − x_pt)/σ_pt; where u(x_pt) > 0.3 σ_pt, z′ = (x − x_pt)/√(σ_pt² + u²(x_pt)) is used instead; ' +
      'ζ = (x − x_pt)/√(u²(x) + u²(x_pt)) and En = (x − x_pt)/√(U²(x) + U²(x_pt)) where the participant reported an uncertainty.',
    'Signals: |score| ≤ 2 acceptable, 2 < |score| < 3 warning signal, |score| ≥ 3 action signal; |En| ≤ 1 acceptable, > 1 action signal (ISO 13528:2015 §9; ISO/IEC 17043).',
  ];
  if (input.groups.some((g) => g.sigmaPtRule.kind === 'precision')) {
    lines.push('Where σ_pt comes from a precision experiment, the repeatability and reproducibility standard deviations were estimated as in ISO 5725-2 (§8.4 of ISO 13528:2015).');
  }
  const excluded = input.groups.reduce((s, g) => s + g.participants.filter((p) => p.excluded).length, 0);
  if (excluded) lines.push(`${excluded} result(s) were kept out of the assigned value for a stated reason; they are still scored.`);
  for (const l of lines) write(doc, l, { size: 9.5, gap: 5 });
  write(doc, 'References: ISO 13528:2015 Statistical methods for use in proficiency testing by interlaboratory comparison; ISO 5725-2:2019 Accuracy of measurement methods and results, Part 2; ISO/IEC 17043:2023 Conformity assessment, general requirements for proficiency testing; ISO 22412:2017 Particle size analysis, dynamic light scattering.', { size: 8.5, colour: PALETTE.grey, gap: 5 });
}

function groupSection(doc: Doc, g: ReportGroup, index: number, highlight?: string): void {
  doc.addPage();
  heading(doc, `4.${index + 1} Item ${g.itemCode}: ${g.measurandName}${g.unit ? ` (${g.unit})` : ''}`);
  const d = g.decimals;
  const u = g.unit ? ` ${g.unit}` : '';
  write(doc, `Assigned value x_pt = ${fixed(g.assignedValue, d + 1)}${u}   u(x_pt) = ${fixed(g.uAssigned, d + 1)}${u}   σ_pt = ${fixed(g.sigmaPt, d + 1)}${u}   n = ${g.n}`, { bold: true, size: 10.5, gap: 3 });
  write(doc, `x_pt: ${METHOD_WORDS[g.method] ?? g.method}. σ_pt: ${sigmaPtRuleWords(g.sigmaPtRule)}. Signal follows ${g.uNegligible === false ? 'z′ (u(x_pt) is not negligible)' : 'z'}.`, { size: 9, gap: 3 });
  for (const w of g.warnings) write(doc, `Note: ${w}`, { size: 9, colour: PALETTE.saffron });
  const width = (doc.page.width - 2 * MARGIN - 10) / 2;
  const y = doc.y + 4;
  const h1 = drawSvg(doc, renderChartSvg(distributionOption(g), 400, 260), MARGIN, y, width);
  const h2 = drawSvg(doc, renderChartSvg(scoreBarOption(g, highlight), 400, 260), MARGIN + width + 10, y, width);
  doc.y = y + Math.max(h1, h2) + 6;
  doc.x = MARGIN;
  const counts = (['acceptable', 'warning', 'action'] as const).map((s) => `${g.participants.filter((p) => p.signal === s).length} ${SIGNAL_WORDS[s]}`);
  write(doc, `Signals: ${counts.join(', ')}.`, { size: 9, gap: 4 });
  const hintCodes = new Map<string, number>();
  g.participants.forEach((p, i) => p.hints.forEach((h) => hintCodes.set(h.code, hintCodes.get(h.code) ?? i)));
  const mark = (code: string) => String.fromCharCode(97 + [...hintCodes.keys()].indexOf(code));
  table(
    doc,
    [
      { title: 'Code', width: 52 },
      { title: `Mean${u}`, width: 58, align: 'right' },
      { title: 'Replicate SD', width: 50, align: 'right' },
      { title: 'u(x)', width: 46, align: 'right' },
      { title: 'z', width: 38, align: 'right' },
      { title: 'z′', width: 38, align: 'right' },
      { title: 'ζ', width: 38, align: 'right' },
      { title: 'En', width: 38, align: 'right' },
      { title: 'Signal', width: 68 },
      { title: 'Hints', width: 34 },
      { title: 'Note', width: 35 },
    ],
    g.participants.map((p) => [
      { text: p.code, bold: p.code === highlight },
      fixed(p.result, d),
      fixed(p.replicateSd, d + 1),
      fixed(p.u, d + 1),
      fixed(p.z, SCORE_DECIMALS),
      fixed(p.zPrime, SCORE_DECIMALS),
      fixed(p.zeta, SCORE_DECIMALS),
      fixed(p.en, SCORE_DECIMALS),
      p.signal ? { text: SIGNAL_WORDS[p.signal], colour: SIGNAL_COLOURS[p.signal] } : '—',
      p.hints.map((h) => mark(h.code)).join(','),
      p.excluded ? 'excl.' : '',
    ]),
  );
  if (hintCodes.size) {
    write(doc, 'Hints (general patterns the software looks for; a hint is a prompt for the laboratory’s own investigation, not a finding):', { size: 8.5, bold: true });
    for (const code of hintCodes.keys()) write(doc, `${mark(code)}: ${hintWords(code)}.`, { size: 8.5 });
  }
}

/** Builds the round report; resolves to the PDF bytes. */
export async function buildRoundReportPdf(input: RoundReportInput): Promise<Buffer> {
  const { doc, done } = createDoc({
    title: `Round report ${input.round.code} v${input.evaluation.version}`,
    subject: 'Proficiency-testing round report',
    footer: footerText(input, 'round report'),
  });
  cover(doc, input, 'Round report');
  doc.addPage();
  schemeSection(doc, input);
  itemsSection(doc, input);
  methodsSection(doc, input);
  input.groups.forEach((g, i) => groupSection(doc, g, i));
  ensureSpace(doc, 160);
  heading(doc, '5 Blunder hints and confidentiality');
  write(doc, 'The software compares each result with the assigned value and flags patterns that often come from a slip rather than from the measurement itself:', { size: 9.5, gap: 3 });
  for (const code of Object.keys(HINT_WORDS)) write(doc, `• ${hintWords(code)}.`, { size: 9.5 });
  doc.moveDown(0.5);
  write(doc, CONFIDENTIALITY, { size: 9.5 });
  finishDoc(doc);
  return done;
}

export { groupSection };
