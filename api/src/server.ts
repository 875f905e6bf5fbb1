import 'reflect-metadata';
import { createDataSource, databaseUrl } from '../../db/data-source';
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
  const ds = createDataSource(config.databaseUrl ?? databaseUrl());
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  const demoPassword = config.demoPassword ?? DEFAULT_DEMO_PASSWORD;
  if (config.mode === 'demo' && (await isEmpty(ds))) {
    console.log('[ringlet] empty database: loading the demo scenario…');
    await seedDemo(ds, demoPassword, config.publicUrl);
  }
  const fake = hasOutbox(config.mode) && !config.smtp ? await startSmtpFake(ds, Number(process.env['RINGLET_SMTP_PORT'] ?? 0)) : null;
  const smtpMailer = createMailer(config, fake ?? undefined);
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
    // The address the socket is bound to ("localhost" may resolve to ::1 while the server listens on 127.0.0.1 only).
    const url = listenUrl(typeof addr === 'object' && addr ? addr.address : config.host, port);
    console.log(`[ringlet] listening on ${url} (${config.mode} mode)`);
    if (fake) console.log(`[ringlet] local mail fake on smtp://127.0.0.1:${fake.port}; mail shows on the Outbox page`);
    if (config.mode === 'demo') printDemoBanner(url, demoPassword);
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
