import type { Request } from 'express';
import * as z from 'zod';
import type { ZodType } from 'zod';
import {
  AttachmentDto,
  AttachmentParams,
  AttachmentUploadFields,
  DraftSave,
  DraftSaved,
  InstrumentCheck,
  InstrumentCheckInput,
  InstrumentCheckQuery,
  LabQuery,
  MyRound,
  MyRoundDetail,
  ReceiptInput,
  RoundIdParams,
  SubmissionView,
  SubmitRequest,
  SubmitResult,
  WorkbookUploadResult,
} from '../../../shared/contracts/bench';
import { Id } from '../../../shared/contracts/common';
import {
  ATTACHMENT_LIMIT,
  describeLimit,
  RECEIPT_PHOTO_LIMIT,
  RESULTS_WORKBOOK_LIMIT,
} from '../../../shared/contracts/upload-limits';
import type { SessionUser } from '../auth/session-user';
import { sendDownload } from '../http/downloads';
import { badRequest } from '../http/errors';
import { uploadedFile, uploadRule } from '../http/uploads';
import type { ApiRouter, Infer, RouteContext, RouteDefinition } from '../http/route';
import * as attachments from '../services/attachments';
import * as bench from '../services/bench';
import type { AppContext } from '../services/context';
import * as checks from '../services/instrument-checks';
import * as submissions from '../services/submissions';
import * as workbook from '../services/submissions-workbook';

const lab = ['lab'] as const;
const LAB_DESCRIPTION =
  'A user in several labs names the lab with `?labId=` or the `x-lab-id` header. Another lab\u2019s objects answer 404.';

/** The lab this request acts for (query wins over header), checked against the user's memberships. */
function labOf(req: Request, user: SessionUser, query: { labId?: string }): string {
  const header = req.get('x-lab-id');
  if (!query.labId && header && !Id.safeParse(header).success) {
    throw badRequest('x-lab-id: not a valid lab id.', [
      { path: 'x-lab-id', message: 'Not a valid lab id.' },
    ]);
  }
  return bench.resolveLab(user, query.labId ?? header);
}

/** A lab bench route: for lab members, acting for the one lab that `labOf` resolves. */
interface BenchRoute<B extends ZodType | undefined, P extends ZodType | undefined> extends Omit<
  RouteDefinition<B, P, typeof LabQuery>,
  'tag' | 'access' | 'query' | 'handler'
> {
  handler: (
    route: RouteContext<Infer<B>, Infer<P>, z.output<typeof LabQuery>> & { labId: string },
  ) => unknown;
}

