/**
 * A lab's individual report (PDF): its own results and scores per item × measurand with a
 * plain explanation, its position in the distribution (rank and the histogram with its result
 * marked), the score chart with its code marked, and its Track record. Other labs appear only
 * as codes (in the charts, unnamed bars).
 */
import { SIGNAL_LIMITS } from '../../shared/stats/scores';
import { EXCLUSION_RULE_LABELS } from '../../shared/contracts/evaluation';
import { explainScore } from '../../shared/evaluation/explain';
import { trackRecordOption } from '../charts/options';
import { mainScore, type ParticipantReportInput, type ReportGroup } from '../model';
import { day, fixed, PALETTE, SCORE_DECIMALS, SIGNAL_COLOURS, SIGNAL_WORDS } from '../text';
import { createDoc, finishDoc, heading, MARGIN, table, write, type Doc } from './document';
import {
  closingSections,
  cover,
  docDates,
  drawGroupCharts,
  footerText,
  groupTitle,
  groupValuesLine,
} from './round-report';
import { chartFigure } from './chart-figure';

/** Share of the other participants' results below this one (0–100 %), and the rank from the lowest. */
export function position(
  g: ReportGroup,
  code: string,
): { rank: number; of: number; percentBelow: number } | null {
  const own = g.participants.find((p) => p.code === code);
  if (!own) return null;
  const values = g.participants.map((p) => p.result).sort((a, b) => a - b);
  const below = values.filter((v) => v < own.result).length;
  return {
    rank: below + 1,
    of: values.length,
    percentBelow: values.length > 1 ? (100 * below) / (values.length - 1) : 0,
  };
}

function ownGroup(doc: Doc, input: ParticipantReportInput, g: ReportGroup, index: number): void {
  const p = g.participants.find((x) => x.code === input.participantCode);
  if (!p) return;
  doc.addPage();
  const u = g.unit ? ` ${g.unit}` : '';
  heading(doc, `${index + 1} ${groupTitle(g)}`);
  write(doc, groupValuesLine(g), { size: 10, gap: 4 });
  const reps = g.replicates[p.code] ?? [];
  table(
    doc,
    [
      { title: 'Your replicates', width: 150 },
      { title: `Mean${u}`, width: 60, align: 'right' },
      { title: 'z', width: 45, align: 'right' },
      { title: 'z′', width: 45, align: 'right' },
      { title: 'ζ', width: 45, align: 'right' },
      { title: 'En', width: 45, align: 'right' },
      { title: 'Signal', width: 100 },
    ],
    [
      [
        reps.map((v) => fixed(v, g.decimals)).join('  '),
        fixed(p.result, g.decimals),
        fixed(p.z, SCORE_DECIMALS),
        fixed(p.zPrime, SCORE_DECIMALS),
        fixed(p.zeta, SCORE_DECIMALS),
        fixed(p.en, SCORE_DECIMALS),
        p.signal
          ? { text: SIGNAL_WORDS[p.signal], colour: SIGNAL_COLOURS[p.signal], bold: true }
          : '—',
      ],
    ],
    9,
  );
  const pos = position(g, p.code);
  if (pos)
    write(
      doc,
      `Position: your result is number ${pos.rank} of ${pos.of} from the lowest; ${pos.percentBelow.toFixed(0)} % of the other results are lower.`,
      { size: 9.5, gap: 3 },
    );
  const s = mainScore(p);
  for (const line of explainScore(p, {
    measurandName: g.measurandName,
    unit: g.unit,
    decimals: g.decimals,
    assignedValue: g.assignedValue,
    sigmaPt: g.sigmaPt,
    uAssigned: g.uAssigned,
  })) {
    write(doc, line, { size: 9.5, gap: 2 });
  }
  // explainScore already gives each hint in the lab's own terms; the general wording is in the round report.
  if (p.excluded)
    write(
      doc,
      `Your result was kept out of the assigned value (${EXCLUSION_RULE_LABELS[p.excluded.rule as keyof typeof EXCLUSION_RULE_LABELS] ?? p.excluded.rule}): ${p.excluded.reason}. It is still scored.`,
      { size: 9.5 },
    );
  drawGroupCharts(doc, g, p.code, p.result);
  if (s !== null)
    write(
      doc,
      'In the charts your result is the line marked “you” and your score is drawn darker (or pinned).',
      { size: 8, colour: PALETTE.grey },
    );
}

/** Builds a lab's individual report; resolves to the PDF bytes. */
export async function buildParticipantReportPdf(input: ParticipantReportInput): Promise<Buffer> {
  const { doc, done } = createDoc({
    title: `Individual report ${input.round.code}, participant ${input.participantCode}, version ${input.evaluation.version}`,
    subject: `Proficiency-testing individual report: ${input.round.title} (${input.round.schemeName})`,
    footer: footerText(input, 'individual report', input.participantCode),
    author: input.provider.name,
    ...docDates(input),
  });
  cover(doc, input, 'Individual report', [
    `Lab: ${input.labName}`,
    `Participant code: ${input.participantCode}`,
  ]);
  input.groups.forEach((g, i) => ownGroup(doc, input, g, i));
  doc.addPage();
  const n = input.groups.length;
  heading(doc, `${n + 1} Track record`);
  const issued = input.evaluation.publishedAt;
  write(
    doc,
    issued
      ? `Scores of rounds published up to this report’s issue date (${day(issued)}); later rounds are not shown.`
      : 'Scores of every round published so far (this is a preview, not an issued report).',
    { size: 9, colour: PALETTE.grey, gap: 4 },
  );
  const points = input.track.reduce((s, t) => s + t.points.length, 0);
  if (points === 0) write(doc, 'No published score yet.', { size: 9.5 });
  else {
    const y = doc.y + 4;
    const h = chartFigure(
      doc,
      trackRecordOption(input.track),
      `Track record of participant ${input.participantCode}: its z-scores per round and item, with the warning (±${SIGNAL_LIMITS.warning}) and action (±${SIGNAL_LIMITS.action}) limits.`,
      { w: 600, h: 280 },
      { x: MARGIN, y, width: doc.page.width - 2 * MARGIN },
    );
    doc.y = y + h + 8;
    doc.x = MARGIN;
    const far = input.track.flatMap((t) =>
      t.points
        .filter((p) => Math.abs(p.z) > 4)
        .map(
          (p) => `${p.roundCode} ${p.itemCode} ${t.measurandName} ${p.z.toFixed(SCORE_DECIMALS)}`,
        ),
    );
    if (far.length)
      write(
        doc,
        `Scores beyond ±4 are drawn at the chart’s edge with their value beside the mark: ${far.join(', ')}.`,
        { size: 8.5, colour: PALETTE.carmine, gap: 3 },
      );
    for (const t of input.track) {
      write(
        doc,
        `${t.measurandName}: ${t.points.length} score(s); rescaled sum of z-scores RSZ = ${t.rsz === null ? '—' : t.rsz.toFixed(2)}.`,
        { size: 9.5 },
      );
      for (const f of t.findings)
        write(doc, `• ${f.roundCode}: ${f.message}`, { size: 9.5, colour: PALETTE.saffron });
    }
  }
  closingSections(doc, input, n + 2);
  finishDoc(doc);
  return done;
}
