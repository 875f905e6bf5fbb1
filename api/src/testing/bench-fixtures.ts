import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { Enrolment, Measurand, Round, Scheme, Shipment, TestItem } from '../../../db/entities';
import type { RoundState } from '../../../shared/contracts/round-states';
import type { SubmissionData } from '../../../shared/contracts/submission';

export interface BenchRound {
  round: Round;
  items: TestItem[];
  zAverage: Measurand;
  pdi: Measurand;
}

export interface BenchRoundSpec {
  code?: string;
  state?: RoundState;
  /** Due date; default a week from now. */
  resultsDueAt?: Date | null;
  protocolTemperatureC?: number;
  /** Nominal sizes of the items, nm (default 100 and 60). */
  nominalSizes?: number[];
  replicates?: number;
}

/**
 * A round ready for the Lab bench, inserted directly with the entities (no coordinator routes):
 * items A, B…, measurands z_average (nm) and pdi, each with the required replicates.
 */
export async function createBenchRound(
  ds: DataSource,
  spec: BenchRoundSpec = {},
): Promise<BenchRound> {
  const code = spec.code ?? `LB-${randomUUID().slice(0, 8)}`;
  const scheme = await ds
    .getRepository(Scheme)
    .save({ code: `S-${code}`, name: 'Nanoparticle sizing by DLS' });
  const round = await ds.getRepository(Round).save({
    schemeId: scheme.id,
    code,
    title: `Sizing round ${code}`,
    state: spec.state ?? 'collecting',
    resultsDueAt:
      spec.resultsDueAt === undefined ? new Date(Date.now() + 7 * 86400_000) : spec.resultsDueAt,
    instructions:
      'Equilibrate each item at the protocol temperature for 10 min. Measure three runs per item.',
    protocolTemperatureC: spec.protocolTemperatureC ?? 25,
  });
  const sizes = spec.nominalSizes ?? [100, 60];
  const items: TestItem[] = [];
  for (const [i, size] of sizes.entries()) {
    items.push(
      await ds.getRepository(TestItem).save({
        roundId: round.id,
        code: String.fromCharCode(65 + i),
        material: `Polystyrene latex in water, nominal ${size} nm`,
        nominalSizeNm: size,
        storageNotes: 'Store at 2–8 °C; do not freeze.',
        handlingNotes: 'Invert gently ten times before sampling; do not sonicate.',
        position: i,
      }),
    );
  }
  const replicates = spec.replicates ?? 3;
  const rule = { kind: 'fixed', value: 1 };
  const zAverage = await ds.getRepository(Measurand).save({
    roundId: round.id,
    key: 'z_average',
    name: 'Z-average',
    unit: 'nm',
    decimals: 1,
    replicatesRequired: replicates,
    sigmaPtRule: rule,
    assignedValueRule: { kind: 'consensus' },
    position: 0,
  });
  const pdi = await ds.getRepository(Measurand).save({
    roundId: round.id,
    key: 'pdi',
    name: 'PDI',
    unit: '1',
    decimals: 3,
    replicatesRequired: replicates,
    sigmaPtRule: rule,
    assignedValueRule: { kind: 'consensus' },
    position: 1,
  });
  return { round, items, zAverage, pdi };
}

/** Enrols a lab with a participant code (and a dispatched shipment). */
export async function enrol(
  ds: DataSource,
  roundId: string,
  labId: string,
  participantCode: string,
  extensionUntil: Date | null = null,
): Promise<Enrolment> {
  const e = await ds
    .getRepository(Enrolment)
    .save({ roundId, organisationId: labId, participantCode, extensionUntil });
  await ds
    .getRepository(Shipment)
    .save({ enrolmentId: e.id, dispatchedOn: new Date().toISOString().slice(0, 10) });
  return e;
}

/** Complete, clean results for every item (three runs near the nominal size, water at 25 °C). */
export function cleanResults(
  r: BenchRound,
  overrides: Partial<SubmissionData> = {},
): SubmissionData {
  return {
    items: r.items.map((item) => {
      const n = item.nominalSizeNm ?? 100;
      return {
        testItemId: item.id,
        results: [
          {
            measurandId: r.zAverage.id,
            replicates: [1.02, 1.025, 1.03].map((f) => Math.round(n * f * 10) / 10),
            uncertainty: { kind: 'expanded', value: 2, k: 2 },
          },
          { measurandId: r.pdi.id, replicates: [0.05, 0.055, 0.06], uncertainty: null },
        ],
        conditions: {
          instrument: 'Sizer One',
          laserWavelengthNm: 633,
          scatteringAngleDeg: 173,
          temperatureC: 25,
          equilibrationMin: 10,
          dispersant: 'water',
          viscosityMPas: 0.89,
          refractiveIndex: 1.332,
          dilution: '1:100',
          filterPoreUm: null,
          cuvette: 'disposable polystyrene',
        },
        methodNotes: '',
      };
    }),
    acknowledgedWarnings: [],
    explanation: '',
    ...overrides,
  };
}

/** A passing instrument check body (common practice values: 92 nm latex, ± 3 nm, PDI ≤ 0.025, 25 °C, ≥ 5 min). */
export function passingCheck(instrument = 'Sizer One') {
  return {
    instrument,
    material: 'Polystyrene latex, nominal 92 nm',
    referenceValueNm: 92,
    toleranceNm: 3,
    pdiLimit: 0.025,
    setPointC: 25,
    temperatureToleranceC: 0.5,
    minEquilibrationMin: 5,
    runs: [
      { zAverageNm: 93.1, pdi: 0.018, temperatureC: 25, equilibrationMin: 5 },
      { zAverageNm: 92.4, pdi: 0.021, temperatureC: 25, equilibrationMin: 5 },
      { zAverageNm: 93.6, pdi: 0.025, temperatureC: 25.1, equilibrationMin: 6 },
    ],
  };
}
