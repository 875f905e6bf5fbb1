import type { Me, MembershipSummary, Role } from '../../../shared/contracts/auth';

/** The user attached to a request: loaded from the database on every request by its id. */
export interface SessionUser {
  id: string;
  email: string;
  name: string;
  roles: Role[];
  memberships: MembershipSummary[];
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

export function toMe(u: SessionUser): Me {
  return { id: u.id, email: u.email, name: u.name, roles: u.roles, memberships: u.memberships };
}

/** Lab ids the user belongs to. */
export function labIds(u: SessionUser): string[] {
  return u.memberships.map((m) => m.organisationId);
}

export function managesLab(u: SessionUser, organisationId: string): boolean {
  return u.memberships.some((m) => m.organisationId === organisationId && m.isManager);
}
