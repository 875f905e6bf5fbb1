/**
 * The compiled server (dist/api/server.js under plain node), measured:
 * - cold start: process spawn → first 200 from GET /api/v1/health, on a migrated database
 *   (target ≤ 1.5 s); one unmeasured start first (it creates the job queue's schema);
 * - load: 50 concurrent clients on loopback for 20 s, each signing in (its own client address via
 *   X-Forwarded-For, the server trusting one proxy as in production) and then looping over the
 *   Consensus board of a published 50-lab round, a draft save of its results in a collecting
 *   round, and GET /health (the trivial reference, measured in the same run). Target: 0 errors.
 * Invented data (api/src/testing fixtures). Bounded: 5 starts; 20 s of load; stops by itself.
 */
import { send, signIn } from './http-client';
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import net from 'node:net';
import { join } from 'node:path';
import { cleanResults, createBenchRound, enrol } from '../api/src/testing/bench-fixtures';
import { buildEvaluationFixture } from '../api/src/testing/evaluation-fixtures';
import { createUser, TEST_PASSWORD } from '../api/src/testing/test-app';
import { createTestDatabase } from '../db/testing';
import type { BenchRow } from './rows';

const ROOT = join(__dirname, '..');
/** The compiled server; RINGLET_BENCH_SERVER names another build (to compare two in one sitting). */
const SERVER = process.env['RINGLET_BENCH_SERVER'] || join(ROOT, 'dist/api/server.js');
const STARTS = 5;
const CLIENTS = 50;
const LOAD_SECONDS = 20;

function row(name: string, l: number[], target?: string, extra?: string): BenchRow {
  const t = [...l].sort((a, b) => a - b);
  const rank = (q: number) =>
    t.length ? t[Math.min(t.length - 1, Math.max(0, Math.ceil(q * t.length) - 1))]! : NaN;
  const r1 = (v: number) => Math.round(v * 10) / 10;
  return { name, median_ms: r1(rank(0.5)), p95_ms: r1(rank(0.95)), runs: l.length, target, extra };
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
    s.on('error', reject);
  });
}

/** Starts the compiled server on the database; resolves with the port once /health answers 200. */
async function startCompiled(
  url: string,
): Promise<{ child: ChildProcess; port: number; ms: number; phases: Record<string, number> }> {
  const port = await freePort();
  const t0 = performance.now();
  const child = spawn(process.execPath, [SERVER], {
    cwd: ROOT,
    stdio: ['ignore', 'pipe', 'inherit'],
    env: {
      ...process.env,
      DATABASE_URL: url,
      RINGLET_MODE: 'development',
      PORT: String(port),
      HOST: '127.0.0.1',
      LOG_LEVEL: 'info',
      TRUST_PROXY: 'true',
      NODE_ENV: 'production',
    },
  });
  let exited = false;
  let out = '';
  let phases: Record<string, number> = {};
  child.stdout!.on('data', (c: Buffer) => {
    out = (out + c.toString()).slice(-4000);
    const m = /"startupMs":(\{[^}]*\})/.exec(out);
    if (m) phases = JSON.parse(m[1]!) as Record<string, number>;
  });
  child.on('exit', () => (exited = true));
  while (!exited && performance.now() - t0 < 90_000) {
    const ok = await send(port, undefined, 'GET', '/api/v1/health').then(
      (r) => r.status === 200,
      () => false,
    );
    if (ok) {
      const ms = performance.now() - t0;
      await new Promise((r) => setTimeout(r, 50)); // the listening line
      child.stdout!.removeAllListeners('data');
      child.stdout!.resume();
      return { child, port, ms, phases };
    }
    await new Promise((r) => setTimeout(r, 5));
  }
  child.kill('SIGKILL');
  throw new Error(
    `the compiled server did not become healthy within 90 s${exited ? ` (it exited ${child.exitCode})` : ''}: ${out}`,
  );
}

async function stop(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null) return;
  await new Promise<void>((resolve) => {
    child.once('exit', () => resolve());
    child.kill('SIGTERM');
    setTimeout(() => child.kill('SIGKILL'), 15_000).unref();
  });
}

/** Signs in from its own address (the sign-in limits count per address). */
const signInFrom = (port: number, agent: http.Agent, email: string, address: string) =>
  signIn(port, agent, email, TEST_PASSWORD, { 'x-forwarded-for': address });

