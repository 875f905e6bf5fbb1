import type { EntityManager } from 'typeorm';
import { Measurand, Round, Submission, SubmissionVersion, TestItem } from '../../../db/entities';
import type {
  DraftSave,
  DraftSaved,
  SubmissionVersionDto,
  SubmissionView,
  SubmitRequest,
  SubmitResult,
} from '../../../shared/contracts/bench';
import type { FieldIssue } from '../../../shared/contracts/common';
import { rangeText } from '../../../shared/contracts/ranges';
import {
  readStoredSubmission,
  replicateRange,
  SubmissionData,
} from '../../../shared/contracts/submission';
import {
  checkResults,
  instrumentCheckNotice,
  type RoundRules,
} from '../../../shared/bench/submission-checks';
import type { SessionUser } from '../auth/session-user';
import { badRequest, conflict, fieldIssues, ruleBroken } from './errors';
import { audit } from './audit';
import { findEnrolment, lockState } from './bench';
import type { AppContext } from './context';
import { latestCheckFor } from './instrument-checks';

/** The round's items and measurands as the shared checks need them. */
export async function roundRules(
  em: EntityManager,
  roundId: string,
  protocolTemperatureC: number,
): Promise<RoundRules> {
  const [items, measurands] = await Promise.all([
    em.find(TestItem, { where: { roundId }, order: { position: 'ASC', code: 'ASC' } }),
    em.find(Measurand, { where: { roundId }, order: { position: 'ASC', key: 'ASC' } }),
  ]);
  return {
    protocolTemperatureC,
    items: items.map((i) => ({ id: i.id, code: i.code, nominalSizeNm: i.nominalSizeNm })),
    measurands: measurands.map((m) => ({
      id: m.id,
      key: m.key,
      name: m.name,
      unit: m.unit,
      replicatesRequired: m.replicatesRequired,
    })),
  };
}

/** A submission's versions with the submitter's name; callers add the where and order. */
function versionQuery(em: EntityManager, submissionId: string) {
  return em
    .createQueryBuilder(SubmissionVersion, 'v')
    .leftJoin('v.submitter', 'u')
    .addSelect(['u.id', 'u.name'])
    .where('v.submissionId = :submissionId', { submissionId });
}

function versionDto(v: SubmissionVersion): SubmissionVersionDto {
  return {
    version: v.version,
    data: readStoredSubmission(v.data),
    submittedAt: v.submittedAt.toISOString(),
    submittedBy: v.submitter?.name ?? null,
    note: v.note,
    isLate: v.isLate,
  };
}

/** The draft's revision and save time as stored (after an update that set them in SQL). */
async function savedRevision(em: EntityManager, id: string): Promise<Submission> {
  return em.findOneOrFail(Submission, {
    where: { id },
    select: { id: true, draftRevision: true, updatedAt: true },
  });
}

/** Creates the submission row if missing and locks it for this transaction (serialises saves and submits). */
async function lockSubmission(em: EntityManager, enrolmentId: string): Promise<Submission> {
  await em
    .createQueryBuilder()
    .insert()
    .into(Submission)
    .values({ enrolmentId })
    .orIgnore()
    .execute();
  const sub = await em
    .getRepository(Submission)
    .createQueryBuilder('s')
    .setLock('pessimistic_write')
    .where('s.enrolment_id = :enrolmentId', { enrolmentId })
    .getOne();
  return sub!;
}

/** GET /rounds/{id}/submission: the draft, its revision and every submitted version (newest first). */
export async function getSubmission(
  ctx: AppContext,
  labId: string,
  roundId: string,
): Promise<SubmissionView> {
  const em = ctx.ds.manager;
  const { round, enrolment } = await findEnrolment(em, labId, roundId);
  const sub = await em.findOne(Submission, { where: { enrolmentId: enrolment.id } });
  const lock = lockState(round, enrolment);
  const versions = sub ? await versionQuery(em, sub.id).orderBy('v.version', 'DESC').getMany() : [];
  return {
    state: sub ? sub.state : 'none',
    draft: readStoredSubmission(sub?.draft),
    draftRevision: sub?.draftRevision ?? 0,
    savedAt: sub && sub.draftRevision > 0 ? sub.updatedAt.toISOString() : null,
    currentVersion: sub?.currentVersion ?? 0,
    isLocked: !lock.isOpen,
    locksAt: lock.locksAt?.toISOString() ?? null,
    versions: versions.map(versionDto),
  };
}

