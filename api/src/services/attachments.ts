import { createHash } from 'node:crypto';
import { MIME_TYPES, sniffFileType } from '../../../shared/files/file-type';
import { Attachment, Enrolment, Measurand, Submission, TestItem, User } from '../../../db/entities';
import type { AttachmentDto, Reanalysis } from '../../../shared/contracts/bench';
import { readStoredSubmission } from '../../../shared/contracts/submission';
import {
  ATTACHMENT_LIMIT,
  formatBytes,
  formatCount,
} from '../../../shared/contracts/upload-limits';
import {
  cumulantsFit,
  parseCorrelationCsv,
  waterRefractiveIndex,
  waterViscosity,
  type CorrelationData,
} from '../../../shared/dls';
import { REANALYSIS_DEFAULTS } from '../../../shared/contracts/bench';
import { mean } from '../../../shared/stats/descriptive';
import type { SessionUser } from '../auth/session-user';
import { badRequest, conflict, ServiceError, notFound } from './errors';
import { cleanFileName } from '../../../shared/files/file-name';
import { classifyText, type TextJobResult } from '../workers/file-jobs';
import { handOver, runInWorker } from '../workers/pool';
import { listZipEntries } from '../workers/zip';
import { audit } from './audit';
import { findEnrolment, lockState } from './bench';
import type { AppContext } from './context';
import { storedReanalysis } from './stored-rules';
import { lockSubmission } from './submissions';

export type AttachmentKind = AttachmentDto['kind'];

/** Z-average differences above this fraction flag the lab's value against the re-analysis (project choice: 5 %). */
export const REANALYSIS_Z_TOLERANCE = 0.05;
/** PDI differences above this flag the lab's value (project choice: PDI depends on the fit range more than the Z-average does). */
export const REANALYSIS_PDI_TOLERANCE = 0.1;

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** PDF (`%PDF-`) or XLSX (a readable zip with `[Content_Types].xml` and `xl/` parts) from the bytes, else null. */
export function detectPackagedType(
  buf: Buffer,
): { kind: 'pdf' | 'xlsx'; contentType: string } | null {
  const sniffed = sniffFileType(buf);
  if (sniffed === 'pdf') return { kind: 'pdf', contentType: MIME_TYPES.pdf };
  if (sniffed === 'zip') {
    try {
      const names = listZipEntries(buf).map((e) => e.name);
      if (names.includes('[Content_Types].xml') && names.some((n) => n.startsWith('xl/')))
        return { kind: 'xlsx', contentType: XLSX_TYPE };
    } catch {
      // not a readable zip
    }
  }
  return null;
}

/** Text up to this size is classified on the request's own thread (a few milliseconds); larger text in a worker. */
const INLINE_TEXT_BYTES = 256 * 1024;

export interface DetectedType {
  kind: AttachmentKind;
  contentType: string;
  /** For a correlation CSV: the parsed data, or the line count when it is longer than the re-analysis reads. */
  correlation?: CorrelationData | { lines: number };
}

/**
 * The file's type from its bytes, never from its name or the client's header: PDF, XLSX, or UTF-8
 * text without control bytes (a two-column lag time / g2 − 1 table is a correlation CSV). Anything
 * else is refused (type null). Text above 256 KB is decoded, hashed and parsed in an upload worker
 * thread, its lines counted before it is parsed (ATTACHMENT_LIMIT.maxCorrelationRows); the bytes
 * move to the thread and back without a copy, so use the `bytes` answered, not `buf`.
 */
