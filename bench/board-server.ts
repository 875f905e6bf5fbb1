/**
 * The real app on a given database, listening on loopback, in its own process so the load
 * generator does not share its event loop. Prints `PORT <n>` when ready. Used by bench/board.ts
 * and, with the built web app's folder as a second argument, by bench/first-visit.ts.
 */
import { createApp } from '../api/src/app';
import { createMailer } from '../api/src/mail/mailer';
import { startSmtpFake } from '../api/src/mail/smtp-fake';
import { testConfig } from '../api/src/testing/test-app';
import { createDataSource } from '../db/data-source';

async function main(): Promise<void> {
  const url = process.argv[2]!;
  const ds = createDataSource(url);
  await ds.initialize();
  const smtp = await startSmtpFake(ds);
  const staticDir = process.argv[3];
  const config = testConfig(staticDir ? { staticDir, mode: 'demo' } : {});
  const mailer = createMailer(config, smtp);
  const { app } = createApp({ ds, config, mailer, log: () => undefined });
  const server = app.listen(0, '127.0.0.1', () => {
    const a = server.address();
    process.stdout.write(`PORT ${typeof a === 'object' && a ? a.port : 0}\n`);
  });
  process.on('SIGTERM', () => {
    server.close();
    mailer.close();
    void smtp
      .close()
      .then(() => ds.destroy())
      .then(() => process.exit(0));
  });
}

void main();
