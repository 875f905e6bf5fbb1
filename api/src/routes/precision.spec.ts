import { AuditEvent, PrecisionExclusion, Round, Scheme } from '../../../db/entities';
import { writePrecisionStudy, type WrittenPrecisionStudy } from '../../../db/seed/demo-precision';
import type { PrecisionAnalysis } from '../../../shared/contracts/precision';
import nistAnova from '../../../shared/stats/fixtures/precision-nist-anova.json';
import { api, binary, send, startCast, type Client, type TestApp } from '../testing/test-app';

/** Three labs × two replicates of one level, no flag: a study the analysis accepts. */
const THREE_LABS = [
  [1, 1.1],
  [1.2, 1.0],
  [1.1, 1.3],
];

/**
 * Precision studies through the API: the analysis from submitted versions, decisions (audited,
 * bounded), reference values, finishing, σ_pt sources, and the refusals between PT rounds and
 * precision studies.
 */
describe('precision studies', () => {
  let t: TestApp;
  let coord: Client;
  let schemeId: string;
  let labIds: string[];
  let studies = 0;

  beforeAll(async () => {
    const cast = await startCast({
      labs: Array.from({ length: 8 }, (_, i) => `Study lab ${i + 1}`),
      users: [{ email: 'coord@rr.test', roles: ['coordinator'], signIn: true }],
    });
    ({ t, labIds } = cast);
    const scheme = await t.ds
      .getRepository(Scheme)
      .save({ code: 'RR-SCHEME', name: 'Round robins (test)' });
    schemeId = scheme.id;
    coord = cast.as('coord@rr.test');
  });
  afterAll(() => t.close());

  /** A study with one level 'A' of measurand 'x': cells[i] = replicates of lab i. */
  function study(
    cells: number[][],
    opts: { kind?: 'pt' | 'precision'; state?: Round['state'] } = {},
  ): Promise<WrittenPrecisionStudy> {
    studies++;
    return writePrecisionStudy(t.ds, {
      schemeId,
      code: `RR-T${studies}`,
      title: `Study ${studies}`,
      state: opts.state ?? 'closed',
      kind: opts.kind,
      levels: [{ code: 'A', material: 'level A', nominalSizeNm: null }],
      measurand: { key: 'x', name: 'Value', unit: 'nm', decimals: 4, replicatesRequired: 5 },
      labs: cells.map((values, i) => ({
        organisationId: labIds[i]!,
        participantCode: `L${i + 1}`,
        values: { A: values },
      })),
    });
  }

  const get = async (id: string): Promise<PrecisionAnalysis> =>
    (await coord.agent.get(api(`/rounds/${id}/precision`)).expect(200)).body;
  const decide = (id: string, body: object) =>
    send(coord, `/rounds/${id}/precision/exclusions`, body);
  /** One decision on level 'A' of 'x' (an outlier confirmed, unless `over` says otherwise). */
  const decision = (participantCode: string, over: Record<string, unknown> = {}) => ({
    itemCode: 'A',
    measurandKey: 'x',
    participantCode,
    kind: 'outlier',
    decision: 'confirmed',
    reason: 'r r r',
    ...over,
  });
  const finish = (id: string) => send(coord, `/rounds/${id}/precision/finish`, {});

  it('NIST StRD SiRstv as 5 labs × 5 replicates: s_r = certified residual SD 1.04076068334656E-01', async () => {
    // Source: NIST Statistical Reference Datasets, ANOVA, SiRstv (shared/stats/fixtures/precision-nist-anova.json).
    const groups = (nistAnova.sets as Record<string, { groups: string[][] }>).SiRstv.groups;
    const s = await study(groups.map((g) => g.map(Number)));
    const a = await get(s.round.id);
    const lv = a.measurands[0]!.levels[0]!;
    expect(lv.p).toBe(5);
    expect(lv.n).toBe(25);
    expect(Math.abs(lv.sr! - 0.104076068334656) / 0.104076068334656).toBeLessThan(1e-12);
    // certified between-groups mean square 1.27865654E-02 = s_d²
    expect(Math.abs(lv.betweenMeanSquare! - 0.0127865654) / 0.0127865654).toBeLessThan(1e-12);
    expect(lv.r).toBeCloseTo(2.8 * lv.sr!, 12);
    expect(lv.cochran).not.toBeNull();
  });

  it('unequal replicate numbers: s_r pools Σ(n_i − 1)s_i²/Σ(n_i − 1), n̄ per ISO 5725-2 §7.4.4', async () => {
    const cells = [
      [10.1, 10.3],
      [10.6, 10.2, 10.4],
      [9.9, 10.0, 10.3, 10.2],
      [10.5, 10.1, 10.2],
    ];
    const s = await study(cells);
    const lv = (await get(s.round.id)).measurands[0]!.levels[0]!;
    // hand calculation from the definitions (ISO 5725-2:1994 §7.4.4–7.4.5, formulas as in docs/STATISTICS.md)
    const ss = cells.map((c) => {
      const m = c.reduce((a, v) => a + v, 0) / c.length;
      return c.reduce((a, v) => a + (v - m) ** 2, 0);
    });
    const df = cells.reduce((a, c) => a + c.length - 1, 0);
    expect(lv.sr).toBeCloseTo(Math.sqrt(ss.reduce((a, v) => a + v, 0) / df), 12);
    const N = 12;
    expect(lv.nBar).toBeCloseTo((N - (4 + 9 + 16 + 9) / N) / 3, 12);
    expect(lv.n).toBe(12);
    expect(lv.warnings.join(' ')).toMatch(/different numbers of results/);
  });

  it('a negative between-lab variance is set to zero with a note (s_R = s_r)', async () => {
    const s = await study([
      [9, 11],
      [9.5, 10.5],
      [10.5, 9.5],
      [11, 9],
    ]);
    const lv = (await get(s.round.id)).measurands[0]!.levels[0]!;
    expect(lv.sL).toBe(0);
    expect(lv.sR).toBe(lv.sr);
    expect(lv.sLNegativeNote).toMatch(/negative/);
  });

  it('decisions: confirm sets the cell aside, reject keeps it, both audited; withdraw reopens the flag', async () => {
    const cells = [
      [100.1, 100.3, 100.2],
      [100.4, 100.2, 100.5],
      [99.9, 100.0, 100.2],
      [100.3, 100.1, 100.2],
      [100.2, 100.4, 100.1],
      [100.0, 100.3, 100.2],
      [100.2, 100.1, 100.4],
      [104.9, 105.2, 105.0],
    ];
    const s = await study(cells);
    const before = await get(s.round.id);
    const lv0 = before.measurands[0]!.levels[0]!;
    expect(lv0.grubbs.singleHigh!.participantCodes).toEqual(['L8']);
    expect(lv0.grubbs.singleHigh!.classification).toBe('outlier');
    expect(before.pending.some((p) => p.participantCode === 'L8')).toBe(true);

    const rejected = await decide(s.round.id, {
      decisions: [decision('L8', { decision: 'rejected', reason: 'Kept for the test' })],
    }).expect(201);
    expect(rejected.body.measurands[0].levels[0].sR).toBe(lv0.sR);
    expect(rejected.body.pending).toHaveLength(0);

    const confirmed = await decide(s.round.id, {
      decisions: [decision('L8', { reason: 'Wrong temperature' })],
    }).expect(201);
    const lv1 = (confirmed.body as PrecisionAnalysis).measurands[0]!.levels[0]!;
    expect(lv1.p).toBe(7);
    expect(lv1.sR!).toBeLessThan(lv0.sR! / 5);
    expect(lv1.cells.find((c) => c.participantCode === 'L8')!.excluded).toBe(true);
    expect(confirmed.body.exclusions).toHaveLength(1);
    expect(confirmed.body.exclusions[0].reason).toBe('Wrong temperature');

    const audits = await t.ds
      .getRepository(AuditEvent)
      .find({ where: { action: 'precision.decision', subjectId: s.round.id } });
    expect(audits).toHaveLength(2);

    const list = await coord.agent
      .get(api(`/rounds/${s.round.id}/precision/exclusions`))
      .expect(200);
    expect(list.body.exclusions).toHaveLength(2);
    const withdrawn = await send(
      coord,
      `/rounds/${s.round.id}/precision/exclusions/${confirmed.body.exclusions[0].id}/withdraw`,
      { reason: 'Decided too early' },
    ).expect(200);
    // the older "kept" decision is in force again
    expect(withdrawn.body.measurands[0].levels[0].p).toBe(8);
    expect(withdrawn.body.exclusions[0].decision).toBe('rejected');

    // finish: no open flag left → evaluated; the study then lists as a σ_pt source
    await finish(s.round.id).expect(200);
    const round = await t.ds.getRepository(Round).findOneByOrFail({ id: s.round.id });
    expect(round.state).toBe('evaluated');
    const sources = await coord.agent
      .get(api(`/schemes/${schemeId}/precision-sources`))
      .expect(200);
    const mine = sources.body.studies.find((x: { roundId: string }) => x.roundId === s.round.id);
    expect(mine.measurands[0].levels[0].sR).toBeCloseTo(lv0.sR!, 12);
    // a later PT round of the scheme takes σ_R from the study, named by id and code
    const pt = await study([[100.1, 100.2]], { kind: 'pt', state: 'draft' });
    const patch = (study: object) =>
      send(
        coord,
        `/rounds/${pt.round.id}/measurands/${pt.measurand.id}`,
        {
          sigmaPtRule: { kind: 'precision', sigmaR: mine.measurands[0].levels[0].sR, study },
        },
        'patch',
      );
    await patch({ roundId: s.round.id, roundCode: s.round.code }).expect(200);
    const wrong = await patch({ roundId: s.round.id, roundCode: 'RR-OTHER' }).expect(422);
    expect(wrong.body.error.code).toBe('sigma_source_invalid');
    // a finished study takes no more decisions
    await decide(s.round.id, {
      decisions: [decision('L1', { kind: 'other', reason: 'Too late' })],
    }).expect(409);
  });

  it('finish refuses while a flag is undecided (422 listing it)', async () => {
    const s = await study([
      [1.0, 1.1],
      [1.05, 1.0],
      [1.1, 1.0],
      [1.0, 1.05],
      [1.02, 1.08],
      [3.0, 3.1],
    ]);
    const res = await finish(s.round.id).expect(422);
    expect(res.body.error.code).toBe('undecided_flags');
  });

  it('bad input answers 400 naming the field and stores nothing', async () => {
    const s = await study(THREE_LABS);
    const bad = [
      [decision('NOPE'), 'decisions.0.participantCode'],
      [decision('L1', { itemCode: 'Z' }), 'decisions.0.itemCode'],
      [decision('L1', { replicate: 3 }), 'decisions.0.replicate'],
      [decision('L1', { replicate: 99 }), 'decisions.0.replicate'],
      [decision('L1', { reason: '' }), 'decisions.0.reason'],
      [decision('L1', { kind: 'nonsense' }), 'decisions.0.kind'],
      [decision('L1\u0007'), 'decisions.0.participantCode'],
    ] as const;
    for (const [decision, path] of bad) {
      const res = await decide(s.round.id, { decisions: [decision] }).expect(400);
      expect(JSON.stringify(res.body)).toContain(path);
    }
    const ref = await send(
      coord,
      `/rounds/${s.round.id}/precision/references`,
      { references: [{ itemCode: 'A', measurandKey: 'x', value: 1e300, source: 'x' }] },
      'put',
    ).expect(400);
    expect(JSON.stringify(ref.body)).toContain('references.0.value');
    expect(
      await t.ds.getRepository(PrecisionExclusion).count({ where: { roundId: s.round.id } }),
    ).toBe(0);
  });

  it('reference values give the bias (ISO 5725-4) and are audited', async () => {
    const s = await study([
      [10.1, 10.2],
      [10.4, 10.3],
      [10.0, 10.2],
      [10.3, 10.2],
    ]);
    const res = await send(
      coord,
      `/rounds/${s.round.id}/precision/references`,
      {
        references: [
          { itemCode: 'A', measurandKey: 'x', value: 10.0, u: null, source: 'Certificate' },
        ],
      },
      'put',
    ).expect(200);
    const lv = (res.body as PrecisionAnalysis).measurands[0]!.levels[0]!;
    expect(lv.bias!.bias).toBeCloseTo(lv.mean! - 10.0, 12);
    expect(lv.bias!.significant).toBe(true);
    expect(
      await t.ds.getRepository(AuditEvent).count({ where: { action: 'precision.references-set' } }),
    ).toBeGreaterThan(0);
  });

  it('a PT round answers 422 on the precision routes; a precision study 422 on the PT evaluation', async () => {
    const pt = await study(THREE_LABS, { kind: 'pt' });
    const r1 = await coord.agent.get(api(`/rounds/${pt.round.id}/precision`)).expect(422);
    expect(r1.body.error.code).toBe('not_a_precision_study');
    await decide(pt.round.id, { decisions: [decision('L1')] }).expect(422);
    const rr = await study(THREE_LABS);
    const r2 = await send(coord, `/rounds/${rr.round.id}/evaluation`, {}).expect(422);
    expect(r2.body.error.code).toBe('precision_study_no_scores');
    // The Consensus board lists PT rounds only: a study has no board of scores to open.
    const boards = (await coord.agent.get(api('/boards')).expect(200)).body as {
      roundId: string;
    }[];
    expect(boards.map((b) => b.roundId)).toContain(pt.round.id);
    expect(boards.map((b) => b.roundId)).not.toContain(rr.round.id);
    await coord.agent
      .get(api(`/rounds/00000000-0000-4000-8000-000000000000/precision`))
      .expect(404);
    const draft = await study([[1, 1.1]], { state: 'draft' });
    await coord.agent.get(api(`/rounds/${draft.round.id}/precision`)).expect(409);
  });
});

