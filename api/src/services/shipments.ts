import { type Round, Shipment } from '../../../db/entities';
import type { DispatchInput, Enrolment as EnrolmentDto } from '../../../shared/contracts/rounds';
import {
  cautionLines,
  DAMAGED_PARCEL_CAUTIONS,
  SAFETY_CAUTIONS,
} from '../../../shared/contracts/safety';
import type { SessionUser } from '../auth/session-user';
import { conflict } from './errors';
import { audit } from './audit';
import { assertFeeAllowsDispatch } from './billing';
import type { AppContext } from './context';
import { enrolmentDto, lockEnrolment, sendSafely } from './enrolment';
import { labRecipients } from './lab-recipients';
import { lockRound } from './round-lifecycle';

/** Round states in which items may be dispatched. */
const DISPATCH_STATES = ['enrolling', 'in-transit', 'collecting'] as const;

/**
 * Records the dispatch of the test items to one enrolment (courier, tracking number, date) and
 * e-mails the lab. Re-recording corrects the details until the lab confirms receipt; the receipt
 * itself is recorded by the lab on the Lab bench (same shipment row).
 */
export async function recordDispatch(
  ctx: AppContext,
  actor: SessionUser,
  roundId: string,
  enrolmentId: string,
  input: DispatchInput,
): Promise<EnrolmentDto> {
  const { dto, round, recipients } = await ctx.ds.transaction(async (em) => {
    const round: Round = await lockRound(em, roundId);
    if (!(DISPATCH_STATES as readonly string[]).includes(round.state)) {
      throw conflict(
        'round_not_shipping',
        'Items are dispatched while the round is enrolling, in transit or collecting.',
      );
    }
    const e = await lockEnrolment(em, roundId, enrolmentId);
    if (e.state !== 'enrolled')
      throw conflict(
        'enrolment_withdrawn',
        'This enrolment is withdrawn; nothing is shipped to it.',
      );
    const existing = await em.findOne(Shipment, { where: { enrolmentId } });
    if (!existing?.dispatchedOn) await assertFeeAllowsDispatch(em, roundId, enrolmentId);
    if (existing?.receivedOn)
      throw conflict('already_received', 'The lab has already confirmed receipt of this shipment.');
    if (existing) {
      await em.update(Shipment, { id: existing.id }, { ...input });
    } else {
      await em.insert(Shipment, { enrolmentId, ...input });
    }
    await audit(
      em,
      actor.id,
      existing ? 'shipment.dispatch-corrected' : 'shipment.dispatched',
      'enrolment',
      enrolmentId,
      { roundId, ...input },
    );
    return {
      dto: await enrolmentDto(em, roundId, enrolmentId),
      round,
      recipients: await labRecipients(em, e.organisationId),
    };
  });
  if (recipients.length) {
    await sendSafely(ctx, {
      to: recipients,
      subject: `Test items for round ${round.code} are on their way`,
      text:
        `Hello,\n\nThe test items for proficiency-testing round ${round.code} (${round.title}) were dispatched on ` +
        `${input.dispatchedOn} with ${input.courier}, tracking number ${input.trackingNumber}.\n\n` +
        `When they arrive, confirm receipt and their condition on your Lab bench: ${ctx.config.publicUrl}/bench\n\n` +
        `Safety:\n${cautionLines(SAFETY_CAUTIONS)}\n\n` +
        `If the parcel arrives leaking or damaged:\n${cautionLines(DAMAGED_PARCEL_CAUTIONS)}\n\nRinglet`,
    });
  }
  return dto;
}
