import * as z from 'zod';
import { IdParams } from '../../../shared/contracts/common';
import {
  AssessorGrantCreate,
  AssessorGrantDto,
  GrantParams,
} from '../../../shared/contracts/evaluation';
import type { ApiRouter } from '../http/route';
import type { AppContext } from '../services/context';
import * as grants from '../services/grants';

/** A lab's grants that let an assessor read its results, investigations and evidence. */
export function assessorGrantRoutes(api: ApiRouter, ctx: AppContext): void {
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
