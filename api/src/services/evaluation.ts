/**
 * Round evaluation: compute a draft from the current submitted versions, commit it (closed →
 * evaluated), publish it (evaluated/reissued → published, e-mails every enrolled lab, opens
 * investigations), reissue a published round with a reason (a new version; the published one
 * never changes: a database trigger refuses it too).
 */
import type { EntityManager } from 'typeorm';
import {
  Enrolment,
  Evaluation,
  EvaluationResult,
  Measurand,
  Round,
  TestItem,
} from '../../../db/entities';
import {
  EvaluationSettings,
  type EvaluationView,
  type ItemMeasurandEvaluation,
} from '../../../shared/contracts/evaluation';
import { enqueuePublicationMails } from '../jobs/publication';
import { ROUND_STATE_LABELS } from '../../../shared/contracts/round-states';
import { buildBoard } from '../../../shared/evaluation/board';
import {
  evaluateRecord,
  type EvaluationInput,
  type ReplicateInput,
} from '../../../shared/evaluation/evaluate';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound, ruleBroken } from './errors';
import { VERSION } from '../version';
import { audit } from './audit';
import type { AppContext } from './context';
import { openInvestigations } from './investigations';
import { labMailboxes } from './lab-recipients';
import {
  measurandRules,
  storedAssignedValueRule,
  storedResult,
  storedSigmaPtRule,
} from './stored-rules';
import { lockRound, transitionRound } from './round-lifecycle';

export interface LoadedRound {
  round: Round;
  input: EvaluationInput;
  items: TestItem[];
  measurands: Measurand[];
}

interface VersionRow {
  enrolment_id: string;
  participant_code: string;
  data: {
    items?: {
      testItemId: string;
      results?: {
        measurandId: string;
        replicates?: (number | null)[];
        uncertainty?: ReplicateInput['uncertainty'];
      }[];
    }[];
  };
}

/** A stored uncertainty in the shape the evaluation reads (anything else: none). */
function storedUncertainty(u: unknown): ReplicateInput['uncertainty'] {
  if (!u || typeof u !== 'object') return null;
  const { kind, value, k } = u as { kind?: unknown; value?: unknown; k?: unknown };
  if ((kind !== 'standard' && kind !== 'expanded') || typeof value !== 'number') return null;
  return { kind, value, k: typeof k === 'number' ? k : null };
}

/** Stored settings as the view shows them; settings stored before a bound existed are shown as stored. */
function storedSettings(raw: unknown): EvaluationSettings {
  const r = EvaluationSettings.safeParse(raw ?? {});
  if (r.success) return r.data;
  const o = (raw ?? {}) as Partial<EvaluationSettings>;
  return {
    sigmaPtOverrides: Array.isArray(o.sigmaPtOverrides) ? o.sigmaPtOverrides : [],
    exclusions: Array.isArray(o.exclusions) ? o.exclusions : [],
  };
}

/**
 * The round's items, measurands and the replicates of every enrolled lab's current submitted
 * version (drafts are never evaluated).
 */
