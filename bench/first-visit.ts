/**
 * What a person waits for in a real browser (headless Debian chromium on loopback): from
 * navigation start until the page shows its data, on the demo scenario.
 * - first visit: a new browser profile (empty cache), already signed in;
 * - revisit: the same page again in that profile (files from the cache).
 * Pages: the Consensus board of a published round (coordinator; "data" = grid rows) and a lab's
 * round on the Lab bench (a demo lab; "data" = the results form). Targets (docs/QUALITY.md):
 * first visit < 1 s, revisit < 300 ms. Needs the production web build (npm run build).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import {
  chromium,
  type Browser,
  type BrowserContext,
  type Page,
  type Request,
} from 'playwright-core';
import { createDataSource } from '../db/data-source';
import { createTestDatabase } from '../db/testing';
import { DEFAULT_DEMO_PASSWORD } from '../db/seed/demo-people';
import { seedDemo } from '../db/seed/demo';
import type { Row } from './stats';

/** The built web app; RINGLET_BENCH_WEB names another build (to compare two in one sitting). */
const WEB = process.env['RINGLET_BENCH_WEB'] || join(__dirname, '..', 'dist', 'web', 'browser');
const VISITS = Number(process.env['RINGLET_BENCH_VISITS'] ?? 7);
/** RINGLET_BENCH_WATERFALL=1 prints each request of one first visit per page (start → end, ms). */
const WATERFALL = process.env['RINGLET_BENCH_WATERFALL'] === '1';
/** RINGLET_BENCH_PROFILE=1 prints where the main thread spent one first visit and one revisit. */
const PROFILE = process.env['RINGLET_BENCH_PROFILE'] === '1';

interface ProfileNode {
  id: number;
  callFrame: { url: string; functionName: string };
}

/** A CPU profile (Chrome DevTools protocol) of what runs until `done`, summed by script file. */
async function profiled(page: Page, title: string, done: () => Promise<unknown>): Promise<void> {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Profiler.enable');
  await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
  await cdp.send('Profiler.start');
  await done();
  const { profile } = (await cdp.send('Profiler.stop')) as unknown as {
    profile: { nodes: ProfileNode[]; samples: number[]; timeDeltas: number[] };
  };
  const nodes = new Map(profile.nodes.map((n) => [n.id, n]));
  const byFile = new Map<string, number>();
  profile.samples.forEach((id, i) => {
    const f = nodes.get(id)!.callFrame;
    const key = f.url ? f.url.replace(/^.*\//, '') : `(${f.functionName || 'program'})`;
    byFile.set(key, (byFile.get(key) ?? 0) + (profile.timeDeltas[i] ?? 0) / 1000);
  });
  process.stderr.write(`\n${title}: main-thread time by script (ms)\n`);
  for (const [file, ms] of [...byFile].sort((a, b) => b[1] - a[1]).slice(0, 12))
    process.stderr.write(`  ${ms.toFixed(0).padStart(6)}  ${file}\n`);
  await cdp.detach();
}

function waterfall(page: Page): { print: (title: string, total: number) => Promise<void> } {
  const t0 = performance.now();
  const started = new Map<Request, number>();
  const ended = new Map<Request, number>();
  const sizes: Promise<unknown>[] = [];
  const kB = new Map<Request, string>();
  page.on('request', (r) => started.set(r, performance.now() - t0));
  page.on('requestfinished', (r) => {
    ended.set(r, performance.now() - t0);
    sizes.push(
      r.sizes().then(
        (s) => kB.set(r, `${(s.responseBodySize / 1024).toFixed(1)} kB`),
        () => undefined,
      ),
    );
  });
  page.on('requestfailed', (r) => ended.set(r, performance.now() - t0));
  return {
    // Every request asked for until the page showed its data; "…" for one still running then.
    print: async (title, total) => {
      await Promise.all(sizes);
      process.stderr.write(`\n${title}: ${total.toFixed(0)} ms\n`);
      const rows = [...started].sort((a, b) => a[1] - b[1]);
      for (const [r, start] of rows) {
        const end = ended.get(r);
        const url = r.url().replace(/^https?:\/\/[^/]+/, '');
        process.stderr.write(
          `  ${start.toFixed(0).padStart(5)} → ${end === undefined ? '    …' : end.toFixed(0).padStart(5)}  ${url.slice(0, 70)} (${kB.get(r) ?? r.failure()?.errorText ?? '-'})\n`,
        );
      }
    },
  };
}

function startServer(url: string): Promise<{ child: ChildProcess; port: number }> {
  const child = spawn(
    process.execPath,
    ['--import', 'tsx', join(__dirname, 'board-server.ts'), url, WEB],
    { stdio: ['ignore', 'pipe', 'inherit'] },
  );
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('server did not start in 60 s')), 60_000);
    child.stdout!.on('data', (b: Buffer) => {
      const m = /PORT (\d+)/.exec(b.toString());
      if (m) {
        clearTimeout(timer);
        resolve({ child, port: Number(m[1]) });
      }
    });
    child.on('exit', (code) => reject(new Error(`server exited (${code})`)));
  });
}

