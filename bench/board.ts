/**
 * Consensus board API under load (docs/QUALITY.md: 1,000 participants, 20 concurrent clients on
 * loopback, p95 ≤ 60 ms and ≥ 30 % of the throughput of a trivial JSON endpoint in the same run).
 *
 * Builds a 1,000 × 2 × 2 × 3 round (api/src/testing/evaluation-fixtures, seeded, invented data)
 * in a fresh test database, evaluates and publishes it through the API, starts the app in a
 * child process on 127.0.0.1, and fires a bounded number of requests from 20 signed-in
 * keep-alive clients: GET /rounds/{id}/board (coordinator and lab views) and GET /health, each
 * accepting gzip as a browser does (the KiB in the notes are the bytes on the wire).
 * Bounded in count and time; stops by itself.
 */
import { send, signIn, type Session } from './http-client';
import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import { join } from 'node:path';
import { buildEvaluationFixture } from '../api/src/testing/evaluation-fixtures';
import { createUser } from '../api/src/testing/test-app';
import { createTestDatabase } from '../db/testing';
import { evaluateRecord } from '../shared/evaluation/evaluate';
import { loadRoundInput } from '../api/src/services/evaluation';
import { stopServer, type BenchRow } from './rows';

const CLIENTS = 20;
const PARTICIPANTS = 1000;
const REQUESTS = { board: 1200, health: 3000 } as const;
const TIME_LIMIT_MS = 60_000;

const signInBench = (port: number, agent: http.Agent, email: string): Promise<Session> =>
  signIn(port, agent, email, 'correct horse battery');

/** Closed-loop load: CLIENTS workers, each with its own session and keep-alive socket. */
/** Like `send` (./http-client.ts), but only counts the body's bytes: a load generator (as wrk) does not decode. */
function fetchCounting(
  port: number,
  agent: http.Agent,
  path: string,
  headers: Record<string, string>,
): Promise<{ status: number; bytes: number }> {
  return new Promise((resolve, reject) => {
    const req = http.request(
      { host: '127.0.0.1', port, method: 'GET', path, agent, headers },
      (res) => {
        let bytes = 0;
        res.on('data', (c: Buffer) => (bytes += c.length));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, bytes }));
        res.on('error', reject);
      },
    );
    req.on('error', reject);
    req.end();
  });
}

async function load(
  port: number,
  sessions: Session[],
  path: string,
  total: number,
): Promise<{ latencies: number[]; seconds: number; bytes: number }> {
  const latencies: number[] = [];
  let issued = 0;
  let bytes = 0;
  const started = performance.now();
  await Promise.all(
    sessions.map(async (s) => {
      const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
      while (issued < total && performance.now() - started < TIME_LIMIT_MS) {
        issued++;
        const t0 = performance.now();
        // As a browser asks: it always accepts gzip (the board answers compressed; /health is tiny).
        const r = await fetchCounting(port, agent, path, {
          cookie: s.cookie,
          'accept-encoding': 'gzip, deflate, br',
        });
        latencies.push(performance.now() - t0);
        if (r.status !== 200) throw new Error(`${path}: ${r.status}`);
        bytes = r.bytes;
      }
      agent.destroy();
    }),
  );
  return { latencies, seconds: (performance.now() - started) / 1000, bytes };
}

function stats(
  name: string,
  l: number[],
  seconds: number,
  target?: string,
  extra?: string,
): BenchRow & { rps: number } {
  const t = [...l].sort((a, b) => a - b);
  const rank = (q: number) => t[Math.min(t.length - 1, Math.max(0, Math.ceil(q * t.length) - 1))]!;
  const r3 = (v: number) => Math.round(v * 1000) / 1000;
  const rps = l.length / seconds;
  return {
    name,
    median_ms: r3(rank(0.5)),
    p95_ms: r3(rank(0.95)),
    runs: l.length,
    rps,
    target,
    extra: `${rps.toFixed(0)} req/s${extra ? '; ' + extra : ''}`,
  };
}

