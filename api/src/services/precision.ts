/**
 * Precision studies (rounds of kind 'precision', ISO 5725-2 round robins): the analysis from the
 * labs' current submitted versions, the coordinator's decisions on flagged cells or replicates,
 * the levels' accepted reference values, finishing the study (closed → evaluated), and the
 * finished studies' s_R offered as σ_pt to later PT rounds of the scheme.
 *
 * The numbers come from the pure shared/evaluation/precision-study.ts, which the browser runs too.
 */
import type { EntityManager } from 'typeorm';
import { In } from 'typeorm';
import {
  Enrolment,
  Measurand,
  PrecisionExclusion,
  PrecisionReference,
  Round,
  RoundTransition,
  Scheme,
  TestItem,
  User,
} from '../../../db/entities';
import type { FieldIssue } from '../../../shared/contracts/common';
import {
  PrecisionDecisionsBody,
  PrecisionReferencesBody,
  PrecisionWithdrawBody,
  type PrecisionAnalysis,
  type PrecisionExclusion as ExclusionView,
  type PrecisionExclusionList,
  type PrecisionSigmaSources,
  type PrecisionStudyInput,
} from '../../../shared/contracts/precision';
import { ROUND_STATE_LABELS, type RoundState } from '../../../shared/contracts/round-states';
import { analysePrecisionStudy } from '../../../shared/evaluation/precision-study';
import type { SessionUser } from '../auth/session-user';
import { badRequest, conflict, notFound, ruleBroken } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';
import { loadRoundInput } from './evaluation';
import { lockRound, transitionRound } from './round-lifecycle';
import { reportProvider } from './provider';
import { VERSION } from '../version';
import type { PrecisionReportInput } from '../../../reports/pdf/precision-report';

/** States in which the analysis can be read (results may be coming in from "collecting" on). */
const READABLE: readonly RoundState[] = [
  'collecting',
  'closed',
  'evaluated',
  'published',
  'reissued',
];
/** A study is finished once the coordinator has approved it (closed → evaluated) or later. */
export const FINISHED: readonly RoundState[] = ['evaluated', 'published', 'reissued'];

/** 422 for a PT round on the precision routes. */
export function assertPrecisionStudy(round: Round): void {
  if (round.kind !== 'precision')
    throw ruleBroken(
      'not_a_precision_study',
      `Round ${round.code} is a proficiency-testing round, not a precision study; it is evaluated with scores on the evaluation page.`,
    );
}

/** 422 for a precision study on the PT evaluation and score routes. */
export function assertProficiencyRound(round: Pick<Round, 'kind' | 'code'>): void {
  if (round.kind === 'precision')
    throw ruleBroken(
      'precision_study_no_scores',
      `Round ${round.code} is a precision study (ISO 5725-2): labs get no z-scores; its repeatability and reproducibility are on the precision page.`,
    );
}

async function userNames(em: EntityManager, ids: (string | null)[]): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))];
  if (wanted.length === 0) return new Map();
  const users = await em.find(User, {
    where: { id: In(wanted) },
    select: { id: true, name: true },
  });
  return new Map(users.map((u) => [u.id, u.name]));
}

async function exclusionViews(
  em: EntityManager,
  roundId: string,
  items: TestItem[],
  measurands: Measurand[],
): Promise<ExclusionView[]> {
  const rows = await em.find(PrecisionExclusion, {
    where: { roundId },
    order: { at: 'DESC', id: 'DESC' },
  });
  const names = await userNames(
    em,
    rows.flatMap((r) => [r.actorId, r.withdrawnBy]),
  );
  const itemCode = new Map(items.map((i) => [i.id, i.code]));
  const mKey = new Map(measurands.map((m) => [m.id, m.key]));
  return rows
    .filter((r) => itemCode.has(r.testItemId) && mKey.has(r.measurandId))
    .map((r) => ({
      id: r.id,
      itemCode: itemCode.get(r.testItemId)!,
      measurandKey: mKey.get(r.measurandId)!,
      participantCode: r.participantCode,
      replicate: r.replicate,
      kind: r.kind,
      decision: r.decision,
      reason: r.reason,
      actorName: r.actorId ? (names.get(r.actorId) ?? null) : null,
      at: r.at.toISOString(),
      withdrawnAt: r.withdrawnAt ? r.withdrawnAt.toISOString() : null,
      withdrawnByName: r.withdrawnBy ? (names.get(r.withdrawnBy) ?? null) : null,
      withdrawnReason: r.withdrawnReason,
    }));
}

