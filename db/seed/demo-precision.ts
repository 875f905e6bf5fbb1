/**
 * The demo's finished precision study (ISO 5725-2 round robin): ten of the invented labs measure
 * the Z-average of three latex levels (60, 100 and 200 nm nominal) three times each. One lab's
 * replicates at 100 nm spread widely (Cochran straggler: kept, no cause found), one lab's mean at
 * 200 nm lies far off (Grubbs outlier: set aside, the lab measured at the wrong temperature). The
 * 100 nm level has an accepted reference value, so the page and the reports show a bias.
 * Invented data only.
 *
 * The results are written as submitted versions; the decisions, the reference value and finishing
 * the study go through the product's services (audited like a coordinator's work).
 */
import type { DataSource, EntityManager } from 'typeorm';
import {
  Enrolment,
  type Measurand,
  Round,
  Submission,
  SubmissionVersion,
  TestItem,
} from '../entities';
import { DEFAULT_INSTRUCTIONS } from '../../shared/contracts/rounds';
import { saveDemoMeasurand } from './demo-rows';
import type { RoundState } from '../../shared/contracts/round-states';
import type { SessionUser } from '../../api/src/auth/session-user';
import type { AppContext } from '../../api/src/services/context';
import { finishStudy, putReferences, recordDecisions } from '../../api/src/services/precision';

/** One lab of a study: its organisation, participant code and replicates per level code. */
export interface PrecisionStudyLab {
  organisationId: string;
  participantCode: string;
  values: Record<string, number[]>;
}

export interface PrecisionStudySpec {
  schemeId: string;
  code: string;
  title: string;
  state: RoundState;
  /** 'pt' writes the same data as a PT round (tests use it for the 422 answers). */
  kind?: 'pt' | 'precision';
  resultsDueAt?: Date;
  levels: { code: string; material: string; nominalSizeNm: number | null }[];
  measurand: {
    key: string;
    name: string;
    unit: string;
    decimals: number;
    replicatesRequired: number;
  };
  labs: PrecisionStudyLab[];
}

export interface WrittenPrecisionStudy {
  round: Round;
  items: TestItem[];
  measurand: Measurand;
  enrolments: Enrolment[];
}

/** Writes a study (round, levels, one measurand, enrolments, submitted versions) in one transaction. */
export async function writePrecisionStudy(
  ds: DataSource,
  spec: PrecisionStudySpec,
): Promise<WrittenPrecisionStudy> {
  const run = async (em: EntityManager): Promise<WrittenPrecisionStudy> => {
    const round = await em.save(
      Round,
      em.create(Round, {
        schemeId: spec.schemeId,
        code: spec.code,
        title: spec.title,
        kind: spec.kind ?? 'precision',
        state: spec.state,
        resultsDueAt: spec.resultsDueAt ?? null,
        instructions: DEFAULT_INSTRUCTIONS,
      }),
    );
    const items: TestItem[] = [];
    for (const [i, lv] of spec.levels.entries()) {
      items.push(
        await em.save(
          TestItem,
          em.create(TestItem, {
            roundId: round.id,
            code: lv.code,
            material: lv.material,
            nominalSizeNm: lv.nominalSizeNm,
            storageNotes: 'Store at 2–8 °C. Do not freeze.',
            position: i,
          }),
        ),
      );
    }
    const measurand = await saveDemoMeasurand(
      em,
      round.id,
      {
        ...spec.measurand,
        sigmaPtRule: { kind: 'robust-sd' },
        assignedValueRule: { kind: 'consensus' },
        minParticipants: 8,
      },
      0,
    );
    const enrolments: Enrolment[] = [];
    for (const lab of spec.labs) {
      const enrolment = await em.save(
        Enrolment,
        em.create(Enrolment, {
          roundId: round.id,
          organisationId: lab.organisationId,
          participantCode: lab.participantCode,
        }),
      );
      enrolments.push(enrolment);
      const data = {
        items: items
          .filter((it) => lab.values[it.code]?.length)
          .map((it) => ({
            testItemId: it.id,
            results: [
              { measurandId: measurand.id, replicates: lab.values[it.code], uncertainty: null },
            ],
            conditions: {},
            methodNotes: '',
          })),
        acknowledgedWarnings: [],
        explanation: '',
      };
      const sub = await em.save(
        Submission,
        em.create(Submission, {
          enrolmentId: enrolment.id,
          state: 'submitted',
          draft: data as unknown as Record<string, unknown>,
          currentVersion: 1,
          submittedAt: spec.resultsDueAt ?? new Date(),
        }),
      );
      await em.insert(SubmissionVersion, { submissionId: sub.id, version: 1, data });
    }
    return { round, items, measurand, enrolments };
  };
  return ds.transaction(run);
}

