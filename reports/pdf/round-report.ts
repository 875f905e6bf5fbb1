/**
 * The round report (PDF): cover, scheme and round, test items with homogeneity and stability,
 * statistical methods with references, then per item × measurand the assigned value, σ_pt,
 * u(x_pt), two charts (ECharts SVG drawn into the PDF) and the table of participant codes and
 * scores; blunder hints in general words; the confidentiality statement. Codes only: no lab
 * name is ever read by this builder.
 */
import { SIGNAL_RULE_TEXT } from '../../shared/charts/signals';
import { SIGNAL_LIMITS } from '../../shared/stats/scores';
import { sigmaPtRuleWords } from '../../shared/contracts/rule-text';
import { distributionOption, offScale, scoreBarOption, scoresOffScale } from '../charts/options';
import { EXCLUSION_RULE_LABELS } from '../../shared/contracts/evaluation';
import {
  METHOD_WORDS,
  recordChecksum,
  reportStatusWords,
  type ReportGroup,
  type ReportStudy,
  type RoundReportInput,
} from '../model';
import {
  day,
  dayTime,
  fixed,
  HINT_WORDS,
  hintWords,
  PALETTE,
  SCORE_DECIMALS,
  SIGNAL_COLOURS,
  SIGNAL_WORDS,
} from '../text';
import {
  artifact,
  banner,
  createDoc,
  ensureSpace,
  figure,
  finishDoc,
  heading,
  MARGIN,
  table,
  wrapTable,
  write,
  type Doc,
} from './document';
import { chartFigure } from './chart-figure';
import {
  HOMOGENEITY_DECISION_LABELS,
  STUDY_KIND_LABELS,
  type HomogeneityDecisionKind,
} from '../../shared/contracts/rounds';

/** A study decision as a person reads it (docs/GLOSSARY.md: no raw code values). */
export const decisionLabel = (d: string | null): string =>
  d ? (HOMOGENEITY_DECISION_LABELS[d as HomogeneityDecisionKind] ?? d) : '—';

export const CONFIDENTIALITY =
  'Confidentiality: participants appear in this report only by their participant codes. The PT provider keeps the ' +
  'link between codes and laboratories confidential and discloses it only with the laboratory’s consent (ISO/IEC 17043). ' +
  'A laboratory may share its own code and results, for example with its accreditation body.';

/** Caution on the use of the results (ISO/IEC 17043 report content, recalled from memory; wording common practice). */
export const USE_CAUTION =
  'Use of these results: a score describes one result on these test items in this round, compared with the assigned value ' +
  'and σ_pt stated here. One round alone does not prove or disprove a laboratory’s competence; look at the Track record over ' +
  'several rounds. The assigned values are not certified reference values and must not be used to calibrate instruments. ' +
  'Results and scores may be quoted only in full, with the round code and the report version.';

export const NO_SUBCONTRACTING_STATED =
  'The PT provider has not stated any subcontracted work for this round.';

function providerName(input: Pick<RoundReportInput, 'provider'>): string {
  return input.provider.name || 'PT provider (name not yet set in the provider profile)';
}

export function footerText(
  input: RoundReportInput,
  kind: string,
  participantCode?: string,
): string {
  const status =
    input.evaluation.state === 'published'
      ? input.evaluation.version > 1
        ? 'corrected'
        : 'final'
      : 'preview';
  const who = participantCode ? ` · participant ${participantCode}` : '';
  return `${input.provider.name || 'PT provider'} · ${kind} (${status}) · ${input.round.code} v${input.evaluation.version}${who} · record ${recordChecksum(input).slice(0, 16)}`;
}

export function reissueNotice(input: RoundReportInput): string | null {
  const r = input.evaluation.reissueReason;
  return r
    ? `Corrected report: evaluation version ${input.evaluation.version} replaces version ${input.evaluation.version - 1}. Reason: ${r}`
    : null;
}