async function signedInContext(
  browser: Browser,
  base: string,
  email: string,
): Promise<BrowserContext> {
  const ctx = await browser.newContext({ baseURL: base, viewport: { width: 1280, height: 860 } });
  const token = (
    (await (await ctx.request.get('/api/v1/auth/csrf-token')).json()) as { token: string }
  ).token;
  const r = await ctx.request.post('/api/v1/auth/sign-in', {
    data: { email, password: DEFAULT_DEMO_PASSWORD },
    headers: { 'x-csrf-token': token },
  });
  if (!r.ok()) throw new Error(`sign-in ${email}: ${r.status()}`);
  return ctx;
}

function summary(name: string, t: number[], target: string): Row & { target: string } {
  const s = [...t].sort((a, b) => a - b);
  const rank = (q: number) => s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)]!;
  return { name, median_ms: rank(0.5), p95_ms: rank(0.95), runs: s.length, target };
}

export async function benchFirstVisit(): Promise<(Row & { target?: string; extra?: string })[]> {
  if (!existsSync(join(WEB, 'index.html'))) {
    return [
      {
        name: 'first visit (browser)',
        median_ms: NaN,
        p95_ms: NaN,
        runs: 0,
        extra: 'no web build: run npm run build first',
      },
    ];
  }
  const db = await createTestDatabase();
  let server: ChildProcess | undefined;
  let browser: Browser | undefined;
  try {
    process.env['RINGLET_DEMO_PASSWORD'] = DEFAULT_DEMO_PASSWORD;
    // The demo seed back-dates publications, which only the owner role may do.
    const owner = await createDataSource(db.ownerUrl).initialize();
    await seedDemo(owner, DEFAULT_DEMO_PASSWORD).finally(() => owner.destroy());
    const [published] = (await db.ds.query(
      `SELECT id FROM round WHERE state = 'published' ORDER BY results_due_at DESC LIMIT 1`,
    )) as { id: string }[];
    const [collecting] = (await db.ds.query(
      `SELECT id FROM round WHERE state = 'collecting' LIMIT 1`,
    )) as { id: string }[];
    const started = await startServer(db.url);
    server = started.child;
    const base = `http://127.0.0.1:${started.port}`;
    browser = await chromium.launch({
      executablePath: process.env['CHROMIUM_PATH'] || '/usr/bin/chromium',
      headless: true,
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-dev-shm-usage',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--disable-quic',
      ],
    });
    const pages = [
      {
        name: 'Consensus board, published round (coordinator)',
        email: 'coordinator@ringlet.example',
        path: `/board/rounds/${published!.id}`,
        ready: '.ag-row',
      },
      {
        name: "a lab's round on the Lab bench (lab)",
        email: 'lab1@ringlet.example',
        path: `/bench/rounds/${collecting!.id}`,
        ready: '.mat-mdc-form-field input',
      },
    ];
    const rows: (Row & { target?: string })[] = [];
    for (const p of pages) {
      const first: number[] = [];
      const again: number[] = [];
      for (let i = 0; i < VISITS; i++) {
        const ctx = await signedInContext(browser, base, p.email);
        const page = await ctx.newPage();
        const log = i === 0 && WATERFALL ? waterfall(page) : undefined;
        const s1 = performance.now();
        await page.goto(p.path, { waitUntil: 'commit' });
        await page
          .locator(p.ready)
          .first()
          .waitFor({ state: 'visible', timeout: 30_000 })
          .catch(async (err: unknown) => {
            await page.screenshot({
              path: join(__dirname, '..', 'test-artifacts', 'bench-first-visit-failed.png'),
            });
            throw err;
          });
        first.push(performance.now() - s1);
        await log?.print(`first visit: ${p.name}`, first[0]!);
        const s2 = performance.now();
        const revisit = async () => {
          await page.goto(p.path, { waitUntil: 'commit' });
          await page.locator(p.ready).first().waitFor({ state: 'visible', timeout: 30_000 });
        };
        if (i === 0 && PROFILE) await profiled(page, `revisit: ${p.name}`, revisit);
        else await revisit();
        again.push(performance.now() - s2);
        await ctx.close();
      }
      rows.push(
        summary(`first visit: ${p.name}`, first, '< 1000 ms'),
        summary(`revisit: ${p.name}`, again, '< 300 ms'),
      );
    }
    return rows;
  } finally {
    await browser?.close();
    server?.kill('SIGTERM');
    await db.drop();
  }
}

// `npx tsx bench/first-visit.ts` runs this bench alone (npm run bench runs it among the others).
if (require.main === module) {
  benchFirstVisit().then(
    (rows) => {
      console.table(rows);
      process.exit(0);
    },
    (err: unknown) => {
      console.error(err);
      process.exit(1);
    },
  );
}