export async function inspectAttachment(
  buf: Buffer,
): Promise<{ type: DetectedType | null; bytes: Buffer; sha256: string }> {
  const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
  if (buf.length === 0) return { type: null, bytes: buf, sha256: sha(buf) };
  const packaged = detectPackagedType(buf);
  if (packaged) return { type: packaged, bytes: buf, sha256: sha(buf) };
  if (buf[0] === 0x50 && buf[1] === 0x4b && buf[2] === 0x03 && buf[3] === 0x04)
    return { type: null, bytes: buf, sha256: sha(buf) }; // another zip
  let c: TextJobResult;
  if (buf.length <= INLINE_TEXT_BYTES)
    c = {
      class: classifyText(buf, ATTACHMENT_LIMIT.maxCorrelationRows),
      sha256: sha(buf),
      bytes: buf,
    };
  else
    c = await runInWorker<TextJobResult>(
      {
        type: 'text',
        data: handOver(buf),
        maxCorrelationRows: ATTACHMENT_LIMIT.maxCorrelationRows,
      },
      ATTACHMENT_LIMIT.label,
    );
  const bytes = Buffer.isBuffer(c.bytes)
    ? c.bytes
    : Buffer.from(c.bytes.buffer, c.bytes.byteOffset, c.bytes.byteLength);
  const k = c.class;
  const type: DetectedType | null =
    k.kind === 'binary'
      ? null
      : k.kind === 'text'
        ? { kind: 'text', contentType: 'text/plain' }
        : {
            kind: 'correlation-csv',
            contentType: 'text/csv',
            correlation: k.data ?? { lines: k.lines },
          };
  return { type, bytes, sha256: c.sha256 };
}

/**
 * Re-analyses a correlation CSV by cumulants (shared/dls, ISO 22412) with the item's stated
 * conditions (defaults where missing: the protocol temperature, water per IAPWS, 633 nm, 173°), and
 * sets the result beside the lab's mean Z-average and PDI.
 */
export function reanalyse(
  source: string | CorrelationData | { lines: number },
  conditions: {
    temperatureC: number | null;
    viscosityMPas: number | null;
    refractiveIndex: number | null;
    laserWavelengthNm: number | null;
    scatteringAngleDeg: number | null;
  },
  protocolTemperatureC: number,
  lab: { zAverageNm: number | null; pdi: number | null },
): Reanalysis {
  const temperatureC = conditions.temperatureC ?? protocolTemperatureC;
  const wavelengthNm = conditions.laserWavelengthNm ?? REANALYSIS_DEFAULTS.wavelengthNm;
  const assumed: Reanalysis['assumed'] = [];
  if (conditions.temperatureC === null) assumed.push('temperatureC');
  if (conditions.viscosityMPas === null) assumed.push('viscosityMPas');
  if (conditions.refractiveIndex === null) assumed.push('refractiveIndex');
  if (conditions.laserWavelengthNm === null) assumed.push('wavelengthNm');
  if (conditions.scatteringAngleDeg === null) assumed.push('angleDeg');
  const waterOk = temperatureC >= 0 && temperatureC <= 40;
  const parameters = {
    temperatureC,
    viscosityMPas:
      conditions.viscosityMPas ?? (waterOk ? waterViscosity(temperatureC) * 1000 : 0.89),
    refractiveIndex:
      conditions.refractiveIndex ??
      (waterOk && wavelengthNm <= 1100 ? waterRefractiveIndex(temperatureC, wavelengthNm) : 1.332),
    wavelengthNm,
    angleDeg: conditions.scatteringAngleDeg ?? REANALYSIS_DEFAULTS.angleDeg,
  };
  const base = { labZAverageNm: lab.zAverageNm, labPdi: lab.pdi, parameters, assumed };
  try {
    if (typeof source === 'object' && 'lines' in source) {
      throw new Error(
        `not re-analysed: the file has ${formatCount(source.lines)} lines and a correlation function is read up to ${formatCount(ATTACHMENT_LIMIT.maxCorrelationRows)} lag times. The file is stored as sent.`,
      );
    }
    const data = typeof source === 'string' ? parseCorrelationCsv(source) : source;
    const fit = cumulantsFit({
      lagTimesS: data.lagTimesS,
      g2Minus1: data.g2Minus1,
      temperatureC,
      viscosityPaS: parameters.viscosityMPas / 1000,
      refractiveIndex: parameters.refractiveIndex,
      wavelengthNm,
      angleDeg: parameters.angleDeg,
    });
    const messages = [...fit.warnings];
    let disagrees = false;
    if (
      lab.zAverageNm !== null &&
      Math.abs(fit.zAverageNm - lab.zAverageNm) / fit.zAverageNm > REANALYSIS_Z_TOLERANCE
    ) {
      disagrees = true;
      messages.push(
        `Your Z-average ${lab.zAverageNm.toFixed(1)} nm differs from the re-analysis ${fit.zAverageNm.toFixed(1)} nm by more than ${100 * REANALYSIS_Z_TOLERANCE} %: check the viscosity, temperature, angle and wavelength stated.`,
      );
    }
    if (lab.pdi !== null && Math.abs(fit.pdi - lab.pdi) > REANALYSIS_PDI_TOLERANCE) {
      disagrees = true;
      messages.push(
        `Your PDI ${lab.pdi.toFixed(3)} differs from the re-analysis ${fit.pdi.toFixed(3)} by more than ${REANALYSIS_PDI_TOLERANCE}.`,
      );
    }
    return {
      ok: true,
      error: null,
      zAverageNm: fit.zAverageNm,
      pdi: fit.pdi,
      disagrees,
      messages,
      ...base,
    };
  } catch (err) {
    return {
      ok: false,
      error: err instanceof Error ? err.message : String(err),
      zAverageNm: null,
      pdi: null,
      disagrees: false,
      messages: [],
      ...base,
    };
  }
}

