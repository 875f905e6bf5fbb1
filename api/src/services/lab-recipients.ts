import { In, type EntityManager } from 'typeorm';
import { Membership, Organisation } from '../../../db/entities';

/** Where a lab's mail goes: its name and its addresses. */
export interface LabMailbox {
  labName: string;
  to: string[];
}

/**
 * The one rule for who receives a lab's mail: its active members and its contact address,
 * lower-case, each once, sorted. Two queries for any number of labs; a lab id that does not
 * exist gets an empty mailbox.
 */
export async function labMailboxes(
  em: EntityManager,
  organisationIds: readonly string[],
): Promise<Map<string, LabMailbox>> {
  const ids = [...new Set(organisationIds)];
  const out = new Map<string, LabMailbox>();
  if (ids.length === 0) return out;
  const orgs = await em.find(Organisation, { where: { id: In(ids) } });
  const members = await em
    .createQueryBuilder(Membership, 'm')
    .innerJoinAndSelect('m.user', 'u')
    .where('m.organisationId IN (:...ids) AND u.isActive = true', { ids })
    .getMany();
  const orgById = new Map(orgs.map((o) => [o.id, o]));
  for (const id of ids) {
    const org = orgById.get(id);
    const all = [
      ...members.filter((m) => m.organisationId === id).map((m) => m.user?.email ?? ''),
      ...(org?.contactEmail ? [org.contactEmail] : []),
    ];
    out.set(id, {
      labName: org?.name ?? '',
      to: [...new Set(all.filter(Boolean).map((a) => a.toLowerCase()))].sort(),
    });
  }
  return out;
}

/** Addresses that receive one lab's mail (see labMailboxes). */
export async function labRecipients(em: EntityManager, organisationId: string): Promise<string[]> {
  return (await labMailboxes(em, [organisationId])).get(organisationId)?.to ?? [];
}
