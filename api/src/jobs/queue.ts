import PgBoss from 'pg-boss';
import type { DataSource } from 'typeorm';
import type { Mailer, OutgoingMail } from '../mail/mailer';
import { sendDueReminders } from './reminders';

export const MAIL_QUEUE = 'mail-send';
export const REMINDER_QUEUE = 'round-reminders';

/** Retry policy for a mail that failed: 8 attempts, exponential back-off from 30 s. */
export const MAIL_RETRY: RetryPolicy = { retryLimit: 8, retryDelay: 30, retryBackoff: true };
export interface RetryPolicy { retryLimit: number; retryDelay: number; retryBackoff: boolean }

export interface JobsOptions {
  connectionString: string;
  ds: DataSource;
  /** The mailer that talks to SMTP. */
  mailer: Mailer;
  publicUrl: string;
  log: (msg: string, err?: unknown) => void;
  /** Cron for the reminder run (default: every 15 minutes). */
  reminderCron?: string;
  /** Overrides for tests (seconds). */
  mailRetry?: RetryPolicy;
  pollingIntervalSeconds?: number;
}

export interface Jobs {
  boss: PgBoss;
  /** Same interface as the SMTP mailer; a failed send is queued and retried instead of lost. */
  mailer: Mailer;
  stop(): Promise<void>;
}

/**
 * A mailer that tries SMTP at once and, on failure, puts the message on the PostgreSQL-backed
 * queue, where a worker (on any instance) retries it with back-off.
 */
export function queuedMailer(inner: Mailer, boss: PgBoss, retry = MAIL_RETRY, log: (m: string, e?: unknown) => void = () => undefined): Mailer {
  return {
    async send(mail: OutgoingMail) {
      try {
        await inner.send(mail);
      } catch (err) {
        log(`mail to ${String(mail.to)} failed; queued for retry`, err);
        await boss.send(MAIL_QUEUE, mail as unknown as object, { ...retry });
      }
    },
    close() {
      inner.close();
    },
  };
}

/**
 * Starts pg-boss 10 on the app's PostgreSQL database (its own schema `pgboss`): the mail retry
 * worker and the reminder schedule. Schedules and singleton keys live in the database, so
 * several instances share one schedule and a reminder run happens once per slot.
 */
export async function startJobs(o: JobsOptions): Promise<Jobs> {
  const boss = new PgBoss({ connectionString: o.connectionString, max: 4 });
  boss.on('error', (err) => o.log('job queue error', err));
  await boss.start();
  await boss.createQueue(MAIL_QUEUE);
  await boss.createQueue(REMINDER_QUEUE, { name: REMINDER_QUEUE, policy: 'singleton' });
  const polling = { pollingIntervalSeconds: o.pollingIntervalSeconds ?? 2 };
  await boss.work<OutgoingMail>(MAIL_QUEUE, polling, async (jobs) => {
    for (const job of jobs) await o.mailer.send(job.data); // a throw fails the job; pg-boss retries it
  });
  const mailer = queuedMailer(o.mailer, boss, o.mailRetry ?? MAIL_RETRY, o.log);
  await boss.work(REMINDER_QUEUE, polling, async () => {
    await sendDueReminders({ ds: o.ds, mailer, publicUrl: o.publicUrl, log: o.log });
  });
  await boss.schedule(REMINDER_QUEUE, o.reminderCron ?? '*/15 * * * *', {}, { singletonKey: 'round-reminders' });
  return {
    boss,
    mailer,
    async stop() {
      await boss.stop({ graceful: true, wait: true, timeout: 5000 });
    },
  };
}
