import type { Me } from '@ringlet/shared/contracts/auth';
import type { InvoiceStatus } from '@ringlet/shared/contracts/billing';

/** The icon beside each invoice status (the status word stands beside it). */
export const STATUS_ICON: Record<InvoiceStatus, string> = {
  issued: 'schedule',
  paid: 'check_circle',
  credited: 'undo',
};

/** What the invoice's PDF is to the lab: a receipt once paid, otherwise the invoice. */
export function pdfLabel(status: InvoiceStatus): string {
  return status === 'paid' ? 'Receipt (PDF)' : 'Invoice (PDF)';
}

/**
 * Whether the signed-in person manages the lab the session acts for (the chosen lab, or else
 * their first lab): only a manager edits the lab's billing details.
 */
export function managesActingLab(me: Pick<Me, 'actingLabId' | 'memberships'> | null): boolean {
  if (!me) return false;
  const acting = me.actingLabId ?? me.memberships[0]?.organisationId;
  return me.memberships.some((m) => m.organisationId === acting && m.isManager);
}
