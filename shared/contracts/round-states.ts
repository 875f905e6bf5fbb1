import * as z from 'zod';

/** The round lifecycle (docs/ARCHITECTURE.md, "Where each rule lives"): draft → enrolling → in transit → collecting → closed → evaluated → published (→ reissued). */
export const ROUND_STATES = ['draft', 'enrolling', 'in-transit', 'collecting', 'closed', 'evaluated', 'published', 'reissued'] as const;
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
 * before publication; `published → reissued` is the only way to correct a published round.
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

/** States in which labs may still change results (before the lock). */
export function acceptsResults(state: RoundState): boolean {
  return state === 'in-transit' || state === 'collecting';
}
