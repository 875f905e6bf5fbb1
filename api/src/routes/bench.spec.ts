import ExcelJS from 'exceljs';
import { createHash, randomUUID } from 'node:crypto';
import { AuditEvent, Enrolment, Round } from '../../../db/entities';
import {
  celsiusToKelvin,
  decayRate,
  diffusionFromDiameter,
  scatteringVector,
  waterViscosity,
} from '../../../shared/dls';
import {
  cleanResults,
  createBenchRound,
  enrol,
  passingCheck,
  type BenchRound,
} from '../testing/bench-fixtures';
import {
  api,
  binary,
  createLab,
  send,
  signedIn,
  startCast,
  type Client,
  type TestApp,
} from '../testing/test-app';

/** A clean single-exponential correlation function of monodisperse spheres (g2 − 1 = β·e^(−2Γτ)). */
function correlationCsv(diameterNm: number, temperatureC = 25): string {
  const eta = waterViscosity(temperatureC);
  const D = diffusionFromDiameter(diameterNm * 1e-9, celsiusToKelvin(temperatureC), eta);
  const gamma = decayRate(D, scatteringVector(1.332, 633e-9, 173));
  const lines = ['lag time (s),g2-1'];
  for (let i = 0; i < 120; i++) {
    const tau = 1e-7 * Math.pow(1.12, i);
    lines.push(`${tau.toExponential(6)},${(0.9 * Math.exp(-2 * gamma * tau)).toExponential(8)}`);
  }
  return lines.join('\n');
}

