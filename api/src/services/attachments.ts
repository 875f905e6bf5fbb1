import { createHash } from 'node:crypto';
import { Attachment, Submission, TestItem } from '../../../db/entities';
import type { AttachmentDto, Reanalysis } from '../../../shared/contracts/bench';
import { MAX_ATTACHMENT_BYTES, REANALYSIS_DEFAULTS } from '../../../shared/contracts/bench';
import { SubmissionData } from '../../../shared/contracts/submission';
import { cumulantsFit, parseCorrelationCsv, waterRefractiveIndex, waterViscosity } from '../../../shared/dls';
import { mean } from '../../../shared/stats/descriptive';
import type { SessionUser } from '../auth/session-user';
import { badRequest, conflict, HttpError, notFound } from '../http/errors';
import { audit } from './audit';
import { findEnrolment, lockState } from './bench';
import type { AppContext } from './context';
import { lockSubmission } from './submissions';

export type AttachmentKind = AttachmentDto['kind'];

/** Z-average differences above this fraction flag the lab's value against the re-analysis (project choice: 5 %). */
export const REANALYSIS_Z_TOLERANCE = 0.05;
/** PDI differences above this flag the lab's value (project choice: PDI depends on the fit range more than the Z-average does). */
export const REANALYSIS_PDI_TOLERANCE = 0.1;

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/**
 * The file's type from its bytes, never from its name or the client's header: PDF (`%PDF-`), XLSX (a
 * zip with `[Content_Types].xml` and an `xl/` part), or UTF-8 text without control bytes (a
 * two-column lag time / g2 − 1 table is a correlation CSV). Anything else is refused.
 */
export function detectAttachmentType(buf: Buffer): { kind: AttachmentKind; contentType: string } | null {
  if (buf.length === 0) return null;
  if (buf.subarray(0, 5).toString('latin1') === '%PDF-') return { kind: 'pdf', contentType: 'application/pdf' };
  if (buf[0] === 0x50 && buf[1] === 0x4b && buf[2] === 0x03 && buf[3] === 0x04) {
    const names = buf.toString('latin1');
    return names.includes('[Content_Types].xml') && names.includes('xl/') ? { kind: 'xlsx', contentType: XLSX_TYPE } : null;
  }
  const text = new TextDecoder('utf-8', { fatal: false }).decode(buf);
  if (text.includes('\uFFFD')) return null; // not valid UTF-8
  // eslint-disable-next-line no-control-regex -- looking for control bytes is the point
  if (/[\u0000-\u0008\u000B\u000E-\u001F\u007F]/.test(text)) return null; // binary control bytes
  try {
    parseCorrelationCsv(text);
    return { kind: 'correlation-csv', contentType: 'text/csv' };
  } catch {
    return { kind: 'text', contentType: 'text/plain' };
  }
}

/**
 * Re-analyses a correlation CSV by cumulants (shared/dls, ISO 22412) with the item's stated
 * conditions (defaults where missing: the protocol temperature, water per IAPWS, 633 nm, 173°), and
 * sets the result beside the lab's mean Z-average and PDI.
 */
export function reanalyse(
  text: string,
  conditions: { temperatureC: number | null; viscosityMPas: number | null; refractiveIndex: number | null; laserWavelengthNm: number | null; scatteringAngleDeg: number | null },
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
    viscosityMPas: conditions.viscosityMPas ?? (waterOk ? waterViscosity(temperatureC) * 1000 : 0.89),
    refractiveIndex: conditions.refractiveIndex ?? (waterOk && wavelengthNm <= 1100 ? waterRefractiveIndex(temperatureC, wavelengthNm) : 1.332),
    wavelengthNm,
    angleDeg: conditions.scatteringAngleDeg ?? REANALYSIS_DEFAULTS.angleDeg,
  };
  const base = { labZAverageNm: lab.zAverageNm, labPdi: lab.pdi, parameters, assumed };
  try {
    const data = parseCorrelationCsv(text);
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
    if (lab.zAverageNm !== null && Math.abs(fit.zAverageNm - lab.zAverageNm) / fit.zAverageNm > REANALYSIS_Z_TOLERANCE) {
      disagrees = true;
      messages.push(
        `Your Z-average ${lab.zAverageNm.toFixed(1)} nm differs from the re-analysis ${fit.zAverageNm.toFixed(1)} nm by more than ${100 * REANALYSIS_Z_TOLERANCE} %: check the viscosity, temperature, angle and wavelength stated.`,
      );
    }
    if (lab.pdi !== null && Math.abs(fit.pdi - lab.pdi) > REANALYSIS_PDI_TOLERANCE) {
      disagrees = true;
      messages.push(`Your PDI ${lab.pdi.toFixed(3)} differs from the re-analysis ${fit.pdi.toFixed(3)} by more than ${REANALYSIS_PDI_TOLERANCE}.`);
    }
    return { ok: true, error: null, zAverageNm: fit.zAverageNm, pdi: fit.pdi, disagrees, messages, ...base };
  } catch (err) {
    return { ok: false, error: err instanceof Error ? err.message : String(err), zAverageNm: null, pdi: null, disagrees: false, messages: [], ...base };
  }
}

interface AttachmentRow extends Attachment {
  uploaded_by_name?: string | null;
}

function dto(a: AttachmentRow, uploadedBy: string | null): AttachmentDto {
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
    reanalysis: (a.reanalysis as Reanalysis | null) ?? null,
  };
}

