import fc from 'fast-check';
import type { ZodType } from 'zod';
import type { Role } from '../../../shared/contracts/auth';
import { createBenchRound, enrol } from '../testing/bench-fixtures';
import { buildEvaluationFixture } from '../testing/evaluation-fixtures';
import {
  client,
  createLab,
  createUser,
  signedIn,
  startTestApp,
  type Client,
  type TestApp,
} from '../testing/test-app';
import type { AnyRoute } from './route';

/**
 * Property-based fuzzing of every JSON request schema against the running API, generated from the
 * route declarations (ApiRouter). For each route, as a role allowed to call it, one field at a time
 * of a valid request is replaced by a hostile value (NUL, lone surrogates, control characters,
 * 1e308, 1e-320, wrong types, a 100,000-character string, empty objects). Asserted: never a 5xx; a
 * 400 names the field; and a refused request leaves every stored table as it was (checksum).
 * Seeded and bounded (a few requests per route). Multipart upload routes are left out.
 */

// ---------------------------------------------------------------- a valid request from a schema

const UUID = '00000000-0000-4000-8000-000000000000';

interface ZodDef {
  type: string;
  format?: string;
  shape?: Record<string, ZodType>;
  element?: ZodType;
  innerType?: ZodType;
  in?: ZodType;
  out?: ZodType;
  options?: ZodType[];
  entries?: Record<string, string>;
  values?: unknown[];
}
const defOf = (s: ZodType): ZodDef => (s as unknown as { _zod: { def: ZodDef } })._zod.def;
const valid = (s: ZodType, v: unknown) => s.safeParse(v).success;
const firstValid = (s: ZodType, candidates: unknown[]) => candidates.find((c) => valid(s, c));

/** A value the schema accepts, found by walking it (best effort: undefined when none is found). */
function sample(s: ZodType, depth = 0): unknown {
  if (depth > 12) return undefined;
  const d = defOf(s);
  switch (d.type) {
    case 'object': {
      const out: Record<string, unknown> = {};
      for (const [k, v] of Object.entries(d.shape ?? {})) {
        const x = sample(v, depth + 1);
        if (x !== undefined) out[k] = x;
      }
      return out;
    }
    case 'optional':
    case 'default':
    case 'prefault':
    case 'readonly':
    case 'catch':
      return sample(d.innerType!, depth + 1);
    case 'nullable': {
      const x = sample(d.innerType!, depth + 1);
      return x === undefined ? null : x;
    }
    case 'pipe':
      return firstValid(s, [sample(d.in!, depth + 1), sample(d.out!, depth + 1)]);
    case 'string': {
      const byFormat: Record<string, unknown> = {
        uuid: UUID,
        email: 'fuzz@example.test',
        date: '2026-06-01',
        datetime: '2026-06-01T12:00:00Z',
      };
      if (d.format && byFormat[d.format]) return byFormat[d.format];
      return firstValid(s, [
        'Fuzz text',
        'fuzz_key',
        'FUZZ-1',
        'A',
        'EUR',
        'abcdefghij',
        'x'.repeat(43),
        '',
      ]);
    }
    case 'number':
      return firstValid(s, [1, 25, 0.5, 2, 100, 0.05, 0]);
    case 'boolean':
      return false;
    case 'enum':
      return Object.values(d.entries ?? {})[0];
    case 'literal':
      return d.values?.[0];
    case 'array': {
      const el = sample(d.element!, depth + 1);
      return firstValid(s, [[], [el], [el, el], [el, el, el]]) ?? [el];
    }
    case 'union':
      for (const o of d.options ?? []) {
        const x = sample(o, depth + 1);
        if (valid(o, x)) return x;
      }
      return undefined;
    default:
      return undefined;
  }
}

/** Paths of every leaf (string, number, boolean, null) of a sampled value, e.g. `items.0.code`. */
function leaves(v: unknown, prefix: string[] = []): string[][] {
  if (v !== null && typeof v === 'object') {
    const out: string[][] = [];
    for (const [k, c] of Object.entries(v)) out.push(...leaves(c, [...prefix, k]));
    return out.length ? out : [prefix];
  }
  return [prefix];
}

