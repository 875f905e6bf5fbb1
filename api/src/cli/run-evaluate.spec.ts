import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { algorithmA } from '../../../shared/stats/algorithm-a';
import { precisionAnalysis } from '../../../shared/stats/precision';
import type { PrecisionJson, PtJson } from './evaluation-output';
import { runEvaluate } from './run-evaluate';

// Fixture numbers are invented (CLI plumbing only); statistical checks against published
// sources live in shared/stats/*.spec.ts.
const fx = (name: string) => join(__dirname, 'fixtures', name);
// Participant means of small-round.csv, z-average: (101+103)/2, 99, (100+101)/2, (98+97)/2, 100.5, (130+132)/2
const zAverageMeans = [102, 99, 100.5, 97.5, 100.5, 131];

describe('evaluate command, --mode pt', () => {
  it('prints exactly the documented JSON shape with Algorithm A numbers', async () => {
    const out = await runEvaluate([fx('small-round.csv')]);
    expect(out.exitCode).toBe(0);
    const doc = JSON.parse(out.stdout) as PtJson;
    expect(Object.keys(doc)).toEqual(['evaluations']);
    expect(doc.evaluations).toHaveLength(2);
    const e = doc.evaluations[0];
    expect(Object.keys(e)).toEqual([
      'item',
      'measurand',
      'n',
      'method',
      'iterations',
      'assignedValue',
      'robustSd',
      'uAssigned',
      'sigmaPt',
      'uNegligible',
      'participants',
    ]);
    expect(Object.keys(e.participants[0])).toEqual(['code', 'result', 'z', 'zPrime', 'signal']);
    const a = algorithmA(zAverageMeans);
    expect(e).toMatchObject({
      item: 'A',
      measurand: 'z-average',
      n: 6,
      method: 'algorithm-a',
      iterations: a.iterations,
    });
    expect(e.assignedValue).toBeCloseTo(a.robustMean, 12);
    expect(e.robustSd).toBeCloseTo(a.robustSd, 12);
    expect(e.uAssigned).toBeCloseTo((1.25 * a.robustSd) / Math.sqrt(6), 12);
    expect(e.sigmaPt).toBeCloseTo(a.robustSd, 12);
    expect(e.uNegligible).toBe(false);
    expect(e.participants.map((p) => p.result)).toEqual(zAverageMeans);
    const l06 = e.participants[5];
    expect(l06.code).toBe('L06');
    expect(l06.z).toBeCloseTo((131 - a.robustMean) / a.robustSd, 10);
    expect(l06.signal).toBe('action');
    expect(out.stderr).toMatch(/fewer than 12 results/);
  });

  it('--sigma-pt fixed and percent', async () => {
    const fixed = JSON.parse(
      (await runEvaluate([fx('small-round.csv'), '--sigma-pt', '2'])).stdout,
    ) as PtJson;
    expect(fixed.evaluations[0].sigmaPt).toBe(2);
    expect(fixed.evaluations[0].participants[0].z).toBeCloseTo(
      (102 - fixed.evaluations[0].assignedValue) / 2,
      12,
    );
    const pct = JSON.parse(
      (await runEvaluate([fx('small-round.csv'), '--sigma-pt=3%'])).stdout,
    ) as PtJson;
    const e = pct.evaluations[0];
    expect(e.sigmaPt).toBeCloseTo(0.03 * e.assignedValue, 12);
  });

  it('reads xlsx (first sheet, formula cells by cached result) like the same CSV', async () => {
    const x = await runEvaluate([fx('small-round.xlsx')]);
    const c = await runEvaluate([fx('small-round.csv')]);
    expect(x.exitCode).toBe(0);
    expect(JSON.parse(x.stdout)).toEqual(JSON.parse(c.stdout));
  });

  it('--format table prints a readable table with the signal words', async () => {
    const out = await runEvaluate([fx('small-round.csv'), '--format', 'table']);
    expect(out.exitCode).toBe(0);
    expect(out.stdout).toMatch(/A \/ z-average: p = 6, x_pt = 100\.8\d+/);
    expect(out.stdout).toMatch(/^L06\s+131\.000\s+\S+\s+\S+\s+action$/m);
  });
});

