import type { ColDef } from 'ag-grid-community';
import type { Invitation, InvitationsCreate } from '@ringlet/shared/contracts/rounds';
import { formatDate } from '../rounds-grid';

/** One invitation row as typed on screen. */
export interface InviteRow {
  organisationId: string;
  labName: string;
  email: string;
}

/** The rows on screen as the contract's invitations: a known lab by id, a new one by its name. */
export function invitationsFromRows(rows: readonly InviteRow[]): InvitationsCreate {
  return {
    invitations: rows.map((row) => ({
      organisationId: row.organisationId || null,
      email: row.email,
      labName: row.organisationId ? null : row.labName.trim() || null,
    })),
  };
}

/** The lab column: the known lab's name, or the new lab's name marked "(new)". */
export function invitedLab(i: Pick<Invitation, 'organisationName' | 'labName'>): string {
  return i.organisationName ?? (i.labName ? `${i.labName} (new)` : '');
}

const dateTime = (title: string, field: 'createdAt' | 'expiresAt' | 'acceptedAt') =>
  ({
    field,
    headerName: title,
    width: 170,
    valueFormatter: ({ value }) => formatDate(value as string | null, true),
  }) satisfies ColDef<Invitation>;

export const INVITATION_COLUMNS: ColDef<Invitation>[] = [
  { field: 'email', headerName: 'E-mail', flex: 1, minWidth: 200 },
  {
    colId: 'lab',
    headerName: 'Lab',
    flex: 1,
    valueGetter: ({ data }) => (data ? invitedLab(data) : ''),
  },
  dateTime('Sent', 'createdAt'),
  dateTime('Expires', 'expiresAt'),
  dateTime('Accepted', 'acceptedAt'),
];
