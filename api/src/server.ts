import 'reflect-metadata';
import { createDataSource, databaseUrl, ownerDatabaseUrl } from '../../db/data-source';
import { migrateDatabase } from '../../db/migrate';
import { providerName } from './services/provider';
import { createApp } from './app';
import { hasOutbox, readConfig } from './config';
import { startJobs } from './jobs/queue';
import { createMailer } from './mail/mailer';
import { startSmtpFake } from './mail/smtp-fake';
import { DEFAULT_DEMO_PASSWORD, DEMO_USERS } from '../../db/seed/demo-people';
import { isEmpty, seedDemo } from '../../db/seed/demo';

/** Reads the config, connects, migrates, starts the local mail fake outside production, listens. */
async function main(): Promise<void> {
  const config = readConfig();
  // Migrations (and the demo seed) run as the owner role; the server itself connects as the runtime role.
  const ownerUrl = config.databaseOwnerUrl ?? ownerDatabaseUrl();
  await migrateDatabase(ownerUrl);
  const ds = createDataSource(config.databaseUrl ?? databaseUrl());
  await ds.initialize();
  const demoPassword = config.demoPassword ?? DEFAULT_DEMO_PASSWORD;
  if (config.mode === 'demo' && (await isEmpty(ds))) {
    console.log('[ringlet] empty database: loading the demo scenario…');
    const owner = await createDataSource(ownerUrl).initialize();
    await seedDemo(owner, demoPassword, config.publicUrl).finally(() => owner.destroy());
  }
  const fake = hasOutbox(config.mode) && !config.smtp ? await startSmtpFake(ds, Number(process.env['RINGLET_SMTP_PORT'] ?? 0)) : null;
  const smtpMailer = createMailer(config, fake ?? undefined, { providerName: () => providerName(ds.manager) });
  // The PostgreSQL-backed job queue: mail retries and round reminders (shared by every instance).
  const jobs = await startJobs({
    connectionString: config.databaseUrl ?? databaseUrl(),
    ds,
    mailer: smtpMailer,
    publicUrl: config.publicUrl,
    log: (msg, err) => console.error(`[ringlet] ${msg}`, err ?? ''),
  });
  const mailer = jobs.mailer;
  const { app } = createApp({ ds, config, mailer });
  const server = app.listen(config.port, config.host, () => {
    const addr = server.address();
    const port = typeof addr === 'object' && addr ? addr.port : config.port;
    console.log(`[ringlet] listening on http://${config.host === '0.0.0.0' ? 'localhost' : config.host}:${port} (${config.mode} mode)`);
    if (fake) console.log(`[ringlet] local mail fake on smtp://127.0.0.1:${fake.port}; mail shows on the Outbox page`);
    if (config.mode === 'demo') printDemoBanner(`http://localhost:${port}`, demoPassword);
  });
  const stop = async () => {
    server.close();
    await jobs.stop();
    mailer.close();
    await fake?.close();
    await ds.destroy();
    process.exit(0);
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

function printDemoBanner(url: string, password: string): void {
  const width = Math.max(...DEMO_USERS.map((u) => u.email.length));
  const lines = [
    '',
    `  Ringlet is ready: ${url}`,
    '',
    `  Demo sign-ins (password for all: ${password})`,
    ...DEMO_USERS.map((u) => `    ${u.email.padEnd(width)}  ${u.roles[0] ?? 'lab member'}${u.lab ? ' (lab manager)' : ''}`),
    '',
    '  Demo mode: invented data; mail goes to the Outbox page. Stop with Ctrl+C.',
    '',
  ];
  console.log(lines.join('\n'));
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
