import { AuditEvent, User } from '../../../db/entities';
import {
  client,
  createUser,
  linkToken,
  mailTo,
  send,
  signedIn,
  startCast,
  startTestApp,
  TEST_PASSWORD,
  type TestApp,
} from '../testing/test-app';

describe('auth routes', () => {
  let t: TestApp;
  let labId: string;
  beforeAll(async () => {
    const cast = await startCast({
      labs: ['Test Lab One'],
      users: [
        { email: 'coord@x.test', name: 'Co Ord', roles: ['coordinator'] },
        { email: 'member@x.test', name: 'Mem Ber', lab: 0, manager: true },
      ],
    });
    ({ t } = cast);
    labId = cast.labIds[0]!;
  });
  afterAll(() => t.close());

  it('me answers 401 when signed out', async () => {
    const res = await (await client(t)).agent.get('/api/v1/auth/me').expect(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('signs in, shows roles and memberships, and signs out', async () => {
    const c = await signedIn(t, 'member@x.test');
    const me = await c.agent.get('/api/v1/auth/me').expect(200);
    expect(me.body.roles).toEqual(['lab']);
    expect(me.body.memberships).toEqual([
      expect.objectContaining({
        organisationId: labId,
        organisationName: 'Test Lab One',
        isManager: true,
      }),
    ]);
    await send(c, '/auth/sign-out', {}).expect(204);
    await c.agent.get('/api/v1/auth/me').expect(401);
  });

  it('regenerates the session id on sign-in (no fixation)', async () => {
    const c = await client(t);
    const before = await c.agent.get('/api/v1/auth/csrf-token');
    const cookieBefore = String(before.headers['set-cookie'] ?? '');
    const res = await send(c, '/auth/sign-in', {
      email: 'coord@x.test',
      password: TEST_PASSWORD,
    }).expect(200);
    const cookieAfter = String(res.headers['set-cookie'] ?? '');
    expect(cookieAfter).toMatch(/ringlet\.sid=/);
    expect(cookieAfter.split(';')[0]).not.toBe(cookieBefore.split(';')[0]);
    const cookie = cookieAfter;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('gives the same message for an unknown user and a wrong password', async () => {
    const c = await client(t);
    const wrong = await send(c, '/auth/sign-in', {
      email: 'coord@x.test',
      password: 'nope-nope-nope',
    }).expect(401);
    const unknown = await send(c, '/auth/sign-in', {
      email: 'ghost@x.test',
      password: 'nope-nope-nope',
    }).expect(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.message).toBe('E-mail or password is incorrect.');
  });

  it('names the field on bad input', async () => {
    const c = await client(t);
    const res = await send(c, '/auth/sign-in', { email: 'not-an-email', password: '' }).expect(400);
    expect(res.body.error.code).toBe('validation_failed');
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['email', 'password']));
    expect(res.body.error.message).toMatch(/^email: /);
  });

  it('refuses a state-changing request without the CSRF token', async () => {
    const c = await client(t);
    const res = await c.agent
      .post('/api/v1/auth/sign-in')
      .send({ email: 'coord@x.test', password: TEST_PASSWORD })
      .expect(403);
    expect(res.body.error.code).toBe('csrf_invalid');
  });

  it('locks an address after five failures, even with the right password', async () => {
    await createUser(t.ds, { email: 'victim@x.test' });
    const c = await client(t);
    for (let i = 0; i < 5; i++) {
      await send(c, '/auth/sign-in', { email: 'victim@x.test', password: `wrong-${i}` }).expect(
        401,
      );
    }
    const res = await send(c, '/auth/sign-in', {
      email: 'victim@x.test',
      password: TEST_PASSWORD,
    }).expect(429);
    expect(res.body.error.code).toBe('locked');
    // an unknown address locks the same way (no enumeration)
    for (let i = 0; i < 5; i++) {
      await send(c, '/auth/sign-in', { email: 'nobody@x.test', password: `wrong-${i}` });
    }
    const ghost = await send(c, '/auth/sign-in', { email: 'nobody@x.test', password: 'x' }).expect(
      429,
    );
    expect(ghost.body.error.code).toBe('locked');
  });

  it('stores passwords with bcrypt cost 12 or more', async () => {
    const u = await t.ds.getRepository(User).findOneByOrFail({ email: 'coord@x.test' });
    expect(u.passwordHash).toMatch(/^\$2[aby]\$(1[2-9]|[2-3]\d)\$/);
  });

  it('resets a password through an e-mailed single-use link', async () => {
    await createUser(t.ds, { email: 'forgetful@x.test', name: 'Fay Forget' });
    const c = await client(t);
    await send(c, '/auth/password-reset', { email: 'forgetful@x.test' }).expect(202);
    await send(c, '/auth/password-reset', { email: 'unknown@x.test' }).expect(202);
    const [mail] = await mailTo(t.ds, 'forgetful@x.test');
    expect(mail!.subject).toBe('Reset your Ringlet password');
    const token = linkToken(mail!.text);
    const info = await c.agent.get(`/api/v1/auth/password-tokens/${token}`).expect(200);
    expect(info.body).toMatchObject({ email: 'forgetful@x.test', purpose: 'reset' });
    await send(c, '/auth/password', { token, password: 'short' }).expect(400);
    await send(c, '/auth/password', { token, password: 'a brand new password' }).expect(204);
    // used once: refused the second time
    const again = await send(c, '/auth/password', {
      token,
      password: 'another new password',
    }).expect(404);
    expect(again.body.error.code).toBe('link_invalid');
    await c.agent.get(`/api/v1/auth/password-tokens/${token}`).expect(404);
    await signedIn(t, 'forgetful@x.test', 'a brand new password');
    // only the hash of the token is stored
    const rows: { token_hash: string }[] = await t.ds.query(
      'SELECT token_hash FROM password_token',
    );
    expect(rows.map((r) => r.token_hash)).not.toContain(token);
  });

  it('refuses an expired link', async () => {
    await createUser(t.ds, { email: 'late@x.test' });
    const c = await client(t);
    await send(c, '/auth/password-reset', { email: 'late@x.test' }).expect(202);
    const token = linkToken((await mailTo(t.ds, 'late@x.test'))[0]!.text);
    await t.ds.query(`UPDATE password_token SET expires_at = now() - interval '1 second'`);
    await send(c, '/auth/password', { token, password: 'a brand new password' }).expect(404);
  });

  it('keeps an append-only audit trail', async () => {
    const count = await t.ds.getRepository(AuditEvent).count();
    expect(count).toBeGreaterThan(0);
    await expect(t.ds.query(`UPDATE audit_event SET action = 'x'`)).rejects.toThrow(/append-only/);
    await expect(t.ds.query(`DELETE FROM audit_event`)).rejects.toThrow(/append-only/);
  });
});

describe('auth in production mode', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp({ mode: 'production' });
    const u = await createUser(t.ds, { email: 'demo@x.test', roles: ['admin'] });
    await t.ds.getRepository(User).update({ id: u.id }, { isDemo: true });
  });
  afterAll(() => t.close());

  it('refuses demo accounts', async () => {
    const c = await client(t);
    await send(c, '/auth/sign-in', { email: 'demo@x.test', password: TEST_PASSWORD }).expect(401);
  });

  it('has no outbox', async () => {
    await createUser(t.ds, { email: 'real@x.test', roles: ['admin'] });
    const c = await signedIn(t, 'real@x.test');
    await c.agent.get('/api/v1/dev/outbox').expect(404);
  });
});