function dto(a: Attachment, uploadedBy: string | null): AttachmentDto {
  return {
    id: a.id,
    fileName: a.fileName,
    contentType: a.contentType,
    kind: a.kind,
    sizeBytes: a.sizeBytes,
    sha256: a.sha256,
    testItemId: a.testItemId,
    uploadedBy,
    uploadedAt: a.uploadedAt.toISOString(),
    reanalysis: storedReanalysis(a.reanalysis, `Attachment ${a.fileName}`),
  };
}

/** POST /rounds/{id}/submission/attachments: stores a raw-data file (bytes in PostgreSQL) with its checksum. */
export async function uploadAttachment(
  ctx: AppContext,
  actor: SessionUser,
  labId: string,
  roundId: string,
  file: { buffer: Buffer; originalname: string } | undefined,
  testItemId: string | undefined,
  /** This file's wavelength and angle for the re-analysis (they win over the item's conditions). */
  optics: { laserWavelengthNm?: number; scatteringAngleDeg?: number } = {},
): Promise<AttachmentDto> {
  if (!file)
    throw badRequest('file: attach a file (multipart field "file").', [
      { path: 'file', message: 'Attach a file.' },
    ]);
  if (file.buffer.length > ATTACHMENT_LIMIT.maxBytes)
    throw new ServiceError(
      413,
      'file_too_large',
      `file: the limit is ${formatBytes(ATTACHMENT_LIMIT.maxBytes)} per file.`,
    );
  const { type, bytes, sha256 } = await inspectAttachment(file.buffer);
  if (!type) {
    throw new ServiceError(
      415,
      'file_type_refused',
      'file: only CSV or TXT text, PDF or XLSX files are accepted (checked by content).',
      [{ path: 'file', message: 'CSV, TXT, PDF or XLSX only.' }],
    );
  }
  return ctx.ds.transaction(async (em) => {
    const { round, enrolment } = await findEnrolment(em, labId, roundId);
    const lock = lockState(round, enrolment);
    if (!lock.isOpen)
      throw conflict('submission_locked', `Results can no longer change: ${lock.reason}`);
    if (testItemId && !(await em.findOne(TestItem, { where: { id: testItemId, roundId } }))) {
      throw badRequest('testItemId: not a test item of this round.', [
        { path: 'testItemId', message: 'Not a test item of this round.' },
      ]);
    }
    const sub = await lockSubmission(em, enrolment.id);
    let reanalysis: Reanalysis | null = null;
    if (type.kind === 'correlation-csv') {
      const draft = readStoredSubmission(sub.draft);
      const item =
        draft.items.find((i) => i.testItemId === testItemId) ??
        (testItemId ? undefined : draft.items[0]);
      const ids = await em.find(Measurand, { where: { roundId }, select: { id: true, key: true } });
      const meanOf = (key: string) => {
        const m = ids.find((x) => x.key === key);
        const xs =
          item?.results
            .find((r) => r.measurandId === m?.id)
            ?.replicates.filter((v): v is number => v !== null) ?? [];
        return xs.length ? mean(xs) : null;
      };
      const stated = item?.conditions ?? {
        temperatureC: null,
        viscosityMPas: null,
        refractiveIndex: null,
        laserWavelengthNm: null,
        scatteringAngleDeg: null,
      };
      reanalysis = reanalyse(
        type.correlation ?? bytes.toString('utf8'),
        {
          ...stated,
          laserWavelengthNm: optics.laserWavelengthNm ?? stated.laserWavelengthNm,
          scatteringAngleDeg: optics.scatteringAngleDeg ?? stated.scatteringAngleDeg,
        },
        round.protocolTemperatureC,
        { zAverageNm: meanOf('z_average'), pdi: meanOf('pdi') },
      );
    }
    const row = await em.save(
      Attachment,
      em.create(Attachment, {
        submissionId: sub.id,
        testItemId: testItemId ?? null,
        fileName: cleanFileName(file.originalname),
        contentType: type.contentType,
        kind: type.kind,
        sizeBytes: bytes.length,
        sha256,
        data: bytes,
        reanalysis: reanalysis && { ...reanalysis },
        uploadedBy: actor.id,
      }),
    );
    await audit(em, actor.id, 'attachment.uploaded', 'attachment', row.id, {
      roundId,
      fileName: row.fileName,
      sizeBytes: row.sizeBytes,
      sha256,
      kind: type.kind,
    });
    const saved = await em.findOneOrFail(Attachment, { where: { id: row.id } });
    return dto(saved, actor.name);
  });
}

