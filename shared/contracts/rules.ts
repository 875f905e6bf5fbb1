import * as z from 'zod';
import { boundedNumber, singleLine } from './ranges';

/**
 * The σ_pt rule and the assigned-value rule of a measurand (shapes of shared/stats SigmaPtRule /
 * AssignedValueRule), defined once with the bounds of ./ranges. The Round desk contracts
 * (./rounds: measurands) and the evaluation contracts (./evaluation: σ_pt overrides, the stored
 * record, the coordinator's view) both use these; the words for a rule are in ./rule-text.
 */

export const SigmaPtRuleInput = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('fixed'),
    value: boundedNumber('sigmaPt', { required: 'Enter σ_pt.' }),
  }),
  z.object({
    kind: z.literal('percent'),
    percent: boundedNumber('sigmaPtPercent', {
      required: 'Enter the percentage of x_pt.',
      tooSmall: 'The percentage must be above 0.',
      tooLarge: 'The percentage is at most 100.',
    }),
  }),
  z.object({ kind: z.literal('robust-sd') }),
  z.object({
    kind: z.literal('precision'),
    sigmaR: boundedNumber('sigmaPt', {
      label: 'σ_R',
      required: 'Enter σ_R from the precision study.',
    }),
    sigmaRepeatability: boundedNumber('sigmaPt', { label: 'σ_r' }).optional(),
    replicates: z.number().int().min(1).max(20).optional(),
    source: singleLine(500).optional(),
  }),
]);
export type SigmaPtRuleInput = z.infer<typeof SigmaPtRuleInput>;

export const AssignedValueRuleInput = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('consensus') }),
  z.object({ kind: z.literal('median') }),
  z.object({
    kind: z.literal('reference'),
    value: boundedNumber('measuredValue', {
      label: 'Reference value',
      required: 'Enter the reference value.',
    }),
    u: boundedNumber('referenceUncertainty', { required: 'Enter its standard uncertainty u.' }),
    source: singleLine(500, { min: 1, required: 'Name the source (e.g. the certificate).' }),
  }),
]);
export type AssignedValueRuleInput = z.infer<typeof AssignedValueRuleInput>;
