/**
 * Report files: who may fetch which, and the shared cache. A file is built from the stored
 * evaluation once per round × kind × lab × evaluation version and kept in the `report` table
 * (bytes + SHA-256), so every server instance serves the same bytes. Small rounds are built
 * inside the request; rounds above backgroundMinParticipants() (300) are built by a `report-build` job
 * on the PostgreSQL-backed queue (api/src/jobs): the status row (queued → running → done or
 * failed, progress 0–100) and the job are inserted in one transaction, so a build survives a
 * restart, is retried (REPORT_RETRY) and shows 'failed' only after its last attempt. The request
 * answers 202 with the status — the caller polls GET /reports/{reportId} and fetches the same URL
 * again when done. Without a queue (tests and benches that start the app alone) the build runs
 * in this process. A 'running' row older than STALE_MINUTES (an instance that died) is rebuilt.
 */
import { In, type EntityManager } from 'typeorm';
import { Enrolment, Organisation, Report, Round, type ReportKind } from '../../../db/entities';
import { sha256 } from '../../../reports/model';
import type { ReportStatus } from '../../../shared/contracts/reports';
import { hasAnyRole, labIds, type SessionUser } from '../auth/session-user';
import { notFound } from './errors';
import type { AppContext } from './context';
import { grantedLabIds } from './grants';
import {
  evaluationHead,
  evaluationHeadById,
  participantReportInput,
  roundReportInput,
  type EvaluationHead,
} from './reports-input';

/** Above this many participants a file is built in the background (RINGLET_REPORT_BACKGROUND_MIN, read at each request). */
export const backgroundMinParticipants = (): number =>
  Number(process.env['RINGLET_REPORT_BACKGROUND_MIN'] ?? 300);
const STALE_MINUTES = 10;

export const CONTENT_TYPES: Record<ReportKind, string> = {
  'round.xlsx': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
  'round.pdf': 'application/pdf',
  'participant.pdf': 'application/pdf',
  'certificate.pdf': 'application/pdf',
  'evidence.zip': 'application/zip',
};

export interface LabInRound {
  organisationId: string;
  participantCode: string;
  labName: string;
}

/** Labs whose files the user may read: own labs, plus labs with an active grant for assessors. */
export async function readableLabIds(em: EntityManager, user: SessionUser): Promise<string[]> {
  const ids = new Set(labIds(user));
  if (user.roles.includes('assessor'))
    for (const id of await grantedLabIds(em, user.id)) ids.add(id);
  return [...ids];
}

/**
 * The evaluation a round file is made from. Coordinators: the newest evaluation (a draft or
 * committed one gives a preview marked with its state). Labs and assessors: the newest
 * published one, and only for a round a readable lab took part in; anything else is 404.
 */
export async function roundFileHead(
  ctx: AppContext,
  user: SessionUser,
  roundId: string,
): Promise<EvaluationHead> {
  const em = ctx.ds.manager;
  if (hasAnyRole(user, ['coordinator', 'admin'])) {
    const head = await evaluationHead(em, roundId, false);
    if (!head) throw notFound('An evaluation of this round');
    return head;
  }
  const labs = await readableLabIds(em, user);
  const enrolled =
    labs.length > 0 &&
    (await em.exists(Enrolment, { where: { roundId, organisationId: In(labs) } }));
  if (!enrolled) throw notFound('The round');
  const head = await evaluationHead(em, roundId, true);
  if (!head) throw notFound('Published reports of this round');
  return head;
}

/** The lab a lab-specific file is for: the caller's own (or the asked-for readable) lab enrolled in the round. */
export async function labFileTarget(
  ctx: AppContext,
  user: SessionUser,
  roundId: string,
  labId?: string,
): Promise<{ head: EvaluationHead; lab: LabInRound }> {
  const em = ctx.ds.manager;
  const readable = await readableLabIds(em, user);
  const candidates = labId
    ? readable.filter((id) => id === labId)
    : labIds(user).length
      ? labIds(user)
      : readable;
  const lab = await enrolledLab(em, roundId, candidates);
  if (!lab) throw notFound('The round');
  const head = await evaluationHead(em, roundId, true);
  if (!head) throw notFound('Published reports of this round');
  return { head, lab };
}

/** The first (by lab name) of these labs enrolled in the round, with its enrolment, or null. */
export async function enrolledLab(
  em: EntityManager,
  roundId: string,
  organisationIds: string[],
): Promise<(LabInRound & { enrolmentId: string }) | null> {
  if (organisationIds.length === 0) return null;
  const e = (await em
    .createQueryBuilder(Enrolment, 'e')
    .innerJoinAndMapOne('e.lab', Organisation, 'o', 'o.id = e.organisationId')
    .where('e.roundId = :roundId', { roundId })
    .andWhere('e.organisationId IN (:...organisationIds)', { organisationIds })
    .orderBy('o.name')
    .getOne()) as (Enrolment & { lab: Organisation }) | null;
  return e
    ? {
        enrolmentId: e.id,
        organisationId: e.organisationId,
        participantCode: e.participantCode,
        labName: e.lab.name,
      }
    : null;
}

