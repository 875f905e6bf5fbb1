import bcrypt from 'bcryptjs';
import { providerName } from '../services/provider';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { createTestDatabase, type TestDatabase } from '../../../db/testing';
import { MailMessage, Membership, Organisation, User } from '../../../db/entities';
import type { GlobalRole } from '../../../shared/contracts/auth';
import { createApp, type RingletApp } from '../app';
import type { AppConfig } from '../config';
import { createMailer, type Mailer } from '../mail/mailer';
import { startSmtpFake, type SmtpFake } from '../mail/smtp-fake';
import { startPaymentFake, type PaymentFake } from '../payments/payment-fake';

export const TEST_PASSWORD = 'correct horse battery';
let cachedHash: string | undefined;
/** One bcrypt hash (cost 12) per test file, reused for every test user. */
export async function testHash(): Promise<string> {
  return (cachedHash ??= await bcrypt.hash(TEST_PASSWORD, 12));
}

export interface TestApp extends RingletApp {
  db: TestDatabase;
  ds: DataSource;
  smtp: SmtpFake;
  /** The local payment fake the app's SDK talks to (webhooks go to config.publicUrl). */
  payments: PaymentFake;
  mailer: Mailer;
  close(): Promise<void>;
}

export function testConfig(overrides: Partial<AppConfig> = {}): AppConfig {
  return {
    port: 0,
    host: '127.0.0.1',
    mode: 'test',
    sessionSecret: 'test-secret-test-secret-test-secret-0',
    publicUrl: 'http://ringlet.test',
    smtp: null,
    mailFrom: 'Ringlet <no-reply@ringlet.example>',
    trustProxy: false,
    staticDir: '/nonexistent',
    ...overrides,
  };
}

/** The real app on a fresh database, with the real SMTP fake capturing mail. */
export async function startTestApp(overrides: Partial<AppConfig> = {}): Promise<TestApp> {
  const db = await createTestDatabase();
  const smtp = await startSmtpFake(db.ds);
  const config = testConfig(overrides);
  const payments = await startPaymentFake({
    webhookUrl: () => `${config.publicUrl}/api/v1/payments/webhook`,
  });
  if (config.payments === undefined) config.payments = payments.settings;
  const mailer = createMailer(config, smtp, { providerName: () => providerName(db.ds.manager) });
  const app = createApp({
    ds: db.ds,
    config,
    mailer,
    log: process.env['RINGLET_TEST_LOG'] ? undefined : () => undefined,
  });
  return {
    ...app,
    db,
    ds: db.ds,
    smtp,
    payments,
    mailer,
    async close() {
      app.stopTimers();
      mailer.close();
      await payments.close();
      await smtp.close();
      await db.drop();
    },
  };
}

export interface TestUserSpec {
  email: string;
  name?: string;
  roles?: GlobalRole[];
  lab?: string; // organisation id
  manager?: boolean;
}

export async function createUser(ds: DataSource, spec: TestUserSpec): Promise<User> {
  const user = await ds.getRepository(User).save({
    email: spec.email,
    name: spec.name ?? spec.email.split('@')[0]!,
    roles: spec.roles ?? [],
    passwordHash: await testHash(),
  });
  if (spec.lab) {
    await ds
      .getRepository(Membership)
      .insert({ userId: user.id, organisationId: spec.lab, isManager: spec.manager ?? false });
  }
  return user;
}

export async function createLab(ds: DataSource, name: string): Promise<Organisation> {
  return ds
    .getRepository(Organisation)
    .save({ name, kind: 'lab', country: null, contactEmail: null });
}

/** A supertest agent (keeps cookies) with the CSRF token of its session. */
export interface Client {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
  refreshCsrf(): Promise<string>;
}

export async function client(app: TestApp): Promise<Client> {
  const agent = request.agent(app.app);
  const c: Client = {
    agent,
    csrf: '',
    async refreshCsrf() {
      const res = await agent.get('/api/v1/auth/csrf-token').expect(200);
      c.csrf = res.body.token;
      return c.csrf;
    },
  };
  await c.refreshCsrf();
  return c;
}

/** Signs in through the real route and returns a client holding the new session's CSRF token. */
export async function signedIn(
  app: TestApp,
  email: string,
  password = TEST_PASSWORD,
): Promise<Client> {
  const c = await client(app);
  await c.agent
    .post('/api/v1/auth/sign-in')
    .set('x-csrf-token', c.csrf)
    .send({ email, password })
    .expect(200);
  await c.refreshCsrf();
  return c;
}

