/**
 * Deterministic synthetic round data for benchmarks and tests: a seeded PRNG (mulberry32,
 * public-domain generator by Tommy Ettinger) and Box–Muller normal deviates.
 * Invented values only; no real laboratory data.
 */
import type { ResultRow } from './evaluate-round';

/** mulberry32 PRNG: returns a function yielding uniform numbers in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface SyntheticRoundSpec {
  readonly participants: number;
  readonly items: number;
  readonly measurands: number;
  readonly replicates: number;
  readonly seed: number;
}

/**
 * Rows of an invented DLS round: Z-average (nm) around 100·(item+1) with 3 % between-lab and
 * 1 % within-lab scatter, PDI around 0.08; about 2 % of labs report a blunder (×2).
 */
export function syntheticRound(spec: SyntheticRoundSpec): ResultRow[] {
  const rnd = mulberry32(spec.seed);
  const normal = (): number => {
    const u = 1 - rnd();
    const v = rnd();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
  const rows: ResultRow[] = [];
  const width = String(spec.participants).length;
  for (let p = 0; p < spec.participants; p++) {
    const code = 'P' + String(p + 1).padStart(width, '0');
    const blunder = rnd() < 0.02 ? 2 : 1;
    for (let i = 0; i < spec.items; i++) {
      for (let m = 0; m < spec.measurands; m++) {
        const target = m === 0 ? 100 * (i + 1) : 0.08 + 0.02 * i;
        const labMean = target * (1 + 0.03 * normal()) * (m === 0 ? blunder : 1);
        for (let r = 0; r < spec.replicates; r++) {
          rows.push({
            participant: code,
            item: `T${i + 1}`,
            measurand: m === 0 ? 'z-average' : m === 1 ? 'pdi' : `m${m + 1}`,
            replicate: r + 1,
            value: labMean * (1 + 0.01 * normal()),
          });
        }
      }
    }
  }
  return rows;
}
