import { AuditEvent, Membership, User } from '../../../db/entities';
import {
  client,
  createUser,
  linkToken,
  mailTo,
  send,
  signedIn,
  startCast,
  type Client,
  type TestApp,
} from '../testing/test-app';

describe('admin: users, labs, memberships', () => {
  let t: TestApp;
  let admin: Client;
  let labA: string;
  let labB: string;
  beforeAll(async () => {
    const cast = await startCast({
      labs: ['Lab Alpha', 'Lab Beta'],
      users: [
        { email: 'root@x.test', roles: ['admin'], signIn: true },
        { email: 'boss@a.test', lab: 0, manager: true },
        { email: 'analyst@a.test', lab: 0 },
      ],
    });
    ({ t } = cast);
    [labA, labB] = cast.labIds as [string, string];
    admin = cast.as('root@x.test');
  });
  afterAll(() => t.close());

  it('invites a user who then sets a first password and signs in', async () => {
    const res = await send(admin, '/admin/users', {
      email: 'New.Person@Lab.test',
      name: 'New Person',
      roles: ['assessor'],
    }).expect(201);
    expect(res.body).toMatchObject({
      email: 'new.person@lab.test',
      roles: ['assessor'],
      hasPassword: false,
    });
    const [mail] = await mailTo(t.ds, 'new.person@lab.test');
    expect(mail!.subject).toBe('Your Ringlet account');
    const token = linkToken(mail!.text);
    const anon = await client(t);
    await send(anon, '/auth/password', { token, password: 'my first password' }).expect(204);
    const c = await signedIn(t, 'new.person@lab.test', 'my first password');
    const me = await c.agent.get('/api/v1/auth/me').expect(200);
    expect(me.body.roles).toEqual(['assessor']);
  });

  it('refuses a duplicate e-mail and leaves data unchanged', async () => {
    const before = await t.ds.getRepository(User).count();
    const res = await send(admin, '/admin/users', { email: 'boss@a.test', name: 'Dup' }).expect(
      409,
    );
    expect(res.body.error.code).toBe('email_taken');
    expect(await t.ds.getRepository(User).count()).toBe(before);
  });

  it('names the field for a bad role', async () => {
    const res = await send(admin, '/admin/users', {
      email: 'r@x.test',
      name: 'R',
      roles: ['wizard'],
    }).expect(400);
    expect(res.body.error.details[0].path).toBe('roles.0');
  });

  it('creates and renames labs; refuses a duplicate name', async () => {
    const created = await send(admin, '/admin/organisations', {
      name: 'Lab Gamma',
      country: 'Testland',
    }).expect(201);
    expect(created.body).toMatchObject({ name: 'Lab Gamma', kind: 'lab' });
    await send(admin, '/admin/organisations', { name: 'lab gamma' }).expect(409);
    const renamed = await send(
      admin,
      `/admin/organisations/${created.body.id}`,
      { name: 'Lab Gamma Two' },
      'patch',
    ).expect(200);
    expect(renamed.body.name).toBe('Lab Gamma Two');
    const list = await admin.agent.get('/api/v1/admin/organisations').expect(200);
    expect(list.body.map((o: { name: string }) => o.name)).toContain('Lab Gamma Two');
  });

  it('adds, flags and removes memberships', async () => {
    const u = await createUser(t.ds, { email: 'floater@x.test' });
    const m = await send(admin, '/admin/memberships', {
      userId: u.id,
      organisationId: labB,
    }).expect(201);
    expect(m.body).toMatchObject({
      organisationName: 'Lab Beta',
      userEmail: 'floater@x.test',
      isManager: false,
    });
    await send(admin, '/admin/memberships', { userId: u.id, organisationId: labB }).expect(409);
    const flagged = await send(
      admin,
      `/admin/memberships/${m.body.id}`,
      { isManager: true },
      'patch',
    ).expect(200);
    expect(flagged.body.isManager).toBe(true);
    const members = await admin.agent
      .get(`/api/v1/admin/organisations/${labB}/memberships`)
      .expect(200);
    expect(members.body).toHaveLength(1);
    await send(admin, `/admin/memberships/${m.body.id}`, undefined, 'delete').expect(204);
    expect(await t.ds.getRepository(Membership).countBy({ organisationId: labB })).toBe(0);
  });

  it('deactivating a user ends their sessions', async () => {
    const u = await createUser(t.ds, { email: 'leaver@x.test', roles: ['coordinator'] });
    const c = await signedIn(t, 'leaver@x.test');
    await c.agent.get('/api/v1/auth/me').expect(200);
    await send(admin, `/admin/users/${u.id}`, { isActive: false }, 'patch').expect(200);
    await c.agent.get('/api/v1/auth/me').expect(401);
  });

  it('an admin cannot lock themselves out', async () => {
    const me = await admin.agent.get('/api/v1/auth/me').expect(200);
    const res = await send(admin, `/admin/users/${me.body.id}`, { roles: [] }, 'patch').expect(422);
    expect(res.body.error.code).toBe('self_lockout');
  });

  it('a lab manager manages their own lab, and another lab answers 404', async () => {
    const boss = await signedIn(t, 'boss@a.test');
    const list = await boss.agent.get(`/api/v1/labs/${labA}/members`).expect(200);
    expect(list.body.map((m: { userEmail: string }) => m.userEmail).sort()).toEqual([
      'analyst@a.test',
      'boss@a.test',
    ]);
    const added = await send(boss, `/labs/${labA}/members`, {
      email: 'intern@a.test',
      name: 'Ian Intern',
    }).expect(201);
    expect((await mailTo(t.ds, 'intern@a.test'))[0]!.subject).toBe('Your Ringlet account');
    await boss.agent.get(`/api/v1/labs/${labB}/members`).expect(404);
    await send(boss, `/labs/${labB}/members`, { email: 'spy@b.test', name: 'Spy' }).expect(404);
    await send(
      boss,
      `/labs/${labA}/members/${added.body.membership.id}`,
      undefined,
      'delete',
    ).expect(204);
    const analyst = await signedIn(t, 'analyst@a.test');
    await analyst.agent.get(`/api/v1/labs/${labA}/members`).expect(404);
  });

  it('audits admin actions', async () => {
    const actions = (await t.ds.getRepository(AuditEvent).find()).map((e) => e.action);
    expect(actions).toEqual(
      expect.arrayContaining([
        'user.invited',
        'organisation.created',
        'membership.created',
        'membership.deleted',
        'user.updated',
      ]),
    );
  });
});
