/**
 * Assessor grants: a lab manager lets an assessor read the lab's results, investigations and
 * evidence for a period. The read rule everyone uses: `grantedLabIds` (active grants only).
 */
import { In, type EntityManager } from 'typeorm';
import { AssessorGrant, Organisation, User } from '../../../db/entities';
import type { AssessorGrantCreate, AssessorGrantDto } from '../../../shared/contracts/evaluation';
import { managesLab, type SessionUser } from '../auth/session-user';
import { notFound, ruleBroken } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';
import { issuePasswordToken, sendLinkMail } from './passwords';

/** Lab (organisation) ids whose active grant lets this assessor read them today. */
export async function grantedLabIds(em: EntityManager, assessorId: string): Promise<string[]> {
  const grants = await em
    .createQueryBuilder(AssessorGrant, 'g')
    .select(['g.id', 'g.organisationId'])
    .where('g.assessorId = :assessorId', { assessorId })
    .andWhere('g.revokedAt IS NULL AND g.startsOn <= CURRENT_DATE')
    .andWhere('(g.endsOn IS NULL OR g.endsOn >= CURRENT_DATE)')
    .getMany();
  return [...new Set(grants.map((g) => g.organisationId))];
}

const today = () => new Date().toISOString().slice(0, 10);

function dto(g: AssessorGrant, u: Pick<User, 'email' | 'name'>): AssessorGrantDto {
  const t = today();
  return {
    id: g.id,
    organisationId: g.organisationId,
    assessorId: g.assessorId,
    assessorEmail: u.email,
    assessorName: u.name,
    startsOn: g.startsOn,
    endsOn: g.endsOn,
    revokedAt: g.revokedAt?.toISOString() ?? null,
    isActive: g.revokedAt === null && g.startsOn <= t && (g.endsOn === null || g.endsOn >= t),
    createdAt: g.createdAt.toISOString(),
  };
}

function assertMember(user: SessionUser, labId: string, manager: boolean): void {
  const ok = manager
    ? managesLab(user, labId)
    : user.memberships.some((m) => m.organisationId === labId);
  if (!ok) throw notFound('The lab');
}

export async function listGrants(
  ctx: AppContext,
  user: SessionUser,
  labId: string,
): Promise<AssessorGrantDto[]> {
  assertMember(user, labId, false);
  const grants = await ctx.ds
    .getRepository(AssessorGrant)
    .find({ where: { organisationId: labId }, order: { createdAt: 'DESC' } });
  const users = grants.length
    ? await ctx.ds.getRepository(User).find({ where: { id: In(grants.map((g) => g.assessorId)) } })
    : [];
  const byId = new Map(users.map((u) => [u.id, u]));
  return grants.map((g) => dto(g, byId.get(g.assessorId)!));
}

/**
 * Grants an assessor access (lab managers). The answer is the same whether or not the e-mail has
 * an account, and whatever that account's roles (it is built from what the manager typed), so
 * the form cannot be used to find out who has an account:
 * - a new e-mail gets an assessor account and a first-password link;
 * - an assessor's account gets the grant;
 * - another account gets the grant too, which counts only once that person holds the assessor
 *   role (every assessor read checks the role); the mail tells them to ask the provider for it.
 */
export async function createGrant(
  ctx: AppContext,
  actor: SessionUser,
  labId: string,
  input: AssessorGrantCreate,
): Promise<AssessorGrantDto> {
  assertMember(actor, labId, true);
  const startsOn = input.startsOn ?? today();
  if (input.endsOn && input.endsOn < startsOn)
    throw ruleBroken('ends_before_start', 'endsOn: the grant cannot end before it starts.');
  const typedName = input.name ?? input.email.split('@')[0]!;
  const out = await ctx.ds.transaction(async (em) => {
    const lab = await em.findOne(Organisation, { where: { id: labId } });
    if (!lab) throw notFound('The lab');
    let user = await em.findOne(User, { where: { email: input.email } });
    let token: string | null = null;
    if (!user) {
      user = await em.save(
        User,
        em.create(User, {
          email: input.email,
          name: typedName,
          roles: ['assessor'],
          passwordHash: null,
        }),
      );
      token = await issuePasswordToken(em, user.id, 'first-password');
      await audit(em, actor.id, 'user.invited', 'user', user.id, {
        email: input.email,
        roles: ['assessor'],
        by: 'lab-manager',
      });
    }
    const g = await em.save(
      AssessorGrant,
      em.create(AssessorGrant, {
        organisationId: labId,
        assessorId: user.id,
        grantedBy: actor.id,
        startsOn,
        endsOn: input.endsOn ?? null,
        revokedAt: null,
      }),
    );
    await audit(em, actor.id, 'assessor-grant.created', 'organisation', labId, {
      grantId: g.id,
      assessorId: user.id,
      startsOn,
      endsOn: g.endsOn,
    });
    return { g: await em.findOneOrFail(AssessorGrant, { where: { id: g.id } }), user, token, lab };
  });
  if (out.token)
    await sendLinkMail(ctx, out.user.email, out.user.name, out.token, 'first-password');
  const isAssessor = out.user.roles.includes('assessor');
  try {
    await ctx.mailer.send({
      to: out.user.email,
      subject: `${out.lab.name} gave you access on Ringlet`,
      text: `Hello ${out.user.name},\n\n${out.lab.name} lets you read its proficiency-testing results and investigations on Ringlet from ${out.g.startsOn}${
        out.g.endsOn ? ` to ${out.g.endsOn}` : ''
      }.\n\n${
        isAssessor
          ? `${ctx.config.publicUrl}/assessor`
          : 'Your account is not an assessor\u2019s account, so this access counts only once the PT provider gives your account the assessor role. If you did not expect this, ignore this e-mail.'
      }\n\nRinglet`,
    });
  } catch (err) {
    ctx.log('grant mail failed', err);
  }
  // Built from the input, not from the account, so a known and an unknown address answer alike.
  return dto(out.g, { email: input.email, name: typedName });
}

export async function revokeGrant(
  ctx: AppContext,
  actor: SessionUser,
  labId: string,
  grantId: string,
): Promise<void> {
  assertMember(actor, labId, true);
  await ctx.ds.transaction(async (em) => {
    const g = await em.findOne(AssessorGrant, { where: { id: grantId, organisationId: labId } });
    if (!g) throw notFound('The grant');
    if (g.revokedAt) return;
    await em.update(AssessorGrant, { id: grantId }, { revokedAt: new Date() });
    await audit(em, actor.id, 'assessor-grant.revoked', 'organisation', labId, { grantId });
  });
}
