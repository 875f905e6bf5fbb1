import type { PrecisionExclusion, PrecisionStudyInput } from '../contracts/precision';
import nistAnova from '../stats/fixtures/precision-nist-anova.json';
import { analysePrecisionStudy } from './precision-study';

const sirstv = (nistAnova.sets as Record<string, { groups: string[][] }>).SiRstv.groups;

function input(over: Partial<PrecisionStudyInput> = {}): PrecisionStudyInput {
  return {
    round: {
      id: '00000000-0000-4000-8000-000000000001',
      code: 'RR-1',
      title: 'Study',
      state: 'closed',
      schemeCode: 'S',
    },
    decisionsOpen: true,
    levels: [{ itemCode: 'A', label: 'Level A' }],
    measurands: [{ key: 'z', label: 'Z', unit: 'nm', decimals: 2, replicatesRequired: 5 }],
    cells: sirstv.map((g, i) => ({
      itemCode: 'A',
      measurandKey: 'z',
      participantCode: `P${i + 1}`,
      values: g.map(Number),
    })),
    references: [],
    exclusions: [],
    ...over,
  };
}

function decision(over: Partial<PrecisionExclusion>): PrecisionExclusion {
  return {
    id: '00000000-0000-4000-8000-0000000000aa',
    itemCode: 'A',
    measurandKey: 'z',
    participantCode: 'P1',
    replicate: null,
    kind: 'outlier',
    decision: 'confirmed',
    reason: 'test',
    actorName: null,
    at: '2026-01-01T00:00:00Z',
    withdrawnAt: null,
    withdrawnByName: null,
    withdrawnReason: null,
    ...over,
  };
}

describe('analysePrecisionStudy', () => {
  it('NIST StRD SiRstv (certified residual SD 1.04076068334656E-01) gives s_r', () => {
    const a = analysePrecisionStudy(input());
    const lv = a.measurands[0].levels[0];
    expect(lv.p).toBe(5);
    expect(lv.n).toBe(25);
    expect(Math.abs(lv.sr! - 0.104076068334656) / 0.104076068334656).toBeLessThan(1e-12);
    expect(lv.r).toBeCloseTo(2.8 * lv.sr!, 14);
  });

  it('a confirmed cell is set aside, a rejected one kept, a withdrawn one ignored', () => {
    const base = analysePrecisionStudy(input()).measurands[0].levels[0];
    const conf = analysePrecisionStudy(input({ exclusions: [decision({})] })).measurands[0]
      .levels[0];
    expect(conf.p).toBe(4);
    expect(conf.cells.find((c) => c.participantCode === 'P1')!.excluded).toBe(true);
    const rej = analysePrecisionStudy(input({ exclusions: [decision({ decision: 'rejected' })] }))
      .measurands[0].levels[0];
    expect(rej.sr).toBe(base.sr);
    const wd = analysePrecisionStudy(
      input({ exclusions: [decision({ withdrawnAt: '2026-01-02T00:00:00Z' })] }),
    );
    expect(wd.measurands[0].levels[0].p).toBe(5);
    expect(wd.exclusions).toHaveLength(0);
  });

  it('a confirmed replicate removes one value only', () => {
    const a = analysePrecisionStudy(input({ exclusions: [decision({ replicate: 2 })] }));
    const lv = a.measurands[0].levels[0];
    expect(lv.n).toBe(24);
    expect(lv.cells[0].n).toBe(4);
    expect(lv.cells[0].replicates[1].excluded).toBe(true);
  });

  it('bias against a reference value', () => {
    const a = analysePrecisionStudy(
      input({
        references: [{ itemCode: 'A', measurandKey: 'z', value: 196, u: null, source: 'x' }],
      }),
    );
    const b = a.measurands[0].levels[0].bias!;
    expect(b.bias).toBeCloseTo(a.measurands[0].levels[0].mean! - 196, 12);
    expect(b.n).toBe(5);
  });

  it('degenerate studies give nulls and notes, never NaN or a throw', () => {
    const a = analysePrecisionStudy(
      input({
        levels: [
          { itemCode: 'A', label: 'A' },
          { itemCode: 'B', label: 'B' },
        ],
        cells: [
          { itemCode: 'A', measurandKey: 'z', participantCode: 'P1', values: [5] },
          { itemCode: 'A', measurandKey: 'z', participantCode: 'P2', values: [5, 5] },
        ],
      }),
    );
    const [la, lb] = a.measurands[0].levels;
    expect(la.sR).toBe(0); // both labs report 5 exactly
    expect(la.warnings.length).toBeGreaterThan(0);
    expect(lb.p).toBe(0);
    expect(lb.warnings).toContain('No results kept at this level.');
    expect(JSON.stringify(a)).not.toMatch(/NaN|Infinity/);
    expect(a.measurands[0].fit.sR?.chosen ?? null).toBeNull();
  });
});
