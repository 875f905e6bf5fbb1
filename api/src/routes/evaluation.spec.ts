import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Evaluation, Round } from '../../../db/entities';
import type { EvaluationView, InvestigationDto } from '../../../shared/contracts/evaluation';
import { runEvaluate } from '../cli/run-evaluate';
import { transitionRound } from '../services/round-lifecycle';
import { startFixtureCast, type EvaluationFixture } from '../testing/evaluation-fixtures';
import { mailTo, signedIn, type Client, type TestApp } from '../testing/test-app';

/**
 * Evaluation → commit → publish → reissue on a fixture round of 30 invented labs, as the
 * coordinator, labs and assessors meet it; confidentiality searched in every JSON answer.
 */
describe('evaluation, board, scores and investigations', () => {
  let t: TestApp;
  let fx: EvaluationFixture;
  let coord: Client;
  let labA: Client; // lab 0, manager
  let labB: Client; // lab 3 (the blunder), manager
  let labBMember: Client; // lab 3, not a manager
  let assessor: Client; // granted by lab 3
  let stranger: Client; // assessor without grants
  const api = (p: string) => `/api/v1${p}`;
  const labNames = () => fx.labs.map((l) => l.name);
  const expectNoLabNames = (body: unknown, except: string[] = []) => {
    const json = JSON.stringify(body);
    for (const name of labNames()) if (!except.includes(name)) expect(json).not.toContain(name);
  };

  beforeAll(async () => {
    const cast = await startFixtureCast(
      {
        participants: 30,
        seed: 7,
        blunders: { 3: 2.0 },
        withUncertainty: true,
        labPrefix: 'Secretlab',
      },
      (fx) => [
        { email: 'coord@ev.test', roles: ['coordinator'], signIn: true },
        { email: 'a@ev.test', lab: fx.labs[0]!.id, manager: true, signIn: true },
        { email: 'b@ev.test', lab: fx.labs[3]!.id, manager: true, signIn: true },
        { email: 'b2@ev.test', lab: fx.labs[3]!.id, manager: false, signIn: true },
        { email: 'stranger@ev.test', roles: ['assessor'], signIn: true },
      ],
    );
    ({ t, fx } = cast);
    coord = cast.as('coord@ev.test');
    labA = cast.as('a@ev.test');
    labB = cast.as('b@ev.test');
    labBMember = cast.as('b2@ev.test');
    stranger = cast.as('stranger@ev.test');
  });
  afterAll(() => t.close());

  const roundId = () => fx.round.id;
  const codeOf = (i: number) => fx.enrolments[i]!.participantCode;
  let draft: EvaluationView;

  it('computes a draft evaluation with x_pt, σ_pt, scores and hints', async () => {
    const res = await coord.agent
      .post(api(`/rounds/${roundId()}/evaluation`))
      .set('x-csrf-token', coord.csrf)
      .send({})
      .expect(201);
    draft = res.body;
    expect(draft.state).toBe('draft');
    expect(draft.version).toBe(1);
    expect(draft.results).toHaveLength(4);
    const za = draft.results.find((r) => r.itemCode === 'A' && r.measurandKey === 'z_average')!;
    expect(za.n).toBe(30);
    expect(za.method).toBe('algorithm-a');
    // Target 100 nm with 2 % between-lab scatter (fixture): the robust mean stays near 100.
    expect(za.assignedValue!).toBeGreaterThan(97);
    expect(za.assignedValue!).toBeLessThan(103);
    expect(za.sigmaPt).toBeCloseTo(za.robustSd!, 12);
    expect(za.uAssigned).toBeCloseTo((1.25 * za.robustSd!) / Math.sqrt(30), 12);
    const blunder = za.participants.find((p) => p.code === codeOf(3))!;
    expect(blunder.signal).toBe('action');
    expect(blunder.hints.map((h) => h.code)).toContain('radius-diameter');
    // ζ and En where labs reported U (k = 2): ζ = (x − x_pt)/√(u² + u(x_pt)²)
    const p0 = za.participants.find((p) => p.code === codeOf(0))!;
    expect(p0.u).toBeCloseTo(2, 12); // U = 4 nm, k = 2
    expect(p0.zeta).toBeCloseTo((p0.result - za.assignedValue!) / Math.hypot(2, za.uAssigned!), 12);
    expect(p0.en).toBeCloseTo(
      (p0.result - za.assignedValue!) / Math.hypot(4, 2 * za.uAssigned!),
      12,
    );
    expect(za.constants).toMatchObject({ consensusUncertaintyFactor: 1.25 });
    expect(draft.softwareVersion).toMatch(/^\d+\.\d+\.\d+/);
    expectNoLabNames(res.body);
  });

  it('the offline evaluate command reproduces the stored evaluation from exported replicates', async () => {
    const rows: {
      participant_code: string;
      data: {
        items: { testItemId: string; results: { measurandId: string; replicates: number[] }[] }[];
      };
    }[] = await t.ds.query(
      `SELECT en.participant_code, sv.data FROM enrolment en JOIN submission s ON s.enrolment_id = en.id
         JOIN submission_version sv ON sv.submission_id = s.id AND sv.version = s.current_version WHERE en.round_id = $1`,
      [roundId()],
    );
    const itemCode = new Map(fx.items.map((i) => [i.id, i.code]));
    const key = new Map(fx.measurands.map((m) => [m.id, m.key]));
    const lines = ['participant,item,measurand,replicate,value'];
    for (const r of rows) {
      for (const it of r.data.items) {
        for (const res of it.results)
          res.replicates.forEach((v, i) =>
            lines.push(
              `${r.participant_code},${itemCode.get(it.testItemId)},${key.get(res.measurandId)},${i + 1},${v}`,
            ),
          );
      }
    }
    const file = join(mkdtempSync(join(tmpdir(), 'ringlet-ev-')), 'round.csv');
    writeFileSync(file, lines.join('\n') + '\n');
    const out = await runEvaluate([file]);
    expect(out.exitCode).toBe(0);
    const doc = JSON.parse(out.stdout) as {
      evaluations: {
        item: string;
        measurand: string;
        n: number;
        iterations: number;
        assignedValue: number;
        robustSd: number;
        uAssigned: number;
        sigmaPt: number;
        participants: { code: string; result: number; z: number; zPrime: number; signal: string }[];
      }[];
    };
    const stored = (await coord.agent.get(api(`/rounds/${roundId()}/evaluation`)).expect(200))
      .body as EvaluationView;
    expect(doc.evaluations).toHaveLength(stored.results.length);
    for (const e of doc.evaluations) {
      const s = stored.results.find(
        (r) => r.itemCode === e.item && r.measurandKey === e.measurand,
      )!;
      expect({
        n: s.n,
        iterations: s.iterations,
        x: s.assignedValue,
        sStar: s.robustSd,
        u: s.uAssigned,
        sigma: s.sigmaPt,
      }).toEqual({
        n: e.n,
        iterations: e.iterations,
        x: e.assignedValue,
        sStar: e.robustSd,
        u: e.uAssigned,
        sigma: e.sigmaPt,
      });
      expect(s.participants.map((p) => [p.code, p.result, p.z, p.zPrime, p.signal])).toEqual(
        e.participants.map((p) => [p.code, p.result, p.z, p.zPrime, p.signal]),
      );
    }
  });

  it('previews a σ_pt override and an exclusion, each with a reason; bad settings are refused', async () => {
    const body = {
      sigmaPtOverrides: [
        {
          measurandKey: 'z_average',
          itemCode: 'A',
          rule: { kind: 'percent', percent: 5 },
          reason: 'fitness for purpose (scheme rule)',
        },
      ],
      exclusions: [
        {
          participantCode: codeOf(3),
          itemCode: 'A',
          measurandKey: 'z_average',
          rule: 'confirmed-blunder',
          reason: 'lab reported a radius',
        },
      ],
    };
    const res = await coord.agent
      .post(api(`/rounds/${roundId()}/evaluation`))
      .set('x-csrf-token', coord.csrf)
      .send(body)
      .expect(201);
    const za = (res.body as EvaluationView).results.find(
      (r) => r.itemCode === 'A' && r.measurandKey === 'z_average',
    )!;
    expect(za.n).toBe(29);
    expect(za.sigmaPt).toBeCloseTo(0.05 * za.assignedValue!, 12);
    const b = za.participants.find((p) => p.code === codeOf(3))!;
    expect(b.excluded).toEqual({ rule: 'confirmed-blunder', reason: 'lab reported a radius' });
    expect(b.z).toBeCloseTo((b.result - za.assignedValue!) / za.sigmaPt!, 12);
    expect(res.body.version).toBe(1); // the draft is replaced, not stacked

    const bad = await coord.agent
      .post(api(`/rounds/${roundId()}/evaluation`))
      .set('x-csrf-token', coord.csrf)
      .send({ exclusions: [{ ...body.exclusions[0], reason: '' }] })
      .expect(400);
    expect(bad.body.error.details[0].path).toBe('exclusions.0.reason');
    const unknown = await coord.agent
      .post(api(`/rounds/${roundId()}/evaluation`))
      .set('x-csrf-token', coord.csrf)
      .send({ exclusions: [{ ...body.exclusions[0], participantCode: 'P999' }] })
      .expect(422);
    expect(unknown.body.error.message).toContain('exclusions.0.participantCode');
    // Back to the plain draft for the rest.
    await coord.agent
      .post(api(`/rounds/${roundId()}/evaluation`))
      .set('x-csrf-token', coord.csrf)
      .send({})
      .expect(201);
  });

  it('shows the draft board to the coordinator only; names only on request', async () => {
    await labA.agent.get(api(`/rounds/${roundId()}/board`)).expect(404);
    const res = await coord.agent.get(api(`/rounds/${roundId()}/board`)).expect(200);
    expect(res.body.rows).toHaveLength(30);
    expect(res.body.groups).toHaveLength(4);
    expect(res.body.labNames).toEqual({});
    expect(res.body.canRevealNames).toBe(true);
    expectNoLabNames(res.body);
    const named = await coord.agent.get(api(`/rounds/${roundId()}/board?reveal=names`)).expect(200);
    expect(named.body.labNames[codeOf(0)]).toBe(fx.labs[0]!.name);
  });

  it('commits (closed → evaluated) and refuses a second draft', async () => {
    const res = await coord.agent
      .post(api(`/rounds/${roundId()}/evaluation/commit`))
      .set('x-csrf-token', coord.csrf)
      .expect(200);
    expect(res.body.state).toBe('committed');
    expect((await t.ds.getRepository(Round).findOneByOrFail({ id: roundId() })).state).toBe(
      'evaluated',
    );
    const again = await coord.agent
      .post(api(`/rounds/${roundId()}/evaluation`))
      .set('x-csrf-token', coord.csrf)
      .send({})
      .expect(409);
    expect(again.body.error.code).toBe('round_not_closed');
  });

  it('publishes: e-mails every lab, opens investigations for signals, and is immutable', async () => {
    const stored = (await coord.agent.get(api(`/rounds/${roundId()}/evaluation`)).expect(200))
      .body as EvaluationView;
    const signals = stored.results.flatMap((r) =>
      r.participants.filter((p) => p.signal === 'warning' || p.signal === 'action'),
    );
    expect(signals.length).toBeGreaterThan(0);
    const res = await coord.agent
      .post(api(`/rounds/${roundId()}/publish`))
      .set('x-csrf-token', coord.csrf)
      .expect(200);
    expect(res.body).toMatchObject({
      version: 1,
      labsNotified: 30,
      investigationsOpened: signals.length,
    });
    const mail = await mailTo(t.ds, fx.labs[0]!.contactEmail!);
    expect(mail[0]!.subject).toContain(fx.round.code);
    expect(mail[0]!.text).toContain(codeOf(0));
    await coord.agent
      .post(api(`/rounds/${roundId()}/publish`))
      .set('x-csrf-token', coord.csrf)
      .expect(409);
    // The database itself refuses a change to a published evaluation.
    await expect(
      t.ds.query(`UPDATE evaluation SET settings = '{}' WHERE round_id = $1`, [roundId()]),
    ).rejects.toThrow(/immutable/);
    await expect(
      t.ds.query(`UPDATE evaluation_result SET sigma_pt = 1 WHERE evaluation_id = $1`, [stored.id]),
    ).rejects.toThrow(/immutable/);
  });

  it('a lab sees codes only with its own row marked; ungranted assessors see nothing', async () => {
    const res = await labA.agent.get(api(`/rounds/${roundId()}/board?reveal=names`)).expect(200);
    expect(res.body.ownCodes).toEqual([codeOf(0)]);
    expect(res.body.labNames).toEqual({});
    expect(res.body.canRevealNames).toBe(false);
    expectNoLabNames(res.body);
    const s = await stranger.agent.get(api(`/rounds/${roundId()}/board`)).expect(404);
    expectNoLabNames(s.body);
    expectNoLabNames((await stranger.agent.get(api('/boards')).expect(200)).body);
    expectNoLabNames((await stranger.agent.get(api('/investigations')).expect(200)).body);
    expect(
      (await labA.agent.get(api('/boards')).expect(200)).body.map(
        (b: { roundId: string }) => b.roundId,
      ),
    ).toEqual([roundId()]);
    // The landing grid's signal counts are the board's: every score of the published version, by signal.
    const [entry] = (await labA.agent.get(api('/boards')).expect(200)).body;
    const board = (await labA.agent.get(api(`/rounds/${roundId()}/board`)).expect(200)).body;
    const count = (s: string) =>
      (board.rows as { cells: ({ signal: string | null } | null)[] }[])
        .flatMap((r) => r.cells)
        .filter((c) => c?.signal === s).length;
    expect(entry).toMatchObject({
      acceptable: count('acceptable'),
      warning: count('warning'),
      action: count('action'),
    });
    expect(entry.action).toBeGreaterThan(0); // the blunder lab
  });

  it('the kept board answers stay per viewer: each lab its own code, gzip and plain alike', async () => {
    const plain = async (c: Client) =>
      JSON.parse(
        (
          await c.agent
            .get(api(`/rounds/${roundId()}/board`))
            .set('Accept-Encoding', 'identity')
            .buffer(true)
            .parse((res, done) => {
              let text = '';
              res.on('data', (chunk: Buffer) => (text += chunk.toString()));
              res.on('end', () => done(null, text));
            })
            .expect(200)
            .expect((res) => expect(res.headers['content-encoding']).toBeUndefined())
        ).body as string,
      ) as { ownCodes: string[] };
    const zipped = async (c: Client) => {
      const res = await c.agent.get(api(`/rounds/${roundId()}/board`)).expect(200);
      expect(res.headers['content-encoding']).toBe('gzip');
      return res.body as { ownCodes: string[] };
    };
    // asked twice each, in turns, so the second answers come from the kept ones
    for (let i = 0; i < 2; i++) {
      const [a, b] = [await zipped(labA), await zipped(labB)];
      expect(a.ownCodes).toEqual([codeOf(0)]);
      expect(b.ownCodes).toEqual([codeOf(3)]);
      expect(await plain(labA)).toEqual(a);
      expect(await plain(labB)).toEqual(b);
      expectNoLabNames(a);
      expectNoLabNames(b);
    }
  });

  it('a lab reads its own scores with a plain explanation, and nothing of the others', async () => {
    const res = await labB.agent.get(api(`/my/rounds/${roundId()}/scores`)).expect(200);
    expect(res.body.participantCode).toBe(codeOf(3));
    expect(res.body.labName).toBe(fx.labs[3]!.name);
    const za = res.body.scores.find(
      (s: { itemCode: string; measurandKey: string }) =>
        s.itemCode === 'A' && s.measurandKey === 'z_average',
    );
    expect(za.score.signal).toBe('action');
    expect(za.explanation.join(' ')).toMatch(/Action signal/);
    expect(za.investigationId).toEqual(expect.any(String));
    expectNoLabNames(res.body, [fx.labs[3]!.name]);
    const json = JSON.stringify(res.body);
    expect(json).not.toContain(`"${codeOf(0)}"`);
    await labA.agent.get(api(`/my/rounds/00000000-0000-4000-8000-000000000000/scores`)).expect(404);
  });

  let inv: InvestigationDto;
  it('investigations: members record findings, the manager closes, others read or get 404', async () => {
    const mine = (await labB.agent.get(api('/my/investigations')).expect(200))
      .body as InvestigationDto[];
    inv = mine.find((i) => i.itemCode === 'A' && i.measurandKey === 'z_average')!;
    expect(inv).toMatchObject({
      signal: 'action',
      state: 'open',
      participantCode: codeOf(3),
      canClose: true,
    });
    await labA.agent.get(api(`/investigations/${inv.id}`)).expect(404);
    await stranger.agent.get(api(`/investigations/${inv.id}`)).expect(404);
    await coord.agent.get(api(`/investigations/${inv.id}`)).expect(200);
    await labA.agent
      .patch(api(`/investigations/${inv.id}`))
      .set('x-csrf-token', labA.csrf)
      .send({ rootCause: 'x' })
      .expect(404);

    await labBMember.agent
      .patch(api(`/investigations/${inv.id}`))
      .set('x-csrf-token', labBMember.csrf)
      .send({ causeCategory: 'data-entry', rootCause: 'Radius reported instead of diameter' })
      .expect(200);
    const notYet = await labB.agent
      .post(api(`/investigations/${inv.id}/close`))
      .set('x-csrf-token', labB.csrf)
      .expect(422);
    expect(notYet.body.error.message).toMatch(/^correctiveAction/);
    await labB.agent
      .patch(api(`/investigations/${inv.id}`))
      .set('x-csrf-token', labB.csrf)
      .send({
        correctiveAction: 'Report template now asks for the diameter',
        effectivenessCheck: 'Next round checked by a second analyst',
      })
      .expect(200);
    const notManager = await labBMember.agent
      .post(api(`/investigations/${inv.id}/close`))
      .set('x-csrf-token', labBMember.csrf)
      .expect(422);
    expect(notManager.body.error.code).toBe('manager_required');
    const closed = await labB.agent
      .post(api(`/investigations/${inv.id}/close`))
      .set('x-csrf-token', labB.csrf)
      .expect(200);
    expect(closed.body).toMatchObject({
      state: 'closed',
      canEdit: false,
      causeCategory: 'data-entry',
    });
    await labB.agent
      .patch(api(`/investigations/${inv.id}`))
      .set('x-csrf-token', labB.csrf)
      .send({ rootCause: 'changed' })
      .expect(409);
    const bad = await labB.agent
      .patch(api(`/investigations/${inv.id}`))
      .set('x-csrf-token', labB.csrf)
      .send({ causeCategory: 'gremlins' })
      .expect(400);
    expect(bad.body.error.details[0].path).toBe('causeCategory');
  });

  it('assessor grants: a lab manager invites an assessor, who then sees that lab only', async () => {
    await labBMember.agent
      .post(api(`/labs/${fx.labs[3]!.id}/assessor-grants`))
      .set('x-csrf-token', labBMember.csrf)
      .send({ email: 'asa@ev.test' })
      .expect(404);
    await labA.agent
      .post(api(`/labs/${fx.labs[3]!.id}/assessor-grants`))
      .set('x-csrf-token', labA.csrf)
      .send({ email: 'asa@ev.test' })
      .expect(404);
    const g = await labB.agent
      .post(api(`/labs/${fx.labs[3]!.id}/assessor-grants`))
      .set('x-csrf-token', labB.csrf)
      .send({ email: 'asa@ev.test', name: 'Asa Assessor' })
      .expect(201);
    expect(g.body).toMatchObject({ assessorEmail: 'asa@ev.test', isActive: true, revokedAt: null });
    const mails = await mailTo(t.ds, 'asa@ev.test', 2);
    expect(mails.length).toBeGreaterThanOrEqual(2);
    // Give the invited account a password the test knows.
    await t.ds.query(
      `UPDATE app_user SET password_hash = (SELECT password_hash FROM app_user WHERE email = 'coord@ev.test') WHERE email = 'asa@ev.test'`,
    );
    assessor = await signedIn(t, 'asa@ev.test');
    const board = await assessor.agent.get(api(`/rounds/${roundId()}/board`)).expect(200);
    expect(board.body.labNames).toEqual({ [codeOf(3)]: fx.labs[3]!.name });
    expectNoLabNames(board.body, [fx.labs[3]!.name]);
    const list = (await assessor.agent.get(api('/investigations')).expect(200))
      .body as InvestigationDto[];
    expect(list.length).toBeGreaterThan(0);
    expect(new Set(list.map((i) => i.organisationId))).toEqual(new Set([fx.labs[3]!.id]));
    await assessor.agent.get(api(`/investigations/${inv.id}`)).expect(200);

    const listed = await labBMember.agent
      .get(api(`/labs/${fx.labs[3]!.id}/assessor-grants`))
      .expect(200);
    expect(listed.body).toHaveLength(1);
    await labB.agent
      .delete(api(`/labs/${fx.labs[3]!.id}/assessor-grants/${g.body.id}`))
      .set('x-csrf-token', labB.csrf)
      .expect(204);
    await assessor.agent.get(api(`/rounds/${roundId()}/board`)).expect(404);
    await assessor.agent.get(api(`/investigations/${inv.id}`)).expect(404);
  });

  it('reissue: a new version with a reason; the published one stays as it was', async () => {
    const before = await t.ds
      .getRepository(Evaluation)
      .findOneByOrFail({ roundId: roundId(), version: 1 });
    const noReason = await coord.agent
      .post(api(`/rounds/${roundId()}/reissue`))
      .set('x-csrf-token', coord.csrf)
      .send({})
      .expect(400);
    expect(noReason.body.error.details[0].path).toBe('reason');
    const res = await coord.agent
      .post(api(`/rounds/${roundId()}/reissue`))
      .set('x-csrf-token', coord.csrf)
      .send({
        reason: 'Lab result confirmed as a radius; excluded from the assigned value',
        settings: {
          exclusions: [
            {
              participantCode: codeOf(3),
              itemCode: 'A',
              measurandKey: 'z_average',
              rule: 'confirmed-blunder',
              reason: 'radius reported',
            },
          ],
        },
      })
      .expect(201);
    expect(res.body).toMatchObject({
      version: 2,
      state: 'committed',
      reissueReason: expect.stringContaining('radius'),
    });
    expect((await t.ds.getRepository(Round).findOneByOrFail({ id: roundId() })).state).toBe(
      'reissued',
    );
    const after = await t.ds.getRepository(Evaluation).findOneByOrFail({ id: before.id });
    expect(after).toEqual(before);
    // Labs still see version 1 until the reissue is published.
    expect((await labA.agent.get(api(`/rounds/${roundId()}/board`)).expect(200)).body.version).toBe(
      1,
    );
    const pub = await coord.agent
      .post(api(`/rounds/${roundId()}/publish`))
      .set('x-csrf-token', coord.csrf)
      .expect(200);
    expect(pub.body.version).toBe(2);
    expect((await labA.agent.get(api(`/rounds/${roundId()}/board`)).expect(200)).body.version).toBe(
      2,
    );
    const scores = await labB.agent.get(api(`/my/rounds/${roundId()}/scores`)).expect(200);
    expect(scores.body.reissueReason).toContain('radius');
  });

  it('a correction starts only on the evaluation page and always leads back to Published', async () => {
    expect((await t.ds.getRepository(Round).findOneByOrFail({ id: roundId() })).state).toBe(
      'published',
    );
    const desk = await coord.agent
      .post(api(`/rounds/${roundId()}/transitions`))
      .set('x-csrf-token', coord.csrf)
      .send({ to: 'reissued', reason: 'Correcting a unit' })
      .expect(409);
    expect(desk.body.error.code).toBe('transition_owned_by_evaluation');
    expect((await t.ds.getRepository(Round).findOneByOrFail({ id: roundId() })).state).toBe(
      'published',
    );
    // A round an older desk move left in Reissued (no new version) is reissued and published again.
    await t.ds.transaction((em) =>
      transitionRound(em, roundId(), 'reissued', { id: null }, { reason: 'older desk move' }),
    );
    const again = await coord.agent
      .post(api(`/rounds/${roundId()}/reissue`))
      .set('x-csrf-token', coord.csrf)
      .send({ reason: 'Completing the correction the desk move began' })
      .expect(201);
    expect(again.body).toMatchObject({ version: 3, state: 'committed' });
    const pub = await coord.agent
      .post(api(`/rounds/${roundId()}/publish`))
      .set('x-csrf-token', coord.csrf)
      .expect(200);
    expect(pub.body.version).toBe(3);
    expect((await t.ds.getRepository(Round).findOneByOrFail({ id: roundId() })).state).toBe(
      'published',
    );
  });

  it('track record: z-scores per measurand with RSZ and run rules', async () => {
    const res = await labB.agent.get(api('/my/track-record')).expect(200);
    expect(res.body.labName).toBe(fx.labs[3]!.name);
    const za = res.body.series.find(
      (s: { measurandKey: string }) => s.measurandKey === 'z_average',
    );
    expect(za.points).toHaveLength(2); // items A and B of the one round
    const zs = za.points.map((p: { z: number }) => p.z);
    expect(za.rsz).toBeCloseTo((zs[0] + zs[1]) / Math.SQRT2, 12);
    expect(za.findings.map((f: { rule: string }) => f.rule)).toContain('action-signal');
    expectNoLabNames(res.body, [fx.labs[3]!.name]);
  });
});