export async function loadRoundInput(em: EntityManager, roundId: string): Promise<LoadedRound> {
  const round = await em.findOne(Round, { where: { id: roundId } });
  if (!round) throw notFound('The round');
  const items = await em.find(TestItem, {
    where: { roundId },
    order: { position: 'ASC', code: 'ASC' },
  });
  const measurands = await em.find(Measurand, {
    where: { roundId },
    order: { position: 'ASC', key: 'ASC' },
  });
  const rows: VersionRow[] = await em.query(
    `SELECT en.id AS enrolment_id, en.participant_code, sv.data
       FROM enrolment en
       JOIN submission s ON s.enrolment_id = en.id AND s.current_version > 0
       JOIN submission_version sv ON sv.submission_id = s.id AND sv.version = s.current_version
      WHERE en.round_id = $1 AND en.state = 'enrolled'`,
    [roundId],
  );
  const itemIds = new Set(items.map((i) => i.id));
  const measurandIds = new Set(measurands.map((m) => m.id));
  const replicates: ReplicateInput[] = [];
  // One result per participant × item × measurand: versions stored before duplicates were refused
  // may name an item or a measurand twice; the first counts (never an extra participant).
  const seen = new Set<string>();
  for (const r of rows) {
    for (const it of Array.isArray(r.data?.items) ? r.data.items : []) {
      if (!it || !itemIds.has(it.testItemId)) continue;
      for (const res of Array.isArray(it.results) ? it.results : []) {
        if (!res || !measurandIds.has(res.measurandId)) continue;
        const key = `${r.participant_code}/${it.testItemId}/${res.measurandId}`;
        if (seen.has(key)) continue;
        seen.add(key);
        const values = (Array.isArray(res.replicates) ? res.replicates : []).filter(
          (v): v is number => typeof v === 'number' && Number.isFinite(v),
        );
        if (values.length === 0) continue;
        replicates.push({
          code: r.participant_code,
          testItemId: it.testItemId,
          measurandId: res.measurandId,
          values,
          uncertainty: storedUncertainty(res.uncertainty),
        });
      }
    }
  }
  return {
    round,
    items,
    measurands,
    input: {
      items: items.map((i) => ({ id: i.id, code: i.code })),
      measurands: measurands.map((m) => ({
        id: m.id,
        key: m.key,
        name: m.name,
        unit: m.unit,
        decimals: m.decimals,
        ...measurandRules(m),
        minParticipants: m.minParticipants,
      })),
      replicates,
    },
  };
}

/** Exclusions must name a participant, item and measurand of this round (422 naming the field). */
function checkSettings(loaded: LoadedRound, settings: EvaluationSettings): void {
  const codes = new Set(loaded.input.replicates.map((r) => r.code));
  const itemCodes = new Set(loaded.items.map((i) => i.code));
  const keys = new Set(loaded.measurands.map((m) => m.key));
  settings.exclusions.forEach((x, i) => {
    if (!codes.has(x.participantCode))
      throw ruleBroken(
        'unknown_participant',
        `exclusions.${i}.participantCode: no result from ${x.participantCode} in this round.`,
      );
    if (!itemCodes.has(x.itemCode))
      throw ruleBroken(
        'unknown_item',
        `exclusions.${i}.itemCode: the round has no item ${x.itemCode}.`,
      );
    if (!keys.has(x.measurandKey))
      throw ruleBroken(
        'unknown_measurand',
        `exclusions.${i}.measurandKey: the round has no measurand ${x.measurandKey}.`,
      );
  });
  settings.sigmaPtOverrides.forEach((o, i) => {
    if (!keys.has(o.measurandKey))
      throw ruleBroken(
        'unknown_measurand',
        `sigmaPtOverrides.${i}.measurandKey: the round has no measurand ${o.measurandKey}.`,
      );
    if (o.itemCode !== null && !itemCodes.has(o.itemCode))
      throw ruleBroken(
        'unknown_item',
        `sigmaPtOverrides.${i}.itemCode: the round has no item ${o.itemCode}.`,
      );
  });
}

/** Stores one computed evaluation (state as given) with its results and the codes-only board. */
async function storeEvaluation(
  em: EntityManager,
  actor: SessionUser,
  loaded: LoadedRound,
  settings: EvaluationSettings,
  state: 'draft' | 'committed',
  reissueReason: string | null,
): Promise<Evaluation> {
  const roundId = loaded.round.id;
  checkSettings(loaded, settings);
  const results = evaluateRecord({ ...loaded.input, settings });
  const version = ((await em.maximum(Evaluation, 'version', { roundId })) ?? 0) + 1;
  const now = new Date();
  const evaluation = await em.save(
    Evaluation,
    em.create(Evaluation, {
      roundId,
      version,
      state,
      settings: settings as never,
      softwareVersion: VERSION,
      reissueReason,
      board: buildBoard(results) as never,
      computedAt: now,
      createdBy: actor.id,
      committedAt: state === 'committed' ? now : null,
    }),
  );
  const inputsByGroup = new Map<string, ReplicateInput[]>();
  for (const r of loaded.input.replicates) {
    const k = r.testItemId + '/' + r.measurandId;
    let l = inputsByGroup.get(k);
    if (!l) inputsByGroup.set(k, (l = []));
    l.push(r);
  }
  for (const r of results) {
    const inputs = (inputsByGroup.get(r.testItemId + '/' + r.measurandId) ?? [])
      .map((x) => ({ code: x.code, values: x.values, uncertainty: x.uncertainty }))
      .sort((a, b) => (a.code < b.code ? -1 : a.code > b.code ? 1 : 0));
    await em.insert(EvaluationResult, {
      evaluationId: evaluation.id,
      testItemId: r.testItemId,
      measurandId: r.measurandId,
      itemCode: r.itemCode,
      measurandKey: r.measurandKey,
      n: r.n,
      assignedValue: r.assignedValue,
      uAssigned: r.uAssigned,
      sigmaPt: r.sigmaPt,
      method: r.method,
      constants: {
        ...r.constants,
        robustSd: r.robustSd,
        uNegligible: r.uNegligible,
        sigmaPtRule: r.sigmaPtRule,
        assignedValueRule: r.assignedValueRule,
        measurandName: r.measurandName,
        unit: r.unit,
        decimals: r.decimals,
        softwareVersion: VERSION,
      } as never,
      iterations: r.iterations,
      warnings: r.warnings,
      inputs: inputs as never,
      participants: r.participants as never,
    });
  }
  return evaluation;
}

