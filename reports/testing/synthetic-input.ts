/**
 * A report input built without a database, for the builders' tests and the benchmark: an
 * invented round of N participants × 2 items × 2 measurands (Z-average nm, PDI) × 3
 * replicates, evaluated with the shared evaluation (shared/evaluation evaluateRecord), as the
 * server stores it. Seeded PRNG (shared/stats mulberry32): the same input every run.
 */
import { randomUUID } from 'node:crypto';
import { evaluateRecord, type ReplicateInput } from '../../shared/evaluation/evaluate';
import { mulberry32 } from '../../shared/stats/synthetic-round';
import type { ParticipantReportInput, ReportGroup, RoundReportInput } from '../model';

export interface SyntheticSpec {
  participants: number;
  seed?: number;
  /** Indices of labs whose item-A Z-average is doubled (a radius/diameter slip). */
  blunders?: number[];
  reissueReason?: string | null;
  /** Text put into the round title and an exclusion reason (formula-neutralisation tests). */
  hostileText?: string;
}

export function syntheticReportInput(spec: SyntheticSpec): RoundReportInput {
  const rnd = mulberry32(spec.seed ?? 7);
  const normal = () => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());
  const items = [
    {
      id: randomUUID(),
      code: 'A',
      material: 'polystyrene latex, 100 nm nominal',
      nominalSizeNm: 100,
      storageNotes: 'Keep at 4–8 °C; do not freeze.',
      handlingNotes: 'Invert gently ten times before sampling.',
    },
    {
      id: randomUUID(),
      code: 'B',
      material: 'silica in water, 200 nm nominal',
      nominalSizeNm: 200,
      storageNotes: 'Keep at room temperature.',
      handlingNotes: 'Sonicate for 1 min before sampling.',
    },
  ];
  const measurands = [
    {
      id: randomUUID(),
      key: 'z_average',
      name: 'Z-average',
      unit: 'nm',
      decimals: 1,
      replicatesRequired: 3,
      sigmaPtRule: { kind: 'robust-sd' as const },
      assignedValueRule: { kind: 'consensus' as const },
      minParticipants: 12,
    },
    {
      id: randomUUID(),
      key: 'pdi',
      name: 'PDI',
      unit: '',
      decimals: 3,
      replicatesRequired: 3,
      sigmaPtRule: { kind: 'percent' as const, percent: 20 },
      assignedValueRule: { kind: 'consensus' as const },
      minParticipants: 12,
    },
  ];
  const width = Math.max(3, String(spec.participants).length);
  const codes = Array.from(
    { length: spec.participants },
    (_, i) => `P${String(i + 1).padStart(width, '0')}`,
  );
  const replicates: ReplicateInput[] = [];
  codes.forEach((code, li) => {
    items.forEach((item, ii) => {
      measurands.forEach((m, mi) => {
        const target = mi === 0 ? 100 * (ii + 1) : 0.06 + 0.02 * ii;
        let mean = target * (1 + (mi === 0 ? 0.02 : 0.1) * normal());
        if (mi === 0 && ii === 0 && spec.blunders?.includes(li)) mean *= 2;
        const values = [0, 1, 2].map(() =>
          Number((mean * (1 + (mi === 0 ? 0.004 : 0.02) * normal())).toFixed(mi === 0 ? 2 : 4)),
        );
        replicates.push({
          code,
          testItemId: item.id,
          measurandId: m.id,
          values,
          uncertainty: mi === 0 ? { kind: 'expanded', value: 0.04 * target, k: 2 } : null,
        });
      });
    });
  });
  const exclusions = spec.hostileText
    ? [
        {
          participantCode: codes[0]!,
          itemCode: 'B',
          measurandKey: 'pdi',
          rule: 'other' as const,
          reason: spec.hostileText,
        },
      ]
    : [];
  const results = evaluateRecord({
    items,
    measurands,
    replicates,
    settings: { sigmaPtOverrides: [], exclusions },
  });
  const byGroup = new Map<string, Record<string, number[]>>();
  for (const r of replicates) {
    const k = `${r.testItemId}/${r.measurandId}`;
    const rec = byGroup.get(k) ?? {};
    rec[r.code] = [...r.values];
    byGroup.set(k, rec);
  }
  const groups: ReportGroup[] = results.map((r) => ({
    ...r,
    replicates: byGroup.get(`${r.testItemId}/${r.measurandId}`) ?? {},
  }));
  return {
    round: {
      id: randomUUID(),
      code: 'SYN-2025-1',
      title: spec.hostileText ? spec.hostileText : 'Latex and silica spheres',
      kind: 'pt',
      state: 'published',
      schemeCode: 'DLS-NANO',
      schemeName: 'Nanoparticle sizing by DLS',
      schemeDescription:
        'Hydrodynamic diameter (Z-average) and PDI of dispersed nanoparticles by dynamic light scattering (ISO 22412).',
      instructions: 'Measure each item three times at 25 °C in the dispersant supplied.',
      protocolTemperatureC: 25,
      resultsDueAt: '2025-03-01T17:00:00.000Z',
      dispatchedAt: '2025-02-03T09:00:00.000Z',
      dispatchPlanned: false,
    },
    items,
    measurands: measurands.map(({ id, key, name, unit, decimals, replicatesRequired }) => ({
      id,
      key,
      name,
      unit,
      decimals,
      replicatesRequired,
    })),
    studies: [
      {
        itemCode: 'A',
        measurandKey: 'z_average',
        kind: 'homogeneity',
        sigmaPt: 2.1,
        passes: true,
        decision: null,
        decisionReason: null,
        result: {
          g: 10,
          m: 2,
          generalMean: 100.4,
          sx: 0.31,
          sw: 0.4,
          ss: 0.12,
          sigmaPt: 2.1,
          limit: 0.63,
          passes: true,
        },
      },
      {
        itemCode: 'A',
        measurandKey: 'z_average',
        kind: 'stability',
        sigmaPt: 2.1,
        passes: true,
        decision: null,
        decisionReason: null,
        result: { meanFirst: 100.4, meanSecond: 100.6, difference: 0.2, limit: 0.63, passes: true },
      },
    ],
    evaluation: {
      id: randomUUID(),
      version: spec.reissueReason ? 2 : 1,
      state: 'published',
      publishedAt: '2025-03-20T09:00:00.000Z',
      computedAt: '2025-03-19T09:00:00.000Z',
      reissueReason: spec.reissueReason ?? null,
      softwareVersion: '0.1.0',
      comments:
        'Item B was shipped two days late to three participants; their deadline was extended by two days.',
    },
    groups,
    provider: {
      name: 'Invented Colloid Proficiency Service',
      address: '12 Example Lane\nTestville 0000\nNowhere',
      contactEmail: 'pt@invented.example',
      contactPhone: '+00 000 000 000',
      website: 'https://invented.example',
      accreditationBody: 'Invented Accreditation Body',
      accreditationNumber: 'PTP-0000',
      authoriserName: 'Dr Invented Person',
      authoriserRole: 'Scheme coordinator',
      subcontracting: 'No part of this round was subcontracted.',
      logo: null,
    },
    nonReporters: [
      { code: 'PZZ9', withdrawn: false },
      { code: 'PZZ8', withdrawn: true },
    ],
    generatedAt: '2025-03-20T10:00:00.000Z',
  };
}

/** The same round seen by one participant, with an invented Track record. */
export function syntheticParticipantInput(spec: SyntheticSpec, index = 0): ParticipantReportInput {
  const input = syntheticReportInput(spec);
  const code = input.groups[0]!.participants[index]!.code;
  return {
    ...input,
    participantCode: code,
    labName: 'Invented Test Laboratory',
    track: [
      {
        measurandKey: 'z_average',
        measurandName: 'Z-average',
        points: [
          {
            roundId: randomUUID(),
            roundCode: 'SYN-2024-1',
            publishedAt: '2024-04-01T00:00:00.000Z',
            itemCode: 'A',
            z: 0.4,
            signal: 'acceptable',
          },
          {
            roundId: randomUUID(),
            roundCode: 'SYN-2024-2',
            publishedAt: '2024-10-01T00:00:00.000Z',
            itemCode: 'A',
            z: -1.2,
            signal: 'acceptable',
          },
          {
            roundId: input.round.id,
            roundCode: input.round.code,
            publishedAt: input.evaluation.publishedAt,
            itemCode: 'A',
            z: 2.4,
            signal: 'warning',
          },
        ],
        rsz: 0.92,
        findings: [],
      },
    ],
  };
}
