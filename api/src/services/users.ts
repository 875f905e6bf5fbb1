import type { EntityManager } from 'typeorm';
import type { GlobalRole, Role } from '../../../shared/contracts/auth';
import type {
  Membership as MembershipDto,
  MembershipCreate,
  Organisation as OrganisationDto,
  OrganisationCreate,
  User as UserDto,
  UserInvite,
  UserUpdate,
} from '../../../shared/contracts/admin';
import { Membership, Organisation, User } from '../../../db/entities';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound, ruleBroken } from '../http/errors';
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
    memberships: { id: string; organisationId: string; organisationName: string; isManager: boolean }[];
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
  return { id: user.id, email: user.email, name: user.name, roles, memberships: user.memberships };
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
  const u = await em.findOne(User, { where: { id }, relations: { memberships: { organisation: true } } });
  if (!u) throw notFound('The user');
  return userDto(u);
}

/**
 * Creates an account (or reuses an existing one for the e-mail, when adding a lab membership)
 * and e-mails a first-password link.
 */
export async function inviteUser(ctx: AppContext, actor: SessionUser, input: UserInvite & { roles: UserDto['roles']; isManager: boolean }): Promise<UserDto> {
  const { user, token } = await ctx.ds.transaction(async (em) => {
    if (await em.findOne(User, { where: { email: input.email } })) {
      throw conflict('email_taken', `An account for ${input.email} already exists.`);
    }
    if (input.organisationId && !(await em.findOne(Organisation, { where: { id: input.organisationId } }))) {
      throw ruleBroken('organisation_unknown', 'organisationId: that lab does not exist.');
    }
    const created = await em.save(User, em.create(User, { email: input.email, name: input.name, roles: input.roles, passwordHash: null }));
    if (input.organisationId) {
      await em.insert(Membership, { userId: created.id, organisationId: input.organisationId, isManager: input.isManager });
    }
    await audit(em, actor.id, 'user.invited', 'user', created.id, { email: input.email, roles: input.roles });
    const t = await issuePasswordToken(em, created.id, 'first-password');
    return { user: await getUserDto(em, created.id), token: t };
  });
  await sendLinkMail(ctx, user.email, user.name, token, 'first-password');
  return user;
}

export async function resendInvitation(ctx: AppContext, actor: SessionUser, userId: string): Promise<void> {
  const { user, token } = await ctx.ds.transaction(async (em) => {
    const u = await em.findOne(User, { where: { id: userId } });
    if (!u) throw notFound('The user');
    const purpose = u.passwordHash ? 'reset' : 'first-password';
    const t = await issuePasswordToken(em, u.id, purpose);
    await audit(em, actor.id, 'user.link-sent', 'user', u.id, { purpose });
    return { user: u, token: t };
  });
  await sendLinkMail(ctx, user.email, user.name, token, user.passwordHash ? 'reset' : 'first-password');
}

export async function updateUser(ctx: AppContext, actor: SessionUser, id: string, patch: UserUpdate): Promise<UserDto> {
  return ctx.ds.transaction(async (em) => {
    const u = await em.findOne(User, { where: { id } });
    if (!u) throw notFound('The user');
    if (id === actor.id && (patch.isActive === false || (patch.roles && !patch.roles.includes('admin')))) {
      throw ruleBroken('self_lockout', 'You cannot remove your own admin role or deactivate yourself.');
    }
    await em.update(User, { id }, patch);
    await audit(em, actor.id, 'user.updated', 'user', id, { ...patch });
    if (patch.isActive === false) {
      // sign the user out everywhere
      await em.query(`DELETE FROM session WHERE sess -> 'passport' ->> 'user' = $1`, [id]);
    }
    return getUserDto(em, id);
  });
}

export async function listOrganisations(ctx: AppContext): Promise<OrganisationDto[]> {
  const orgs = await ctx.ds.getRepository(Organisation).find({ order: { name: 'ASC' } });
  return orgs.map(organisationDto);
}

async function assertNameFree(em: EntityManager, name: string, exceptId?: string): Promise<void> {
  const rows: { id: string }[] = await em.query(`SELECT id FROM organisation WHERE lower(name) = lower($1)`, [name]);
  if (rows.some((r) => r.id !== exceptId)) throw conflict('name_taken', `name: an organisation called "${name}" already exists.`);
}

export async function createOrganisation(ctx: AppContext, actor: SessionUser, input: OrganisationCreate & { kind: 'lab' | 'provider' }): Promise<OrganisationDto> {
  return ctx.ds.transaction(async (em) => {
    await assertNameFree(em, input.name);
    const o = await em.save(Organisation, em.create(Organisation, {
      name: input.name,
      kind: input.kind,
      country: input.country ?? null,
      contactEmail: input.contactEmail ?? null,
    }));
    await audit(em, actor.id, 'organisation.created', 'organisation', o.id, { name: o.name });
    return organisationDto(o);
  });
}