/** The input of the pure analysis, from the stored rows (read leniently: odd stored data is skipped). */
export async function loadStudyInput(
  em: EntityManager,
  roundId: string,
): Promise<{
  round: Round;
  input: PrecisionStudyInput;
  items: TestItem[];
  measurands: Measurand[];
}> {
  const loaded = await loadRoundInput(em, roundId);
  const { round, items, measurands } = loaded;
  const scheme = await em.findOne(Scheme, { where: { id: round.schemeId } });
  const itemById = new Map(items.map((i) => [i.id, i]));
  const mById = new Map(measurands.map((m) => [m.id, m]));
  const refs = await em.find(PrecisionReference, { where: { roundId } });
  const input: PrecisionStudyInput = {
    round: {
      id: round.id,
      code: round.code,
      title: round.title,
      state: round.state,
      schemeCode: scheme?.code ?? '',
    },
    decisionsOpen: round.state === 'closed',
    levels: items.map((i) => ({ itemCode: i.code, label: levelLabel(i) })),
    measurands: measurands.map((m) => ({
      key: m.key,
      label: m.name,
      unit: m.unit,
      decimals: m.decimals,
      replicatesRequired: m.replicatesRequired,
    })),
    cells: loaded.input.replicates.map((r) => ({
      itemCode: itemById.get(r.testItemId)!.code,
      measurandKey: mById.get(r.measurandId)!.key,
      participantCode: r.code,
      values: [...r.values],
    })),
    references: refs
      .filter((r) => itemById.has(r.testItemId) && mById.has(r.measurandId))
      .filter((r) => Number.isFinite(r.value))
      .map((r) => ({
        itemCode: itemById.get(r.testItemId)!.code,
        measurandKey: mById.get(r.measurandId)!.key,
        value: r.value,
        u: r.u !== null && Number.isFinite(r.u) && r.u > 0 ? r.u : null,
        source: r.source,
      })),
    exclusions: await exclusionViews(em, roundId, items, measurands),
  };
  return { round, input, items, measurands };
}

/** "A: 60 nm latex" style label of a level. */
function levelLabel(i: TestItem): string {
  return i.material ? `${i.code}: ${i.material}` : i.code;
}

async function analysis(em: EntityManager, roundId: string): Promise<PrecisionAnalysis> {
  const { round, input } = await loadStudyInput(em, roundId);
  assertPrecisionStudy(round);
  return analysePrecisionStudy(input);
}

function assertReadable(round: Round): void {
  if (!READABLE.includes(round.state))
    throw conflict(
      'study_not_collecting',
      `The precision analysis opens once results are being collected; the study is ${ROUND_STATE_LABELS[round.state]}.`,
    );
}

function assertDecisionsOpen(round: Round): void {
  if (round.state !== 'closed')
    throw conflict(
      'decisions_not_open',
      `Decisions on stragglers and outliers are taken while the study is Closed; it is ${ROUND_STATE_LABELS[round.state]}.`,
    );
}

/** GET /rounds/{id}/precision */
export async function getPrecision(ctx: AppContext, roundId: string): Promise<PrecisionAnalysis> {
  const em = ctx.ds.manager;
  const round = await em.findOne(Round, { where: { id: roundId } });
  if (!round) throw notFound('The round');
  assertPrecisionStudy(round);
  assertReadable(round);
  return analysis(em, roundId);
}

/** GET /rounds/{id}/precision/exclusions: every decision, withdrawn ones too. */
export async function listExclusions(
  ctx: AppContext,
  roundId: string,
): Promise<PrecisionExclusionList> {
  const em = ctx.ds.manager;
  const round = await em.findOne(Round, { where: { id: roundId } });
  if (!round) throw notFound('The round');
  assertPrecisionStudy(round);
  const { items, measurands } = await loadRoundInput(em, roundId);
  return { exclusions: await exclusionViews(em, roundId, items, measurands) };
}

