import * as z from 'zod';

/** How the server runs. `demo` seeds demo data and shows the Outbox; `production` refuses demo accounts. */
export const Mode = z.enum(['demo', 'development', 'production', 'test']);
export type Mode = z.infer<typeof Mode>;

const ConfigSchema = z
  .object({
    PORT: z.coerce.number().int().min(0).max(65535).default(3000),
    HOST: z.string().default('127.0.0.1'),
    RINGLET_MODE: Mode.default('development'),
    DATABASE_URL: z.string().optional(),
    DATABASE_OWNER_URL: z.string().optional(),
    MIGRATION_DATABASE_URL: z.string().optional(),
    SESSION_SECRET: z.string().min(32).optional(),
    PUBLIC_URL: z.url().optional(),
    SMTP_HOST: z.string().optional(),
    SMTP_PORT: z.coerce.number().int().optional(),
    SMTP_USER: z.string().optional(),
    SMTP_PASSWORD: z.string().optional(),
    SMTP_SECURE: z.enum(['true', 'false']).optional(),
    MAIL_FROM: z.string().default('Ringlet <no-reply@ringlet.example>'),
    RINGLET_DEMO_PASSWORD: z.string().min(12).optional(),
    RINGLET_STATIC_DIR: z.string().optional(),
    TRUST_PROXY: z.enum(['true', 'false']).default('false'),
    STRIPE_SECRET_KEY: z.string().min(8).max(300).optional(),
    STRIPE_WEBHOOK_SECRET: z.string().min(8).max(300).optional(),
    /** Only for a local fake of the payment service: where the SDK sends its calls. */
    STRIPE_API_BASE: z.url({ protocol: /^https?$/ }).optional(),
  })
  .superRefine((c, ctx) => {
    if (c.RINGLET_MODE === 'production') {
      if (!c.SESSION_SECRET)
        ctx.addIssue({
          code: 'custom',
          path: ['SESSION_SECRET'],
          message: 'required in production (32+ characters)',
        });
      if (!c.SMTP_HOST)
        ctx.addIssue({ code: 'custom', path: ['SMTP_HOST'], message: 'required in production' });
      if (!c.PUBLIC_URL)
        ctx.addIssue({ code: 'custom', path: ['PUBLIC_URL'], message: 'required in production' });
    }
  });

export interface AppConfig {
  port: number;
  host: string;
  mode: Mode;
  /** The runtime role's connection (DATABASE_URL; default: the local cluster's ringlet_app). */
  databaseUrl?: string;
  /** The owner role's connection for migrations and the seed (DATABASE_OWNER_URL or MIGRATION_DATABASE_URL). */
  databaseOwnerUrl?: string;
  sessionSecret: string;
  publicUrl: string;
  smtp: { host: string; port: number; user?: string; password?: string; secure: boolean } | null;
  mailFrom: string;
  demoPassword?: string;
  staticDir?: string;
  trustProxy: boolean;
  /**
   * Card payments through the hosted-payment SDK (stripe): the secret key, the webhook signing
   * secret and, only for the local fake, the API's address. Null: card payment is off.
   */
  payments?: PaymentSettings | null;
}

export interface PaymentSettings {
  secretKey: string;
  webhookSecret: string;
  api?: { host: string; port: number; protocol: 'http' | 'https' };
}

function paymentSettings(c: {
  STRIPE_SECRET_KEY?: string;
  STRIPE_WEBHOOK_SECRET?: string;
  STRIPE_API_BASE?: string;
}): PaymentSettings | null {
  if (!c.STRIPE_SECRET_KEY || !c.STRIPE_WEBHOOK_SECRET) return null;
  const base = c.STRIPE_API_BASE ? new URL(c.STRIPE_API_BASE) : null;
  const protocol = base?.protocol === 'http:' ? 'http' : 'https';
  return {
    secretKey: c.STRIPE_SECRET_KEY,
    webhookSecret: c.STRIPE_WEBHOOK_SECRET,
    api: base
      ? {
          host: base.hostname,
          port: Number(base.port || (protocol === 'http' ? 80 : 443)),
          protocol,
        }
      : undefined,
  };
}

/** Reads the environment once; a bad value stops the server with the variable named. */
export function readConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const parsed = ConfigSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  return {
    port: c.PORT,
    host: c.HOST,
    mode: c.RINGLET_MODE,
    databaseUrl: c.DATABASE_URL,
    databaseOwnerUrl:
      c.DATABASE_OWNER_URL ??
      c.MIGRATION_DATABASE_URL ??
      (c.DATABASE_URL ? c.DATABASE_URL : undefined),
    sessionSecret: c.SESSION_SECRET ?? 'ringlet-development-secret-not-for-production',
    publicUrl: (c.PUBLIC_URL ?? `http://localhost:${c.PORT}`).replace(/\/$/, ''),
    smtp: c.SMTP_HOST
      ? {
          host: c.SMTP_HOST,
          port: c.SMTP_PORT ?? 587,
          user: c.SMTP_USER,
          password: c.SMTP_PASSWORD,
          secure: c.SMTP_SECURE === 'true',
        }
      : null,
    mailFrom: c.MAIL_FROM,
    demoPassword: c.RINGLET_DEMO_PASSWORD,
    staticDir: c.RINGLET_STATIC_DIR,
    trustProxy: c.TRUST_PROXY === 'true',
    payments: paymentSettings(c),
  };
}

/** Modes in which the local mail fake and the Outbox exist. */
export function hasOutbox(mode: Mode): boolean {
  return mode !== 'production';
}
