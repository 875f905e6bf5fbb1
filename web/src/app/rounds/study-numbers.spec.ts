import type { Study } from '@ringlet/shared/contracts/rounds';
import { parseReplicateText, studyNumbers } from './study-numbers';

describe('study numbers', () => {
  it('reads one line per item, any common separator', () => {
    expect(parseReplicateText('100.2 100.4\n99.8,100.1\n\n101;100.9\t')).toEqual([
      [100.2, 100.4],
      [99.8, 100.1],
      [101, 100.9],
    ]);
    expect(parseReplicateText('1 x')[0]![1]).toBeNaN(); // left for the schema to reject
  });

  it('shows the homogeneity numbers with 4 significant digits', () => {
    const s = {
      kind: 'homogeneity',
      result: {
        g: 3,
        m: 2,
        generalMean: 100.1,
        sx: 5,
        sw: 0.1414213562,
        ss: 4.9989999,
        limit: 0.6,
        passes: false,
        passesExtended: false,
        widenedSigmaPt: 5.384236,
      },
    } as unknown as Study;
    expect(studyNumbers(s)).toBe(
      'g = 3, m = 2, mean 100.100; s_x 5.000, s_w 0.1414, s_s 4.999 vs 0.3σ_pt 0.6000 (not met); extended not met; widened σ_pt 5.384',
    );
  });
});