/** POST /rounds/{id}/precision/exclusions: records decisions (all or none), audited. */
export async function recordDecisions(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  raw: PrecisionDecisionsBody,
): Promise<PrecisionAnalysis> {
  const body = PrecisionDecisionsBody.parse(raw);
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    assertPrecisionStudy(round);
    assertDecisionsOpen(round);
    const { input, items, measurands } = await loadStudyInput(em, roundId);
    const enrolments = await em.find(Enrolment, { where: { roundId, state: 'enrolled' } });
    const enrolmentOf = new Map(enrolments.map((e) => [e.participantCode, e.id]));
    const issues: FieldIssue[] = [];
    const rows: Partial<PrecisionExclusion>[] = [];
    body.decisions.forEach((d, i) => {
      const at = (f: string) => `decisions.${i}.${f}`;
      const item = items.find((x) => x.code === d.itemCode);
      const m = measurands.find((x) => x.key === d.measurandKey);
      if (!item)
        issues.push({ path: at('itemCode'), message: `No level "${d.itemCode}" in this study.` });
      if (!m)
        issues.push({
          path: at('measurandKey'),
          message: `No measurand "${d.measurandKey}" in this study.`,
        });
      if (!item || !m) return;
      const cell = input.cells.find(
        (c) =>
          c.itemCode === d.itemCode &&
          c.measurandKey === d.measurandKey &&
          c.participantCode === d.participantCode,
      );
      const enrolmentId = enrolmentOf.get(d.participantCode);
      if (!cell || !enrolmentId) {
        issues.push({
          path: at('participantCode'),
          message: `Participant ${d.participantCode} has no submitted results at ${d.itemCode} × ${d.measurandKey}.`,
        });
        return;
      }
      if (d.replicate !== null && d.replicate > cell.values.length) {
        issues.push({
          path: at('replicate'),
          message: `Participant ${d.participantCode} reported ${cell.values.length} replicate(s) there; there is no replicate ${d.replicate}.`,
        });
        return;
      }
      rows.push({
        roundId,
        testItemId: item.id,
        measurandId: m.id,
        enrolmentId,
        participantCode: d.participantCode,
        replicate: d.replicate,
        kind: d.kind,
        decision: d.decision,
        reason: d.reason,
        actorId: actor.id,
      });
    });
    if (issues.length > 0)
      throw badRequest('Some decisions do not name data of this study.', issues);
    for (const row of rows) {
      const saved = await em.save(PrecisionExclusion, em.create(PrecisionExclusion, row));
      await audit(em, actor.id, 'precision.decision', 'round', roundId, {
        exclusionId: saved.id,
        itemId: row.testItemId,
        measurandId: row.measurandId,
        participantCode: row.participantCode,
        replicate: row.replicate,
        kind: row.kind,
        decision: row.decision,
        reason: row.reason,
      });
    }
    return analysis(em, roundId);
  });
}

/** POST /rounds/{id}/precision/exclusions/{exclusionId}/withdraw */
export async function withdrawDecision(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  exclusionId: string,
  raw: PrecisionWithdrawBody,
): Promise<PrecisionAnalysis> {
  const body = PrecisionWithdrawBody.parse(raw);
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    assertPrecisionStudy(round);
    const row = await em.findOne(PrecisionExclusion, { where: { id: exclusionId, roundId } });
    if (!row) throw notFound('The decision');
    assertDecisionsOpen(round);
    if (row.withdrawnAt)
      throw conflict('already_withdrawn', 'This decision was already withdrawn.');
    await em.update(
      PrecisionExclusion,
      { id: row.id },
      { withdrawnAt: new Date(), withdrawnBy: actor.id, withdrawnReason: body.reason },
    );
    await audit(em, actor.id, 'precision.decision-withdrawn', 'round', roundId, {
      exclusionId: row.id,
      reason: body.reason,
    });
    return analysis(em, roundId);
  });
}

/** PUT /rounds/{id}/precision/references: replaces the levels' accepted reference values. */
export async function putReferences(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  raw: PrecisionReferencesBody,
): Promise<PrecisionAnalysis> {
  const body = PrecisionReferencesBody.parse(raw);
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    assertPrecisionStudy(round);
    if (FINISHED.includes(round.state))
      throw conflict(
        'study_finished',
        `The study is ${ROUND_STATE_LABELS[round.state]}; its reference values no longer change.`,
      );
    const items = await em.find(TestItem, { where: { roundId } });
    const measurands = await em.find(Measurand, { where: { roundId } });
    const issues: FieldIssue[] = [];
    const seen = new Set<string>();
    const rows: Partial<PrecisionReference>[] = [];
    body.references.forEach((r, i) => {
      const at = (f: string) => `references.${i}.${f}`;
      const item = items.find((x) => x.code === r.itemCode);
      const m = measurands.find((x) => x.key === r.measurandKey);
      if (!item)
        issues.push({ path: at('itemCode'), message: `No level "${r.itemCode}" in this study.` });
      if (!m)
        issues.push({
          path: at('measurandKey'),
          message: `No measurand "${r.measurandKey}" in this study.`,
        });
      if (!item || !m) return;
      const k = `${item.id}/${m.id}`;
      if (seen.has(k)) {
        issues.push({
          path: at('itemCode'),
          message: `${r.itemCode} × ${r.measurandKey} is listed twice.`,
        });
        return;
      }
      seen.add(k);
      rows.push({
        roundId,
        testItemId: item.id,
        measurandId: m.id,
        value: r.value,
        u: r.u,
        source: r.source,
        updatedBy: actor.id,
      });
    });
    if (issues.length > 0)
      throw badRequest('Some reference values do not name a level of this study.', issues);
    await em.delete(PrecisionReference, { roundId });
    if (rows.length > 0) await em.insert(PrecisionReference, rows);
    await audit(em, actor.id, 'precision.references-set', 'round', roundId, {
      references: body.references,
    });
    return analysis(em, roundId);
  });
}

