import creosote from './fixtures/creosote.json';
import { algorithmA } from './algorithm-a';
import { consensusUncertainty } from './assigned-value';
import { evaluateColumns, evaluateRound, toColumns, type ResultRow } from './evaluate-round';
import { mulberry32, syntheticRound } from './synthetic-round';

function rowsFromMeans(means: readonly number[], replicates = 1): ResultRow[] {
  const rows: ResultRow[] = [];
  means.forEach((m, i) => {
    for (let r = 0; r < replicates; r++) {
      // replicates symmetric about the mean so the participant's result is exactly m
      const off = replicates === 1 ? 0 : (r - (replicates - 1) / 2) * 0.01;
      rows.push({
        participant: `L${String(i + 1).padStart(2, '0')}`,
        item: 'A',
        measurand: 'x',
        replicate: r + 1,
        value: m + off,
      });
    }
  });
  return rows;
}

describe('evaluateRound', () => {
  it('uses Algorithm A on participant means (ISO 5725-5 creosote means, computed x*, s*)', () => {
    const { evaluations } = evaluateRound(rowsFromMeans(creosote.values, 3));
    expect(evaluations).toHaveLength(1);
    const e = evaluations[0];
    expect(e.n).toBe(9);
    expect(e.assignedValue).toBeCloseTo(20.4121428571, 8);
    expect(e.robustSd).toBeCloseTo(1.069839703, 8);
    expect(e.sigmaPt).toBeCloseTo(1.069839703, 8);
    expect(e.uAssigned).toBeCloseTo((1.25 * 1.069839703) / 3, 8);
    // u = 0.4458 > 0.3·σ_pt = 0.321 → not negligible, z′ governs the signal
    expect(e.uNegligible).toBe(false);
    expect(e.warnings).toEqual(expect.arrayContaining(['few-results', 'u-not-negligible']));
    const lab1 = e.participants[0];
    expect(lab1.code).toBe('L01');
    expect(lab1.result).toBeCloseTo(24.14, 12);
    expect(lab1.replicateSd).toBeCloseTo(0.01, 12);
    expect(lab1.z).toBeCloseTo((24.14 - 20.4121428571) / 1.069839703, 7);
    expect(lab1.zPrime).toBeCloseTo(
      (24.14 - 20.4121428571) / Math.hypot(1.069839703, (1.25 * 1.069839703) / 3),
      7,
    );
    // z = 3.48, z′ = 3.22 → action
    expect(lab1.signal).toBe('action');
  });

  it('fixed and percent σ_pt; z governs the signal when u(x_pt) is negligible', () => {
    const means = Array.from({ length: 25 }, (_, i) => 100 + (i - 12) * 0.1);
    means[3] = 102.5; // |z| = 2.5 with σ_pt = 1 → warning
    const fixed = evaluateRound(rowsFromMeans(means), { sigmaPt: { kind: 'fixed', value: 1 } })
      .evaluations[0];
    expect(fixed.sigmaPt).toBe(1);
    expect(fixed.uNegligible).toBe(true);
    const p4 = fixed.participants.find((p) => p.code === 'L04')!;
    expect(p4.z).toBeCloseTo(102.5 - fixed.assignedValue, 12);
    expect(p4.signal).toBe('warning');
    const pct = evaluateRound(rowsFromMeans(means), { sigmaPt: { kind: 'percent', percent: 3 } })
      .evaluations[0];
    expect(pct.sigmaPt).toBeCloseTo(0.03 * pct.assignedValue, 12);
  });

  it('s* = 0 leaves σ_pt unavailable with a warning and null scores, never NaN', () => {
    const e = evaluateRound(rowsFromMeans([5, 5, 5, 5, 6])).evaluations[0];
    expect(e.outcome).toBe('zero-spread');
    expect(e.sigmaPt).toBeNull();
    expect(e.warnings).toContain('sigma-pt-unavailable');
    expect(e.participants.every((p) => p.z === null && p.signal === null)).toBe(true);
  });

  it('groups per item × measurand and averages replicates', () => {
    const rows = syntheticRound({
      participants: 50,
      items: 2,
      measurands: 2,
      replicates: 3,
      seed: 7,
    });
    const { evaluations } = evaluateRound(rows);
    expect(evaluations.map((e) => `${e.item}/${e.measurand}`)).toEqual([
      'T1/z-average',
      'T1/pdi',
      'T2/z-average',
      'T2/pdi',
    ]);
    for (const e of evaluations) {
      expect(e.n).toBe(50);
      expect(e.participants.every((p) => p.replicates === 3)).toBe(true);
    }
    const manual = rows.filter(
      (r) => r.participant === 'P01' && r.item === 'T1' && r.measurand === 'pdi',
    );
    const got = evaluations[1].participants.find((p) => p.code === 'P01')!.result;
    expect(got).toBeCloseTo(manual.reduce((s, r) => s + r.value, 0) / 3, 14);
  });

  it('names the row of a non-finite value', () => {
    expect(() =>
      evaluateRound([{ participant: 'a', item: 'b', measurand: 'c', replicate: 1, value: NaN }]),
    ).toThrow(/row 0/);
  });
});

