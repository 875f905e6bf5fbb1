import {
  AssignedValueRuleInput,
  MeasurandInput,
  SigmaPtRuleInput,
} from '@ringlet/shared/contracts/rounds';
import {
  assignedRuleFromForm,
  assignedRuleText,
  assignedRuleToForm,
  sigmaRuleFromForm,
  sigmaRuleText,
  sigmaRuleToForm,
  type SigmaPtRuleForm,
} from './measurand-rules';

const blank: SigmaPtRuleForm = {
  kind: 'robust-sd',
  value: null,
  percent: null,
  sigmaR: null,
  source: '',
};

describe('σ_pt and assigned-value rule forms', () => {
  it('maps each σ_pt rule to the form and back unchanged', () => {
    const rules: SigmaPtRuleInput[] = [
      { kind: 'fixed', value: 2.5 },
      { kind: 'percent', percent: 4 },
      { kind: 'robust-sd' },
      { kind: 'precision', sigmaR: 3.1, source: 'Precision study PS-2025, ISO 5725-2 evaluation' },
    ];
    for (const rule of rules) {
      expect(SigmaPtRuleInput.parse(sigmaRuleFromForm(sigmaRuleToForm(rule), rule))).toEqual(rule);
    }
  });

  it('switching robust SD to 4 % of x_pt gives the percent rule and drops the other fields', () => {
    const form = {
      ...sigmaRuleToForm({ kind: 'robust-sd' }),
      kind: 'percent' as const,
      percent: 4,
      value: 9,
    };
    expect(sigmaRuleFromForm(form)).toEqual({ kind: 'percent', percent: 4 });
  });

  it('reads number inputs given as text, and keeps the precision study fields the form does not show', () => {
    const previous: SigmaPtRuleInput = {
      kind: 'precision',
      sigmaR: 3,
      sigmaRepeatability: 1.2,
      replicates: 3,
      source: 'old',
    };
    const form = {
      ...blank,
      kind: 'precision' as const,
      sigmaR: '2.75' as unknown as number,
      source: '  Study B  ',
    };
    expect(sigmaRuleFromForm(form, previous)).toEqual({
      kind: 'precision',
      sigmaR: 2.75,
      sigmaRepeatability: 1.2,
      replicates: 3,
      source: 'Study B',
    });
    // no source typed: none sent (it is optional in the contract)
    expect(sigmaRuleFromForm({ ...blank, kind: 'precision', sigmaR: 2 })).toEqual({
      kind: 'precision',
      sigmaR: 2,
    });
  });

  it('an empty or out-of-range value fails the shared schema under the field the form has', () => {
    const empty = SigmaPtRuleInput.safeParse(sigmaRuleFromForm({ ...blank, kind: 'percent' }));
    expect(empty.success).toBe(false);
    expect(empty.error!.issues[0]).toMatchObject({
      path: ['percent'],
      message: 'Enter the percentage of x_pt.',
    });
    const over = SigmaPtRuleInput.safeParse(
      sigmaRuleFromForm({ ...blank, kind: 'percent', percent: 120 }),
    );
    expect(over.error!.issues[0]!.message).toBe('The percentage is at most 100.');
    const zero = SigmaPtRuleInput.safeParse(
      sigmaRuleFromForm({ ...blank, kind: 'fixed', value: 0 }),
    );
    expect(zero.error!.issues[0]).toMatchObject({
      path: ['value'],
      message: 'σ_pt must be above 0.',
    });
  });

  it('maps the assigned-value rules; a reference value needs u and a source', () => {
    const reference: AssignedValueRuleInput = {
      kind: 'reference',
      value: 101.8,
      u: 0.9,
      source: 'Certificate, lot 7',
    };
    expect(
      AssignedValueRuleInput.parse(assignedRuleFromForm(assignedRuleToForm(reference))),
    ).toEqual(reference);
    expect(assignedRuleFromForm({ ...assignedRuleToForm(reference), kind: 'median' })).toEqual({
      kind: 'median',
    });
    expect(assignedRuleToForm({ kind: 'consensus' })).toEqual({
      kind: 'consensus',
      value: null,
      u: null,
      source: '',
    });
    const missing = MeasurandInput.safeParse({
      key: 'z_average',
      name: 'Z-average diameter',
      unit: 'nm',
      decimals: 1,
      replicatesRequired: 3,
      assignedValueRule: assignedRuleFromForm({
        kind: 'reference',
        value: 100,
        u: null,
        source: ' ',
      }),
    });
    expect(missing.error!.issues.map((i) => i.path.join('.')).sort()).toEqual([
      'assignedValueRule.source',
      'assignedValueRule.u',
    ]);
  });

  it('describes the rules in one line with the unit', () => {
    expect(sigmaRuleText({ kind: 'percent', percent: 4 })).toBe('4 % of x_pt');
    expect(sigmaRuleText({ kind: 'fixed', value: 2.5 }, 'nm')).toBe('fixed 2.5 nm');
    expect(
      assignedRuleText({ kind: 'reference', value: 101.8, u: 0.9, source: 'Cert' }, 'nm'),
    ).toBe('reference 101.8 ± 0.9 nm (Cert)');
  });
});
