/**
 * Investigations: every warning or action signal of a published evaluation opens one for the
 * lab. Lab members fill in cause, root cause, corrective action and the check of its
 * effectiveness; the lab manager closes it. The coordinator and the lab's granted assessors read.
 */
import type { EntityManager } from 'typeorm';
import { Enrolment, Investigation } from '../../../db/entities';
import type {
  InvestigationDto,
  InvestigationUpdate,
  ItemMeasurandEvaluation,
} from '../../../shared/contracts/evaluation';
import { hasAnyRole, labIds, managesLab, type SessionUser } from '../auth/session-user';
import { conflict, notFound, ruleBroken } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';
import { grantedLabIds } from './grants';

/**
 * Opens one investigation per warning/action signal (inside the publishing transaction). A
 * signal already investigated in an earlier version of the same round is not opened twice.
 * @returns how many were opened.
 */
export async function openInvestigations(
  em: EntityManager,
  roundId: string,
  evaluationId: string,
  results: readonly ItemMeasurandEvaluation[],
): Promise<number> {
  const enrolments = await em.find(Enrolment, {
    select: { id: true, organisationId: true, participantCode: true },
    where: { roundId },
  });
  const byCode = new Map(enrolments.map((e) => [e.participantCode, e]));
  const existing = await em.find(Investigation, {
    select: { enrolmentId: true, testItemId: true, measurandId: true },
    where: { roundId },
  });
  const seen = new Set(existing.map((x) => `${x.enrolmentId}/${x.testItemId}/${x.measurandId}`));
  const rows: Partial<Investigation>[] = [];
  for (const r of results) {
    for (const p of r.participants) {
      if (p.signal !== 'warning' && p.signal !== 'action') continue;
      const en = byCode.get(p.code);
      if (!en) continue;
      if (seen.has(`${en.id}/${r.testItemId}/${r.measurandId}`)) continue;
      const score = p.scoreKind === 'z' ? p.z : p.zPrime;
      rows.push({
        enrolmentId: en.id,
        organisationId: en.organisationId,
        roundId,
        evaluationId,
        testItemId: r.testItemId,
        measurandId: r.measurandId,
        scoreKind: p.scoreKind,
        score: score ?? 0,
        signal: p.signal,
        state: 'open',
      });
    }
  }
  for (let i = 0; i < rows.length; i += 500)
    await em.insert(Investigation, rows.slice(i, i + 500) as never);
  if (rows.length > 0)
    await audit(em, null, 'investigations.opened', 'round', roundId, {
      evaluationId,
      count: rows.length,
    });
  return rows.length;
}

/** The one read of investigation records (with round, lab, item and measurand names). */
const SELECT = `
  SELECT i.*, r.code AS round_code, o.name AS lab_name, en.participant_code, ti.code AS item_code,
         m.key AS measurand_key, m.name AS measurand_name, u.name AS closed_by_name
    FROM investigation i
    JOIN round r ON r.id = i.round_id
    JOIN organisation o ON o.id = i.organisation_id
    JOIN enrolment en ON en.id = i.enrolment_id
    JOIN test_item ti ON ti.id = i.test_item_id
    JOIN measurand m ON m.id = i.measurand_id
    LEFT JOIN app_user u ON u.id = i.closed_by`;