/** The document's dates: issued = published (creation date), file made = now (modification date). */
export function docDates(input: RoundReportInput): { createdAt: Date; modifiedAt: Date } {
  const made = new Date(input.generatedAt);
  return {
    createdAt: input.evaluation.publishedAt ? new Date(input.evaluation.publishedAt) : made,
    modifiedAt: made,
  };
}

/** The provider block: logo, name, address, contact, accreditation. */
export function providerBlock(doc: Doc, input: Pick<RoundReportInput, 'provider'>): void {
  const p = input.provider;
  if (p.logo) {
    const y = doc.y;
    figure(doc, `Logo of ${providerName(input)}`, () => {
      try {
        doc.image(p.logo!.data, MARGIN, y, { fit: [140, 56] });
      } catch {
        // A logo pdfkit cannot read is left out rather than failing the report.
      }
    });
    doc.y = y + 62;
  }
  write(doc, providerName(input), { size: 13, colour: PALETTE.teal, bold: true, gap: 2 });
  const lines = [
    p.address.split(/\r?\n/).filter(Boolean).join(', '),
    [p.contactEmail, p.contactPhone, p.website].filter(Boolean).join(' · '),
  ].filter(Boolean);
  for (const l of lines) write(doc, l, { size: 9, colour: PALETTE.grey, gap: 1 });
  write(
    doc,
    p.accreditationNumber
      ? `Accredited as a PT provider to ISO/IEC 17043${p.accreditationBody ? ` by ${p.accreditationBody}` : ''}, accreditation number ${p.accreditationNumber}.`
      : 'Accreditation: none stated by the PT provider.',
    { size: 9, colour: PALETTE.grey, gap: 10 },
  );
}

/** Who authorised the report, as the cover names them. */
export function authoriserWords(p: RoundReportInput['provider']): string {
  return p.authoriserName
    ? `${p.authoriserName}${p.authoriserRole ? `, ${p.authoriserRole}` : ''}`
    : 'not named in the provider profile';
}

/** The head of a cover page: the ink bar, the provider block, the title, the round and its scheme. */
export function coverHead(
  doc: Doc,
  input: Pick<RoundReportInput, 'provider'>,
  title: string,
  round: { code: string; title: string; schemeCode: string; schemeName: string },
): void {
  artifact(doc, () => doc.rect(0, 0, doc.page.width, 8).fillColor(PALETTE.ink, 1).fill());
  doc.y = 50;
  providerBlock(doc, input);
  doc.y = Math.max(doc.y, 170);
  write(doc, title, { size: 24, bold: true, colour: PALETTE.ink, gap: 8, tag: 'H1' });
  write(doc, `Round ${round.code}: ${round.title}`, { size: 14, gap: 4 });
  write(doc, `Scheme ${round.schemeCode}: ${round.schemeName}`, {
    size: 11,
    colour: PALETTE.grey,
    gap: 14,
  });
}

/** The cover's table of facts about the report, then the record checksum it was made from. */
export function coverFacts(doc: Doc, rows: string[][], checksum: string): void {
  wrapTable(
    doc,
    [
      { title: 'Report', width: 130 },
      { title: '', width: doc.page.width - 2 * MARGIN - 130 },
    ],
    rows,
    9.5,
  );
  write(doc, `Record checksum (SHA-256): ${checksum}`, {
    size: 8,
    colour: PALETTE.grey,
    gap: 12,
  });
}

