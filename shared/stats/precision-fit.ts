/**
 * Level dependence of a precision standard deviation (ISO 5725-2:1994 §7.5): how s_r or s_R
 * changes with the level m of a round-robin study, fitted over the study's levels.
 *
 * Relations (ISO 5725-2 §7.5.2, from memory; "constant" added as the case of no dependence):
 *   constant      s = c
 *   proportional  s = b·m                   (I)
 *   linear        s = a + b·m               (II)
 *   log-linear    lg s = c + d·lg m         (III)
 *
 * Fitting (ISO 5725-2 §7.5.6–7.5.8, from memory): relations I and II by weighted least squares with
 * weights W_j = 1/ŝ_j², ŝ the fitted value of the previous step (started from the observed s_j,
 * then refined twice); for I this reduces to b = mean(s_j/m_j). Relation III by ordinary least
 * squares on the logarithms. "constant" is the mean of the s_j.
 *
 * Pure functions, no I/O: runs on the server and in the browser.
 */

export type PrecisionRelationKind = 'constant' | 'proportional' | 'linear' | 'log-linear';

export interface LevelDependenceCandidate {
  relation: PrecisionRelationKind;
  /** constant: {c}; proportional: {b}; linear: {a, b}; log-linear: {c, d} (lg = log10). */
  parameters: Record<string, number>;
  /** Fitted s at each level, in input order. */
  fitted: number[];
  /** √(Σ((s − ŝ)/ŝ)²/(q − k)); null when q ≤ k or a fitted value is not positive. */
  relativeResidualSd: number | null;
  /** q − k (k = number of parameters). */
  degreesOfFreedom: number;
}

export interface LevelDependenceFit {
  candidates: LevelDependenceCandidate[];
  /** Smallest relative residual SD; a relation with fewer parameters wins a near tie (within 10 %). */
  chosen: PrecisionRelationKind | null;
  /** Why nothing was chosen, or null. */
  note: string | null;
}

/** A fewer-parameter relation is preferred when its residual SD is within this factor of the best. */
export const NEAR_TIE_FACTOR = 1.1;

const PARAMS: Record<PrecisionRelationKind, number> = {
  constant: 1,
  proportional: 1,
  linear: 2,
  'log-linear': 2,
};

/** Weighted straight line y = a + b·x; null when the design is singular. */
function weightedLine(
  x: readonly number[],
  y: readonly number[],
  w: readonly number[],
): { a: number; b: number } | null {
  let sw = 0;
  let swx = 0;
  let swy = 0;
  for (let i = 0; i < x.length; i++) {
    sw += w[i];
    swx += w[i] * x[i];
    swy += w[i] * y[i];
  }
  const mx = swx / sw;
  const my = swy / sw;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < x.length; i++) {
    sxx += w[i] * (x[i] - mx) ** 2;
    sxy += w[i] * (x[i] - mx) * (y[i] - my);
  }
  if (!(sxx > 0)) return null;
  const b = sxy / sxx;
  return { a: my - b * mx, b };
}

function relativeResidualSd(s: readonly number[], fitted: readonly number[], k: number) {
  const df = s.length - k;
  if (df <= 0 || fitted.some((f) => !(f > 0) || !Number.isFinite(f))) return null;
  let ss = 0;
  for (let i = 0; i < s.length; i++) ss += ((s[i] - fitted[i]) / fitted[i]) ** 2;
  return Math.sqrt(ss / df);
}

function candidate(
  relation: PrecisionRelationKind,
  parameters: Record<string, number>,
  s: readonly number[],
  fitted: number[],
): LevelDependenceCandidate {
  const k = PARAMS[relation];
  return {
    relation,
    parameters,
    fitted,
    relativeResidualSd: relativeResidualSd(s, fitted, k),
    degreesOfFreedom: s.length - k,
  };
}

/**
 * Fits the four relations of s against m over q levels and picks one.
 *
 * @param m level means m̂_j (unit of the measurand), each > 0
 * @param s the standard deviations at those levels (s_r or s_R), each > 0, same unit
 * @returns the candidates (those that could be fitted) and the chosen relation
 * @throws RangeError when the arrays differ in length or hold a value that is not finite and > 0
 */
export function fitLevelDependence(m: readonly number[], s: readonly number[]): LevelDependenceFit {
  if (m.length !== s.length) throw new RangeError('fitLevelDependence: m and s differ in length');
  m.forEach((v, i) => {
    if (!(Number.isFinite(v) && v > 0))
      throw new RangeError(`fitLevelDependence: m[${i}] must be finite and > 0, got ${v}`);
    if (!(Number.isFinite(s[i]) && s[i] > 0))
      throw new RangeError(`fitLevelDependence: s[${i}] must be finite and > 0, got ${s[i]}`);
  });
  const q = m.length;
  if (q === 0) return { candidates: [], chosen: null, note: 'No level has this statistic.' };

  const candidates: LevelDependenceCandidate[] = [];
  const c = s.reduce((a, v) => a + v, 0) / q;
  candidates.push(
    candidate(
      'constant',
      { c },
      s,
      m.map(() => c),
    ),
  );
  const b = s.reduce((a, v, i) => a + v / m[i], 0) / q;
  candidates.push(
    candidate(
      'proportional',
      { b },
      s,
      m.map((v) => b * v),
    ),
  );

  if (q >= 2 && new Set(m).size >= 2) {
    // Relation II: W = 1/ŝ², started from the observed s, refined twice.
    let w = s.map((v) => 1 / (v * v));
    let line = weightedLine(m, s, w);
    for (let iter = 0; iter < 2 && line; iter++) {
      const f = m.map((v) => line!.a + line!.b * v);
      if (f.some((v) => !(v > 0))) break;
      w = f.map((v) => 1 / (v * v));
      line = weightedLine(m, s, w) ?? line;
    }
    if (line) {
      const { a, b: slope } = line;
      candidates.push(
        candidate(
          'linear',
          { a, b: slope },
          s,
          m.map((v) => a + slope * v),
        ),
      );
    }
    const lx = m.map(Math.log10);
    const ly = s.map(Math.log10);
    const lg = weightedLine(
      lx,
      ly,
      lx.map(() => 1),
    );
    if (lg) {
      candidates.push(
        candidate(
          'log-linear',
          { c: lg.a, d: lg.b },
          s,
          m.map((v) => 10 ** (lg.a + lg.b * Math.log10(v))),
        ),
      );
    }
  }

  const usable = candidates.filter((x) => x.relativeResidualSd !== null);
  if (usable.length === 0) {
    return {
      candidates,
      chosen: null,
      note: 'Too few levels to judge a relation (at least 2 levels with different means are needed).',
    };
  }
  const best = Math.min(...usable.map((x) => x.relativeResidualSd!));
  const near = usable.filter((x) => x.relativeResidualSd! <= best * NEAR_TIE_FACTOR + 1e-15);
  const fewest = Math.min(...near.map((x) => PARAMS[x.relation]));
  const pick = near
    .filter((x) => PARAMS[x.relation] === fewest)
    .sort((x, y) => x.relativeResidualSd! - y.relativeResidualSd!)[0];
  return { candidates, chosen: pick.relation, note: null };
}
