import { IsNull, type EntityManager } from 'typeorm';
import type { GlobalRole, Role } from '../../../shared/contracts/auth';
import type {
  LabInvitation as LabInvitationDto,
  LabMemberInviteResult,
  Membership as MembershipDto,
  MembershipCreate,
  Organisation as OrganisationDto,
  OrganisationCreate,
  User as UserDto,
  UserInvite,
  UserUpdate,
} from '../../../shared/contracts/admin';
import {
  LabInvitation,
  type LabInvitationAnswer,
  Membership,
  Organisation,
  User,
} from '../../../db/entities';
import { forgetSessionUser } from '../auth/session-cache';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound, ruleBroken } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';
import { issuePasswordToken, sendLinkMail } from './passwords';

/**
 * Loads the request's user with its lab memberships; null when missing or deactivated. Runs on
 * every signed-in request, so it is one plain query.
 */
export async function loadSessionUser(em: EntityManager, id: string): Promise<SessionUser | null> {
  const rows: {
    id: string;
    email: string;
    name: string;
    roles: GlobalRole[];
    memberships: {
      id: string;
      organisationId: string;
      organisationName: string;
      isManager: boolean;
    }[];
  }[] = await em.query(
    `SELECT u.id, u.email, u.name, u.roles,
            COALESCE(json_agg(json_build_object('id', m.id, 'organisationId', m.organisation_id,
                       'organisationName', o.name, 'isManager', m.is_manager) ORDER BY o.name)
                     FILTER (WHERE m.id IS NOT NULL), '[]') AS memberships
       FROM app_user u
       LEFT JOIN membership m ON m.user_id = u.id
       LEFT JOIN organisation o ON o.id = m.organisation_id
      WHERE u.id = $1 AND u.is_active
      GROUP BY u.id`,
    [id],
  );
  const user = rows[0];
  if (!user) return null;
  const roles: Role[] = [...user.roles];
  if (user.memberships.length > 0) roles.push('lab');
  const order: Role[] = ['admin', 'coordinator', 'lab', 'assessor'];
  roles.sort((a, b) => order.indexOf(a) - order.indexOf(b));
  const actingLabId = user.memberships.length === 1 ? user.memberships[0]!.organisationId : null;
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    roles,
    memberships: user.memberships,
    actingLabId,
  };
}

function membershipDto(m: Membership): MembershipDto {
  return {
    id: m.id,
    userId: m.userId,
    userEmail: m.user?.email ?? '',
    userName: m.user?.name ?? '',
    organisationId: m.organisationId,
    organisationName: m.organisation?.name ?? '',
    isManager: m.isManager,
  };
}

function userDto(u: User): UserDto {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    roles: u.roles,
    isActive: u.isActive,
    hasPassword: u.passwordHash !== null,
    lastSignInAt: u.lastSignInAt?.toISOString() ?? null,
    memberships: (u.memberships ?? []).map((m) => membershipDto({ ...m, user: u } as Membership)),
    createdAt: u.createdAt.toISOString(),
  };
}

export function organisationDto(o: Organisation): OrganisationDto {
  return {
    id: o.id,
    name: o.name,
    kind: o.kind,
    country: o.country,
    contactEmail: o.contactEmail,
    createdAt: o.createdAt.toISOString(),
  };
}

export async function listUsers(ctx: AppContext): Promise<UserDto[]> {
  const users = await ctx.ds.getRepository(User).find({
    relations: { memberships: { organisation: true } },
    order: { name: 'ASC' },
  });
  return users.map(userDto);
}

async function getUserDto(em: EntityManager, id: string): Promise<UserDto> {
  const u = await em.findOne(User, {
    where: { id },
    relations: { memberships: { organisation: true } },
  });
  if (!u) throw notFound('The user');
  return userDto(u);
}

/**
 * Creates an account (or reuses an existing one for the e-mail, when adding a lab membership)
 * and e-mails a first-password link.
 */
