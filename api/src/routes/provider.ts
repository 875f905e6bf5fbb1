import * as z from 'zod';
import { IdParams } from '../../../shared/contracts/common';
import {
  LogoUpload,
  ProviderProfile,
  ProviderProfileInput,
  RoundComments,
} from '../../../shared/contracts/provider';
import type { ApiRouter } from '../http/route';
import type { AppContext } from '../services/context';
import {
  deleteProviderLogo,
  providerLogo,
  providerProfile,
  roundComments,
  setProviderLogo,
  setRoundComments,
  updateProviderProfile,
} from '../services/provider';

const CommentsAnswer = RoundComments.extend({ editable: z.boolean() });

/** The PT provider's profile (printed on every report, certificate and e-mail) and a round's comments. */
export function providerRoutes(api: ApiRouter, ctx: AppContext): void {
  const editors = ['admin', 'coordinator'] as const;
  api.add({
    method: 'get',
    path: '/provider',
    tag: 'provider',
    summary: 'The PT provider’s profile (name, address, contact, accreditation, authoriser)',
    access: 'signed-in',
    response: ProviderProfile,
    handler: () => providerProfile(ctx.ds.manager),
  });
  api.add({
    method: 'put',
    path: '/provider',
    tag: 'provider',
    summary: 'Update the PT provider’s profile',
    description:
      'Every report, certificate and e-mail made afterwards prints the new profile; files already issued keep theirs.',
    access: editors,
    body: ProviderProfileInput,
    response: ProviderProfile,
    handler: ({ user, body }) => updateProviderProfile(ctx, user, body),
  });
  api.add({
    method: 'get',
    path: '/provider/logo',
    tag: 'provider',
    summary: 'The PT provider’s logo (PNG or JPEG)',
    access: 'signed-in',
    produces: 'image/png',
    handler: async ({ res }) => {
      const logo = await providerLogo(ctx.ds.manager);
      res.setHeader('Content-Type', logo.type);
      res.setHeader('Cache-Control', 'private, no-cache');
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.status(200).send(logo.data);
    },
  });
  api.add({
    method: 'put',
    path: '/provider/logo',
    tag: 'provider',
    summary: 'Set the PT provider’s logo',
    description:
      'Base64 of a PNG or JPEG file of at most 256 KB; the type is read from the file’s content.',
    access: editors,
    body: LogoUpload,
    response: ProviderProfile,
    handler: ({ user, body }) => setProviderLogo(ctx, user, body.dataBase64),
  });
  api.add({
    method: 'delete',
    path: '/provider/logo',
    tag: 'provider',
    summary: 'Remove the PT provider’s logo',
    access: editors,
    response: ProviderProfile,
    handler: ({ user }) => deleteProviderLogo(ctx, user),
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}/evaluation/comments',
    tag: 'evaluation',
    summary: 'The coordinator’s comments on the round (printed in the round report)',
    access: ['coordinator'],
    params: IdParams,
    response: CommentsAnswer,
    handler: ({ params }) => roundComments(ctx, params.id),
  });
  api.add({
    method: 'put',
    path: '/rounds/{id}/evaluation/comments',
    tag: 'evaluation',
    summary: 'Save the coordinator’s comments on the round',
    description:
      'Only while the newest evaluation is not published (409 otherwise; a reissue makes an editable version).',
    access: ['coordinator'],
    params: IdParams,
    body: RoundComments,
    response: CommentsAnswer,
    handler: ({ user, params, body }) => setRoundComments(ctx, user, params.id, body.comments),
  });
}
