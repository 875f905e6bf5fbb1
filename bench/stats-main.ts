/** Prints the statistics benchmarks as a table: `npx tsx bench/stats-main.ts`. */
import { benchStats, type Row } from './stats';

function table(rows: Row[]): string {
  const head = ['benchmark', 'median ms', 'p95 ms', 'runs'];
  const body = rows.map((r) => [
    r.name,
    r.median_ms.toFixed(3),
    r.p95_ms.toFixed(3),
    String(r.runs),
  ]);
  const w = head.map((h, i) => Math.max(h.length, ...body.map((b) => b[i].length)));
  const line = (c: string[]) =>
    c.map((x, i) => (i === 0 ? x.padEnd(w[i]) : x.padStart(w[i]))).join('  ');
  return [line(head), w.map((n) => '-'.repeat(n)).join('  '), ...body.map(line)].join('\n');
}

void benchStats().then((rows) => {
  process.stdout.write(table(rows) + '\n');
});