export async function inviteUser(
  ctx: AppContext,
  actor: SessionUser,
  input: UserInvite & { roles: UserDto['roles']; isManager: boolean },
): Promise<UserDto> {
  const { user, token } = await ctx.ds.transaction(async (em) => {
    if (await em.findOne(User, { where: { email: input.email } })) {
      throw conflict('email_taken', `An account for ${input.email} already exists.`);
    }
    if (
      input.organisationId &&
      !(await em.findOne(Organisation, { where: { id: input.organisationId } }))
    ) {
      throw ruleBroken('organisation_unknown', 'organisationId: that lab does not exist.');
    }
    const created = await em.save(
      User,
      em.create(User, {
        email: input.email,
        name: input.name,
        roles: input.roles,
        passwordHash: null,
      }),
    );
    if (input.organisationId) {
      await em.insert(Membership, {
        userId: created.id,
        organisationId: input.organisationId,
        isManager: input.isManager,
      });
    }
    await audit(em, actor.id, 'user.invited', 'user', created.id, {
      email: input.email,
      roles: input.roles,
    });
    const t = await issuePasswordToken(em, created.id, 'first-password');
    return { user: await getUserDto(em, created.id), token: t };
  });
  await sendLinkMail(ctx, user.email, user.name, token, 'first-password');
  return user;
}

export async function resendInvitation(
  ctx: AppContext,
  actor: SessionUser,
  userId: string,
): Promise<void> {
  const { user, token } = await ctx.ds.transaction(async (em) => {
    const u = await em.findOne(User, { where: { id: userId } });
    if (!u) throw notFound('The user');
    const purpose = u.passwordHash ? 'reset' : 'first-password';
    const t = await issuePasswordToken(em, u.id, purpose);
    await audit(em, actor.id, 'user.link-sent', 'user', u.id, { purpose });
    return { user: u, token: t };
  });
  await sendLinkMail(
    ctx,
    user.email,
    user.name,
    token,
    user.passwordHash ? 'reset' : 'first-password',
  );
}

export async function updateUser(
  ctx: AppContext,
  actor: SessionUser,
  id: string,
  patch: UserUpdate,
): Promise<UserDto> {
  return ctx.ds.transaction(async (em) => {
    const u = await em.findOne(User, { where: { id } });
    if (!u) throw notFound('The user');
    if (
      id === actor.id &&
      (patch.isActive === false || (patch.roles && !patch.roles.includes('admin')))
    ) {
      throw ruleBroken(
        'self_lockout',
        'You cannot remove your own admin role or deactivate yourself.',
      );
    }
    await em.update(User, { id }, patch);
    await audit(em, actor.id, 'user.updated', 'user', id, { ...patch });
    if (patch.isActive === false) {
      // sign the user out everywhere
      await em.query(`DELETE FROM session WHERE sess -> 'passport' ->> 'user' = $1`, [id]);
      forgetSessionUser(id);
    }
    return getUserDto(em, id);
  });
}

export async function listOrganisations(ctx: AppContext): Promise<OrganisationDto[]> {
  const orgs = await ctx.ds.getRepository(Organisation).find({ order: { name: 'ASC' } });
  return orgs.map(organisationDto);
}

async function assertNameFree(em: EntityManager, name: string, exceptId?: string): Promise<void> {
  const rows = await em
    .createQueryBuilder(Organisation, 'o')
    .select('o.id')
    .where('lower(o.name) = lower(:name)', { name })
    .getMany();
  if (rows.some((r) => r.id !== exceptId))
    throw conflict('name_taken', `name: an organisation called "${name}" already exists.`);
}

export async function createOrganisation(
  ctx: AppContext,
  actor: SessionUser,
  input: OrganisationCreate & { kind: 'lab' | 'provider' },
): Promise<OrganisationDto> {
  return ctx.ds.transaction(async (em) => {
    await assertNameFree(em, input.name);
    const o = await em.save(
      Organisation,
      em.create(Organisation, {
        name: input.name,
        kind: input.kind,
        country: input.country ?? null,
        contactEmail: input.contactEmail ?? null,
      }),
    );
    await audit(em, actor.id, 'organisation.created', 'organisation', o.id, { name: o.name });
    return organisationDto(o);
  });
}