export interface BuiltFile {
  file: Buffer;
  sha256: string;
  fileName: string;
  contentType: string;
}

function statusOf(r: Report, downloadUrl: string): ReportStatus {
  return {
    id: r.id,
    kind: r.kind,
    roundId: r.roundId,
    evaluationVersion: r.evaluationVersion,
    status: r.status,
    progress: r.progress,
    sha256: r.sha256,
    sizeBytes: r.sizeBytes,
    error: r.error,
    downloadUrl,
  };
}

interface CacheKey {
  roundId: string;
  kind: ReportKind;
  organisationId: string | null;
  head: EvaluationHead;
}

async function findRow(em: EntityManager, k: CacheKey): Promise<Report | null> {
  const qb = em
    .createQueryBuilder(Report, 'r')
    .where('r.round_id = :roundId AND r.kind = :kind AND r.evaluation_version = :v', {
      roundId: k.roundId,
      kind: k.kind,
      v: k.head.version,
    });
  if (k.organisationId) qb.andWhere('r.organisation_id = :o', { o: k.organisationId });
  else qb.andWhere('r.organisation_id IS NULL');
  return qb.getOne();
}

async function readFile(em: EntityManager, id: string): Promise<Buffer> {
  const row = await em.findOneOrFail(Report, { where: { id }, select: { id: true, file: true } });
  return row.file!;
}

/** Builds one file from the stored evaluation (the work of a background job too). */
async function buildFile(
  ctx: AppContext,
  k: CacheKey,
  lab: LabInRound | null,
  progress: (p: number) => Promise<void>,
): Promise<Buffer> {
  const em = ctx.ds.manager;
  if (k.kind === 'round.xlsx' || k.kind === 'round.pdf') {
    const input = await roundReportInput(em, k.head);
    await progress(30);
    // The builders (and pdfkit, ECharts, ExcelJS behind them) load at the first build, not at server start.
    return k.kind === 'round.xlsx'
      ? (await import('../../../reports/excel/round-workbook')).buildRoundWorkbook(input)
      : (await import('../../../reports/pdf/round-report')).buildRoundReportPdf(input);
  }
  if (!lab) throw new Error('a lab file needs its lab');
  const input = await participantReportInput(em, k.head, lab);
  await progress(30);
  return k.kind === 'participant.pdf'
    ? (await import('../../../reports/pdf/participant-report')).buildParticipantReportPdf(input)
    : (await import('../../../reports/pdf/certificate')).buildCertificatePdf(input);
}

function fileName(k: CacheKey, roundCode: string, lab: LabInRound | null): string {
  const base = `${roundCode}-v${k.head.version}`.replace(/[^A-Za-z0-9._-]+/g, '_');
  const who = lab ? `-${lab.participantCode.replace(/[^A-Za-z0-9._-]+/g, '_')}` : '';
  const [stem, ext] = k.kind.split('.') as [string, string];
  return `${base}-${stem}${who}.${ext}`;
}

async function participantCount(em: EntityManager, evaluationId: string): Promise<number> {
  const rows: { n: number }[] = await em.query(
    `SELECT coalesce(max(jsonb_array_length(participants)), 0)::int AS n FROM evaluation_result WHERE evaluation_id = $1`,
    [evaluationId],
  );
  return rows[0]?.n ?? 0;
}

async function runBuild(
  ctx: AppContext,
  row: Report,
  k: CacheKey,
  lab: LabInRound | null,
  lastAttempt = true,
): Promise<Buffer> {
  const repo = ctx.ds.getRepository(Report);
  try {
    const file = await buildFile(
      ctx,
      k,
      lab,
      async (p) => void (await repo.update({ id: row.id }, { progress: p })),
    );
    const sum = sha256(file);
    await repo.update(
      { id: row.id },
      {
        file,
        sha256: sum,
        sizeBytes: file.length,
        status: 'done',
        progress: 100,
        finishedAt: new Date(),
        error: null,
      },
    );
    return file;
  } catch (err) {
    ctx.log(
      `report build ${k.kind} for round ${k.roundId} failed${lastAttempt ? '' : '; retried later'}`,
      err,
    );
    if (!lastAttempt) {
      await repo.update({ id: row.id }, { status: 'queued', progress: 0 });
      throw err;
    }
    await markFailed(ctx, row.id);
    throw err;
  }
}

/** A build that will not be retried: the row says so to its reader. */
async function markFailed(ctx: AppContext, id: string): Promise<void> {
  await ctx.ds.getRepository(Report).update(
    { id },
    {
      status: 'failed',
      error: 'The file could not be built. Try again; if it fails again, tell the coordinator.',
      finishedAt: new Date(),
    },
  );
}

/**
 * The file for a key: from the cache, or built now (small rounds, or `wait`), or started in
 * the background (large rounds): then the status to answer 202 with.
 */
