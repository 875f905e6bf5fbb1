import request from 'supertest';
import type { DataSource } from 'typeorm';
import { createDataSource } from '../../db/data-source';
import { Enrolment, Round, Scheme } from '../../db/entities';
import { createApp, type RingletApp } from './app';
import { startJobs, REMINDER_QUEUE, type Jobs } from './jobs/queue';
import { SIGN_IN_LIMITS } from './routes/auth';
import {
  createLab,
  createUser,
  mailTo,
  startTestApp,
  testConfig,
  TEST_PASSWORD,
  type TestApp,
} from './testing/test-app';

jest.setTimeout(120_000);

/**
 * Two server instances on one database (README, "Several instances"): A is the test app, B a
 * second createApp with its own connection pool on the same database and the same session secret.
 */
describe('scale-out: two instances, one database', () => {
  let a: TestApp;
  let dsB: DataSource;
  let b: RingletApp;
  const jobs: Jobs[] = [];

  beforeAll(async () => {
    a = await startTestApp();
    dsB = await createDataSource(a.db.url).initialize();
    b = createApp({ ds: dsB, config: testConfig(), mailer: a.mailer, log: () => undefined });
    await createUser(a.ds, { email: 'shared@x.test' });
    await createUser(a.ds, { email: 'locked@x.test' });
  });
  afterAll(async () => {
    for (const j of jobs) await j.stop();
    await dsB.destroy();
    await a.close();
  });

  async function csrf(agent: ReturnType<typeof request.agent>): Promise<string> {
    return (await agent.get('/api/v1/auth/csrf-token').expect(200)).body.token as string;
  }

  it('a session made on one instance works on the other, and signing out on the other ends it', async () => {
    const onA = request.agent(a.app);
    const first = await csrf(onA);
    const signIn = await onA
      .post('/api/v1/auth/sign-in')
      .set('x-csrf-token', first)
      .send({ email: 'shared@x.test', password: TEST_PASSWORD })
      .expect(200);
    const cookie = ([] as string[])
      .concat(signIn.headers['set-cookie'] ?? [])
      .map((c) => c.split(';')[0]!)
      .find((c) => c.startsWith('ringlet.sid='))!;
    expect(cookie).toMatch(/^ringlet\.sid=.+/);
    await onA.get('/api/v1/auth/me').expect(200);
    const tokenA = await csrf(onA);

    // The same cookie (and the CSRF token bound to its session) on instance B.
    const me = await request(b.app).get('/api/v1/auth/me').set('Cookie', cookie).expect(200);
    expect(me.body.email).toBe('shared@x.test');
    await request(b.app)
      .post('/api/v1/auth/sign-out')
      .set('Cookie', cookie)
      .set('x-csrf-token', tokenA)
      .send({})
      .expect((r) => expect(r.status).toBeLessThan(300));
    await request(a.app).get('/api/v1/auth/me').set('Cookie', cookie).expect(401);
    await request(b.app).get('/api/v1/auth/me').set('Cookie', cookie).expect(401);
  });

  it('counts sign-in failures on both instances together (the lockout is shared)', async () => {
    const onA = request.agent(a.app);
    const onB = request.agent(b.app);
    const [ta, tb] = [await csrf(onA), await csrf(onB)];
    const wrong = { email: 'locked@x.test', password: 'not the password at all' };
    for (let i = 0; i < SIGN_IN_LIMITS.perEmail; i++) {
      const [agent, token] = i % 2 === 0 ? [onA, ta] : [onB, tb];
      await agent.post('/api/v1/auth/sign-in').set('x-csrf-token', token).send(wrong).expect(401);
    }
    // Neither instance alone has seen perEmail failures, yet both refuse the right password now.
    for (const [agent, token] of [
      [onA, ta],
      [onB, tb],
    ] as const) {
      const res = await agent
        .post('/api/v1/auth/sign-in')
        .set('x-csrf-token', token)
        .send({ email: 'locked@x.test', password: TEST_PASSWORD });
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('locked');
    }
  });

  it('a reminder run started on both instances sends each reminder once', async () => {
    const lab = await createLab(a.ds, 'Lab Scale');
    await createUser(a.ds, { email: 'remind@scale.test', lab: lab.id });
    const scheme = await a.ds
      .getRepository(Scheme)
      .save({ code: 'SCALE', name: 'Scale-out scheme' });
    const round = await a.ds.getRepository(Round).save({
      schemeId: scheme.id,
      code: 'R-SCALE',
      title: 'Scale-out round',
      state: 'collecting',
      resultsDueAt: new Date(Date.now() + 86400_000),
    });
    await a.ds
      .getRepository(Enrolment)
      .insert({ roundId: round.id, organisationId: lab.id, participantCode: 'PSCAL' });

    const log = () => undefined;
    for (const ds of [a.ds, dsB]) {
      jobs.push(
        await startJobs({
          connectionString: a.db.url,
          ds,
          mailer: a.mailer,
          publicUrl: 'http://ringlet.test',
          log,
          pollingIntervalSeconds: 0.5,
        }),
      );
    }
    // One shared schedule, however many instances start.
    const schedules: unknown[] = await a.ds.query(`SELECT 1 FROM pgboss.schedule WHERE name = $1`, [
      REMINDER_QUEUE,
    ]);
    expect(schedules.length).toBe(1);

    // Both instances start a run at the same moment (as both would on the same cron slot).
    await Promise.all(jobs.map((j) => j.boss.send(REMINDER_QUEUE, {})));
    let pending = 1;
    for (let i = 0; i < 80 && pending > 0; i++) {
      await new Promise((r) => setTimeout(r, 250));
      const rows: { n: number }[] = await a.ds.query(
        `SELECT count(*)::int AS n FROM pgboss.job WHERE name = $1 AND state IN ('created', 'retry', 'active')`,
        [REMINDER_QUEUE],
      );
      pending = rows[0]!.n;
    }
    expect(pending).toBe(0);
    const done: { n: number }[] = await a.ds.query(
      `SELECT count(*)::int AS n FROM pgboss.job WHERE name = $1 AND state = 'completed'`,
      [REMINDER_QUEUE],
    );
    expect(done[0]!.n).toBeGreaterThanOrEqual(1);
    const mails = await mailTo(a.ds, 'remind@scale.test');
    expect(mails.map((m) => m.subject)).toEqual(['Results for round R-SCALE are due soon']);
    const claims: { n: number }[] = await a.ds.query(
      `SELECT count(*)::int AS n FROM reminder_log WHERE round_id = $1`,
      [round.id],
    );
    expect(claims[0]!.n).toBe(1);
  });
});
