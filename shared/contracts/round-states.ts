import * as z from 'zod';

/** The round lifecycle (docs/ARCHITECTURE.md, "Where each rule lives"): draft → enrolling → in transit → collecting → closed → evaluated → published (→ reissued). */
export const ROUND_STATES = [
  'draft',
  'enrolling',
  'in-transit',
  'collecting',
  'closed',
  'evaluated',
  'published',
  'reissued',
] as const;
export const RoundState = z.enum(ROUND_STATES);
export type RoundState = z.infer<typeof RoundState>;

export const ROUND_STATE_LABELS: Record<RoundState, string> = {
  draft: 'Draft',
  enrolling: 'Enrolling',
  'in-transit': 'In transit',
  collecting: 'Collecting',
  closed: 'Closed',
  evaluated: 'Evaluated',
  published: 'Published',
  reissued: 'Reissued',
};

/**
 * The allowed moves, one source of truth for the server (which enforces them with further rules)
 * and the browser (which offers only these buttons). `evaluated → closed` reopens evaluation
 * before publication; `published → reissued` happens only inside a reissue from the evaluation
 * page (which stores a new evaluation version), and `reissued → published` only by publishing it.
 */
export const ROUND_TRANSITIONS: Readonly<Record<RoundState, readonly RoundState[]>> = {
  draft: ['enrolling'],
  enrolling: ['in-transit', 'draft'],
  'in-transit': ['collecting'],
  collecting: ['closed'],
  closed: ['evaluated', 'collecting'],
  evaluated: ['published', 'closed'],
  published: ['reissued'],
  reissued: ['published'],
};

export function canMove(from: RoundState, to: RoundState): boolean {
  return ROUND_TRANSITIONS[from].includes(to);
}

/**
 * Moves driven by the evaluation page, never offered on the Round desk: evaluating, publishing and
 * reissuing (a reissue must store a new evaluation version, so a bare state change would leave the
 * round with nothing to publish).
 */
export const EVALUATION_TARGETS: readonly RoundState[] = ['evaluated', 'published', 'reissued'];

/** True for a move the coordinator may make on the Round desk. */
export function isDeskMove(from: RoundState, to: RoundState): boolean {
  return canMove(from, to) && !EVALUATION_TARGETS.includes(to);
}

/** How a Round desk move is named and explained (docs/GLOSSARY.md, "Round states"). */
export interface MoveDescription {
  /** The button text. */
  label: string;
  /** A move back: it needs a reason. */
  backwards: boolean;
  /** Who hears of the move, in a sentence. */
  whoIsTold: string;
}

const BACKWARD_MOVES: Partial<
  Record<`${RoundState}>${RoundState}`, Omit<MoveDescription, 'backwards'>>
> = {
  'enrolling>draft': {
    label: 'Back to draft',
    whoIsTold:
      'No lab has enrolled, so nobody is told; invitations already sent stay valid until they expire.',
  },
  'closed>collecting': {
    label: 'Reopen for results',
    whoIsTold:
      'Every enrolled lab is e-mailed that the round accepts results again, with your reason.',
  },
  'evaluated>closed': {
    label: 'Reopen evaluation',
    whoIsTold:
      'Nothing was published, so no lab is told; the approved evaluation is set aside and the reason is kept in the round history.',
  },
};

const FORWARD_LABELS: Partial<Record<RoundState, string>> = {
  enrolling: 'Open enrolment',
  'in-transit': 'Start dispatch (In transit)',
  collecting: 'Start collecting results',
  closed: 'Close for results',
};

export function describeMove(from: RoundState, to: RoundState): MoveDescription {
  const back = BACKWARD_MOVES[`${from}>${to}`];
  if (back) return { ...back, backwards: true };
  return {
    label: FORWARD_LABELS[to] ?? `Move to ${ROUND_STATE_LABELS[to]}`,
    backwards: false,
    whoIsTold:
      to === 'collecting'
        ? 'Labs see the round open for results on their Lab bench.'
        : 'The move is recorded in the round history.',
  };
}

/** States in which labs may still change results (before the lock). */
export function acceptsResults(state: RoundState): boolean {
  return state === 'in-transit' || state === 'collecting';
}
