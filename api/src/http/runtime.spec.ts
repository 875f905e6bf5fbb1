/** Production running: request ids in the response header and the JSON log line; graceful shutdown. */
import express from 'express';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { Writable } from 'node:stream';
import request from 'supertest';
import { createApp } from '../app';
import { createMailer } from '../mail/mailer';
import { startSmtpFake } from '../mail/smtp-fake';
import { createTestDatabase, type TestDatabase } from '../../../db/testing';
import { testConfig } from '../testing/test-app';
import { createLogger, requestLogging } from './logging';
import { gracefulShutdown } from './shutdown';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

function captured() {
  const lines: Record<string, unknown>[] = [];
  const stream = new Writable({
    write(chunk: Buffer, _enc, cb) {
      for (const l of chunk.toString('utf8').split('\n'))
        if (l.trim()) lines.push(JSON.parse(l) as Record<string, unknown>);
      cb();
    },
  });
  return { lines, logger: createLogger({ destination: stream }) };
}

describe('request ids and structured logs', () => {
  let db: TestDatabase;
  beforeAll(async () => {
    db = await createTestDatabase();
  });
  afterAll(() => db.drop());

  it('answers with X-Request-Id and writes one JSON line per request carrying the same id', async () => {
    const { lines, logger } = captured();
    const smtp = await startSmtpFake(db.ds);
    const config = testConfig();
    const mailer = createMailer(config, smtp);
    try {
      const { app } = createApp({ ds: db.ds, config, mailer, logger, log: () => undefined });
      const res = await request(app)
        .get('/api/v1/health')
        .set('cookie', 'ringlet.sid=secret-cookie')
        .expect(200);
      const id = res.headers['x-request-id'] as string;
      expect(id).toMatch(UUID);
      const missing = await request(app).get('/api/v1/nowhere').expect(404);
      await new Promise((r) => setImmediate(r));
      const line = lines.find((l) => (l['req'] as { id?: string } | undefined)?.id === id);
      expect(line).toBeDefined();
      expect(line!['msg']).toBe('GET /api/v1/health 200');
      expect(line!['level']).toBe(30); // info
      expect((line!['res'] as { statusCode: number }).statusCode).toBe(200);
      expect(typeof line!['responseTime']).toBe('number');
      expect(JSON.stringify(line)).not.toContain('secret-cookie'); // no cookies, no other headers
      const notFound = lines.find(
        (l) => (l['req'] as { id?: string } | undefined)?.id === missing.headers['x-request-id'],
      );
      expect(notFound!['level']).toBe(40); // warn for 4xx
      expect(new Set(lines.map((l) => (l['req'] as { id: string }).id)).size).toBe(2);
    } finally {
      mailer.close();
      await smtp.close();
    }
  });

  it("keeps a proxy's request id when it is a short token and replaces anything else", async () => {
    const { logger } = captured();
    const app = express();
    app.use(requestLogging(logger));
    app.get('/x', (_req, res) => void res.json({ ok: true }));
    const kept = await request(app).get('/x').set('x-request-id', 'edge-7f3a9c21').expect(200);
    expect(kept.headers['x-request-id']).toBe('edge-7f3a9c21');
    const replaced = await request(app)
      .get('/x')
      .set('x-request-id', '<script>alert(1)</script>')
      .expect(200);
    expect(replaced.headers['x-request-id']).toMatch(UUID);
    const long = await request(app).get('/x').set('x-request-id', 'a'.repeat(65)).expect(200);
    expect(long.headers['x-request-id']).toMatch(UUID);
  });
});

describe('graceful shutdown', () => {
  it('finishes an in-flight request, refuses new connections, then runs the shutdown steps', async () => {
    const app = express();
    let arrived!: () => void;
    const handling = new Promise<void>((r) => (arrived = r));
    const order: string[] = [];
    app.get('/slow', (_req, res) => {
      arrived();
      // The server's side of "finished": the whole answer handed to the connection. (The
      // client's 'end' event can come after the shutdown steps on a loaded machine.)
      res.on('finish', () => order.push('response'));
      setTimeout(() => res.json({ finished: true }), 600);
    });
    const server = app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const port = (server.address() as AddressInfo).port;
    const shutdown = gracefulShutdown(
      server,
      [() => void order.push('jobs stopped'), () => void order.push('database closed')],
      {
        requestTimeoutMs: 5000,
        log: () => undefined,
      },
    );
    const agent = new http.Agent({ keepAlive: true });
    const inFlight = new Promise<{ status: number; body: string }>((resolve, reject) => {
      http
        .get({ host: '127.0.0.1', port, path: '/slow', agent }, (res) => {
          let body = '';
          res.on('data', (c: Buffer) => (body += c.toString()));
          res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
        })
        .on('error', reject);
    });
    await handling; // the request is being handled (a fixed wait raced on a loaded machine)
    const done = shutdown();
    const refused = await new Promise<string>((resolve) => {
      http
        .get({ host: '127.0.0.1', port, path: '/slow' }, () => resolve('answered'))
        .on('error', (e: NodeJS.ErrnoException) => resolve(e.code ?? 'error'));
    });
    expect(refused).toBe('ECONNREFUSED');
    const r = await inFlight;
    expect(r.status).toBe(200);
    expect(JSON.parse(r.body)).toEqual({ finished: true });
    await done;
    expect(order).toEqual(['response', 'jobs stopped', 'database closed']);
    expect(server.listening).toBe(false);
    agent.destroy();
  });

  it('cuts requests that outlast the grace period and still runs the steps', async () => {
    const app = express();
    let arrived!: () => void;
    const handling = new Promise<void>((r) => (arrived = r));
    app.get('/hang', () => arrived()); // never answers
    const server = app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const port = (server.address() as AddressInfo).port;
    const steps: string[] = [];
    const shutdown = gracefulShutdown(server, [() => void steps.push('closed')], {
      requestTimeoutMs: 300,
      log: () => undefined,
    });
    const outcome = new Promise<string>((resolve) => {
      http
        .get({ host: '127.0.0.1', port, path: '/hang' }, () => resolve('answered'))
        .on('error', (e: NodeJS.ErrnoException) => resolve(e.code ?? 'error'));
    });
    await handling;
    await shutdown();
    expect(await outcome).toBe('ECONNRESET');
    expect(steps).toEqual(['closed']);
  });
});