export async function reportFile(
  ctx: AppContext,
  user: SessionUser,
  k: CacheKey,
  lab: LabInRound | null,
  downloadUrl: string,
  wait = false,
): Promise<BuiltFile | { pending: ReportStatus }> {
  const em = ctx.ds.manager;
  const round = await em.findOne(Round, { where: { id: k.roundId }, select: { code: true } });
  const meta = {
    fileName: fileName(k, round?.code ?? 'round', lab),
    contentType: CONTENT_TYPES[k.kind],
  };
  for (let attempt = 0; attempt < 600; attempt++) {
    let row = await findRow(em, k);
    const stale =
      row &&
      row.status === 'running' &&
      Date.now() - row.createdAt.getTime() > STALE_MINUTES * 60_000;
    if (row && (row.status === 'failed' || stale)) {
      await em.delete(Report, { id: row.id });
      row = null;
    }
    if (row?.status === 'done')
      return { file: await readFile(em, row.id), sha256: row.sha256!, ...meta };
    if (!row) {
      const background =
        !wait && (await participantCount(em, k.head.id)) > backgroundMinParticipants();
      try {
        row = await saveAndEnqueue(ctx, background, (tx) =>
          tx.save(
            Report,
            em.create(Report, {
              roundId: k.roundId,
              kind: k.kind,
              organisationId: k.organisationId,
              evaluationId: k.head.id,
              evaluationVersion: k.head.version,
              status: background ? 'queued' : 'running',
              progress: background ? 0 : 5,
              requestedBy: user.id,
            }),
          ),
        );
      } catch (err) {
        if ((err as { code?: string }).code === '23505') continue; // another request or instance started it
        throw err;
      }
      if (background) {
        if (ctx.queue) ctx.queue.kick();
        else setImmediate(() => void runBuild(ctx, row!, k, lab).catch(() => undefined));
        return { pending: statusOf(row, downloadUrl) };
      }
      const file = await runBuild(ctx, row, k, lab);
      return { file, sha256: sha256(file), ...meta };
    }
    // Being built elsewhere.
    if (!wait) return { pending: statusOf(row, downloadUrl) };
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('report build did not finish in time');
}

/** Saves a new report row; for a background build with a queue, together with its job in one transaction. */
async function saveAndEnqueue(
  ctx: AppContext,
  background: boolean,
  save: (em: EntityManager) => Promise<Report>,
): Promise<Report> {
  const queue = ctx.queue;
  if (!background || !queue) return save(ctx.ds.manager);
  return ctx.ds.transaction(async (tx) => {
    const row = await save(tx);
    await queue.enqueueReportBuild(row.id, tx);
    return row;
  });
}

/**
 * The `report-build` job's work: builds a queued report row. A failure before the last attempt
 * puts the row back to 'queued' and throws, so the queue retries it; the last one leaves it
 * 'failed' with a message for the reader. A row that is done or gone (rebuilt meanwhile) is left alone.
 */
export async function runQueuedBuild(
  ctx: AppContext,
  reportId: string,
  lastAttempt: boolean,
): Promise<void> {
  const repo = ctx.ds.getRepository(Report);
  const row = await repo.findOne({ where: { id: reportId } });
  if (!row || row.status === 'done' || row.status === 'failed' || !row.roundId || !row.evaluationId)
    return;
  const head = await evaluationHeadById(ctx.ds.manager, row.evaluationId);
  const lab = row.organisationId
    ? await enrolledLab(ctx.ds.manager, row.roundId, [row.organisationId])
    : null;
  await repo.update({ id: row.id }, { status: 'running', progress: 5 });
  if (!head) {
    // The evaluation is gone: the build fails for good (no retry can find it).
    ctx.log(`report build ${row.kind} for round ${row.roundId} failed`, 'its evaluation is gone');
    await markFailed(ctx, row.id);
    throw new Error(`evaluation ${row.evaluationId} of report ${row.id} is gone`);
  }
  const k: CacheKey = {
    roundId: row.roundId,
    kind: row.kind,
    organisationId: row.organisationId,
    head,
  };
  await runBuild(ctx, row, k, lab, lastAttempt);
}

/** GET /reports/{reportId}: a build's status, for its requester, coordinators, or readers of its lab and round. */
export async function reportStatus(
  ctx: AppContext,
  user: SessionUser,
  reportId: string,
): Promise<ReportStatus> {
  const r = await ctx.ds.getRepository(Report).findOne({ where: { id: reportId } });
  if (!r || !r.roundId) throw notFound('The report');
  if (r.requestedBy !== user.id && !hasAnyRole(user, ['coordinator', 'admin'])) {
    if (r.organisationId) {
      if (!(await readableLabIds(ctx.ds.manager, user)).includes(r.organisationId))
        throw notFound('The report');
    } else {
      await roundFileHead(ctx, user, r.roundId);
    }
  }
  const lab = r.organisationId ? `?labId=${r.organisationId}` : '';
  return statusOf(r, `/api/v1/rounds/${r.roundId}/reports/${r.kind}${lab}`);
}
