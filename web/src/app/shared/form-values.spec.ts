import { isoToLocal, localToIso, numberOrNull } from './form-values';

describe('form values', () => {
  it('reads a number input: empty is null, text is a number', () => {
    expect(numberOrNull(null)).toBeNull();
    expect(numberOrNull('')).toBeNull();
    expect(numberOrNull(undefined)).toBeNull();
    expect(numberOrNull(0)).toBe(0);
    expect(numberOrNull('12.5')).toBe(12.5);
    expect(numberOrNull('abc')).toBeNaN();
  });

  it('turns a local date-time into ISO 8601 and back in the same time zone', () => {
    expect(localToIso('')).toBeNull();
    expect(localToIso('not a date')).toBe('not a date');
    const iso = localToIso('2026-06-30T14:00')!;
    expect(iso).toBe(new Date(2026, 5, 30, 14, 0).toISOString());
    expect(isoToLocal(iso)).toBe('2026-06-30T14:00');
    expect(isoToLocal(null)).toBe('');
    expect(isoToLocal('nonsense')).toBe('');
  });
});
