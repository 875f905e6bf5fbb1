/**
 * Run rules for a lab's Track record: a sequence of z-scores of one measurand across rounds
 * (oldest first). Rules (common practice for control charts of PT scores, in the spirit of
 * ISO 13528:2015 §10 and the Western Electric run rules; from memory):
 * - action signal: one |z| ≥ 3;
 * - two warnings in a row: two consecutive |z| > 2;
 * - nine on one side: nine consecutive z of the same sign (a bias);
 * - RSZ = Σz/√n, the rescaled sum of z-scores, read on the z scale (|RSZ| > 2 flags a bias).
 */
import { SIGNAL_LIMITS } from '../stats/scores';

const { warning: WARN, action: ACT } = SIGNAL_LIMITS;

export type RunRule = 'action-signal' | 'two-warnings-in-a-row' | 'nine-on-one-side' | 'rsz';

export interface RunPoint {
  readonly z: number;
  readonly label: string;
}

export interface RunFinding {
  readonly rule: RunRule;
  readonly message: string;
  /** Label of the point where the rule fired. */
  readonly roundCode: string;
}

/** Rescaled sum of z-scores RSZ = Σz/√n, dimensionless; null for no points. */
export function rescaledSumZ(zs: readonly number[]): number | null {
  if (zs.length === 0) return null;
  let s = 0;
  for (const z of zs) s += z;
  return s / Math.sqrt(zs.length);
}

export function runRules(points: readonly RunPoint[]): RunFinding[] {
  const out: RunFinding[] = [];
  let side = 0;
  let run = 0;
  for (let i = 0; i < points.length; i++) {
    const p = points[i]!;
    if (Math.abs(p.z) >= ACT)
      out.push({
        rule: 'action-signal',
        message: `Action signal (z = ${p.z.toFixed(2)}).`,
        roundCode: p.label,
      });
    if (i > 0 && Math.abs(p.z) > WARN && Math.abs(points[i - 1]!.z) > WARN) {
      out.push({
        rule: 'two-warnings-in-a-row',
        message: `Two results in a row beyond ±${WARN}: act as on an action signal.`,
        roundCode: p.label,
      });
    }
    const s = Math.sign(p.z);
    if (s !== 0 && s === side) run++;
    else {
      side = s;
      run = s === 0 ? 0 : 1;
    }
    if (run === 9) {
      out.push({
        rule: 'nine-on-one-side',
        message: `Nine results in a row ${side > 0 ? 'above' : 'below'} the assigned value: a steady bias is likely.`,
        roundCode: p.label,
      });
    }
  }
  const rsz = rescaledSumZ(points.map((p) => p.z));
  if (rsz !== null && Math.abs(rsz) > WARN && points.length > 1) {
    out.push({
      rule: 'rsz',
      message: `Rescaled sum of z-scores RSZ = ${rsz.toFixed(2)} beyond ±${WARN}: the results lean to one side overall.`,
      roundCode: points[points.length - 1]!.label,
    });
  }
  return out;
}
