/**
 * The usual cautions shown wherever Ringlet tells labs how to handle a test item (docs/QUALITY.md,
 * "Where the work can hurt someone"). One list for the round instructions, the Lab bench, the
 * results workbook and the e-mails.
 */
export const SAFETY_CAUTIONS: readonly string[] = [
  'Wear eye protection and gloves when opening and diluting test items.',
  'Never defeat or bypass the instrument\u2019s laser interlock.',
  'Follow the safety data sheet of each test item and dispersant, and your lab\u2019s chemical-hygiene plan.',
  'Local regulations and your lab\u2019s safety officer take precedence over these notes.',
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