/** The record of one stored evaluation, in item × measurand order. */
export async function loadResults(
  em: EntityManager,
  evaluationId: string,
): Promise<{ results: ItemMeasurandEvaluation[]; inputs: EvaluationView['inputs'] }> {
  const rows = await em
    .createQueryBuilder(EvaluationResult, 'r')
    .innerJoin(TestItem, 'i', 'i.id = r.test_item_id')
    .innerJoin(Measurand, 'm', 'm.id = r.measurand_id')
    .where('r.evaluation_id = :evaluationId', { evaluationId })
    .orderBy('i.position', 'ASC')
    .addOrderBy('i.code', 'ASC')
    .addOrderBy('m.position', 'ASC')
    .addOrderBy('m.key', 'ASC')
    .getMany();
  const stored = rows.map((r) => storedResult(r, `Result ${r.itemCode}/${r.measurandKey}`));
  const results = rows.map((r, i): ItemMeasurandEvaluation => {
    const { method, constants: c, participants } = stored[i]!;
    const {
      robustSd,
      uNegligible,
      sigmaPtRule,
      assignedValueRule,
      measurandName,
      unit,
      decimals,
      ...constants
    } = c;
    return {
      testItemId: r.testItemId,
      itemCode: r.itemCode,
      measurandId: r.measurandId,
      measurandKey: r.measurandKey,
      measurandName: String(measurandName),
      unit: String(unit),
      decimals: Number(decimals),
      n: r.n,
      method,
      iterations: r.iterations,
      assignedValue: r.assignedValue,
      robustSd: typeof robustSd === 'number' ? robustSd : null,
      uAssigned: r.uAssigned,
      sigmaPt: r.sigmaPt,
      uNegligible: typeof uNegligible === 'boolean' ? uNegligible : null,
      sigmaPtRule: storedSigmaPtRule(sigmaPtRule, `Result ${r.itemCode}/${r.measurandKey}`),
      assignedValueRule: storedAssignedValueRule(
        assignedValueRule,
        `Result ${r.itemCode}/${r.measurandKey}`,
      ),
      constants,
      warnings: r.warnings,
      participants,
    };
  });
  const inputs = rows.map((r, i) => ({
    testItemId: r.testItemId,
    measurandId: r.measurandId,
    rows: stored[i]!.inputs,
  }));
  return { results, inputs };
}

