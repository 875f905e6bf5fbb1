import type { EntityManager } from 'typeorm';
import { Measurand } from '../entities';

/** What a demo round's measurand is made from: its definition and its scoring rules. */
export type DemoMeasurand = Pick<
  Measurand,
  | 'key'
  | 'name'
  | 'unit'
  | 'decimals'
  | 'replicatesRequired'
  | 'sigmaPtRule'
  | 'assignedValueRule'
  | 'minParticipants'
>;

/** Stores a measurand of a demo round at `position` (the demo scenario and the precision studies). */
export function saveDemoMeasurand(
  em: EntityManager,
  roundId: string,
  m: DemoMeasurand,
  position: number,
): Promise<Measurand> {
  return em.save(
    Measurand,
    em.create(Measurand, {
      roundId,
      key: m.key,
      name: m.name,
      unit: m.unit,
      decimals: m.decimals,
      replicatesRequired: m.replicatesRequired,
      sigmaPtRule: m.sigmaPtRule,
      assignedValueRule: m.assignedValueRule,
      minParticipants: m.minParticipants,
      position,
    }),
  );
}
