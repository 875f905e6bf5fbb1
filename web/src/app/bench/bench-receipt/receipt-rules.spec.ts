import { DAMAGED_CONDITIONS } from '@ringlet/shared/contracts/bench';
import { isParcelDamaged } from './receipt-rules';

describe('isParcelDamaged', () => {
  const damaged = DAMAGED_CONDITIONS[0]!;
  it('shows the cautions while the form or the stored receipt says damaged', () => {
    expect(isParcelDamaged('intact', null)).toBe(false);
    expect(isParcelDamaged(damaged, null)).toBe(true);
    expect(isParcelDamaged('intact', damaged)).toBe(true);
  });
});
