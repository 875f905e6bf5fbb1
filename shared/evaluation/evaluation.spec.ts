import { evaluateRound } from '../stats/evaluate-round';
import { syntheticRound } from '../stats/synthetic-round';
import { buildBoard } from './board';
import { evaluateRecord, type EvaluationInput, type ReplicateInput } from './evaluate';
import { explainScore } from './explain';
import { rescaledSumZ, runRules } from './run-rules';

/** The same invented round as shared/stats/synthetic-round, as stored replicates. */
function input(participants = 40): EvaluationInput {
  const rows = syntheticRound({ participants, items: 2, measurands: 2, replicates: 3, seed: 11 });
  const map = new Map<string, ReplicateInput & { values: number[] }>();
  for (const r of rows) {
    const k = `${r.participant}/${r.item}/${r.measurand}`;
    if (!map.has(k))
      map.set(k, {
        code: r.participant,
        testItemId: r.item,
        measurandId: r.measurand,
        values: [],
        uncertainty: null,
      });
    map.get(k)!.values.push(r.value);
  }
  return {
    items: [
      { id: 'T1', code: 'T1' },
      { id: 'T2', code: 'T2' },
    ],
    measurands: [
      {
        id: 'z-average',
        key: 'z-average',
        name: 'Z-average',
        unit: 'nm',
        decimals: 1,
        sigmaPtRule: { kind: 'robust-sd' },
        assignedValueRule: { kind: 'consensus' },
        minParticipants: 12,
      },
      {
        id: 'pdi',
        key: 'pdi',
        name: 'PDI',
        unit: '',
        decimals: 3,
        sigmaPtRule: { kind: 'robust-sd' },
        assignedValueRule: { kind: 'consensus' },
        minParticipants: 12,
      },
    ],
    replicates: [...map.values()],
  };
}

describe('evaluateRecord', () => {
  it('gives exactly the numbers of shared/stats evaluateRound (the offline command) for consensus rules', () => {
    const inp = input();
    const rows = syntheticRound({
      participants: 40,
      items: 2,
      measurands: 2,
      replicates: 3,
      seed: 11,
    });
    const ref = evaluateRound(rows).evaluations;
    const mine = evaluateRecord(inp);
    for (const r of ref) {
      const m = mine.find((x) => x.itemCode === r.item && x.measurandKey === r.measurand)!;
      expect([m.assignedValue, m.robustSd, m.uAssigned, m.sigmaPt, m.iterations]).toEqual([
        r.assignedValue,
        r.robustSd,
        r.uAssigned,
        r.sigmaPt,
        r.iterations,
      ]);
      expect(m.participants.map((p) => [p.code, p.result, p.z, p.zPrime, p.signal])).toEqual(
        r.participants.map((p) => [p.code, p.result, p.z, p.zPrime, p.signal]),
      );
    }
  });

  it('applies the most specific σ_pt override and scores excluded results against the rest', () => {
    const inp = input();
    const out = evaluateRecord({
      ...inp,
      settings: {
        sigmaPtOverrides: [
          {
            measurandKey: 'z-average',
            itemCode: null,
            rule: { kind: 'fixed', value: 4 },
            reason: 'scheme rule',
          },
          {
            measurandKey: 'z-average',
            itemCode: 'T2',
            rule: { kind: 'percent', percent: 2 },
            reason: 'bigger item',
          },
        ],
        exclusions: [
          {
            participantCode: 'P01',
            itemCode: 'T1',
            measurandKey: 'z-average',
            rule: 'other',
            reason: 'test',
          },
        ],
      },
    });
    const t1 = out.find((r) => r.itemCode === 'T1' && r.measurandKey === 'z-average')!;
    const t2 = out.find((r) => r.itemCode === 'T2' && r.measurandKey === 'z-average')!;
    expect(t1.sigmaPt).toBe(4);
    expect(t2.sigmaPt).toBeCloseTo(0.02 * t2.assignedValue!, 12);
    expect(t1.n).toBe(39);
    const p = t1.participants.find((x) => x.code === 'P01')!;
    expect(p.excluded?.rule).toBe('other');
    expect(p.z).toBeCloseTo((p.result - t1.assignedValue!) / 4, 12);
  });

  it('uses the median rule with u(x_pt) = 1.25·MADe/√p, and a reference value as given', () => {
    const inp = input(20);
    const med = evaluateRecord({
      ...inp,
      measurands: [{ ...inp.measurands[0]!, assignedValueRule: { kind: 'median' } }],
    })[0]!;
    expect(med.method).toBe('median');
    expect(med.uAssigned).toBeCloseTo((1.25 * med.robustSd!) / Math.sqrt(20), 12);
    const ref = evaluateRecord({
      ...inp,
      measurands: [
        {
          ...inp.measurands[0]!,
          assignedValueRule: {
            kind: 'reference',
            value: 100,
            u: 0.5,
            source: 'certificate (invented)',
          },
          sigmaPtRule: { kind: 'fixed', value: 3 },
        },
      ],
    })[0]!;
    expect([ref.assignedValue, ref.uAssigned, ref.sigmaPt, ref.method]).toEqual([
      100,
      0.5,
      3,
      'reference',
    ]);
  });

  it('builds a board row per code and explains a score in plain words', () => {
    const out = evaluateRecord(input(15));
    const board = buildBoard(out);
    expect(board.rows).toHaveLength(15);
    expect(board.rows[0]!.cells).toHaveLength(4);
    const g = out[0]!;
    const text = explainScore(
      { ...g.participants[0]!, z: 2.5, signal: 'warning', scoreKind: 'z' },
      { ...g, assignedValue: g.assignedValue, sigmaPt: g.sigmaPt, uAssigned: g.uAssigned },
    );
    expect(text.join(' ')).toMatch(/z-score is 2\.50.*Warning signal/);
  });
});

