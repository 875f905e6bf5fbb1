/**
 * Plain-language explanation of one lab's scores for one item × measurand, for the lab's score
 * page and reports. Thresholds: ISO 13528:2015 §9 / ISO/IEC 17043 (|z| ≤ 2 acceptable,
 * 2 < |z| < 3 warning, |z| ≥ 3 action; |En| ≤ 1 acceptable).
 */
import type { ParticipantScore } from '../contracts/evaluation';
import { SIGNAL_LIMITS } from '../stats/scores';

const { warning: WARN, action: ACT, en: EN } = SIGNAL_LIMITS;

export interface ExplainContext {
  readonly measurandName: string;
  readonly unit: string;
  readonly decimals: number;
  readonly assignedValue: number | null;
  readonly sigmaPt: number | null;
  readonly uAssigned: number | null;
}

const fmt = (v: number, decimals: number) => v.toFixed(Math.max(0, Math.min(6, decimals)));

export function explainScore(s: ParticipantScore, c: ExplainContext): string[] {
  const out: string[] = [];
  const unit = c.unit ? ` ${c.unit}` : '';
  if (s.notScored?.code === 'value-out-of-range') return [s.notScored.message];
  if (c.assignedValue === null || c.sigmaPt === null) {
    out.push(
      'No score could be given for this measurand: the assigned value or σ_pt could not be set (see the round report).',
    );
    return out;
  }
  const d = s.result - c.assignedValue;
  out.push(
    `Your result ${fmt(s.result, c.decimals)}${unit} (mean of ${s.replicates} replicate${s.replicates === 1 ? '' : 's'}) is ` +
      `${fmt(Math.abs(d), c.decimals)}${unit} ${d >= 0 ? 'above' : 'below'} the assigned value ${fmt(c.assignedValue, c.decimals)}${unit}` +
      (s.dPct !== null ? ` (${s.dPct >= 0 ? '+' : ''}${s.dPct.toFixed(1)} %).` : '.'),
  );
  const main = s.scoreKind === 'z' ? s.z : s.zPrime;
  const name = s.scoreKind === 'z' ? 'z-score' : 'z′-score';
  if (main !== null) {
    out.push(
      `Your ${name} is ${main.toFixed(2)}: the difference is ${Math.abs(main).toFixed(1)} times the standard deviation for proficiency assessment ` +
        `(σ_pt = ${fmt(c.sigmaPt, c.decimals + 1)}${unit})` +
        (s.scoreKind === 'zPrime'
          ? ', widened by the uncertainty of the assigned value because it is not negligible.'
          : '.'),
    );
  }
  if (s.signal === 'acceptable')
    out.push(`Acceptable: within ±${WARN}, as most competent labs are. No action is needed.`);
  if (s.signal === 'warning') {
    out.push(
      `Warning signal: between ${WARN} and ${ACT} in size. One in about twenty results lands here by chance, so look for a cause, and watch the next rounds: two warnings in a row call for action.`,
    );
  }
  if (s.signal === 'action') {
    out.push(
      `Action signal: ${ACT} or more in size, which chance alone rarely gives. Investigate the cause, correct it and check that the correction works (an investigation has been opened for you).`,
    );
  }
  if (s.zeta !== null) {
    out.push(
      `Your ζ-score is ${s.zeta.toFixed(2)}: it compares the difference with your own reported uncertainty and that of the assigned value. ` +
        (Math.abs(s.zeta) > WARN
          ? `Above ${WARN} in size: your uncertainty may be too small for the agreement you achieve.`
          : `Within ±${WARN}: your reported uncertainty covers the difference.`),
    );
  }
  if (s.en !== null) {
    out.push(
      `Your En number is ${s.en.toFixed(2)} (expanded uncertainties): ` +
        (Math.abs(s.en) <= EN
          ? `within ±${EN}, consistent with the assigned value.`
          : `beyond ±${EN}, the difference is not covered by the uncertainties.`),
    );
  }
  if (s.notScored) out.push(s.notScored.message);
  for (const h of s.hints) out.push(`Hint: ${h.message}`);
  if (s.excluded) {
    out.push(
      `This result was kept out of the assigned value (${s.excluded.reason}); it is still scored against it.`,
    );
  }
  return out;
}