async function view(em: EntityManager, e: Evaluation): Promise<EvaluationView> {
  const round = await em.findOneOrFail(Round, { where: { id: e.roundId } });
  const { results, inputs } = await loadResults(em, e.id);
  return {
    id: e.id,
    roundId: e.roundId,
    roundCode: round.code,
    roundState: round.state,
    version: e.version,
    state: e.state,
    settings: storedSettings(e.settings),
    softwareVersion: e.softwareVersion,
    reissueReason: e.reissueReason,
    createdAt: e.createdAt.toISOString(),
    committedAt: e.committedAt?.toISOString() ?? null,
    publishedAt: e.publishedAt?.toISOString() ?? null,
    results,
    items: (
      await em.find(TestItem, {
        where: { roundId: e.roundId },
        order: { position: 'ASC', code: 'ASC' },
      })
    ).map((i) => ({ id: i.id, code: i.code })),
    measurands: (
      await em.find(Measurand, {
        where: { roundId: e.roundId },
        order: { position: 'ASC', key: 'ASC' },
      })
    ).map((m) => ({
      id: m.id,
      key: m.key,
      name: m.name,
      unit: m.unit,
      decimals: m.decimals,
      ...measurandRules(m),
      minParticipants: m.minParticipants,
    })),
    inputs,
  };
}

/** The newest evaluation of a round (any state), or null. */
export async function latestEvaluation(
  em: EntityManager,
  roundId: string,
  state?: Evaluation['state'],
): Promise<Evaluation | null> {
  return em.findOne(Evaluation, {
    where: state ? { roundId, state } : { roundId },
    order: { version: 'DESC' },
  });
}

/**
 * POST /rounds/{id}/evaluation: computes a draft from the current submitted versions (replacing
 * an earlier draft). Only a closed round is evaluated.
 */
export async function computeDraft(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  input: Partial<EvaluationSettings>,
): Promise<EvaluationView> {
  const settings = EvaluationSettings.parse(input ?? {});
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    if (round.kind === 'precision')
      throw ruleBroken(
        'precision_study_no_scores',
        `Round ${round.code} is a precision study (ISO 5725-2): labs get no z-scores; its repeatability and reproducibility are on the precision page.`,
      );
    if (round.state !== 'closed') {
      throw conflict(
        'round_not_closed',
        `Only a closed round is evaluated; this one is ${ROUND_STATE_LABELS[round.state]}.`,
      );
    }
    await em.delete(Evaluation, { roundId, state: 'draft' });
    const loaded = await loadRoundInput(em, roundId);
    if (loaded.input.replicates.length === 0)
      throw ruleBroken('no_results', 'No lab has submitted results; there is nothing to evaluate.');
    const e = await storeEvaluation(em, actor, loaded, settings, 'draft', null);
    await audit(em, actor.id, 'evaluation.computed', 'round', roundId, {
      evaluationId: e.id,
      version: e.version,
      settings,
    });
    return view(em, e);
  });
}

/** GET /rounds/{id}/evaluation: the newest evaluation of the round (404 before the first). */
export async function getEvaluation(ctx: AppContext, roundId: string): Promise<EvaluationView> {
  const em = ctx.ds.manager;
  if (!(await em.exists(Round, { where: { id: roundId } }))) throw notFound('The round');
  const e = await latestEvaluation(em, roundId);
  if (!e) throw notFound('An evaluation of this round');
  return view(em, e);
}

/** POST /rounds/{id}/evaluation/commit: stores the draft as the round's evaluation (closed → evaluated). */
export async function commitEvaluation(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
): Promise<EvaluationView> {
  return ctx.ds.transaction(async (em) => {
    await lockRound(em, roundId);
    const draft = await latestEvaluation(em, roundId, 'draft');
    if (!draft)
      throw conflict(
        'no_draft',
        'There is no draft evaluation to approve; evaluate the round first.',
      );
    await transitionRound(em, roundId, 'evaluated', { id: actor.id });
    await em.update(Evaluation, { id: draft.id }, { state: 'committed', committedAt: new Date() });
    await audit(em, actor.id, 'evaluation.committed', 'round', roundId, {
      evaluationId: draft.id,
      version: draft.version,
    });
    return view(em, { ...draft, state: 'committed', committedAt: new Date() });
  });
}

/** Where mail to every enrolled lab of a round goes (the rule is labMailboxes). */
export async function labAddresses(
  em: EntityManager,
  roundId: string,
): Promise<{ labName: string; code: string; to: string[] }[]> {
  const enrolments = await em.find(Enrolment, { where: { roundId, state: 'enrolled' } });
  const boxes = await labMailboxes(
    em,
    enrolments.map((e) => e.organisationId),
  );
  return enrolments.map((e) => ({
    labName: boxes.get(e.organisationId)?.labName ?? '',
    code: e.participantCode,
    to: boxes.get(e.organisationId)?.to ?? [],
  }));
}

