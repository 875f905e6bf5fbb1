import { DEFAULT_CHECK } from '@ringlet/shared/bench/instrument-check';
import { checkPreview, type CheckFormValue } from './check-preview';

const form = (runs: CheckFormValue['runs']): CheckFormValue => ({ ...DEFAULT_CHECK, runs });
const empty = { zAverageNm: null, pdi: null, temperatureC: 25, equilibrationMin: 2 };

describe('checkPreview', () => {
  it('has no verdict before the first run with a Z-average and a PDI', () => {
    expect(checkPreview(form([empty, empty]))).toBeNull();
  });
  it('judges only the runs typed so far', () => {
    const ref = DEFAULT_CHECK.referenceValueNm;
    const ok = {
      zAverageNm: ref,
      pdi: DEFAULT_CHECK.pdiLimit / 2,
      temperatureC: DEFAULT_CHECK.setPointC,
      equilibrationMin: DEFAULT_CHECK.minEquilibrationMin,
    };
    expect(checkPreview(form([ok, empty]))?.meanZAverageNm).toBe(ref);
    const far = { ...ok, zAverageNm: ref + 10 * DEFAULT_CHECK.toleranceNm };
    expect(checkPreview(form([far]))?.passed).toBe(false);
  });
});
