/**
 * Start-up of the compiled offline command: `npm run evaluate` on a 1,000-lab CSV (invented
 * values, 2 items × 2 measurands × 3 replicates), wall time from process start to exit.
 * Target (docs/QUALITY.md): under 300 ms. The bundle is built first, outside the timing.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { syntheticRound } from '../shared/stats/synthetic-round';
import type { Row } from './stats';

export function benchCli(): (Row & { target?: string; extra?: string })[] {
  const root = join(__dirname, '..');
  const dir = mkdtempSync(join(tmpdir(), 'ringlet-cli-'));
  try {
    const rows = syntheticRound({
      participants: 1000,
      items: 2,
      measurands: 2,
      replicates: 3,
      seed: 7,
    });
    const csv = [
      'participant,item,measurand,replicate,value',
      ...rows.map((r) => [r.participant, r.item, r.measurand, r.replicate, r.value].join(',')),
    ];
    const file = join(dir, 'round.csv');
    writeFileSync(file, csv.join('\n'));
    const script = join(root, 'scripts', 'evaluate.mjs');
    const once = () =>
      spawnSync(process.execPath, [script, file], {
        cwd: root,
        encoding: 'utf8',
        maxBuffer: 64 * 1024 * 1024,
      });
    const first = once(); // builds the bundle when stale
    if (first.status !== 0) throw new Error(`evaluate failed: ${first.stderr}`);
    const t: number[] = [];
    for (let i = 0; i < 15; i++) {
      const s = performance.now();
      const r = once();
      t.push(performance.now() - s);
      if (r.status !== 0) throw new Error(`evaluate failed: ${r.stderr}`);
    }
    t.sort((a, b) => a - b);
    const rank = (q: number) => t[Math.min(t.length - 1, Math.ceil(q * t.length) - 1)]!;
    return [
      {
        name: 'npm run evaluate, 1,000-lab CSV (process start to exit)',
        median_ms: rank(0.5),
        p95_ms: rank(0.95),
        runs: t.length,
        target: '< 300 ms',
      },
    ];
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
