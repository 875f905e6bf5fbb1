import { formatDate, formatDateTime, formatMoney } from './format';

describe('screen formats (one place for dates and money)', () => {
  it('writes money from minor units with two decimals and the ISO 4217 code', () => {
    expect(formatMoney(45000, 'EUR')).toBe('450.00 EUR');
    expect(formatMoney(5, 'CHF')).toBe('0.05 CHF');
    expect(formatMoney(123456789, 'USD')).toBe('1,234,567.89 USD');
  });

  it('shows a calendar date on its own day in the user locale, and a dash for none', () => {
    const expected = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' }).format(
      new Date(2025, 2, 14),
    );
    expect(formatDate('2025-03-14')).toBe(expected);
    expect(formatDate(null)).toBe('—');
    expect(formatDateTime(undefined)).toBe('—');
    expect(formatDate('not a date')).toBe('not a date');
  });
});
