import { randomBytes, randomInt } from 'node:crypto';
import { In, IsNull, MoreThan, type EntityManager } from 'typeorm';
import {
  Enrolment,
  Invitation,
  Membership,
  Organisation,
  Round,
  Shipment,
  Submission,
  User,
} from '../../../db/entities';
import type {
  Enrolment as EnrolmentDto,
  ExtensionGrant,
  Invitation as InvitationDto,
  InvitationAcceptResult,
  InvitationCreate,
  InvitationInfo,
  ReceiptStatus,
} from '../../../shared/contracts/rounds';
import type { SessionUser } from '../auth/session-user';
import { conflict, ServiceError, notFound, ruleBroken, unauthorized } from './errors';
import type { OutgoingMail } from '../mail/mailer';
import { audit } from './audit';
import { creditOnWithdrawal, issueInvoiceForEnrolment, mailInvoiceIssued } from './billing';
import type { AppContext } from './context';
import { issuePasswordToken, sendLinkMail, tokenHash, unexpiredLink } from './passwords';
import { lockRound } from './round-lifecycle';

/** How long an invitation link stays valid. */
export const INVITATION_LIFETIME_MS = 14 * 24 * 3600 * 1000;

/**
 * Participant codes: 'P' + 4 characters from 31 letters and digits without the look-alikes
 * (0/O, 1/I/L). 31⁴ ≈ 924,000 codes per round, drawn with a CSPRNG: not guessable and unrelated to
 * the order of enrolment.
 */
export const CODE_ALPHABET = 'ABCDEFGHJKMNPQRSTUVWXYZ23456789';
export function randomParticipantCode(): string {
  let s = 'P';
  for (let i = 0; i < 4; i++) s += CODE_ALPHABET[randomInt(CODE_ALPHABET.length)];
  return s;
}

/** A code not yet used in the round (retried on collision). */
export async function freshParticipantCode(
  em: EntityManager,
  roundId: string,
  draw = randomParticipantCode,
): Promise<string> {
  for (let attempt = 0; attempt < 20; attempt++) {
    const code = draw();
    if (!(await em.findOne(Enrolment, { where: { roundId, participantCode: code } }))) return code;
  }
  throw new ServiceError(
    503,
    'code_space_exhausted',
    'No free participant code was found; try again.',
  );
}

/** Sends a mail; a failure is logged and never undoes the action (a queued mailer retries it). */
export async function sendSafely(ctx: AppContext, mail: OutgoingMail): Promise<void> {
  try {
    await ctx.mailer.send(mail);
  } catch (err) {
    ctx.log(`mail to ${String(mail.to)} failed`, err);
  }
}

function invitationDto(i: Invitation, orgName: string | null): InvitationDto {
  return {
    id: i.id,
    roundId: i.roundId,
    organisationId: i.organisationId,
    organisationName: orgName,
    email: i.email,
    labName: i.labName,
    expiresAt: i.expiresAt.toISOString(),
    acceptedAt: i.acceptedAt?.toISOString() ?? null,
    createdAt: i.createdAt.toISOString(),
  };
}

export async function listInvitations(ctx: AppContext, roundId: string): Promise<InvitationDto[]> {
  if (!(await ctx.ds.getRepository(Round).findOne({ where: { id: roundId } })))
    throw notFound('The round');
  const rows = await ctx.ds
    .getRepository(Invitation)
    .find({ where: { roundId }, order: { createdAt: 'ASC' } });
  const orgs = await ctx.ds.getRepository(Organisation).find();
  const names = new Map(orgs.map((o) => [o.id, o.name]));
  return rows.map((i) =>
    invitationDto(i, i.organisationId ? (names.get(i.organisationId) ?? null) : null),
  );
}

/**
 * Invites labs by e-mail: an existing lab (organisationId) or a new one (labName + contact
 * address). Each invitation carries a single-use token (only its hash is stored) valid 14 days.
 */
