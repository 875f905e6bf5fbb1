import { assignedValueRuleText, sigmaPtRuleText, sigmaPtRuleWords } from './rule-text';
import { AssignedValueRuleInput, SigmaPtRuleInput } from './rules';

describe('rule text (one set of words for screens and reports)', () => {
  it('says each σ_pt rule in one short line, with the unit where it has one', () => {
    expect(sigmaPtRuleText({ kind: 'fixed', value: 2.5 }, 'nm')).toBe('fixed 2.5 nm');
    expect(sigmaPtRuleText({ kind: 'fixed', value: 0.02 })).toBe('fixed 0.02');
    expect(sigmaPtRuleText({ kind: 'percent', percent: 4 }, 'nm')).toBe('4 % of x_pt');
    expect(sigmaPtRuleText({ kind: 'robust-sd' })).toBe('robust SD s*');
    expect(sigmaPtRuleText({ kind: 'precision', sigmaR: 1.2, source: 'Study 7' }, 'nm')).toBe(
      'σ_R 1.2 nm (Study 7)',
    );
  });

  it('says each assigned-value rule in one short line', () => {
    expect(assignedValueRuleText({ kind: 'consensus' })).toBe('consensus (Algorithm A)');
    expect(assignedValueRuleText({ kind: 'median' })).toBe('median');
    expect(
      assignedValueRuleText({ kind: 'reference', value: 101.8, u: 0.9, source: 'Cert' }, 'nm'),
    ).toBe('reference 101.8 ± 0.9 nm (Cert)');
  });

  it('says how σ_pt was set as the sentence a report prints (ISO 13528 §8.4 for σ_R)', () => {
    expect(sigmaPtRuleWords({ kind: 'percent', percent: 5 })).toBe('5 % of the assigned value');
    expect(sigmaPtRuleWords({ kind: 'precision', sigmaR: 3 })).toBe(
      'from a precision experiment (ISO 13528 §8.4; σ_R = 3)',
    );
  });
});

describe('rule schemas (one definition with the bounds of ranges.ts)', () => {
  it('refuses a percentage above 100 and a reference without its source', () => {
    expect(SigmaPtRuleInput.safeParse({ kind: 'percent', percent: 101 }).success).toBe(false);
    expect(SigmaPtRuleInput.safeParse({ kind: 'percent', percent: 5 }).success).toBe(true);
    expect(
      AssignedValueRuleInput.safeParse({ kind: 'reference', value: 100, u: 1, source: '' }).success,
    ).toBe(false);
  });
});
