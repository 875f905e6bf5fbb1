import { studyDecisionText, studyInput } from './study-input';

describe('study input', () => {
  const base = { testItemId: 'i', measurandId: 'm', sigmaPt: null, text: '1 2\n3 4\n5 6' };
  it('a homogeneity study sends one line per item', () => {
    expect(studyInput({ ...base, kind: 'homogeneity' })).toEqual({
      kind: 'homogeneity',
      testItemId: 'i',
      measurandId: 'm',
      sigmaPt: null,
      data: {
        items: [
          [1, 2],
          [3, 4],
          [5, 6],
        ],
      },
    });
  });
  it('a stability study sends the first two lines as before and after', () => {
    expect(studyInput({ ...base, kind: 'stability', sigmaPt: 2 }).data).toEqual({
      first: [1, 2],
      second: [3, 4],
    });
  });
  it('says a decision is needed only for a failed study without one', () => {
    expect(studyDecisionText({ passes: true, decision: null, decisionReason: null })).toBe('—');
    expect(studyDecisionText({ passes: false, decision: null, decisionReason: null })).toBe(
      'Needed before publication',
    );
  });
});
