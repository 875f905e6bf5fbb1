import type { AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';

export type GrantState = 'active' | 'upcoming' | 'ended' | 'revoked';

export const GRANT_STATE_WORDS: Readonly<Record<GrantState, string>> = {
  active: 'Active',
  upcoming: 'Starts later',
  ended: 'Ended',
  revoked: 'Revoked',
};

/** The server decides "today" in UTC; the form's default start date follows it. */
export const utcToday = (): string => new Date().toISOString().slice(0, 10);

/** A grant's state on `today` (YYYY-MM-DD): revoked wins, then the server's active flag, then the dates. */
export function grantState(g: AssessorGrantDto, today = utcToday()): GrantState {
  if (g.revokedAt) return 'revoked';
  if (g.isActive) return 'active';
  if (g.endsOn !== null && g.endsOn < today) return 'ended';
  return 'upcoming';
}

/** Whether a grant can still be revoked (it gives access now or will). */
export function isRevocable(g: AssessorGrantDto, today = utcToday()): boolean {
  const state = grantState(g, today);
  return state === 'active' || state === 'upcoming';
}
