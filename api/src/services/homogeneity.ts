import type { EntityManager } from 'typeorm';
import { HomogeneityStudy, Measurand, TestItem } from '../../../db/entities';
import type {
  StudyDecision,
  Study as StudyDto,
  StudyInput,
} from '../../../shared/contracts/rounds';
import { homogeneityCheck, stabilityCheck, type SigmaPtRule } from '../../../shared/stats';
import { mean } from '../../../shared/stats';
import type * as z from 'zod';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound, ruleBroken } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';
import { lockRound } from './round-lifecycle';
import { storedSigmaPtRule } from './stored-rules';

type ParsedStudy = z.output<typeof StudyInput>;

/** States in which studies may be entered and decisions recorded (not after publication). */
const STUDY_STATES = [
  'draft',
  'enrolling',
  'in-transit',
  'collecting',
  'closed',
  'evaluated',
  'reissued',
];

/**
 * σ_pt for a homogeneity/stability check, unit of the measurand: the coordinator's value, else
 * the measurand's fixed σ_pt, else its percentage of the study's mean. Rules that depend on the
 * round's results (robust SD, precision data) need the coordinator's value.
 */
export function studySigmaPt(
  given: number | null,
  rule: SigmaPtRule,
  studyMean: number,
): number | null {
  if (given !== null) return given;
  if (rule.kind === 'fixed') return rule.value;
  if (rule.kind === 'percent') return (rule.percent / 100) * Math.abs(studyMean);
  if (rule.kind === 'precision') return rule.sigmaR;
  return null;
}

function studyDto(s: HomogeneityStudy, item: TestItem, m: Measurand): StudyDto {
  return {
    id: s.id,
    roundId: s.roundId,
    testItemId: s.testItemId,
    testItemCode: item.code,
    measurandId: s.measurandId,
    measurandName: m.name,
    unit: m.unit,
    kind: s.kind,
    sigmaPt: s.sigmaPt,
    data: s.data,
    result: s.result,
    passes: s.passes,
    decision: s.decision,
    decisionReason: s.decisionReason,
    decidedAt: s.decidedAt?.toISOString() ?? null,
    createdAt: s.createdAt.toISOString(),
  };
}

export async function listStudies(em: EntityManager, roundId: string): Promise<StudyDto[]> {
  await lockRoundless(em, roundId);
  const studies = await em.find(HomogeneityStudy, {
    where: { roundId },
    order: { createdAt: 'ASC' },
  });
  const items = new Map((await em.find(TestItem, { where: { roundId } })).map((i) => [i.id, i]));
  const ms = new Map((await em.find(Measurand, { where: { roundId } })).map((m) => [m.id, m]));
  return studies.map((s) => studyDto(s, items.get(s.testItemId)!, ms.get(s.measurandId)!));
}

async function lockRoundless(em: EntityManager, roundId: string): Promise<void> {
  const n: unknown[] = await em.query(`SELECT 1 FROM round WHERE id = $1`, [roundId]);
  if (!n.length) throw notFound('The round');
}

/**
 * Computes and stores a homogeneity (ISO 13528 B.2) or stability (B.5) check with the stats
 * engine, replacing an earlier study of the same item × measurand × kind (and its decision).
 * A study passes on the basic criterion (s_s ≤ 0.3σ_pt, |ȳ₁ − ȳ₂| ≤ 0.3σ_pt) or on the extended
 * one, which allows for the sampling error of the estimates (B.2.3, B.5).
 */
export async function recordStudy(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  input: ParsedStudy,
): Promise<StudyDto> {
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    if (!STUDY_STATES.includes(round.state))
      throw conflict('round_locked', 'A published round does not change in place; reissue it.');
    const item = await em.findOne(TestItem, { where: { id: input.testItemId, roundId } });
    if (!item) throw ruleBroken('item_unknown', 'testItemId: that test item is not in this round.');
    const m = await em.findOne(Measurand, { where: { id: input.measurandId, roundId } });
    if (!m)
      throw ruleBroken('measurand_unknown', 'measurandId: that measurand is not in this round.');

    const values = input.kind === 'homogeneity' ? input.data.items.flat() : input.data.first;
    const sigma = studySigmaPt(
      input.sigmaPt,
      storedSigmaPtRule(m.sigmaPtRule, `measurandId: ${m.key}`),
      mean(values),
    );
    if (sigma === null || !(sigma > 0)) {
      throw ruleBroken(
        'sigma_pt_needed',
        `sigmaPt: the σ_pt rule of ${m.name} depends on the round's results; give σ_pt for the check.`,
      );
    }
    let result: Record<string, unknown>;
    let passes: boolean;
    try {
      if (input.kind === 'homogeneity') {
        const r = homogeneityCheck(input.data.items, sigma);
        result = { ...r };
        passes = r.passes || r.passesExtended;
      } else {
        const r = stabilityCheck(input.data.first, input.data.second, sigma);
        result = { ...r };
        passes = r.passes || r.passesExtended;
      }
    } catch (err) {
      if (err instanceof RangeError) throw ruleBroken('study_invalid', `data: ${err.message}`);
      throw err;
    }
    await em.delete(HomogeneityStudy, {
      roundId,
      testItemId: item.id,
      measurandId: m.id,
      kind: input.kind,
    });
    const saved = await em.save(
      HomogeneityStudy,
      em.create(HomogeneityStudy, {
        roundId,
        testItemId: item.id,
        measurandId: m.id,
        kind: input.kind,
        sigmaPt: sigma,
        data: input.data as unknown as Record<string, unknown>,
        result,
        passes,
        createdBy: actor.id,
      }),
    );
    await audit(em, actor.id, `round.${input.kind}-recorded`, 'round', roundId, {
      studyId: saved.id,
      testItemId: item.id,
      measurandId: m.id,
      sigmaPt: sigma,
      passes,
    });
    return studyDto(saved, item, m);
  });
}

/** Records the coordinator's decision on a failing check (unblocks publication). */
export async function decideStudy(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  studyId: string,
  input: z.output<typeof StudyDecision>,
): Promise<StudyDto> {
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    if (!STUDY_STATES.includes(round.state))
      throw conflict('round_locked', 'A published round does not change in place; reissue it.');
    const s = await em.findOne(HomogeneityStudy, { where: { id: studyId, roundId } });
    if (!s) throw notFound('The study');
    if (s.passes) throw conflict('study_passes', 'This check passed; there is nothing to decide.');
    await em.update(
      HomogeneityStudy,
      { id: s.id },
      {
        decision: input.decision,
        decisionReason: input.reason,
        decidedBy: actor.id,
        decidedAt: new Date(),
      },
    );
    await audit(em, actor.id, 'round.homogeneity-decision', 'round', roundId, {
      studyId,
      decision: input.decision,
      reason: input.reason,
    });
    const updated = await em.findOneOrFail(HomogeneityStudy, { where: { id: s.id } });
    const item = await em.findOneOrFail(TestItem, { where: { id: s.testItemId } });
    const m = await em.findOneOrFail(Measurand, { where: { id: s.measurandId } });
    return studyDto(updated, item, m);
  });
}
