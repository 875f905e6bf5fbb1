/**
 * Background work that must not be lost goes through the PostgreSQL-backed job queue: a
 * publication's lab mails and a large round's report build are jobs that survive the instance
 * that enqueued them (stopped mid-way, a new one on the same database finishes them), and a build
 * that keeps failing ends as 'failed' after its retries.
 */
import { Report } from '../../../db/entities';
import { createApp } from '../app';
import type { Mailer } from '../mail/mailer';
import { runQueuedBuild } from '../services/reports';
import { buildEvaluationFixture, type EvaluationFixture } from '../testing/evaluation-fixtures';
import {
  createLab,
  createUser,
  send,
  signedIn,
  startTestApp,
  testConfig,
  type Client,
  type TestApp,
} from '../testing/test-app';
import {
  PUBLICATION_MAIL_QUEUE,
  REPORT_QUEUE,
  startJobs,
  type Jobs,
  type JobsOptions,
} from './queue';

jest.setTimeout(90_000);

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
async function until<T>(
  what: string,
  probe: () => T | null | undefined | false | Promise<T | null | undefined | false>,
  seconds = 40,
): Promise<T> {
  for (let i = 0; i < seconds * 10; i++) {
    const v = await probe();
    if (v) return v;
    await sleep(100);
  }
  throw new Error(`timed out waiting for ${what}`);
}

