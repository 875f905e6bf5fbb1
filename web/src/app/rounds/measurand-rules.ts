import type { AssignedValueRuleInput, SigmaPtRuleInput } from '@ringlet/shared/contracts/rounds';

/**
 * The σ_pt and assigned-value rules as flat form groups, and back. The form groups have the same
 * paths as the contract (`sigmaPtRule.percent`, `assignedValueRule.source`), so zod's issues and
 * the server's 400 details land under the right field. The shared schema validates what
 * `…FromForm` returns; these functions only reshape.
 */
export interface SigmaPtRuleForm {
  kind: SigmaPtRuleInput['kind'];
  /** fixed: σ_pt in the measurand's unit */
  value: number | null;
  /** percent: σ_pt as a percentage of x_pt */
  percent: number | null;
  /** precision: σ_R from a precision study (ISO 13528 §8.4), and where it comes from */
  sigmaR: number | null;
  source: string;
}

export interface AssignedValueRuleForm {
  kind: AssignedValueRuleInput['kind'];
  /** reference: the reference value, its standard uncertainty u and its source */
  value: number | null;
  u: number | null;
  source: string;
}

export const SIGMA_PT_KIND_LABELS: Record<SigmaPtRuleInput['kind'], string> = {
  fixed: 'Fixed value',
  percent: 'Percent of x_pt',
  'robust-sd': 'Robust SD of the round (s*)',
  precision: 'σ_R from a precision study',
};

export const ASSIGNED_VALUE_KIND_LABELS: Record<AssignedValueRuleInput['kind'], string> = {
  consensus: 'Consensus (robust mean, Algorithm A)',
  median: 'Median of the results',
  reference: 'Reference value (with u and source)',
};

export function sigmaRuleToForm(rule: SigmaPtRuleInput): SigmaPtRuleForm {
  return {
    kind: rule.kind,
    value: rule.kind === 'fixed' ? rule.value : null,
    percent: rule.kind === 'percent' ? rule.percent : null,
    sigmaR: rule.kind === 'precision' ? rule.sigmaR : null,
    source: rule.kind === 'precision' ? (rule.source ?? '') : '',
  };
}

/** A number input's value: empty stays null (the schema then says what to enter). */
function num(v: number | string | null): number | null {
  if (v === null || v === '') return null;
  return typeof v === 'number' ? v : Number(v);
}

/**
 * The rule the form describes. `previous` keeps the precision study's optional repeatability,
 * replicate count and study link, which the form does not show, when the rule stays a precision rule.
 */
export function sigmaRuleFromForm(f: SigmaPtRuleForm, previous?: SigmaPtRuleInput): unknown {
  switch (f.kind) {
    case 'fixed':
      return { kind: 'fixed', value: num(f.value) };
    case 'percent':
      return { kind: 'percent', percent: num(f.percent) };
    case 'robust-sd':
      return { kind: 'robust-sd' };
    case 'precision': {
      const kept =
        previous?.kind === 'precision'
          ? {
              ...(previous.sigmaRepeatability !== undefined
                ? { sigmaRepeatability: previous.sigmaRepeatability }
                : {}),
              ...(previous.replicates !== undefined ? { replicates: previous.replicates } : {}),
              ...(previous.study !== undefined ? { study: previous.study } : {}),
            }
          : {};
      const source = f.source.trim();
      return { kind: 'precision', sigmaR: num(f.sigmaR), ...kept, ...(source ? { source } : {}) };
    }
  }
}

export function assignedRuleToForm(rule: AssignedValueRuleInput): AssignedValueRuleForm {
  return rule.kind === 'reference'
    ? { kind: 'reference', value: rule.value, u: rule.u, source: rule.source }
    : { kind: rule.kind, value: null, u: null, source: '' };
}

export function assignedRuleFromForm(f: AssignedValueRuleForm): unknown {
  return f.kind === 'reference'
    ? { kind: 'reference', value: num(f.value), u: num(f.u), source: f.source }
    : { kind: f.kind };
}

/** One line for the measurands table: the shared words (shared/contracts/rule-text.ts). */
export {
  assignedValueRuleText as assignedRuleText,
  sigmaPtRuleText as sigmaRuleText,
} from '@ringlet/shared/contracts/rule-text';
