/**
 * An invented precision study (report tests only): 8 labs × 3 levels × 3 replicates drawn from a
 * seeded generator, one lab far off at the top level (set aside by a decision), a reference value
 * at the middle level. Invented data.
 */
import type { PrecisionExclusion } from '../../shared/contracts/precision';
import { analysePrecisionStudy } from '../../shared/evaluation/precision-study';
import { mulberry32 } from '../../shared/stats/synthetic-round';
import type { PrecisionReportInput } from '../pdf/precision-report';
import { syntheticReportInput } from './synthetic-input';

export function syntheticPrecisionInput(): PrecisionReportInput {
  const rnd = mulberry32(5725);
  const normal = () => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());
  const levels = [
    { code: 'L1', m: 60, sL: 1, sr: 0.4 },
    { code: 'L2', m: 100, sL: 1.6, sr: 0.7 },
    { code: 'L3', m: 200, sL: 3, sr: 1.2 },
  ];
  const cells = levels.flatMap((lv) =>
    Array.from({ length: 8 }, (_, i) => {
      const mean = lv.m + lv.sL * normal() + (lv.code === 'L3' && i === 7 ? 20 : 0);
      return {
        itemCode: lv.code,
        measurandKey: 'z_average',
        participantCode: `Q${i + 1}`,
        values: [0, 1, 2].map(() => Number((mean + lv.sr * normal()).toFixed(1))),
      };
    }),
  );
  const decision: PrecisionExclusion = {
    id: '00000000-0000-4000-8000-000000000010',
    itemCode: 'L3',
    measurandKey: 'z_average',
    participantCode: 'Q8',
    replicate: null,
    kind: 'outlier',
    decision: 'confirmed',
    reason: 'Grubbs outlier at 1 %; the lab measured at the wrong temperature.',
    actorName: 'Invented Coordinator',
    at: '2025-05-02T10:00:00.000Z',
    withdrawnAt: null,
    withdrawnByName: null,
    withdrawnReason: null,
  };
  const analysis = analysePrecisionStudy({
    round: {
      id: '00000000-0000-4000-8000-000000000011',
      code: 'SYN-RR-2025',
      title: 'Invented round robin on latex',
      state: 'evaluated',
      schemeCode: 'SYN',
    },
    decisionsOpen: false,
    levels: levels.map((l) => ({ itemCode: l.code, label: `${l.code}: latex, ${l.m} nm nominal` })),
    measurands: [
      {
        key: 'z_average',
        label: 'Z-average diameter',
        unit: 'nm',
        decimals: 1,
        replicatesRequired: 3,
      },
    ],
    cells,
    references: [
      {
        itemCode: 'L2',
        measurandKey: 'z_average',
        value: 100,
        u: 0.5,
        source: 'Invented certificate',
      },
    ],
    exclusions: [decision],
  });
  return {
    analysis,
    provider: syntheticReportInput({ participants: 5 }).provider,
    schemeName: 'Invented scheme',
    items: levels.map((l) => ({
      code: l.code,
      material: `latex, ${l.m} nm nominal`,
      nominalSizeNm: l.m,
    })),
    instructions: 'Measure each level three times under repeatability conditions.',
    protocolTemperatureC: 25,
    resultsDueAt: '2025-04-30T17:00:00.000Z',
    finishedAt: '2025-05-03T09:00:00.000Z',
    enrolled: 8,
    generatedAt: '2025-07-01T00:00:00.000Z',
    softwareVersion: 'test',
  };
}