export function cover(doc: Doc, input: RoundReportInput, kind: string, extra: string[] = []): void {
  const { round, evaluation } = input;
  coverHead(doc, input, kind, round);
  for (const line of extra) write(doc, line, { size: 11, gap: 4 });
  doc.moveDown(0.6);
  const rows: string[][] = [
    ['Report status', reportStatusWords(evaluation)],
    [
      'Issue date',
      evaluation.state === 'published' ? day(evaluation.publishedAt) : 'not issued (preview)',
    ],
    [
      'Test items dispatched',
      round.dispatchedAt
        ? `${day(round.dispatchedAt)}${round.dispatchPlanned ? ' (planned date)' : ''}`
        : '—',
    ],
    ['Results due', dayTime(round.resultsDueAt)],
    ['Authorised by', authoriserWords(input.provider)],
    [
      'This file made',
      `${dayTime(input.generatedAt)} with Ringlet ${evaluation.softwareVersion}${evaluation.publishedAt && day(input.generatedAt) !== day(evaluation.publishedAt) ? ' (regenerated from the record of the issued version; contents as issued)' : ''}`,
    ],
  ];
  coverFacts(doc, rows, recordChecksum(input));
  const notice = reissueNotice(input);
  if (notice) banner(doc, notice);
  doc.moveDown(0.6);
  banner(doc, CONFIDENTIALITY, PALETTE.ink);
}

function schemeSection(doc: Doc, input: RoundReportInput): void {
  const { round } = input;
  heading(doc, '1 Scheme and round');
  if (round.schemeDescription) write(doc, round.schemeDescription, { gap: 6 });
  const n = new Set(input.groups.flatMap((g) => g.participants.map((p) => p.code))).size;
  write(
    doc,
    `Round ${round.code} (${round.kind === 'pt' ? 'proficiency test' : 'precision study'}): ${n + input.nonReporters.length} participants enrolled and ${n} reported results. ` +
      `Protocol temperature ${round.protocolTemperatureC} °C. Test items dispatched ${round.dispatchedAt ? day(round.dispatchedAt) + (round.dispatchPlanned ? ' (planned date)' : '') : '—'}; results were due ${round.resultsDueAt ? day(round.resultsDueAt) : '—'}.`,
    { gap: 6 },
  );
  const silent = input.nonReporters.filter((x) => !x.withdrawn).map((x) => x.code);
  const withdrawn = input.nonReporters.filter((x) => x.withdrawn).map((x) => x.code);
  write(
    doc,
    `Enrolled but did not report: ${silent.length ? silent.join(', ') : 'none'}.${withdrawn.length ? ` Withdrew from the round: ${withdrawn.join(', ')}.` : ''}`,
    { gap: 6 },
  );
  if (round.instructions) {
    write(doc, 'Instructions given to participants:', { bold: true });
    write(doc, round.instructions, { size: 9, gap: 6 });
  }
  write(doc, `Subcontracting: ${input.provider.subcontracting || NO_SUBCONTRACTING_STATED}`, {
    size: 9.5,
    gap: 6,
  });
}

function studyLine(s: ReportStudy, d: number): string {
  const stat =
    s.kind === 'homogeneity'
      ? `s_s = ${fixed(s.result['ss'] as number, d)}`
      : `|ȳ₁ − ȳ₂| = ${fixed(s.result['difference'] as number, d)}`;
  return `${stat}; criterion 0.3 σ_pt = ${fixed(s.result['limit'] as number, d)} (σ_pt ${fixed(s.sigmaPt, d)})`;
}

