import type { Response } from 'express';
import { IdParams } from '../../../shared/contracts/common';
import { ReportIdParams, ReportLabQuery, ReportStatus } from '../../../shared/contracts/reports';
import { sendDownload } from '../http/downloads';
import type { ApiRouter } from '../http/route';
import type { AppContext } from '../services/context';
import {
  CONTENT_TYPES,
  labFileTarget,
  reportFile,
  reportStatus,
  roundFileHead,
  type BuiltFile,
} from '../services/reports';
import type { ReportStatus as Status } from '../../../shared/contracts/reports';

/** Sends a file with its checksum, or 202 with the build status for a background build. */
export function sendFile(res: Response, out: BuiltFile | { pending: Status }): void {
  if ('pending' in out) {
    res.status(202).json(out.pending);
    return;
  }
  sendDownload(res, out);
}

/** Round workbook and PDF, individual report, certificate, and the status of background builds. */
export function reportRoutes(api: ApiRouter, ctx: AppContext): void {
  const readers = ['coordinator', 'lab', 'assessor'] as const;
  const background =
    ' Large rounds are built in the background: the answer is then 202 with the build status; poll GET /reports/{reportId} and fetch again when done.';
  for (const kind of ['round.xlsx', 'round.pdf'] as const) {
    api.add({
      method: 'get',
      path: `/rounds/{id}/reports/${kind}`,
      tag: 'reports',
      summary:
        kind === 'round.xlsx'
          ? 'Round workbook (Excel): summary, one sheet per item × measurand, homogeneity and stability'
          : 'Round report (PDF) with charts, codes and scores',
      description:
        'Coordinators: the newest evaluation. Labs of the round and assessors granted by one of them: the newest published evaluation (404 otherwise). Participant codes only.' +
        background,
      access: readers,
      params: IdParams,
      produces: CONTENT_TYPES[kind],
      response: ReportStatus,
      handler: async ({ user, params, req, res }) => {
        const head = await roundFileHead(ctx, user, params.id);
        sendFile(
          res,
          await reportFile(
            ctx,
            user,
            { roundId: params.id, kind, organisationId: null, head },
            null,
            req.originalUrl,
          ),
        );
      },
    });
  }
  for (const kind of ['participant.pdf', 'certificate.pdf'] as const) {
    api.add({
      method: 'get',
      path: `/rounds/{id}/reports/${kind}`,
      tag: 'reports',
      summary:
        kind === 'participant.pdf'
          ? 'My lab’s individual report (PDF): own scores, position, Track record'
          : 'My lab’s certificate of participation (PDF)',
      description:
        'For the caller’s own lab enrolled in the round (labId picks one of several), or an assessor’s granting lab (labId). Published rounds only; 404 otherwise.' +
        background,
      access: ['lab', 'assessor'],
      params: IdParams,
      query: ReportLabQuery,
      produces: CONTENT_TYPES[kind],
      response: ReportStatus,
      handler: async ({ user, params, query, req, res }) => {
        const { head, lab } = await labFileTarget(ctx, user, params.id, query.labId);
        sendFile(
          res,
          await reportFile(
            ctx,
            user,
            { roundId: params.id, kind, organisationId: lab.organisationId, head },
            lab,
            req.originalUrl,
          ),
        );
      },
    });
  }
  api.add({
    method: 'get',
    path: '/reports/{reportId}',
    tag: 'reports',
    summary: 'Status and progress of a report built in the background',
    access: readers,
    params: ReportIdParams,
    response: ReportStatus,
    handler: ({ user, params }) => reportStatus(ctx, user, params.reportId),
  });
}
