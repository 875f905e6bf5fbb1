import type { Role } from '../../../shared/contracts/auth';
import { client, startCast, type Client, type TestApp } from '../testing/test-app';

/**
 * Walks every route the app declares: anonymous callers get 401 on everything that is not public,
 * and a signed-in user without the route's role gets 403. New routes are covered automatically.
 */
describe('authorization of every route', () => {
  let t: TestApp;
  const clients = new Map<Role, Client>();
  beforeAll(async () => {
    const cast = await startCast({
      labs: ['Walk Lab'],
      users: [
        ...(['admin', 'coordinator', 'assessor'] as const).map((role) => ({
          email: `${role}@walk.test`,
          roles: [role],
          signIn: true,
        })),
        { email: 'lab@walk.test', lab: 0, signIn: true },
      ],
    });
    t = cast.t;
    for (const role of ['admin', 'coordinator', 'assessor', 'lab'] as const) {
      clients.set(role, cast.as(`${role}@walk.test`));
    }
  });
  afterAll(() => t.close());

  const fill = (path: string) =>
    '/api/v1' +
    path.replace(/\{(\w+)\}/g, (_m, name: string) =>
      name === 'token' ? 'x'.repeat(43) : '00000000-0000-4000-8000-000000000000',
    );

  it('declares a healthy number of routes', () => {
    expect(t.routes.length).toBeGreaterThan(15);
  });

  it('answers 401 to anonymous callers on every non-public route', async () => {
    const anon = await client(t);
    const checked: string[] = [];
    for (const r of t.routes.filter((x) => x.access !== 'public')) {
      const res = await anon.agent[r.method](fill(r.path)).set('x-csrf-token', anon.csrf).send({});
      expect({ route: `${r.method} ${r.path}`, status: res.status }).toEqual({
        route: `${r.method} ${r.path}`,
        status: 401,
      });
      checked.push(r.path);
    }
    expect(checked.length).toBeGreaterThan(10);
  });

  it('answers 403 to every role a route does not admit', async () => {
    let checked = 0;
    for (const r of t.routes) {
      if (!Array.isArray(r.access)) continue;
      const access = r.access as readonly Role[];
      for (const [role, c] of clients) {
        if (access.includes(role)) continue;
        const res = await c.agent[r.method](fill(r.path)).set('x-csrf-token', c.csrf).send({});
        expect({
          route: `${r.method} ${r.path}`,
          role,
          status: res.status,
          code: res.body?.error?.code,
        }).toEqual({
          route: `${r.method} ${r.path}`,
          role,
          status: 403,
          code: 'forbidden',
        });
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(10);
  });

  it('lists every route in the OpenAPI document', async () => {
    const res = await (await client(t)).agent.get('/api/v1/openapi.json').expect(200);
    for (const r of t.routes) {
      expect(res.body.paths[`/api/v1${r.path}`]?.[r.method]).toBeDefined();
    }
    expect(res.body.openapi).toBe('3.1.0');
  });

  it('serves a readable API reference', async () => {
    const res = await (await client(t)).agent.get('/api/docs').expect(200);
    expect(res.text).toContain('/api/v1/auth/sign-in');
    expect(res.headers['content-security-policy']).toContain("script-src 'self'");
  });

  it('answers unknown API routes with the problem body', async () => {
    const res = await (await client(t)).agent.get('/api/v1/no-such-thing').expect(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('reports health with the database', async () => {
    const res = await (await client(t)).agent.get('/api/v1/health').expect(200);
    expect(res.body).toMatchObject({ status: 'ok', database: 'up', mode: 'test' });
  });
});