function itemsSection(doc: Doc, input: RoundReportInput): void {
  heading(doc, '2 Test items, homogeneity and stability');
  const width = doc.page.width - 2 * MARGIN;
  wrapTable(
    doc,
    [
      { title: 'Item', width: 40 },
      { title: 'Material', width: 170 },
      { title: 'Nominal size (nm)', width: 60, align: 'right' },
      { title: 'Storage', width: 110 },
      { title: 'Handling', width: width - 380 },
    ],
    input.items.map((i) => [
      i.code,
      i.material,
      fixed(i.nominalSizeNm, 0),
      i.storageNotes,
      i.handlingNotes,
    ]),
    8,
  );
  const ms = new Map(input.measurands.map((m) => [m.key, m]));
  if (input.studies.length === 0) {
    write(
      doc,
      'No homogeneity study and no stability study is recorded for the test items of this round. The evaluation assumes ' +
        'the items were sufficiently homogeneous and stable; the coordinator’s comments (section 6) give the reason where one was recorded.',
      { size: 9.5, gap: 4 },
    );
    return;
  }
  write(
    doc,
    'Criteria (ISO 13528:2015 B.2.2 and B.5): homogeneity passes when the between-sample standard deviation s_s ≤ 0.3 σ_pt, ' +
      'stability when |ȳ₁ − ȳ₂| ≤ 0.3 σ_pt; where the basic criterion failed, the extended criteria that allow for the sampling error were applied.',
    { size: 9, gap: 4 },
  );
  const rows: string[][] = [];
  for (const item of input.items) {
    for (const m of input.measurands) {
      for (const kind of ['homogeneity', 'stability'] as const) {
        const st = input.studies.find(
          (x) => x.itemCode === item.code && x.measurandKey === m.key && x.kind === kind,
        );
        const label = STUDY_KIND_LABELS[kind];
        if (!st) rows.push([item.code, m.name, label, 'none recorded', '—', '']);
        else {
          const d = (ms.get(st.measurandKey)?.decimals ?? 3) + 1;
          rows.push([
            item.code,
            m.name,
            label,
            studyLine(st, d),
            st.passes ? 'Pass' : 'Fail',
            [st.decision ? decisionLabel(st.decision) : '', st.decisionReason]
              .filter(Boolean)
              .join(': '),
          ]);
        }
      }
    }
  }
  wrapTable(
    doc,
    [
      { title: 'Item', width: 35 },
      { title: 'Measurand', width: 75 },
      { title: 'Study', width: 75 },
      { title: 'Data and criterion', width: 170 },
      { title: 'Outcome', width: 45 },
      { title: 'Decision', width: width - 400 },
    ],
    rows,
    8,
  );
}

/** Why σ_pt set this way is fit for purpose (ISO 13528:2015 §8; wording ours). */
export function sigmaPtFitness(g: ReportGroup): string {
  switch (g.sigmaPtRule.kind) {
    case 'fixed':
    case 'percent':
      return 'set in advance by the PT provider from the performance the scheme expects of particle-sizing laboratories (fitness for purpose, ISO 13528:2015 §8.2); it does not depend on this round’s results';
    case 'robust-sd':
      return 'the robust standard deviation s* of this round’s results (ISO 13528:2015 §8.6): it describes how far the participants actually agree, so a score shows a result’s position among its peers rather than against a predefined requirement';
    case 'precision':
      return 'derived from the reproducibility of a precision experiment (ISO 13528:2015 §8.4), so it reflects what the method can achieve between laboratories';
  }
}

/** The nature of x_pt: consensus (not independently traceable) or a reference value with its source. */
export function assignedValueNature(g: ReportGroup): string {
  if (g.assignedValueRule.kind === 'reference') {
    return `reference value from a characterisation outside the round (${g.assignedValueRule.source || 'source not stated'}); its metrological traceability is that of this characterisation`;
  }
  return 'consensus value of the participants’ results; it is not metrologically traceable on its own: it rests on the participants’ own calibrations, and it can be biased if most participants share the same bias';
}

