/**
 * What an assessor reads of the labs that granted access (active grants only: a lab without
 * one answers 404, and access ends the day the grant ends or is revoked), and the Evidence pack.
 */
import type { EntityManager } from 'typeorm';
import { InstrumentCheck } from '../../../db/entities';
import { buildEvidencePack, type EvidenceFile } from '../../../reports/evidence/evidence-pack';
import {
  buildInstrumentChecksPdf,
  buildInvestigationsPdf,
} from '../../../reports/evidence/lab-records';
import { reportProvider } from './provider';
import { fileSafe } from '../../../reports/text';
import {
  AssessorInvestigation,
  type AssessorInstrumentCheck,
  type AssessorLab,
  type AssessorLabDetail,
  type AssessorRound,
} from '../../../shared/contracts/reports';
import type { SessionUser } from '../auth/session-user';
import { notFound } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';
import { grantedLabIds } from './grants';
import { investigationRecord, selectInvestigations } from './investigations';
import { reportFile, type LabInRound } from './reports';
import { evaluationHead } from './reports-input';

/**
 * A lab's grants to one assessor folded into one span (an aggregate, so raw SQL): the earliest
 * start, and no end while any grant is open-ended. `where` adds the caller's filter ($2…).
 */
interface GrantedLabRow {
  id: string;
  name: string;
  starts_on: string;
  ends_on: string | null;
}

async function selectGrantedLabs(
  em: EntityManager,
  assessorId: string,
  where: string,
  params: unknown[] = [],
): Promise<AssessorLab[]> {
  const rows: GrantedLabRow[] = await em.query(
    `SELECT o.id, o.name, min(g.starts_on)::text AS starts_on,
            CASE WHEN bool_or(g.ends_on IS NULL) THEN NULL ELSE max(g.ends_on)::text END AS ends_on
       FROM assessor_grant g JOIN organisation o ON o.id = g.organisation_id
      WHERE g.assessor_id = $1 AND g.revoked_at IS NULL AND ${where}
      GROUP BY o.id, o.name ORDER BY o.name`,
    [assessorId, ...params],
  );
  return rows.map((r) => ({ id: r.id, name: r.name, startsOn: r.starts_on, endsOn: r.ends_on }));
}

/** GET /assessor/labs: labs with an active grant for the caller. */
export async function assessorLabs(ctx: AppContext, user: SessionUser): Promise<AssessorLab[]> {
  return selectGrantedLabs(
    ctx.ds.manager,
    user.id,
    'g.starts_on <= CURRENT_DATE AND (g.ends_on IS NULL OR g.ends_on >= CURRENT_DATE)',
  );
}

async function grantedLab(
  em: EntityManager,
  user: SessionUser,
  labId: string,
): Promise<AssessorLab> {
  if (!(await grantedLabIds(em, user.id)).includes(labId)) throw notFound('The lab');
  const [lab] = await selectGrantedLabs(em, user.id, 'g.organisation_id = $2', [labId]);
  return lab!;
}

/** A lab's round with its latest published evaluation and its warning and action signals. */
interface LabRoundRow {
  round_id: string;
  code: string;
  title: string;
  state: string;
  participant_code: string;
  version: number | null;
  published_at: Date | null;
  reissue_reason: string | null;
  warnings: number | null;
  actions: number | null;
}

function assessorRound(r: LabRoundRow): AssessorRound {
  return {
    roundId: r.round_id,
    roundCode: r.code,
    roundTitle: r.title,
    roundState: r.state,
    participantCode: r.participant_code,
    version: r.version ?? null,
    publishedAt: r.published_at?.toISOString() ?? null,
    reissueReason: r.reissue_reason,
    warnings: r.warnings ?? 0,
    actions: r.actions ?? 0,
  };
}