function withValue(base: unknown, path: string[], value: unknown): unknown {
  if (path.length === 0) return value;
  // A JSON copy: sampled arrays repeat one element object, which must not stay shared.
  const copy = JSON.parse(JSON.stringify(base)) as Record<string, unknown>;
  let cur = copy;
  for (const k of path.slice(0, -1)) cur = cur[k] as Record<string, unknown>;
  cur[path[path.length - 1]!] = value;
  return copy;
}

// ---------------------------------------------------------------- hostile values

/** Values no field accepts (each must answer 400 naming the field). */
const alwaysInvalid = fc.constantFrom<unknown>(
  '\u0000',
  'ok\u0000ok',
  '\ud800',
  'a\udfffb',
  'bell\u0007',
  'esc\u001b[31m',
  'del\u007f',
  1e308,
  -1e308,
  'x'.repeat(100_001),
);
/** Values that may or may not be valid for a field (only: no 5xx, and a refusal changes nothing). */
const maybeInvalid = fc.oneof(
  fc.constantFrom<unknown>(
    1e-320,
    -0,
    0,
    -1,
    Number.MAX_SAFE_INTEGER + 2,
    {},
    [],
    null,
    true,
    'NaN',
    'Infinity',
    '',
    ' ',
  ),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer(),
  fc.string({ maxLength: 30 }),
  fc.string({ unit: 'binary', maxLength: 10 }),
  fc.jsonValue({ maxDepth: 2 }),
);

// ---------------------------------------------------------------- the walk

const isMultipart = (r: AnyRoute) => /multipart/i.test(r.summary);
const ROLE_ORDER: readonly Role[] = ['coordinator', 'lab', 'admin', 'assessor'];