function methodsSection(doc: Doc, input: RoundReportInput): void {
  heading(doc, '3 Statistical methods');
  const lines = [
    'Each participant’s result is the mean of its replicates. The assigned value x_pt and its standard uncertainty u(x_pt) follow ISO 13528:2015 §7: ' +
      'for a consensus value, the robust mean x* and robust standard deviation s* by Algorithm A (Annex C.3), with u(x_pt) = 1.25 · s*/√(p) for p participants (§7.7); ' +
      'for a reference value, the value and uncertainty of its characterisation.',
    'The standard deviation for proficiency assessment σ_pt follows ISO 13528:2015 §8, by the rule stated for each item and measurand in the table below.',
    'u(x_pt) is negligible when u(x_pt) ≤ 0.3 σ_pt (ISO 13528:2015 §9.2); then z = (x − x_pt)/σ_pt is used, otherwise z′ = (x − x_pt)/√(σ_pt² + u²(x_pt)). ' +
      'ζ = (x − x_pt)/√(u²(x) + u²(x_pt)) and En = (x − x_pt)/√(U²(x) + U²(x_pt)) where the participant reported an uncertainty.',
    `Signals: ${SIGNAL_RULE_TEXT} (ISO 13528:2015 §9; ISO/IEC 17043).`,
  ];
  if (input.groups.some((g) => g.sigmaPtRule.kind === 'precision')) {
    lines.push(
      'Where σ_pt comes from a precision experiment, the repeatability and reproducibility standard deviations were estimated as in ISO 5725-2 (§8.4 of ISO 13528:2015).',
    );
  }
  for (const l of lines) write(doc, l, { size: 9.5, gap: 5 });
  const width = doc.page.width - 2 * MARGIN;
  wrapTable(
    doc,
    [
      { title: 'Item, measurand', width: 75 },
      { title: 'x_pt and its nature', width: 150 },
      { title: 's*', width: 45, align: 'right' },
      { title: 'σ_pt and why it is fit for purpose', width: width - 345 },
      { title: 'u(x_pt)', width: 75 },
    ],
    input.groups.map((g) => {
      const d = g.decimals + 1;
      const u = g.unit ? ` ${g.unit}` : '';
      const ratio = g.uAssigned !== null && g.sigmaPt ? g.uAssigned / g.sigmaPt : null;
      return [
        `${g.itemCode}, ${g.measurandName}`,
        `${fixed(g.assignedValue, d)}${u}: ${METHOD_WORDS[g.method] ?? g.method}; ${assignedValueNature(g)}`,
        fixed(g.robustSd, d),
        `${fixed(g.sigmaPt, d)}${u}: ${sigmaPtRuleWords(g.sigmaPtRule)}; ${sigmaPtFitness(g)}`,
        `${fixed(g.uAssigned, d)}${u}; ${ratio === null ? '—' : `${ratio.toFixed(2)} σ_pt, ${g.uNegligible === false ? 'not negligible: z′ used' : 'negligible: z used'}`}`,
      ];
    }),
    7.5,
  );
  exclusionsSection(doc, input);
  write(
    doc,
    'References: ISO 13528:2015 Statistical methods for use in proficiency testing by interlaboratory comparison; ISO 5725-2:2019 Accuracy of measurement methods and results, Part 2; ISO/IEC 17043:2023 Conformity assessment, general requirements for proficiency testing; ISO 22412:2017 Particle size analysis, dynamic light scattering.',
    { size: 8.5, colour: PALETTE.grey, gap: 5 },
  );
}

/** Participants kept out of the assigned value, by code, with the rule and the reason. */
function exclusionsSection(doc: Doc, input: RoundReportInput): void {
  const rows: string[][] = [];
  for (const g of input.groups) {
    for (const p of g.participants) {
      if (p.excluded)
        rows.push([
          p.code,
          `${g.itemCode}, ${g.measurandName}`,
          EXCLUSION_RULE_LABELS[p.excluded.rule] ?? 'Other',
          p.excluded.reason,
        ]);
    }
  }
  write(doc, 'Participants excluded from the assigned value', { size: 10, bold: true, gap: 3 });
  if (rows.length === 0) {
    write(doc, 'None: every reported result was used for the assigned value.', {
      size: 9.5,
      gap: 5,
    });
    return;
  }
  write(
    doc,
    `${rows.length} result(s) were kept out of the assigned value for the reason stated; they are still scored.`,
    { size: 9.5, gap: 3 },
  );
  const width = doc.page.width - 2 * MARGIN;
  wrapTable(
    doc,
    [
      { title: 'Code', width: 55 },
      { title: 'Item, measurand', width: 110 },
      { title: 'Rule', width: 150 },
      { title: 'Reason', width: width - 315 },
    ],
    rows,
    8,
  );
}

