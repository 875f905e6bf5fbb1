import type { AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { DataSource } from 'typeorm';
import { MailMessage } from '../../../db/entities';

export interface SmtpFake {
  host: string;
  port: number;
  close(): Promise<void>;
}

function addresses(a: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(a) ? a : a ? [a] : [];
  return list.flatMap((x) => x.value.map((v) => v.address ?? '')).filter(Boolean);
}

/**
 * The local stand-in for a hosted mail service: a real SMTP server on loopback that keeps every
 * message in the `mail_message` table, where the Outbox page shows it. Development, demo and tests only.
 */
export async function startSmtpFake(
  ds: DataSource,
  port = 0,
  host = '127.0.0.1',
): Promise<SmtpFake> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, _session, callback) {
      // mailparser loads at the first message, not at start-up.
      import('mailparser')
        .then(({ simpleParser }) => simpleParser(stream))
        .then(async (parsed) => {
          await ds.getRepository(MailMessage).insert({
            from: addresses(parsed.from).join(', ') || 'unknown',
            to: addresses(parsed.to),
            subject: parsed.subject ?? '(no subject)',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
          });
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const address = server.server.address();
  const actualPort = typeof address === 'object' && address ? address.port : port;
  return {
    host,
    port: actualPort,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
