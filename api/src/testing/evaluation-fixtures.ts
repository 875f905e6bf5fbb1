/**
 * Test and benchmark data for the evaluation: a closed PT round with N invented labs × 2 test
 * items × 2 measurands (Z-average in nm, PDI) × 3 replicates, written straight into the tables
 * (no dependency on the Round desk or Lab bench routes). Values come from a seeded PRNG
 * (mulberry32, shared/stats), so every run builds the same round. Invented data only.
 */
import type { DataSource, EntityManager } from 'typeorm';
import {
  Enrolment,
  Measurand,
  Organisation,
  Round,
  Scheme,
  Submission,
  SubmissionVersion,
  TestItem,
} from '../../../db/entities';
import { mulberry32 } from '../../../shared/stats/synthetic-round';
import { createCast, startTestApp, type Cast, type CastMember } from './test-app';

export interface EvaluationFixtureSpec {
  participants: number;
  seed?: number;
  /** Labs whose Z-average of item 1 is off by this factor (blunders), by index. */
  blunders?: Record<number, number>;
  /** Give every lab a reported expanded uncertainty (k = 2) so ζ and En are scored. */
  withUncertainty?: boolean;
  state?: Round['state'];
  /** Lab name prefix (the confidentiality tests search responses for it). */
  labPrefix?: string;
}

export interface EvaluationFixture {
  round: Round;
  items: TestItem[];
  measurands: Measurand[];
  labs: Organisation[];
  enrolments: Enrolment[];
  /** Replicates as written: [labIndex][item][measurand] → values. */
  values: number[][][][];
}

let counter = 0;

async function insertChunked<T>(
  em: EntityManager,
  target: new () => T,
  rows: object[],
  size = 500,
): Promise<void> {
  for (let i = 0; i < rows.length; i += size)
    await em.insert(target, rows.slice(i, i + size) as never);
}