/**
 * The two charts of an item × measurand side by side (Figures with text alternatives), then a
 * note for every result or score drawn at an axis edge, with its true value.
 */
export function drawGroupCharts(
  doc: Doc,
  g: ReportGroup,
  highlight?: string,
  ownResult?: number,
): void {
  const width = (doc.page.width - 2 * MARGIN - 10) / 2;
  ensureSpace(doc, width * 0.65 + 10);
  const y = doc.y + 4;
  const u = g.unit ? ` ${g.unit}` : '';
  const svg = { w: 400, h: 260 };
  const h1 = chartFigure(
    doc,
    distributionOption(g, ownResult),
    `Histogram of the participants’ results for item ${g.itemCode}, ${g.measurandName}, with x_pt = ${fixed(g.assignedValue, g.decimals + 1)}${u} and x_pt ± 2σ_pt marked.`,
    svg,
    { x: MARGIN, y, width },
  );
  const h2 = chartFigure(
    doc,
    scoreBarOption(g, highlight),
    `Scores of every participant for item ${g.itemCode}, ${g.measurandName}, in ascending order, with the warning (±${SIGNAL_LIMITS.warning}) and action (±${SIGNAL_LIMITS.action}) limits.`,
    svg,
    { x: MARGIN + width + 10, y, width },
  );
  doc.y = y + Math.max(h1, h2) + 6;
  doc.x = MARGIN;
  const off = offScale(g);
  const d = g.decimals;
  const list = (xs: { code: string; result: number }[]) =>
    xs.map((x) => `${x.code} ${fixed(x.result, d)}${u}`).join(', ');
  if (off.below.length || off.above.length) {
    write(
      doc,
      `Outside the histogram’s axis (x_pt ± 5σ_pt), not drawn in it: ${[off.below.length ? `below: ${list(off.below)}` : '', off.above.length ? `above: ${list(off.above)}` : ''].filter(Boolean).join('; ')}.`,
      { size: 8.5, colour: PALETTE.carmine, gap: 2 },
    );
  }
  const far = scoresOffScale(g);
  if (far.length) {
    write(
      doc,
      `Scores beyond ±5 are drawn at the chart’s edge with their value written on the bar: ${far.map((x) => `${x.code} ${x.score.toFixed(SCORE_DECIMALS)}`).join(', ')}.`,
      { size: 8.5, colour: PALETTE.carmine, gap: 2 },
    );
  }
}

/** An item × measurand as its section heading names it: "Item A: Z-average diameter (nm)". */
export function groupTitle(g: ReportGroup): string {
  return `Item ${g.itemCode}: ${g.measurandName}${g.unit ? ` (${g.unit})` : ''}`;
}

/** The line under a group's heading: x_pt, u(x_pt) and σ_pt (one decimal more than the results) and n. */
export function groupValuesLine(g: ReportGroup): string {
  const d = g.decimals + 1;
  const u = g.unit ? ` ${g.unit}` : '';
  return `Assigned value x_pt = ${fixed(g.assignedValue, d)}${u}   u(x_pt) = ${fixed(g.uAssigned, d)}${u}   σ_pt = ${fixed(g.sigmaPt, d)}${u}   n = ${g.n}`;
}

