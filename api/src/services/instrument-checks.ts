import type { EntityManager } from 'typeorm';
import { InstrumentCheck, User } from '../../../db/entities';
import type {
  InstrumentCheck as InstrumentCheckDto,
  InstrumentCheckInput,
} from '../../../shared/contracts/bench';
import { judgeInstrumentCheck } from '../../../shared/bench/instrument-check';
import type { SessionUser } from '../auth/session-user';
import { ruleBroken } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';
import { storedInstrumentCheck } from './stored-rules';

export function instrumentCheckDto(
  c: InstrumentCheck,
  recordedByName: string | null = null,
): InstrumentCheckDto {
  const { runs, verdict } = storedInstrumentCheck(c, `Instrument check of ${c.instrument}`);
  return {
    id: c.id,
    instrument: c.instrument,
    material: c.material,
    referenceValueNm: c.referenceValueNm,
    toleranceNm: c.toleranceNm,
    pdiLimit: c.pdiLimit,
    setPointC: c.setPointC,
    temperatureToleranceC: c.temperatureToleranceC,
    minEquilibrationMin: c.minEquilibrationMin,
    runs,
    notes: c.notes,
    checkedAt: c.checkedAt.toISOString(),
    recordedBy: recordedByName,
    verdict,
  };
}

/** POST /my/instrument-checks: records a check and Ringlet's verdict (the server judges; the browser only previews). */
export async function recordInstrumentCheck(
  ctx: AppContext,
  actor: SessionUser,
  labId: string,
  input: InstrumentCheckInput,
): Promise<InstrumentCheckDto> {
  const checkedAt = input.checkedAt ? new Date(input.checkedAt) : new Date();
  if (checkedAt.getTime() > Date.now() + 5 * 60_000) {
    throw ruleBroken('check_in_future', 'checkedAt: a check cannot be recorded for the future.', [
      { path: 'checkedAt', message: 'Not in the future.' },
    ]);
  }
  const verdict = judgeInstrumentCheck(input);
  return ctx.ds.transaction(async (em) => {
    const row = await em.save(
      InstrumentCheck,
      em.create(InstrumentCheck, {
        organisationId: labId,
        instrument: input.instrument,
        material: input.material,
        referenceValueNm: input.referenceValueNm,
        toleranceNm: input.toleranceNm,
        pdiLimit: input.pdiLimit,
        setPointC: input.setPointC,
        temperatureToleranceC: input.temperatureToleranceC,
        minEquilibrationMin: input.minEquilibrationMin,
        runs: input.runs,
        passed: verdict.passed,
        verdict: { ...verdict },
        notes: input.notes,
        checkedAt,
        recordedBy: actor.id,
      }),
    );
    await audit(em, actor.id, 'instrument-check.recorded', 'instrument_check', row.id, {
      organisationId: labId,
      instrument: input.instrument,
      passed: verdict.passed,
      reasons: verdict.reasons.map((r) => r.code),
    });
    return instrumentCheckDto(row, actor.name);
  });
}

/** GET /my/instrument-checks: the lab's history, newest first, optionally for one instrument. */
export async function listInstrumentChecks(
  ctx: AppContext,
  labId: string,
  instrument?: string,
): Promise<InstrumentCheckDto[]> {
  const qb = ctx.ds
    .getRepository(InstrumentCheck)
    .createQueryBuilder('c')
    .leftJoinAndMapOne('c.recorder', User, 'u', 'u.id = c.recordedBy')
    .where('c.organisationId = :labId', { labId })
    .orderBy('c.checkedAt', 'DESC')
    .addOrderBy('c.createdAt', 'DESC')
    .limit(500);
  if (instrument) qb.andWhere('lower(c.instrument) = lower(:instrument)', { instrument });
  const checks = (await qb.getMany()) as (InstrumentCheck & { recorder: User | null })[];
  return checks.map((c) => instrumentCheckDto(c, c.recorder?.name ?? null));
}

/**
 * The check that covers a submission: the latest one of the instruments the results name (null if
 * they have none), or the lab's latest check when the results name no instrument.
 */
export async function latestCheckFor(
  em: EntityManager,
  labId: string,
  instruments: string[],
): Promise<InstrumentCheck | null> {
  const names = instruments.map((s) => s.trim().toLowerCase()).filter(Boolean);
  if (names.length) {
    const named = await em
      .getRepository(InstrumentCheck)
      .createQueryBuilder('c')
      .where('c.organisation_id = :labId AND lower(c.instrument) IN (:...names)', { labId, names })
      .orderBy('c.checked_at', 'DESC')
      .getOne();
    return named; // an instrument the results name, with no check of its own, counts as unchecked
  }
  return em
    .getRepository(InstrumentCheck)
    .findOne({ where: { organisationId: labId }, order: { checkedAt: 'DESC' } });
}
