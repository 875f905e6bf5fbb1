import { IsNull, Not, type EntityManager } from 'typeorm';
import { sniffImageType } from '../../../shared/files/file-type';
import { Enrolment, Measurand, Round, Shipment, Submission, TestItem } from '../../../db/entities';
import type {
  MyRound,
  MyRoundDetail,
  MyRoundStatus,
  ReceiptInput,
} from '../../../shared/contracts/bench';
import { SAFETY_CAUTIONS } from '../../../shared/contracts/bench';
import { withoutSafetyBlock } from '../../../shared/contracts/safety';
import { acceptsResults } from '../../../shared/contracts/round-states';
import type { SessionUser } from '../auth/session-user';
import { badRequest, conflict, ServiceError, notFound, ruleBroken } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';

/** A round is "due soon" within this many days of its lock. */
export const DUE_SOON_DAYS = 7;

/**
 * The lab a request acts for: the one given (query `labId` or header `x-lab-id`), which must be
 * one of the user's labs (else 404, as for any other lab's object), else the lab chosen in the
 * session (PUT /auth/acting-lab), else the user's only lab.
 */
export function resolveLab(user: SessionUser, requested: string | undefined): string {
  requested ??= user.actingLabId ?? undefined; // the lab chosen in the session
  const mine = user.memberships.map((m) => m.organisationId);
  if (requested) {
    if (!mine.includes(requested)) throw notFound('The lab');
    return requested;
  }
  if (mine.length === 1) return mine[0]!;
  if (mine.length === 0) throw notFound('The lab');
  throw badRequest(
    'labId: you belong to several labs; choose one (query labId or header x-lab-id).',
    [{ path: 'labId', message: 'Choose the lab you act for.' }],
  );
}

/** When results lock for one enrolment: the later of the due date and a granted extension. */
export function locksAt(
  round: Pick<Round, 'resultsDueAt'>,
  enrolment: Pick<Enrolment, 'extensionUntil'>,
): Date | null {
  const due = round.resultsDueAt;
  const ext = enrolment.extensionUntil;
  if (!due) return ext ?? null;
  if (ext && ext > due) return ext;
  return due;
}

export interface LockState {
  isOpen: boolean;
  isLate: boolean;
  locksAt: Date | null;
  /** Why results cannot change (when closed). */
  reason: string | null;
}

/** Whether this lab may still change results for the round (the server's lock; one source of truth). */
export function lockState(round: Round, enrolment: Enrolment, now = new Date()): LockState {
  const at = locksAt(round, enrolment);
  const isLate = round.resultsDueAt !== null && now > round.resultsDueAt;
  if (enrolment.state !== 'enrolled')
    return { isOpen: false, isLate, locksAt: at, reason: 'Your lab withdrew from this round.' };
  if (!acceptsResults(round.state))
    return {
      isOpen: false,
      isLate,
      locksAt: at,
      reason: `The round is ${round.state}: results are locked.`,
    };
  if (at && now > at)
    return { isOpen: false, isLate, locksAt: at, reason: `Results locked at ${at.toISOString()}.` };
  return { isOpen: true, isLate, locksAt: at, reason: null };
}

/** The lab's enrolment in a round (rounds in draft are not shown to labs); 404 otherwise. */
export async function findEnrolment(
  em: EntityManager,
  labId: string,
  roundId: string,
): Promise<{ round: Round; enrolment: Enrolment }> {
  const enrolment = await em.findOne(Enrolment, { where: { roundId, organisationId: labId } });
  const round = enrolment ? await em.findOne(Round, { where: { id: roundId } }) : null;
  if (!enrolment || !round || round.state === 'draft') throw notFound('The round');
  return { round, enrolment };
}

/**
 * The enrolment whose objects a viewer may read: a coordinator reads any enrolment of the round
 * (`enrolmentId` picks it), a lab only its own.
 */
export function isCoordinator(user: SessionUser): boolean {
  return user.roles.includes('coordinator') || user.roles.includes('admin');
}

const iso = (d: Date | null) => (d ? d.toISOString() : null);

