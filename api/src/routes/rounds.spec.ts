import ExcelJS from 'exceljs';
import {
  AuditEvent,
  Enrolment,
  Organisation,
  Round,
  RoundTransition,
  Shipment,
  User,
} from '../../../db/entities';
import {
  DAMAGED_PARCEL_CAUTIONS,
  SAFETY_BLOCK,
  SAFETY_CAUTIONS,
} from '../../../shared/contracts/safety';
import { CODE_ALPHABET, freshParticipantCode, randomParticipantCode } from '../services/enrolment';
import { assertPublishable, transitionRound } from '../services/round-lifecycle';
import {
  api,
  client,
  invitationToken,
  linkToken,
  mailTo,
  send,
  signedIn,
  startCast,
  type Client,
  type TestApp,
} from '../testing/test-app';

const PLUS_DAYS = (d: number) => new Date(Date.now() + d * 86400_000).toISOString();
/** Three items far apart with nearly equal pairs: fails the homogeneity check at σ_pt = 2. */
const FAILING_ITEMS = [
  [100, 100.2],
  [105, 105.2],
  [95, 95.2],
];

describe('Round desk API', () => {
  let t: TestApp;
  let coord: Client;
  let labA: string;
  let labB: string;
  let schemeId: string;
  beforeAll(async () => {
    const cast = await startCast({
      labs: ['Lab Alpha', 'Lab Beta'],
      users: [
        { email: 'coord@x.test', name: 'Cora Ordin', roles: ['coordinator'], signIn: true },
        { email: 'alice@a.test', lab: 0, manager: true },
        { email: 'bob@b.test', lab: 1 },
      ],
    });
    ({ t } = cast);
    [labA, labB] = cast.labIds as [string, string];
    coord = cast.as('coord@x.test');
    const s = await post(coord, '/schemes', {
      code: 'NANO-DLS',
      name: 'Nanoparticle sizing by DLS',
      description: 'Latex and silica suspensions',
    }).expect(201);
    schemeId = s.body.id;
  });
  afterAll(() => t.close());

  const post = (c: Client, path: string, body: unknown) => send(c, path, body);

  /** A round in draft with two items; returns its id. */
  async function newRound(code: string, extra: Record<string, unknown> = {}): Promise<string> {
    const res = await post(coord, '/rounds', {
      schemeId,
      code,
      title: `Round ${code}`,
      items: [
        { code: 'A', material: 'Polystyrene latex in water', nominalSizeNm: 100 },
        { code: 'B', material: 'Silica in water', nominalSizeNm: 60 },
      ],
      ...extra,
    }).expect(201);
    return res.body.id;
  }
  function moveTo(id: string, to: string, extra: Record<string, unknown> = {}) {
    return post(coord, `/rounds/${id}/transitions`, { to, ...extra });
  }
  const patch = (path: string, body: unknown) => send(coord, path, body, 'patch');
  const del = (path: string) => send(coord, path, undefined, 'delete');
  const detail = async (id: string) =>
    (await coord.agent.get(api(`/rounds/${id}`)).expect(200)).body;
  const enrolments = async (roundId: string) =>
    (await coord.agent.get(api(`/rounds/${roundId}/enrolments`)).expect(200)).body;
  /** A coordinator's action on one enrolment: `withdrawal`, `dispatch` or `extension`. */
  const onEnrolment = (roundId: string, enrolmentId: string, action: string, body: object) =>
    post(coord, `/rounds/${roundId}/enrolments/${enrolmentId}/${action}`, body);
  const invite = (roundId: string, invitations: object[]) =>
    post(coord, `/rounds/${roundId}/invitations`, { invitations });
  const accept = (member: Client, token: string) =>
    post(member, `/invitations/${token}/accept`, {});
  /** The token of the invitation link in the newest mail to `email`. */
  async function invitationFor(email: string): Promise<string> {
    const [mail] = await mailTo(t.ds, email);
    return invitationToken(mail!.text);
  }
  /** Invites the lab `labId` by `email`, whose owner signs in and accepts; the participant code. */
  async function inviteAndAccept(roundId: string, labId: string, email: string): Promise<string> {
    await invite(roundId, [{ organisationId: labId, email }]).expect(201);
    const token = await invitationFor(email);
    const res = await accept(await signedIn(t, email), token).expect(201);
    return res.body.participantCode;
  }
  /** A round in enrolling, due in `dueInDays`, with the lab of `email` enrolled; returns its id. */
  async function roundWithLab(
    code: string,
    dueInDays: number,
    labId: string,
    email: string,
  ): Promise<string> {
    const id = await newRound(code, { resultsDueAt: PLUS_DAYS(dueInDays) });
    await moveTo(id, 'enrolling').expect(200);
    await inviteAndAccept(id, labId, email);
    return id;
  }
  /** Records a homogeneity study of one item × measurand; `items` holds each item's replicates. */
  const homogeneityStudy = (
    roundId: string,
    testItemId: string,
    measurandId: string,
    items: number[][],
    sigmaPt?: number,
  ) =>
    post(coord, `/rounds/${roundId}/homogeneity`, {
      kind: 'homogeneity',
      testItemId,
      measurandId,
      sigmaPt,
      data: { items },
    });
  const decide = (roundId: string, studyId: string, body: object) =>
    post(coord, `/rounds/${roundId}/homogeneity/${studyId}/decision`, body);

  describe('schemes', () => {
    it('stores the DLS default measurands (Z-average nm 1 decimal 3 replicates; PDI 3 decimals 3 replicates)', async () => {
      const list = await coord.agent.get('/api/v1/schemes').expect(200);
      const scheme = list.body.find((s: { code: string }) => s.code === 'NANO-DLS');
      expect(scheme.defaultMeasurands).toEqual([
        expect.objectContaining({
          key: 'z_average',
          unit: 'nm',
          decimals: 1,
          replicatesRequired: 3,
        }),
        expect.objectContaining({ key: 'pdi', unit: '', decimals: 3, replicatesRequired: 3 }),
      ]);
    });
    it('names the field for a bad code and refuses a duplicate code', async () => {
      const bad = await post(coord, '/schemes', { code: 'bad code', name: 'X scheme' }).expect(400);
      expect(bad.body.error.details[0].path).toBe('code');
      const dup = await post(coord, '/schemes', { code: 'NANO-DLS', name: 'Again' }).expect(409);
      expect(dup.body.error.code).toBe('code_taken');
    });
  });

  describe('rounds, items, measurands', () => {
    it('creates a draft round with two items, the scheme measurands and the safety cautions', async () => {
      const id = await newRound('R-CREATE');
      const round = await detail(id);
      expect(round.state).toBe('draft');
      expect(round.items.map((i: { code: string }) => i.code)).toEqual(['A', 'B']);
      expect(
        round.measurands.map((m: { key: string; decimals: number }) => [m.key, m.decimals]),
      ).toEqual([
        ['z_average', 1],
        ['pdi', 3],
      ]);
      expect(round.instructions).toContain('eye protection and gloves');
      expect(round.instructions).toContain('laser interlock');
      expect(round.instructions).toContain('safety officer');
      const list = await coord.agent.get('/api/v1/rounds').expect(200);
      expect(list.body.find((r: { id: string }) => r.id === id)).toMatchObject({
        itemCount: 2,
        enrolledCount: 0,
        schemeCode: 'NANO-DLS',
      });
    });

    /** Creating the round `fields` describe answers `status` and stores no round; the error. */
    async function refusedRound(fields: Record<string, unknown>, status: number) {
      const before = await t.ds.getRepository(Round).count();
      const res = await post(coord, '/rounds', { schemeId, ...fields }).expect(status);
      expect(await t.ds.getRepository(Round).count()).toBe(before);
      return res.body.error;
    }

    it('refuses dates out of order (400 naming resultsDueAt) and saves nothing', async () => {
      const error = await refusedRound(
        {
          code: 'R-DATES',
          title: 'Dates',
          dispatchOn: '2026-05-10',
          resultsDueAt: '2026-05-01T12:00:00Z',
        },
        400,
      );
      expect(error.details[0].path).toBe('resultsDueAt');
    });

    it('refuses a duplicate item code without half-saving the round', async () => {
      const error = await refusedRound(
        {
          code: 'R-DUP',
          title: 'Dup',
          items: [
            { code: 'A', material: 'x' },
            { code: 'a', material: 'y' },
          ],
        },
        409,
      );
      expect(error.code).toBe('item_code_taken');
    });

    it('adds items and measurands in draft; patches fields; rejects a negative nominal size', async () => {
      const id = await newRound('R-ADD', { useSchemeMeasurands: false });
      const items = await post(coord, `/rounds/${id}/items`, {
        items: [
          { code: 'C', material: 'Gold colloid', nominalSizeNm: 30, handlingNotes: 'Keep dark' },
        ],
      }).expect(201);
      expect(
        items.body.map((i: { code: string; position: number }) => [i.code, i.position]),
      ).toEqual([
        ['A', 0],
        ['B', 1],
        ['C', 2],
      ]);
      const bad = await post(coord, `/rounds/${id}/items`, {
        items: [{ code: 'D', material: 'x', nominalSizeNm: -5 }],
      }).expect(400);
      expect(bad.body.error.details[0].path).toBe('items.0.nominalSizeNm');
      const ms = await post(coord, `/rounds/${id}/measurands`, {
        measurands: [
          {
            key: 'z_average',
            name: 'Z-average diameter',
            unit: 'nm',
            decimals: 1,
            replicatesRequired: 3,
            sigmaPtRule: { kind: 'percent', percent: 5 },
          },
        ],
      }).expect(201);
      expect(ms.body[0]).toMatchObject({
        key: 'z_average',
        sigmaPtRule: { kind: 'percent', percent: 5 },
        assignedValueRule: { kind: 'consensus' },
        minParticipants: 12,
      });
      const dup = await post(coord, `/rounds/${id}/measurands`, {
        measurands: [
          { key: 'z_average', name: 'Again', unit: 'nm', decimals: 1, replicatesRequired: 3 },
        ],
      }).expect(409);
      expect(dup.body.error.code).toBe('measurand_key_taken');
      const patched = await patch(`/rounds/${id}`, { title: 'Renamed', feeMinor: 45000 }).expect(
        200,
      );
      expect(patched.body).toMatchObject({ title: 'Renamed', feeMinor: 45000 });
      // The basic cautions cannot be removed: text without them gets them back in front; own cautions stay.
      const own = 'Measure at 25 °C.\n- Use a fume hood for the silica item.';
      const stripped = await patch(`/rounds/${id}`, { instructions: own }).expect(200);
      expect(stripped.body.instructions).toBe(`${SAFETY_BLOCK}\n\n${own}`);
      const stored = await t.ds.getRepository(Round).findOneByOrFail({ id });
      for (const c of SAFETY_CAUTIONS) expect(stored.instructions).toContain(c);
    });

    it('answers 404 for an unknown round', async () => {
      await coord.agent.get('/api/v1/rounds/00000000-0000-4000-8000-000000000000').expect(404);
    });
  });

  describe('one test item or measurand at a time', () => {
    const auditCount = (action: string) => t.ds.getRepository(AuditEvent).countBy({ action });

    it('edits an item in draft (audited); a taken code is 409 item_code_taken and a bad size is 400 naming the field; nothing half-saved', async () => {
      const id = await newRound('R-ITEM-EDIT');
      const [a, b] = (await detail(id)).items;
      const before = await auditCount('round.item-updated');
      const res = await patch(`/rounds/${id}/items/${b.id}`, {
        material: 'Silica in 10 mM NaCl',
        nominalSizeNm: 62.5,
        storageNotes: 'Keep at 4 °C',
      }).expect(200);
      expect(res.body).toMatchObject({
        id: b.id,
        code: 'B',
        material: 'Silica in 10 mM NaCl',
        nominalSizeNm: 62.5,
        storageNotes: 'Keep at 4 °C',
        handlingNotes: '',
      });
      expect(await auditCount('round.item-updated')).toBe(before + 1);

      const taken = await patch(`/rounds/${id}/items/${b.id}`, {
        code: 'a',
        material: 'Changed too',
      }).expect(409);
      expect(taken.body.error.code).toBe('item_code_taken');
      const bad = await patch(`/rounds/${id}/items/${a.id}`, {
        material: 'Changed',
        nominalSizeNm: -1,
      }).expect(400);
      expect(bad.body.error.details.map((d: { path: string }) => d.path)).toEqual([
        'nominalSizeNm',
      ]);
      await patch(`/rounds/${id}/items/${a.id}`, {}).expect(400);
      const after = (await detail(id)).items;
      expect(after.map((i: { code: string; material: string }) => [i.code, i.material])).toEqual([
        ['A', 'Polystyrene latex in water'],
        ['B', 'Silica in 10 mM NaCl'],
      ]);
      expect(await auditCount('round.item-updated')).toBe(before + 1);
    });

    it('removes an item in draft; an item of another round answers 404; the last item of an enrolling round stays (422)', async () => {
      const id = await newRound('R-ITEM-DEL');
      const other = await newRound('R-ITEM-OTHER');
      const [a, b] = (await detail(id)).items;
      const [foreign] = (await detail(other)).items;
      await del(`/rounds/${id}/items/${foreign.id}`).expect(404);
      await patch(`/rounds/${id}/items/${foreign.id}`, { material: 'x' }).expect(404);
      await del(`/rounds/${id}/items/${a.id}`).expect(204);
      expect((await detail(id)).items.map((i: { code: string }) => i.code)).toEqual(['B']);
      expect((await detail(other)).items).toHaveLength(2);
      await moveTo(id, 'enrolling').expect(200);
      const last = await del(`/rounds/${id}/items/${b.id}`).expect(422);
      expect(last.body.error.code).toBe('round_incomplete');
      expect((await detail(id)).items).toHaveLength(1);
    });

    it('refuses to remove an item or measurand with a recorded homogeneity check (409)', async () => {
      const id = await newRound('R-ITEM-CHECK');
      const d = await detail(id);
      await homogeneityStudy(
        id,
        d.items[0].id,
        d.measurands[0].id,
        [
          [100, 100.2],
          [100.1, 100.3],
        ],
        2,
      ).expect(201);
      expect((await del(`/rounds/${id}/items/${d.items[0].id}`).expect(409)).body.error.code).toBe(
        'item_has_checks',
      );
      expect(
        (await del(`/rounds/${id}/measurands/${d.measurands[0].id}`).expect(409)).body.error.code,
      ).toBe('measurand_has_checks');
      expect((await detail(id)).items).toHaveLength(2);
    });

    it('changes the Z-average σ_pt rule to 4 % of x_pt and the assigned value to a reference value, audited', async () => {
      const id = await newRound('R-MEAS-EDIT');
      const [z, pdi] = (await detail(id)).measurands;
      const before = await auditCount('round.measurand-updated');
      const res = await patch(`/rounds/${id}/measurands/${z.id}`, {
        sigmaPtRule: { kind: 'percent', percent: 4 },
        assignedValueRule: {
          kind: 'reference',
          value: 101.8,
          u: 0.9,
          source: 'Certificate of the reference material, lot 7',
        },
        minParticipants: 8,
      }).expect(200);
      expect(res.body).toMatchObject({
        key: 'z_average',
        decimals: 1,
        replicatesRequired: 3,
        minParticipants: 8,
        sigmaPtRule: { kind: 'percent', percent: 4 },
        assignedValueRule: { kind: 'reference', value: 101.8, u: 0.9 },
      });
      expect(await auditCount('round.measurand-updated')).toBe(before + 1);
      const stored = (await detail(id)).measurands;
      expect(stored[0].sigmaPtRule).toEqual({ kind: 'percent', percent: 4 });
      expect(stored[1]).toMatchObject({ id: pdi.id, sigmaPtRule: { kind: 'robust-sd' } });
    });

    it('names the field of a bad rule (400), refuses a taken key (409), and saves nothing', async () => {
      const id = await newRound('R-MEAS-BAD');
      const [z] = (await detail(id)).measurands;
      const percent = await patch(`/rounds/${id}/measurands/${z.id}`, {
        name: 'Changed',
        sigmaPtRule: { kind: 'percent', percent: 0 },
      }).expect(400);
      expect(percent.body.error.details[0].path).toBe('sigmaPtRule.percent');
      const source = await patch(`/rounds/${id}/measurands/${z.id}`, {
        assignedValueRule: { kind: 'reference', value: 100, u: 1, source: '' },
      }).expect(400);
      expect(source.body.error.details[0].path).toBe('assignedValueRule.source');
      const key = await patch(`/rounds/${id}/measurands/${z.id}`, {
        key: 'pdi',
        name: 'Changed',
      }).expect(409);
      expect(key.body.error.code).toBe('measurand_key_taken');
      expect(key.body.error.message).toMatch(/^key: /);
      expect((await detail(id)).measurands[0]).toMatchObject({
        key: 'z_average',
        name: 'Z-average diameter',
        sigmaPtRule: { kind: 'robust-sd' },
      });
    });

    it('removes a measurand in draft; the last measurand of an enrolling round stays (422)', async () => {
      const id = await newRound('R-MEAS-DEL');
      const [z, pdi] = (await detail(id)).measurands;
      const before = await auditCount('round.measurand-removed');
      await del(`/rounds/${id}/measurands/${pdi.id}`).expect(204);
      expect((await detail(id)).measurands.map((m: { key: string }) => m.key)).toEqual([
        'z_average',
      ]);
      expect(await auditCount('round.measurand-removed')).toBe(before + 1);
      await moveTo(id, 'enrolling').expect(200);
      expect((await del(`/rounds/${id}/measurands/${z.id}`).expect(422)).body.error.code).toBe(
        'round_incomplete',
      );
    });

    it('after enrolment, items and measurands are fixed: 409 round_not_editable, nothing changes', async () => {
      const id = await roundWithLab('R-DESIGN-LOCK', 20, labA, 'alice@a.test');
      await moveTo(id, 'in-transit').expect(200);
      const d = await detail(id);
      for (const res of [
        await patch(`/rounds/${id}/items/${d.items[0].id}`, { material: 'Changed' }),
        await del(`/rounds/${id}/items/${d.items[0].id}`),
        await patch(`/rounds/${id}/measurands/${d.measurands[0].id}`, {
          sigmaPtRule: { kind: 'percent', percent: 4 },
        }),
        await del(`/rounds/${id}/measurands/${d.measurands[0].id}`),
      ]) {
        expect(res.status).toBe(409);
        expect(res.body.error.code).toBe('round_not_editable');
      }
      const after = await detail(id);
      expect(after.items).toEqual(d.items);
      expect(after.measurands).toEqual(d.measurands);
    });
  });

  describe('lifecycle', () => {
    it('refuses enrolment without items and measurands (422 round_incomplete)', async () => {
      const res = await post(coord, '/rounds', {
        schemeId,
        code: 'R-EMPTY',
        title: 'Empty',
        useSchemeMeasurands: false,
      }).expect(201);
      const r = await moveTo(res.body.id, 'enrolling').expect(422);
      expect(r.body.error.code).toBe('round_incomplete');
      expect(r.body.error.details).toEqual({ items: 0, measurands: 0 });
    });

    it('refuses a move the lifecycle does not have (409 transition_not_allowed)', async () => {
      const id = await newRound('R-SKIP');
      const r = await moveTo(id, 'collecting').expect(409);
      expect(r.body.error.code).toBe('transition_not_allowed');
      expect(r.body.error.message).toBe('A round cannot move from Draft to Collecting.');
    });

    it('walks draft → enrolling → in transit → collecting → closed with the rules, audited', async () => {
      const id = await newRound('R-WALK', { resultsDueAt: PLUS_DAYS(10) });
      await moveTo(id, 'enrolling').expect(200);
      expect((await moveTo(id, 'in-transit').expect(422)).body.error.code).toBe('no_participants');
      await inviteAndAccept(id, labA, 'alice@a.test');
      expect(
        (await moveTo(id, 'draft', { reason: 'Wrong items chosen' }).expect(409)).body.error.code,
      ).toBe('round_has_enrolments');
      await moveTo(id, 'in-transit').expect(200);
      await moveTo(id, 'collecting').expect(200);
      const early = await moveTo(id, 'closed').expect(422);
      expect(early.body.error.code).toBe('results_not_due');
      const noReason = await moveTo(id, 'closed', { force: true }).expect(400);
      expect(noReason.body.error.details[0].path).toBe('reason');
      const closed = await moveTo(id, 'closed', {
        force: true,
        reason: 'All labs submitted early',
      }).expect(200);
      expect(closed.body.state).toBe('closed');
      expect(closed.body.transitions.map((x: { toState: string }) => x.toState)).toEqual([
        'enrolling',
        'in-transit',
        'collecting',
        'closed',
      ]);
      expect(closed.body.transitions[3]).toMatchObject({
        forced: true,
        reason: 'All labs submitted early',
        actorName: 'Cora Ordin',
      });
      const rows = await t.ds.getRepository(RoundTransition).find({ where: { roundId: id } });
      expect(rows).toHaveLength(4);
      const audits = await t.ds
        .getRepository(AuditEvent)
        .find({ where: { subjectId: id, action: 'round.transition' } });
      expect(audits).toHaveLength(4);
      // reopening needs a reason
      expect((await moveTo(id, 'collecting').expect(422)).body.error.code).toBe('reason_required');
      // evaluation and publication belong to the Consensus board
      expect((await moveTo(id, 'evaluated').expect(409)).body.error.code).toBe(
        'transition_owned_by_evaluation',
      );
      // "Reopen for results" tells every enrolled lab, with the reason
      await moveTo(id, 'collecting', { reason: 'Lab P asked to correct a typing slip' }).expect(
        200,
      );
      const mails = await mailTo(t.ds, 'alice@a.test', 2);
      const reopened = mails.find((m) => /accepts results again/.test(m.subject));
      expect(reopened?.text).toContain('Lab P asked to correct a typing slip');
    });

    it('closes without force once results are due', async () => {
      const id = await roundWithLab('R-DUE', 5, labB, 'bob@b.test');
      await moveTo(id, 'in-transit').expect(200);
      await moveTo(id, 'collecting').expect(200);
      await t.ds
        .getRepository(Round)
        .update({ id }, { resultsDueAt: new Date(Date.now() - 60_000) });
      const res = await moveTo(id, 'closed').expect(200);
      expect(res.body.transitions.at(-1)).toMatchObject({
        toState: 'closed',
        forced: false,
        reason: null,
      });
    });

    it('blocks publication while a failing homogeneity check has no decision (service API for the evaluation)', async () => {
      const id = await newRound('R-PUB', { resultsDueAt: PLUS_DAYS(1) });
      const d = await detail(id);
      const failing = await homogeneityStudy(
        id,
        d.items[0].id,
        d.measurands[0].id,
        FAILING_ITEMS,
        2,
      ).expect(201);
      expect(failing.body.passes).toBe(false);
      await t.ds.getRepository(Round).update({ id }, { state: 'closed' });
      const actor = await t.ds.getRepository(User).findOneByOrFail({ email: 'coord@x.test' });
      await t.ds.transaction((em) => transitionRound(em, id, 'evaluated', { id: actor.id }));
      await expect(
        t.ds.transaction((em) => transitionRound(em, id, 'published', { id: actor.id })),
      ).rejects.toMatchObject({
        status: 422,
        code: 'homogeneity_decision_missing',
      });
      expect(await detail(id)).toMatchObject({
        state: 'evaluated',
        hasOpenHomogeneityFailure: true,
      });
      await decide(id, failing.body.id, {
        decision: 'widen-sigma-pt',
        reason: 'σ_pt widened to include s_s',
      }).expect(200);
      await t.ds.transaction((em) => assertPublishable(em, id));
      const published = await t.ds.transaction((em) =>
        transitionRound(em, id, 'published', { id: actor.id }),
      );
      expect(published.state).toBe('published');
      // no reopening a published round except as a reissue
      await expect(
        t.ds.transaction((em) => transitionRound(em, id, 'closed', { id: actor.id })),
      ).rejects.toMatchObject({ status: 409, code: 'transition_not_allowed' });
      const locked = await patch(`/rounds/${id}`, { title: 'Changed in place' }).expect(409);
      expect(locked.body.error.code).toBe('round_locked');
      await expect(
        t.ds.transaction((em) => transitionRound(em, id, 'reissued', { id: actor.id })),
      ).rejects.toMatchObject({ status: 422, code: 'reason_required' });
      await t.ds.transaction((em) =>
        transitionRound(
          em,
          id,
          'reissued',
          { id: actor.id },
          { reason: 'Corrected unit of lab P' },
        ),
      );
      const renamed = await patch(`/rounds/${id}`, { title: 'x y' });
      expect(renamed.status).toBe(200); // a reissue reopens the description for the correction
    });
  });

  describe('invitations and enrolment', () => {
    let roundId: string;
    beforeAll(async () => {
      roundId = await newRound('R-INV', { resultsDueAt: PLUS_DAYS(20) });
    });

    it('refuses invitations before enrolment opens', async () => {
      const res = await invite(roundId, [{ organisationId: labA, email: 'alice@a.test' }]).expect(
        409,
      );
      expect(res.body.error.code).toBe('round_not_enrolling');
      await moveTo(roundId, 'enrolling').expect(200);
    });

    it('names the field of a bad invitation', async () => {
      const res = await invite(roundId, [{ email: 'not-an-address' }]).expect(400);
      expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(
        'invitations.0.email',
      );
    });

    it('e-mails an existing lab; only a signed-in member accepts; the link works once', async () => {
      await invite(roundId, [{ organisationId: labA, email: 'alice@a.test' }]).expect(201);
      const [mail] = await mailTo(t.ds, 'alice@a.test');
      expect(mail!.to).toEqual(['alice@a.test']);
      expect(mail!.subject).toBe('Invitation to proficiency-testing round R-INV');
      const token = invitationToken(mail!.text);
      const anon = await client(t);
      const info = await anon.agent.get(`/api/v1/invitations/${token}`).expect(200);
      expect(info.body).toMatchObject({
        roundCode: 'R-INV',
        labName: 'Lab Alpha',
        isNewLab: false,
      });
      // anonymous: 401, and the link still works afterwards (nothing half-saved)
      expect((await accept(anon, token).expect(401)).body.error.code).toBe('unauthenticated');
      const bob = await signedIn(t, 'bob@b.test');
      expect((await accept(bob, token).expect(403)).body.error.code).toBe('not_a_member');
      const alice = await signedIn(t, 'alice@a.test');
      const ok = await accept(alice, token).expect(201);
      expect(ok.body.participantCode).toMatch(/^P[ABCDEFGHJKMNPQRSTUVWXYZ23456789]{4}$/);
      expect(ok.body.accountCreated).toBe(false);
      const again = await accept(alice, token).expect(404);
      expect(again.body.error.code).toBe('link_invalid');
      await anon.agent.get(`/api/v1/invitations/${token}`).expect(404);
      expect(await enrolments(roundId)).toEqual([
        expect.objectContaining({
          organisationName: 'Lab Alpha',
          participantCode: ok.body.participantCode,
          receiptStatus: 'not-dispatched',
          state: 'enrolled',
        }),
      ]);
      // a second invitation for an enrolled lab is refused
      expect(
        (await invite(roundId, [{ organisationId: labA, email: 'alice@a.test' }]).expect(409)).body
          .error.code,
      ).toBe('already_enrolled');
    });

    it('a new lab by contact address: accepting creates the lab and an account with a first-password link (once)', async () => {
      await invite(roundId, [{ email: 'Head@Gamma.test', labName: 'Lab Gamma' }]).expect(201);
      const anon = await client(t);
      const accepted = await accept(anon, await invitationFor('head@gamma.test')).expect(201);
      expect(accepted.body.accountCreated).toBe(true);
      const lab = await t.ds.getRepository(Organisation).findOneByOrFail({ name: 'Lab Gamma' });
      expect(lab.contactEmail).toBe('head@gamma.test');
      const enrolment = await t.ds
        .getRepository(Enrolment)
        .findOneByOrFail({ roundId, organisationId: lab.id });
      expect(enrolment.participantCode).toBe(accepted.body.participantCode);
      const mails = await mailTo(t.ds, 'head@gamma.test', 2);
      const account = mails.find((m) => m.subject === 'Your Ringlet account')!;
      const pw = linkToken(account.text);
      await post(anon, '/auth/password', { token: pw, password: 'gamma first password' }).expect(
        204,
      );
      expect(
        (
          await post(anon, '/auth/password', {
            token: pw,
            password: 'gamma other password',
          }).expect(404)
        ).body.error.code,
      ).toBe('link_invalid');
      const head = await signedIn(t, 'head@gamma.test', 'gamma first password');
      const me = await head.agent.get('/api/v1/auth/me').expect(200);
      expect(me.body.memberships).toEqual([
        expect.objectContaining({ organisationName: 'Lab Gamma', isManager: true }),
      ]);
    });

    it('an expired invitation is refused', async () => {
      await invite(roundId, [{ organisationId: labB, email: 'bob@b.test' }]).expect(201);
      const token = await invitationFor('bob@b.test');
      await t.ds.query(
        `UPDATE invitation SET expires_at = now() - interval '1 minute' WHERE email = 'bob@b.test' AND round_id = $1`,
        [roundId],
      );
      const bob = await signedIn(t, 'bob@b.test');
      expect((await accept(bob, token).expect(404)).body.error.code).toBe('link_invalid');
    });

    it('withdraws an enrolment with a reason, once', async () => {
      const [e] = await enrolments(roundId);
      const bad = await onEnrolment(roundId, e.id, 'withdrawal', { reason: '' }).expect(400);
      expect(bad.body.error.details[0].path).toBe('reason');
      const ok = await onEnrolment(roundId, e.id, 'withdrawal', {
        reason: 'Lab asked to withdraw',
      }).expect(200);
      expect(ok.body).toMatchObject({
        state: 'withdrawn',
        withdrawnReason: 'Lab asked to withdraw',
      });
      expect(
        (await onEnrolment(roundId, e.id, 'withdrawal', { reason: 'Again please' }).expect(409))
          .body.error.code,
      ).toBe('already_withdrawn');
      const audit = await t.ds
        .getRepository(AuditEvent)
        .findOneByOrFail({ subjectId: e.id, action: 'enrolment.withdrawn' });
      expect(audit.details).toMatchObject({ reason: 'Lab asked to withdraw' });
    });

    it('an enrolment of another round answers 404', async () => {
      const other = await newRound('R-OTHER');
      const [e] = await enrolments(roundId);
      await onEnrolment(other, e.id, 'withdrawal', { reason: 'wrong round' }).expect(404);
    });
  });

  describe('participant codes', () => {
    it('are P + 4 characters of the unambiguous alphabet, spread over it', () => {
      const seen = new Set<string>();
      const chars = new Map<string, number>();
      for (let i = 0; i < 2000; i++) {
        const c = randomParticipantCode();
        expect(c).toMatch(/^P[A-Z2-9]{4}$/);
        expect(c.slice(1)).not.toMatch(/[01OIL]/);
        seen.add(c);
        for (const ch of c.slice(1)) chars.set(ch, (chars.get(ch) ?? 0) + 1);
      }
      expect(CODE_ALPHABET).toHaveLength(31);
      expect(seen.size).toBeGreaterThan(1990); // 2000 draws from 923,521 codes: ~2 collisions expected
      expect(chars.size).toBe(31);
    });
    it('retries on a collision within the round', async () => {
      const roundId = await newRound('R-CODES');
      await t.ds.getRepository(Round).update({ id: roundId }, { state: 'enrolling' });
      await t.ds
        .getRepository(Enrolment)
        .insert({ roundId, organisationId: labA, participantCode: 'PAAAA' });
      const draws = ['PAAAA', 'PAAAA', 'PBBBB'];
      const code = await freshParticipantCode(t.ds.manager, roundId, () => draws.shift()!);
      expect(code).toBe('PBBBB');
    });
  });

  describe('shipments and extensions', () => {
    let roundId: string;
    let enrolmentId: string;
    beforeAll(async () => {
      roundId = await roundWithLab('R-SHIP', 3, labB, 'bob@b.test');
      enrolmentId = (await enrolments(roundId))[0].id;
    });

    it('records the dispatch and e-mails the lab', async () => {
      const bad = await onEnrolment(roundId, enrolmentId, 'dispatch', {
        courier: 'Swift Parcel',
        trackingNumber: 'SP-1',
        dispatchedOn: '31/03/2026',
      }).expect(400);
      expect(bad.body.error.details[0].path).toBe('dispatchedOn');
      const res = await onEnrolment(roundId, enrolmentId, 'dispatch', {
        courier: 'Swift Parcel',
        trackingNumber: 'SP-123',
        dispatchedOn: '2026-03-02',
      }).expect(200);
      expect(res.body).toMatchObject({
        receiptStatus: 'dispatched',
        shipment: {
          courier: 'Swift Parcel',
          trackingNumber: 'SP-123',
          dispatchedOn: '2026-03-02',
          receivedOn: null,
        },
      });
      const mails = await mailTo(t.ds, 'bob@b.test');
      const mail = mails.find((m) => m.subject === 'Test items for round R-SHIP are on their way')!;
      expect(mail.to).toEqual(['bob@b.test']);
      expect(mail.text).toContain('SP-123');
      // every caution from the one shared list, and what to do with a leaked or damaged parcel
      for (const c of [...SAFETY_CAUTIONS, ...DAMAGED_PARCEL_CAUTIONS])
        expect(mail.text).toContain(c);
    });

    it('shows the receipt the lab recorded; no re-dispatch after receipt', async () => {
      await t.ds
        .getRepository(Shipment)
        .update({ enrolmentId }, { receivedOn: '2026-03-04', condition: 'arrived-warm' });
      const [e] = await enrolments(roundId);
      expect(e).toMatchObject({
        receiptStatus: 'received-with-problem',
        shipment: { receivedOn: '2026-03-04', condition: 'arrived-warm' },
      });
      const res = await onEnrolment(roundId, enrolmentId, 'dispatch', {
        courier: 'Other',
        trackingNumber: 'X',
        dispatchedOn: '2026-03-05',
      }).expect(409);
      expect(res.body.error.code).toBe('already_received');
    });

    it('grants an extension after the due date with a reason, audited', async () => {
      await moveTo(roundId, 'in-transit').expect(200);
      const early = await onEnrolment(roundId, enrolmentId, 'extension', {
        until: PLUS_DAYS(1),
        reason: 'Instrument repair',
      }).expect(422);
      expect(early.body.error.code).toBe('extension_before_due');
      const until = PLUS_DAYS(7);
      const ok = await onEnrolment(roundId, enrolmentId, 'extension', {
        until,
        reason: 'Instrument repair',
      }).expect(200);
      expect(ok.body.extensionUntil).toBe(until);
      const row = await t.ds.getRepository(Enrolment).findOneByOrFail({ id: enrolmentId });
      expect(row.extensionUntil?.toISOString()).toBe(until);
      const audit = await t.ds
        .getRepository(AuditEvent)
        .findOneByOrFail({ subjectId: enrolmentId, action: 'enrolment.extension-granted' });
      expect(audit.details).toMatchObject({ reason: 'Instrument repair', until });
    });
  });

  describe('homogeneity and stability', () => {
    let roundId: string;
    let itemId: string;
    let zId: string;
    beforeAll(async () => {
      roundId = await newRound('R-HOM');
      const d = await detail(roundId);
      itemId = d.items[0].id;
      zId = d.measurands[0].id;
    });
    /** A homogeneity study of the first item's Z-average. */
    const study = (items: number[][], sigmaPt?: number) =>
      homogeneityStudy(roundId, itemId, zId, items, sigmaPt);
    /** A study of the first item's Z-average sent as a file (multipart), σ_pt as typed. */
    function upload(kind: string, sigmaPt: string | undefined, file: Buffer, name: string) {
      const req = coord.agent
        .post(api(`/rounds/${roundId}/homogeneity/upload`))
        .set('x-csrf-token', coord.csrf)
        .field('kind', kind)
        .field('testItemId', itemId)
        .field('measurandId', zId);
      return (sigmaPt === undefined ? req : req.field('sigmaPt', sigmaPt)).attach(
        'file',
        file,
        name,
      );
    }

    it('computes a passing homogeneity check with the numbers (hand-computed)', async () => {
      // item means 101, 102, 100 → s_x = 1; each pair differs by 2 → s_t² = 2, s_w² = 2;
      // s_s² = max(0, 1 − 2/2) = 0. σ_pt = 1 → limit 0.3 (ISO 13528:2015 B.2, from memory)
      const res = await study(
        [
          [100, 102],
          [101, 103],
          [99, 101],
        ],
        1,
      ).expect(201);
      expect(res.body.passes).toBe(true);
      expect(res.body.result.sx).toBeCloseTo(1, 12);
      expect(res.body.result.sw).toBeCloseTo(Math.SQRT2, 12);
      expect(res.body.result.ss).toBe(0);
      expect(res.body.result.limit).toBeCloseTo(0.3, 12);
      expect(res.body.result.generalMean).toBeCloseTo(101, 12);
    });

    it('a failing check: s_s = √24.99, widened σ_pt, decision needed; 409 on a decision for a passing check', async () => {
      // means 100.1, 105.1, 95.1 → s_x = 5; s_t² = 0.02 → s_w² = 0.02; s_s² = 25 − 0.01 = 24.99
      // F1 = χ²(0.95; 2)/2 = 5.9915/2 = 2.9957 (χ² table); extended limit² = 2.9957·0.36 + F2·0.02 ≪ 24.99
      const res = await study(FAILING_ITEMS, 2).expect(201);
      expect(res.body.passes).toBe(false);
      expect(res.body.result.ss).toBeCloseTo(Math.sqrt(24.99), 10);
      expect(res.body.result.f1).toBeCloseTo(2.9957, 4);
      expect(res.body.result.passesExtended).toBe(false);
      expect(res.body.result.widenedSigmaPt).toBeCloseTo(Math.sqrt(4 + 24.99), 10);
      const list = await coord.agent.get(`/api/v1/rounds/${roundId}/homogeneity`).expect(200);
      expect(list.body).toHaveLength(1); // replaced the earlier study of the same item × measurand
      expect((await detail(roundId)).hasOpenHomogeneityFailure).toBe(true);
      const bad = await decide(roundId, res.body.id, {
        decision: 'shrug',
        reason: 'whatever',
      }).expect(400);
      expect(bad.body.error.details[0].path).toBe('decision');
      const ok = await decide(roundId, res.body.id, {
        decision: 'widen-sigma-pt',
        reason: 'Include s_s in σ_pt',
      }).expect(200);
      expect(ok.body).toMatchObject({
        decision: 'widen-sigma-pt',
        decisionReason: 'Include s_s in σ_pt',
      });
      expect((await detail(roundId)).hasOpenHomogeneityFailure).toBe(false);
    });

    it('stability: |ȳ₁ − ȳ₂| = 0.5 ≤ 0.3·2 passes', async () => {
      const res = await post(coord, `/rounds/${roundId}/homogeneity`, {
        kind: 'stability',
        testItemId: itemId,
        measurandId: zId,
        sigmaPt: 2,
        data: { first: [100, 101, 102], second: [100.5, 101.5, 102.5] },
      }).expect(201);
      expect(res.body.passes).toBe(true);
      expect(res.body.result.difference).toBeCloseTo(0.5, 12);
      expect(res.body.result.uFirst).toBeCloseTo(1 / Math.sqrt(3), 12);
    });

    it('needs σ_pt when the measurand rule depends on the results (422 sigma_pt_needed)', async () => {
      const res = await study([
        [1, 2],
        [1, 2],
      ]).expect(422);
      expect(res.body.error.code).toBe('sigma_pt_needed');
    });

    it('names the field for unequal replicate counts', async () => {
      const res = await study(
        [
          [1, 2],
          [1, 2, 3],
        ],
        1,
      ).expect(400);
      expect(res.body.error.details[0].path).toBe('data.items');
    });

    it('accepts a CSV upload and computes the same numbers', async () => {
      const csv = 'item,rep1,rep2\nH01,100,102\nH02,101,103\nH03,99,101\n';
      const res = await upload('homogeneity', '1', Buffer.from(csv), 'homogeneity.csv').expect(201);
      expect(res.body.data.items).toEqual([
        [100, 102],
        [101, 103],
        [99, 101],
      ]);
      expect(res.body.result.sx).toBeCloseTo(1, 12);
    });

    it('accepts an XLSX stability upload', async () => {
      const wb = new ExcelJS.Workbook();
      const ws = wb.addWorksheet('stability');
      ws.addRow(['occasion', 'z-average nm']);
      for (const v of [100, 101, 102]) ws.addRow(['first', v]);
      for (const v of [103, 104, 105]) ws.addRow(['second', v]);
      const buf = Buffer.from(await wb.xlsx.writeBuffer());
      const res = await upload('stability', '2', buf, 'stability.xlsx').expect(201);
      // |101 − 104| = 3 > 0.6; extended 0.6 + 2·√(1/3 + 1/3) = 2.233 → fails
      expect(res.body.result.difference).toBeCloseTo(3, 12);
      expect(res.body.result.extendedLimit).toBeCloseTo(0.6 + 2 * Math.sqrt(2 / 3), 12);
      expect(res.body.passes).toBe(false);
    });

    it('refuses a binary file that is not a workbook', async () => {
      const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 0, 0]);
      const res = await upload('homogeneity', undefined, png, 'x.csv').expect(422);
      expect(res.body.error.code).toBe('file_type');
    });
  });
});
