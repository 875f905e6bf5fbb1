import { Enrolment, Round, Scheme, Submission } from '../../../db/entities';
import type { Mailer, OutgoingMail } from '../mail/mailer';
import { createLab, createUser, mailTo, startTestApp, type TestApp } from '../testing/test-app';
import { startJobs } from './queue';
import { sendDueReminders } from './reminders';

jest.setTimeout(60_000);

describe('jobs: reminders and mail retry', () => {
  let t: TestApp;
  let roundId: string;
  const log = () => undefined;
  beforeAll(async () => {
    t = await startTestApp();
    const a = await createLab(t.ds, 'Lab Alpha');
    const b = await createLab(t.ds, 'Lab Beta');
    await createUser(t.ds, { email: 'alice@a.test', lab: a.id });
    await createUser(t.ds, { email: 'bob@b.test', lab: b.id });
    const scheme = await t.ds.getRepository(Scheme).save({ code: 'JOBS', name: 'Jobs scheme' });
    const round = await t.ds.getRepository(Round).save({
      schemeId: scheme.id,
      code: 'R-JOBS',
      title: 'Reminder round',
      state: 'collecting',
      resultsDueAt: new Date(Date.now() + 2 * 86400_000),
    });
    roundId = round.id;
    await t.ds
      .getRepository(Enrolment)
      .insert({ roundId, organisationId: a.id, participantCode: 'PAAAA' });
    const eb = await t.ds
      .getRepository(Enrolment)
      .save({ roundId, organisationId: b.id, participantCode: 'PBBBB' });
    // Lab Beta has submitted: it gets no reminder
    await t.ds.getRepository(Submission).insert({
      enrolmentId: eb.id,
      state: 'submitted',
      currentVersion: 1,
      submittedAt: new Date(),
    });
  });
  afterAll(() => t.close());

  const deps = () => ({ ds: t.ds, mailer: t.mailer, publicUrl: 'http://ringlet.test', log });

  it('sends "due soon" once even when two instances run at the same moment', async () => {
    const [x, y] = await Promise.all([sendDueReminders(deps()), sendDueReminders(deps())]);
    expect(x + y).toBe(1);
    expect(await sendDueReminders(deps())).toBe(0);
    const mails = await mailTo(t.ds, 'alice@a.test');
    expect(mails.map((m) => m.subject)).toEqual(['Results for round R-JOBS are due soon']);
    expect(mails[0]!.text).toContain('http://ringlet.test/bench');
    expect(await mailTo(t.ds, 'bob@b.test', 1)).toEqual([]);
  });

  it('sends "overdue" once after the due date', async () => {
    await t.ds
      .getRepository(Round)
      .update({ id: roundId }, { resultsDueAt: new Date(Date.now() - 3600_000) });
    const [x, y, z] = await Promise.all([
      sendDueReminders(deps()),
      sendDueReminders(deps()),
      sendDueReminders(deps()),
    ]);
    expect(x + y + z).toBe(1);
    const mails = await mailTo(t.ds, 'alice@a.test', 2);
    expect(mails.map((m) => m.subject).sort()).toEqual([
      'Results for round R-JOBS are due soon',
      'Results for round R-JOBS are overdue',
    ]);
  });

  it('a failed send is queued in PostgreSQL and retried until it goes through', async () => {
    let failures = 2;
    const attempts: string[] = [];
    const flaky: Mailer = {
      async send(mail: OutgoingMail) {
        attempts.push(mail.subject);
        if (failures-- > 0) throw new Error('SMTP 451 try again later');
        await t.mailer.send(mail);
      },
      close: () => undefined,
    };
    const jobs = await startJobs({
      connectionString: t.db.url,
      ds: t.ds,
      mailer: flaky,
      publicUrl: 'http://ringlet.test',
      log,
      mailRetry: { retryLimit: 5, retryDelay: 1, retryBackoff: false },
      pollingIntervalSeconds: 0.5,
    });
    try {
      await jobs.mailer.send({ to: 'carol@c.test', subject: 'Queued hello', text: 'x' }); // resolves: queued, not lost
      const [mail] = await mailTo(t.ds, 'carol@c.test').then(async (m) => {
        for (let i = 0; i < 60 && m.length === 0; i++) {
          await new Promise((r) => setTimeout(r, 250));
          m = await mailTo(t.ds, 'carol@c.test');
        }
        return m;
      });
      expect(mail?.subject).toBe('Queued hello');
      expect(attempts).toEqual(['Queued hello', 'Queued hello', 'Queued hello']); // first try, one failed retry, success
    } finally {
      await jobs.stop();
    }
  });
});
