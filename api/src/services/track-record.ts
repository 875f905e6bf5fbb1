/**
 * A lab's Track record: its z-scores (the score its signal followed: z or z′) across published
 * rounds, per measurand, with run rules and the rescaled sum of z-scores (shared/evaluation).
 */
import type { TrackRecord, TrackSeries } from '../../../shared/contracts/evaluation';
import { runRules, rescaledSumZ } from '../../../shared/evaluation/run-rules';
import { labIds, type SessionUser } from '../auth/session-user';
import { notFound } from '../http/errors';
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
  const org: { name: string }[] = await ctx.ds.query(
    'SELECT name FROM organisation WHERE id = $1',
    [lab],
  );
  return {
    labId: lab,
    labName: org[0]?.name ?? '',
    series: await labTrackRecord(ctx.ds.manager, lab),
  };
}

/**
 * The Track record of one lab, by id (its own members, its individual report, and assessors it
 * granted access): z or z′ per published round, per measurand, with run rules and RSZ.
 */
export async function labTrackRecord(em: EntityManager, labId: string): Promise<TrackSeries[]> {
  const rows: {
    round_id: string;
    round_code: string;
    published_at: Date | null;
    item_code: string;
    measurand_key: string;
    measurand_name: string;
    z: number | null;
    zp: number | null;
    kind: string;
    signal: 'acceptable' | 'warning' | 'action' | null;
  }[] = await em.query(
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
  for (const r of rows) {
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
