import nodemailer, { type Transporter } from 'nodemailer';
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

export interface MailerOptions {
  /** The PT provider's name from its profile ('' when none is set): From display name and signature. */
  providerName?: () => Promise<string>;
}

/** The bare address of a From value written as `Name <address>` or `address`. */
export function mailAddress(from: string): string {
  return /<([^>]+)>/.exec(from)?.[1]?.trim() ?? from.trim();
}

/**
 * Mail through SMTP with nodemailer: the configured server in production, or the local SMTP fake
 * (started by the project itself) in development, demo and tests.
 */
export function createMailer(
  config: Pick<AppConfig, 'smtp' | 'mailFrom'>,
  fallbackSmtp?: { host: string; port: number },
  options: MailerOptions = {},
): Mailer {
  const smtp = config.smtp ?? (fallbackSmtp ? { ...fallbackSmtp, secure: false } : null);
  if (!smtp)
    throw new Error('No SMTP server configured (set SMTP_HOST) and no local mail fake running.');
  // Created at the first mail: loading nodemailer is a noticeable part of start-up.
  let transport: Transporter | undefined;
  const transporter = () =>
    (transport ??= nodemailer.createTransport({
      host: smtp.host,
      port: smtp.port,
      secure: smtp.secure,
      ignoreTLS: !smtp.secure && smtp.host === '127.0.0.1',
      auth:
        'user' in smtp && smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
    }));
  return {
    async send(mail) {
      const name = (await (options.providerName?.() ?? Promise.resolve('')).catch(() => '')).trim();
      if (!name) {
        await transporter().sendMail({ from: config.mailFrom, ...mail });
        return;
      }
      // The PT provider's name (its profile) is the From display name and signs the message.
      await transporter().sendMail({
        ...mail,
        from: { name, address: mailAddress(config.mailFrom) },
        text: `${mail.text}\n\n-- \n${name}\n`,
      });
    },
    close() {
      transport?.close();
    },
  };
}