export async function updateOrganisation(ctx: AppContext, actor: SessionUser, id: string, patch: Partial<OrganisationCreate>): Promise<OrganisationDto> {
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

export async function listMemberships(em: EntityManager, organisationId: string): Promise<MembershipDto[]> {
  if (!(await em.findOne(Organisation, { where: { id: organisationId } }))) throw notFound('The organisation');
  const rows = await em.find(Membership, {
    where: { organisationId },
    relations: { user: true, organisation: true },
  });
  return rows.map(membershipDto).sort((a, b) => a.userName.localeCompare(b.userName));
}

async function getMembershipDto(em: EntityManager, id: string): Promise<MembershipDto> {
  const m = await em.findOne(Membership, { where: { id }, relations: { user: true, organisation: true } });
  if (!m) throw notFound('The membership');
  return membershipDto(m);
}

export async function createMembership(ctx: AppContext, actor: SessionUser, input: MembershipCreate & { isManager: boolean }): Promise<MembershipDto> {
  return ctx.ds.transaction(async (em) => {
    if (!(await em.findOne(User, { where: { id: input.userId } }))) throw ruleBroken('user_unknown', 'userId: that user does not exist.');
    if (!(await em.findOne(Organisation, { where: { id: input.organisationId } })))
      throw ruleBroken('organisation_unknown', 'organisationId: that organisation does not exist.');
    if (await em.findOne(Membership, { where: { userId: input.userId, organisationId: input.organisationId } }))
      throw conflict('already_member', 'That user is already a member of this organisation.');
    const m = await em.save(Membership, em.create(Membership, input));
    await audit(em, actor.id, 'membership.created', 'membership', m.id, { ...input });
    return getMembershipDto(em, m.id);
  });
}

export async function updateMembership(ctx: AppContext, actor: SessionUser, id: string, isManager: boolean, organisationId?: string): Promise<MembershipDto> {
  return ctx.ds.transaction(async (em) => {
    const m = await em.findOne(Membership, { where: { id } });
    if (!m || (organisationId && m.organisationId !== organisationId)) throw notFound('The membership');
    await em.update(Membership, { id }, { isManager });
    await audit(em, actor.id, 'membership.updated', 'membership', id, { isManager });
    return getMembershipDto(em, id);
  });
}

export async function deleteMembership(ctx: AppContext, actor: SessionUser, id: string, organisationId?: string): Promise<void> {
  await ctx.ds.transaction(async (em) => {
    const m = await em.findOne(Membership, { where: { id } });
    if (!m || (organisationId && m.organisationId !== organisationId)) throw notFound('The membership');
    if (organisationId && m.userId === actor.id) {
      throw ruleBroken('self_removal', 'You cannot remove yourself from the lab; ask another manager.');
    }
    await em.delete(Membership, { id });
    await audit(em, actor.id, 'membership.deleted', 'membership', id, { userId: m.userId, organisationId: m.organisationId });
  });
}

/**
 * A lab manager adds a colleague: an existing account gets the membership, a new address gets an
 * account and a first-password link.
 */
export async function inviteLabMember(
  ctx: AppContext,
  actor: SessionUser,
  organisationId: string,
  input: { email: string; name: string; isManager: boolean },
): Promise<MembershipDto> {
  const { membership, mail } = await ctx.ds.transaction(async (em) => {
    if (!(await em.findOne(Organisation, { where: { id: organisationId } }))) throw notFound('The lab');
    let user = await em.findOne(User, { where: { email: input.email } });
    let token: string | null = null;
    if (!user) {
      user = await em.save(User, em.create(User, { email: input.email, name: input.name, roles: [], passwordHash: null }));
      token = await issuePasswordToken(em, user.id, 'first-password');
      await audit(em, actor.id, 'user.invited', 'user', user.id, { email: input.email, organisationId });
    } else if (await em.findOne(Membership, { where: { userId: user.id, organisationId } })) {
      throw conflict('already_member', `${input.email} is already a member of this lab.`);
    }
    const m = await em.save(Membership, em.create(Membership, { userId: user.id, organisationId, isManager: input.isManager }));
    await audit(em, actor.id, 'membership.created', 'membership', m.id, { userId: user.id, organisationId });
    return { membership: await getMembershipDto(em, m.id), mail: token ? { user, token } : null };
  });
  if (mail) await sendLinkMail(ctx, mail.user.email, mail.user.name, mail.token, 'first-password');
  return membership;
}
