import { AuditEvent, Membership, User } from '../../../db/entities';
import { createBenchRound, enrol } from '../testing/bench-fixtures';
import { buildEvaluationFixture } from '../testing/evaluation-fixtures';
import {
  api,
  client,
  createLab,
  createUser,
  linkToken,
  mailTo,
  send,
  signedIn,
  startCast,
  startTestApp,
  TEST_PASSWORD,
  type Client,
  type TestApp,
} from '../testing/test-app';
import { HSTS } from '../app';

async function auditRows(t: TestApp, action: string): Promise<AuditEvent[]> {
  return t.ds.getRepository(AuditEvent).find({ where: { action }, order: { id: 'ASC' } });
}

describe('accounts: outbox, sessions, lab invitations, audit, grants', () => {
  let t: TestApp;
  let labA: string;
  let labB: string;
  let admin: Client;
  let boss: Client; // manager of lab A
  beforeAll(async () => {
    const cast = await startCast({
      labs: ['Alder Particle Lab', 'Birch Sizing Lab'],
      users: [
        { email: 'admin@acc.test', name: 'Ada Admin', roles: ['admin'], signIn: true },
        { email: 'coord@acc.test', name: 'Cora Coord', roles: ['coordinator'] },
        { email: 'assessor@acc.test', name: 'Asa Assessor', roles: ['assessor'] },
        { email: 'boss@acc.test', name: 'Bo Boss', lab: 0, manager: true, signIn: true },
        { email: 'analyst@acc.test', name: 'Ann Analyst', lab: 0 },
        { email: 'birch@acc.test', name: 'Bert Birch', lab: 1, manager: true },
      ],
    });
    ({ t } = cast);
    [labA, labB] = cast.labIds as [string, string];
    admin = cast.as('admin@acc.test');
    boss = cast.as('boss@acc.test');
  });
  afterAll(() => t.close());

  describe('Outbox', () => {
    it("shows a lab user only mail addressed to them, never the admin's reset link; the admin sees all", async () => {
      const anon = await client(t);
      await send(anon, '/auth/password-reset', { email: 'admin@acc.test' }).expect(202);
      await send(anon, '/auth/password-reset', { email: 'analyst@acc.test' }).expect(202);
      const [adminMail] = await mailTo(t.ds, 'admin@acc.test');
      const [analystMail] = await mailTo(t.ds, 'analyst@acc.test');
      expect(adminMail).toBeDefined();
      expect(analystMail).toBeDefined();

      const analyst = await signedIn(t, 'analyst@acc.test');
      const mine = await analyst.agent.get(api('/dev/outbox')).expect(200);
      const ids = mine.body.map((m: { id: string }) => m.id);
      expect(ids).toContain(analystMail!.id);
      expect(ids).not.toContain(adminMail!.id);
      for (const m of mine.body as { to: string[] }[])
        expect(m.to.map((a) => a.toLowerCase())).toContain('analyst@acc.test');
      expect(JSON.stringify(mine.body)).not.toContain(linkToken(adminMail!.text));

      const all = await admin.agent.get(api('/dev/outbox')).expect(200);
      const allIds = all.body.map((m: { id: string }) => m.id);
      expect(allIds).toEqual(expect.arrayContaining([adminMail!.id, analystMail!.id]));
    });
  });

  describe('sessions end on a password change or reset', () => {
    it('a password change ends the other session (401 there) and keeps this one', async () => {
      await createUser(t.ds, { email: 'twice@acc.test', lab: labA });
      const first = await signedIn(t, 'twice@acc.test');
      const second = await signedIn(t, 'twice@acc.test');
      await first.agent.get(api('/auth/me')).expect(200); // cached for the second that follows
      await second.agent.get(api('/auth/me')).expect(200);
      const wrong = await send(second, '/auth/password/change', {
        currentPassword: 'not the password',
        password: 'a fresh password here',
      }).expect(422);
      expect(wrong.body.error.details[0].path).toBe('currentPassword');
      await first.agent.get(api('/auth/me')).expect(200); // a refused change ends nothing
      await send(second, '/auth/password/change', {
        currentPassword: TEST_PASSWORD,
        password: 'a fresh password here',
      }).expect(204);
      await first.agent.get(api('/auth/me')).expect(401);
      await second.agent.get(api('/auth/me')).expect(200);
      await signedIn(t, 'twice@acc.test', 'a fresh password here');
      const [row] = await auditRows(t, 'password.changed');
      expect(row!.details).toMatchObject({ otherSessionsEnded: 1 });
    });

    it('a reset through the e-mailed link ends every session of the account', async () => {
      await createUser(t.ds, { email: 'reset@acc.test', lab: labA });
      const signedInElsewhere = await signedIn(t, 'reset@acc.test');
      await signedInElsewhere.agent.get(api('/auth/me')).expect(200);
      const anon = await client(t);
      await send(anon, '/auth/password-reset', { email: 'reset@acc.test' }).expect(202);
      const token = linkToken((await mailTo(t.ds, 'reset@acc.test'))[0]!.text);
      await send(anon, '/auth/password', { token, password: 'the reset password' }).expect(204);
      await signedInElsewhere.agent.get(api('/auth/me')).expect(401);
    });
  });

  describe('lab membership needs consent', () => {
    it('refuses staff accounts (admin, coordinator, assessor) and changes nothing', async () => {
      for (const email of ['admin@acc.test', 'coord@acc.test', 'assessor@acc.test']) {
        const res = await send(boss, `/labs/${labA}/members`, { email, name: 'Staff' }).expect(422);
        expect(res.body.error.code).toBe('staff_account');
        expect(res.body.error.message).toMatch(/^email: /);
        const u = await t.ds.getRepository(User).findOneByOrFail({ email });
        expect(await t.ds.getRepository(Membership).countBy({ userId: u.id })).toBe(0);
      }
      const open: unknown[] = await t.ds.query('SELECT 1 FROM lab_invitation');
      expect(open).toHaveLength(0);
    });

    it('a new address gets an account and the membership at once', async () => {
      const res = await send(boss, `/labs/${labA}/members`, {
        email: 'newbie@acc.test',
        name: 'Nina New',
      }).expect(201);
      expect(res.body.outcome).toBe('member-added');
      expect(res.body.membership).toMatchObject({
        userEmail: 'newbie@acc.test',
        organisationId: labA,
      });
      expect(res.body.invitation).toBeNull();
      const [mail] = await mailTo(t.ds, 'newbie@acc.test');
      expect(mail!.subject).toBe('Your Ringlet account');
    });

    it('an existing account gets an invitation, and no membership until it accepts', async () => {
      const res = await send(boss, `/labs/${labA}/members`, {
        email: 'birch@acc.test',
        name: 'Bert',
      }).expect(201);
      expect(res.body.outcome).toBe('invitation-sent');
      expect(res.body.membership).toBeNull();
      expect(res.body.invitation).toMatchObject({
        organisationId: labA,
        organisationName: 'Alder Particle Lab',
        email: 'birch@acc.test',
        invitedByName: 'Bo Boss',
      });
      const bert = await t.ds.getRepository(User).findOneByOrFail({ email: 'birch@acc.test' });
      expect(
        await t.ds.getRepository(Membership).countBy({ userId: bert.id, organisationId: labA }),
      ).toBe(0);
      const [mail] = await mailTo(t.ds, 'birch@acc.test');
      expect(mail!.subject).toBe('Alder Particle Lab invites you to join the lab on Ringlet');
      expect(mail!.text).toContain('http://ringlet.test/lab-invitations');

      // the manager sees the open invitation; another lab's manager does not
      const listed = await boss.agent.get(api(`/labs/${labA}/invitations`)).expect(200);
      expect(listed.body.map((i: { email: string }) => i.email)).toEqual(['birch@acc.test']);

      const birch = await signedIn(t, 'birch@acc.test');
      await birch.agent.get(api(`/labs/${labA}/invitations`)).expect(404);
      let me = await birch.agent.get(api('/auth/me')).expect(200);
      expect(me.body.memberships.map((m: { organisationId: string }) => m.organisationId)).toEqual([
        labB,
      ]);
      // the Lab bench still acts for the one lab
      await birch.agent.get(api('/my/rounds')).expect(200);

      const mine = await birch.agent.get(api('/my/lab-invitations')).expect(200);
      expect(mine.body).toHaveLength(1);
      const invitationId = mine.body[0].id as string;
      // someone else cannot answer it
      const analyst = await signedIn(t, 'analyst@acc.test');
      await analyst.agent
        .post(api(`/my/lab-invitations/${invitationId}/accept`))
        .set('x-csrf-token', analyst.csrf)
        .expect(404);

      const accepted = await birch.agent
        .post(api(`/my/lab-invitations/${invitationId}/accept`))
        .set('x-csrf-token', birch.csrf)
        .expect(200);
      expect(
        accepted.body.memberships.map((m: { organisationName: string }) => m.organisationName),
      ).toEqual(['Alder Particle Lab', 'Birch Sizing Lab']);
      // the lab acted for before stays chosen in this session
      expect(accepted.body.actingLabId).toBe(labB);
      me = await birch.agent.get(api('/auth/me')).expect(200);
      expect(me.body.actingLabId).toBe(labB);
      expect(
        await t.ds.getRepository(Membership).countBy({ userId: bert.id, organisationId: labA }),
      ).toBe(1);
      // answered once
      await birch.agent
        .post(api(`/my/lab-invitations/${invitationId}/decline`))
        .set('x-csrf-token', birch.csrf)
        .expect(404);
      expect((await auditRows(t, 'lab-invitation.accepted')).map((r) => r.actorId)).toEqual([
        bert.id,
      ]);
    });

    it('a declined invitation leaves no membership; a withdrawn one cannot be accepted', async () => {
      await createUser(t.ds, { email: 'solo@acc.test', name: 'Sol Solo' });
      await send(boss, `/labs/${labA}/members`, { email: 'solo@acc.test', name: 'Sol' }).expect(
        201,
      );
      const solo = await signedIn(t, 'solo@acc.test');
      const [inv] = (await solo.agent.get(api('/my/lab-invitations')).expect(200)).body;
      await solo.agent
        .post(api(`/my/lab-invitations/${inv.id}/decline`))
        .set('x-csrf-token', solo.csrf)
        .expect(204);
      expect((await solo.agent.get(api('/auth/me')).expect(200)).body.memberships).toEqual([]);

      await send(boss, `/labs/${labA}/members`, { email: 'solo@acc.test', name: 'Sol' }).expect(
        201,
      );
      const [again] = (await solo.agent.get(api('/my/lab-invitations')).expect(200)).body;
      await boss.agent
        .delete(api(`/labs/${labA}/invitations/${again.id}`))
        .set('x-csrf-token', boss.csrf)
        .expect(204);
      await solo.agent
        .post(api(`/my/lab-invitations/${again.id}/accept`))
        .set('x-csrf-token', solo.csrf)
        .expect(404);
      expect((await solo.agent.get(api('/auth/me')).expect(200)).body.memberships).toEqual([]);
    });

    it('a person in several labs chooses the lab they act for, kept in the session', async () => {
      const r1 = await createBenchRound(t.ds, { code: 'ACT-A' });
      const r2 = await createBenchRound(t.ds, { code: 'ACT-B' });
      await enrol(t.ds, r1.round.id, labA, 'P-101');
      await enrol(t.ds, r2.round.id, labB, 'P-202');
      const both = await createUser(t.ds, { email: 'both@acc.test', lab: labA });
      await t.ds
        .getRepository(Membership)
        .insert({ userId: both.id, organisationId: labB, isManager: false });
      const c = await signedIn(t, 'both@acc.test');
      expect((await c.agent.get(api('/auth/me')).expect(200)).body.actingLabId).toBeNull();
      const unchosen = await c.agent.get(api('/my/rounds')).expect(400);
      expect(unchosen.body.error.message).toMatch(/^labId: /);

      await send(c, '/auth/acting-lab', { labId: labB }, 'put').expect(200);
      let rounds = await c.agent.get(api('/my/rounds')).expect(200);
      expect(rounds.body.map((r: { code: string }) => r.code)).toEqual(['ACT-B']);
      expect((await c.agent.get(api('/auth/me')).expect(200)).body.actingLabId).toBe(labB);

      await send(c, '/auth/acting-lab', { labId: labA }, 'put').expect(200);
      rounds = await c.agent.get(api('/my/rounds')).expect(200);
      expect(rounds.body.map((r: { code: string }) => r.code)).toEqual(['ACT-A']);
      // an explicit labId still wins for the one request
      rounds = await c.agent.get(api(`/my/rounds?labId=${labB}`)).expect(200);
      expect(rounds.body.map((r: { code: string }) => r.code)).toEqual(['ACT-B']);

      // a lab that is not mine: 404, choice unchanged
      const other = (await createLab(t.ds, 'Cedar Lab')).id;
      await send(c, '/auth/acting-lab', { labId: other }, 'put').expect(404);
      await send(c, '/auth/acting-lab', { labId: 'nope' }, 'put').expect(400);
      expect((await c.agent.get(api('/auth/me')).expect(200)).body.actingLabId).toBe(labA);

      // the choice belongs to the session: another sign-in starts unchosen
      const fresh = await signedIn(t, 'both@acc.test');
      expect((await fresh.agent.get(api('/auth/me')).expect(200)).body.actingLabId).toBeNull();
    });
  });

  describe('audit of refused sign-ins and lockouts', () => {
    it('writes a row per failed sign-in and one when an address locks', async () => {
      await createUser(t.ds, { email: 'target@acc.test' });
      const c = await client(t);
      for (let i = 0; i < 5; i++) {
        await send(c, '/auth/sign-in', { email: 'target@acc.test', password: `wrong-${i}` }).expect(
          401,
        );
      }
      await send(c, '/auth/sign-in', { email: 'target@acc.test', password: TEST_PASSWORD }).expect(
        429,
      );
      const target = await t.ds.getRepository(User).findOneByOrFail({ email: 'target@acc.test' });
      const failed = (await auditRows(t, 'auth.sign-in-failed')).filter(
        (r) => r.subjectId === target.id,
      );
      expect(failed).toHaveLength(5);
      expect(failed.map((r) => (r.details as { failures: number }).failures)).toEqual([
        1, 2, 3, 4, 5,
      ]);
      const locked = (await auditRows(t, 'auth.locked-out')).filter(
        (r) => r.subjectId === target.id,
      );
      expect(locked).toHaveLength(1);
      const refused = (await auditRows(t, 'auth.sign-in-refused')).filter(
        (r) => r.subjectId === target.id,
      );
      expect(refused).toHaveLength(1);

      // an unknown address is audited by the address typed
      await send(c, '/auth/sign-in', {
        email: 'ghost@acc.test',
        password: 'whatever-it-is',
      }).expect(401);
      const ghost = (await auditRows(t, 'auth.sign-in-failed')).filter(
        (r) => (r.details as { email: string }).email === 'ghost@acc.test',
      );
      expect(ghost).toHaveLength(1);
      expect(ghost[0]!.subjectId).toBeNull();
    });
  });

  describe('assessor grants', () => {
    it('answers alike for an unknown address, an assessor and a non-assessor account', async () => {
      const grant = (email: string) =>
        send(boss, `/labs/${labA}/assessor-grants`, {
          email,
          name: 'Given Name',
          startsOn: '2026-01-01',
          endsOn: null,
        });
      const answers = [
        await grant('fresh-auditor@acc.test'),
        await grant('assessor@acc.test'),
        await grant('analyst@acc.test'),
      ];
      const shape = (b: Record<string, unknown>) => {
        const { id: _id, assessorId: _a, createdAt: _c, assessorEmail: _e, ...rest } = b;
        return rest;
      };
      expect(answers.map((a) => a.status)).toEqual([201, 201, 201]);
      expect(shape(answers[1]!.body)).toEqual(shape(answers[0]!.body));
      expect(shape(answers[2]!.body)).toEqual(shape(answers[0]!.body));
      expect(answers.map((a) => a.body.assessorName)).toEqual([
        'Given Name',
        'Given Name',
        'Given Name',
      ]);
      expect(answers.map((a) => Object.keys(a.body).sort().join())).toEqual(
        Array(3).fill(Object.keys(answers[0]!.body).sort().join()),
      );
      // a non-assessor account gains no assessor access from it
      const analyst = await signedIn(t, 'analyst@acc.test');
      expect((await analyst.agent.get(api('/auth/me')).expect(200)).body.roles).toEqual(['lab']);
    });
  });
});