/**
 * The per-row object path the engine replaced, kept here as the reference: rows grouped under
 * string keys in Maps, codes sorted, each participant's replicates averaged (two-pass, centred
 * on the first replicate), Algorithm A (validated entry point) on the means in code order, then
 * u(x_pt), z and z′ with σ_pt = s*.
 */
function objectPath(rows: readonly ResultRow[]) {
  const groups = new Map<string, Map<string, number[]>>();
  for (const r of rows) {
    const key = `${r.item}\u0000${r.measurand}`;
    let byCode = groups.get(key);
    if (!byCode) groups.set(key, (byCode = new Map()));
    let vs = byCode.get(r.participant);
    if (!vs) byCode.set(r.participant, (vs = []));
    vs.push(r.value);
  }
  return new Map([...groups].map(([key, byCode]) => [key, referenceGroup(byCode)] as const));
}

function referenceGroup(byCode: ReadonlyMap<string, number[]>) {
  const codes = [...byCode.keys()].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  const means = codes.map((c) => {
    const vs = byCode.get(c)!;
    const s = vs.reduce((acc, v) => acc + (v - vs[0]), 0);
    return vs[0] + s / vs.length;
  });
  const a = algorithmA(means);
  const u = consensusUncertainty(a.robustSd, means.length);
  const zpDen = Math.sqrt(a.robustSd * a.robustSd + u * u);
  return {
    x: a.robustMean,
    s: a.robustSd,
    u,
    codes,
    means,
    z: means.map((m) => (m - a.robustMean) / a.robustSd),
    zPrime: means.map((m) => (m - a.robustMean) / zpDen),
  };
}

describe('evaluateColumns (columns) against the per-row object path', () => {
  // Invented data (seeded synthetic round); exact equality, so any change of a number fails.
  // Above 16,000 participants a group's columns are typed arrays, below plain arrays: both kinds.
  it.each([
    [12, 2],
    [250, 2],
    [3000, 2],
    [16_001, 1],
  ])(
    'gives identical x*, s*, u(x_pt), results and z, z′ for %i participants, %i item(s)',
    (n, items) => {
      const rows = syntheticRound({
        participants: n,
        items,
        measurands: 2,
        replicates: 3,
        seed: 20240601,
      });
      // The same rows shuffled: the engine's slower path (rows not in code order) must agree too.
      const shuffled = rows.slice();
      const rnd = mulberry32(n);
      for (let i = shuffled.length - 1; i > 0; i--) {
        const j = Math.floor(rnd() * (i + 1));
        [shuffled[i], shuffled[j]] = [shuffled[j], shuffled[i]];
      }
      const ref = objectPath(rows);
      for (const input of [rows, shuffled]) {
        const cols = toColumns(input);
        const { evaluations } = evaluateColumns(cols);
        expect(evaluations).toHaveLength(ref.size);
        evaluations.forEach((e) => {
          const r = ref.get(`${e.item}\u0000${e.measurand}`)!;
          expect(e.assignedValue).toBe(r.x);
          expect(e.robustSd).toBe(r.s);
          expect(e.sigmaPt).toBe(r.s);
          expect(e.uAssigned).toBe(r.u);
          expect(Array.from(e.columns.code, (c) => cols.codes[c])).toEqual(r.codes);
          expect(Array.from(e.columns.result)).toEqual(r.means);
          expect(Array.from(e.columns.z!)).toEqual(r.z);
          expect(Array.from(e.columns.zPrime!)).toEqual(r.zPrime);
          // The objects built on reading carry the same numbers.
          expect(e.participants.map((p) => [p.code, p.result, p.z, p.zPrime])).toEqual(
            r.codes.map((c, i) => [c, r.means[i], r.z[i], r.zPrime[i]]),
          );
        });
      }
    },
  );

  it('builds the participant objects once, on first read, and includes them in JSON', () => {
    const e = evaluateRound(
      syntheticRound({ participants: 20, items: 1, measurands: 1, replicates: 2, seed: 5 }),
    ).evaluations[0];
    expect(e.participants).toBe(e.participants);
    const json = JSON.parse(JSON.stringify(e)) as { participants: { code: string }[] };
    expect(json.participants.map((p) => p.code)).toEqual(e.participants.map((p) => p.code));
  });
});