function startServer(url: string): Promise<{ child: ChildProcess; port: number }> {
  return new Promise((resolve, reject) => {
    const child = spawn(
      process.execPath,
      ['--import', 'tsx', join(__dirname, 'board-server.ts'), url],
      {
        stdio: ['ignore', 'pipe', 'inherit'],
        env: { ...process.env, NODE_ENV: 'production' },
      },
    );
    let out = '';
    child.stdout!.on('data', (c: Buffer) => {
      out += c.toString();
      const m = /PORT (\d+)/.exec(out);
      if (m) resolve({ child, port: Number(m[1]) });
    });
    child.on('exit', (code) => reject(new Error(`board server exited ${code}`)));
  });
}

export async function benchBoard(): Promise<BenchRow[]> {
  const db = await createTestDatabase();
  let child: ChildProcess | undefined;
  try {
    const fx = await buildEvaluationFixture(db.ds, {
      participants: PARTICIPANTS,
      seed: 42,
      blunders: { 5: 2, 17: 1.25 },
      withUncertainty: true,
    });
    await createUser(db.ds, { email: 'coordinator@bench.test', roles: ['coordinator'] });
    await createUser(db.ds, { email: 'lab@bench.test', lab: fx.labs[0]!.id, manager: true });

    // The evaluation itself, in process (docs/QUALITY.md target ≤ 20 ms).
    const loaded = await loadRoundInput(db.ds.manager, fx.round.id);
    const evalTimes: number[] = [];
    for (let i = 0; i < 40; i++) {
      const t0 = performance.now();
      evaluateRecord(loaded.input);
      if (i >= 10) evalTimes.push(performance.now() - t0);
    }

    const server = await startServer(db.url);
    child = server.child;
    const port = server.port;
    const setupAgent = new http.Agent({ keepAlive: true });
    const coord = await signInBench(port, setupAgent, 'coordinator@bench.test');
    const base = `/api/v1/rounds/${fx.round.id}`;
    const post = async (p: string) => {
      const r = await send(
        port,
        setupAgent,
        'POST',
        p,
        { cookie: coord.cookie, 'x-csrf-token': coord.csrf },
        '{}',
      );
      if (r.status >= 300) throw new Error(`${p}: ${r.status} ${r.body}`);
    };
    await post(`${base}/evaluation`);
    await post(`${base}/evaluation/commit`);
    await post(`${base}/publish`);

    // One session per role shared by the 20 clients (each with its own keep-alive connection):
    // the sign-in rate limit stops 40 sign-ins from one address, as it should.
    const lab = await signInBench(port, setupAgent, 'lab@bench.test');
    const coordSessions: Session[] = Array.from({ length: CLIENTS }, () => coord);
    const labSessions: Session[] = Array.from({ length: CLIENTS }, () => lab);
    setupAgent.destroy();

    // Warm-up (JIT, board cache, connection pools), not measured.
    await load(port, coordSessions, `${base}/board`, 200);
    await load(port, coordSessions, '/api/v1/health', 400);

    const health = await load(port, coordSessions, '/api/v1/health', REQUESTS.health);
    const board = await load(port, coordSessions, `${base}/board`, REQUESTS.board);
    const labBoard = await load(port, labSessions, `${base}/board`, REQUESTS.board);
    const h = stats(
      `GET /health, ${CLIENTS} signed-in clients (trivial JSON, reference)`,
      health.latencies,
      health.seconds,
    );
    const b = stats(
      `GET /rounds/{id}/board coordinator, ${PARTICIPANTS} participants, ${CLIENTS} clients`,
      board.latencies,
      board.seconds,
      'p95 ≤ 60 ms; ≥ 30 % of /health throughput',
      `${((100 * board.latencies.length) / board.seconds / h.rps).toFixed(0)} % of /health; ${(board.bytes / 1024).toFixed(0)} KiB`,
    );
    const l = stats(
      `GET /rounds/{id}/board lab view, ${PARTICIPANTS} participants, ${CLIENTS} clients`,
      labBoard.latencies,
      labBoard.seconds,
      'p95 ≤ 60 ms',
      `${((100 * labBoard.latencies.length) / labBoard.seconds / h.rps).toFixed(0)} % of /health`,
    );
    const e = stats(
      `evaluateRecord ${PARTICIPANTS}×2×2×3 (x_pt, σ_pt, z, z′, ζ, En, hints)`,
      evalTimes,
      1,
      '≤ 20 ms',
    );
    e.extra = undefined;
    return [e, h, b, l].map(({ rps: _rps, ...row }) => row);
  } finally {
    await stopServer(child);
    await db.drop();
  }
}