export async function createInvitations(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  list: { organisationId: string | null; email: string; labName: string | null }[],
): Promise<InvitationDto[]> {
  const { created, mails, round } = await ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    if (round.state !== 'enrolling') {
      throw conflict(
        'round_not_enrolling',
        'Invitations go out only while the round is enrolling; open enrolment first.',
      );
    }
    const created: InvitationDto[] = [];
    const mails: { email: string; token: string; labName: string }[] = [];
    for (const [n, inv] of list.entries()) {
      let orgName: string | null = null;
      if (inv.organisationId) {
        const org = await em.findOne(Organisation, {
          where: { id: inv.organisationId, kind: 'lab' },
        });
        if (!org)
          throw ruleBroken(
            'organisation_unknown',
            `invitations.${n}.organisationId: that lab does not exist.`,
          );
        if (await em.findOne(Enrolment, { where: { roundId, organisationId: org.id } })) {
          throw conflict(
            'already_enrolled',
            `invitations.${n}.organisationId: ${org.name} is already enrolled in this round.`,
          );
        }
        orgName = org.name;
      }
      const token = randomBytes(32).toString('base64url');
      const row = await em.save(
        Invitation,
        em.create(Invitation, {
          roundId,
          organisationId: inv.organisationId,
          email: inv.email,
          labName: inv.organisationId ? null : inv.labName,
          tokenHash: tokenHash(token),
          expiresAt: new Date(Date.now() + INVITATION_LIFETIME_MS),
          createdBy: actor.id,
        }),
      );
      await audit(em, actor.id, 'invitation.created', 'invitation', row.id, {
        roundId,
        email: inv.email,
        organisationId: inv.organisationId,
      });
      created.push(invitationDto(row, orgName));
      mails.push({ email: inv.email, token, labName: orgName ?? inv.labName ?? '' });
    }
    return { created, mails, round };
  });
  for (const m of mails) {
    const link = `${ctx.config.publicUrl}/invitations/${m.token}`;
    await sendSafely(ctx, {
      to: m.email,
      subject: `Invitation to proficiency-testing round ${round.code}`,
      text:
        `Hello,\n\n${m.labName || 'Your lab'} is invited to take part in the proficiency-testing round ` +
        `${round.code} (${round.title}).\n\nAccept here (the link works once and for 14 days):\n\n${link}\n\n` +
        `On acceptance your lab receives a participant code; other participants only ever see codes.\n\n` +
        `If you did not expect this e-mail, ignore it.\n\nRinglet`,
    });
  }
  return created;
}

const invalidInvitation = () =>
  new ServiceError(
    404,
    'link_invalid',
    'This invitation has expired or was already used. Ask the coordinator for a new one.',
  );

/** What the invitee sees before accepting. */
export async function invitationInfo(ctx: AppContext, token: string): Promise<InvitationInfo> {
  const inv = await ctx.ds
    .getRepository(Invitation)
    .findOne({ where: { tokenHash: tokenHash(token) } });
  if (!inv || inv.acceptedAt || inv.expiresAt.getTime() <= Date.now()) throw invalidInvitation();
  const round = await ctx.ds.getRepository(Round).findOneOrFail({ where: { id: inv.roundId } });
  const org = inv.organisationId
    ? await ctx.ds.getRepository(Organisation).findOne({ where: { id: inv.organisationId } })
    : null;
  return {
    roundCode: round.code,
    roundTitle: round.title,
    email: inv.email,
    labName: org?.name ?? inv.labName,
    isNewLab: inv.organisationId === null,
    expiresAt: inv.expiresAt.toISOString(),
  };
}

/**
 * Accepts an invitation: atomically marks the token used (so the link works once), then enrols
 * the lab with a fresh participant code. An existing lab's invitation needs a signed-in member of
 * that lab; a new lab's invitation creates the lab and (if the address has no account) a user
 * who gets a first-password link.
 */
