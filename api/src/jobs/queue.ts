import PgBoss from 'pg-boss';
import type { DataSource, EntityManager } from 'typeorm';
import type { Mailer, OutgoingMail } from '../mail/mailer';
import type { AppContext } from '../services/context';
import { sendDueReminders } from './reminders';

export const MAIL_QUEUE = 'mail-send';
export const REMINDER_QUEUE = 'round-reminders';
/** One job per lab mail of a publication; inserted in the publication's own transaction. */
export const PUBLICATION_MAIL_QUEUE = 'publication-mail';
/** One job per background report build; inserted in the transaction that creates the report row. */
export const REPORT_QUEUE = 'report-build';

/** Retry policy for a mail that failed: 8 attempts, exponential back-off from 30 s. */
export const MAIL_RETRY: RetryPolicy = { retryLimit: 8, retryDelay: 30, retryBackoff: true };
/** Retry policy for a report build: 2 more attempts, 10 s then 20 s later. */
export const REPORT_RETRY: RetryPolicy = { retryLimit: 2, retryDelay: 10, retryBackoff: true };
export interface RetryPolicy {
  retryLimit: number;
  retryDelay: number;
  retryBackoff: boolean;
}

/** A build that runs longer than this is taken as lost (its instance died) and retried. */
const REPORT_EXPIRE_SECONDS = 15 * 60;

/**
 * What the services enqueue. Given an EntityManager inside a transaction, the job is inserted in
 * that transaction: it exists exactly when the change that asked for it was committed.
 */
export interface JobQueue {
  enqueueReportBuild(reportId: string, em?: EntityManager): Promise<void>;
  enqueueMails(mails: OutgoingMail[], em?: EntityManager): Promise<void>;
  /** Wakes this instance's workers after a commit (other instances find the job at their next poll). */
  kick(): void;
}

/** The report-build job's work, given by the services (api/src/services/reports.ts). */
export type ReportBuilder = (
  ctx: AppContext,
  reportId: string,
  lastAttempt: boolean,
) => Promise<void>;

export interface JobsOptions {
  connectionString: string;
  ds: DataSource;
  /** The mailer that talks to SMTP. */
  mailer: Mailer;
  publicUrl: string;
  log: (msg: string, err?: unknown) => void;
  /** Cron for the reminder run (default: every 15 minutes). */
  reminderCron?: string;
  /** false: this instance only enqueues (a web-only instance); another process runs the workers. */
  workers?: boolean;
  /** Overrides for tests (seconds). */
  mailRetry?: RetryPolicy;
  reportRetry?: RetryPolicy;
  pollingIntervalSeconds?: number;
}

export interface Jobs {
  boss: PgBoss;
  /** Same interface as the SMTP mailer; a failed send is queued and retried instead of lost. */
  mailer: Mailer;
  queue: JobQueue;
  /** Starts the workers that need the app's services (report builds), once the app exists. */
  attach(ctx: AppContext, build: ReportBuilder): Promise<void>;
  /** Stops taking jobs and waits (up to timeoutMs) for the jobs in progress; unfinished ones are retried later. */
  stop(timeoutMs?: number): Promise<void>;
}

/**
 * A mailer that tries SMTP at once and, on failure, puts the message on the PostgreSQL-backed
 * queue, where a worker (on any instance) retries it with back-off.
 */
