/**
 * The round report and individual report of a demo round (the invented scenario seeded
 * through the real services): the report content ISO/IEC 17043 asks for, and every page
 * rendered and looked at.
 *
 * The clause list is ISO/IEC 17043:2023 §7.4 (reports) with ISO 13528 on σ_pt, x_pt and its
 * uncertainty, recalled from memory: not checked against the text of the standards.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  evaluationHead,
  participantReportInput,
  roundReportInput,
} from '../../api/src/services/reports-input';
import { DEMO_PROVIDER_PROFILE } from '../../db/seed/demo-provider';
import { seedDemo } from '../../db/seed/demo';
import { createTestDatabase, type TestDatabase } from '../../db/testing';
import { largestBlackArea, renderPages, words, wordsOverPlots } from '../testing/page-check';
import { layoutProbe } from './document';
import { buildParticipantReportPdf } from './participant-report';
import { buildRoundReportPdf } from './round-report';

function pdftext(pdf: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'ringlet-text-'));
  try {
    writeFileSync(join(dir, 'in.pdf'), pdf);
    return execFileSync('pdftotext', [join(dir, 'in.pdf'), '-'])
      .toString('utf8')
      .replace(/\s+/g, ' ');
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

describe('demo round report', () => {
  let db: TestDatabase;
  let roundPdf: Buffer;
  let text: string;
  let plots: typeof layoutProbe.plots;

  beforeAll(async () => {
    db = await createTestDatabase();
    await seedDemo(db.ds, 'demo-password-for-tests');
    const rounds: { id: string }[] = await db.ds.query(
      `SELECT id FROM round WHERE code = 'NPS-2025-A'`,
    );
    const head = (await evaluationHead(db.ds.manager, rounds[0]!.id, true))!;
    layoutProbe.enabled = true;
    layoutProbe.plots = [];
    roundPdf = await buildRoundReportPdf(await roundReportInput(db.ds.manager, head));
    plots = layoutProbe.plots;
    layoutProbe.enabled = false;
    text = pdftext(roundPdf);
  }, 120_000);

  afterAll(async () => {
    layoutProbe.enabled = false;
    await db?.drop();
  });

  // ISO/IEC 17043:2023 §7.4 report content, from memory (see the file's header).
  const clauses: [string, RegExp][] = [
    ['PT provider name', new RegExp(DEMO_PROVIDER_PROFILE.name)],
    ['provider address', /Quarry Lane Science Park/],
    ['provider contact', new RegExp(DEMO_PROVIDER_PROFILE.contactEmail.replace(/\./g, '\\.'))],
    ['accreditation number', /accreditation number PTP-0427/],
    [
      'person authorising the report, with role',
      /Authorised by Dr Imogen Vale, Technical manager, proficiency testing/,
    ],
    ['report status', /Report status Final report, version 1/],
    ['issue date', /Issue date \d{4}-\d{2}-\d{2}/],
    ['dispatch date', /Test items dispatched \d{4}-\d{2}-\d{2}/],
    ['date results were due', /Results due \d{4}-\d{2}-\d{2}/],
    ['round and scheme identification', /Round NPS-2025-A: .* Scheme NPS-DLS/],
    ['test items', /2 Test items, homogeneity and stability/],
    [
      'homogeneity: data, criterion and outcome per item, or a statement that none was done',
      /(Homogeneity study .*criterion 0\.3 σ_pt.*(Pass|Fail))|No homogeneity study and no stability study is recorded/,
    ],
    ['stability, same', /(Stability study .*(Pass|Fail))|no stability study is recorded/],
    ['participants enrolled who did not report, by code', /Enrolled but did not report: /],
    [
      'participants excluded from the assigned value, with the reason',
      /Participants excluded from the assigned value (None|\d+ result)/,
    ],
    ['s* (robust standard deviation)', /robust standard deviation s\*/],
    ['how σ_pt was set and why it is fit for purpose', /σ_pt and why it is fit for purpose/],
    [
      'nature of x_pt (consensus, traceability)',
      /consensus value of the participants’ results; it is not metrologically traceable/,
    ],
    [
      'u(x_pt) and whether it is negligible',
      /u\(x_pt\) is negligible when u\(x_pt\) ≤ 0\.3 σ_pt.*(negligible: z used|not negligible: z′ used)/,
    ],
    ['performance criteria', /warning signal.*action signal/],
    ['statistical methods with references', /3 Statistical methods.*ISO 13528/],
    [
      'confidentiality',
      /Confidentiality: participants appear in this report only by their participant codes/,
    ],
    ['caution on the use of the results', /Use of these results: /],
    ['subcontracting statement', /Subcontracting: No part of the scheme is subcontracted/],
    ['coordinator’s comments', /6 Comments of the coordinator/],
  ];

  it.each(clauses)('states %s', (_name, pattern) => {
    expect(text).toMatch(pattern);
  });

  it('renders every page without a black box or text over a chart', () => {
    renderPages(roundPdf).forEach((p, i) =>
      expect({ page: i + 1, ok: largestBlackArea(p) < 1500 }).toEqual({ page: i + 1, ok: true }),
    );
    expect(wordsOverPlots(words(roundPdf), plots).map((w) => w.text)).toEqual([]);
  });

  it('an individual report issued in 2025 shows no later round in its Track record, and its chart is not covered', async () => {
    const rows: {
      round_id: string;
      organisation_id: string;
      participant_code: string;
      name: string;
    }[] = await db.ds.query(
      `SELECT e.round_id, e.organisation_id, e.participant_code, o.name FROM enrolment e JOIN organisation o ON o.id = e.organisation_id
         JOIN round r ON r.id = e.round_id WHERE r.code = 'NPS-2025-A' AND o.name = 'Aldergrove Colloid Laboratory'`,
    );
    const r = rows[0]!;
    const head = (await evaluationHead(db.ds.manager, r.round_id, true))!;
    const input = await participantReportInput(db.ds.manager, head, {
      organisationId: r.organisation_id,
      participantCode: r.participant_code,
      labName: r.name,
    });
    const later: { code: string }[] = await db.ds.query(
      `SELECT r.code FROM round r JOIN evaluation e ON e.round_id = r.id WHERE e.state = 'published' AND e.published_at > $1`,
      [head.published_at],
    );
    expect(later.length).toBeGreaterThan(0); // the scenario has rounds published after NPS-2025-A
    const shown = new Set(input.track.flatMap((t) => t.points.map((p) => p.roundCode)));
    for (const l of later) expect(shown.has(l.code)).toBe(false);
    layoutProbe.enabled = true;
    layoutProbe.plots = [];
    const pdf = await buildParticipantReportPdf(input);
    const own = layoutProbe.plots;
    layoutProbe.enabled = false;
    renderPages(pdf).forEach((p, i) =>
      expect({ page: i + 1, ok: largestBlackArea(p) < 1500 }).toEqual({ page: i + 1, ok: true }),
    );
    expect(wordsOverPlots(words(pdf), own).map((w) => w.text)).toEqual([]);
    const t = pdftext(pdf);
    expect(t).toContain('Scores of rounds published up to this report’s issue date');
    // The lab's own hint appears once per item × measurand, not twice.
    expect((t.match(/Hint: /g) ?? []).length).toBeLessThanOrEqual(input.groups.length);
  });
});