describe('run rules for the Track record', () => {
  it('RSZ = Σz/√n', () => {
    expect(rescaledSumZ([1, 2, 3, -2])).toBeCloseTo(4 / 2, 12);
    expect(rescaledSumZ([])).toBeNull();
  });
  it('finds two warnings in a row, nine on one side and action signals', () => {
    const pts = (zs: number[]) => zs.map((z, i) => ({ z, label: `R${i + 1}` }));
    expect(runRules(pts([0.5, 2.3, -2.4, 0.1])).map((f) => [f.rule, f.roundCode])).toEqual([
      ['two-warnings-in-a-row', 'R3'],
    ]);
    expect(runRules(pts([0.1, 0.2, 0.3, 0.1, 0.5, 0.2, 0.4, 0.1, 0.3])).map((f) => f.rule)).toEqual(
      ['nine-on-one-side'],
    );
    expect(
      runRules(pts([0.1, 0.2, 0.3, 0.1, 0.5, 0.2, 0.4, 0.1, -0.3])).map((f) => f.rule),
    ).toEqual([]);
    expect(runRules(pts([3.1])).map((f) => f.rule)).toEqual(['action-signal']);
  });
});

describe('evaluateRecord on stored data outside the bounds (never throws, reasons per participant)', () => {
  it('counts a participant named twice for one item × measurand once, and says so', () => {
    const inp = input(20);
    const first = inp.replicates.find(
      (r) => r.testItemId === 'T1' && r.measurandId === 'z-average',
    )!;
    const twice = {
      ...inp,
      replicates: [...inp.replicates, { ...first, values: first.values.map((v) => v * 5) }],
    };
    const g = evaluateRecord(twice).find(
      (x) => x.itemCode === 'T1' && x.measurandKey === 'z-average',
    )!;
    const ref = evaluateRecord(inp).find(
      (x) => x.itemCode === 'T1' && x.measurandKey === 'z-average',
    )!;
    expect(g.n).toBe(20);
    expect(g.participants).toHaveLength(20);
    expect(g.assignedValue).toBe(ref.assignedValue);
    expect(g.warnings).toContain('duplicate-results-ignored');
  });

  it('reports ζ and En as not computed for an uncertainty of 1e308 and keeps z', () => {
    const inp = input(20);
    const replicates = inp.replicates.map((r) => ({
      ...r,
      uncertainty: { kind: 'expanded' as const, value: 4, k: 2 },
    }));
    const target = replicates.find((r) => r.testItemId === 'T1' && r.measurandId === 'z-average')!;
    (target as { uncertainty: unknown }).uncertainty = { kind: 'standard', value: 1e308, k: null };
    const g = evaluateRecord({ ...inp, replicates }).find(
      (x) => x.itemCode === 'T1' && x.measurandKey === 'z-average',
    )!;
    const p = g.participants.find((x) => x.code === target.code)!;
    expect([p.zeta, p.en, p.notScored?.code]).toEqual([null, null, 'uncertainty-out-of-range']);
    expect(p.z).not.toBeNull();
    expect(g.participants.filter((x) => x.en === null)).toHaveLength(1);
  });

  it('keeps a diameter of 1e308 nm and one of 1e-300 nm out of x_pt, each with a reason', () => {
    const inp = input(20);
    const group = inp.replicates.filter(
      (r) => r.testItemId === 'T2' && r.measurandId === 'z-average',
    );
    const [a, b] = group;
    const replicates = inp.replicates.map((r) =>
      r === a ? { ...r, values: [1e308, 1e308, -1e308] } : r === b ? { ...r, values: [1e-300] } : r,
    );
    const g = evaluateRecord({ ...inp, replicates }).find(
      (x) => x.itemCode === 'T2' && x.measurandKey === 'z-average',
    )!;
    expect(g.n).toBe(18);
    expect(Number.isFinite(g.assignedValue!)).toBe(true);
    for (const code of [a!.code, b!.code]) {
      const p = g.participants.find((x) => x.code === code)!;
      expect([p.z, p.signal, p.notScored?.code]).toEqual([null, null, 'value-out-of-range']);
      expect(Number.isFinite(p.result)).toBe(true);
    }
    expect(() => buildBoard(evaluateRecord({ ...inp, replicates }))).not.toThrow();
  });

  it('reports a stored σ_pt of 1e-320 per participant instead of throwing', () => {
    const inp = input(20);
    const measurands = inp.measurands.map((m) =>
      m.key === 'pdi' ? { ...m, sigmaPtRule: { kind: 'fixed' as const, value: 1e-320 } } : m,
    );
    const g = evaluateRecord({ ...inp, measurands }).find(
      (x) => x.itemCode === 'T1' && x.measurandKey === 'pdi',
    )!;
    expect(g.sigmaPt).toBeNull();
    expect(g.warnings).toContain('sigma-pt-out-of-range');
    expect(
      g.participants.every((p) => p.z === null && p.notScored?.code === 'sigma-pt-out-of-range'),
    ).toBe(true);
  });
});
