import * as z from 'zod';
import { IdParams } from '../../../shared/contracts/common';
import {
  AssessorGrantCreate,
  AssessorGrantDto,
  GrantParams,
  InvestigationDto,
  InvestigationUpdate,
} from '../../../shared/contracts/evaluation';
import type { ApiRouter } from '../http/route';
import type { AppContext } from '../services/context';
import * as grants from '../services/grants';
import * as inv from '../services/investigations';

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

  api.add({
    method: 'get',
    path: '/labs/{id}/assessor-grants',
    tag: 'labs',
    summary: 'Assessors my lab gave access (lab members)',
    access: ['lab'],
    params: IdParams,
    response: z.array(AssessorGrantDto),
    handler: ({ user, params }) => grants.listGrants(ctx, user, params.id),
  });
  api.add({
    method: 'post',
    path: '/labs/{id}/assessor-grants',
    tag: 'labs',
    summary:
      'Give an assessor access to my lab’s results and investigations, inviting them by e-mail (lab managers)',
    access: ['lab'],
    params: IdParams,
    body: AssessorGrantCreate,
    status: 201,
    response: AssessorGrantDto,
    handler: ({ user, params, body }) => grants.createGrant(ctx, user, params.id, body),
  });
  api.add({
    method: 'delete',
    path: '/labs/{id}/assessor-grants/{grantId}',
    tag: 'labs',
    summary: 'Revoke an assessor’s access (lab managers)',
    access: ['lab'],
    params: GrantParams,
    status: 204,
    handler: ({ user, params }) => grants.revokeGrant(ctx, user, params.id, params.grantId),
  });
}
