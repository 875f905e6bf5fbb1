/**
 * Gathers what the report builders read from the stored round and its stored evaluation
 * (reports/model.ts). Nothing is recomputed: the numbers are the evaluation's record.
 */
import type { EntityManager } from 'typeorm';
import type { ParticipantReportInput, ReportStudy, RoundReportInput } from '../../../reports/model';
import type { TrackSeries } from '../../../shared/contracts/evaluation';
import { rescaledSumZ, runRules } from '../../../shared/evaluation/run-rules';
import {
  Enrolment,
  Evaluation,
  HomogeneityStudy,
  Measurand,
  Round,
  RoundTransition,
  Scheme,
  TestItem,
} from '../../../db/entities';
import { notFound } from './errors';
import { loadResults } from './evaluation';
import { reportProvider } from './provider';
import { storedStudyResult } from './stored-rules';
import { labTrackRecord } from './track-record';
import { withSafetyBlock } from '../../../shared/contracts/safety';

export interface EvaluationHead {
  id: string;
  round_id: string;
  version: number;
  state: 'draft' | 'committed' | 'published';
  published_at: Date | null;
  computed_at: Date;
  reissue_reason: string | null;
  software_version: string;
  coordinator_comments: string;
}

/** The evaluation's head in the shape reports read (snake_case, as the builders were written for). */
function headOf(e: Evaluation): EvaluationHead {
  return {
    id: e.id,
    round_id: e.roundId,
    version: e.version,
    state: e.state,
    published_at: e.publishedAt,
    computed_at: e.computedAt,
    reissue_reason: e.reissueReason,
    software_version: e.softwareVersion,
    coordinator_comments: e.coordinatorComments,
  };
}

/** The newest evaluation of a round (published only, or any state), or null. */
export async function evaluationHead(
  em: EntityManager,
  roundId: string,
  publishedOnly: boolean,
): Promise<EvaluationHead | null> {
  const e = await em.findOne(Evaluation, {
    where: publishedOnly ? { roundId, state: 'published' } : { roundId },
    order: { version: 'DESC' },
  });
  return e ? headOf(e) : null;
}

/** One evaluation's head by id, or null. */
export async function evaluationHeadById(
  em: EntityManager,
  id: string,
): Promise<EvaluationHead | null> {
  const e = await em.findOne(Evaluation, { where: { id } });
  return e ? headOf(e) : null;
}

