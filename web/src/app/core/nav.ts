import type { Me } from '@ringlet/shared/contracts/auth';

export interface NavEntry {
  readonly label: string;
  readonly path: string;
  /** Material Symbols ligature. */
  readonly icon: string;
}

/**
 * The navigation entries a user sees, from their roles and lab memberships. The Outbox shows only
 * when the server captures mail (demo and development mode).
 */
export function navEntries(me: Me | null, hasOutbox: boolean): NavEntry[] {
  if (!me) return [];
  const roles = new Set(me.roles);
  const entries: NavEntry[] = [];
  if (roles.has('coordinator'))
    entries.push({ label: 'Round desk', path: '/desk', icon: 'event_note' });
  if (roles.has('lab')) {
    entries.push({ label: 'Lab bench', path: '/bench', icon: 'science' });
    entries.push({ label: 'Track record', path: '/bench/track-record', icon: 'timeline' });
  }
  if (me.memberships.some((membership) => membership.isManager)) {
    entries.push({ label: 'My lab', path: '/bench/lab-members', icon: 'groups' });
  }
  if (roles.has('assessor'))
    entries.push({ label: 'Assessor', path: '/assessor', icon: 'fact_check' });
  if (roles.has('coordinator') || roles.has('lab') || roles.has('assessor')) {
    entries.push({ label: 'Consensus board', path: '/board', icon: 'leaderboard' });
  }
  if (roles.has('admin')) {
    entries.push({ label: 'Users', path: '/admin/users', icon: 'manage_accounts' });
    entries.push({ label: 'Organisations', path: '/admin/labs', icon: 'domain' });
  }
  if (roles.has('coordinator') || roles.has('admin'))
    entries.push({ label: 'PT provider', path: '/provider', icon: 'badge' });
  if (hasOutbox) entries.push({ label: 'Outbox', path: '/outbox', icon: 'outgoing_mail' });
  return entries;
}