/** The saved draft as the submit reads it: a draft saved before a bound existed is refused with 400 naming the field. */
function savedDraft(raw: unknown): SubmissionData {
  const r = SubmissionData.safeParse(raw ?? {});
  if (!r.success) {
    const details = fieldIssues(r.error, 'data');
    throw badRequest(
      `${details[0]!.path}: ${details[0]!.message} (in the saved draft; correct it and save again)`,
      details,
    );
  }
  return r.data;
}

/**
 * Replicates outside their measurand's plausible range (diameters in nm, PDI 0–1; see
 * shared/contracts/ranges.ts), as 400 field issues naming `data.items.i.results.j.replicates.k`.
 */
export function replicatesOutOfRange(data: SubmissionData, rules: RoundRules): FieldIssue[] {
  const byId = new Map(rules.measurands.map((m) => [m.id, m] as const));
  const issues: FieldIssue[] = [];
  data.items.forEach((it, i) =>
    it.results.forEach((res, j) => {
      const m = byId.get(res.measurandId);
      const range = m ? replicateRange(m) : null;
      if (!range) return;
      res.replicates.forEach((v, k) => {
        if (v === null) return;
        const ok =
          v <= range.max &&
          ('minExclusive' in range && range.minExclusive ? v > range.min : v >= range.min);
        if (!ok)
          issues.push({
            path: `data.items.${i}.results.${j}.replicates.${k}`,
            message: `${m!.name} must be ${rangeText(range)}.`,
          });
      });
    }),
  );
  return issues;
}

function assertOpen(lock: ReturnType<typeof lockState>): void {
  if (!lock.isOpen)
    throw conflict('submission_locked', `Results can no longer change: ${lock.reason}`);
}

/**
 * PUT /rounds/{id}/submission: saves the working copy as the lab types. `baseRevision` must be the
 * revision the client last saw; otherwise 409 draft_conflict (another tab or colleague saved since).
 * Drafts keep what was typed, even a value the submit would refuse by the round's rules, so nothing
 * is lost; a value outside the plausible ranges (shared/contracts/ranges.ts) is refused already here.
 */
export async function saveDraft(
  ctx: AppContext,
  actor: SessionUser,
  labId: string,
  roundId: string,
  input: DraftSave,
): Promise<DraftSaved> {
  return ctx.ds.transaction(async (em) => {
    const { round, enrolment } = await findEnrolment(em, labId, roundId);
    assertOpen(lockState(round, enrolment));
    const sub = await lockSubmission(em, enrolment.id);
    if (sub.draftRevision !== input.baseRevision) {
      throw conflict(
        'draft_conflict',
        `The draft changed since revision ${input.baseRevision} (now ${sub.draftRevision}): reload it before saving.`,
      );
    }
    const revision = sub.draftRevision + 1;
    await em.update(
      Submission,
      { id: sub.id },
      { draft: input.data, draftRevision: revision, updatedAt: () => 'now()' },
    );
    const saved = await savedRevision(em, sub.id);
    await audit(em, actor.id, 'submission.draft-saved', 'submission', sub.id, {
      roundId,
      revision,
    });
    return { draftRevision: revision, savedAt: saved.updatedAt.toISOString() };
  });
}

/** Saves a whole draft without the revision check (the workbook upload replaces the draft). */
export async function replaceDraft(
  em: EntityManager,
  actor: SessionUser,
  submissionId: string,
  data: SubmissionData,
  source: string,
): Promise<number> {
  await em.update(
    Submission,
    { id: submissionId },
    { draft: data, draftRevision: () => 'draft_revision + 1', updatedAt: () => 'now()' },
  );
  const { draftRevision } = await savedRevision(em, submissionId);
  await audit(em, actor.id, 'submission.draft-replaced', 'submission', submissionId, {
    source,
    revision: draftRevision,
  });
  return draftRevision;
}

export { lockSubmission };