function statusOf(
  round: Round,
  enrolment: Enrolment | null,
  submittedVersion: number,
  now: Date,
): MyRoundStatus {
  if (!enrolment) return 'invited';
  if (enrolment.state === 'withdrawn') return 'withdrawn';
  if (round.state === 'published' || round.state === 'reissued') return 'published';
  if (submittedVersion > 0) return 'submitted';
  const lock = lockState(round, enrolment, now);
  if (!lock.isOpen)
    return acceptsResults(round.state) || ['closed', 'evaluated'].includes(round.state)
      ? 'locked'
      : 'enrolled';
  if (lock.locksAt && lock.locksAt.getTime() - now.getTime() <= DUE_SOON_DAYS * 86400_000)
    return 'due-soon';
  return 'enrolled';
}

function myRound(
  round: Round,
  enrolment: Enrolment | null,
  submission: Submission | null,
  now: Date,
): MyRound {
  const version = submission?.currentVersion ?? 0;
  return {
    roundId: round.id,
    code: round.code,
    title: round.title,
    kind: round.kind,
    state: round.state,
    status: statusOf(round, enrolment, version, now),
    participantCode: enrolment?.participantCode ?? null,
    resultsDueAt: iso(round.resultsDueAt),
    extensionUntil: iso(enrolment?.extensionUntil ?? null),
    locksAt: enrolment ? iso(locksAt(round, enrolment)) : iso(round.resultsDueAt),
    submittedVersion: version,
    submittedAt: iso(submission?.submittedAt ?? null),
  };
}

/** A round as /my/rounds reads it: with the lab's enrolment and submission when there is one. */
type RoundOfLab = Round & { enrolment: Enrolment | null; submission: Submission | null };

/**
 * GET /my/rounds: the lab's rounds (enrolled ones and open invitations), soonest lock first.
 * One query whatever the number of rounds: rounds joined with the lab's enrolment and submission,
 * kept when the lab is enrolled or holds an open invitation.
 */
export async function listMyRounds(ctx: AppContext, labId: string): Promise<MyRound[]> {
  const now = new Date();
  const rows = (await ctx.ds
    .getRepository(Round)
    .createQueryBuilder('r')
    .leftJoinAndMapOne(
      'r.enrolment',
      Enrolment,
      'e',
      'e.roundId = r.id AND e.organisationId = :labId',
      { labId },
    )
    .leftJoinAndMapOne('r.submission', Submission, 's', 's.enrolmentId = e.id')
    .where('r.state <> :draft', { draft: 'draft' })
    .andWhere(
      `(e.id IS NOT NULL OR EXISTS (
          SELECT 1 FROM invitation i
           WHERE i.round_id = r.id AND i.organisation_id = :labId
             AND i.accepted_at IS NULL AND i.expires_at > now()))`,
      { labId },
    )
    .getMany()) as RoundOfLab[];
  const out = rows.map((r) => myRound(r, r.enrolment ?? null, r.submission ?? null, now));
  const key = (r: MyRound) => (r.locksAt ? Date.parse(r.locksAt) : Number.MAX_SAFE_INTEGER);
  return out.sort((a, b) => key(a) - key(b) || a.code.localeCompare(b.code));
}

