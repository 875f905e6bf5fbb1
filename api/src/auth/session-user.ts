import type { Me, MembershipSummary, Role } from '../../../shared/contracts/auth';

/** The user attached to a request: loaded from the database on every request by its id. */
export interface SessionUser {
  id: string;
  email: string;
  name: string;
  roles: Role[];
  memberships: MembershipSummary[];
  /**
   * The lab this request acts for: the lab chosen in the session (PUT /auth/acting-lab), else the
   * only lab of a user in one lab; null for a user in several labs who has not chosen.
   */
  actingLabId: string | null;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

export function toMe(u: SessionUser): Me {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    roles: u.roles,
    memberships: u.memberships,
    actingLabId: u.actingLabId,
  };
}

/**
 * Lab ids the request acts for: the chosen (or only) lab; all of the user's labs only when a
 * person in several labs has not chosen yet.
 */
export function labIds(u: SessionUser): string[] {
  if (u.actingLabId) return [u.actingLabId];
  return u.memberships.map((m) => m.organisationId);
}

/** The same user acting for `labId` when it is one of their labs (a copy: cached users are shared). */
export function actingFor(u: SessionUser, labId: string | undefined): SessionUser {
  if (!labId || labId === u.actingLabId || !u.memberships.some((m) => m.organisationId === labId))
    return u;
  return { ...u, actingLabId: labId };
}

/** True when the user holds any of the roles ('lab' = member of at least one lab). */
export function hasAnyRole(user: SessionUser, roles: readonly Role[]): boolean {
  return roles.some((r) => user.roles.includes(r));
}

export function managesLab(u: SessionUser, organisationId: string): boolean {
  return u.memberships.some((m) => m.organisationId === organisationId && m.isManager);
}
