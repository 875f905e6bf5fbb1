/** A lab's own scores of a published round, with a plain-language explanation per score. */
import { Evaluation, Investigation, Round } from '../../../db/entities';
import type { LabScores } from '../../../shared/contracts/evaluation';
import { explainScore } from '../../../shared/evaluation/explain';
import { labIds, type SessionUser } from '../auth/session-user';
import { notFound, ruleBroken } from './errors';
import type { AppContext } from './context';
import { enrolledLab } from './reports';
import { storedConstants, storedParticipantScore } from './stored-rules';

export async function myScores(
  ctx: AppContext,
  user: SessionUser,
  roundId: string,
  labId?: string,
): Promise<LabScores> {
  const em = ctx.ds.manager;
  // The user's lab enrolled in the round (or the one asked for); 404 for anything else.
  const en = await enrolledLab(
    em,
    roundId,
    labIds(user).filter((id) => !labId || id === labId),
  );
  if (!en) throw notFound('The round');
  const round = await em.findOne(Round, {
    where: { id: roundId },
    select: { id: true, kind: true, code: true, title: true },
  });
  if (round?.kind === 'precision')
    throw ruleBroken(
      'precision_study_no_scores',
      `Round ${round.code} is a precision study (ISO 5725-2): labs get no z-scores.`,
    );
  const head = await em.findOne(Evaluation, {
    where: { roundId, state: 'published' },
    order: { version: 'DESC' },
  });
  if (!round || !head) throw notFound('Published scores of this round');
  // Only the lab's own participant entry leaves the database.
  const rows: {
    test_item_id: string;
    measurand_id: string;
    item_code: string;
    measurand_key: string;
    assigned_value: number | null;
    u_assigned: number | null;
    sigma_pt: number | null;
    constants: unknown;
    p: unknown;
  }[] = await em.query(
    `SELECT er.test_item_id, er.measurand_id, er.item_code, er.measurand_key, er.assigned_value, er.u_assigned, er.sigma_pt, er.constants, p
       FROM evaluation_result er
       JOIN test_item ti ON ti.id = er.test_item_id
       JOIN measurand m ON m.id = er.measurand_id
       CROSS JOIN LATERAL jsonb_array_elements(er.participants) p
      WHERE er.evaluation_id = $1 AND p->>'code' = $2
      ORDER BY ti.position, ti.code, m.position, m.key`,
    [head.id, en.participantCode],
  );
  const inv = await em.find(Investigation, {
    where: { enrolmentId: en.enrolmentId },
    select: { id: true, testItemId: true, measurandId: true },
    order: { createdAt: 'DESC' },
  });
  return {
    roundId,
    roundCode: round.code,
    roundTitle: round.title,
    version: head.version,
    publishedAt: head.publishedAt?.toISOString() ?? null,
    reissueReason: head.reissueReason,
    participantCode: en.participantCode,
    labName: en.labName,
    scores: rows.map((r) => {
      const constants = storedConstants(r.constants);
      const p = storedParticipantScore(r.p, `${r.item_code} ${r.measurand_key}`);
      const c = {
        measurandName: constants.measurandName ?? r.measurand_key,
        unit: constants.unit ?? '',
        decimals: constants.decimals ?? 3,
        assignedValue: r.assigned_value,
        sigmaPt: r.sigma_pt,
        uAssigned: r.u_assigned,
      };
      return {
        itemCode: r.item_code,
        measurandKey: r.measurand_key,
        measurandName: c.measurandName,
        unit: c.unit,
        decimals: c.decimals,
        assignedValue: r.assigned_value,
        uAssigned: r.u_assigned,
        sigmaPt: r.sigma_pt,
        score: p,
        explanation: explainScore(p, c),
        investigationId:
          inv.find((i) => i.testItemId === r.test_item_id && i.measurandId === r.measurand_id)
            ?.id ?? null,
      };
    }),
  };
}