/** A row of SELECT (snake_case, as PostgreSQL returns it); investigationRecord maps it. */
export interface InvestigationRow {
  id: string;
  round_id: string;
  round_code: string;
  organisation_id: string;
  lab_name: string;
  participant_code: string;
  item_code: string;
  measurand_key: string;
  measurand_name: string;
  score_kind: string;
  score: number;
  signal: 'warning' | 'action';
  state: 'open' | 'closed';
  cause_category: InvestigationDto['causeCategory'];
  root_cause: string;
  corrective_action: string;
  effectiveness_check: string;
  closed_by_name: string | null;
  closed_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

/** An investigation as every reader sees it, before the viewer's rights are added. */
export type InvestigationRecord = Omit<InvestigationDto, 'canEdit' | 'canClose'>;

/** The one mapper from an investigation row to its record (labs, coordinators, assessors). */
export function investigationRecord(r: InvestigationRow): InvestigationRecord {
  return {
    id: r.id,
    roundId: r.round_id,
    roundCode: r.round_code,
    organisationId: r.organisation_id,
    labName: r.lab_name,
    participantCode: r.participant_code,
    itemCode: r.item_code,
    measurandKey: r.measurand_key,
    measurandName: r.measurand_name,
    scoreKind: r.score_kind,
    score: r.score,
    signal: r.signal,
    state: r.state,
    causeCategory: r.cause_category,
    rootCause: r.root_cause,
    correctiveAction: r.corrective_action,
    effectivenessCheck: r.effectiveness_check,
    closedByName: r.closed_by_name,
    closedAt: r.closed_at?.toISOString() ?? null,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}

/**
 * Investigation rows matching a SQL condition on SELECT's aliases (`i` investigation, `r` round,
 * `o` organisation, `en` enrolment, `ti` test item, `m` measurand), in the given order.
 */
export async function selectInvestigations(
  em: EntityManager,
  where: string,
  params: unknown[],
  orderBy = 'i.created_at DESC, en.participant_code, ti.code, m.key',
  limit?: number,
): Promise<InvestigationRow[]> {
  const cap = limit === undefined ? '' : `LIMIT ${Math.trunc(limit)}`;
  return em.query(`${SELECT} ${where ? `WHERE ${where}` : ''} ORDER BY ${orderBy} ${cap}`, params);
}

function dto(r: InvestigationRow, user: SessionUser): InvestigationDto {
  return {
    ...investigationRecord(r),
    canEdit: labIds(user).includes(r.organisation_id) && r.state === 'open',
    canClose: managesLab(user, r.organisation_id) && r.state === 'open',
  };
}

/** Lab ids whose investigations the user may read; 'all' for coordinators and admins. */
async function readableLabs(em: EntityManager, user: SessionUser): Promise<string[] | 'all'> {
  if (hasAnyRole(user, ['coordinator', 'admin'])) return 'all';
  const ids = new Set(labIds(user));
  if (user.roles.includes('assessor'))
    for (const id of await grantedLabIds(em, user.id)) ids.add(id);
  return [...ids];
}

/** GET /my/investigations: the investigations of the user's labs, newest first. */
export async function listMyInvestigations(
  ctx: AppContext,
  user: SessionUser,
): Promise<InvestigationDto[]> {
  const rows = await selectInvestigations(
    ctx.ds.manager,
    'i.organisation_id = ANY($1)',
    [labIds(user)],
    'i.created_at DESC, ti.code, m.key',
  );
  return rows.map((r) => dto(r, user));
}

/** GET /investigations: every investigation (coordinator) or those of granting labs (assessor). */
export async function listInvestigations(
  ctx: AppContext,
  user: SessionUser,
  roundId?: string,
): Promise<InvestigationDto[]> {
  const labs = await readableLabs(ctx.ds.manager, user);
  const where: string[] = [];
  const params: unknown[] = [];
  if (labs !== 'all') {
    params.push(labs);
    where.push(`i.organisation_id = ANY($${params.length})`);
  }
  if (roundId) {
    params.push(roundId);
    where.push(`i.round_id = $${params.length}`);
  }
  const rows = await selectInvestigations(
    ctx.ds.manager,
    where.join(' AND '),
    params,
    undefined,
    5000,
  );
  return rows.map((r) => dto(r, user));
}

async function loadVisible(
  em: EntityManager,
  user: SessionUser,
  id: string,
): Promise<InvestigationRow> {
  const [row] = await selectInvestigations(em, 'i.id = $1', [id]);
  if (!row) throw notFound('The investigation');
  const labs = await readableLabs(em, user);
  if (labs !== 'all' && !labs.includes(row.organisation_id)) throw notFound('The investigation');
  return row;
}

export async function getInvestigation(
  ctx: AppContext,
  user: SessionUser,
  id: string,
): Promise<InvestigationDto> {
  return dto(await loadVisible(ctx.ds.manager, user, id), user);
}

/** PATCH /investigations/{id}: a member of the lab records its findings while open. */
export async function updateInvestigation(
  ctx: AppContext,
  user: SessionUser,
  id: string,
  patch: InvestigationUpdate,
): Promise<InvestigationDto> {
  return ctx.ds.transaction(async (em) => {
    const row = await loadVisible(em, user, id);
    if (!labIds(user).includes(row.organisation_id)) throw notFound('The investigation');
    if (row.state !== 'open')
      throw conflict('investigation_closed', 'A closed investigation does not change.');
    const set: Partial<Investigation> = {};
    if (patch.causeCategory !== undefined) set.causeCategory = patch.causeCategory;
    if (patch.rootCause !== undefined) set.rootCause = patch.rootCause;
    if (patch.correctiveAction !== undefined) set.correctiveAction = patch.correctiveAction;
    if (patch.effectivenessCheck !== undefined) set.effectivenessCheck = patch.effectivenessCheck;
    if (Object.keys(set).length > 0) {
      await em.update(Investigation, { id }, set);
      await audit(em, user.id, 'investigation.updated', 'investigation', id, {
        fields: Object.keys(set),
      });
    }
    return dto(await loadVisible(em, user, id), user);
  });
}

/** POST /investigations/{id}/close: the lab manager closes it once every finding is recorded. */
export async function closeInvestigation(
  ctx: AppContext,
  user: SessionUser,
  id: string,
): Promise<InvestigationDto> {
  return ctx.ds.transaction(async (em) => {
    const row = await loadVisible(em, user, id);
    if (!labIds(user).includes(row.organisation_id)) throw notFound('The investigation');
    if (!managesLab(user, row.organisation_id)) {
      throw ruleBroken('manager_required', 'Only the lab manager closes an investigation.');
    }
    if (row.state !== 'open')
      throw conflict('investigation_closed', 'The investigation is already closed.');
    const missing: [keyof InvestigationRow, string][] = [
      ['cause_category', 'causeCategory'],
      ['root_cause', 'rootCause'],
      ['corrective_action', 'correctiveAction'],
      ['effectiveness_check', 'effectivenessCheck'],
    ];
    for (const [col, field] of missing) {
      if (!row[col] || String(row[col]).trim() === '') {
        throw ruleBroken(
          'investigation_incomplete',
          `${field}: record it before closing the investigation.`,
          { field },
        );
      }
    }
    await em.update(
      Investigation,
      { id },
      { state: 'closed', closedBy: user.id, closedAt: new Date() },
    );
    await audit(em, user.id, 'investigation.closed', 'investigation', id, {});
    return dto(await loadVisible(em, user, id), user);
  });
}