/** GET /my/rounds/{id}: what the lab needs to measure and report. */
export async function getMyRound(
  ctx: AppContext,
  labId: string,
  roundId: string,
): Promise<MyRoundDetail> {
  const em = ctx.ds.manager;
  const { round, enrolment } = await findEnrolment(em, labId, roundId);
  const now = new Date();
  const [items, measurands, shipment, sub] = await Promise.all([
    em.find(TestItem, { where: { roundId }, order: { position: 'ASC', code: 'ASC' } }),
    em.find(Measurand, { where: { roundId }, order: { position: 'ASC', key: 'ASC' } }),
    em.findOne(Shipment, { where: { enrolmentId: enrolment.id } }),
    em.findOne(Submission, { where: { enrolmentId: enrolment.id } }),
  ]);
  const hasPhoto = shipment
    ? await em.exists(Shipment, { where: { id: shipment.id, receiptPhoto: Not(IsNull()) } })
    : false;
  const lock = lockState(round, enrolment, now);
  return {
    ...myRound(round, enrolment, sub, now),
    instructions: withoutSafetyBlock(round.instructions),
    safetyCautions: [...SAFETY_CAUTIONS],
    protocolTemperatureC: round.protocolTemperatureC,
    acceptsResults: acceptsResults(round.state),
    isLocked: !lock.isOpen,
    items: items.map((i) => ({
      id: i.id,
      code: i.code,
      material: i.material,
      nominalSizeNm: i.nominalSizeNm,
      storageNotes: i.storageNotes,
      handlingNotes: i.handlingNotes,
    })),
    measurands: measurands.map((m) => ({
      id: m.id,
      key: m.key,
      name: m.name,
      unit: m.unit,
      decimals: m.decimals,
      replicatesRequired: m.replicatesRequired,
    })),
    receipt: shipment
      ? {
          dispatchedOn: shipment.dispatchedOn,
          receivedOn: shipment.receivedOn,
          condition: shipment.condition,
          notes: shipment.receiptNotes,
          hasPhoto,
        }
      : null,
    submission: {
      state: sub ? sub.state : 'none',
      currentVersion: sub?.currentVersion ?? 0,
      submittedAt: iso(sub?.submittedAt ?? null),
      draftRevision: sub?.draftRevision ?? 0,
    },
  };
}

/** An image file type from its first bytes (JPEG, PNG, WebP), or null (shared/files/file-type.ts). */
export function detectImageType(buf: Buffer): string | null {
  return sniffImageType(buf, ['jpeg', 'png', 'webp']);
}

export const MAX_PHOTO_BYTES = 8 * 1024 * 1024;

/** PUT /rounds/{id}/receipt: date and condition of the items on arrival, with an optional photo. */
export async function saveReceipt(
  ctx: AppContext,
  actor: SessionUser,
  labId: string,
  roundId: string,
  input: ReceiptInput,
  photo: Buffer | null,
): Promise<MyRoundDetail> {
  const today = new Date().toISOString().slice(0, 10);
  if (input.receivedOn > today)
    throw ruleBroken('receipt_in_future', 'receivedOn: the items cannot arrive after today.', [
      { path: 'receivedOn', message: 'Not after today.' },
    ]);
  const photoType = photo ? detectImageType(photo) : null;
  if (photo && !photoType) {
    throw new ServiceError(415, 'file_type_refused', 'photo: send a JPEG, PNG or WebP image.', [
      { path: 'photo', message: 'JPEG, PNG or WebP only.' },
    ]);
  }
  await ctx.ds.transaction(async (em) => {
    const { round, enrolment } = await findEnrolment(em, labId, roundId);
    if (!['in-transit', 'collecting'].includes(round.state) || enrolment.state !== 'enrolled') {
      throw conflict(
        'receipt_not_open',
        `The round is ${round.state}: receipt can be recorded while items are in transit or results are collected.`,
      );
    }
    await em
      .createQueryBuilder()
      .insert()
      .into(Shipment)
      .values({ enrolmentId: enrolment.id })
      .orIgnore()
      .execute();
    await em.update(
      Shipment,
      { enrolmentId: enrolment.id },
      {
        receivedOn: input.receivedOn,
        condition: input.condition,
        receiptNotes: input.notes,
        receivedBy: actor.id,
        ...(photo ? { receiptPhoto: photo, receiptPhotoType: photoType } : {}),
      },
    );
    await audit(em, actor.id, 'shipment.received', 'enrolment', enrolment.id, {
      roundId,
      receivedOn: input.receivedOn,
      condition: input.condition,
      photoBytes: photo?.length ?? 0,
    });
  });
  return getMyRound(ctx, labId, roundId);
}

/** The receipt photo of the lab's own shipment, or (coordinator) of any enrolment of the round. */
export async function receiptPhoto(
  ctx: AppContext,
  enrolmentId: string,
): Promise<{ data: Buffer; type: string }> {
  const row = await ctx.ds
    .getRepository(Shipment)
    .createQueryBuilder('s')
    .addSelect('s.receiptPhoto')
    .where('s.enrolmentId = :enrolmentId', { enrolmentId })
    .getOne();
  if (!row?.receiptPhoto) throw notFound('The photo');
  return { data: row.receiptPhoto, type: row.receiptPhotoType ?? 'application/octet-stream' };
}
