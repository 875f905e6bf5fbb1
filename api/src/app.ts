import connectPgSimple from 'connect-pg-simple';
import { csrfSync } from 'csrf-sync';
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import { join } from 'node:path';
import type { Pool } from 'pg';
import type { DataSource } from 'typeorm';
import { actingLab, createPassport } from './auth/passport';
import { API_REFERENCE_CSS, renderApiReference } from './http/api-reference';
import { errorHandler, notFound } from './http/errors';
import { requestLogging, silentLogger, type Logger } from './http/logging';
import { buildOpenApi } from './http/openapi';
import { ApiRouter, type AnyRoute } from './http/route';
import { webApp } from './http/static-files';
import type { AppConfig } from './config';
import type { JobQueue } from './jobs/queue';
import type { Mailer } from './mail/mailer';
import { adminRoutes } from './routes/admin';
import { authRoutes } from './routes/auth';
import { roundRoutes } from './routes/rounds';
import { benchRoutes } from './routes/bench';
import { systemRoutes } from './routes/system';
import { evaluationRoutes } from './routes/evaluation';
import { precisionRoutes } from './routes/precision';
import { boardRoutes } from './routes/board';
import { investigationRoutes } from './routes/investigations';
import { assessorGrantRoutes } from './routes/assessor-grants';
import { reportRoutes } from './routes/reports';
import { providerRoutes } from './routes/provider';
import { assessorRoutes } from './routes/assessor';
import { billingRoutes, WEBHOOK_PATH, webhookRawBody } from './routes/billing';
import type { AppContext } from './services/context';
import { RateLimiter } from './services/rate-limit';
import { VERSION } from './version';

export interface AppDeps {
  ds: DataSource;
  config: AppConfig;
  mailer: Mailer;
  log?: (msg: string, err?: unknown) => void;
  /** The job queue for background work (report builds, publication mail); server.ts passes it. */
  queue?: JobQueue;
  /** Structured log (pino) for the per-request lines with their request id; tests get a silent one. */
  logger?: Logger;
}

export interface RingletApp {
  app: Express;
  /** Every API route, as declared (for the OpenAPI document and the authorization tests). */
  routes: readonly AnyRoute[];
  context: AppContext;
  /** Stops what the app itself keeps running (the session store's prune timer). */
  readonly stopTimers: () => void;
}

/** The Content-Security-Policy the built Angular app runs under. */
export const CONTENT_SECURITY_POLICY = {
  defaultSrc: ["'self'"],
  scriptSrc: ["'self'"],
  // Angular, Material and the grid add component styles at run time; scripts stay strict.
  styleSrc: ["'self'", "'unsafe-inline'"],
  imgSrc: ["'self'", 'data:', 'blob:'],
  fontSrc: ["'self'", 'data:'],
  connectSrc: ["'self'"],
  objectSrc: ["'none'"],
  baseUri: ["'self'"],
  formAction: ["'self'"],
  frameAncestors: ["'none'"],
  upgradeInsecureRequests: null,
};

/** Strict-Transport-Security on HTTPS answers (helmet's default value). */
export const HSTS = 'max-age=31536000; includeSubDomains';

/** Builds the Express app without listening (server.ts listens; tests use supertest). */
export function createApp(deps: AppDeps): RingletApp {
  const log =
    deps.log ?? ((msg: string, err?: unknown) => console.error(`[ringlet] ${msg}`, err ?? ''));
  const ctx: AppContext = {
    ds: deps.ds,
    config: deps.config,
    mailer: deps.mailer,
    log,
    queue: deps.queue,
  };
  const app = express();
  app.disable('x-powered-by');
  app.use(requestLogging(deps.logger ?? silentLogger()));
  if (deps.config.trustProxy) app.set('trust proxy', 1);

  // HSTS only on answers that went out over HTTPS (directly, or behind a trusted proxy that says
  // so in X-Forwarded-Proto): over plain http the header is meaningless and would pin a dev host.
  app.use(
    helmet({
      contentSecurityPolicy: { useDefaults: false, directives: CONTENT_SECURITY_POLICY },
      strictTransportSecurity: false,
    }),
  );
  app.use((req, res, next) => {
    if (req.secure) res.setHeader('Strict-Transport-Security', HSTS);
    next();
  });
  // The built web app (precompressed, cache headers by file kind), with the SPA fallback: ahead
  // of the session, so its files and index.html cost no session read from PostgreSQL.
  const web = webApp(deps.config.staticDir ?? join(__dirname, '../../dist/web/browser'));
  if (web) app.use(web);

  app.use(WEBHOOK_PATH, ...webhookRawBody()); // the signed raw body, before express.json
  app.use(express.json({ limit: '1mb' }));

  // Sessions live in PostgreSQL so several server instances share them.
  const PgStore = connectPgSimple(session);
  const pool = (deps.ds.driver as unknown as { master: Pool }).master;
  const sessionStore = new PgStore({
    pool,
    tableName: 'session',
    createTableIfMissing: false,
    disableTouch: true,
    pruneSessionInterval: deps.config.mode === 'test' ? false : 900,
  });
  app.use(
    session({
      name: 'ringlet.sid',
      secret: deps.config.sessionSecret,
      // disableTouch + no rolling: a session lasts 8 hours from sign-in (an absolute timeout), and a
      // request costs one session read instead of a read and a write.
      store: sessionStore,
      resave: false,
      saveUninitialized: false,
      rolling: false,
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        // Secure cookies wherever the public address is https (always, in a real deployment)
        secure: deps.config.publicUrl.startsWith('https:'),
        maxAge: 8 * 3600 * 1000,
      },
    }),
  );

  const passport = createPassport(deps.ds);
  app.use(passport.initialize());
  app.use(passport.session());
  app.use(actingLab);

  const csrf = csrfSync({ getTokenFromRequest: (req) => req.get('x-csrf-token') ?? undefined });
  const api = new ApiRouter({ isCsrfValid: (req) => csrf.isRequestValid(req) });
  const limiter = new RateLimiter(deps.ds);

  systemRoutes(api, ctx);
  authRoutes(api, ctx, limiter, (req) => csrf.generateToken(req), passport);
  adminRoutes(api, ctx);
  // Feature routes: one line each, below this comment.
  roundRoutes(api, ctx);
  evaluationRoutes(api, ctx);
  boardRoutes(api, ctx);
  investigationRoutes(api, ctx);
  assessorGrantRoutes(api, ctx);
  benchRoutes(api, ctx);
  reportRoutes(api, ctx);
  providerRoutes(api, ctx);
  assessorRoutes(api, ctx);
  precisionRoutes(api, ctx);
  billingRoutes(api, ctx);

  let openApi: object | undefined;
  const document = () => (openApi ??= buildOpenApi(api.routes, VERSION));
  api.add({
    method: 'get',
    path: '/openapi.json',
    tag: 'system',
    summary: 'This API described in OpenAPI 3.1',
    access: 'public',
    handler: () => document(),
  });

  app.use('/api/v1', api.router);
  app.get('/api/docs', (_req, res) => {
    res.type('html').send(renderApiReference(document() as never));
  });
  app.get('/api/docs.css', (_req, res) => {
    res.type('css').send(API_REFERENCE_CSS);
  });
  app.use('/api', (_req, _res, next) => next(notFound('That API route')));

  app.use(errorHandler(log));
  return { app, routes: api.routes, context: ctx, stopTimers: () => sessionStore.close() };
}