describe('evaluate command, --mode precision', () => {
  it('groups rows per item × measurand into cells for precisionAnalysis', async () => {
    const out = await runEvaluate([fx('precision-study.csv'), '--mode', 'precision']);
    expect(out.exitCode).toBe(0);
    const doc = JSON.parse(out.stdout) as PrecisionJson;
    expect(doc.precision).toHaveLength(1);
    const p = doc.precision[0];
    expect(p.item).toBe('B');
    expect(p.measurand).toBe('z-average');
    const direct = precisionAnalysis([
      { code: 'R1', values: [60.2, 60.5, 60.4] },
      { code: 'R2', values: [61.1, 60.9, 61.3] },
      { code: 'R3', values: [59.8, 60.1, 59.9] },
      { code: 'R4', values: [60.6, 60.4, 60.9] },
      { code: 'R5', values: [60.0, 60.3, 60.2] },
    ]);
    expect(p.p).toBe(5);
    expect(p.sr).toBeCloseTo(direct.sr!, 12);
    expect(p.sR).toBeCloseTo(direct.sR!, 12);
    expect(p.cells.map((c) => c.code)).toEqual(['R1', 'R2', 'R3', 'R4', 'R5']);
    // hand check of s_r: pooled variance of the five cells = mean of s_i² (equal n)
    const s2 = [0.023333333333, 0.04, 0.023333333333, 0.063333333333, 0.023333333333];
    expect(p.sr).toBeCloseTo(Math.sqrt(s2.reduce((a, b) => a + b) / 5), 6);
  });

  it('table format', async () => {
    const out = await runEvaluate([
      fx('precision-study.csv'),
      '--mode=precision',
      '--format=table',
    ]);
    expect(out.exitCode).toBe(0);
    expect(out.stdout).toMatch(/s_r = 0\.186/);
    expect(out.stdout).toMatch(/^R2\s+3\s+61\.1000/m);
  });
});

describe('evaluate command, bad input → exit code 2 with row and column named', () => {
  it.each([
    [['missing-column.csv'], /row 1 \(header\): missing column "measurand"/],
    [['bad-value.csv'], /row 3, column "value": "abc" is not a number/],
    [['duplicate.csv'], /row 3, column "replicate": .*already given in row 2/],
    [['small-round.csv', '--bogus'], /unknown option --bogus/],
    [['small-round.csv', '--mode', 'fast'], /--mode: "fast" is not one of pt, precision/],
    [['small-round.csv', '--sigma-pt', '-1'], /--sigma-pt: "-1" is not a positive/],
    [['small-round.csv', '--sigma-pt', '2', '--mode', 'precision'], /pt only/],
    [['no-such-file.csv'], /cannot be read \(ENOENT\)/],
    [['small-round.txt'], /unsupported file type/],
    [[], /no input file/],
  ])('%j', async (args, message) => {
    const out = await runEvaluate(args.map((a, i) => (i === 0 && a.includes('.') ? fx(a) : a)));
    expect(out.exitCode).toBe(2);
    expect(out.stdout).toBe('');
    expect(out.stderr).toMatch(message);
  });

  it('the real process exits with code 2 and prints the message (npx tsx)', async () => {
    const err = await npxTsxEvaluate([fx('bad-value.csv')]);
    expect(err.code).toBe(2);
    expect(err.stderr).toMatch(/row 3, column "value"/);
    const ok = await npxTsxEvaluate([fx('small-round.csv')]);
    expect(ok.code).toBe(0);
    expect((JSON.parse(ok.stdout) as PtJson).evaluations[0].n).toBe(6);
  });
});

/**
 * Commands still running when a test ends. npx starts tsx, which starts node: each command runs in
 * its own process group, and a test that ends early (a time-out) ends the whole group, so no
 * process outlives the test file and keeps the jest worker from exiting.
 */
const running = new Set<ChildProcess>();
afterEach(() => {
  for (const child of running) {
    try {
      process.kill(-child.pid!, 'SIGKILL');
    } catch {
      // already gone
    }
  }
  running.clear();
});

/** `npx tsx api/src/cli/evaluate.ts ARGS` from the repository root, as the README runs it. */
function npxTsxEvaluate(
  args: string[],
): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn('npx', ['tsx', 'api/src/cli/evaluate.ts', ...args], {
      cwd: join(__dirname, '..', '..', '..'),
      detached: true,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    running.add(child);
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('error', reject);
    child.on('close', (code) => {
      running.delete(child);
      resolve({ code, stdout, stderr });
    });
  });
}
