/**
 * Every page of every PDF, rendered with Debian's poppler-utils (pdftoppm, pdftotext, pdfinfo)
 * and looked at: no large solid-black region, no flowing text inside a chart's plot area,
 * real metadata, a tagged PDF with an outline, and text that extracts in reading order.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildInstrumentChecksPdf, buildInvestigationsPdf } from '../evidence/lab-records';
import { largestBlackArea, renderPages, words, wordsOverPlots } from '../testing/page-check';
import { syntheticParticipantInput, syntheticReportInput } from '../testing/synthetic-input';
import { buildCertificatePdf } from './certificate';
import { createDoc, figure, finishDoc, layoutProbe, write } from './document';
import { buildParticipantReportPdf } from './participant-report';
import { buildRoundReportPdf } from './round-report';
import { buildPrecisionReportPdf } from './precision-report';
import { syntheticPrecisionInput } from '../testing/synthetic-precision';

/** A solid-black region larger than this (points², about 39 × 39 pt) fails a page. */
const MAX_BLACK = 1500;

function pdfinfo(pdf: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'ringlet-info-'));
  try {
    writeFileSync(join(dir, 'in.pdf'), pdf);
    return execFileSync('pdfinfo', [join(dir, 'in.pdf')]).toString('utf8');
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function pdftext(pdf: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'ringlet-text-'));
  try {
    writeFileSync(join(dir, 'in.pdf'), pdf);
    return execFileSync('pdftotext', [join(dir, 'in.pdf'), '-']).toString('utf8');
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

async function withPlots(
  build: () => Promise<Buffer>,
): Promise<{ pdf: Buffer; plots: typeof layoutProbe.plots }> {
  layoutProbe.enabled = true;
  layoutProbe.plots = [];
  try {
    const pdf = await build();
    return { pdf, plots: layoutProbe.plots };
  } finally {
    layoutProbe.enabled = false;
  }
}

function participantWithFarScores() {
  const input = syntheticParticipantInput({ participants: 25, blunders: [0] }, 0);
  // A Track record score beyond the chart's ±4 axis: drawn at the edge with its value beside it.
  input.track[0]!.points.push({
    roundId: input.round.id,
    roundCode: input.round.code,
    publishedAt: input.evaluation.publishedAt,
    itemCode: 'B',
    z: 6.3,
    signal: 'action',
  });
  return input;
}

const builders: [string, () => Promise<Buffer>][] = [
  [
    'round report',
    () =>
      buildRoundReportPdf(
        syntheticReportInput({
          participants: 25,
          blunders: [4],
          reissueReason: 'corrected σ_pt of item B',
        }),
      ),
  ],
  ['individual report', () => buildParticipantReportPdf(participantWithFarScores())],
  ['certificate', () => buildCertificatePdf(syntheticParticipantInput({ participants: 10 }, 1))],
  ['precision study report', () => buildPrecisionReportPdf(syntheticPrecisionInput())],
  [
    'investigations',
    () =>
      buildInvestigationsPdf(
        [
          {
            id: '00000000-0000-4000-8000-000000000001',
            roundCode: 'SYN-2025-1',
            participantCode: 'P001',
            itemCode: 'A',
            measurandName: 'Z-average',
            scoreKind: 'z',
            score: 3.4,
            signal: 'action',
            state: 'closed',
            causeCategory: 'data-entry',
            rootCause: 'Radius typed as diameter.',
            correctiveAction: 'Second person checks the entry.',
            effectivenessCheck: 'Next round acceptable.',
            closedAt: '2025-06-01T00:00:00.000Z',
            createdAt: '2025-04-01T00:00:00.000Z',
          },
        ],
        {
          lab: 'Invented Test Laboratory',
          provider: syntheticReportInput({ participants: 5 }).provider,
          generatedFor: 'Assessor <a@x.example>',
          generatedAt: '2025-07-01T00:00:00.000Z',
        },
      ),
  ],
  [
    'instrument checks',
    () =>
      buildInstrumentChecksPdf(
        [
          {
            id: '00000000-0000-4000-8000-000000000002',
            instrument: 'DLS unit 1',
            material: 'Latex 100 nm reference',
            referenceValueNm: 100,
            toleranceNm: 3,
            passed: true,
            notes: '',
            checkedAt: '2025-03-01T00:00:00.000Z',
          },
        ],
        {
          lab: 'Invented Test Laboratory',
          provider: syntheticReportInput({ participants: 5 }).provider,
          generatedFor: 'Assessor <a@x.example>',
          generatedAt: '2025-07-01T00:00:00.000Z',
        },
      ),
  ],
];

describe('PDF pages, rendered', () => {
  it.each(builders)(
    '%s: no large solid-black region and no text over a chart',
    async (_name, build) => {
      const { pdf, plots } = await withPlots(build);
      const pages = renderPages(pdf);
      expect(pages.length).toBeGreaterThan(0);
      pages.forEach((p, i) =>
        expect({ page: i + 1, black: largestBlackArea(p) < MAX_BLACK }).toEqual({
          page: i + 1,
          black: true,
        }),
      );
      expect(wordsOverPlots(words(pdf), plots).map((w) => `${w.page + 1}: ${w.text}`)).toEqual([]);
    },
  );

  it('finds what it looks for: a black box and text printed over a chart', async () => {
    const { pdf, plots } = await withPlots(async () => {
      const { doc, done } = createDoc({ title: 'probe', subject: 'probe', footer: 'probe' });
      doc.rect(100, 100, 150, 150).fillColor('#000000', 1).fill();
      doc.y = 400;
      figure(doc, 'empty chart', () => undefined, { x: 50, y: 390, width: 300, height: 100 });
      write(doc, 'RSZ printed over the chart', { y: 420 });
      finishDoc(doc);
      return done;
    });
    const [page] = renderPages(pdf);
    expect(largestBlackArea(page!)).toBeGreaterThan(MAX_BLACK);
    expect(wordsOverPlots(words(pdf), plots).map((w) => w.text)).toEqual([
      'RSZ',
      'printed',
      'over',
      'the',
      'chart',
    ]);
  });

  it.each(builders)(
    '%s: title, author, dates, language, tagged, with an outline',
    async (_name, build) => {
      const pdf = await build();
      const info = pdfinfo(pdf);
      expect(info).toMatch(/^Tagged:\s+yes$/m);
      expect(info).toMatch(/^Title:\s+\S.+$/m);
      expect(info).toMatch(/^Author:\s+Invented Colloid Proficiency Service$/m);
      expect(info).not.toMatch(/^CreationDate:.*1970/m);
      expect(info).toMatch(/^CreationDate:.*2025/m);
      const raw = pdf.toString('latin1');
      expect(raw).toContain('/Lang (en-GB)');
      expect(raw).toContain('/StructTreeRoot');
      expect(raw).toMatch(/\/DisplayDocTitle true/);
      expect(raw).toContain('/Outlines');
    },
  );

  it('round report text extracts in reading order, section after section', async () => {
    const text = pdftext(await buildRoundReportPdf(syntheticReportInput({ participants: 25 })));
    const order = [
      'Round report',
      '1 Scheme and round',
      '2 Test items, homogeneity and stability',
      '3 Statistical methods',
      '4 Results by item and measurand',
      '4.1 Item A',
      '4.4 Item B',
      '5 Blunder hints',
      '6 Comments of the coordinator',
      '7 Use of the results',
      '8 Authorisation',
    ];
    const at = order.map((h) => text.indexOf(h));
    expect(at.every((i) => i >= 0)).toBe(true);
    expect([...at].sort((a, b) => a - b)).toEqual(at);
  });
});
