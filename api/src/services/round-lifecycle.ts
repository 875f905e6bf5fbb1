import type { EntityManager } from 'typeorm';
import {
  Enrolment,
  HomogeneityStudy,
  Measurand,
  Round,
  RoundTransition,
  TestItem,
} from '../../../db/entities';
import {
  canMove,
  isDeskMove,
  ROUND_STATE_LABELS,
  type RoundState,
} from '../../../shared/contracts/round-states';
import { conflict, notFound, ruleBroken } from './errors';
import { audit } from './audit';

/** Who moves a round: a user id, or null for the system (e.g. a scheduled job). */
export interface TransitionActor {
  id: string | null;
}

export interface TransitionOptions {
  reason?: string | null;
  /** Overrides a date rule (closing before results are due); needs a reason. */
  force?: boolean;
}

/**
 * Extra checks before a round may be published, run by `assertPublishable` inside the
 * publishing transaction. Other features append theirs (e.g. the evaluation engine checks that an
 * evaluation is recorded). A guard throws a ServiceError (409/422) to block.
 */
export type PublicationGuard = (em: EntityManager, round: Round) => Promise<void>;
export const publicationGuards: PublicationGuard[] = [];

/**
 * Transitions the coordinator may request on the Round desk. `closed → evaluated`,
 * `evaluated → published`, `published → reissued` and `reissued → published` are driven by the
 * evaluation page, which calls `transitionRound` itself (a reissue stores a new evaluation version).
 */
export function isCoordinatorTransition(from: RoundState, to: RoundState): boolean {
  return isDeskMove(from, to);
}

/** Moves back (reopening) and reissues need a reason in the record. */
function needsReason(from: RoundState, to: RoundState): boolean {
  return (
    (from === 'closed' && to === 'collecting') ||
    (from === 'evaluated' && to === 'closed') ||
    (from === 'published' && to === 'reissued') ||
    (from === 'enrolling' && to === 'draft')
  );
}

/** The round, locked for the rest of the transaction (concurrent transitions queue up). */
export async function lockRound(em: EntityManager, roundId: string): Promise<Round> {
  const round = await em.findOne(Round, {
    where: { id: roundId },
    lock: { mode: 'pessimistic_write' },
  });
  if (!round) throw notFound('The round');
  return round;
}

/** True while a failing homogeneity or stability check of the round has no recorded decision. */
export async function hasOpenHomogeneityFailure(
  em: EntityManager,
  roundId: string,
): Promise<boolean> {
  const n = await em
    .createQueryBuilder(HomogeneityStudy, 'h')
    .where('h.round_id = :roundId AND h.passes = false AND h.decision IS NULL', { roundId })
    .getCount();
  return n > 0;
}

/**
 * Throws unless the round may be published: a failing homogeneity/stability check must have a
 * decision on record, and every registered publication guard must agree.
 */
export async function assertPublishable(em: EntityManager, roundId: string): Promise<void> {
  const round = await em.findOne(Round, { where: { id: roundId } });
  if (!round) throw notFound('The round');
  if (await hasOpenHomogeneityFailure(em, roundId)) {
    throw ruleBroken(
      'homogeneity_decision_missing',
      'A homogeneity or stability study failed and has no recorded decision; record one on the Round desk before publishing.',
    );
  }
  for (const guard of publicationGuards) await guard(em, round);
}

/**
 * Moves a round to another state inside the caller's transaction, enforcing the lifecycle
 * (shared/contracts/round-states ROUND_TRANSITIONS) and its rules; records the move in
 * round_transition and the audit trail. Errors: 409 `transition_not_allowed` for a move the
 * lifecycle does not have, 422 with the rule's code for a rule the round breaks.
 */
export async function transitionRound(
  em: EntityManager,
  roundId: string,
  to: RoundState,
  actor: TransitionActor,
  options: TransitionOptions = {},
): Promise<Round> {
  const round = await lockRound(em, roundId);
  const from = round.state;
  const reason = options.reason?.trim() || null;
  const force = options.force ?? false;
  if (!canMove(from, to)) {
    throw conflict(
      'transition_not_allowed',
      `A round cannot move from ${ROUND_STATE_LABELS[from]} to ${ROUND_STATE_LABELS[to]}.`,
    );
  }
  if (force && !reason) throw ruleBroken('reason_required', 'Give a reason for closing early.');
  if (needsReason(from, to) && !reason) {
    throw ruleBroken(
      'reason_required',
      `Give a reason for moving from ${ROUND_STATE_LABELS[from]} back to ${ROUND_STATE_LABELS[to]}.`,
    );
  }

  if (from === 'draft' && to === 'enrolling') {
    const items = await em.count(TestItem, { where: { roundId } });
    const measurands = await em.count(Measurand, { where: { roundId } });
    if (items === 0 || measurands === 0) {
      throw ruleBroken(
        'round_incomplete',
        'Enrolment needs at least one test item and one measurand.',
        { items, measurands },
      );
    }
  }
  if (from === 'enrolling' && to === 'draft') {
    const n = await em.count(Enrolment, { where: { roundId } });
    if (n > 0)
      throw conflict(
        'round_has_enrolments',
        'Labs have enrolled; the round cannot go back to draft.',
      );
  }
  if (from === 'enrolling' && to === 'in-transit') {
    const n = await em.count(Enrolment, { where: { roundId, state: 'enrolled' } });
    if (n === 0)
      throw ruleBroken('no_participants', 'No lab is enrolled; there is nothing to ship.');
  }
  if (from === 'collecting' && to === 'closed') {
    const due = round.resultsDueAt;
    if ((!due || due.getTime() > Date.now()) && !force) {
      throw ruleBroken(
        'results_not_due',
        due
          ? `Results are due ${due.toISOString().slice(0, 16).replace('T', ' ')} UTC; closing earlier needs "Close early" and a reason.`
          : 'The round has no results-due date; closing needs "Close early" and a reason.',
        { resultsDueAt: due?.toISOString() ?? null },
      );
    }
  }
  if (to === 'published') await assertPublishable(em, roundId);

  await em.update(Round, { id: roundId }, { state: to });
  await em.insert(RoundTransition, {
    roundId,
    fromState: from,
    toState: to,
    actorId: actor.id,
    reason,
    forced: force,
  });
  await audit(em, actor.id, 'round.transition', 'round', roundId, {
    from,
    to,
    reason,
    forced: force,
  });
  return { ...round, state: to };
}
