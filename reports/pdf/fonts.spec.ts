import { fontRuns, printable } from './fonts';

describe('PDF fonts: ≤ ≥ ± · √ print as themselves', () => {
  it('keeps the signs and sends mathematical operators to Noto Sans Math', () => {
    const text = 'u ≤ 0.3 σ, |z| ≥ 3, ±2, a · b, √(p), ȳ1';
    expect(printable(text)).toBe(text);
    expect(fontRuns('a ≤ b')).toEqual([
      { text: 'a ', subset: '' },
      { text: '≤', subset: '-math' },
      { text: ' b', subset: '' },
    ]);
    // The minus sign (U+2212) and ± · stay in the latin file, which has them.
    expect(fontRuns('−1 ± 2 · 3')).toEqual([{ text: '−1 ± 2 · 3', subset: '' }]);
  });
});