/**
 * POST /rounds/{id}/submission/submit: one new immutable version, atomically. A retry with the same
 * idempotency key returns the version it made (even after the lock). Concurrent submits are
 * serialised on the submission row, so each makes exactly one version. After the lock (due date, or
 * a granted extension) nothing changes.
 */
export async function submit(
  ctx: AppContext,
  actor: SessionUser,
  labId: string,
  roundId: string,
  input: SubmitRequest,
): Promise<SubmitResult> {
  return ctx.ds.transaction(async (em) => {
    const { enrolment } = await findEnrolment(em, labId, roundId);
    const sub = await lockSubmission(em, enrolment.id);
    const earlier = await versionQuery(em, sub.id)
      .andWhere('v.idempotencyKey = :key', { key: input.idempotencyKey })
      .getOne();
    if (earlier) return { version: versionDto(earlier), replayed: true };

    // Re-read the round under a share lock: a state change waits for this submit, or this sees it.
    const roundRow = await em.findOne(Round, {
      where: { id: roundId },
      select: { id: true },
      lock: { mode: 'pessimistic_read' },
    });
    if (!roundRow) throw conflict('submission_locked', 'The round is gone.');
    const { round, enrolment: fresh } = await findEnrolment(em, labId, roundId);
    const lock = lockState(round, fresh);
    assertOpen(lock);

    const data = input.data ?? savedDraft(sub.draft);
    const rules = await roundRules(em, roundId, round.protocolTemperatureC);
    const outcome = checkResults(data, rules, true);
    if (outcome.errors.length) {
      throw ruleBroken(
        'results_invalid',
        `${outcome.errors[0]!.path}: ${outcome.errors[0]!.message}`,
        outcome.errors,
      );
    }
    const outOfRange = replicatesOutOfRange(data, rules);
    if (outOfRange.length)
      throw badRequest(`${outOfRange[0]!.path}: ${outOfRange[0]!.message}`, outOfRange);
    if (outcome.unacknowledged.length) {
      throw ruleBroken(
        'warnings_unacknowledged',
        `acknowledgedWarnings: acknowledge ${outcome.unacknowledged.length} warning(s) before submitting: ${outcome.unacknowledged[0]!.message}`,
        outcome.unacknowledged,
      );
    }
    const instruments = [
      ...new Set(data.items.map((i) => i.conditions.instrument).filter(Boolean)),
    ];
    const check = await latestCheckFor(em, labId, instruments);
    const notice = instrumentCheckNotice(
      check
        ? {
            passed: check.passed,
            instrument: check.instrument,
            checkedAt: check.checkedAt.toISOString(),
          }
        : null,
    );
    if (notice && !data.explanation.trim()) {
      throw ruleBroken('instrument_check_explanation_required', `explanation: ${notice}`, [
        { path: 'explanation', message: notice },
      ]);
    }

    const version = sub.currentVersion + 1;
    await em.insert(SubmissionVersion, {
      submissionId: sub.id,
      version,
      data,
      submittedBy: actor.id,
      note: input.note ?? null,
      idempotencyKey: input.idempotencyKey,
      isLate: lock.isLate,
      instrumentCheckId: check?.id ?? null,
    });
    await em.update(
      Submission,
      { id: sub.id },
      {
        state: 'submitted',
        currentVersion: version,
        submittedAt: () => 'now()',
        updatedAt: () => 'now()',
        ...(input.data ? { draft: input.data, draftRevision: () => 'draft_revision + 1' } : {}),
      },
    );
    await audit(
      em,
      actor.id,
      version === 1 ? 'submission.submitted' : 'submission.amended',
      'submission',
      sub.id,
      {
        roundId,
        version,
        isLate: lock.isLate,
        extensionUntil: fresh.extensionUntil?.toISOString() ?? null,
        instrumentCheckId: check?.id ?? null,
        instrumentCheckPassed: check?.passed ?? null,
        acknowledgedWarnings: outcome.warnings.map((w) => w.code),
      },
    );
    const row = await versionQuery(em, sub.id)
      .andWhere('v.version = :version', { version })
      .getOneOrFail();
    return { version: versionDto(row), replayed: false };
  });
}
