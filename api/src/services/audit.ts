import type { EntityManager } from 'typeorm';
import { AuditEvent } from '../../../db/entities';

/** Appends one event to the audit trail (inside the caller's transaction). */
export async function audit(
  em: EntityManager,
  actorId: string | null,
  action: string,
  subjectType: string,
  subjectId: string | null,
  details: Record<string, unknown> = {},
): Promise<void> {
  await em.insert(AuditEvent, {
    actorId,
    action,
    subjectType,
    subjectId,
    details: details as never,
  });
}
