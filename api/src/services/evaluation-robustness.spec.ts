import { Client as PgClient } from 'pg';
import { SubmissionVersion } from '../../../db/entities';
import type { EvaluationView, LabScores } from '../../../shared/contracts/evaluation';
import { RANGES } from '../../../shared/contracts/ranges';
import {
  cleanResults,
  createBenchRound,
  enrol,
  passingCheck,
  type BenchRound,
} from '../testing/bench-fixtures';
import { buildEvaluationFixture, type EvaluationFixture } from '../testing/evaluation-fixtures';
import {
  api,
  commitAndPublish,
  createUser,
  send,
  signedIn,
  startCast,
  type Client,
  type TestApp,
} from '../testing/test-app';

/**
 * Absurd numbers and duplicates: refused at submit with a 400 naming the field; stored data that
 * predates the bounds is evaluated without a 500, with a reason per participant it cannot score.
 */
describe('absurd values and duplicates', () => {
  let t: TestApp;
  let lab: Client;
  let r: BenchRound;
  let coord: Client;
  let fx: EvaluationFixture;

  beforeAll(async () => {
    const cast = await startCast({
      labs: ['Range Lab'],
      users: [
        { email: 'lab@range.test', lab: 0, manager: true, signIn: true },
        { email: 'coord@range.test', roles: ['coordinator'], signIn: true },
      ],
    });
    t = cast.t;
    lab = cast.as('lab@range.test');
    coord = cast.as('coord@range.test');
    r = await createBenchRound(t.ds);
    await enrol(t.ds, r.round.id, cast.labIds[0]!, 'P01');
    await send(lab, '/my/instrument-checks', passingCheck()).expect(201);
  });
  afterAll(() => t.close());

  async function submit(data: unknown) {
    return send(lab, `/rounds/${r.round.id}/submission/submit`, {
      idempotencyKey: `key-${Math.random().toString(36).slice(2)}`,
      data,
    });
  }
  const versions = async () => await t.ds.getRepository(SubmissionVersion).count();

  it('refuses an uncertainty of 1e308 with 400 naming the field, and stores nothing', async () => {
    const data = cleanResults(r);
    data.items[0]!.results[0]!.uncertainty = { kind: 'standard', value: 1e308, k: null };
    const before = await versions();
    const res = await submit(data);
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(
      'data.items.0.results.0.uncertainty.value',
    );
    expect(await versions()).toBe(before);
  });

  it('refuses an uncertainty far above the result (more than 10 times)', async () => {
    const data = cleanResults(r);
    data.items[0]!.results[0]!.uncertainty = { kind: 'expanded', value: 5000, k: 2 };
    const res = await submit(data);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('data.items.0.results.0.uncertainty.value');
  });

  it.each([
    ['1e308 nm', 1e308, 'data.items.0.results.0.replicates.0'],
    ['1e-300 nm', 1e-300, 'data.items.0.results.0.replicates.0'],
    ['0.1 nm (below the DLS range)', 0.1, 'data.items.0.results.0.replicates.0'],
    ['20 µm (above the DLS range)', 20_000, 'data.items.0.results.0.replicates.0'],
  ])('refuses a diameter of %s with 400 naming the replicate', async (_label, value, path) => {
    const data = cleanResults(r);
    data.items[0]!.results[0]!.replicates[0] = value;
    const before = await versions();
    const res = await submit(data);
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(path);
    expect(await versions()).toBe(before);
  });

  it('refuses a viscosity of 1e308 mPa·s and a temperature of 500 °C', async () => {
    const data = cleanResults(r);
    data.items[1]!.conditions.viscosityMPas = 1e308;
    data.items[1]!.conditions.temperatureC = 500;
    const res = await submit(data);
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(
      expect.arrayContaining([
        'data.items.1.conditions.viscosityMPas',
        'data.items.1.conditions.temperatureC',
      ]),
    );
  });

  it('refuses the same item twice, naming the duplicate', async () => {
    const data = cleanResults(r);
    data.items.push(structuredClone(data.items[0]!));
    const res = await submit(data);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('data.items.2.testItemId');
  });

  it('refuses the same measurand twice within an item, naming the duplicate', async () => {
    const data = cleanResults(r);
    data.items[1]!.results.push(structuredClone(data.items[1]!.results[0]!));
    const res = await submit(data);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('data.items.1.results.2.measurandId');
  });

  it('accepts the clean results (the fixture is valid, so the refusals above are about the field)', async () => {
    const res = await submit(cleanResults(r));
    expect(res.status).toBe(201);
  });

  describe('evaluation of stored absurd data (saved before the bounds existed)', () => {
    let ev: EvaluationView;
    beforeAll(async () => {
      fx = await buildEvaluationFixture(t.ds, {
        participants: 20,
        seed: 11,
        withUncertainty: true,
      });
      const [a, b] = fx.items;
      const [za, pdi] = fx.measurands;
      // Lab 0: an uncertainty of 1e308 on A × Z-average. Lab 1: diameters of 1e308 nm on B.
      // Lab 2: item A named twice (the second copy would count as a 21st participant).
      const patch = async (
        i: number,
        f: (d: {
          items: {
            testItemId: string;
            results: { measurandId: string; replicates: number[]; uncertainty: unknown }[];
          }[];
        }) => void,
      ) => {
        const [v] = (await t.ds.query(
          'SELECT sv.id, sv.data FROM submission_version sv JOIN submission s ON s.id = sv.submission_id WHERE s.enrolment_id = $1',
          [fx.enrolments[i]!.id],
        )) as { id: string; data: never }[];
        const data = structuredClone(v!.data);
        f(data);
        // Submitted versions are append-only for the server's role: only the owner can lift the
        // guard, as data written before the bounds existed would have been.
        const owner = new PgClient({ connectionString: t.db.ownerUrl });
        await owner.connect();
        try {
          await owner.query('BEGIN');
          await owner.query(
            'ALTER TABLE submission_version DISABLE TRIGGER submission_version_no_change',
          );
          await owner.query('UPDATE submission_version SET data = $2 WHERE id = $1', [
            v!.id,
            JSON.stringify(data),
          ]);
          await owner.query(
            'ALTER TABLE submission_version ENABLE TRIGGER submission_version_no_change',
          );
          await owner.query('COMMIT');
        } finally {
          await owner.end();
        }
      };
      await patch(0, (d) => {
        d.items
          .find((it) => it.testItemId === a!.id)!
          .results.find((x) => x.measurandId === za!.id)!.uncertainty = {
          kind: 'standard',
          value: 1e308,
          k: null,
        };
      });
      await patch(1, (d) => {
        d.items
          .find((it) => it.testItemId === b!.id)!
          .results.find((x) => x.measurandId === za!.id)!.replicates = [1e308, 1e308, 1e308];
      });
      await patch(2, (d) => {
        const copy = structuredClone(d.items.find((it) => it.testItemId === a!.id)!);
        for (const x of copy.results) x.replicates = x.replicates.map((v) => v * 3);
        d.items.push(copy);
      });
      // A σ_pt rule stored before the bound: 1e-320 for the PDI.
      await t.ds.query(
        `UPDATE measurand SET sigma_pt_rule = '{"kind":"fixed","value":1e-320}' WHERE id = $1`,
        [pdi!.id],
      );
      const res = await send(coord, `/rounds/${fx.round.id}/evaluation`, {});
      expect(res.status).toBe(201);
      ev = res.body;
    });

    const group = (item: string, key: string) =>
      ev.results.find((g) => g.itemCode === item && g.measurandKey === key)!;
    const code = (i: number) => fx.enrolments[i]!.participantCode;

    it('counts a duplicated item once (n = 20, not 21)', () => {
      expect(group('A', 'z_average').n).toBe(20);
      expect(group('A', 'z_average').participants).toHaveLength(20);
      expect(group('A', 'pdi').n).toBe(20);
      // The first copy counts: lab 2's tripled duplicate does not move its result.
      const p2 = group('A', 'z_average').participants.find((p) => p.code === code(2))!;
      expect(p2.result).toBeCloseTo(fx.values[2]![0]![0]!.reduce((s, v) => s + v, 0) / 3, 6);
    });

    it('scores z but reports ζ and En as not computed for an uncertainty of 1e308', () => {
      const p = group('A', 'z_average').participants.find((x) => x.code === code(0))!;
      expect(p.z).not.toBeNull();
      expect(p.signal).not.toBeNull();
      expect(p.zeta).toBeNull();
      expect(p.en).toBeNull();
      expect(p.notScored?.code).toBe('uncertainty-out-of-range');
      // Every other lab keeps its En.
      const others = group('A', 'z_average').participants.filter((x) => x.code !== code(0));
      expect(others.every((x) => x.en !== null && x.notScored === undefined)).toBe(true);
    });

    it('keeps diameters of 1e308 nm out of x_pt and reports the participant as not scored', () => {
      const g = group('B', 'z_average');
      expect(g.n).toBe(19);
      expect(g.assignedValue!).toBeGreaterThan(150);
      expect(g.assignedValue!).toBeLessThan(250);
      const p = g.participants.find((x) => x.code === code(1))!;
      expect(p.z).toBeNull();
      expect(p.signal).toBeNull();
      expect(p.notScored?.code).toBe('value-out-of-range');
      expect(p.notScored?.message).toContain(String(RANGES.diameterNm.max));
    });

    it('reports a σ_pt of 1e-320 per participant instead of failing', () => {
      const g = group('A', 'pdi');
      expect(g.sigmaPt).toBeNull();
      expect(g.warnings).toContain('sigma-pt-out-of-range');
      expect(
        g.participants.every((p) => p.z === null && p.notScored?.code === 'sigma-pt-out-of-range'),
      ).toBe(true);
    });

    it('commits, publishes and shows each lab its scores with the reason', async () => {
      await coord.agent.get(api(`/rounds/${fx.round.id}/evaluation`)).expect(200);
      await commitAndPublish(coord, fx.round.id);
      const board = await coord.agent.get(api(`/rounds/${fx.round.id}/board`)).expect(200);
      const gi = (board.body.groups as { itemCode: string; measurandKey: string }[]).findIndex(
        (g) => g.itemCode === 'B' && g.measurandKey === 'z_average',
      );
      const row = (
        board.body.rows as { code: string; cells: ({ notScored?: string } | null)[] }[]
      ).find((x) => x.code === code(1))!;
      expect(row.cells[gi]!.notScored).toMatch(/^Not scored: the result/);
      await createUser(t.ds, { email: 'one@range.test', lab: fx.labs[1]!.id });
      const one = await signedIn(t, 'one@range.test');
      const res = await one.agent.get(api(`/my/rounds/${fx.round.id}/scores`)).expect(200);
      const scores = (res.body as LabScores).scores.find(
        (s) => s.itemCode === 'B' && s.measurandKey === 'z_average',
      )!;
      expect(scores.score.notScored?.code).toBe('value-out-of-range');
      expect(scores.explanation[0]).toMatch(/^Not scored/);
    });
  });
});