describe('fuzzing every request schema', () => {
  let t: TestApp;
  const clients = new Map<Role | 'anonymous', Client>();
  let coordinatorId = '';

  const fill = (path: string, value?: string) =>
    '/api/v1' +
    path.replace(
      /\{(\w+)\}/g,
      (_m, name: string) => value ?? (name === 'token' ? 'x'.repeat(43) : UUID),
    );

  function callerOf(r: AnyRoute): Client {
    if (r.access === 'public') return clients.get('anonymous')!;
    if (r.access === 'signed-in') return clients.get('admin')!;
    const role = ROLE_ORDER.find((x) => (r.access as readonly Role[]).includes(x))!;
    return clients.get(role)!;
  }

  /** One checksum of every stored table except the session store and the sign-in counters. */
  let checksumSql = '';
  async function checksum(): Promise<string> {
    const [row] = (await t.ds.query(checksumSql)) as { sum: string }[];
    return row!.sum;
  }

  let last = '';
  const failures: string[] = [];

  /** Sends one request; checks no 5xx, a named field on 400, and no change after a refusal. */
  async function probe(
    r: AnyRoute,
    where: 'body' | 'query',
    value: unknown,
    expectField?: string,
    url = fill(r.path),
  ): Promise<number> {
    const c = callerOf(r);
    let req = c.agent[r.method](url).set('x-csrf-token', c.csrf);
    if (where === 'query') req = req.query(value as Record<string, string>);
    const res = where === 'body' ? await req.send(value as object) : await req;
    const label = `${r.method.toUpperCase()} ${r.path} ${where}=${JSON.stringify(value)?.slice(0, 120)}`;
    if (res.status >= 500) failures.push(`${label} → ${res.status} ${JSON.stringify(res.body)}`);
    if (res.status === 400) {
      const details = (res.body?.error?.details ?? []) as { path: string }[];
      if (
        !Array.isArray(details) ||
        details.length === 0 ||
        !details.every((d) => typeof d.path === 'string' && d.path.length > 0)
      ) {
        failures.push(`${label} → 400 without a named field: ${JSON.stringify(res.body)}`);
      } else if (
        expectField !== undefined &&
        !details.some((d) => d.path === expectField || d.path.startsWith(expectField + '.'))
      ) {
        failures.push(
          `${label} → 400 names ${details.map((d) => d.path).join(', ')}, not ${expectField}`,
        );
      }
    } else if (expectField !== undefined) {
      failures.push(`${label} → ${res.status}, expected 400 naming ${expectField}`);
    }
    const now = await checksum();
    if (res.status >= 400 && now !== last)
      failures.push(`${label} → ${res.status} but stored data changed`);
    last = now;
    return res.status;
  }

  let routes: AnyRoute[] = [];
  /** Real objects for the second pass, so hostile values reach the services and not only a 404. */
  const real: Record<string, string> = {};

  /** The path with real ids: a draft round for design routes, a collecting round for lab and enrolment routes, a closed one for the evaluation. */
  function fillReal(path: string): string {
    const round = /\/(evaluation|publish|reissue|board)/.test(path)
      ? real['closedRound']
      : /^\/my\/|\/(submission|receipt|enrolments)/.test(path)
        ? real['collectingRound']
        : real['draftRound'];
    const byName: Record<string, string | undefined> = {
      itemId: real['itemId'],
      measurandId: real['measurandId'],
      enrolmentId: real['enrolmentId'],
      token: 'x'.repeat(43),
    };
    return (
      '/api/v1' +
      path.replace(/\{(\w+)\}/g, (_m, name: string) => {
        if (name !== 'id') return byName[name] ?? UUID;
        if (path.startsWith('/rounds/') || path.startsWith('/my/rounds/')) return round!;
        if (path.startsWith('/labs/')) return real['labId']!;
        if (path.startsWith('/admin/users/')) return real['victimUser']!;
        if (path.startsWith('/admin/organisations/')) return real['victimOrg']!;
        return UUID;
      })
    );
  }

  beforeAll(async () => {
    t = await startTestApp();
    const lab = await createLab(t.ds, 'Fuzz Lab');
    await createUser(t.ds, { email: 'admin@fuzz.test', roles: ['admin'] });
    coordinatorId = (
      await createUser(t.ds, { email: 'coordinator@fuzz.test', roles: ['coordinator'] })
    ).id;
    await createUser(t.ds, { email: 'assessor@fuzz.test', roles: ['assessor'] });
    await createUser(t.ds, { email: 'lab@fuzz.test', lab: lab.id, manager: true });
    real['labId'] = lab.id;
    real['victimUser'] = (
      await createUser(t.ds, { email: 'victim@fuzz.test', roles: ['assessor'] })
    ).id;
    real['victimOrg'] = (await createLab(t.ds, 'Victim Lab')).id;
    const draft = await createBenchRound(t.ds, { state: 'draft' });
    real['draftRound'] = draft.round.id;
    real['itemId'] = draft.items[0]!.id;
    real['measurandId'] = draft.zAverage.id;
    const collecting = await createBenchRound(t.ds, { state: 'collecting' });
    real['collectingRound'] = collecting.round.id;
    real['enrolmentId'] = (await enrol(t.ds, collecting.round.id, lab.id, 'P01')).id;
    real['closedRound'] = (
      await buildEvaluationFixture(t.ds, { participants: 12, seed: 3, withUncertainty: true })
    ).round.id;
    for (const role of ['admin', 'coordinator', 'assessor', 'lab'] as const)
      clients.set(role, await signedIn(t, `${role}@fuzz.test`));
    clients.set('anonymous', await client(t));
    const tables = (await t.ds.query(
      `SELECT quote_ident(table_name) AS t FROM information_schema.tables
        WHERE table_schema = 'public' AND table_type = 'BASE TABLE' AND table_name NOT IN ('session', 'rate_limit', 'migrations')
        ORDER BY table_name`,
    )) as { t: string }[];
    // A refused sign-in is meant to leave a trace: the audit rows of refusals are left out.
    const refusals = `r.action NOT IN ('auth.sign-in-failed', 'auth.sign-in-refused', 'auth.locked-out', 'auth.rate-limited')`;
    checksumSql =
      'SELECT md5(' +
      tables
        .map(
          (x) =>
            `coalesce((SELECT md5(string_agg(r::text, '|' ORDER BY r::text)) FROM ${x.t} r${x.t === 'audit_event' ? ` WHERE ${refusals}` : ''}), '-')`,
        )
        .join(` || `) +
      ') AS sum';
    last = await checksum();
    routes = t.routes.filter((r) => !isMultipart(r) && !r.produces && (r.body || r.query));
  });
  afterAll(() => t.close());

  it('finds the JSON routes and a valid request for most of them', () => {
    const withBody = routes.filter((r) => r.body);
    const validBase = withBody.filter((r) => valid(r.body!, sample(r.body!)));
    const invalid = withBody
      .filter((r) => !validBase.includes(r))
      .map(
        (r) =>
          `${r.method} ${r.path}: ${JSON.stringify(r.body!.safeParse(sample(r.body!)).error?.issues.slice(0, 2))}`,
      );
    if (process.env['FUZZ_VERBOSE']) console.log(invalid.join('\n'));
    expect(withBody.length).toBeGreaterThan(30);
    // The generator must build a valid body for most routes, or the field checks below test little.
    expect(validBase.length / withBody.length).toBeGreaterThan(0.8);
  });

  it('refuses NUL and lone surrogates in every body field with 400 naming the field (the edge rule)', async () => {
    let checked = 0;
    for (const r of routes.filter((x) => x.body)) {
      const base = sample(r.body!);
      if (!valid(r.body!, base)) continue;
      for (const [i, path] of leaves(base).slice(0, 8).entries()) {
        if (path.length === 0) continue;
        await probe(
          r,
          'body',
          withValue(base, path, i % 2 === 0 ? 'a\u0000' : 'b\ud800'),
          path.join('.'),
        );
        checked++;
      }
    }
    expect(failures).toEqual([]);
    expect(checked).toBeGreaterThan(100);
  }, 120_000);

  it('refuses control characters in query fields and path parameters, naming them', async () => {
    let checked = 0;
    for (const r of t.routes.filter((x) => !isMultipart(x))) {
      if (r.query) {
        const base = sample(r.query) as Record<string, unknown>;
        for (const k of Object.keys(base ?? {})) {
          await probe(r, 'query', { ...base, [k]: 'a\u0000' }, `query.${k}`);
          checked++;
        }
      }
      const param = /\{(\w+)\}/.exec(r.path)?.[1];
      if (param && r.params) {
        const c = callerOf(r);
        const res = await c.agent[r.method](fill(r.path, encodeURIComponent('\u0000')))
          .set('x-csrf-token', c.csrf)
          .send({});
        if (
          res.status !== 400 ||
          !res.body.error.details?.some((d: { path: string }) => d.path.startsWith('params.'))
        ) {
          failures.push(
            `${r.method} ${r.path} with NUL in {${param}} → ${res.status} ${JSON.stringify(res.body)}`,
          );
        }
        checked++;
      }
    }
    expect(failures).toEqual([]);
    expect(checked).toBeGreaterThan(30);
  }, 120_000);

  it('never answers 5xx to hostile field values; a refusal names the field and stores nothing', async () => {
    let checked = 0;
    for (const [ri, r] of routes.filter((x) => x.body).entries()) {
      const base = sample(r.body!);
      const baseValid = valid(r.body!, base);
      const paths = leaves(base);
      const cases = fc.sample(
        fc.tuple(
          fc.nat({ max: paths.length - 1 }),
          fc.oneof(
            alwaysInvalid.map((v) => ({ v, always: true })),
            maybeInvalid.map((v) => ({ v, always: false })),
          ),
        ),
        { numRuns: 12, seed: 20261203 + ri },
      );
      for (const [pi, { v, always }] of cases) {
        const path = paths[pi]!;
        await probe(
          r,
          'body',
          withValue(base, path, v),
          baseValid && always && path.length > 0 ? path.join('.') : undefined,
        );
        checked++;
      }
      // Whole bodies of arbitrary JSON, and the empty object.
      for (const body of [
        {},
        [],
        ...fc.sample(fc.dictionary(fc.string({ maxLength: 12 }), fc.jsonValue({ maxDepth: 3 })), {
          numRuns: 2,
          seed: 7 + ri,
        }),
      ]) {
        await probe(r, 'body', body);
        checked++;
      }
    }
    expect(failures).toEqual([]);
    expect(checked).toBeGreaterThan(200);
  }, 120_000);

  it('never answers 5xx against real rounds, items, enrolments and users; refusals store nothing', async () => {
    let checked = 0;
    const tally = new Map<number, number>();
    for (const [ri, r] of routes.entries()) {
      const url = fillReal(r.path);
      if (r.body) {
        const base = sample(r.body);
        const paths = leaves(base);
        const cases = fc.sample(
          fc.tuple(fc.nat({ max: paths.length - 1 }), fc.oneof(alwaysInvalid, maybeInvalid)),
          { numRuns: 8, seed: 99 + ri },
        );
        // The valid request first (it reaches the service), then one hostile field at a time.
        const baseStatus = await probe(r, 'body', base, undefined, url);
        tally.set(baseStatus, (tally.get(baseStatus) ?? 0) + 1);
        for (const [pi, v] of cases) {
          const status = await probe(r, 'body', withValue(base, paths[pi]!, v), undefined, url);
          tally.set(status, (tally.get(status) ?? 0) + 1);
          checked++;
        }
      } else if (r.query) {
        const base = (sample(r.query) ?? {}) as Record<string, unknown>;
        for (const v of fc.sample(
          fc.oneof(
            fc.string({ maxLength: 20 }),
            fc.constantFrom('\u0000', 'x'.repeat(5000), '-1', '1e308'),
          ),
          { numRuns: 4, seed: 5 + ri },
        )) {
          for (const k of Object.keys(base)) {
            await probe(r, 'query', { ...base, [k]: v }, undefined, url);
            checked++;
          }
        }
      }
    }
    if (process.env['FUZZ_VERBOSE'])
      console.log(
        [...tally]
          .sort()
          .map(([k, n]) => `${k}: ${n}`)
          .join(', '),
      );
    expect(failures).toEqual([]);
    expect(checked).toBeGreaterThan(250);
    // The values reached the services: some were accepted, some refused by a rule there.
    expect([...tally].filter(([k]) => k < 300).reduce((a, [, n]) => a + n, 0)).toBeGreaterThan(8);
  }, 180_000);

  it('shows the declared ranges in the OpenAPI document', async () => {
    const doc = (await clients.get('anonymous')!.agent.get('/api/v1/openapi.json').expect(200))
      .body as {
      paths: Record<string, Record<string, { requestBody?: unknown }>>;
    };
    const bodies = Object.values(doc.paths).flatMap((ops) =>
      Object.values(ops)
        .map((op) => op.requestBody)
        .filter(Boolean),
    );
    /** The first schema of a property with this name in a request body (nullable unwrapped). */
    const prop = (name: string): Record<string, unknown> => {
      const stack: unknown[] = [...bodies].reverse();
      while (stack.length) {
        const v = stack.pop();
        if (!v || typeof v !== 'object') continue;
        const props = (v as { properties?: Record<string, unknown> }).properties;
        if (props && props[name]) {
          const p = props[name] as { anyOf?: Record<string, unknown>[] };
          return p.anyOf
            ? p.anyOf.find((x) => x['type'] !== 'null')!
            : (p as Record<string, unknown>);
        }
        stack.push(...Object.values(v));
      }
      throw new Error(`no property ${name}`);
    };
    expect(prop('pdi')).toMatchObject({ minimum: 0, maximum: 1 });
    expect(prop('zAverageNm')).toMatchObject({ minimum: 0.3, maximum: 10_000 });
    expect(prop('viscosityMPas')).toMatchObject({ minimum: 0.2, maximum: 100 });
    expect(prop('temperatureC')).toMatchObject({ minimum: 0, maximum: 95 });
    expect(prop('nominalSizeNm')).toMatchObject({ minimum: 0.3, maximum: 10_000 });
    expect(prop('value')['description']).toEqual(expect.stringContaining('between') as unknown);
    expect(String(prop('resultsDueAt')['description'])).toContain('2000-01-01');
    expect(String(prop('endsOn')['description'])).toContain('2100-12-31');
  });

  it('answers PATCH of a user with an empty body with 400, not 500', async () => {
    const admin = clients.get('admin')!;
    const res = await admin.agent
      .patch(`/api/v1/admin/users/${coordinatorId}`)
      .set('x-csrf-token', admin.csrf)
      .send({});
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('(body)');
  });
});
