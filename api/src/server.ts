import 'reflect-metadata';
import { createDataSource, databaseUrl, ownerDatabaseUrl } from '../../db/data-source';
import { migrateDatabase } from '../../db/migrate';
import { providerName } from './services/provider';
import { createApp } from './app';
import { hasOutbox, readConfig } from './config';
import { createLogger, logFunction } from './http/logging';
import { gracefulShutdown } from './http/shutdown';
import { startJobsInBackground } from './jobs/queue';
import { createMailer } from './mail/mailer';
import { runQueuedBuild } from './services/reports';
import { DEFAULT_DEMO_PASSWORD, DEMO_USERS } from '../../db/seed/demo-people';
import { isEmpty, seedDemo } from '../../db/seed/demo';

const logger = createLogger({ level: process.env['LOG_LEVEL'] || 'info' });
const log = logFunction(logger);
/** In-flight requests get this long to finish at shutdown; jobs in progress get JOB_GRACE_MS more. */
const REQUEST_GRACE_MS = Number(process.env['RINGLET_SHUTDOWN_REQUEST_MS'] ?? 20_000);
const JOB_GRACE_MS = Number(process.env['RINGLET_SHUTDOWN_JOB_MS'] ?? 20_000);

/**
 * Reads the config, connects, migrates, starts the local mail fake outside production and the
 * job queue, listens; on SIGTERM or SIGINT shuts down gracefully (in-flight requests, then jobs).
 */
async function main(): Promise<void> {
  const phases: Record<string, number> = { modules: Math.round(performance.now()) };
  let mark = performance.now();
  const phase = (name: string) => {
    phases[name] = Math.round(performance.now() - mark);
    mark = performance.now();
  };
  const config = readConfig();
  // Migrations (and the demo seed) run as the owner role; the server itself connects as the runtime role.
  const ownerUrl = config.databaseOwnerUrl ?? ownerDatabaseUrl();
  // The runtime connection opens while the owner role checks the migrations (it only connects:
  // no schema is read until the first query).
  const ds = createDataSource(config.databaseUrl ?? databaseUrl());
  await Promise.all([migrateDatabase(ownerUrl), ds.initialize()]);
  phase('database');
  const demoPassword = config.demoPassword ?? DEFAULT_DEMO_PASSWORD;
  if (config.mode === 'demo' && (await isEmpty(ds))) {
    logger.info('empty database: loading the demo scenario');
    const owner = await createDataSource(ownerUrl).initialize();
    await seedDemo(owner, demoPassword, config.publicUrl).finally(() => owner.destroy());
  }
  // The local SMTP fake (and mailparser behind it) loads only where it runs: never in production.
  const fake =
    hasOutbox(config.mode) && !config.smtp
      ? await (
          await import('./mail/smtp-fake')
        ).startSmtpFake(ds, Number(process.env['RINGLET_SMTP_PORT'] ?? 0))
      : null;
  // The local fake of the payment service, likewise, when no real one is configured.
  let webhookUrl = `${config.publicUrl}/api/v1/payments/webhook`;
  const payFake =
    hasOutbox(config.mode) && !config.payments
      ? await (
          await import('./payments/payment-fake')
        ).startPaymentFake({
          webhookUrl: () => webhookUrl,
          port: Number(process.env['RINGLET_PAYMENT_FAKE_PORT'] ?? 0),
        })
      : null;
  if (payFake) config.payments = payFake.settings;
  const smtpMailer = createMailer(config, fake ?? undefined, {
    providerName: () => providerName(ds.manager),
  });
  // The PostgreSQL-backed job queue: mail retries, publication mail, report builds, round
  // reminders (shared by every instance; jobs survive a restart). Background work: it starts
  // while the server already listens; a request that enqueues meanwhile waits for it.
  const jobs = startJobsInBackground({
    connectionString: config.databaseUrl ?? databaseUrl(),
    ds,
    mailer: smtpMailer,
    publicUrl: config.publicUrl,
    log,
    workers: process.env['RINGLET_JOB_WORKERS'] !== 'off',
  });
  const mailer = jobs.mailer;
  const { app, context, stopTimers } = createApp({
    ds,
    config,
    mailer,
    log,
    logger,
    queue: jobs.queue,
  });
  phase('app');
  jobs.ready.then(
    async (j) => {
      await j.attach(context, runQueuedBuild);
      logger.info({ jobQueueMs: Math.round(performance.now() - mark) }, 'job queue started');
    },
    (err: unknown) => {
      logger.error({ err }, 'the job queue did not start');
      logger.flush(() => process.exit(1));
    },
  );
  const server = app.listen(config.port, config.host, () => {
    const addr = server.address();
    const port = typeof addr === 'object' && addr ? addr.port : config.port;
    // The address the socket is bound to ("localhost" may resolve to ::1 while the server listens on 127.0.0.1 only).
    const url = listenUrl(typeof addr === 'object' && addr ? addr.address : config.host, port);
    webhookUrl = `${url}/api/v1/payments/webhook`;
    logger.info(
      { port, mode: config.mode, startupMs: { ...phases, total: Math.round(performance.now()) } },
      `listening on ${url} (${config.mode} mode)`,
    );
    if (fake)
      logger.info(
        { smtpPort: fake.port },
        `local mail fake on smtp://127.0.0.1:${fake.port}; mail shows on the Outbox page`,
      );
    if (payFake)
      logger.info(
        { paymentFakePort: payFake.port },
        `local payment fake on http://127.0.0.1:${payFake.port} (test card 4242 4242 4242 4242)`,
      );
    if (config.mode === 'demo') printDemoBanner(url, demoPassword);
  });
  const shutdown = gracefulShutdown(
    server,
    [
      async () => (await jobs.ready).stop(JOB_GRACE_MS),
      () => mailer.close(),
      () => stopTimers(),
      async () => void (await fake?.close()),
      async () => void (await payFake?.close()),
      () => ds.destroy(),
    ],
    { requestTimeoutMs: REQUEST_GRACE_MS, log: (m) => logger.info(m) },
  );
  const stop = (signal: string) => {
    logger.info({ signal }, `${signal} received`);
    shutdown().then(
      () => logger.flush(() => process.exit(0)),
      (err: unknown) => {
        logger.error({ err }, 'shutdown failed');
        logger.flush(() => process.exit(1));
      },
    );
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
}

/** A URL a browser on this machine reaches for the bound address (any-address binds → the loopback of the same family). */
export function listenUrl(address: string, port: number): string {
  if (address === '0.0.0.0') return `http://127.0.0.1:${port}`;
  if (address === '::') return `http://[::1]:${port}`;
  return address.includes(':') ? `http://[${address}]:${port}` : `http://${address}:${port}`;
}

function printDemoBanner(url: string, password: string): void {
  const width = Math.max(...DEMO_USERS.map((u) => u.email.length));
  const lines = [
    '',
    `  Ringlet is ready: ${url}`,
    '',
    `  Demo sign-ins (password for all: ${password})`,
    ...DEMO_USERS.map(
      (u) =>
        `    ${u.email.padEnd(width)}  ${u.roles[0] ?? 'lab member'}${u.lab ? ' (lab manager)' : ''}`,
    ),
    '',
    '  Demo mode: invented data; mail goes to the Outbox page. Stop with Ctrl+C.',
    '',
  ];
  console.log(lines.join('\n'));
}

main().catch((err: unknown) => {
  logger.fatal({ err }, err instanceof Error ? err.message : String(err));
  logger.flush(() => process.exit(1));
});