/** The lab's rounds (a lateral join and counts over stored scores, so raw SQL). */
async function labRounds(em: EntityManager, labId: string): Promise<AssessorRound[]> {
  const rows: LabRoundRow[] = await em.query(
    `SELECT r.id AS round_id, r.code, r.title, r.state, en.participant_code, e.version, e.published_at, e.reissue_reason,
            (SELECT count(*)::int FROM evaluation_result er CROSS JOIN LATERAL jsonb_array_elements(er.participants) p
              WHERE er.evaluation_id = e.id AND p->>'code' = en.participant_code AND p->>'signal' = 'warning') AS warnings,
            (SELECT count(*)::int FROM evaluation_result er CROSS JOIN LATERAL jsonb_array_elements(er.participants) p
              WHERE er.evaluation_id = e.id AND p->>'code' = en.participant_code AND p->>'signal' = 'action') AS actions
       FROM enrolment en JOIN round r ON r.id = en.round_id
       LEFT JOIN LATERAL (SELECT * FROM evaluation x WHERE x.round_id = r.id AND x.state = 'published' ORDER BY x.version DESC LIMIT 1) e ON true
      WHERE en.organisation_id = $1
      ORDER BY r.created_at DESC`,
    [labId],
  );
  return rows.map(assessorRound);
}

/** The assessor's columns of an investigation record (the contract's fields, in its order). */
const ASSESSOR_INVESTIGATION_FIELDS = Object.keys(
  AssessorInvestigation.shape,
) as (keyof AssessorInvestigation)[];

async function labInvestigations(
  em: EntityManager,
  labId: string,
): Promise<AssessorInvestigation[]> {
  const rows = await selectInvestigations(
    em,
    'i.organisation_id = $1',
    [labId],
    'i.created_at DESC, ti.code, m.key',
  );
  return rows.map((r) => {
    const record = investigationRecord(r);
    return Object.fromEntries(
      ASSESSOR_INVESTIGATION_FIELDS.map((k) => [k, record[k]]),
    ) as AssessorInvestigation;
  });
}

async function labInstrumentChecks(
  em: EntityManager,
  labId: string,
): Promise<AssessorInstrumentCheck[]> {
  const checks = await em.find(InstrumentCheck, {
    select: {
      id: true,
      instrument: true,
      material: true,
      referenceValueNm: true,
      toleranceNm: true,
      passed: true,
      notes: true,
      checkedAt: true,
    },
    where: { organisationId: labId },
    order: { checkedAt: 'DESC' },
    take: 1000,
  });
  return checks.map((c) => ({
    id: c.id,
    instrument: c.instrument,
    material: c.material,
    referenceValueNm: c.referenceValueNm,
    toleranceNm: c.toleranceNm,
    passed: c.passed,
    notes: c.notes,
    checkedAt: c.checkedAt.toISOString(),
  }));
}

/** GET /assessor/labs/{id}/rounds: a granting lab's rounds, investigations and instrument checks. */
export async function assessorLabDetail(
  ctx: AppContext,
  user: SessionUser,
  labId: string,
): Promise<AssessorLabDetail> {
  const em = ctx.ds.manager;
  const lab = await grantedLab(em, user, labId);
  const [rounds, investigations, instrumentChecks] = await Promise.all([
    labRounds(em, labId),
    labInvestigations(em, labId),
    labInstrumentChecks(em, labId),
  ]);
  return { lab, rounds, investigations, instrumentChecks };
}

interface AuditExtractRow {
  id: string;
  at: Date;
  action: string;
  subject_type: string;
  subject_id: string | null;
  details: unknown;
  actor: string | null;
}

/**
 * The audit events about the lab, its investigations and the evaluation of its rounds (no other
 * lab's), as PostgreSQL returns them: the extract's JSON keeps the stored column names.
 */
