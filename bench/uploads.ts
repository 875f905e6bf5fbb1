/**
 * Uploads under the limits (shared/contracts/upload-limits.ts): while the heaviest allowed uploads
 * are processed, GET /health must answer within 200 ms and the server's memory stays bounded.
 *
 * Starts the app in a child process (bench/board-server.ts) on a fresh test database, signs in a
 * lab user and, for each scenario, sends the upload(s) while a second client polls /health every
 * 10 ms and the server's resident memory (VmRSS in /proc/<pid>/status) is sampled every 20 ms.
 * Scenarios: the largest allowed results workbook (row and cell limits, just under the byte limit),
 * one row too many (413 before parsing), a 17.8 MB workbook upload (413 at the edge), a 19 MB
 * correlation CSV attachment, and two workbooks with the CSV at once. Invented data; stops by itself.
 */
import { send, signIn, type Answer } from './http-client';
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import http from 'node:http';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { ATTACHMENT_LIMIT, RESULTS_WORKBOOK_LIMIT } from '../shared/contracts/upload-limits';
import { createBenchRound, enrol } from '../api/src/testing/bench-fixtures';
import { createLab, createUser } from '../api/src/testing/test-app';
import { createTestDatabase } from '../db/testing';
import { stopServer, type BenchRow } from './rows';

const signInBench = (port: number, agent: http.Agent, email: string) =>
  signIn(port, agent, email, 'correct horse battery');

function multipart(name: string, filename: string, data: Buffer): { body: Buffer; type: string } {
  const b = `----ringletbench${randomBytes(8).toString('hex')}`;
  const body = Buffer.concat([
    Buffer.from(
      `--${b}\r\nContent-Disposition: form-data; name="${name}"; filename="${filename}"\r\nContent-Type: application/octet-stream\r\n\r\n`,
    ),
    data,
    Buffer.from(`\r\n--${b}--\r\n`),
  ]);
  return { body, type: `multipart/form-data; boundary=${b}` };
}

function rssMb(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) / 1024 : NaN;
}

function startServer(url: string): Promise<{ child: ChildProcess; port: number }> {
  return new Promise((resolve, reject) => {
    // BENCH_CPU_PROF=<dir> writes the server's CPU profile there (node --cpu-prof) to find what blocks.
    const prof = process.env['BENCH_CPU_PROF']
      ? ['--cpu-prof', `--cpu-prof-dir=${process.env['BENCH_CPU_PROF']}`]
      : [];
    const child = spawn(
      process.execPath,
      [...prof, '--import', 'tsx', join(__dirname, 'board-server.ts'), url],
      { stdio: ['ignore', 'pipe', 'inherit'], env: { ...process.env, NODE_ENV: 'production' } },
    );
    let out = '';
    child.stdout!.on('data', (c: Buffer) => {
      out += c.toString();
      const m = /PORT (\d+)/.exec(out);
      if (m) resolve({ child, port: Number(m[1]) });
    });
    child.on('exit', (code) => reject(new Error(`server exited ${code}`)));
  });
}

/** The largest allowed results workbook: the template's sheets filled to the row and cell limits. */
async function largestWorkbook(items: string[]): Promise<Buffer> {
  const limit = RESULTS_WORKBOOK_LIMIT;
  const wb = new ExcelJS.Workbook();
  const ws = wb.addWorksheet('Results');
  ws.addRow([
    'Item',
    'Measurand key',
    'Measurand',
    'Unit',
    'Run 1',
    'Run 2',
    'Run 3',
    'Uncertainty type',
    'Uncertainty',
    'k',
  ]);
  for (const code of items) {
    ws.addRow([code, 'z_average', 'Z-average', 'nm', 101, 102, 103, 'expanded', 2, 2]);
    ws.addRow([code, 'pdi', 'PDI', '1', 0.05, 0.06, 0.05, null, null, null]);
  }
  while (ws.rowCount < limit.maxRows) ws.addRow([null, null, null, null, 1, 2, 3, 4, 5, 6, 7, 8]);
  const notes = wb.addWorksheet('Notes');
  const perRow = Math.floor((limit.maxCells - 13_000) / limit.maxRows);
  for (let r = 0; r < limit.maxRows; r++)
    notes.addRow(Array.from({ length: perRow }, () => randomBytes(36).toString('base64')));
  return Buffer.from(await wb.xlsx.writeBuffer());
}

