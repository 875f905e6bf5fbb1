import type { AssignedValueRuleInput, SigmaPtRuleInput } from './rules';

/**
 * A measurand's σ_pt and assigned-value rules in words, defined once for every screen and report.
 * `sigmaPtRuleText` / `assignedValueRuleText`: one short line (tables, the evaluation page).
 * `sigmaPtRuleWords`: the sentence a report prints (round report, round workbook).
 */

/** The unit after a number, with its space; nothing for a dimensionless measurand. */
const withUnit = (unit: string): string => (unit ? ` ${unit}` : '');

/** σ_pt rule as one short line, e.g. "fixed 2.5 nm", "4 % of x_pt", "σ_R 1.2 nm (study 2025)". */
export function sigmaPtRuleText(rule: SigmaPtRuleInput, unit = ''): string {
  const u = withUnit(unit);
  switch (rule.kind) {
    case 'fixed':
      return `fixed ${rule.value}${u}`;
    case 'percent':
      return `${rule.percent} % of x_pt`;
    case 'robust-sd':
      return 'robust SD s*';
    case 'precision':
      return `σ_R ${rule.sigmaR}${u}${rule.source ? ` (${rule.source})` : ''}`;
  }
}

/** Assigned-value rule as one short line, e.g. "consensus (Algorithm A)", "reference 101.8 ± 0.9 nm (Cert)". */
export function assignedValueRuleText(rule: AssignedValueRuleInput, unit = ''): string {
  switch (rule.kind) {
    case 'consensus':
      return 'consensus (Algorithm A)';
    case 'median':
      return 'median';
    case 'reference':
      return `reference ${rule.value} ± ${rule.u}${withUnit(unit)} (${rule.source})`;
  }
}

/** How σ_pt was set, as the sentence a report prints. */
export function sigmaPtRuleWords(rule: SigmaPtRuleInput): string {
  switch (rule.kind) {
    case 'fixed':
      return `fixed value ${rule.value}`;
    case 'percent':
      return `${rule.percent} % of the assigned value`;
    case 'robust-sd':
      return 'robust standard deviation of the participants’ results (Algorithm A)';
    case 'precision':
      return `from a precision experiment (ISO 13528 §8.4; σ_R = ${rule.sigmaR}${rule.source ? `, ${rule.source}` : ''})`;
  }
}
