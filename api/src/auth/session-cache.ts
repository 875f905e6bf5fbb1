/**
 * The signed-in user is read on every request; reads within a second reuse it. Any
 * state-changing request on this instance forgets them all (ApiRouter calls forgetSessionUsers),
 * so a change of roles or memberships shows at once here and within a second on other instances.
 * Signing a user out everywhere deletes their sessions, which no cache outlives.
 */
export const SESSION_USER_TTL_MS = 1000;
export const sessionUsers = new Map<string, { user: Express.User; until: number }>();

export function forgetSessionUsers(): void {
  sessionUsers.clear();
}

/** Forgets one user's cached copy (their sessions ended, password or memberships changed). */
export function forgetSessionUser(userId: string): void {
  sessionUsers.delete(userId);
}