describe('Lab bench API', () => {
  let t: TestApp;
  let labA: string;
  let labB: string;
  let a: Client; // analyst of lab A
  let b: Client; // analyst of lab B
  let multi: Client; // member of both labs
  let coord: Client;
  let r: BenchRound;

  const put = (c: Client, p: string, body: unknown) => send(c, p, body, 'put');
  const post = (c: Client, p: string, body: unknown) => send(c, p, body);
  const submit = (c: Client, roundId: string, body: Record<string, unknown>) =>
    post(c, `/rounds/${roundId}/submission/submit`, { idempotencyKey: randomUUID(), ...body });

  beforeAll(async () => {
    const cast = await startCast({
      labs: ['Alder Particle Lab', 'Birch Colloid Lab'],
      users: [
        { email: 'a@bench.test', name: 'Ann Alder', lab: 0, signIn: true },
        { email: 'b@bench.test', name: 'Ben Birch', lab: 1, signIn: true },
        { email: 'multi@bench.test', name: 'Mo Multi', lab: 0 },
        { email: 'coord@bench.test', roles: ['coordinator'], signIn: true },
      ],
    });
    ({ t } = cast);
    [labA, labB] = cast.labIds as [string, string];
    await t.ds.query(
      `INSERT INTO membership (user_id, organisation_id, is_manager) VALUES ($1, $2, false)`,
      [cast.users[2]!.id, labB],
    );
    a = cast.as('a@bench.test');
    b = cast.as('b@bench.test');
    multi = await signedIn(t, 'multi@bench.test');
    coord = cast.as('coord@bench.test');
    r = await createBenchRound(t.ds, { code: 'LB-MAIN' });
    await enrol(t.ds, r.round.id, labA, 'P-017');
    await enrol(t.ds, r.round.id, labB, 'P-042');
  });
  afterAll(() => t.close());

  describe('rounds and confidentiality', () => {
    it('lists the lab’s rounds with its own participant code, deadline and status', async () => {
      const other = await createBenchRound(t.ds, { code: 'LB-ONLY-B' });
      await enrol(t.ds, other.round.id, labB, 'P-001');
      const res = await a.agent.get(api('/my/rounds')).expect(200);
      expect(res.body).toHaveLength(1);
      expect(res.body[0]).toMatchObject({
        code: 'LB-MAIN',
        participantCode: 'P-017',
        status: 'due-soon',
        submittedVersion: 0,
      });
      expect(Date.parse(res.body[0].locksAt)).toBe(r.round.resultsDueAt!.getTime());
      expect(JSON.stringify(res.body)).not.toContain('P-042');
    });

    it('shows a round with items, measurands, safety cautions and no other lab', async () => {
      const res = await a.agent.get(api(`/my/rounds/${r.round.id}`)).expect(200);
      expect(res.body.items.map((i: { code: string }) => i.code)).toEqual(['A', 'B']);
      expect(
        res.body.measurands.map((m: { key: string; replicatesRequired: number }) => [
          m.key,
          m.replicatesRequired,
        ]),
      ).toEqual([
        ['z_average', 3],
        ['pdi', 3],
      ]);
      expect(res.body.safetyCautions.join(' ')).toMatch(/eye protection.*gloves/i);
      expect(res.body.safetyCautions.join(' ')).toMatch(/laser interlock/);
      expect(JSON.stringify(res.body)).not.toMatch(/P-042|Birch/);
    });

    it('answers 404 for another lab’s round and objects', async () => {
      const other = await createBenchRound(t.ds, { code: 'LB-FOREIGN' });
      await enrol(t.ds, other.round.id, labB, 'P-002');
      await post(b, `/rounds/${other.round.id}/submission/attachments`, {}).expect(400); // own: no file
      const id = other.round.id;
      const calls = [
        a.agent.get(api(`/my/rounds/${id}`)),
        a.agent.get(api(`/rounds/${id}/submission`)),
        put(a, `/rounds/${id}/submission`, { data: {}, baseRevision: 0 }),
        submit(a, id, { data: cleanResults(other), note: 'x' }),
        a.agent.get(api(`/rounds/${id}/submission/attachments`)),
        put(a, `/rounds/${id}/receipt`, { receivedOn: '2025-01-02', condition: 'intact' }),
        a.agent.get(api(`/rounds/${id}/submission/template.xlsx`)),
      ];
      for (const res of await Promise.all(calls)) {
        expect({ status: res.status, code: res.body?.error?.code }).toEqual({
          status: 404,
          code: 'not_found',
        });
      }
    });

    it('makes a user of several labs choose one, and only among their own', async () => {
      const res = await multi.agent.get(api('/my/rounds')).expect(400);
      expect(res.body.error.message).toContain('labId');
      const asA = await multi.agent.get(api(`/my/rounds?labId=${labA}`)).expect(200);
      expect(asA.body[0].participantCode).toBe('P-017');
      const asB = await multi.agent.get(api('/my/rounds')).set('x-lab-id', labB).expect(200);
      expect(asB.body.map((x: { participantCode: string }) => x.participantCode)).toContain(
        'P-042',
      );
      const stranger = (await createLab(t.ds, 'Cedar Lab')).id;
      await multi.agent.get(api(`/my/rounds?labId=${stranger}`)).expect(404);
    });
  });

  describe('receipt', () => {
    it('records date and condition, refuses bad input and stores a photo checked by content', async () => {
      const bad = await put(a, `/rounds/${r.round.id}/receipt`, {
        receivedOn: '2025-01-02',
        condition: 'squashed',
      }).expect(400);
      expect(bad.body.error.details[0].path).toBe('condition');
      const png = Buffer.concat([
        Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
        Buffer.alloc(64, 1),
      ]);
      const res = await a.agent
        .put(api(`/rounds/${r.round.id}/receipt`))
        .set('x-csrf-token', a.csrf)
        .field('receivedOn', '2025-01-02')
        .field('condition', 'arrived-warm')
        .field('notes', 'Cool pack thawed')
        .attach('photo', png, 'box.png')
        .expect(200);
      expect(res.body.receipt).toMatchObject({
        receivedOn: '2025-01-02',
        condition: 'arrived-warm',
        notes: 'Cool pack thawed',
        hasPhoto: true,
      });
      const photo = await a.agent.get(api(`/rounds/${r.round.id}/receipt/photo`)).expect(200);
      expect(photo.headers['content-type']).toBe('image/png');
      await a.agent
        .put(api(`/rounds/${r.round.id}/receipt`))
        .set('x-csrf-token', a.csrf)
        .field('receivedOn', '2025-01-02')
        .field('condition', 'intact')
        .attach('photo', Buffer.from('not an image'), 'box.png')
        .expect(415);
      const events = await t.ds.getRepository(AuditEvent).findBy({ action: 'shipment.received' });
      expect(events).toHaveLength(1);
    });
  });

  describe('instrument checks', () => {
    // Check values: common practice, no published source (issue 5).
    it('passes the 92 nm latex within 3 nm, PDI ≤ 0.025, 25 °C, ≥ 5 min and fails 115.7 nm with PDI 0.125', async () => {
      const ok = await post(a, '/my/instrument-checks', passingCheck('Sizer One')).expect(201);
      expect(ok.body.verdict.passed).toBe(true);
      expect(ok.body.verdict.meanZAverageNm).toBeCloseTo(93.0333, 3);
      const failing = {
        ...passingCheck('Sizer Two'),
        runs: [{ zAverageNm: 115.7, pdi: 0.125, temperatureC: 25, equilibrationMin: 5 }],
      };
      const tooFew = await post(a, '/my/instrument-checks', failing).expect(400);
      expect(tooFew.body.error.details[0].path).toBe('runs');
      const threeRuns = {
        ...failing,
        runs: [
          failing.runs[0],
          { zAverageNm: 92.1, pdi: 0.02, temperatureC: 25, equilibrationMin: 5 },
          { zAverageNm: 91.9, pdi: 0.02, temperatureC: 25, equilibrationMin: 5 },
        ],
      };
      const bad = await post(a, '/my/instrument-checks', threeRuns).expect(201);
      expect(bad.body.verdict.passed).toBe(false);
      expect(bad.body.verdict.reasons.map((x: { code: string }) => x.code)).toEqual([
        'mean-out-of-tolerance',
        'pdi-above-limit',
      ]);
    });

    it('keeps a history per instrument, only for the own lab', async () => {
      const all = await a.agent.get(api('/my/instrument-checks')).expect(200);
      expect(all.body).toHaveLength(2);
      const one = await a.agent.get(api('/my/instrument-checks?instrument=sizer two')).expect(200);
      expect(
        one.body.map((c: { instrument: string; verdict: { passed: boolean } }) => [
          c.instrument,
          c.verdict.passed,
        ]),
      ).toEqual([['Sizer Two', false]]);
      expect((await b.agent.get(api('/my/instrument-checks')).expect(200)).body).toEqual([]);
    });
  });

  describe('draft, submit and amend', () => {
    it('saves drafts with a revision and refuses a stale one', async () => {
      const data = cleanResults(r);
      const first = await put(a, `/rounds/${r.round.id}/submission`, {
        data,
        baseRevision: 0,
      }).expect(200);
      expect(first.body.draftRevision).toBe(1);
      await put(a, `/rounds/${r.round.id}/submission`, { data, baseRevision: 1 }).expect(200);
      const stale = await put(a, `/rounds/${r.round.id}/submission`, {
        data,
        baseRevision: 1,
      }).expect(409);
      expect(stale.body.error.code).toBe('draft_conflict');
      const view = await a.agent.get(api(`/rounds/${r.round.id}/submission`)).expect(200);
      expect(view.body).toMatchObject({
        state: 'draft',
        draftRevision: 2,
        currentVersion: 0,
        isLocked: false,
      });
      expect(view.body.draft.items[0].results[0].replicates).toEqual([102, 102.5, 103]);
    });

    it('refuses impossible values and unacknowledged warnings, naming the field', async () => {
      const data = cleanResults(r, { explanation: 'checked' });
      data.items[0]!.results[1]!.replicates[2] = 1.2;
      const res = await submit(a, r.round.id, { data }).expect(422);
      expect(res.body.error.code).toBe('results_invalid');
      expect(res.body.error.message).toContain('items.0.results.1.replicates.2');
      const radius = cleanResults(r, { explanation: 'checked' });
      radius.items[0]!.results[0]!.replicates = [50.5, 50.2, 50.8];
      const warn = await submit(a, r.round.id, { data: radius }).expect(422);
      expect(warn.body.error.code).toBe('warnings_unacknowledged');
      expect(warn.body.error.details[0].code).toBe(
        `blunder-radius-diameter:${r.items[0]!.id}:${r.zAverage.id}`,
      );
      expect(await t.ds.query(`SELECT count(*)::int AS n FROM submission_version`)).toEqual([
        { n: 0 },
      ]);
    });

    it('requires an explanation when the instrument used has no passing check', async () => {
      const data = cleanResults(r);
      data.items.forEach((i) => (i.conditions.instrument = 'Sizer Two')); // its latest check failed
      const res = await submit(a, r.round.id, { data }).expect(422);
      expect(res.body.error.code).toBe('instrument_check_explanation_required');
      expect(res.body.error.message).toContain('failed');
    });

    it('submits atomically and idempotently, then amends into a new version', async () => {
      const key = randomUUID();
      const data = cleanResults(r); // Sizer One has a passing check
      const first = await post(a, `/rounds/${r.round.id}/submission/submit`, {
        idempotencyKey: key,
        data,
      }).expect(201);
      expect(first.body).toMatchObject({
        replayed: false,
        version: { version: 1, submittedBy: 'Ann Alder', isLate: false },
      });
      const again = await post(a, `/rounds/${r.round.id}/submission/submit`, {
        idempotencyKey: key,
        data,
      }).expect(200);
      expect(again.body).toMatchObject({ replayed: true, version: { version: 1 } });

      const typo = cleanResults(r);
      typo.items[1]!.results[0]!.replicates = [61.5, 61.6, 61.7];
      await submit(a, r.round.id, { data: typo, note: 'Corrected a typo in item B' }).expect(201);
      const view = await a.agent.get(api(`/rounds/${r.round.id}/submission`)).expect(200);
      expect(view.body.currentVersion).toBe(2);
      expect(
        view.body.versions.map((v: { version: number; note: string | null }) => [
          v.version,
          v.note,
        ]),
      ).toEqual([
        [2, 'Corrected a typo in item B'],
        [1, null],
      ]);
      expect(view.body.versions[1].data.items[1].results[0].replicates).toEqual([61.2, 61.5, 61.8]);
      expect(view.body.versions[0].data.items[1].results[0].replicates).toEqual([61.5, 61.6, 61.7]);
      const actions = (
        await t.ds.getRepository(AuditEvent).findBy({ subjectType: 'submission' })
      ).map((e) => e.action);
      expect(actions.filter((x) => x === 'submission.submitted')).toHaveLength(1);
      expect(actions.filter((x) => x === 'submission.amended')).toHaveLength(1);
      const mine = await a.agent.get(api('/my/rounds')).expect(200);
      expect(mine.body[0]).toMatchObject({ status: 'submitted', submittedVersion: 2 });
    });

    it('gives concurrent submits exactly one version each, and one for a repeated key', async () => {
      const rr = await createBenchRound(t.ds, { code: 'LB-RACE' });
      await enrol(t.ds, rr.round.id, labA, 'P-100');
      const data = cleanResults(rr);
      const results = await Promise.all(
        Array.from({ length: 6 }, () => submit(a, rr.round.id, { data })),
      );
      expect(results.map((x) => x.status)).toEqual([201, 201, 201, 201, 201, 201]);
      expect(results.map((x) => x.body.version.version).sort()).toEqual([1, 2, 3, 4, 5, 6]);
      const key = randomUUID();
      const same = await Promise.all(
        Array.from({ length: 5 }, () =>
          post(a, `/rounds/${rr.round.id}/submission/submit`, { idempotencyKey: key, data }),
        ),
      );
      expect(same.map((x) => x.body.version.version)).toEqual([7, 7, 7, 7, 7]);
      expect(same.filter((x) => x.status === 201)).toHaveLength(1);
      const rows = await t.ds.query(
        `SELECT v.version FROM submission_version v JOIN submission s ON s.id = v.submission_id JOIN enrolment e ON e.id = s.enrolment_id WHERE e.round_id = $1 ORDER BY 1`,
        [rr.round.id],
      );
      expect(rows.map((x: { version: number }) => x.version)).toEqual([1, 2, 3, 4, 5, 6, 7]);
    });
  });

  describe('the lock', () => {
    it('changes nothing after the due date, and replays still answer', async () => {
      const rr = await createBenchRound(t.ds, { code: 'LB-LOCK' });
      await enrol(t.ds, rr.round.id, labA, 'P-200');
      const key = randomUUID();
      await post(a, `/rounds/${rr.round.id}/submission/submit`, {
        idempotencyKey: key,
        data: cleanResults(rr),
      }).expect(201);
      await t.ds
        .getRepository(Round)
        .update({ id: rr.round.id }, { resultsDueAt: new Date(Date.now() - 60_000) });
      const draft = await put(a, `/rounds/${rr.round.id}/submission`, {
        data: cleanResults(rr),
        baseRevision: 1,
      }).expect(409);
      expect(draft.body.error.code).toBe('submission_locked');
      expect(
        (await submit(a, rr.round.id, { data: cleanResults(rr) }).expect(409)).body.error.code,
      ).toBe('submission_locked');
      const csv = Buffer.from(correlationCsv(100));
      await a.agent
        .post(api(`/rounds/${rr.round.id}/submission/attachments`))
        .set('x-csrf-token', a.csrf)
        .attach('file', csv, 'g2.csv')
        .expect(409);
      await post(a, `/rounds/${rr.round.id}/submission/submit`, {
        idempotencyKey: key,
        data: cleanResults(rr),
      }).expect(200);
      const view = await a.agent.get(api(`/rounds/${rr.round.id}/submission`)).expect(200);
      expect(view.body).toMatchObject({ isLocked: true, currentVersion: 1, draftRevision: 1 });
      expect(
        (await a.agent.get(api('/my/rounds')).expect(200)).body.find(
          (x: { code: string }) => x.code === 'LB-LOCK',
        ).status,
      ).toBe('submitted');
    });

    it('accepts a late submission only through an extension the coordinator granted, marked late', async () => {
      const rr = await createBenchRound(t.ds, {
        code: 'LB-LATE',
        resultsDueAt: new Date(Date.now() - 86400_000),
      });
      const e = await enrol(t.ds, rr.round.id, labA, 'P-300');
      expect(
        (await submit(a, rr.round.id, { data: cleanResults(rr) }).expect(409)).body.error.code,
      ).toBe('submission_locked');
      await t.ds
        .getRepository(Enrolment)
        .update({ id: e.id }, { extensionUntil: new Date(Date.now() + 3600_000) });
      const res = await submit(a, rr.round.id, { data: cleanResults(rr) }).expect(201);
      expect(res.body.version.isLate).toBe(true);
      const ev = await t.ds.getRepository(AuditEvent).findOneByOrFail({
        action: 'submission.submitted',
        subjectId: (
          await t.ds.query(`SELECT id FROM submission WHERE enrolment_id = $1`, [e.id])
        )[0].id,
      });
      expect(ev.details).toMatchObject({ isLate: true });
    });

    it('locks when the round leaves collecting', async () => {
      const rr = await createBenchRound(t.ds, { code: 'LB-CLOSED', state: 'closed' });
      await enrol(t.ds, rr.round.id, labA, 'P-400');
      expect(
        (
          await put(a, `/rounds/${rr.round.id}/submission`, {
            data: cleanResults(rr),
            baseRevision: 0,
          }).expect(409)
        ).body.error.code,
      ).toBe('submission_locked');
    });
  });

  describe('attachments', () => {
    let fileId: string;
    it('stores a correlation CSV with checksum and sets the cumulants re-analysis beside the lab’s values', async () => {
      const csv = Buffer.from(correlationCsv(100));
      const res = await a.agent
        .post(api(`/rounds/${r.round.id}/submission/attachments`))
        .set('x-csrf-token', a.csrf)
        .field('testItemId', r.items[0]!.id)
        .attach('file', csv, { filename: 'item-A.csv', contentType: 'application/octet-stream' })
        .expect(201);
      fileId = res.body.id;
      expect(res.body).toMatchObject({
        kind: 'correlation-csv',
        contentType: 'text/csv',
        sizeBytes: csv.length,
        sha256: createHash('sha256').update(csv).digest('hex'),
      });
      // Synthetic monodisperse 100 nm at 25 °C: the fit returns 100 nm and PDI ≈ 0; the lab's draft mean is 102.5 nm (within 5 %).
      expect(res.body.reanalysis.zAverageNm).toBeCloseTo(100, 1);
      expect(res.body.reanalysis.pdi).toBeLessThan(0.005);
      expect(res.body.reanalysis.labZAverageNm).toBeCloseTo(102.5, 6);
      expect(res.body.reanalysis.disagrees).toBe(false);
      // 130 nm data against the lab's 102.5 nm: flagged
      const far = await a.agent
        .post(api(`/rounds/${r.round.id}/submission/attachments`))
        .set('x-csrf-token', a.csrf)
        .field('testItemId', r.items[0]!.id)
        .attach('file', Buffer.from(correlationCsv(130)), 'far.csv')
        .expect(201);
      expect(far.body.reanalysis.zAverageNm).toBeCloseTo(130, 1);
      expect(far.body.reanalysis.disagrees).toBe(true);
      expect(far.body.reanalysis.messages.join(' ')).toContain('differs from the re-analysis');
    });

    it('re-analyses with the wavelength and angle given for the file, and says which values were assumed', async () => {
      const post = (fields: Record<string, string>) => {
        let req = a.agent
          .post(api(`/rounds/${r.round.id}/submission/attachments`))
          .set('x-csrf-token', a.csrf)
          .field('testItemId', r.items[0]!.id);
        for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
        return req.attach('file', Buffer.from(correlationCsv(100)), 'angle.csv');
      };
      const at90 = await post({ laserWavelengthNm: '633', scatteringAngleDeg: '90' }).expect(201);
      expect(at90.body.reanalysis.parameters).toMatchObject({ wavelengthNm: 633, angleDeg: 90 });
      expect(at90.body.reanalysis.assumed).not.toContain('angleDeg');
      expect(at90.body.reanalysis.assumed).not.toContain('wavelengthNm');
      // The decay rate is fixed by the data; the size scales with q² ∝ sin²(θ/2): 100 nm × sin²45° / sin²86.5°.
      expect(at90.body.reanalysis.zAverageNm).toBeCloseTo(
        (100 * Math.sin(Math.PI / 4) ** 2) / Math.sin((86.5 * Math.PI) / 180) ** 2,
        0,
      );
      const bad = await post({ scatteringAngleDeg: '200' }).expect(400);
      expect(bad.body.error.details[0].path).toBe('scatteringAngleDeg');
    });

    it('checks type by content and the 20 MB limit', async () => {
      const up = (buf: Buffer, name: string) =>
        a.agent
          .post(api(`/rounds/${r.round.id}/submission/attachments`))
          .set('x-csrf-token', a.csrf)
          .attach('file', buf, name);
      const pdf = await up(
        Buffer.from('%PDF-1.7\n1 0 obj\n<<>>\nendobj\n%%EOF'),
        'report.pdf',
      ).expect(201);
      expect(pdf.body.kind).toBe('pdf');
      const txt = await up(Buffer.from('Instrument export\nRun 1: 101.2 nm\n'), 'notes.csv').expect(
        201,
      );
      expect(txt.body.kind).toBe('text');
      const exe = await up(Buffer.from([0x4d, 0x5a, 0x90, 0x00, 0x03, 0x00]), 'data.csv').expect(
        415,
      ); // a program named .csv
      expect(exe.body.error.code).toBe('file_type_refused');
      await up(Buffer.concat([Buffer.from('PK\x03\x04'), Buffer.alloc(40)]), 'fake.xlsx').expect(
        415,
      );
      const big = await up(Buffer.alloc(20 * 1024 * 1024 + 1, 0x41), 'big.txt').expect(413);
      expect(big.body.error.code).toBe('file_too_large');
      await up(Buffer.alloc(20 * 1024 * 1024, 0x41), 'limit.txt').expect(201);
      await a.agent
        .post(api(`/rounds/${r.round.id}/submission/attachments`))
        .set('x-csrf-token', a.csrf)
        .expect(400);
    });

    it('lets the lab and the coordinator download, and answers 404 to another lab', async () => {
      const list = await a.agent
        .get(api(`/rounds/${r.round.id}/submission/attachments`))
        .expect(200);
      expect(list.body.length).toBeGreaterThanOrEqual(5);
      const own = await a.agent
        .get(api(`/rounds/${r.round.id}/submission/attachments/${fileId}`))
        .buffer(true)
        .parse(binary)
        .expect(200);
      expect(
        createHash('sha256')
          .update(own.body as Buffer)
          .digest('hex'),
      ).toBe(own.headers['x-content-sha256']);
      expect(own.headers['content-disposition']).toContain('item-A.csv');
      await coord.agent
        .get(api(`/rounds/${r.round.id}/submission/attachments/${fileId}`))
        .expect(200);
      await b.agent.get(api(`/rounds/${r.round.id}/submission/attachments/${fileId}`)).expect(404);
      expect(
        (await b.agent.get(api(`/rounds/${r.round.id}/submission/attachments`)).expect(200)).body,
      ).toEqual([]);
    });
  });

  describe('bulk entry', () => {
    it('round-trips the prefilled template and names row and column of a bad cell', async () => {
      const rr = await createBenchRound(t.ds, { code: 'LB-XLSX' });
      await enrol(t.ds, rr.round.id, labA, 'P-500');
      await put(a, `/rounds/${rr.round.id}/submission`, {
        data: cleanResults(rr),
        baseRevision: 0,
      }).expect(200);
      const tpl = await a.agent
        .get(api(`/rounds/${rr.round.id}/submission/template.xlsx`))
        .buffer(true)
        .parse(binary)
        .expect(200);
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.load(tpl.body as unknown as ArrayBuffer);
      const ws = wb.getWorksheet('Results')!;
      expect(ws.getRow(1).values).toEqual([
        undefined,
        'Item',
        'Measurand file code',
        'Measurand',
        'Unit',
        'Replicate 1',
        'Replicate 2',
        'Replicate 3',
        'Uncertainty type',
        'Uncertainty',
        'k',
      ]);
      expect(ws.getRow(2).values).toEqual([
        undefined,
        'A',
        'z_average',
        'Z-average',
        'nm',
        102,
        102.5,
        103,
        'expanded',
        2,
        2,
      ]);
      ws.getCell('F2').value = 104; // item A Z-average, run 2
      wb.getWorksheet('Conditions')!.getCell('M2').value = '=HYPERLINK("x")';
      const ok = await a.agent
        .post(api(`/rounds/${rr.round.id}/submission/upload.xlsx`))
        .set('x-csrf-token', a.csrf)
        .attach('file', Buffer.from(await wb.xlsx.writeBuffer()), 'results.xlsx')
        .expect(200);
      expect(ok.body.draftRevision).toBe(2);
      expect(ok.body.data.items[0].results[0].replicates).toEqual([102, 104, 103]);
      expect(ok.body.data.items[0].methodNotes).toBe('=HYPERLINK("x")'); // kept as text, never evaluated
      expect(ok.body.data.items[0].conditions.dilution).toBe('1:100');

      ws.getCell('F3').value = 1.5; // item A PDI, run 2
      ws.getCell('G4').value = 'abc'; // item B Z-average, run 3
      const bad = await a.agent
        .post(api(`/rounds/${rr.round.id}/submission/upload.xlsx`))
        .set('x-csrf-token', a.csrf)
        .attach('file', Buffer.from(await wb.xlsx.writeBuffer()), 'results.xlsx')
        .expect(422);
      const msgs = bad.body.error.details.map(
        (d: { sheet: string; row: number; column: string; message: string }) => [
          d.sheet,
          d.row,
          d.column,
          d.message,
        ],
      );
      expect(msgs).toEqual([
        ['Results', 4, 'G', 'Results row 4, column G (Replicate 3): "abc" is not a number.'],
        [
          'Results',
          3,
          'F',
          'Results row 3, column F: A PDI, replicate 2: PDI must be between 0 and 1.',
        ],
      ]);
      const view = await a.agent.get(api(`/rounds/${rr.round.id}/submission`)).expect(200);
      expect(view.body.draftRevision).toBe(2); // nothing half-saved
    });
  });
});
