import type { SigmaPtOverride } from '@ringlet/shared/contracts/evaluation';
import { canReissue, fix, groupChanged, overrideRule, withOverride } from './evaluation-logic';

describe('evaluation page logic', () => {
  it('rounds to the measurand decimals, 0…8, and shows a dash for no number', () => {
    expect(fix(101.23456, 2)).toBe('101.23');
    expect(fix(1.5, -3)).toBe('2');
    expect(fix(null, 2)).toBe('—');
  });
  it('a rule for the same measurand and item replaces the one before', () => {
    const a: SigmaPtOverride = {
      measurandKey: 'z',
      itemCode: null,
      rule: { kind: 'robust-sd' },
      reason: 'one',
    };
    const b = { ...a, rule: overrideRule('percent', 10), reason: 'two' };
    const c = { ...a, itemCode: 'A', reason: 'three' };
    expect(withOverride(withOverride([a], c), b)).toEqual([c, b]);
  });
  it('reissue: a published round, or a reissued one without an approved new version', () => {
    expect(canReissue({ roundState: 'published', state: 'committed' })).toBe(true);
    expect(canReissue({ roundState: 'reissued', state: 'draft' })).toBe(true);
    expect(canReissue({ roundState: 'reissued', state: 'committed' })).toBe(false);
    expect(canReissue({ roundState: 'closed', state: 'draft' })).toBe(false);
  });
  it('a group changed when σ_pt or x_pt moved', () => {
    expect(groupChanged(undefined, { sigmaPt: 1, assignedValue: 2 })).toBe(false);
    const same = { sigmaPt: 1, assignedValue: 2 };
    expect(groupChanged(same as Parameters<typeof groupChanged>[0], same)).toBe(false);
  });
});