export async function updateOrganisation(
  ctx: AppContext,
  actor: SessionUser,
  id: string,
  patch: Partial<OrganisationCreate>,
): Promise<OrganisationDto> {
  return ctx.ds.transaction(async (em) => {
    const o = await em.findOne(Organisation, { where: { id } });
    if (!o) throw notFound('The organisation');
    if (patch.name) await assertNameFree(em, patch.name, id);
    Object.assign(o, Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)));
    await em.save(o);
    await audit(em, actor.id, 'organisation.updated', 'organisation', id, { ...patch });
    return organisationDto(o);
  });
}

export async function listMemberships(
  em: EntityManager,
  organisationId: string,
): Promise<MembershipDto[]> {
  if (!(await em.findOne(Organisation, { where: { id: organisationId } })))
    throw notFound('The organisation');
  const rows = await em.find(Membership, {
    where: { organisationId },
    relations: { user: true, organisation: true },
  });
  return rows.map(membershipDto).sort((a, b) => a.userName.localeCompare(b.userName));
}

async function getMembershipDto(em: EntityManager, id: string): Promise<MembershipDto> {
  const m = await em.findOne(Membership, {
    where: { id },
    relations: { user: true, organisation: true },
  });
  if (!m) throw notFound('The membership');
  return membershipDto(m);
}

export async function createMembership(
  ctx: AppContext,
  actor: SessionUser,
  input: MembershipCreate & { isManager: boolean },
): Promise<MembershipDto> {
  return ctx.ds.transaction(async (em) => {
    if (!(await em.findOne(User, { where: { id: input.userId } })))
      throw ruleBroken('user_unknown', 'userId: that user does not exist.');
    if (!(await em.findOne(Organisation, { where: { id: input.organisationId } })))
      throw ruleBroken('organisation_unknown', 'organisationId: that organisation does not exist.');
    if (
      await em.findOne(Membership, {
        where: { userId: input.userId, organisationId: input.organisationId },
      })
    )
      throw conflict('already_member', 'That user is already a member of this organisation.');
    const m = await em.save(Membership, em.create(Membership, input));
    await audit(em, actor.id, 'membership.created', 'membership', m.id, { ...input });
    return getMembershipDto(em, m.id);
  });
}

export async function updateMembership(
  ctx: AppContext,
  actor: SessionUser,
  id: string,
  isManager: boolean,
  organisationId?: string,
): Promise<MembershipDto> {
  return ctx.ds.transaction(async (em) => {
    const m = await em.findOne(Membership, { where: { id } });
    if (!m || (organisationId && m.organisationId !== organisationId))
      throw notFound('The membership');
    await em.update(Membership, { id }, { isManager });
    await audit(em, actor.id, 'membership.updated', 'membership', id, { isManager });
    return getMembershipDto(em, id);
  });
}

export async function deleteMembership(
  ctx: AppContext,
  actor: SessionUser,
  id: string,
  organisationId?: string,
): Promise<void> {
  await ctx.ds.transaction(async (em) => {
    const m = await em.findOne(Membership, { where: { id } });
    if (!m || (organisationId && m.organisationId !== organisationId))
      throw notFound('The membership');
    if (organisationId && m.userId === actor.id) {
      throw ruleBroken(
        'self_removal',
        'You cannot remove yourself from the lab; ask another manager.',
      );
    }
    await em.delete(Membership, { id });
    await audit(em, actor.id, 'membership.deleted', 'membership', id, {
      userId: m.userId,
      organisationId: m.organisationId,
    });
  });
}

/** Staff roles: a lab cannot make these accounts lab members (the provider's people stay neutral). */
export const STAFF_ROLES: readonly GlobalRole[] = ['admin', 'coordinator', 'assessor'];

/** How long a lab's invitation to an existing account stays open. */
export const LAB_INVITATION_DAYS = 14;

