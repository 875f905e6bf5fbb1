import {
  describeMove,
  isDeskMove,
  ROUND_STATE_LABELS,
  ROUND_TRANSITIONS,
  type RoundState,
} from '@ringlet/shared/contracts/round-states';
import type { RoundDetail } from '@ringlet/shared/contracts/rounds';

/** The moves the Round desk offers from a state (the others happen elsewhere or by the system). */
export function deskMoves(state: RoundState): RoundState[] {
  return ROUND_TRANSITIONS[state].filter((s) => isDeskMove(state, s));
}

/** Closing before results are due is closing early: it needs the tick and a reason. */
export function closesEarly(
  round: Pick<RoundDetail, 'resultsDueAt'>,
  to: RoundState,
  now: number,
): boolean {
  return to === 'closed' && (!round.resultsDueAt || new Date(round.resultsDueAt).getTime() > now);
}

/** From Closed on, evaluation, publication and corrections run from the evaluation page. */
export function evaluatedElsewhere(state: RoundState): boolean {
  return (
    state === 'closed' || state === 'evaluated' || state === 'published' || state === 'reissued'
  );
}

/** What the transition dialog says and asks for one move of a round. */
export function transitionAsk(
  round: Pick<RoundDetail, 'code' | 'state' | 'resultsDueAt'>,
  to: RoundState,
  now: number,
) {
  const early = closesEarly(round, to, now);
  const move = describeMove(round.state, to);
  return {
    kind: 'transition' as const,
    title: move.backwards
      ? `${move.label}: ${round.code}`
      : `Move ${round.code} to ${ROUND_STATE_LABELS[to]}`,
    moveLabel: move.label,
    whoIsTold: move.whoIsTold,
    intro: early ? 'Results are not due yet: tick "Close early" and give a reason.' : undefined,
    to,
    offerForce: early,
    reasonRequired: early || move.backwards,
  };
}
