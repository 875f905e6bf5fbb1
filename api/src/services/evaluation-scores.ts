/** A lab's own scores of a published round, with a plain-language explanation per score. */
import type { LabScores, ParticipantScore } from '../../../shared/contracts/evaluation';
import { explainScore } from '../../../shared/evaluation/explain';
import { labIds, type SessionUser } from '../auth/session-user';
import { notFound, ruleBroken } from '../http/errors';
import type { AppContext } from './context';

/** Picks the user's lab enrolled in the round (or the one asked for); 404 for anything else. */
export async function myEnrolment(
  ctx: AppContext,
  user: SessionUser,
  roundId: string,
  labId?: string,
): Promise<{ id: string; organisation_id: string; participant_code: string; lab_name: string }> {
  const mine = labIds(user).filter((id) => !labId || id === labId);
  const rows: {
    id: string;
    organisation_id: string;
    participant_code: string;
    lab_name: string;
  }[] = mine.length
    ? await ctx.ds.query(
        `SELECT e.id, e.organisation_id, e.participant_code, o.name AS lab_name FROM enrolment e
           JOIN organisation o ON o.id = e.organisation_id
          WHERE e.round_id = $1 AND e.organisation_id = ANY($2) ORDER BY o.name LIMIT 1`,
        [roundId, mine],
      )
    : [];
  if (!rows[0]) throw notFound('The round');
  return rows[0];
}

export async function myScores(
  ctx: AppContext,
  user: SessionUser,
  roundId: string,
  labId?: string,
): Promise<LabScores> {
  const en = await myEnrolment(ctx, user, roundId, labId);
  const kinds: { kind: string; code: string }[] = await ctx.ds.query(
    'SELECT kind, code FROM round WHERE id = $1',
    [roundId],
  );
  if (kinds[0]?.kind === 'precision')
    throw ruleBroken(
      'precision_study_no_scores',
      `Round ${kinds[0].code} is a precision study (ISO 5725-2): labs get no z-scores.`,
    );
  const heads: {
    id: string;
    version: number;
    published_at: Date | null;
    reissue_reason: string | null;
    code: string;
    title: string;
  }[] = await ctx.ds.query(
    `SELECT e.id, e.version, e.published_at, e.reissue_reason, r.code, r.title FROM evaluation e JOIN round r ON r.id = e.round_id
      WHERE e.round_id = $1 AND e.state = 'published' ORDER BY e.version DESC LIMIT 1`,
    [roundId],
  );
  const head = heads[0];
  if (!head) throw notFound('Published scores of this round');
  // Only the lab's own participant entry leaves the database.
  const rows: {
    test_item_id: string;
    measurand_id: string;
    item_code: string;
    measurand_key: string;
    assigned_value: number | null;
    u_assigned: number | null;
    sigma_pt: number | null;
    constants: { measurandName?: string; unit?: string; decimals?: number };
    p: ParticipantScore;
  }[] = await ctx.ds.query(
    `SELECT er.test_item_id, er.measurand_id, er.item_code, er.measurand_key, er.assigned_value, er.u_assigned, er.sigma_pt, er.constants, p
       FROM evaluation_result er
       JOIN test_item ti ON ti.id = er.test_item_id
       JOIN measurand m ON m.id = er.measurand_id
       CROSS JOIN LATERAL jsonb_array_elements(er.participants) p
      WHERE er.evaluation_id = $1 AND p->>'code' = $2
      ORDER BY ti.position, ti.code, m.position, m.key`,
    [head.id, en.participant_code],
  );
  const inv: { id: string; test_item_id: string; measurand_id: string }[] = await ctx.ds.query(
    `SELECT id, test_item_id, measurand_id FROM investigation WHERE enrolment_id = $1 ORDER BY created_at DESC`,
    [en.id],
  );
  return {
    roundId,
    roundCode: head.code,
    roundTitle: head.title,
    version: head.version,
    publishedAt: head.published_at?.toISOString() ?? null,
    reissueReason: head.reissue_reason,
    participantCode: en.participant_code,
    labName: en.lab_name,
    scores: rows.map((r) => {
      const c = {
        measurandName: r.constants.measurandName ?? r.measurand_key,
        unit: r.constants.unit ?? '',
        decimals: r.constants.decimals ?? 3,
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
        score: r.p,
        explanation: explainScore(r.p, c),
        investigationId:
          inv.find((i) => i.test_item_id === r.test_item_id && i.measurand_id === r.measurand_id)
            ?.id ?? null,
      };
    }),
  };
}
