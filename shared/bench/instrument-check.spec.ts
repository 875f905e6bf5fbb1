import { judgeInstrumentCheck } from './instrument-check';

// Check values: common practice, no published source (issue 5): a nominal 92 nm latex whose three
// runs average within 3 nm of 92 nm with PDI ≤ 0.025 at 25 °C after ≥ 5 min equilibration passes;
// a reading of 115.7 nm with PDI 0.125 fails.
const spec = {
  referenceValueNm: 92,
  toleranceNm: 3,
  pdiLimit: 0.025,
  setPointC: 25,
  temperatureToleranceC: 0.5,
  minEquilibrationMin: 5,
};
const run = (zAverageNm: number, pdi: number, temperatureC = 25, equilibrationMin = 5) => ({
  zAverageNm,
  pdi,
  temperatureC,
  equilibrationMin,
});

describe('judgeInstrumentCheck (common practice values, no published source)', () => {
  it('passes three runs of a 92 nm latex averaging within 3 nm with PDI ≤ 0.025 at 25 °C after 5 min', () => {
    const v = judgeInstrumentCheck({
      ...spec,
      runs: [run(93.1, 0.018), run(92.4, 0.021), run(93.6, 0.025)],
    });
    expect(v.passed).toBe(true);
    expect(v.meanZAverageNm).toBeCloseTo(93.0333, 3);
    expect(v.maxPdi).toBe(0.025);
    expect(v.reasons).toEqual([]);
  });

  it('passes at the edge (mean exactly 95.0 nm) and fails just beyond it', () => {
    expect(
      judgeInstrumentCheck({ ...spec, runs: [run(95, 0.02), run(95, 0.02), run(95, 0.02)] }).passed,
    ).toBe(true);
    const v = judgeInstrumentCheck({
      ...spec,
      runs: [run(95.2, 0.02), run(95.1, 0.02), run(95.1, 0.02)],
    });
    expect(v.passed).toBe(false);
    expect(v.reasons.map((r) => r.code)).toEqual(['mean-out-of-tolerance']);
  });

  it('fails a single reading of 115.7 nm with PDI 0.125 (too few runs, mean and PDI)', () => {
    const v = judgeInstrumentCheck({ ...spec, runs: [run(115.7, 0.125)] });
    expect(v.passed).toBe(false);
    expect(v.meanZAverageNm).toBe(115.7);
    expect(v.reasons.map((r) => r.code)).toEqual([
      'too-few-runs',
      'mean-out-of-tolerance',
      'pdi-above-limit',
    ]);
  });

  it('fails three runs when one of them reads 115.7 nm with PDI 0.125', () => {
    const v = judgeInstrumentCheck({
      ...spec,
      runs: [run(92.2, 0.02), run(91.9, 0.02), run(115.7, 0.125)],
    });
    expect(v.passed).toBe(false);
    expect(v.meanZAverageNm).toBeCloseTo(99.9333, 3);
    expect(v.reasons.map((r) => r.code)).toEqual(['mean-out-of-tolerance', 'pdi-above-limit']);
    expect(v.reasons[1]!.message).toContain('replicate 3');
  });

  it('fails a run off the set point or not equilibrated long enough', () => {
    const v = judgeInstrumentCheck({
      ...spec,
      runs: [run(92, 0.02, 25), run(92, 0.02, 26.2), run(92, 0.02, 25, 2)],
    });
    expect(v.reasons.map((r) => r.code)).toEqual([
      'temperature-off-set-point',
      'equilibration-too-short',
    ]);
    expect(v.reasons[0]!.message).toContain('replicate 2');
    expect(v.reasons[1]!.message).toContain('replicate 3');
  });
});