export function queuedMailer(
  inner: Mailer,
  boss: PgBoss,
  retry = MAIL_RETRY,
  log: (m: string, e?: unknown) => void = () => undefined,
): Mailer {
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

/** pg-boss's SQL through a TypeORM transaction, so a job commits (or rolls back) with it. */
export function inTransaction(em: EntityManager): PgBoss.Db {
  return {
    executeSql: async (text, values) => ({
      rows: ((await em.query(text, values)) as unknown[]) ?? [],
    }),
  };
}

/**
 * Starts pg-boss 10 on the app's PostgreSQL database (its own schema `pgboss`): the mail retry
 * worker, the publication mail worker and the reminder schedule; `attach` adds the report
 * builder. Jobs, schedules and singleton keys live in the database, so they survive a restart,
 * several instances share them, and a reminder run happens once per slot.
 */
export async function startJobs(o: JobsOptions): Promise<Jobs> {
  const boss = new PgBoss({ connectionString: o.connectionString, max: 4 });
  boss.on('error', (err) => o.log('job queue error', err));
  await boss.start();
  await boss.createQueue(MAIL_QUEUE);
  await boss.createQueue(PUBLICATION_MAIL_QUEUE);
  await boss.createQueue(REPORT_QUEUE);
  await boss.createQueue(REMINDER_QUEUE, { name: REMINDER_QUEUE, policy: 'singleton' });
  const polling = { pollingIntervalSeconds: o.pollingIntervalSeconds ?? 2 };
  const workers = o.workers ?? true;
  const workerIds: string[] = [];
  const mailer = queuedMailer(o.mailer, boss, o.mailRetry ?? MAIL_RETRY, o.log);
  const mailRetry = o.mailRetry ?? MAIL_RETRY;
  const reportRetry = o.reportRetry ?? REPORT_RETRY;

  if (workers) {
    workerIds.push(
      await boss.work<OutgoingMail>(MAIL_QUEUE, polling, async (jobs) => {
        for (const job of jobs) await o.mailer.send(job.data); // a throw fails the job; pg-boss retries it
      }),
    );
    // Up to 8 publication mails at a time; a refused one fails alone and is retried with back-off.
    workerIds.push(
      await boss.work<OutgoingMail>(
        PUBLICATION_MAIL_QUEUE,
        { ...polling, batchSize: 8 },
        async (jobs) => {
          const results = await Promise.allSettled(jobs.map((job) => o.mailer.send(job.data)));
          const failed = jobs.filter((_, i) => results[i]!.status === 'rejected');
          for (const job of failed) {
            const reason = (results[jobs.indexOf(job)] as PromiseRejectedResult).reason as unknown;
            o.log(`publication mail to ${String(job.data.to)} failed; retried later`, reason);
            await boss.fail(PUBLICATION_MAIL_QUEUE, job.id, {
              message: reason instanceof Error ? reason.message : String(reason),
            });
          }
          // the rest are completed by pg-boss when this returns (a failed job is no longer active)
        },
      ),
    );
    await boss.work(REMINDER_QUEUE, polling, async () => {
      await sendDueReminders({ ds: o.ds, mailer, publicUrl: o.publicUrl, log: o.log });
    });
    await boss.schedule(
      REMINDER_QUEUE,
      o.reminderCron ?? '*/15 * * * *',
      {},
      { singletonKey: 'round-reminders' },
    );
  }

  const queue: JobQueue = {
    async enqueueReportBuild(reportId, em) {
      await boss.insert(
        [
          {
            name: REPORT_QUEUE,
            data: { reportId },
            singletonKey: reportId,
            expireInSeconds: REPORT_EXPIRE_SECONDS,
            ...reportRetry,
          },
        ],
        em ? { db: inTransaction(em) } : {},
      );
    },
    async enqueueMails(mails, em) {
      if (mails.length === 0) return;
      await boss.insert(
        mails.map((m) => ({
          name: PUBLICATION_MAIL_QUEUE,
          data: m as unknown as object,
          ...mailRetry,
        })),
        em ? { db: inTransaction(em) } : {},
      );
    },
    kick() {
      for (const id of workerIds) boss.notifyWorker(id);
    },
  };

  return {
    boss,
    mailer,
    queue,
    async attach(ctx, build) {
      if (!workers) return;
      workerIds.push(
        await boss.work<{ reportId: string }>(
          REPORT_QUEUE,
          { ...polling, includeMetadata: true },
          async ([job]) => {
            if (!job) return;
            await build(ctx, job.data.reportId, job.retryCount >= job.retryLimit);
          },
        ),
      );
    },
    async stop(timeoutMs = 10_000) {
      await boss.stop({ graceful: true, wait: true, timeout: timeoutMs });
    },
  };
}

/**
 * The job queue started in the background, for a server that listens first: `queue` and `mailer`
 * are usable at once and wait for pg-boss when it is not started yet (a request that enqueues
 * during the first moments waits, it does not fail). `ready` settles once pg-boss and its
 * workers run (rejected when they cannot start: the caller stops the process).
 */
export function startJobsInBackground(o: JobsOptions): {
  queue: JobQueue;
  mailer: Mailer;
  ready: Promise<Jobs>;
} {
  const ready = startJobs(o);
  ready.catch(() => undefined); // the caller handles it; no unhandled rejection meanwhile
  return {
    ready,
    queue: {
      enqueueReportBuild: async (reportId, em) =>
        (await ready).queue.enqueueReportBuild(reportId, em),
      enqueueMails: async (mails, em) => (await ready).queue.enqueueMails(mails, em),
      kick: () =>
        void ready.then(
          (j) => j.queue.kick(),
          () => undefined,
        ),
    },
    mailer: {
      send: async (mail) => (await ready).mailer.send(mail),
      close: () =>
        void ready.then(
          (j) => j.mailer.close(),
          () => undefined,
        ),
    },
  };
}
