/**
 * The usual cautions shown wherever Ringlet tells labs how to handle a test item (docs/QUALITY.md,
 * "Where the work can hurt someone"). One list for the round instructions, the Lab bench, the
 * results workbook, the round report and the e-mails: nothing else writes its own copy.
 * The wording is common practice for lab work with dilute particle suspensions and class 1–3R
 * laser instruments (no single published source); every list ends by deferring to local rules.
 */
export const SAFETY_CAUTIONS: readonly string[] = [
  'Wear eye protection and gloves when opening and diluting test items.',
  'Never defeat or bypass the instrument\u2019s laser interlock.',
  'Follow the safety data sheet of each test item and dispersant, and your lab\u2019s chemical-hygiene plan.',
  'Local regulations and your lab\u2019s safety officer take precedence over these notes.',
];

/**
 * Packing and transport, for the PT provider when it dispatches test items (common practice).
 * Ringlet does not classify goods: the carrier's rules and the dangerous-goods rules that apply
 * to the consignment decide.
 */
export const DISPATCH_CAUTIONS: readonly string[] = [
  'Pack, mark and label each parcel under the carrier\u2019s conditions and the dangerous-goods rules that apply to the route (road, air or post); these notes do not replace them.',
  'Use leak-proof primary containers, absorbent material and a rigid outer packaging, and put the safety data sheets in the parcel.',
  'Your organisation\u2019s dangerous-goods adviser or safety officer decides how a consignment is classified and shipped.',
];

/** When receipt records a leaked or damaged parcel (common practice). */
export const DAMAGED_PARCEL_CAUTIONS: readonly string[] = [
  'Do not open a leaking or damaged parcel on an open bench: put on gloves and eye protection and open it in a fume hood or a contained area.',
  'Contain and clean up any spill as the safety data sheet says, and dispose of the waste under your lab\u2019s rules.',
  'Tell your safety officer, and do not measure an item whose container leaked: report the damage so the PT provider can send a replacement.',
];

/** When syringes, needles or syringe filters are used to fill cuvettes (common practice). */
export const SHARPS_CAUTIONS: readonly string[] = [
  'Put used needles and syringes straight into a sharps container; never recap a needle.',
  'Hold the syringe filter firmly and push gently: a blocked filter can burst off and spray the sample.',
];

/** The cautions as the opening block of a round's instructions. */
export const SAFETY_BLOCK = ['Safety:', ...SAFETY_CAUTIONS.map((c) => `- ${c}`)].join('\n');

/** Instructions a new round starts with: the cautions, then the measuring request. */
export const DEFAULT_INSTRUCTIONS = `${SAFETY_BLOCK}\n\nMeasure each test item as you would a routine sample, at the protocol temperature, and report every replicate.`;

/**
 * The instructions without the standard safety block, for pages that show the cautions in their
 * own box already (the text is otherwise kept exactly as the coordinator wrote it).
 */
export function withoutSafetyBlock(instructions: string): string {
  return instructions.replace(SAFETY_BLOCK, '').trim();
}

/**
 * The instructions as stored and printed: always opened by the standard safety block (the basic
 * cautions cannot be removed); the coordinator's own text, which may add cautions, follows.
 */
export function withSafetyBlock(instructions: string): string {
  const text = withoutSafetyBlock(instructions);
  return text ? `${SAFETY_BLOCK}\n\n${text}` : SAFETY_BLOCK;
}

/** True when the text mentions syringes, needles or syringe filters (the sharps cautions apply). */
export function mentionsSharps(text: string): boolean {
  return /\b(syringes?|needles?|filter(s|ed|ing)?)\b/i.test(text);
}

/** A caution list as plain-text lines for an e-mail. */
export function cautionLines(cautions: readonly string[]): string {
  return cautions.map((c) => `- ${c}`).join('\n');
}