/**
 * POST /rounds/{id}/publish: publishes the committed evaluation (evaluated or reissued →
 * published), opens an investigation for each warning or action signal, then e-mails every
 * enrolled lab. The published evaluation is immutable afterwards.
 */
export async function publishEvaluation(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
): Promise<{
  evaluationId: string;
  version: number;
  labsNotified: number;
  investigationsOpened: number;
}> {
  const out = await ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    if (round.state !== 'evaluated' && round.state !== 'reissued') {
      throw conflict(
        'round_not_evaluated',
        `Only an evaluated (or reissued) round is published; this one is ${ROUND_STATE_LABELS[round.state]}.`,
      );
    }
    const e = await latestEvaluation(em, roundId);
    if (!e || e.state !== 'committed')
      throw conflict(
        'no_committed_evaluation',
        'Approve an evaluation for publication before publishing.',
      );
    await transitionRound(em, roundId, 'published', { id: actor.id });
    await em.update(Evaluation, { id: e.id }, { state: 'published', publishedAt: new Date() });
    const { results } = await loadResults(em, e.id);
    const opened = await openInvestigations(em, roundId, e.id, results);
    const addresses = await labAddresses(em, roundId);
    await audit(em, actor.id, 'evaluation.published', 'round', roundId, {
      evaluationId: e.id,
      version: e.version,
      investigationsOpened: opened,
    });
    const link = `${ctx.config.publicUrl}/board/rounds/${roundId}/scores`;
    const reissue = e.reissueReason
      ? `\nThis is a corrected version (version ${e.version}): ${e.reissueReason}\n`
      : '';
    const mails = addresses
      .filter((a) => a.to.length > 0)
      .map((a) => ({
        to: a.to,
        subject: `Results of round ${round.code} are published`,
        text:
          `Hello ${a.labName},\n\nThe results of round ${round.code} (${round.title}) are published.\n` +
          `Your participant code is ${a.code}. Read your scores with a plain explanation here:\n\n${link}\n${reissue}\n` +
          `Every other lab appears only by its participant code.\n\nRinglet`,
      }));
    // One queued mail per lab, committed with the publication (api/src/jobs/publication.ts): sent
    // after it by the job queue's worker, retried with back-off, never lost with this process.
    const deliver = await enqueuePublicationMails(ctx, em, mails);
    return { e, opened, sent: mails.length, deliver };
  });
  out.deliver();
  const sent = out.sent;
  return {
    evaluationId: out.e.id,
    version: out.e.version,
    labsNotified: sent,
    investigationsOpened: out.opened,
  };
}

/**
 * POST /rounds/{id}/reissue: corrects a published round. The published evaluation stays as it
 * was; a new committed version is computed from the current data with the given settings and
 * the reason (published → reissued). Publishing it again e-mails the labs.
 */
export async function reissueEvaluation(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  reason: string,
  input: Partial<EvaluationSettings> | undefined,
): Promise<EvaluationView> {
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    // A round left in Reissued without an approved new version (an older desk move could do
    // that) is corrected the same way, so it always leads back to Published.
    const stranded =
      round.state === 'reissued' && (await latestEvaluation(em, roundId))?.state !== 'committed';
    if (round.state !== 'published' && !stranded)
      throw conflict('round_not_published', 'Only a published round is reissued.');
    const prev = await latestEvaluation(em, roundId, 'published');
    const settings = EvaluationSettings.parse({ ...(prev?.settings ?? {}), ...(input ?? {}) });
    if (round.state === 'published')
      await transitionRound(em, roundId, 'reissued', { id: actor.id }, { reason });
    await em.delete(Evaluation, { roundId, state: 'draft' });
    const loaded = await loadRoundInput(em, roundId);
    const e = await storeEvaluation(em, actor, loaded, settings, 'committed', reason);
    await audit(em, actor.id, 'evaluation.reissued', 'round', roundId, {
      evaluationId: e.id,
      version: e.version,
      reason,
      previous: prev?.id ?? null,
    });
    return view(em, e);
  });
}
