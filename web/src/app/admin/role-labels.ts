import type { GlobalRole } from '@ringlet/shared/contracts/auth';

/** Roles an admin can grant directly (lab access comes from a membership). */
export const GLOBAL_ROLE_LABELS: Readonly<Record<GlobalRole, string>> = {
  admin: 'Administrator',
  coordinator: 'Coordinator',
  assessor: 'Assessor',
};
export const GLOBAL_ROLES = Object.keys(GLOBAL_ROLE_LABELS) as GlobalRole[];
