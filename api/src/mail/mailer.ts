import nodemailer from 'nodemailer';
import type { AppConfig } from '../config';

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/**
 * Mail through SMTP with nodemailer: the configured server in production, or the local SMTP fake
 * (started by the project itself) in development, demo and tests.
 */
export function createMailer(
  config: Pick<AppConfig, 'smtp' | 'mailFrom'>,
  fallbackSmtp?: { host: string; port: number },
): Mailer {
  const smtp = config.smtp ?? (fallbackSmtp ? { ...fallbackSmtp, secure: false } : null);
  if (!smtp) throw new Error('No SMTP server configured (set SMTP_HOST) and no local mail fake running.');
  const transport = nodemailer.createTransport({
    host: smtp.host,
    port: smtp.port,
    secure: smtp.secure,
    ignoreTLS: !smtp.secure && smtp.host === '127.0.0.1',
    auth: 'user' in smtp && smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: config.mailFrom, ...mail });
    },
    close() {
      transport.close();
    },
  };
}
