/**
 * Benchmarks of the statistics engine (not timed tests; see docs/QUALITY.md "Performance
 * targets": full evaluation of a 1,000 × 2 × 2 × 3 round ≤ 20 ms median).
 * Data: deterministic synthetic round (seeded PRNG), invented values.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { evaluateRound } from '../shared/stats/evaluate-round';
import { syntheticRound } from '../shared/stats/synthetic-round';

export interface Row {
  name: string;
  median_ms: number;
  p95_ms: number;
  runs: number;
}

const SPEC = {
  participants: 1000,
  items: 2,
  measurands: 2,
  replicates: 3,
  seed: 20240601,
} as const;

/** Times `fn` `runs` times after `warmup` untimed calls; nearest-rank median and p95 in ms. */
export function time(name: string, fn: () => unknown, runs = 100, warmup = 20): Row {
  for (let i = 0; i < warmup; i++) fn();
  const t: number[] = [];
  for (let i = 0; i < runs; i++) {
    const s = performance.now();
    fn();
    t.push(performance.now() - s);
  }
  t.sort((a, b) => a - b);
  const rank = (q: number) => t[Math.min(t.length - 1, Math.ceil(q * t.length) - 1)];
  return { name, median_ms: round3(rank(0.5)), p95_ms: round3(rank(0.95)), runs };
}

function round3(v: number): number {
  return Math.round(v * 1000) / 1000;
}

export async function benchStats(): Promise<Row[]> {
  const rows = syntheticRound(SPEC);
  const label = `${SPEC.participants}×${SPEC.items}×${SPEC.measurands}×${SPEC.replicates}`;
  const out: Row[] = [
    time(`evaluate-round ${label} (Algorithm A, z, z′)`, () => evaluateRound(rows)),
  ];

  if (existsSync(join(__dirname, '..', 'shared', 'stats', 'precision.ts'))) {
    const { precisionAnalysis } = await import('../shared/stats/precision');
    // Cells per item × measurand, grouped outside the timed loop like the CLI does.
    const groups = new Map<string, Map<string, number[]>>();
    for (const r of rows) {
      const key = r.item + '/' + r.measurand;
      let g = groups.get(key);
      if (!g) groups.set(key, (g = new Map<string, number[]>()));
      let vs = g.get(r.participant);
      if (!vs) g.set(r.participant, (vs = []));
      vs.push(r.value);
    }
    const levels = [...groups.values()].map((g) =>
      [...g].map(([code, values]) => ({ code, values })),
    );
    out.push(
      time(
        `precision analysis ${label} (ISO 5725-2, 4 levels)`,
        () => levels.map((cells) => precisionAnalysis(cells)),
        30,
        5,
      ),
    );
  }
  return out;
}
