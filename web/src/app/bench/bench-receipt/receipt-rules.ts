import { DAMAGED_CONDITIONS, type ShipmentCondition } from '@ringlet/shared/contracts/bench';

/** The damaged-parcel cautions show while the form or the stored receipt says damaged or leaked. */
export function isParcelDamaged(
  chosen: ShipmentCondition,
  stored: ShipmentCondition | null,
): boolean {
  return DAMAGED_CONDITIONS.includes(chosen) || (!!stored && DAMAGED_CONDITIONS.includes(stored));
}
