/**
 * A lab's Track record: its z-scores (the score its signal followed: z or z′) across published
 * rounds, per measurand, with run rules and the rescaled sum of z-scores (shared/evaluation).
 */
import {
  ScoreKind,
  Signal,
  type TrackRecord,
  type TrackSeries,
} from '../../../shared/contracts/evaluation';
import { runRules, rescaledSumZ } from '../../../shared/evaluation/run-rules';
import { labIds, type SessionUser } from '../auth/session-user';
import * as z from 'zod';
import { Organisation } from '../../../db/entities';
import { notFound, ruleBroken } from './errors';
import type { EntityManager } from 'typeorm';
import type { AppContext } from './context';

export async function trackRecord(
  ctx: AppContext,
  user: SessionUser,
  labId?: string,
): Promise<TrackRecord> {
  const labs = labIds(user);
  const lab = labId ?? labs[0];
  if (!lab || !labs.includes(lab)) throw notFound('The lab');
  const org = await ctx.ds.manager.findOne(Organisation, {
    where: { id: lab },
    select: { id: true, name: true },
  });
  return {
    labId: lab,
    labName: org?.name ?? '',
    series: await labTrackRecord(ctx.ds.manager, lab),
  };
}

/**
 * One row of a lab's published scores: the round, the item and measurand of an evaluation result,
 * and the lab's entry of its stored `participants` (jsonb, the ParticipantScore contract).
 */
const TrackRow = z.object({
  round_id: z.string(),
  round_code: z.string(),
  published_at: z.date().nullable(),
  item_code: z.string(),
  measurand_key: z.string(),
  measurand_name: z.string(),
  z: z.number().nullable(),
  zp: z.number().nullable(),
  kind: ScoreKind.nullable(),
  signal: Signal.nullable(),
});

function trackRow(raw: unknown): z.infer<typeof TrackRow> {
  const r = TrackRow.safeParse(raw);
  if (r.success) return r.data;
  const round = z.object({ round_code: z.string() }).safeParse(raw);
  throw ruleBroken(
    'stored_result_unreadable',
    `Round ${round.success ? round.data.round_code : '(unknown)'}: a stored score cannot be read; ask the coordinator to evaluate the round again.`,
  );
}

/**
 * The Track record of one lab, by id (its own members, its individual report, and assessors it
 * granted access): z or z′ per published round, per measurand, with run rules and RSZ.
 */
export async function labTrackRecord(em: EntityManager, labId: string): Promise<TrackSeries[]> {
  const raw: unknown[] = await em.query(
    `SELECT r.id AS round_id, r.code AS round_code, e.published_at, er.item_code, er.measurand_key,
            COALESCE(er.constants->>'measurandName', er.measurand_key) AS measurand_name,
            (p->>'z')::float8 AS z, (p->>'zPrime')::float8 AS zp, p->>'scoreKind' AS kind, p->>'signal' AS signal
       FROM enrolment en
       JOIN round r ON r.id = en.round_id
       JOIN LATERAL (SELECT * FROM evaluation x WHERE x.round_id = r.id AND x.state = 'published' ORDER BY x.version DESC LIMIT 1) e ON true
       JOIN evaluation_result er ON er.evaluation_id = e.id
       CROSS JOIN LATERAL jsonb_array_elements(er.participants) p
      WHERE en.organisation_id = $1 AND p->>'code' = en.participant_code
      ORDER BY e.published_at, r.code, er.item_code`,
    [labId],
  );
  const series = new Map<string, TrackSeries>();
  for (const r of raw.map(trackRow)) {
    const z = r.kind === 'zPrime' ? r.zp : r.z;
    if (z === null || r.signal === null) continue;
    let s = series.get(r.measurand_key);
    if (!s)
      series.set(
        r.measurand_key,
        (s = {
          measurandKey: r.measurand_key,
          measurandName: r.measurand_name,
          points: [],
          rsz: null,
          findings: [],
        }),
      );
    s.points.push({
      roundId: r.round_id,
      roundCode: r.round_code,
      publishedAt: r.published_at?.toISOString() ?? null,
      itemCode: r.item_code,
      z,
      signal: r.signal,
    });
  }
  for (const s of series.values()) {
    s.rsz = rescaledSumZ(s.points.map((p) => p.z));
    s.findings = runRules(s.points.map((p) => ({ z: p.z, label: `${p.roundCode} ${p.itemCode}` })));
  }
  return [...series.values()];
}
