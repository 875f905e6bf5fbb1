/**
 * npm run bench: the speed goals of docs/QUALITY.md, measured on this machine (not timed tests).
 * Each area exports a function returning rows; this prints them as one table.
 */
import type { BenchRow } from './rows';
import { benchStats } from './stats';

// A bench may be synchronous (the offline command, engine growth) or async.
type Load = () => BenchRow[] | Promise<BenchRow[]>;
type Bench = { title: string; load: Load };

const benches: Bench[] = [{ title: 'statistics engine', load: benchStats as Load }];

async function optional(title: string, path: string, fn: string): Promise<void> {
  try {
    const mod = (await import(path)) as Record<string, Load>;
    if (typeof mod[fn] === 'function') benches.push({ title, load: mod[fn]! });
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    if (code !== 'MODULE_NOT_FOUND' && code !== 'ERR_MODULE_NOT_FOUND') throw err;
  }
}

async function main(): Promise<void> {
  await optional('engine growth', './engine-scaling', 'benchEngineScaling');
  await optional('offline command', './cli', 'benchCli');
  await optional('consensus board API', './board', 'benchBoard');
  await optional('browser', './first-visit', 'benchFirstVisit');
  await optional('reports', './reports', 'benchReports');
  await optional('uploads', './uploads', 'benchUploads');
  await optional('compiled server', './runtime', 'benchRuntime');
  const rows: (BenchRow & { area: string })[] = [];
  for (const b of benches) {
    process.stderr.write(`running ${b.title}…\n`);
    for (const r of await b.load()) rows.push({ area: b.title, ...r });
  }
  const fmt = (n: number) => (Number.isFinite(n) ? n.toFixed(2) : '—');
  const header = ['area', 'benchmark', 'median ms', 'p95 ms', 'runs', 'target', 'notes'];
  const table = rows.map((r) => [
    r.area,
    r.name,
    fmt(r.median_ms),
    fmt(r.p95_ms),
    String(r.runs),
    r.target ?? '',
    r.extra ?? '',
  ]);
  const widths = header.map((h, i) => Math.max(h.length, ...table.map((row) => row[i]!.length)));
  const line = (cells: string[]) =>
    cells
      .map((c, i) => (i >= 2 && i <= 4 ? c.padStart(widths[i]!) : c.padEnd(widths[i]!)))
      .join('  ');
  console.log(line(header));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const row of table) console.log(line(row));
  process.exit(0);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