/** A workbook with `rows` small rows in one sheet (one row too many, or the 100,000). */
async function longWorkbook(rows: number): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  const ws = wb.addWorksheet('Results');
  ws.addRow(['Item', 'Measurand key', 'Measurand', 'Unit', 'Run 1']);
  for (let r = 1; r < rows; r++) ws.addRow([null, null, null, null, r]);
  return Buffer.from(await wb.xlsx.writeBuffer());
}

/** A correlation CSV of `bytes` size: lag time, g2 − 1 (invented single exponential). */
function correlationCsv(bytes: number): Buffer {
  const lines: string[] = ['lag time (s),g2-1'];
  let size = 18;
  for (let i = 0; size < bytes - 64; i++) {
    const line = `${(1e-7 * (1 + i)).toExponential(9)},${(0.9 * Math.exp(-i / 1e5)).toExponential(9)}`;
    lines.push(line);
    size += line.length + 1;
  }
  return Buffer.from(lines.join('\n'));
}

function rank(sorted: number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))] ?? NaN;
}

export async function benchUploads(): Promise<BenchRow[]> {
  const db = await createTestDatabase();
  let child: ChildProcess | undefined;
  try {
    const lab = await createLab(db.ds, 'Bench Upload Lab');
    await createUser(db.ds, { email: 'lab@uploads.bench', lab: lab.id });
    const round = await createBenchRound(db.ds, { code: 'UP-BENCH' });
    await enrol(db.ds, round.round.id, lab.id, 'P-001');
    const started = await startServer(db.url);
    child = started.child;
    const port = started.port;
    const pid = child.pid!;
    const agent = new http.Agent({ keepAlive: true, maxSockets: 8 });
    const healthAgent = new http.Agent({ keepAlive: true, maxSockets: 1 });
    const session = await signInBench(port, agent, 'lab@uploads.bench');
    // The multipart bodies are built before a scenario starts, so the client's own copying does not
    // count against the server's /health latency.
    const bodies = new Map<Buffer, { body: Buffer; type: string }>();
    const upload = (path: string, field: string, name: string, data: Buffer) => {
      let m = bodies.get(data);
      if (!m) bodies.set(data, (m = multipart(field, name, data)));
      return send(
        port,
        agent,
        'POST',
        `/api/v1/rounds/${round.round.id}${path}`,
        { cookie: session.cookie, 'x-csrf-token': session.csrf, 'content-type': m.type },
        m.body,
      );
    };

    process.stderr.write('  building the upload files…\n');
    const largest = await largestWorkbook(round.items.map((i) => i.code));
    const oneTooMany = await longWorkbook(RESULTS_WORKBOOK_LIMIT.maxRows + 1);
    const hundredK = await longWorkbook(100_000);
    const oversize = Buffer.concat([
      hundredK,
      randomBytes(Math.max(0, 17.8 * 1024 * 1024 - hundredK.length)),
    ]);
    const csv = correlationCsv(19 * 1024 * 1024);
    for (const b of [oneTooMany, hundredK, oversize, csv])
      bodies.set(b, multipart('file', 'upload', b));

    // Warm-up: one health call and one upload so the worker code is compiled once (tsx caches it).
    await send(port, healthAgent, 'GET', '/api/v1/health', {});
    await upload('/submission/upload.xlsx', 'file', 'warm.xlsx', largest);
    await new Promise((r) => setTimeout(r, 500));
    const idleRss = rssMb(pid);

    const rows: BenchRow[] = [];
    const scenario = async (
      name: string,
      work: () => Promise<Answer[]>,
      expect: number[],
    ): Promise<void> => {
      let done = false;
      const latencies: number[] = [];
      let peak = rssMb(pid);
      const sampler = setInterval(() => (peak = Math.max(peak, rssMb(pid))), 20);
      const poll = (async () => {
        while (!done) {
          const t0 = performance.now();
          const r = await send(port, healthAgent, 'GET', '/api/v1/health', {});
          if (r.status !== 200) throw new Error(`health ${r.status}`);
          latencies.push(performance.now() - t0);
          await new Promise((ok) => setTimeout(ok, 10));
        }
      })();
      const t0 = performance.now();
      const results = await work().finally(() => (done = true));
      const seconds = (performance.now() - t0) / 1000;
      await poll;
      clearInterval(sampler);
      const statuses = results.map((r) => r.status);
      if (statuses.join() !== expect.join()) {
        throw new Error(
          `${name}: status ${statuses.join()} (expected ${expect.join()}): ${results.map((r) => r.body.toString().slice(0, 300)).join(' | ')}`,
        );
      }
      const sorted = [...latencies].sort((a, b) => a - b);
      const r3 = (v: number) => Math.round(v * 1000) / 1000;
      rows.push({
        name: `/health during ${name}`,
        median_ms: r3(rank(sorted, 0.5)),
        p95_ms: r3(rank(sorted, 0.95)),
        runs: latencies.length,
        target: 'max ≤ 200 ms',
        extra: `max ${sorted[sorted.length - 1]!.toFixed(1)} ms; upload ${seconds.toFixed(2)} s → ${statuses.join(', ')}; server RSS peak ${peak.toFixed(0)} MB (idle ${idleRss.toFixed(0)} MB)`,
      });
      await new Promise((r) => setTimeout(r, 300));
    };

    const mb = (b: Buffer) => `${(b.length / 1024 / 1024).toFixed(2)} MB`;
    await scenario(
      'idle',
      async () => {
        await new Promise((r) => setTimeout(r, 1000));
        return [];
      },
      [],
    );
    await scenario(
      `largest allowed workbook (${RESULTS_WORKBOOK_LIMIT.maxRows} rows, ${mb(largest)})`,
      async () => [await upload('/submission/upload.xlsx', 'file', 'results.xlsx', largest)],
      [200],
    );
    await scenario(
      `workbook one row over the limit (${mb(oneTooMany)})`,
      async () => [await upload('/submission/upload.xlsx', 'file', 'results.xlsx', oneTooMany)],
      [413],
    );
    await scenario(
      `workbook of 100,000 rows (${mb(hundredK)})`,
      async () => [await upload('/submission/upload.xlsx', 'file', 'results.xlsx', hundredK)],
      [413],
    );
    await scenario(
      `17.8 MB workbook upload`,
      async () => [await upload('/submission/upload.xlsx', 'file', 'results.xlsx', oversize)],
      [413],
    );
    await scenario(
      `correlation CSV attachment (${mb(csv)}, limit ${ATTACHMENT_LIMIT.maxBytes / 1024 / 1024} MB)`,
      async () => [await upload('/submission/attachments', 'file', 'g2.csv', csv)],
      [201],
    );
    await scenario(
      'two largest workbooks and the 19 MB CSV at once',
      () =>
        Promise.all([
          upload('/submission/upload.xlsx', 'file', 'results.xlsx', largest),
          upload('/submission/upload.xlsx', 'file', 'results.xlsx', largest),
          upload('/submission/attachments', 'file', 'g2.csv', csv),
        ]),
      [200, 200, 201],
    );
    const hwm = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    rows.push({
      name: 'server RSS high-water mark over the whole run (VmHWM)',
      median_ms: NaN,
      p95_ms: NaN,
      runs: 1,
      extra: `${hwm ? (Number(hwm[1]) / 1024).toFixed(0) : '?'} MB`,
    });
    return rows;
  } finally {
    await stopServer(child);
    await db.drop();
  }
}