describe('coordinator reveal of lab names is audited', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(() => t.close());

  it('writes one audit row per reveal, none for the codes-only board', async () => {
    const fx = await buildEvaluationFixture(t.ds, { participants: 12, seed: 11 });
    const coordUser = await createUser(t.ds, { email: 'coord@rev.test', roles: ['coordinator'] });
    const coord = await signedIn(t, 'coord@rev.test');
    await send(coord, `/rounds/${fx.round.id}/evaluation`, {}).expect(201);
    await coord.agent.get(api(`/rounds/${fx.round.id}/board`)).expect(200);
    expect(await auditRows(t, 'board.names-revealed')).toHaveLength(0);
    const named = await coord.agent
      .get(api(`/rounds/${fx.round.id}/board?reveal=names`))
      .expect(200);
    expect(Object.keys(named.body.labNames)).toHaveLength(12);
    const rows = await auditRows(t, 'board.names-revealed');
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      actorId: coordUser.id,
      subjectType: 'round',
      subjectId: fx.round.id,
    });
    expect(rows[0]!.details).toMatchObject({ labs: 12 });
  });
});

describe('HSTS only over HTTPS', () => {
  let plain: TestApp;
  let proxied: TestApp;
  beforeAll(async () => {
    plain = await startTestApp();
    proxied = await startTestApp({ trustProxy: true, publicUrl: 'https://ringlet.test' });
  });
  afterAll(async () => {
    await plain.close();
    await proxied.close();
  });

  it('is absent over plain http', async () => {
    const res = await (await client(plain)).agent.get(api('/health')).expect(200);
    expect(res.headers['strict-transport-security']).toBeUndefined();
  });

  it('is absent behind a proxy that forwarded plain http, present when it forwarded https', async () => {
    const c = await client(proxied);
    const http = await c.agent.get(api('/health')).set('X-Forwarded-Proto', 'http').expect(200);
    expect(http.headers['strict-transport-security']).toBeUndefined();
    const https = await c.agent.get(api('/health')).set('X-Forwarded-Proto', 'https').expect(200);
    expect(https.headers['strict-transport-security']).toBe(HSTS);
  });

  it('is ignored from an untrusted client (no trust proxy)', async () => {
    const res = await (
      await client(plain)
    ).agent
      .get(api('/health'))
      .set('X-Forwarded-Proto', 'https')
      .expect(200);
    expect(res.headers['strict-transport-security']).toBeUndefined();
  });
});