describe('precision study reports', () => {
  let t: TestApp;
  let coord: Client;
  let lab: Client;
  let roundId: string;
  beforeAll(async () => {
    const cast = await startCast({
      labs: Array.from({ length: 4 }, (_, i) => `Report lab ${i + 1}`),
      users: [
        { email: 'coord@rep.test', roles: ['coordinator'], signIn: true },
        { email: 'lab@rep.test', lab: 0, manager: true, signIn: true },
      ],
    });
    t = cast.t;
    const scheme = await t.ds
      .getRepository(Scheme)
      .save({ code: 'RR-REP', name: 'Reports (test)' });
    const s = await writePrecisionStudy(t.ds, {
      schemeId: scheme.id,
      code: 'RR-REP-1',
      title: 'Report study',
      state: 'closed',
      levels: [
        { code: 'A', material: 'latex 60 nm', nominalSizeNm: 60 },
        { code: 'B', material: 'latex 200 nm', nominalSizeNm: 200 },
      ],
      measurand: { key: 'z', name: 'Z-average', unit: 'nm', decimals: 1, replicatesRequired: 2 },
      labs: cast.labIds.map((organisationId, i) => ({
        organisationId,
        participantCode: `C${i + 1}`,
        values: { A: [60 + i * 0.4, 60.2 + i * 0.3], B: [200 + i, 201 + i * 0.8] },
      })),
    });
    roundId = s.round.id;
    coord = cast.as('coord@rep.test');
    lab = cast.as('lab@rep.test');
  });
  afterAll(() => t.close());

  it('PDF and workbook for the coordinator, codes only; a lab is refused', async () => {
    const pdf = await coord.agent
      .get(api(`/rounds/${roundId}/reports/precision.pdf`))
      .buffer(true)
      .parse(binary)
      .expect(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const body = pdf.body as Buffer;
    expect(body.subarray(0, 5).toString()).toBe('%PDF-');
    expect(body.toString('latin1')).not.toContain('Report lab');
    const xlsx = await coord.agent
      .get(api(`/rounds/${roundId}/reports/precision.xlsx`))
      .buffer(true)
      .parse(binary)
      .expect(200);
    const ExcelJS = (await import('exceljs')).default;
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(xlsx.body as unknown as ArrayBuffer);
    expect(wb.worksheets.map((w) => w.name)).toEqual([
      'Summary',
      'Data',
      'Tests',
      'Decisions',
      'Level fit',
      'Bias',
    ]);
    expect(wb.getWorksheet('Data')!.rowCount).toBe(1 + 2 * 4);
    await lab.agent.get(api(`/rounds/${roundId}/reports/precision.pdf`)).expect(403);
    const mine = await lab.agent.get('/api/v1/my/rounds').expect(200);
    expect(mine.body.find((r: { roundId: string }) => r.roundId === roundId)?.kind).toBe(
      'precision',
    );
  });
});
