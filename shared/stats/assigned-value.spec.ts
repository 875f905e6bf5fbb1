import creosote from './fixtures/creosote.json';
import { assignedValue, consensusUncertainty, isUncertaintyNegligible } from './assigned-value';

describe('assignedValue', () => {
  it('consensus = Algorithm A x*, u = 1.25 s* / √p (ISO 5725-5 creosote, computed x*, s*; ISO 13528 §7.7.3 from memory)', () => {
    const a = assignedValue(creosote.values, { kind: 'consensus' });
    expect(a.method).toBe('algorithm-a');
    expect(a.value).toBeCloseTo(20.4121428571, 9);
    expect(a.u).toBeCloseTo((1.25 * 1.069839703) / 3, 9);
    expect(a.p).toBe(9);
    expect(a.algorithmA?.outcome).toBe('converged');
  });

  it('median rule uses 1.25·MADe / √p (from memory)', () => {
    const a = assignedValue([1, 2, 3, 4, 100], { kind: 'median' });
    expect(a.value).toBe(3);
    expect(a.u).toBeCloseTo((1.25 * 1.483) / Math.sqrt(5), 12);
  });

  it('reference value is passed through with its source', () => {
    const a = assignedValue([], { kind: 'reference', value: 60.2, u: 0.4, source: 'certificate' });
    expect(a).toMatchObject({
      value: 60.2,
      u: 0.4,
      method: 'reference',
      source: 'certificate',
      p: 0,
    });
    expect(() => assignedValue([], { kind: 'reference', value: 1, u: -1, source: '' })).toThrow(
      RangeError,
    );
  });

  it('consensus on no results throws', () => {
    expect(() => assignedValue([], { kind: 'consensus' })).toThrow(RangeError);
  });

  it('consensusUncertainty and the 0.3·σ_pt negligible check (ISO 13528 §9.2.1, from memory)', () => {
    expect(consensusUncertainty(2, 25)).toBeCloseTo(0.5, 14);
    expect(isUncertaintyNegligible(0.3, 1)).toBe(true);
    expect(isUncertaintyNegligible(0.3001, 1)).toBe(false);
    expect(() => consensusUncertainty(1, 0)).toThrow(RangeError);
  });
});