/** Open invitations with the lab, the invited person and the inviter, newest first. */
function invitationQuery(em: EntityManager) {
  return em
    .createQueryBuilder(LabInvitation, 'i')
    .innerJoin('i.organisation', 'o')
    .innerJoin('i.user', 'u')
    .leftJoin('i.inviter', 'b')
    .select(['i', 'o.id', 'o.name', 'u.id', 'u.email', 'u.name', 'b.id', 'b.name'])
    .orderBy('i.createdAt', 'DESC');
}

function openInvitations(em: EntityManager) {
  return invitationQuery(em).where('i.answeredAt IS NULL').andWhere('i.expiresAt > now()');
}

function invitationDto(i: LabInvitation): LabInvitationDto {
  return {
    id: i.id,
    organisationId: i.organisationId,
    organisationName: i.organisation!.name,
    email: i.user!.email,
    name: i.user!.name,
    invitedByName: i.inviter?.name ?? null,
    isManager: i.isManager,
    createdAt: i.createdAt.toISOString(),
    expiresAt: i.expiresAt.toISOString(),
  };
}

/** Answers the open invitations matching `where` (an answered one keeps its answer); how many. */
async function answerOpen(
  em: EntityManager,
  where: { id?: string; organisationId: string; userId?: string },
  answer: LabInvitationAnswer,
): Promise<number> {
  const r = await em.update(
    LabInvitation,
    { ...where, answeredAt: IsNull() },
    { answeredAt: () => 'now()', answer },
  );
  return r.affected ?? 0;
}

/**
 * A lab manager adds a colleague. A new address gets an account, the membership and a
 * first-password link (choosing the password is the consent). An existing account gets an
 * invitation it accepts or declines: no membership until then. Staff accounts cannot be added.
 */
export async function inviteLabMember(
  ctx: AppContext,
  actor: SessionUser,
  organisationId: string,
  input: { email: string; name: string; isManager: boolean },
): Promise<LabMemberInviteResult> {
  const { result, mail } = await ctx.ds.transaction(async (em) => {
    const lab = await em.findOne(Organisation, { where: { id: organisationId } });
    if (!lab) throw notFound('The lab');
    const user = await em.findOne(User, { where: { email: input.email } });
    if (!user) {
      const created = await em.save(
        User,
        em.create(User, { email: input.email, name: input.name, roles: [], passwordHash: null }),
      );
      const token = await issuePasswordToken(em, created.id, 'first-password');
      await audit(em, actor.id, 'user.invited', 'user', created.id, {
        email: input.email,
        organisationId,
      });
      const m = await em.save(
        Membership,
        em.create(Membership, { userId: created.id, organisationId, isManager: input.isManager }),
      );
      await audit(em, actor.id, 'membership.created', 'membership', m.id, {
        userId: created.id,
        organisationId,
      });
      return {
        result: {
          outcome: 'member-added' as const,
          membership: await getMembershipDto(em, m.id),
          invitation: null,
        },
        mail: { kind: 'account' as const, user: created, token },
      };
    }
    if (user.roles.some((r) => STAFF_ROLES.includes(r))) {
      throw ruleBroken(
        'staff_account',
        'email: this address belongs to a PT provider staff account (admin, coordinator or assessor), which cannot be a lab member.',
        [{ path: 'email', message: 'A PT provider staff account cannot be a lab member.' }],
      );
    }
    if (await em.findOne(Membership, { where: { userId: user.id, organisationId } })) {
      throw conflict('already_member', `${input.email} is already a member of this lab.`);
    }
    // One open invitation per lab and person: inviting again renews it.
    await answerOpen(em, { organisationId, userId: user.id }, 'withdrawn');
    const inserted = await em.insert(LabInvitation, {
      organisationId,
      userId: user.id,
      isManager: input.isManager,
      invitedBy: actor.id,
      expiresAt: () => `now() + make_interval(days => ${LAB_INVITATION_DAYS})`,
    });
    const invitationId = (inserted.identifiers[0] as { id: string }).id;
    await audit(em, actor.id, 'lab-invitation.created', 'organisation', organisationId, {
      invitationId,
      userId: user.id,
      isManager: input.isManager,
    });
    return {
      result: {
        outcome: 'invitation-sent' as const,
        membership: null,
        invitation: invitationDto(
          await invitationQuery(em).where('i.id = :id', { id: invitationId }).getOneOrFail(),
        ),
      },
      mail: { kind: 'invitation' as const, user, lab, inviter: actor.name },
    };
  });
  if (mail.kind === 'account') {
    await sendLinkMail(ctx, mail.user.email, mail.user.name, mail.token, 'first-password');
  } else {
    try {
      await ctx.mailer.send({
        to: mail.user.email,
        subject: `${mail.lab.name} invites you to join the lab on Ringlet`,
        text:
          `Hello ${mail.user.name},\n\n${mail.inviter} invites you to join ${mail.lab.name} on Ringlet, the proficiency-testing service.\n` +
          `You become a member only if you accept. Sign in and answer here (the invitation is open for ${LAB_INVITATION_DAYS} days):\n\n` +
          `${ctx.config.publicUrl}/lab-invitations\n\nIf you did not expect this e-mail, decline the invitation or ignore it.\n\nRinglet`,
      });
    } catch (err) {
      ctx.log(`mail to ${mail.user.email} failed; invite again to resend`, err);
    }
  }
  return result;
}