async function auditExtract(
  em: EntityManager,
  labId: string,
  roundIds: string[],
): Promise<AuditExtractRow[]> {
  return em.query(
    `SELECT a.id, a.at, a.action, a.subject_type, a.subject_id, a.details, u.name AS actor
       FROM audit_event a LEFT JOIN app_user u ON u.id = a.actor_id
      WHERE (a.subject_type = 'organisation' AND a.subject_id = $1::text)
         OR (a.subject_type = 'investigation' AND a.subject_id IN (SELECT id::text FROM investigation WHERE organisation_id::text = $1::text))
         OR (a.subject_type = 'round' AND a.subject_id = ANY($2::text[]) AND a.action IN ('evaluation.committed', 'evaluation.published', 'evaluation.reissued'))
      ORDER BY a.at, a.id LIMIT 20000`,
    [labId, roundIds],
  );
}

/**
 * GET /assessor/labs/{id}/evidence.zip: every published round of the lab with its round report,
 * workbook, individual report and certificate (from the report cache), its investigations,
 * instrument checks and an audit extract, with a manifest of SHA-256 checksums.
 */
export async function evidencePack(
  ctx: AppContext,
  user: SessionUser,
  labId: string,
): Promise<{ file: Buffer; fileName: string }> {
  const em = ctx.ds.manager;
  const lab = await grantedLab(em, user, labId);
  const rounds = await labRounds(em, labId);
  const files: EvidenceFile[] = [];
  const published = rounds.filter((r) => r.version !== null);
  for (const r of published) {
    const head = (await evaluationHead(em, r.roundId, true))!;
    const labIn: LabInRound = {
      organisationId: labId,
      participantCode: r.participantCode,
      labName: lab.name,
    };
    const dir = `rounds/${fileSafe(r.roundCode)}`;
    for (const kind of ['round.pdf', 'round.xlsx', 'participant.pdf', 'certificate.pdf'] as const) {
      const own = kind === 'participant.pdf' || kind === 'certificate.pdf';
      const built = await reportFile(
        ctx,
        user,
        { roundId: r.roundId, kind, organisationId: own ? labId : null, head },
        own ? labIn : null,
        '',
        true,
      );
      if ('pending' in built) throw new Error('unreachable: waited for the build');
      files.push({ path: `${dir}/${built.fileName}`, data: built.file });
    }
  }
  const detail = {
    investigations: await labInvestigations(em, labId),
    instrumentChecks: await labInstrumentChecks(em, labId),
  };
  const generatedAt = new Date().toISOString();
  const recordsMeta = {
    lab: lab.name,
    provider: await reportProvider(em),
    generatedFor: `${user.name} <${user.email}>`,
    generatedAt,
  };
  files.push({ path: 'rounds.json', data: Buffer.from(JSON.stringify(rounds, null, 2)) });
  files.push({
    path: 'investigations.pdf',
    data: await buildInvestigationsPdf(detail.investigations, recordsMeta),
  });
  files.push({
    path: 'investigations.json',
    data: Buffer.from(JSON.stringify(detail.investigations, null, 2)),
  });
  files.push({
    path: 'instrument-checks.pdf',
    data: await buildInstrumentChecksPdf(detail.instrumentChecks, recordsMeta),
  });
  files.push({
    path: 'instrument-checks.json',
    data: Buffer.from(JSON.stringify(detail.instrumentChecks, null, 2)),
  });
  files.push({
    path: 'audit-extract.json',
    data: Buffer.from(
      JSON.stringify(
        await auditExtract(
          em,
          labId,
          rounds.map((r) => r.roundId),
        ),
        null,
        2,
      ),
    ),
  });
  const file = await buildEvidencePack(files, {
    lab: lab.name,
    generatedFor: `${user.name} <${user.email}>`,
    generatedAt,
  });
  await ctx.ds.transaction((tx) =>
    audit(tx, user.id, 'evidence-pack.downloaded', 'organisation', labId, {
      rounds: published.map((r) => r.roundCode),
      files: files.length,
    }),
  );
  return { file, fileName: `evidence-${fileSafe(lab.name)}-${generatedAt.slice(0, 10)}.zip` };
}