/** Lab bench: the lab's rounds, receipt, instrument checks, results (draft, submit, amend), files, workbook. */
export function benchRoutes(api: ApiRouter, ctx: AppContext): void {
  /** Declares a lab bench route (`description` follows LAB_DESCRIPTION); the handler gets `labId`. */
  function addBenchRoute<
    B extends ZodType | undefined = undefined,
    P extends ZodType | undefined = undefined,
  >(def: BenchRoute<B, P>): void {
    api.add<B, P, typeof LabQuery>({
      ...def,
      tag: 'lab bench',
      description: def.description ? `${LAB_DESCRIPTION} ${def.description}` : LAB_DESCRIPTION,
      access: lab,
      query: LabQuery,
      handler: (route) =>
        def.handler({ ...route, labId: labOf(route.req, route.user, route.query) }),
    });
  }
  addBenchRoute({
    method: 'get',
    path: '/my/rounds',
    summary: 'My lab\u2019s rounds: invited, enrolled, due soon, submitted, published',
    response: z.array(MyRound),
    handler: ({ labId }) => bench.listMyRounds(ctx, labId),
  });
  addBenchRoute({
    method: 'get',
    path: '/my/rounds/{id}',
    summary:
      'One of my rounds: items, measurands, instructions with safety cautions, receipt, submission state',
    params: RoundIdParams,
    response: MyRoundDetail,
    handler: ({ params, labId }) => bench.getMyRound(ctx, labId, params.id),
  });

  // Receipt (JSON, or multipart with an optional `photo`).
  // Uploads: every multipart route goes through the one upload rule (api/src/http/uploads.ts).
  api.router.put('/rounds/:id/receipt', uploadRule(RECEIPT_PHOTO_LIMIT, lab));
  addBenchRoute({
    method: 'put',
    path: '/rounds/{id}/receipt',
    summary:
      'Record the arrival of the test items: date, condition, notes, optional photo (multipart field `photo`, JPEG/PNG/WebP)',
    description: describeLimit(RECEIPT_PHOTO_LIMIT),
    params: RoundIdParams,
    body: ReceiptInput,
    response: MyRoundDetail,
    handler: ({ req, user, params, body, labId }) =>
      bench.saveReceipt(ctx, user, labId, params.id, body, uploadedFile(req)?.buffer ?? null),
  });
  addBenchRoute({
    method: 'get',
    path: '/rounds/{id}/receipt/photo',
    summary: 'The receipt photo',
    params: RoundIdParams,
    produces: 'image/*',
    handler: async ({ res, params, labId }) => {
      const { enrolment } = await bench.findEnrolment(ctx.ds.manager, labId, params.id);
      const photo = await bench.receiptPhoto(ctx, enrolment.id);
      sendDownload(res, { file: photo.data, contentType: photo.type, fileName: 'receipt-photo' });
    },
  });

  // Instrument checks.
  addBenchRoute({
    method: 'post',
    path: '/my/instrument-checks',
    summary: 'Record an instrument check with a reference material; Ringlet judges it',
    body: InstrumentCheckInput,
    status: 201,
    response: InstrumentCheck,
    handler: ({ user, body, labId }) => checks.recordInstrumentCheck(ctx, user, labId, body),
  });
  api.add({
    method: 'get',
    path: '/my/instrument-checks',
    tag: 'lab bench',
    summary: 'My lab\u2019s instrument checks, newest first (optionally one instrument)',
    description: LAB_DESCRIPTION,
    access: lab,
    query: InstrumentCheckQuery,
    response: z.array(InstrumentCheck),
    handler: ({ req, user, query }) =>
      checks.listInstrumentChecks(ctx, labOf(req, user, query), query.instrument),
  });

  // Results: draft, submit, versions.
  addBenchRoute({
    method: 'get',
    path: '/rounds/{id}/submission',
    summary: 'My results for the round: the draft and every submitted version',
    params: RoundIdParams,
    response: SubmissionView,
    handler: ({ params, labId }) => submissions.getSubmission(ctx, labId, params.id),
  });
  addBenchRoute({
    method: 'put',
    path: '/rounds/{id}/submission',
    summary:
      'Save the draft (autosave); 409 draft_conflict when baseRevision is stale, 409 submission_locked after the lock',
    params: RoundIdParams,
    body: DraftSave,
    response: DraftSaved,
    handler: ({ user, params, body, labId }) =>
      submissions.saveDraft(ctx, user, labId, params.id, body),
  });
  addBenchRoute({
    method: 'post',
    path: '/rounds/{id}/submission/submit',
    summary:
      'Submit or amend: one new version, atomic and idempotent (idempotencyKey); 422 names a broken rule, 409 after the lock',
    params: RoundIdParams,
    body: SubmitRequest,
    status: 201,
    response: SubmitResult,
    handler: async ({ res, user, params, body, labId }) => {
      const result = await submissions.submit(ctx, user, labId, params.id, body);
      res.status(result.replayed ? 200 : 201).json(result);
    },
  });

  // Attachments.
  api.router.post('/rounds/:id/submission/attachments', uploadRule(ATTACHMENT_LIMIT, lab));
  api.add({
    method: 'post',
    path: '/rounds/{id}/submission/attachments',
    tag: 'lab bench',
    summary:
      "Attach a raw-data file (multipart field `file`; CSV/TXT/PDF/XLSX by content); a correlation CSV is re-analysed by cumulants with the optional fields `laserWavelengthNm` and `scatteringAngleDeg` (else the item's conditions, else 633 nm and 173°, reported as assumed)",
    description: `${LAB_DESCRIPTION} ${describeLimit(ATTACHMENT_LIMIT)} A correlation CSV of more than ${ATTACHMENT_LIMIT.maxCorrelationRows.toLocaleString('en-GB')} lines is stored but not re-analysed.`,
    access: lab,
    params: RoundIdParams,
    query: LabQuery,
    body: AttachmentUploadFields,
    status: 201,
    response: AttachmentDto,
    handler: ({ req, user, query, params, body }) => {
      return attachments.uploadAttachment(
        ctx,
        user,
        labOf(req, user, { labId: query.labId ?? body.labId }),
        params.id,
        uploadedFile(req),
        body.testItemId,
        {
          laserWavelengthNm: body.laserWavelengthNm,
          scatteringAngleDeg: body.scatteringAngleDeg,
        },
      );
    },
  });
  addBenchRoute({
    method: 'get',
    path: '/rounds/{id}/submission/attachments',
    summary: 'My files for the round, with checksums and re-analysis',
    params: RoundIdParams,
    response: z.array(AttachmentDto),
    handler: ({ params, labId }) => attachments.listAttachments(ctx, labId, params.id),
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}/submission/attachments/{attachmentId}',
    tag: 'lab bench',
    summary: 'Download one file (the lab its own; a coordinator any file of the round)',
    access: ['lab', 'coordinator'],
    params: AttachmentParams,
    query: LabQuery,
    produces: 'application/octet-stream',
    handler: async ({ req, res, user, query, params }) => {
      const labId = user.roles.includes('coordinator') ? null : labOf(req, user, query);
      const file = await attachments.readAttachment(ctx, labId, params.id, params.attachmentId);
      await attachments.auditDownload(ctx, user, file);
      sendDownload(res, { ...file, file: file.data });
    },
  });

  // Bulk entry.
  addBenchRoute({
    method: 'get',
    path: '/rounds/{id}/submission/template.xlsx',
    summary: 'The results workbook for the round, prefilled with my draft',
    params: RoundIdParams,
    produces: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    handler: async ({ res, params, labId }) => {
      const { buffer, fileName } = await workbook.buildTemplate(ctx, labId, params.id);
      sendDownload(res, {
        file: buffer,
        contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
        fileName,
      });
    },
  });
  api.router.post('/rounds/:id/submission/upload.xlsx', uploadRule(RESULTS_WORKBOOK_LIMIT, lab));
  addBenchRoute({
    method: 'post',
    path: '/rounds/{id}/submission/upload.xlsx',
    summary:
      'Upload the filled workbook (multipart field `file`) into the draft; problems name sheet, row and column',
    description: `${describeLimit(RESULTS_WORKBOOK_LIMIT)} More answers 413 naming the limit; a formula cell answers 422 naming the cell.`,
    params: RoundIdParams,
    response: WorkbookUploadResult,
    handler: ({ req, user, params, labId }) =>
      workbook.uploadWorkbook(ctx, user, labId, params.id, uploadedFile(req)?.buffer),
  });
}