/** Builds the round in one transaction (about 1 s for 1,000 labs on 2 cores). */
export async function buildEvaluationFixture(
  ds: DataSource,
  spec: EvaluationFixtureSpec,
): Promise<EvaluationFixture> {
  const rnd = mulberry32(spec.seed ?? 20250101);
  const normal = (): number => {
    const u = 1 - rnd();
    const v = rnd();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
  const tag = `${Date.now().toString(36)}${(counter++).toString(36)}`;
  const prefix = spec.labPrefix ?? 'Fixture Lab';
  return ds.transaction(async (em) => {
    const scheme = await em.save(
      Scheme,
      em.create(Scheme, { code: `FX-${tag}`, name: 'Nanoparticle sizing by DLS (fixture)' }),
    );
    const round = await em.save(
      Round,
      em.create(Round, {
        schemeId: scheme.id,
        code: `FX-${tag}-R1`,
        title: 'Fixture round: latex spheres',
        state: spec.state ?? 'closed',
      }),
    );
    const items = await em.save(
      TestItem,
      [
        { code: 'A', material: 'polystyrene latex, 100 nm nominal', nominalSizeNm: 100 },
        { code: 'B', material: 'polystyrene latex, 200 nm nominal', nominalSizeNm: 200 },
      ].map((item, position) => em.create(TestItem, { roundId: round.id, ...item, position })),
    );
    // Both measurands: 3 replicates, robust SD as σ_pt and the consensus as assigned value.
    const measurands = await em.save(
      Measurand,
      [
        { key: 'z_average', name: 'Z-average', unit: 'nm', decimals: 1 },
        { key: 'pdi', name: 'PDI', unit: '', decimals: 3 },
      ].map((m, position) =>
        em.create(Measurand, {
          roundId: round.id,
          ...m,
          replicatesRequired: 3,
          sigmaPtRule: { kind: 'robust-sd' },
          assignedValueRule: { kind: 'consensus' },
          minParticipants: 12,
          position,
        }),
      ),
    );
    const width = String(spec.participants).length;
    const labRows = Array.from({ length: spec.participants }, (_, i) => ({
      name: `${prefix} ${String(i + 1).padStart(width, '0')}`,
      kind: 'lab' as const,
      country: null,
      contactEmail: `lab${i + 1}-${tag}@fixture.test`,
    }));
    await insertChunked(em, Organisation, labRows);
    const labs = await em
      .createQueryBuilder(Organisation, 'o')
      .where('o.contact_email LIKE :t', { t: `%-${tag}@fixture.test` })
      .getMany();
    labs.sort((a, b) => a.name.localeCompare(b.name));
    // Participant codes are shuffled against lab order, as a provider would assign them.
    const codes = labs.map(
      (_, i) => `P${String(((i * 7919) % spec.participants) + 1).padStart(width, '0')}`,
    );
    await insertChunked(
      em,
      Enrolment,
      labs.map((l, i) => ({ roundId: round.id, organisationId: l.id, participantCode: codes[i] })),
    );
    const enrolments = await em.find(Enrolment, { where: { roundId: round.id } });
    const byOrg = new Map(enrolments.map((e) => [e.organisationId, e]));
    const ordered = labs.map((l) => byOrg.get(l.id)!);

    const values: number[][][][] = [];
    const submissions: object[] = [];
    const versions: { enrolmentIndex: number; data: object }[] = [];
    labs.forEach((_, li) => {
      const perItem: number[][][] = [];
      const data = { items: [] as object[], acknowledgedWarnings: [], explanation: '' };
      items.forEach((item, ii) => {
        const perMeasurand: number[][] = [];
        const results: object[] = [];
        measurands.forEach((m, mi) => {
          const target = mi === 0 ? 100 * (ii + 1) : 0.05 + 0.02 * ii;
          let labMean = target * (1 + (mi === 0 ? 0.02 : 0.1) * normal());
          if (mi === 0 && ii === 0 && spec.blunders?.[li]) labMean *= spec.blunders[li]!;
          const reps = [0, 1, 2].map(() =>
            Number(
              (labMean * (1 + (mi === 0 ? 0.005 : 0.02) * normal())).toFixed(mi === 0 ? 2 : 4),
            ),
          );
          perMeasurand.push(reps);
          results.push({
            measurandId: m.id,
            replicates: reps,
            uncertainty: spec.withUncertainty
              ? {
                  kind: 'expanded',
                  value: Number(((mi === 0 ? 0.04 : 0.2) * target).toFixed(4)),
                  k: 2,
                }
              : null,
          });
        });
        perItem.push(perMeasurand);
        data.items.push({ testItemId: item.id, results, conditions: {}, methodNotes: '' });
      });
      values.push(perItem);
      submissions.push({
        enrolmentId: ordered[li]!.id,
        state: 'submitted',
        draft: data,
        currentVersion: 1,
        submittedAt: new Date(),
      });
      versions.push({ enrolmentIndex: li, data });
    });
    await insertChunked(em, Submission, submissions);
    const subRows: { id: string; enrolment_id: string }[] = await em.query(
      'SELECT s.id, s.enrolment_id FROM submission s JOIN enrolment e ON e.id = s.enrolment_id WHERE e.round_id = $1',
      [round.id],
    );
    const subByEnrolment = new Map(subRows.map((r) => [r.enrolment_id, r.id]));
    await insertChunked(
      em,
      SubmissionVersion,
      versions.map((v) => ({
        submissionId: subByEnrolment.get(ordered[v.enrolmentIndex]!.id)!,
        version: 1,
        data: v.data,
      })),
    );
    return { round, items, measurands, labs, enrolments: ordered, values };
  });
}

/**
 * The real app on a fresh database with a fixture round, and a cast whose `users` may join the
 * fixture's labs by id (`lab: fx.labs[0]!.id`).
 */
export async function startFixtureCast(
  spec: EvaluationFixtureSpec,
  users: (fx: EvaluationFixture) => CastMember[],
): Promise<Cast & { fx: EvaluationFixture }> {
  const t = await startTestApp();
  const fx = await buildEvaluationFixture(t.ds, spec);
  return { ...(await createCast(t, { users: users(fx) })), fx };
}