export async function benchRuntime(): Promise<BenchRow[]> {
  const build = spawnSync(process.execPath, [join(ROOT, 'scripts/server-build.mjs')], {
    cwd: ROOT,
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  if (build.status !== 0) throw new Error('server build failed');
  const db = await createTestDatabase();
  let child: ChildProcess | undefined;
  try {
    // Cold start.
    const first = await startCompiled(db.url); // creates the pgboss schema; not measured
    await stop(first.child);
    const starts: number[] = [];
    const modules: number[] = [];
    for (let i = 0; i < STARTS; i++) {
      const s = await startCompiled(db.url);
      starts.push(s.ms);
      if (s.phases['modules'] !== undefined) modules.push(s.phases['modules']);
      await stop(s.child);
    }
    const cold = row(
      'cold start → first healthy answer (node dist/api/server.js)',
      starts,
      '≤ 1500 ms',
      `median module loading ${row('', modules).median_ms} ms (startupMs in the listening log line has every phase)`,
    );

    // Load: a published 50-lab round (its board) and a collecting round (draft saves).
    const fx = await buildEvaluationFixture(db.ds, { participants: CLIENTS, seed: 7 });
    const collecting = await createBenchRound(db.ds);
    await createUser(db.ds, { email: 'coordinator@load.test', roles: ['coordinator'] });
    for (const [i, lab] of fx.labs.entries()) {
      await createUser(db.ds, { email: `lab${i}@load.test`, lab: lab.id, manager: true });
      await enrol(db.ds, collecting.round.id, lab.id, `L${String(i).padStart(4, '0')}`);
    }
    const s = await startCompiled(db.url);
    child = s.child;
    const port = s.port;
    const setup = new http.Agent({ keepAlive: true, maxSockets: 1 });
    const coord = await signInFrom(port, setup, 'coordinator@load.test', '10.9.0.1');
    for (const step of ['evaluation', 'evaluation/commit', 'publish']) {
      const r = await send(
        port,
        setup,
        'POST',
        `/api/v1/rounds/${fx.round.id}/${step}`,
        { cookie: coord.cookie, 'x-csrf-token': coord.csrf, 'x-forwarded-for': '10.9.0.1' },
        '{}',
      );
      if (r.status >= 300) throw new Error(`${step}: ${r.status} ${r.body}`);
    }
    setup.destroy();

    const lat = {
      signIn: [] as number[],
      board: [] as number[],
      draft: [] as number[],
      health: [] as number[],
    };
    const errors: string[] = [];
    const draftBody = cleanResults(collecting);
    // All 50 sign in at once (each from its own address), then 20 s of board, draft save and /health.
    const clients = await Promise.all(
      fx.labs.map(async (_lab, i) => {
        const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
        const address = `10.8.${Math.floor(i / 250)}.${(i % 250) + 1}`;
        const t0 = performance.now();
        try {
          const session = await signInFrom(port, agent, `lab${i}@load.test`, address);
          lat.signIn.push(performance.now() - t0);
          return { agent, address, session };
        } catch (err) {
          errors.push(String(err));
          agent.destroy();
          return null;
        }
      }),
    );
    const started = performance.now();
    const until = started + LOAD_SECONDS * 1000;
    await Promise.all(
      clients.map(async (c) => {
        if (!c) return;
        const { agent, address, session } = c;
        try {
          let t0: number;
          const h = { cookie: session.cookie, 'x-forwarded-for': address };
          let revision = 0;
          while (performance.now() < until) {
            t0 = performance.now();
            const b = await send(port, agent, 'GET', `/api/v1/rounds/${fx.round.id}/board`, h);
            lat.board.push(performance.now() - t0);
            if (b.status !== 200) errors.push(`board ${b.status}`);
            t0 = performance.now();
            const d = await send(
              port,
              agent,
              'PUT',
              `/api/v1/rounds/${collecting.round.id}/submission`,
              { ...h, 'x-csrf-token': session.csrf },
              JSON.stringify({ data: draftBody, baseRevision: revision }),
            );
            lat.draft.push(performance.now() - t0);
            if (d.status !== 200) errors.push(`draft ${d.status} ${d.body.slice(0, 120)}`);
            else revision = (JSON.parse(d.body) as { draftRevision: number }).draftRevision;
            t0 = performance.now();
            const hr = await send(port, agent, 'GET', '/api/v1/health', h);
            lat.health.push(performance.now() - t0);
            if (hr.status !== 200) errors.push(`health ${hr.status}`);
          }
        } catch (err) {
          errors.push(String(err));
        } finally {
          agent.destroy();
        }
      }),
    );
    const seconds = (performance.now() - started) / 1000;
    const total = lat.signIn.length + lat.board.length + lat.draft.length + lat.health.length;
    const note = `${errors.length} errors of ${total} requests; load phase ${seconds.toFixed(0)} s${errors.length ? ` (first: ${errors[0]})` : ''}`;
    return [
      cold,
      row(
        `load: sign-in, ${CLIENTS} clients at once (bcrypt cost 12)`,
        lat.signIn,
        '0 errors',
        note,
      ),
      row(
        `load: GET /rounds/{id}/board (lab view, ${CLIENTS} labs), ${CLIENTS} clients, ${LOAD_SECONDS} s`,
        lat.board,
        '0 errors',
      ),
      row(
        `load: PUT /rounds/{id}/submission (draft save), ${CLIENTS} clients, ${LOAD_SECONDS} s`,
        lat.draft,
        '0 errors',
      ),
      row(
        `load: GET /health in the same run (trivial reference)`,
        lat.health,
        undefined,
        `${(lat.health.length / seconds).toFixed(0)} req/s`,
      ),
    ];
  } finally {
    if (child) await stop(child);
    await db.drop();
  }
}
