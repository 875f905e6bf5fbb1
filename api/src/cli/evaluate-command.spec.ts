import { spawnSync } from 'node:child_process';
import { join } from 'node:path';

// The compiled command as `npm run evaluate` starts it: bundled by scripts/evaluate.mjs.
const root = join(__dirname, '..', '..', '..');

describe('npm run evaluate (compiled command)', () => {
  it('evaluates a small round and exits 0', () => {
    const r = spawnSync(
      process.execPath,
      [join(root, 'scripts/evaluate.mjs'), join(__dirname, 'fixtures', 'small-round.csv')],
      { cwd: root, encoding: 'utf8' },
    );
    expect(r.stderr).toMatch(/fewer than 12 results/);
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as { evaluations: { n: number }[] };
    expect(out.evaluations.length).toBeGreaterThan(0);
  });

  it('names the problem and exits 2 for a missing file', () => {
    const r = spawnSync(
      process.execPath,
      [join(root, 'scripts/evaluate.mjs'), join(__dirname, 'fixtures', 'no-such-file.csv')],
      { cwd: root, encoding: 'utf8' },
    );
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/no-such-file\.csv/);
  });
});