/** The open invitations of one lab (lab managers see whom they invited). */
export async function listLabInvitations(
  em: EntityManager,
  organisationId: string,
): Promise<LabInvitationDto[]> {
  const rows = await openInvitations(em)
    .andWhere('i.organisationId = :organisationId', { organisationId })
    .getMany();
  return rows.map(invitationDto);
}

/** A lab manager withdraws an open invitation of their lab. */
export async function withdrawLabInvitation(
  ctx: AppContext,
  actor: SessionUser,
  organisationId: string,
  id: string,
): Promise<void> {
  await ctx.ds.transaction(async (em) => {
    if ((await answerOpen(em, { id, organisationId }, 'withdrawn')) === 0)
      throw notFound('The invitation');
    await audit(em, actor.id, 'lab-invitation.withdrawn', 'organisation', organisationId, {
      invitationId: id,
    });
  });
}

/** My open lab invitations. */
export async function listMyInvitations(
  em: EntityManager,
  userId: string,
): Promise<LabInvitationDto[]> {
  const rows = await openInvitations(em).andWhere('i.userId = :userId', { userId }).getMany();
  return rows.map(invitationDto);
}

/**
 * Accepts or declines one of my open invitations (another person's, an answered or an expired
 * one answers 404). Accepting creates the membership.
 */
export async function answerInvitation(
  ctx: AppContext,
  user: SessionUser,
  id: string,
  accept: boolean,
): Promise<void> {
  await ctx.ds.transaction(async (em) => {
    const inv = await em.findOne(LabInvitation, {
      where: { id, userId: user.id },
      lock: { mode: 'pessimistic_write' },
    });
    if (!inv || inv.answeredAt || inv.expiresAt.getTime() <= Date.now())
      throw notFound('The invitation');
    if (accept) {
      const account = await em.findOneOrFail(User, { where: { id: user.id } });
      if (account.roles.some((r) => STAFF_ROLES.includes(r))) {
        throw ruleBroken(
          'staff_account',
          'A PT provider staff account (admin, coordinator or assessor) cannot be a lab member.',
        );
      }
      if (
        !(await em.findOne(Membership, {
          where: { userId: user.id, organisationId: inv.organisationId },
        }))
      ) {
        const m = await em.save(
          Membership,
          em.create(Membership, {
            userId: user.id,
            organisationId: inv.organisationId,
            isManager: inv.isManager,
          }),
        );
        await audit(em, user.id, 'membership.created', 'membership', m.id, {
          userId: user.id,
          organisationId: inv.organisationId,
          invitationId: id,
        });
      }
    }
    await em.update(
      LabInvitation,
      { id },
      { answeredAt: () => 'now()', answer: accept ? 'accepted' : 'declined' },
    );
    await audit(
      em,
      user.id,
      accept ? 'lab-invitation.accepted' : 'lab-invitation.declined',
      'organisation',
      inv.organisationId,
      { invitationId: id },
    );
  });
  forgetSessionUser(user.id);
}