/** A safe display name: no path, no control characters, at most 200 characters. */
export function cleanFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? 'file';
  // eslint-disable-next-line no-control-regex -- strip control characters from file names
  const cleaned = base.replace(/[\u0000-\u001F\u007F"]/g, '').trim().slice(0, 200);
  return cleaned || 'file';
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
  if (!file) throw badRequest('file: attach a file (multipart field "file").', [{ path: 'file', message: 'Attach a file.' }]);
  if (file.buffer.length > MAX_ATTACHMENT_BYTES) throw new HttpError(413, 'file_too_large', 'file: the limit is 20 MB per file.');
  const type = detectAttachmentType(file.buffer);
  if (!type) {
    throw new HttpError(415, 'file_type_refused', 'file: only CSV or TXT text, PDF or XLSX files are accepted (checked by content).', [
      { path: 'file', message: 'CSV, TXT, PDF or XLSX only.' },
    ]);
  }
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  return ctx.ds.transaction(async (em) => {
    const { round, enrolment } = await findEnrolment(em, labId, roundId);
    const lock = lockState(round, enrolment);
    if (!lock.isOpen) throw conflict('submission_locked', `Results can no longer change: ${lock.reason}`);
    if (testItemId && !(await em.findOne(TestItem, { where: { id: testItemId, roundId } }))) {
      throw badRequest('testItemId: not a test item of this round.', [{ path: 'testItemId', message: 'Not a test item of this round.' }]);
    }
    const sub = await lockSubmission(em, enrolment.id);
    let reanalysis: Reanalysis | null = null;
    if (type.kind === 'correlation-csv') {
      const draft = SubmissionData.parse(sub.draft ?? {});
      const item = draft.items.find((i) => i.testItemId === testItemId) ?? (testItemId ? undefined : draft.items[0]);
      const ids: { id: string; key: string }[] = await em.query(`SELECT id, key FROM measurand WHERE round_id = $1`, [roundId]);
      const meanOf = (key: string) => {
        const m = ids.find((x) => x.key === key);
        const xs = item?.results.find((r) => r.measurandId === m?.id)?.replicates.filter((v): v is number => v !== null) ?? [];
        return xs.length ? mean(xs) : null;
      };
      const stated = item?.conditions ?? { temperatureC: null, viscosityMPas: null, refractiveIndex: null, laserWavelengthNm: null, scatteringAngleDeg: null };
      reanalysis = reanalyse(
        file.buffer.toString('utf8'),
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
        sizeBytes: file.buffer.length,
        sha256,
        data: file.buffer,
        reanalysis: reanalysis as unknown as Record<string, unknown> | null,
        uploadedBy: actor.id,
      }),
    );
    await audit(em, actor.id, 'attachment.uploaded', 'attachment', row.id, { roundId, fileName: row.fileName, sizeBytes: row.sizeBytes, sha256, kind: type.kind });
    const saved = await em.findOneOrFail(Attachment, { where: { id: row.id } });
    return dto(saved, actor.name);
  });
}

async function listFor(ctx: AppContext, submissionId: string): Promise<AttachmentDto[]> {
  const { entities, raw } = await ctx.ds
    .getRepository(Attachment)
    .createQueryBuilder('a')
    .leftJoin('app_user', 'u', 'u.id = a.uploaded_by')
    .addSelect('u.name', 'uploaded_by_name')
    .where('a.submission_id = :submissionId', { submissionId })
    .orderBy('a.uploaded_at', 'ASC')
    .getRawAndEntities();
  return entities.map((e, i) => dto(e, (raw[i] as { uploaded_by_name: string | null }).uploaded_by_name));
}

/** GET /rounds/{id}/submission/attachments: the lab's own files for the round. */
export async function listAttachments(ctx: AppContext, labId: string, roundId: string): Promise<AttachmentDto[]> {
  const { enrolment } = await findEnrolment(ctx.ds.manager, labId, roundId);
  const sub = await ctx.ds.getRepository(Submission).findOne({ where: { enrolmentId: enrolment.id } });
  return sub ? listFor(ctx, sub.id) : [];
}

/**
 * One file's bytes. A lab reads only its own (labId given); a coordinator reads any file of the
 * round (labId null). Anything else answers 404.
 */
export async function readAttachment(ctx: AppContext, labId: string | null, roundId: string, attachmentId: string): Promise<Attachment> {
  const rows: { enrolment_id: string; organisation_id: string }[] = await ctx.ds.query(
    `SELECT e.id AS enrolment_id, e.organisation_id FROM attachment a
       JOIN submission s ON s.id = a.submission_id JOIN enrolment e ON e.id = s.enrolment_id
      WHERE a.id = $1 AND e.round_id = $2`,
    [attachmentId, roundId],
  );
  const row = rows[0];
  if (!row || (labId !== null && row.organisation_id !== labId)) throw notFound('The file');
  const a = await ctx.ds
    .getRepository(Attachment)
    .createQueryBuilder('a')
    .addSelect('a.data')
    .where('a.id = :id', { id: attachmentId })
    .getOne();
  if (!a) throw notFound('The file');
  return a;
}

export async function auditDownload(ctx: AppContext, actor: SessionUser, a: Attachment): Promise<void> {
  await audit(ctx.ds.manager, actor.id, 'attachment.downloaded', 'attachment', a.id, { sha256: a.sha256 });
}

