import creosote from './fixtures/creosote.json';
import { evaluateRound, type ResultRow } from './evaluate-round';
import { syntheticRound } from './synthetic-round';

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
