import * as z from 'zod';
import type { ZodType } from 'zod';
import { Me } from '../../../shared/contracts/auth';
import {
  LabInvitation,
  LabInvitationParams,
  LabMemberInvite,
  LabMemberInviteResult,
  LabMemberParams,
  Membership,
  MembershipCreate,
  MembershipUpdate,
  Organisation,
  OrganisationCreate,
  OrganisationUpdate,
  User,
  UserInvite,
  UserUpdate,
} from '../../../shared/contracts/admin';
import { IdParams } from '../../../shared/contracts/common';
import { actingFor, managesLab, toMe } from '../auth/session-user';
import { notFound } from '../http/errors';
import type { ApiRouter, RouteDefinition } from '../http/route';
import type { AppContext } from '../services/context';
import * as users from '../services/users';

export function adminRoutes(api: ApiRouter, ctx: AppContext): void {
  const admin = ['admin'] as const;
  api.add({
    method: 'get',
    path: '/admin/users',
    tag: 'admin',
    summary: 'All users with their roles and memberships',
    access: admin,
    response: z.array(User),
    handler: () => users.listUsers(ctx),
  });
  api.add({
    method: 'post',
    path: '/admin/users',
    tag: 'admin',
    summary: 'Invite a user by e-mail (creates the account, sends a first-password link)',
    access: admin,
    body: UserInvite,
    status: 201,
    response: User,
    handler: ({ body, user }) => users.inviteUser(ctx, user, body),
  });
  api.add({
    method: 'patch',
    path: '/admin/users/{id}',
    tag: 'admin',
    summary: "Change a user's name, roles or active flag",
    access: admin,
    params: IdParams,
    body: UserUpdate,
    response: User,
    handler: ({ params, body, user }) => users.updateUser(ctx, user, params.id, body),
  });
  api.add({
    method: 'post',
    path: '/admin/users/{id}/invitation',
    tag: 'admin',
    summary: 'Send the user a new password link',
    access: admin,
    params: IdParams,
    status: 202,
    response: z.object({ sent: z.literal(true) }),
    handler: async ({ params, user }) => {
      await users.resendInvitation(ctx, user, params.id);
      return { sent: true as const };
    },
  });
  api.add({
    method: 'get',
    path: '/admin/organisations',
    tag: 'admin',
    summary: 'All organisations (labs and the provider)',
    access: admin,
    response: z.array(Organisation),
    handler: () => users.listOrganisations(ctx),
  });
  api.add({
    method: 'post',
    path: '/admin/organisations',
    tag: 'admin',
    summary: 'Create a lab or provider organisation',
    access: admin,
    body: OrganisationCreate,
    status: 201,
    response: Organisation,
    handler: ({ body, user }) => users.createOrganisation(ctx, user, body),
  });
  api.add({
    method: 'patch',
    path: '/admin/organisations/{id}',
    tag: 'admin',
    summary: 'Change an organisation',
    access: admin,
    params: IdParams,
    body: OrganisationUpdate,
    response: Organisation,
    handler: ({ params, body, user }) => users.updateOrganisation(ctx, user, params.id, body),
  });
  api.add({
    method: 'get',
    path: '/admin/organisations/{id}/memberships',
    tag: 'admin',
    summary: 'Members of an organisation',
    access: admin,
    params: IdParams,
    response: z.array(Membership),
    handler: ({ params }) => users.listMemberships(ctx.ds.manager, params.id),
  });
  api.add({
    method: 'post',
    path: '/admin/memberships',
    tag: 'admin',
    summary: 'Add a user to an organisation',
    access: admin,
    body: MembershipCreate,
    status: 201,
    response: Membership,
    handler: ({ body, user }) => users.createMembership(ctx, user, body),
  });
  api.add({
    method: 'patch',
    path: '/admin/memberships/{id}',
    tag: 'admin',
    summary: 'Set or clear the lab-manager flag',
    access: admin,
    params: IdParams,
    body: MembershipUpdate,
    response: Membership,
    handler: ({ params, body, user }) =>
      users.updateMembership(ctx, user, params.id, body.isManager),
  });
  api.add({
    method: 'delete',
    path: '/admin/memberships/{id}',
    tag: 'admin',
    summary: 'Remove a user from an organisation',
    access: admin,
    params: IdParams,
    status: 204,
    handler: ({ params, user }) => users.deleteMembership(ctx, user, params.id),
  });

  // A lab manager looks after the lab's own users. Another lab's id answers 404.
  /** A route on /labs/{id}/…: for an admin or a manager of lab `id` (anyone else: 404). */
  function addLabRoute<B extends ZodType | undefined, P extends ZodType>(
    def: Omit<RouteDefinition<B, P>, 'tag' | 'access'>,
  ): void {
    api.add<B, P>({
      ...def,
      tag: 'labs',
      access: ['admin', 'lab'],
      handler: (route) => {
        const labId = (route.params as { id: string }).id;
        if (!route.user.roles.includes('admin') && !managesLab(route.user, labId))
          throw notFound('The lab');
        return def.handler(route);
      },
    });
  }
  addLabRoute({
    method: 'get',
    path: '/labs/{id}/members',
    summary: 'Members of my lab (lab managers)',
    params: IdParams,
    response: z.array(Membership),
    handler: ({ params }) => users.listMemberships(ctx.ds.manager, params.id),
  });
  addLabRoute({
    method: 'post',
    path: '/labs/{id}/members',
    summary: 'Invite a colleague into my lab (lab managers)',
    description:
      'A new address gets an account, the membership and a first-password link (outcome member-added). An existing account gets an invitation ' +
      'it accepts or declines, and no membership until it accepts (outcome invitation-sent). A PT provider staff account (admin, coordinator, ' +
      'assessor) answers 422 staff_account; a member already, 409.',
    params: IdParams,
    body: LabMemberInvite,
    status: 201,
    response: LabMemberInviteResult,
    handler: ({ params, body, user }) => users.inviteLabMember(ctx, user, params.id, body),
  });
  addLabRoute({
    method: 'delete',
    path: '/labs/{id}/members/{membershipId}',
    summary: 'Remove a colleague from my lab (lab managers)',
    params: LabMemberParams,
    status: 204,
    handler: ({ params, user }) =>
      users.deleteMembership(ctx, user, params.membershipId, params.id),
  });
  addLabRoute({
    method: 'get',
    path: '/labs/{id}/invitations',
    summary: 'Open invitations of my lab (lab managers)',
    params: IdParams,
    response: z.array(LabInvitation),
    handler: ({ params }) => users.listLabInvitations(ctx.ds.manager, params.id),
  });
  addLabRoute({
    method: 'delete',
    path: '/labs/{id}/invitations/{invitationId}',
    summary: 'Withdraw an open invitation of my lab (lab managers)',
    params: LabInvitationParams,
    status: 204,
    handler: ({ params, user }) =>
      users.withdrawLabInvitation(ctx, user, params.id, params.invitationId),
  });

  // The invited person answers. Any signed-in account may hold invitations (it has no lab yet).
  api.add({
    method: 'get',
    path: '/my/lab-invitations',
    tag: 'labs',
    summary: 'Labs that invited me, open invitations only',
    access: 'signed-in',
    response: z.array(LabInvitation),
    handler: ({ user }) => users.listMyInvitations(ctx.ds.manager, user.id),
  });
  api.add({
    method: 'post',
    path: '/my/lab-invitations/{id}/accept',
    tag: 'labs',
    summary: 'Accept a lab\u2019s invitation: I become a member',
    description:
      'Answers my updated account. The lab I acted for stays chosen; a person in several labs can switch with PUT /auth/acting-lab.',
    access: 'signed-in',
    params: IdParams,
    response: Me,
    handler: async ({ req, params, user }) => {
      await users.answerInvitation(ctx, user, params.id, true);
      if (!req.session.actingLabId && user.actingLabId) req.session.actingLabId = user.actingLabId;
      const fresh = await users.loadSessionUser(ctx.ds.manager, user.id);
      if (!fresh) throw notFound('The user');
      return toMe(actingFor(fresh, req.session.actingLabId));
    },
  });
  api.add({
    method: 'post',
    path: '/my/lab-invitations/{id}/decline',
    tag: 'labs',
    summary: 'Decline a lab\u2019s invitation',
    access: 'signed-in',
    params: IdParams,
    status: 204,
    handler: ({ params, user }) => users.answerInvitation(ctx, user, params.id, false),
  });
}