describe('durable background work (pg-boss)', () => {
  let t: TestApp;
  let fx: EvaluationFixture;
  const running: Jobs[] = [];
  const log = () => undefined;

  /** One "instance": a job queue and an app on the test database. */
  async function instance(o: Partial<JobsOptions> = {}) {
    const jobs = await startJobs({
      connectionString: t.db.url,
      ds: t.ds,
      mailer: t.mailer,
      publicUrl: 'http://ringlet.test',
      log,
      pollingIntervalSeconds: 0.5,
      mailRetry: { retryLimit: 5, retryDelay: 1, retryBackoff: false },
      reportRetry: { retryLimit: 1, retryDelay: 1, retryBackoff: false },
      ...o,
    });
    running.push(jobs);
    const app = createApp({
      ds: t.ds,
      config: testConfig(),
      mailer: jobs.mailer,
      queue: jobs.queue,
      log,
    });
    await jobs.attach(app.context, runQueuedBuild);
    const coordinator = await signedIn({ ...t, ...app }, 'coord@durable.test');
    return { jobs, app, coordinator };
  }
  const jobStates = async (queue: string): Promise<Record<string, number>> => {
    const rows: { state: string; n: number }[] = await t.ds.query(
      `SELECT state, count(*)::int AS n FROM pgboss.job WHERE name = $1 GROUP BY state`,
      [queue],
    );
    return Object.fromEntries(rows.map((r) => [r.state, r.n]));
  };
  const publishedMails = async (): Promise<string[][]> =>
    (
      await t.ds.query(
        `SELECT mail_to FROM mail_message WHERE subject LIKE 'Results of round % are published'`,
      )
    ).map((r: { mail_to: string[] }) => r.mail_to);

  beforeAll(async () => {
    t = await startTestApp();
    fx = await buildEvaluationFixture(t.ds, { participants: 12, labPrefix: 'Durable Lab' });
    await createUser(t.ds, { email: 'coord@durable.test', roles: ['coordinator'] });
    const c: Client = await signedIn(t, 'coord@durable.test');
    await send(c, `/rounds/${fx.round.id}/evaluation`, {}).expect(201);
    await send(c, `/rounds/${fx.round.id}/evaluation/commit`, {}).expect(200);
  });
  afterEach(async () => {
    for (const j of running.splice(0)) await j.stop(1000).catch(() => undefined);
  });
  afterAll(async () => {
    for (const j of running) await j.stop(1000).catch(() => undefined);
    delete process.env['RINGLET_REPORT_BACKGROUND_MIN'];
    await t.close();
  });

  it('a report build queued by an instance that stops is built by the next one', async () => {
    process.env['RINGLET_REPORT_BACKGROUND_MIN'] = '5'; // 12 participants: built in the background
    // Instance A only enqueues (its workers are off) and then goes away.
    const a = await instance({ workers: false });
    const started = await a.coordinator.agent
      .get(`/api/v1/rounds/${fx.round.id}/reports/round.pdf`)
      .expect(202);
    expect(started.body.status).toBe('queued');
    expect(started.body.progress).toBe(0);
    await a.jobs.stop(1000);
    await sleep(1000);
    const row = await t.ds.getRepository(Report).findOneByOrFail({ id: started.body.id });
    expect(row.status).toBe('queued'); // nothing built it
    expect((await jobStates(REPORT_QUEUE))['created']).toBe(1);

    // Instance B starts on the same database and finishes the build.
    const b = await instance();
    const done = await until('the build', async () => {
      const s = await b.coordinator.agent.get(`/api/v1/reports/${started.body.id}`).expect(200);
      return s.body.status === 'done' ? s.body : null;
    });
    expect(done.progress).toBe(100);
    expect(done.sizeBytes).toBeGreaterThan(1000);
    const file = await b.coordinator.agent
      .get(`/api/v1/rounds/${fx.round.id}/reports/round.pdf`)
      .buffer(true)
      .expect(200);
    expect(file.headers['content-type']).toContain('application/pdf');
    expect(file.headers['x-content-sha256']).toBe(done.sha256);
    expect((await jobStates(REPORT_QUEUE))['completed']).toBe(1);
    await b.jobs.stop(1000);
  });

  it('a build that keeps failing is retried, then shows failed with a message for the reader', async () => {
    const outsider = await createLab(t.ds, 'Not Enrolled Lab'); // its individual report cannot be built
    const b = await instance();
    const evaluation: { id: string; version: number }[] = await t.ds.query(
      `SELECT id, version FROM evaluation WHERE round_id = $1`,
      [fx.round.id],
    );
    const row = await t.ds.getRepository(Report).save({
      roundId: fx.round.id,
      kind: 'participant.pdf',
      organisationId: outsider.id,
      evaluationId: evaluation[0]!.id,
      evaluationVersion: evaluation[0]!.version,
      status: 'queued',
      progress: 0,
    } as Partial<Report>);
    await b.jobs.queue.enqueueReportBuild(row.id);
    b.jobs.queue.kick();
    const failed = await until('the failure', async () => {
      const s = await b.coordinator.agent.get(`/api/v1/reports/${row.id}`).expect(200);
      return s.body.status === 'failed' ? s.body : null;
    });
    expect(failed.error).toMatch(/could not be built/);
    // The handler marks the report failed before pg-boss records the job's own
    // end, so wait for the queue to settle rather than read it at once.
    const jobs = await until('the job to settle', async () => {
      const rows: { state: string; retry_count: number }[] = await t.ds.query(
        `SELECT state, retry_count FROM pgboss.job WHERE name = $1 AND data->>'reportId' = $2`,
        [REPORT_QUEUE, row.id],
      );
      return rows.every((r) => r.state !== 'active' && r.state !== 'retry') ? rows : null;
    });
    expect(jobs).toEqual([{ state: 'failed', retry_count: 1 }]); // the first attempt and one retry
    await b.jobs.stop(1000);
  });

  it('publication mails survive an instance that stopped while SMTP refused them', async () => {
    const refused: string[] = [];
    const down: Mailer = {
      send(m) {
        refused.push(String(m.to));
        return Promise.reject(new Error('SMTP 421 service not available'));
      },
      close: () => undefined,
    };
    const a = await instance({ mailer: down });
    const res = await send(a.coordinator, `/rounds/${fx.round.id}/publish`, {}).expect(200);
    expect(res.body.labsNotified).toBe(12);
    // The publication committed with one job per lab; A tries, SMTP refuses, the jobs wait for a retry.
    await until('the first attempts', () => refused.length >= 12);
    await a.jobs.stop(1000);
    const states = await jobStates(PUBLICATION_MAIL_QUEUE);
    expect(states['completed'] ?? 0).toBe(0);
    expect((states['retry'] ?? 0) + (states['created'] ?? 0) + (states['failed'] ?? 0)).toBe(12);
    expect(await publishedMails()).toEqual([]);

    // B, with SMTP back, delivers every lab's mail exactly once.
    await instance();
    const mails = await until('the mails', async () => {
      const m = await publishedMails();
      return m.length >= 12 ? m : null;
    });
    await sleep(1500); // no duplicates arrive later
    const all = (await publishedMails()).flat().sort();
    expect(all).toEqual(fx.labs.map((l) => l.contactEmail).sort());
    expect(mails.length).toBe(12);
    expect((await jobStates(PUBLICATION_MAIL_QUEUE))['completed']).toBe(12);
  });
});