export async function acceptInvitation(
  ctx: AppContext,
  user: SessionUser | undefined,
  token: string,
): Promise<InvitationAcceptResult> {
  const { result, mail, enrolmentId } = await ctx.ds.transaction(async (em) => {
    // Locked, then marked accepted: a concurrent use of the same link waits and then finds it used.
    const inv = await em.findOne(Invitation, {
      where: { ...unexpiredLink(token), acceptedAt: IsNull() },
      lock: { mode: 'pessimistic_write' },
    });
    if (!inv) throw invalidInvitation();
    await em.update(Invitation, { id: inv.id }, { acceptedAt: () => 'now()' });
    const round = await lockRound(em, inv.roundId);
    if (round.state !== 'enrolling')
      throw conflict('round_not_enrolling', 'Enrolment for this round is closed.');

    let organisationId: string;
    let mail: { email: string; name: string; token: string } | null = null;
    let actorId: string | null = user?.id ?? null;
    if (inv.organisationId) {
      if (!user) throw unauthorized();
      if (!user.memberships.some((m) => m.organisationId === inv.organisationId)) {
        throw new ServiceError(
          403,
          'not_a_member',
          'Sign in as a member of the invited lab to accept.',
        );
      }
      organisationId = inv.organisationId;
    } else {
      const name = inv.labName ?? inv.email;
      const clash = await em
        .createQueryBuilder(Organisation, 'o')
        .where('lower(o.name) = lower(:name)', { name })
        .getExists();
      if (clash)
        throw conflict(
          'name_taken',
          `A lab called "${name}" already exists; ask the coordinator to invite it directly.`,
        );
      const org = await em.save(
        Organisation,
        em.create(Organisation, { name, kind: 'lab', country: null, contactEmail: inv.email }),
      );
      organisationId = org.id;
      await audit(em, actorId, 'organisation.created', 'organisation', org.id, {
        name,
        via: 'invitation',
        invitationId: inv.id,
      });
      let account = await em.findOne(User, { where: { email: inv.email } });
      if (!account) {
        account = await em.save(
          User,
          em.create(User, { email: inv.email, name, roles: [], passwordHash: null }),
        );
        await audit(em, actorId, 'user.invited', 'user', account.id, {
          email: inv.email,
          organisationId,
        });
        mail = {
          email: account.email,
          name: account.name,
          token: await issuePasswordToken(em, account.id, 'first-password'),
        };
      }
      await em.insert(Membership, { userId: account.id, organisationId, isManager: true });
      actorId ??= account.id;
    }
    if (await em.findOne(Enrolment, { where: { roundId: round.id, organisationId } })) {
      throw conflict('already_enrolled', 'Your lab is already enrolled in this round.');
    }
    const participantCode = await freshParticipantCode(em, round.id);
    const enrolment = await em.save(
      Enrolment,
      em.create(Enrolment, { roundId: round.id, organisationId, participantCode }),
    );
    await em.update(Invitation, { id: inv.id }, { enrolmentId: enrolment.id, organisationId });
    await issueInvoiceForEnrolment(em, actorId, enrolment);
    await audit(em, actorId, 'enrolment.created', 'enrolment', enrolment.id, {
      roundId: round.id,
      organisationId,
      invitationId: inv.id,
    });
    return {
      result: { roundId: round.id, participantCode, accountCreated: mail !== null },
      mail,
      enrolmentId: enrolment.id,
    };
  });
  if (mail) await sendLinkMail(ctx, mail.email, mail.name, mail.token, 'first-password');
  await mailInvoiceIssued(ctx, enrolmentId);
  return result;
}

function receiptStatus(s: Shipment | null): ReceiptStatus {
  if (!s?.dispatchedOn) return 'not-dispatched';
  if (!s.receivedOn) return 'dispatched';
  return s.condition && s.condition !== 'intact' ? 'received-with-problem' : 'received';
}

/** Enrolments of a round with lab names, shipment and receipt status (coordinator's view). */
export async function listEnrolments(em: EntityManager, roundId: string): Promise<EnrolmentDto[]> {
  if (!(await em.findOne(Round, { where: { id: roundId } }))) throw notFound('The round');
  const enrolments = await em.find(Enrolment, {
    where: { roundId },
    order: { participantCode: 'ASC' },
  });
  if (!enrolments.length) return [];
  const ids = enrolments.map((e) => e.id);
  const shipments = await em
    .createQueryBuilder(Shipment, 's')
    .where('s.enrolment_id IN (:...ids)', { ids })
    .getMany();
  const orgs = await em
    .createQueryBuilder(Organisation, 'o')
    .where('o.id IN (:...ids)', { ids: enrolments.map((e) => e.organisationId) })
    .getMany();
  const submitted = await em.find(Submission, {
    select: { id: true, enrolmentId: true },
    where: { enrolmentId: In(ids), currentVersion: MoreThan(0) },
  });
  const bySubmission = new Set(submitted.map((r) => r.enrolmentId));
  const byEnrolment = new Map(shipments.map((s) => [s.enrolmentId, s]));
  const names = new Map(orgs.map((o) => [o.id, o.name]));
  return enrolments.map((e) => {
    const s = byEnrolment.get(e.id) ?? null;
    return {
      id: e.id,
      roundId: e.roundId,
      organisationId: e.organisationId,
      organisationName: names.get(e.organisationId) ?? '',
      participantCode: e.participantCode,
      state: e.state,
      withdrawnReason: e.withdrawnReason,
      extensionUntil: e.extensionUntil?.toISOString() ?? null,
      enrolledAt: e.enrolledAt.toISOString(),
      shipment: s
        ? {
            courier: s.courier,
            trackingNumber: s.trackingNumber,
            dispatchedOn: s.dispatchedOn,
            receivedOn: s.receivedOn,
            condition: s.condition,
            receiptNotes: s.receiptNotes,
          }
        : null,
      receiptStatus: receiptStatus(s),
      submitted: bySubmission.has(e.id),
    };
  });
}