async function listFor(ctx: AppContext, submissionId: string): Promise<AttachmentDto[]> {
  const files = (await ctx.ds
    .getRepository(Attachment)
    .createQueryBuilder('a')
    .leftJoinAndMapOne('a.uploader', User, 'u', 'u.id = a.uploadedBy')
    .where('a.submissionId = :submissionId', { submissionId })
    .orderBy('a.uploadedAt', 'ASC')
    .getMany()) as (Attachment & { uploader: User | null })[];
  return files.map((a) => dto(a, a.uploader?.name ?? null));
}

/** GET /rounds/{id}/submission/attachments: the lab's own files for the round. */
export async function listAttachments(
  ctx: AppContext,
  labId: string,
  roundId: string,
): Promise<AttachmentDto[]> {
  const { enrolment } = await findEnrolment(ctx.ds.manager, labId, roundId);
  const sub = await ctx.ds
    .getRepository(Submission)
    .findOne({ where: { enrolmentId: enrolment.id } });
  return sub ? listFor(ctx, sub.id) : [];
}

/**
 * One file's bytes. A lab reads only its own (labId given); a coordinator reads any file of the
 * round (labId null). Anything else answers 404.
 */
export async function readAttachment(
  ctx: AppContext,
  labId: string | null,
  roundId: string,
  attachmentId: string,
): Promise<Attachment> {
  const qb = ctx.ds
    .getRepository(Attachment)
    .createQueryBuilder('a')
    .addSelect('a.data')
    .innerJoin(Submission, 's', 's.id = a.submissionId')
    .innerJoin(Enrolment, 'e', 'e.id = s.enrolmentId')
    .where('a.id = :id AND e.roundId = :roundId', { id: attachmentId, roundId });
  if (labId !== null) qb.andWhere('e.organisationId = :labId', { labId });
  const a = await qb.getOne();
  if (!a) throw notFound('The file');
  return a;
}

export async function auditDownload(
  ctx: AppContext,
  actor: SessionUser,
  a: Attachment,
): Promise<void> {
  await audit(ctx.ds.manager, actor.id, 'attachment.downloaded', 'attachment', a.id, {
    sha256: a.sha256,
  });
}