function groupSection(doc: Doc, g: ReportGroup, index: number, highlight?: string): void {
  doc.addPage();
  if (index === 0) heading(doc, '4 Results by item and measurand');
  heading(doc, `4.${index + 1} ${groupTitle(g)}`, 2);
  const d = g.decimals;
  const u = g.unit ? ` ${g.unit}` : '';
  write(doc, groupValuesLine(g), { bold: true, size: 10.5, gap: 3 });
  write(
    doc,
    `x_pt: ${METHOD_WORDS[g.method] ?? g.method}. σ_pt: ${sigmaPtRuleWords(g.sigmaPtRule)}. Signal follows ${g.uNegligible === false ? 'z′ (u(x_pt) is not negligible)' : 'z'}.`,
    { size: 9, gap: 3 },
  );
  for (const w of g.warnings) write(doc, `Note: ${w}`, { size: 9, colour: PALETTE.saffron });
  drawGroupCharts(doc, g, highlight);
  const counts = (['acceptable', 'warning', 'action'] as const).map(
    (s) => `${g.participants.filter((p) => p.signal === s).length} ${SIGNAL_WORDS[s]}`,
  );
  write(doc, `Signals: ${counts.join(', ')}.`, { size: 9, gap: 4 });
  const hintCodes = new Map<string, number>();
  g.participants.forEach((p, i) =>
    p.hints.forEach((h) => hintCodes.set(h.code, hintCodes.get(h.code) ?? i)),
  );
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
    write(
      doc,
      'Hints (general patterns the software looks for; a hint is a prompt for the laboratory’s own investigation, not a finding):',
      { size: 8.5, bold: true },
    );
    for (const code of hintCodes.keys())
      write(doc, `${mark(code)}: ${hintWords(code)}.`, { size: 8.5 });
  }
}

/** Coordinator's comments, caution on use and the authorisation (ISO/IEC 17043 report content, from memory). */
export function closingSections(doc: Doc, input: RoundReportInput, first: number): void {
  ensureSpace(doc, 160);
  heading(doc, `${first} Comments of the coordinator`);
  write(
    doc,
    input.evaluation.comments.trim() || 'The coordinator made no comments on this round.',
    { size: 9.5, gap: 6 },
  );
  heading(doc, `${first + 1} Use of the results, subcontracting and confidentiality`);
  write(doc, USE_CAUTION, { size: 9.5, gap: 5 });
  write(doc, `Subcontracting: ${input.provider.subcontracting || NO_SUBCONTRACTING_STATED}`, {
    size: 9.5,
    gap: 5,
  });
  write(doc, CONFIDENTIALITY, { size: 9.5, gap: 5 });
  heading(doc, `${first + 2} Authorisation`);
  const p = input.provider;
  const issued =
    input.evaluation.state === 'published'
      ? `issued ${day(input.evaluation.publishedAt)}`
      : 'not issued (preview)';
  write(
    doc,
    `${reportStatusWords(input.evaluation)}, ${issued}. Authorised by ${p.authoriserName || '(name not set in the provider profile)'}${p.authoriserRole ? `, ${p.authoriserRole}` : ''}, for ${providerName(input)}.`,
    { size: 9.5, gap: 4 },
  );
  write(
    doc,
    `Questions about this report: ${[p.contactEmail, p.contactPhone].filter(Boolean).join(', ') || 'the PT provider'}.`,
    { size: 9.5 },
  );
}

/** Builds the round report; resolves to the PDF bytes. */
export async function buildRoundReportPdf(input: RoundReportInput): Promise<Buffer> {
  const { doc, done } = createDoc({
    title: `Round report ${input.round.code}, version ${input.evaluation.version}`,
    subject: `Proficiency-testing round report: ${input.round.title} (${input.round.schemeName})`,
    footer: footerText(input, 'round report'),
    author: input.provider.name,
    ...docDates(input),
  });
  cover(doc, input, 'Round report');
  doc.addPage();
  schemeSection(doc, input);
  itemsSection(doc, input);
  methodsSection(doc, input);
  input.groups.forEach((g, i) => groupSection(doc, g, i));
  ensureSpace(doc, 160);
  heading(doc, '5 Blunder hints');
  write(
    doc,
    'The software compares each result with the assigned value and flags patterns that often come from a slip rather than from the measurement itself:',
    { size: 9.5, gap: 3 },
  );
  for (const code of Object.keys(HINT_WORDS)) write(doc, `• ${hintWords(code)}.`, { size: 9.5 });
  closingSections(doc, input, 6);
  finishDoc(doc);
  return done;
}

export { groupSection };
