import type { PrecisionStudyInput } from '@ringlet/shared/contracts/precision';
import { analysePrecisionStudy } from '@ringlet/shared/evaluation/precision-study';
import anova from '../../../../shared/stats/fixtures/precision-nist-anova.json';
import uranium from '../../../../shared/stats/fixtures/precision-grubbs-uranium.json';
import {
  curveOf,
  fix,
  inputFromAnalysis,
  mandelBars,
  pendingCells,
  replicatesText,
  withDecisions,
} from './precision-view';

const ROUND = {
  id: '8d0f5b8e-1c7a-4d7e-9a3b-2f1e0c9d8b7a',
  code: 'PS-1',
  title: 'Precision study',
  state: 'closed' as const,
  schemeCode: 'DLS',
};

function study(cells: Array<{ code: string; values: number[] }>): PrecisionStudyInput {
  return {
    round: ROUND,
    decisionsOpen: true,
    levels: [{ itemCode: 'A', label: 'A · latex 100 nm' }],
    measurands: [
      { key: 'z_average', label: 'Z-average', unit: 'nm', decimals: 2, replicatesRequired: 5 },
    ],
    cells: cells.map((c) => ({
      itemCode: 'A',
      measurandKey: 'z_average',
      participantCode: c.code,
      values: c.values,
    })),
    references: [],
    exclusions: [],
  };
}

// NIST StRD ANOVA, SiRstv: 5 groups × 5 replicates read as 5 labs at one level.
const sirstv = study(
  anova.sets.SiRstv.groups.map((g, i) => ({ code: `L${i + 1}`, values: g.map(Number) })),
);
// NIST/SEMATECH e-Handbook §1.3.5.17.1 (Tietjen–Moore uranium data), one result per lab.
const uraniumStudy = study(uranium.values.map((v, i) => ({ code: `U${i + 1}`, values: [v] })));

describe('precision page view', () => {
  it('rebuilds the input from the answer: the shared function gives the same analysis again', () => {
    const a = analysePrecisionStudy(sirstv);
    // NIST StRD SiRstv certified residual SD = s_r.
    expect(a.measurands[0]!.levels[0]!.sr).toBeCloseTo(
      Number(anova.sets.SiRstv.certified.residualSd),
      12,
    );
    const again = analysePrecisionStudy(inputFromAnalysis(a));
    expect(again).toEqual(a);
    expect(inputFromAnalysis(a).levels).toEqual([{ itemCode: 'A', label: 'A · latex 100 nm' }]);
  });

  it('a confirmed decision sets the cell aside at once: p drops and s_r is pooled over the rest', () => {
    const a = analysePrecisionStudy(sirstv);
    const live = analysePrecisionStudy(
      withDecisions(inputFromAnalysis(a), [
        {
          itemCode: 'A',
          measurandKey: 'z_average',
          participantCode: 'L5',
          replicate: null,
          kind: 'other',
          decision: 'confirmed',
          reason: 'cuvette cracked',
        },
      ]),
    );
    const level = live.measurands[0]!.levels[0]!;
    expect(level.p).toBe(4);
    expect(level.cells.find((c) => c.participantCode === 'L5')!.excluded).toBe(true);
    // Equal n: s_r² is the mean of the four cell variances (ISO 5725-2 §7.4.4 with n_i = n).
    const variances = anova.sets.SiRstv.groups.slice(0, 4).map((g) => {
      const xs = g.map(Number);
      const m = xs.reduce((s, x) => s + x, 0) / xs.length;
      return xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1);
    });
    expect(level.sr).toBeCloseTo(Math.sqrt(variances.reduce((s, v) => s + v, 0) / 4), 12);
    expect(level.sR).not.toBeCloseTo(a.measurands[0]!.levels[0]!.sR!, 6);
    expect(live.exclusions).toHaveLength(1);
    expect(mandelBars(level, 'h').map((b) => b.code)).toEqual(['L1', 'L2', 'L3', 'L4']);
  });

  it('groups open flags per cell: the uranium 245.57 is a Grubbs outlier until decided', () => {
    const a = analysePrecisionStudy(uraniumStudy);
    // e-Handbook: G = 2.4687 for the maximum; ISO 5725-2 two-sided 1 % critical for p = 8 ≈ 2.274.
    expect(a.measurands[0]!.levels[0]!.grubbs.singleHigh!.G).toBeCloseTo(uranium.G, 3); // printed truncated
    const open = pendingCells(a);
    expect(open).toEqual([
      expect.objectContaining({
        participantCode: 'U8',
        classification: 'outlier',
        tests: ['grubbs-single'],
        itemLabel: 'A · latex 100 nm',
        measurandLabel: 'Z-average',
      }),
    ]);
    const kept = analysePrecisionStudy(
      withDecisions(inputFromAnalysis(a), [
        {
          itemCode: 'A',
          measurandKey: 'z_average',
          participantCode: 'U8',
          replicate: null,
          kind: 'outlier',
          decision: 'rejected',
          reason: 'the lab confirmed the value',
        },
      ]),
    );
    expect(pendingCells(kept)).toEqual([]);
    expect(kept.measurands[0]!.levels[0]!.p).toBe(8);
  });

  it('a local decision replaces a stored one even when the browser clock lags', () => {
    const stored = withDecisions(
      sirstv,
      [
        {
          itemCode: 'A',
          measurandKey: 'z_average',
          participantCode: 'L2',
          kind: 'other',
          decision: 'confirmed',
          reason: 'stored',
        },
      ],
      new Date('2030-01-01T00:00:00Z'),
    );
    const next = withDecisions(
      stored,
      [
        {
          itemCode: 'A',
          measurandKey: 'z_average',
          participantCode: 'L2',
          kind: 'other',
          decision: 'rejected',
          reason: 'kept after all',
        },
      ],
      new Date('2020-01-01T00:00:00Z'),
    );
    const level = analysePrecisionStudy(next).measurands[0]!.levels[0]!;
    expect(level.p).toBe(5);
  });

  it('formats numbers, replicates and fitted curves', () => {
    expect(fix(1.23456, 2)).toBe('1.23');
    expect(fix(null, 2)).toBe('—');
    expect(
      replicatesText(
        {
          participantCode: 'X',
          replicates: [
            { replicate: 1, value: 1, excluded: false },
            { replicate: 2, value: 2.5, excluded: true },
          ],
          excluded: false,
          n: 1,
          mean: 1,
          sd: null,
          h: null,
          k: null,
          flags: [],
          classification: 'accepted',
          suspectReplicate: null,
        },
        1,
      ),
    ).toBe('1.0 · [2.5]');
    const base = { fitted: [], relativeResidualSd: null, degreesOfFreedom: 0, equation: 'e' };
    expect(
      curveOf({ ...base, relation: 'linear', parameters: { a: 1, b: 0.5 } }).fn(10),
    ).toBeCloseTo(6, 12);
    expect(
      curveOf({ ...base, relation: 'log-linear', parameters: { c: -2, d: 1 } }).fn(100),
    ).toBeCloseTo(1, 12);
    expect(curveOf({ ...base, relation: 'constant', parameters: { c: 3 } }).fn(7)).toBe(3);
  });
});