export async function enrolmentDto(
  em: EntityManager,
  roundId: string,
  enrolmentId: string,
): Promise<EnrolmentDto> {
  const found = (await listEnrolments(em, roundId)).find((e) => e.id === enrolmentId);
  if (!found) throw notFound('The enrolment');
  return found;
}

/** The enrolment of the round, locked; 404 when it belongs to another round. */
export async function lockEnrolment(
  em: EntityManager,
  roundId: string,
  enrolmentId: string,
): Promise<Enrolment> {
  const e = await em.findOne(Enrolment, {
    where: { id: enrolmentId, roundId },
    lock: { mode: 'pessimistic_write' },
  });
  if (!e) throw notFound('The enrolment');
  return e;
}

/** Withdraws an enrolment with a reason (before the round closes). */
export async function withdrawEnrolment(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  enrolmentId: string,
  reason: string,
): Promise<EnrolmentDto> {
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    const e = await lockEnrolment(em, roundId, enrolmentId);
    if (e.state === 'withdrawn')
      throw conflict('already_withdrawn', 'This enrolment is already withdrawn.');
    if (!['draft', 'enrolling', 'in-transit', 'collecting'].includes(round.state)) {
      throw conflict(
        'round_closed',
        'The round has closed; enrolments can no longer be withdrawn.',
      );
    }
    await em.update(Enrolment, { id: e.id }, { state: 'withdrawn', withdrawnReason: reason });
    await audit(em, actor.id, 'enrolment.withdrawn', 'enrolment', e.id, { roundId, reason });
    await creditOnWithdrawal(em, actor.id, e.id, reason);
    return enrolmentDto(em, roundId, e.id);
  });
}

/**
 * Grants a lab a late-submission extension (read by the Lab bench from enrolment.extension_until).
 * The new deadline must be after the round's results-due date.
 */
export async function grantExtension(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  enrolmentId: string,
  input: ExtensionGrant,
): Promise<EnrolmentDto> {
  return ctx.ds.transaction(async (em) => {
    const round = await lockRound(em, roundId);
    const e = await lockEnrolment(em, roundId, enrolmentId);
    if (e.state !== 'enrolled')
      throw conflict('enrolment_withdrawn', 'A withdrawn enrolment cannot get an extension.');
    if (!['in-transit', 'collecting', 'closed'].includes(round.state)) {
      throw conflict(
        'round_not_collecting',
        'Extensions are granted while results are collected (or just after closing).',
      );
    }
    const until = new Date(input.until);
    if (round.resultsDueAt && until.getTime() <= round.resultsDueAt.getTime()) {
      throw ruleBroken(
        'extension_before_due',
        `until: the extension must end after the results-due date (${round.resultsDueAt.toISOString()}).`,
      );
    }
    if (until.getTime() <= Date.now())
      throw ruleBroken('extension_in_past', 'until: the extension must end in the future.');
    await em.update(Enrolment, { id: e.id }, { extensionUntil: until });
    await audit(em, actor.id, 'enrolment.extension-granted', 'enrolment', e.id, {
      roundId,
      until: until.toISOString(),
      reason: input.reason,
    });
    return enrolmentDto(em, roundId, e.id);
  });
}

export type { InvitationCreate };