/** POST /rounds/{id}/precision/finish: every flag decided → closed → evaluated. */
export async function finishStudy(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
): Promise<PrecisionAnalysis> {
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    assertPrecisionStudy(round);
    assertDecisionsOpen(round);
    const a = await analysis(em, roundId);
    if (a.design.participants === 0)
      throw ruleBroken('no_results', 'No lab has submitted results; there is nothing to finish.');
    if (a.pending.length > 0)
      throw ruleBroken(
        'undecided_flags',
        `${a.pending.length} straggler/outlier flag(s) have no decision yet: set each aside or keep it, with a reason.`,
        { pending: a.pending },
      );
    await transitionRound(em, roundId, 'evaluated', { id: actor.id });
    await audit(em, actor.id, 'precision.finished', 'round', roundId, {
      exclusions: a.exclusions.map((e) => e.id),
    });
    return analysis(em, roundId);
  });
}

/** GET /schemes/{id}/precision-sources: finished studies' s_R per measurand and level. */
export async function precisionSources(
  ctx: AppContext,
  schemeId: string,
): Promise<PrecisionSigmaSources> {
  const em = ctx.ds.manager;
  if (!(await em.exists(Scheme, { where: { id: schemeId } }))) throw notFound('The scheme');
  const rounds = await em.find(Round, {
    where: { schemeId, kind: 'precision', state: In([...FINISHED]) },
    order: { createdAt: 'DESC' },
  });
  const studies: PrecisionSigmaSources['studies'] = [];
  for (const r of rounds) {
    const a = analysePrecisionStudy((await loadStudyInput(em, r.id)).input);
    studies.push({
      roundId: r.id,
      roundCode: r.code,
      title: r.title,
      state: r.state,
      measurands: a.measurands.map((m) => ({
        key: m.key,
        label: m.label,
        unit: m.unit,
        levels: m.levels.map((l) => ({
          itemCode: l.itemCode,
          itemLabel: l.itemLabel,
          mean: l.mean,
          sr: l.sr,
          sR: l.sR,
          p: l.p,
        })),
      })),
    });
  }
  return { studies };
}

/** What the precision report builders read (GET /rounds/{id}/reports/precision.pdf|xlsx). */
export async function precisionReportInput(
  ctx: AppContext,
  roundId: string,
): Promise<PrecisionReportInput> {
  const em = ctx.ds.manager;
  const round = await em.findOne(Round, { where: { id: roundId } });
  if (!round) throw notFound('The round');
  assertPrecisionStudy(round);
  assertReadable(round);
  const { input, items } = await loadStudyInput(em, roundId);
  const scheme = await em.findOne(Scheme, { where: { id: round.schemeId } });
  const finished = FINISHED.includes(round.state)
    ? await em.findOne(RoundTransition, {
        where: { roundId, toState: 'evaluated' },
        order: { at: 'DESC' },
      })
    : null;
  return {
    analysis: analysePrecisionStudy(input),
    provider: await reportProvider(em),
    schemeName: scheme?.name ?? '',
    items: items.map((i) => ({
      code: i.code,
      material: i.material,
      nominalSizeNm: i.nominalSizeNm,
    })),
    instructions: round.instructions,
    protocolTemperatureC: round.protocolTemperatureC,
    resultsDueAt: round.resultsDueAt ? round.resultsDueAt.toISOString() : null,
    finishedAt: finished ? finished.at.toISOString() : null,
    enrolled: await em.count(Enrolment, { where: { roundId, state: 'enrolled' } }),
    generatedAt: new Date().toISOString(),
    softwareVersion: VERSION,
  };
}

/**
 * A σ_pt rule of kind 'precision' that names its study must name a finished precision study of
 * the same scheme, by id and code (422 naming the field otherwise).
 */
export async function assertSigmaSource(
  em: EntityManager,
  roundId: string,
  rule: unknown,
  field: string,
): Promise<void> {
  const r = rule as { kind?: string; study?: { roundId: string; roundCode: string } };
  if (r?.kind !== 'precision' || !r.study) return;
  const round = await em.findOne(Round, { where: { id: roundId } });
  const study = await em.findOne(Round, { where: { id: r.study.roundId } });
  if (
    !round ||
    !study ||
    study.kind !== 'precision' ||
    study.schemeId !== round.schemeId ||
    study.code !== r.study.roundCode ||
    !FINISHED.includes(study.state)
  )
    throw ruleBroken(
      'sigma_source_invalid',
      `${field}: σ_R must come from a finished precision study of the same scheme (code ${r.study.roundCode} does not name one).`,
      [{ path: field, message: 'Pick a finished precision study of this scheme.' }],
    );
}
