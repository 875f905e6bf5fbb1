import { IdParams } from '../../../shared/contracts/common';
import { AssessorLab, AssessorLabDetail } from '../../../shared/contracts/reports';
import * as z from 'zod';
import { sendDownload } from '../http/downloads';
import type { ApiRouter } from '../http/route';
import { assessorLabDetail, assessorLabs, evidencePack } from '../services/assessor';
import type { AppContext } from '../services/context';

/** The assessor's reading room: labs with an active grant, their rounds, and Evidence packs. */
export function assessorRoutes(api: ApiRouter, ctx: AppContext): void {
  api.add({
    method: 'get',
    path: '/assessor/labs',
    tag: 'assessor',
    summary: 'Labs that granted me access (active grants only)',
    access: ['assessor'],
    response: z.array(AssessorLab),
    handler: ({ user }) => assessorLabs(ctx, user),
  });
  api.add({
    method: 'get',
    path: '/assessor/labs/{id}/rounds',
    tag: 'assessor',
    summary:
      'A granting lab’s rounds with its codes and signals, its investigations and instrument-check history',
    description: '404 without an active grant from that lab.',
    access: ['assessor'],
    params: IdParams,
    response: AssessorLabDetail,
    handler: ({ user, params }) => assessorLabDetail(ctx, user, params.id),
  });
  api.add({
    method: 'get',
    path: '/assessor/labs/{id}/evidence.zip',
    tag: 'assessor',
    summary:
      'Evidence pack (zip): round reports, workbooks, individual reports, certificates, investigations, instrument checks, audit extract, manifest of SHA-256 checksums',
    description:
      '404 without an active grant from that lab. Files of large rounds come from the report cache (built once).',
    access: ['assessor'],
    params: IdParams,
    produces: 'application/zip',
    handler: async ({ user, params, res }) => {
      const out = await evidencePack(ctx, user, params.id);
      sendDownload(res, { ...out, contentType: 'application/zip' });
    },
  });
}