export async function roundReportInput(
  em: EntityManager,
  head: EvaluationHead,
): Promise<RoundReportInput> {
  const r = (await em
    .createQueryBuilder(Round, 'r')
    .innerJoinAndMapOne('r.scheme', Scheme, 's', 's.id = r.schemeId')
    .where('r.id = :id', { id: head.round_id })
    .getOne()) as (Round & { scheme: Scheme }) | null;
  if (!r) throw notFound('The round');
  const [items, measurands, enrolled, dispatched, studies] = await Promise.all([
    em.find(TestItem, { where: { roundId: r.id }, order: { position: 'ASC', code: 'ASC' } }),
    em.find(Measurand, { where: { roundId: r.id }, order: { position: 'ASC', key: 'ASC' } }),
    em.find(Enrolment, { where: { roundId: r.id }, order: { participantCode: 'ASC' } }),
    // The first move to in-transit is when the items left.
    em.findOne(RoundTransition, {
      where: { roundId: r.id, toState: 'in-transit' },
      order: { at: 'ASC' },
    }),
    // The Round desk's homogeneity and stability studies, with their item and measurand.
    em
      .createQueryBuilder(HomogeneityStudy, 'h')
      .innerJoinAndMapOne('h.item', TestItem, 'ti', 'ti.id = h.testItemId')
      .innerJoinAndMapOne('h.measurand', Measurand, 'm', 'm.id = h.measurandId')
      .where('h.roundId = :roundId', { roundId: r.id })
      .orderBy('ti.position')
      .addOrderBy('ti.code')
      .addOrderBy('m.position')
      .addOrderBy('h.kind')
      .getMany() as Promise<(HomogeneityStudy & { item: TestItem; measurand: Measurand })[]>,
  ]);
  const dispatchedAt = dispatched?.at ?? null;
  const { results, inputs } = await loadResults(em, head.id);
  const groups = results.map((g) => {
    const rows =
      inputs.find((i) => i.testItemId === g.testItemId && i.measurandId === g.measurandId)?.rows ??
      [];
    const replicates: Record<string, number[]> = {};
    for (const row of rows) replicates[row.code] = row.values;
    return { ...g, replicates };
  });
  const reported = new Set(groups.flatMap((g) => g.participants.map((p) => p.code)));
  return {
    round: {
      id: r.id,
      code: r.code,
      title: r.title,
      kind: r.kind,
      state: r.state,
      schemeCode: r.scheme.code,
      schemeName: r.scheme.name,
      schemeDescription: r.scheme.description,
      instructions: withSafetyBlock(r.instructions),
      protocolTemperatureC: r.protocolTemperatureC,
      resultsDueAt: r.resultsDueAt?.toISOString() ?? null,
      dispatchedAt: dispatchedAt?.toISOString() ?? r.dispatchOn ?? null,
      dispatchPlanned: !dispatchedAt && !!r.dispatchOn,
    },
    items: items.map((i) => ({
      id: i.id,
      code: i.code,
      material: i.material,
      nominalSizeNm: i.nominalSizeNm,
      storageNotes: i.storageNotes,
      handlingNotes: i.handlingNotes,
    })),
    measurands: measurands.map((m) => ({
      id: m.id,
      key: m.key,
      name: m.name,
      unit: m.unit,
      decimals: m.decimals,
      replicatesRequired: m.replicatesRequired,
    })),
    studies: studies.map((s): ReportStudy => ({
      itemCode: s.item.code,
      measurandKey: s.measurand.key,
      kind: s.kind,
      sigmaPt: s.sigmaPt,
      passes: s.passes,
      decision: s.decision,
      decisionReason: s.decisionReason,
      result: storedStudyResult(s.result, `The ${s.kind} study of ${s.item.code}`),
    })),
    evaluation: {
      id: head.id,
      version: head.version,
      state: head.state,
      publishedAt: head.published_at?.toISOString() ?? null,
      computedAt: head.computed_at.toISOString(),
      reissueReason: head.reissue_reason,
      softwareVersion: head.software_version,
      comments: head.coordinator_comments ?? '',
    },
    groups,
    provider: await reportProvider(em),
    nonReporters: enrolled
      .filter((e) => !reported.has(e.participantCode))
      .map((e) => ({ code: e.participantCode, withdrawn: e.state === 'withdrawn' })),
    generatedAt: new Date().toISOString(),
  };
}

export async function participantReportInput(
  em: EntityManager,
  head: EvaluationHead,
  lab: { organisationId: string; participantCode: string; labName: string },
): Promise<ParticipantReportInput> {
  const base = await roundReportInput(em, head);
  const track = trackUntil(await labTrackRecord(em, lab.organisationId), head.published_at);
  return { ...base, participantCode: lab.participantCode, labName: lab.labName, track };
}

/**
 * The Track record as it stood when a report was issued: only rounds published no later than
 * `issuedAt` (a report shows what was known then), with RSZ and run rules recomputed on those.
 * An unpublished preview shows everything published so far.
 */
export function trackUntil(series: TrackSeries[], issuedAt: Date | null): TrackSeries[] {
  if (!issuedAt) return series;
  const limit = issuedAt.getTime();
  return series
    .map((s) => {
      const points = s.points.filter(
        (p) => p.publishedAt !== null && new Date(p.publishedAt).getTime() <= limit,
      );
      return {
        ...s,
        points,
        rsz: rescaledSumZ(points.map((p) => p.z)),
        findings: runRules(points.map((p) => ({ z: p.z, label: `${p.roundCode} ${p.itemCode}` }))),
      };
    })
    .filter((s) => s.points.length > 0);
}
