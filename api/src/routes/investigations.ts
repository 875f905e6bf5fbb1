import * as z from 'zod';
import { IdParams } from '../../../shared/contracts/common';
import { InvestigationDto, InvestigationUpdate } from '../../../shared/contracts/evaluation';
import type { ApiRouter } from '../http/route';
import type { AppContext } from '../services/context';
import * as inv from '../services/investigations';

/** Investigations of warning and action signals: the lab records and closes them; others read. */
export function investigationRoutes(api: ApiRouter, ctx: AppContext): void {
  api.add({
    method: 'get',
    path: '/my/investigations',
    tag: 'investigations',
    summary: 'Investigations of my lab(s), newest first',
    access: ['lab'],
    response: z.array(InvestigationDto),
    handler: ({ user }) => inv.listMyInvestigations(ctx, user),
  });
  api.add({
    method: 'get',
    path: '/investigations',
    tag: 'investigations',
    summary:
      'All investigations (coordinator) or those of the labs that granted me access (assessor)',
    access: ['coordinator', 'assessor'],
    query: z.object({ roundId: z.uuid().optional() }),
    response: z.array(InvestigationDto),
    handler: ({ user, query }) => inv.listInvestigations(ctx, user, query.roundId),
  });
  api.add({
    method: 'get',
    path: '/investigations/{id}',
    tag: 'investigations',
    summary: 'One investigation (the lab, the coordinator, granted assessors)',
    access: ['coordinator', 'lab', 'assessor'],
    params: IdParams,
    response: InvestigationDto,
    handler: ({ user, params }) => inv.getInvestigation(ctx, user, params.id),
  });
  api.add({
    method: 'patch',
    path: '/investigations/{id}',
    tag: 'investigations',
    summary:
      'Record cause, root cause, corrective action and the check of its effectiveness (lab members, while open)',
    access: ['lab'],
    params: IdParams,
    body: InvestigationUpdate,
    response: InvestigationDto,
    handler: ({ user, params, body }) => inv.updateInvestigation(ctx, user, params.id, body),
  });
  api.add({
    method: 'post',
    path: '/investigations/{id}/close',
    tag: 'investigations',
    summary: 'Close an investigation (the lab manager; every finding recorded)',
    access: ['lab'],
    params: IdParams,
    response: InvestigationDto,
    handler: ({ user, params }) => inv.closeInvestigation(ctx, user, params.id),
  });
}