/** Invented replicates (nm), ten labs × three levels × three replicates. */
const DEMO_VALUES: Record<string, number[][]> = {
  L060: [
    [61.3, 61.9, 61.7],
    [60.2, 61.0, 61.5],
    [62.6, 62.5, 62.7],
    [62.1, 62.6, 61.7],
    [62.2, 63.6, 62.6],
    [62.1, 62.6, 62.4],
    [61.9, 61.4, 62.7],
    [61.7, 61.9, 61.6],
    [61.4, 61.3, 61.3],
    [61.5, 61.8, 62.2],
  ],
  L100: [
    [103.0, 102.5, 102.2],
    [98.8, 100.7, 99.6],
    [104.4, 102.2, 102.4],
    [100.9, 102.0, 102.5],
    [100.8, 105.8, 101.2], // the straggler (Cochran): wide spread
    [102.8, 103.0, 101.4],
    [100.6, 101.4, 102.5],
    [102.5, 101.7, 99.9],
    [101.1, 101.7, 100.4],
    [100.8, 101.9, 102.2],
  ],
  L200: [
    [205.9, 203.3, 204.3],
    [199.4, 201.2, 200.6],
    [205.7, 204.1, 205.4],
    [202.2, 200.8, 201.6],
    [203.9, 201.9, 206.5],
    [201.9, 205.0, 206.1],
    [201.1, 201.0, 202.4],
    [218.1, 218.8, 219.6], // the outlier (Grubbs): measured at 20 °C instead of 25 °C
    [201.8, 202.8, 201.2],
    [202.7, 201.6, 204.7],
  ],
};

/** Participant codes of the study (invented; the study's own codes, not those of the PT rounds). */
const DEMO_CODES = ['R2K7', 'R3MX', 'R4QD', 'R5TB', 'R6HW', 'R7NC', 'R8VP', 'R9EJ', 'RA3S', 'RB6G'];

/**
 * Loads the finished precision study into the demo scheme: written as a closed round, then the
 * reference value, the two decisions and "finish" through the services.
 */
export async function seedPrecisionStudy(
  ds: DataSource,
  ctx: AppContext,
  actor: SessionUser,
  schemeId: string,
  labIds: string[],
  now: Date,
): Promise<void> {
  const due = new Date(now.getTime() - 120 * 86_400_000);
  due.setUTCHours(17, 0, 0, 0);
  const labs = labIds.slice(0, DEMO_CODES.length).map((organisationId, i) => ({
    organisationId,
    participantCode: DEMO_CODES[i]!,
    values: Object.fromEntries(Object.entries(DEMO_VALUES).map(([k, v]) => [k, v[i]!])),
  }));
  const { round } = await writePrecisionStudy(ds, {
    schemeId,
    code: `NPS-RR-${due.getUTCFullYear()}`,
    title: 'Round robin: repeatability and reproducibility of the Z-average on latex (60–200 nm)',
    state: 'closed',
    resultsDueAt: due,
    levels: [
      { code: 'L060', material: 'polystyrene latex, 60 nm nominal', nominalSizeNm: 60 },
      { code: 'L100', material: 'polystyrene latex, 100 nm nominal', nominalSizeNm: 100 },
      { code: 'L200', material: 'polystyrene latex, 200 nm nominal', nominalSizeNm: 200 },
    ],
    measurand: {
      key: 'z_average',
      name: 'Z-average diameter',
      unit: 'nm',
      decimals: 1,
      replicatesRequired: 3,
    },
    labs,
  });
  await putReferences(ctx, actor, round.id, {
    references: [
      {
        itemCode: 'L100',
        measurandKey: 'z_average',
        value: 101.0,
        u: 0.8,
        source: 'Certificate of the latex reference batch (invented for the demo)',
      },
    ],
  });
  await recordDecisions(ctx, actor, round.id, {
    decisions: [
      {
        itemCode: 'L100',
        measurandKey: 'z_average',
        participantCode: DEMO_CODES[4]!,
        replicate: null,
        kind: 'straggler',
        decision: 'rejected',
        reason:
          'Cochran straggler at 5 %. The lab found no technical cause (no bubble, no dust warning); stragglers are kept (ISO 5725-2 §7.3.2).',
      },
      {
        itemCode: 'L200',
        measurandKey: 'z_average',
        participantCode: DEMO_CODES[7]!,
        replicate: null,
        kind: 'outlier',
        decision: 'confirmed',
        reason:
          'Grubbs outlier at 1 %. The lab confirmed it measured at 20 °C with the viscosity of water at 25 °C; the cell is set aside.',
      },
    ],
  });
  await finishStudy(ctx, actor, round.id);
}
