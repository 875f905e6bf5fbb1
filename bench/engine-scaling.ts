/**
 * How the statistics engine grows with the number of participants, beside an independent
 * vectorised implementation (numpy, bench/reference/evaluate_numpy.py) run on the same data in
 * the same bench run. Targets (docs/QUALITY.md): growth exponent ≤ 1.05 over 100 → 100,000
 * participants, and faster than the numpy version at every size. Not a timed test.
 * Data: the seeded synthetic round (invented values), 2 items × 2 measurands × 3 replicates.
 * Both sides are timed in CPU time of their own process (process.cpuUsage here, process_time in
 * Python), so other load on a shared 2-core machine distorts the comparison less than wall time.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { evaluateColumns, toColumns, type ResultColumns } from '../shared/stats/evaluate-round';
import { syntheticRound } from '../shared/stats/synthetic-round';
import type { Row } from './stats';

const SIZES = [100, 1000, 10_000, 100_000] as const;

interface NumpyAnswer {
  median_ms: number;
  p95_ms: number;
  runs: number;
  groups: { x: number; s: number }[];
  numpy: string;
}

function runNumpy(cols: ResultColumns, runs: number): NumpyAnswer | string {
  const dir = mkdtempSync(join(tmpdir(), 'ringlet-bench-'));
  try {
    const bytes = (a: Int32Array | Float64Array) =>
      Buffer.from(a.buffer, a.byteOffset, a.byteLength);
    writeFileSync(join(dir, 'participant.i32'), bytes(cols.participant));
    writeFileSync(join(dir, 'group.i32'), bytes(cols.group));
    writeFileSync(join(dir, 'value.f64'), bytes(cols.value));
    writeFileSync(
      join(dir, 'meta.json'),
      JSON.stringify({ codes: cols.codes.length, groups: cols.groups.length }),
    );
    const script = join(__dirname, 'reference', 'evaluate_numpy.py');
    const r = spawnSync('python3', [script, dir, String(runs)], {
      encoding: 'utf8',
      timeout: 600_000,
    });
    if (r.error || r.status !== 0)
      return `numpy reference not run: ${r.error?.message ?? r.stderr.trim().split('\n').pop()}`;
    return JSON.parse(r.stdout) as NumpyAnswer;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Median and p95 CPU milliseconds of `fn` over `runs` calls after `warmup` untimed ones. */
function cpuTime(name: string, fn: () => unknown, runs: number, warmup: number): Row {
  for (let i = 0; i < warmup; i++) fn();
  const t: number[] = [];
  for (let i = 0; i < runs; i++) {
    const s = process.cpuUsage();
    fn();
    const d = process.cpuUsage(s);
    t.push((d.user + d.system) / 1000);
  }
  t.sort((a, b) => a - b);
  const rank = (q: number) => t[Math.min(t.length - 1, Math.ceil(q * t.length) - 1)]!;
  return { name, median_ms: rank(0.5), p95_ms: rank(0.95), runs };
}

/** Least-squares slope of log(time) against log(size). */
export function growthExponent(sizes: readonly number[], ms: readonly number[]): number {
  const xs = sizes.map(Math.log);
  const ys = ms.map(Math.log);
  const mx = xs.reduce((a, b) => a + b, 0) / xs.length;
  const my = ys.reduce((a, b) => a + b, 0) / ys.length;
  let num = 0;
  let den = 0;
  for (let i = 0; i < xs.length; i++) {
    num += (xs[i]! - mx) * (ys[i]! - my);
    den += (xs[i]! - mx) ** 2;
  }
  return num / den;
}

export function benchEngineScaling(): (Row & { target?: string; extra?: string })[] {
  const rows: (Row & { target?: string; extra?: string })[] = [];
  const medians: number[] = [];
  let slower = 0;
  for (const n of SIZES) {
    const cols = toColumns(
      syntheticRound({ participants: n, items: 2, measurands: 2, replicates: 3, seed: 20240601 }),
    );
    const runs = Math.max(10, Math.min(200, Math.round(2_000_000 / (n * 12))));
    let result = evaluateColumns(cols);
    const ours = cpuTime(
      `evaluate ${n.toLocaleString('en')} participants (columns)`,
      () => (result = evaluateColumns(cols)),
      runs,
      Math.min(20, runs),
    );
    medians.push(ours.median_ms);
    const np = runNumpy(cols, runs);
    let extra: string;
    if (typeof np === 'string') {
      extra = np;
    } else {
      const agree = np.groups.every((g, i) => {
        const e = result.evaluations[i]!;
        return (
          Math.abs(g.x - e.assignedValue) <= 1e-9 * Math.abs(e.assignedValue) &&
          Math.abs(g.s - e.robustSd) <= 1e-9 * e.robustSd
        );
      });
      const ratio = np.median_ms / ours.median_ms;
      if (ratio < 1) slower++;
      extra = `numpy ${np.numpy}: ${np.median_ms.toFixed(2)} ms, ours ${ratio.toFixed(1)}× faster; x*, s* ${agree ? 'agree to 1e-9' : 'DISAGREE'}`;
    }
    rows.push({ ...ours, target: 'faster than numpy', extra });
  }
  const k = growthExponent(SIZES, medians);
  rows.push({
    name: 'growth exponent, 100 → 100,000 participants (CPU time)',
    median_ms: NaN,
    p95_ms: NaN,
    runs: SIZES.length,
    target: '≤ 1.05',
    extra: `exponent ${k.toFixed(3)}${slower ? `; slower than numpy at ${slower} size(s)` : ''}`,
  });
  return rows;
}
