import net from 'node:net';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { createDataSource } from '../../../db/data-source';
import { createApp, type RingletApp } from '../app';
import {
  createUser,
  startTestApp,
  testConfig,
  TEST_PASSWORD,
  type TestApp,
} from '../testing/test-app';
import { DATABASE_RETRY_AFTER_SECONDS } from './errors';

jest.setTimeout(120_000);

/**
 * A TCP proxy in front of PostgreSQL that the test can cut and restore: to the app, a cut looks
 * exactly like the database server stopping (open connections drop, new ones are refused), but
 * the shared test cluster keeps running for the other test files.
 */
class CuttableProxy {
  private server: net.Server | null = null;
  private readonly sockets = new Set<net.Socket>();
  port = 0;
  constructor(private readonly targetPort: number) {}

  async start(): Promise<void> {
    this.server = net.createServer((client) => {
      const upstream = net.connect(this.targetPort, '127.0.0.1');
      for (const s of [client, upstream]) {
        this.sockets.add(s);
        s.on('close', () => this.sockets.delete(s));
        s.on('error', () => undefined);
      }
      client.pipe(upstream).pipe(client);
    });
    await new Promise<void>((resolve) => this.server!.listen(this.port, '127.0.0.1', resolve));
    const a = this.server.address();
    this.port = typeof a === 'object' && a ? a.port : 0;
  }

  /** The database "stops": every open connection drops and the port refuses new ones. */
  async cut(): Promise<void> {
    const s = this.server;
    this.server = null;
    for (const sock of this.sockets) sock.destroy();
    if (s) await new Promise<void>((resolve) => s.close(() => resolve()));
  }
}

describe('database outage: 503 with a retry hint, health follows, recovery without restart', () => {
  let t: TestApp;
  let ds: DataSource;
  let app: RingletApp;
  let proxy: CuttableProxy;
  const unhandled: string[] = [];

  beforeAll(async () => {
    t = await startTestApp();
    await createUser(t.ds, { email: 'outage@x.test' });
    proxy = new CuttableProxy(Number(new URL(t.db.url).port));
    await proxy.start();
    const url = new URL(t.db.url);
    url.port = String(proxy.port);
    ds = await createDataSource(url.toString()).initialize();
    app = createApp({
      ds,
      config: testConfig(),
      mailer: t.mailer,
      log: (msg) => unhandled.push(msg),
    });
  });
  afterAll(async () => {
    await proxy.cut();
    if (ds.isInitialized) await ds.destroy();
    await t.close();
  });

  async function signIn() {
    const agent = request.agent(app.app);
    let csrf = (await agent.get('/api/v1/auth/csrf-token').expect(200)).body.token as string;
    await agent
      .post('/api/v1/auth/sign-in')
      .set('x-csrf-token', csrf)
      .send({ email: 'outage@x.test', password: TEST_PASSWORD })
      .expect(200);
    csrf = (await agent.get('/api/v1/auth/csrf-token').expect(200)).body.token as string;
    return { agent, csrf };
  }

  function expectUnavailable(res: request.Response) {
    expect(res.status).toBe(503);
    expect(res.headers['retry-after']).toBe(String(DATABASE_RETRY_AFTER_SECONDS));
    expect(res.body.error.code).toBe('database_unavailable');
    expect(res.body.error.message).toMatch(/try again/i);
  }

  it('answers 503 (never 500) while the database is gone, and recovers on its own', async () => {
    const { agent, csrf } = await signIn();
    await agent.get('/api/v1/auth/me').expect(200);
    const healthy = await request(app.app).get('/api/v1/health').expect(200);
    expect(healthy.body).toMatchObject({ status: 'ok', database: 'up' });
    await request(app.app).get('/api/v1/health/ready').expect(200);

    // Requests in flight when the database stops: each one answers 200 (done before the cut) or 503.
    const inFlight = Array.from({ length: 24 }, (_, i) =>
      i % 3 === 0 ? request(app.app).get('/api/v1/health') : agent.get('/api/v1/auth/me'),
    ).map((r) => r.then((res) => res));
    await new Promise((r) => setTimeout(r, 5));
    await proxy.cut();
    const statuses = (await Promise.all(inFlight)).map((r) => r.status);
    expect(statuses.filter((s) => s !== 200 && s !== 503)).toEqual([]);

    // While it is down: a request with a session cookie, a state-changing request, the health checks.
    expectUnavailable(await agent.get('/api/v1/auth/me'));
    expectUnavailable(await agent.post('/api/v1/auth/sign-out').set('x-csrf-token', csrf).send({}));
    const anonymous = await request(app.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'outage@x.test', password: TEST_PASSWORD });
    expect([403, 503]).toContain(anonymous.status); // no session to carry a CSRF token; never 500
    const down = await request(app.app).get('/api/v1/health');
    expect(down.status).toBe(503);
    expect(down.headers['retry-after']).toBe(String(DATABASE_RETRY_AFTER_SECONDS));
    expect(down.body).toMatchObject({ status: 'degraded', database: 'down' });
    expect((await request(app.app).get('/api/v1/health/ready')).status).toBe(503);
    const live = await request(app.app).get('/api/v1/health/live').expect(200);
    expect(live.body.status).toBe('ok');
    expect(live.body).not.toHaveProperty('database');
    expect(unhandled).toEqual([]); // an outage is not logged as an unhandled error

    // The database comes back on the same address: the same app and the same session work again.
    await proxy.start();
    let status = 0;
    for (let i = 0; i < 40 && status !== 200; i++) {
      status = (await request(app.app).get('/api/v1/health/ready')).status;
      if (status !== 200) await new Promise((r) => setTimeout(r, 250));
    }
    expect(status).toBe(200);
    const me = await agent.get('/api/v1/auth/me').expect(200);
    expect(me.body.email).toBe('outage@x.test');
    await agent
      .post('/api/v1/auth/sign-out')
      .set('x-csrf-token', csrf)
      .send({})
      .expect((r) => expect(r.status).toBeLessThan(300));
  });
});