/** Mail the fake captured, newest first (waits briefly: SMTP delivery is asynchronous). */
export async function mailTo(ds: DataSource, address: string, atLeast = 1): Promise<MailMessage[]> {
  for (let i = 0; i < 50; i++) {
    const rows = await ds
      .getRepository(MailMessage)
      .createQueryBuilder('m')
      .where(':a = ANY(m.mail_to)', { a: address })
      .orderBy('m.received_at', 'DESC')
      .getMany();
    if (rows.length >= atLeast) return rows;
    await new Promise((r) => setTimeout(r, 40));
  }
  return [];
}

/** The token of the first /set-password/ link in a message. */
export function linkToken(text: string): string {
  const m = /\/set-password\/([A-Za-z0-9_-]+)/.exec(text);
  if (!m) throw new Error(`no password link in: ${text}`);
  return m[1]!;
}

/** The token of the first /invitations/ link in a message (a round's invitation to a lab). */
export function invitationToken(text: string): string {
  const m = /\/invitations\/([A-Za-z0-9_-]+)/.exec(text);
  if (!m) throw new Error(`no invitation link in: ${text}`);
  return m[1]!;
}

/** supertest: collect a binary response body into a Buffer (`.buffer(true).parse(binary)`). */
export function binary(res: unknown, done: (err: Error | null, body: Buffer) => void): void {
  const stream = res as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
}

/** Every API path starts here. */
export const api = (path: string): string => `/api/v1${path}`;

/** A file download under /api/v1 with its body collected into a Buffer. */
export function download(c: Client, path: string): ReturnType<Client['agent']['get']> {
  return c.agent.get(api(path)).buffer(true).parse(binary);
}

/** A JSON request under /api/v1 with the client's CSRF token (POST unless told). */
export function send(
  c: Client,
  path: string,
  body: unknown,
  method: 'post' | 'put' | 'patch' | 'delete' = 'post',
): ReturnType<Client['agent']['post']> {
  return c.agent[method](api(path))
    .set('x-csrf-token', c.csrf)
    .send(body as object);
}

/**
 * A user of a spec's cast: `lab` is an index into the cast's labs, or the id of a lab made
 * elsewhere (a fixture's); `signIn` gives a client.
 */
export interface CastMember extends Omit<TestUserSpec, 'lab'> {
  lab?: number | string;
  signIn?: boolean;
}

/** The people a spec works with: labs, then users (in order), then the sign-ins. */
export interface CastSpec {
  labs?: string[];
  users?: CastMember[];
}

export interface Cast {
  t: TestApp;
  /** The ids of `labs`, in order. */
  labIds: string[];
  /** The users, in the order of `users`. */
  users: User[];
  /** The signed-in client of a user marked `signIn` (throws for anyone else). */
  as(email: string): Client;
}

/** Creates a spec's labs and users on `t` and signs in those marked `signIn`. */
export async function createCast(t: TestApp, spec: CastSpec): Promise<Cast> {
  const labIds: string[] = [];
  for (const name of spec.labs ?? []) labIds.push((await createLab(t.ds, name)).id);
  const users: User[] = [];
  for (const { lab, signIn: _signIn, ...u } of spec.users ?? []) {
    users.push(await createUser(t.ds, { ...u, lab: typeof lab === 'number' ? labIds[lab] : lab }));
  }
  const clients = new Map<string, Client>();
  for (const u of spec.users ?? []) if (u.signIn) clients.set(u.email, await signedIn(t, u.email));
  return {
    t,
    labIds,
    users,
    as(email) {
      const c = clients.get(email);
      if (!c) throw new Error(`${email} is not signed in in this cast`);
      return c;
    },
  };
}

/** The real app on a fresh database with a spec's cast (see createCast). */
export async function startCast(spec: CastSpec, overrides: Partial<AppConfig> = {}): Promise<Cast> {
  return createCast(await startTestApp(overrides), spec);
}

/** As a new coordinator `email`: evaluate a closed round, commit the evaluation and publish it. */
export async function publishAsCoordinator(
  t: TestApp,
  roundId: string,
  email: string,
): Promise<void> {
  await createUser(t.ds, { email, roles: ['coordinator'] });
  const coord = await signedIn(t, email);
  await send(coord, `/rounds/${roundId}/evaluation`, {}).expect(201);
  await commitAndPublish(coord, roundId);
}

/** As coordinator `coord`: commit a round's evaluation draft, then publish it. */
export async function commitAndPublish(coord: Client, roundId: string): Promise<void> {
  await send(coord, `/rounds/${roundId}/evaluation/commit`, {}).expect(200);
  await send(coord, `/rounds/${roundId}/publish`, {}).expect(200);
}
