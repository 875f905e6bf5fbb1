import * as z from 'zod';
import { changeSomething, changesSomething, Email, Id, Timestamp } from './common';
import { boundedNumber, boundedTimestamp, dateOnly, multiLine, singleLine } from './ranges';
import { RoundState } from './round-states';
import { AssignedValueRuleInput, SigmaPtRuleInput } from './rules';

/**
 * Round desk contracts: schemes, rounds, test items, measurands, invitations, enrolments,
 * shipments, homogeneity and stability studies. The server validates every request with these
 * and the web forms validate with the same schemas.
 */

import { DEFAULT_INSTRUCTIONS } from './safety';

export { DEFAULT_INSTRUCTIONS, SAFETY_CAUTIONS } from './safety';

// ---- σ_pt and assigned-value rules: defined once in ./rules ----

export { AssignedValueRuleInput, SigmaPtRuleInput } from './rules';

// ---- measurands ----

export const MeasurandInput = z.object({
  key: z
    .string()
    .trim()
    .regex(/^[a-z][a-z0-9_]{0,39}$/, {
      message: 'Use lower-case letters, digits and _ (e.g. z_average).',
    }),
  name: singleLine(100, { min: 1, required: 'Enter the measurand name.' }),
  unit: singleLine(20),
  decimals: z.number().int().min(0).max(6),
  replicatesRequired: z.number().int().min(1).max(20),
  sigmaPtRule: SigmaPtRuleInput.default({ kind: 'robust-sd' }),
  assignedValueRule: AssignedValueRuleInput.default({ kind: 'consensus' }),
  minParticipants: z.number().int().min(1).max(10000).default(12),
});
export type MeasurandInput = z.input<typeof MeasurandInput>;

/**
 * The DLS defaults (issue 4): Z-average diameter in nm with 1 decimal and 3 replicates; PDI with
 * 3 decimals and 3 replicates. σ_pt from the round's robust SD and x_pt by consensus (Algorithm A)
 * until the coordinator chooses otherwise; 12 participants minimum is common practice.
 */
export const DLS_DEFAULT_MEASURANDS: readonly z.output<typeof MeasurandInput>[] = [
  {
    key: 'z_average',
    name: 'Z-average diameter',
    unit: 'nm',
    decimals: 1,
    replicatesRequired: 3,
    sigmaPtRule: { kind: 'robust-sd' },
    assignedValueRule: { kind: 'consensus' },
    minParticipants: 12,
  },
  {
    key: 'pdi',
    name: 'Polydispersity index (PDI)',
    unit: '',
    decimals: 3,
    replicatesRequired: 3,
    sigmaPtRule: { kind: 'robust-sd' },
    assignedValueRule: { kind: 'consensus' },
    minParticipants: 12,
  },
];

export const Measurand = z.object({
  id: Id,
  roundId: Id,
  key: z.string(),
  name: z.string(),
  unit: z.string(),
  decimals: z.number().int(),
  replicatesRequired: z.number().int(),
  sigmaPtRule: SigmaPtRuleInput,
  assignedValueRule: AssignedValueRuleInput,
  minParticipants: z.number().int(),
  position: z.number().int(),
});
export type Measurand = z.infer<typeof Measurand>;

/** PATCH of one measurand: any of its fields; a rule is replaced whole. */
export const MeasurandUpdate = z
  .object({
    key: MeasurandInput.shape.key,
    name: MeasurandInput.shape.name,
    unit: MeasurandInput.shape.unit,
    decimals: MeasurandInput.shape.decimals,
    replicatesRequired: MeasurandInput.shape.replicatesRequired,
    sigmaPtRule: SigmaPtRuleInput,
    assignedValueRule: AssignedValueRuleInput,
    minParticipants: MeasurandInput.shape.minParticipants.unwrap(),
  })
  .partial()
  .refine(changesSomething, changeSomething);
export type MeasurandUpdate = z.input<typeof MeasurandUpdate>;

// ---- schemes ----

/** A scheme or round code: 2–30 capital letters, digits or dashes; the message shows `example`. */
function capitalCode(example: string) {
  return z
    .string()
    .trim()
    .regex(/^[A-Z0-9][A-Z0-9-]{1,29}$/, {
      message: `Use 2–30 capital letters, digits or dashes (e.g. ${example}).`,
    });
}

export const SchemeCreate = z.object({
  code: capitalCode('NANO-DLS'),
  name: singleLine(200, { min: 2, required: 'Enter the scheme name.' }),
  description: multiLine(4000, { trim: true }).default(''),
  rules: multiLine(8000, { trim: true }).default(''),
  defaultMeasurands: z
    .array(MeasurandInput)
    .max(20)
    .default([...DLS_DEFAULT_MEASURANDS]),
});
export type SchemeCreate = z.input<typeof SchemeCreate>;

export const Scheme = z.object({
  id: Id,
  code: z.string(),
  name: z.string(),
  description: z.string(),
  rules: z.string(),
  defaultMeasurands: z.array(MeasurandInput),
  createdAt: Timestamp,
});
export type Scheme = z.infer<typeof Scheme>;

// ---- test items ----

export const TestItemInput = z.object({
  code: z
    .string()
    .trim()
    .regex(/^[A-Za-z0-9][A-Za-z0-9-]{0,19}$/, {
      message: 'Use up to 20 letters, digits or dashes (e.g. A).',
    }),
  material: singleLine(200, { min: 1, required: 'Enter the material.' }),
  nominalSizeNm: boundedNumber('diameterNm', { label: 'Nominal size' }).nullable().default(null),
  storageNotes: multiLine(2000, { trim: true }).default(''),
  handlingNotes: multiLine(2000, { trim: true }).default(''),
});
export type TestItemInput = z.input<typeof TestItemInput>;

export const TestItem = z.object({
  id: Id,
  roundId: Id,
  code: z.string(),
  material: z.string(),
  nominalSizeNm: z.number().nullable(),
  storageNotes: z.string(),
  handlingNotes: z.string(),
  position: z.number().int(),
});
export type TestItem = z.infer<typeof TestItem>;

/** PATCH of one test item: any of its fields (no defaults, so an absent field stays as it is). */
export const TestItemUpdate = z
  .object({
    code: TestItemInput.shape.code,
    material: TestItemInput.shape.material,
    nominalSizeNm: TestItemInput.shape.nominalSizeNm.unwrap(),
    storageNotes: TestItemInput.shape.storageNotes.unwrap(),
    handlingNotes: TestItemInput.shape.handlingNotes.unwrap(),
  })
  .partial()
  .refine(changesSomething, changeSomething);
export type TestItemUpdate = z.input<typeof TestItemUpdate>;

export const ItemParams = z.object({ id: Id, itemId: Id });
export const MeasurandParams = z.object({ id: Id, measurandId: Id });

// ---- rounds ----

/** States in which a round's test items and measurands may change (the server enforces it). */
export const ROUND_DESIGN_STATES: readonly RoundState[] = ['draft', 'enrolling'];
/** A published round does not change in place (a reissue reopens its description). */
export const ROUND_LOCKED_STATES: readonly RoundState[] = ['published'];

export const isDesignOpen = (state: RoundState): boolean => ROUND_DESIGN_STATES.includes(state);
export const isDescriptionOpen = (state: RoundState): boolean =>
  !ROUND_LOCKED_STATES.includes(state);
/** The participation fee is fixed once enrolment has opened. */
export const isFeeOpen = (state: RoundState): boolean => state === 'draft';

/** A calendar date, YYYY-MM-DD. */
export const DateOnly = dateOnly();

const roundFields = {
  title: singleLine(200, { min: 2, required: 'Enter the round title.' }),
  enrolmentClosesOn: dateOnly('Enrolment closing date').nullable().default(null),
  dispatchOn: dateOnly('Dispatch date').nullable().default(null),
  resultsDueAt: boundedTimestamp('Results due').nullable().default(null),
  instructions: multiLine(20000).default(DEFAULT_INSTRUCTIONS),
  protocolTemperatureC: boundedNumber('temperatureC', { label: 'Protocol temperature' }).default(
    25,
  ),
  feeMinor: z.number().int().min(0).max(100_000_000).default(0),
  currency: z
    .string()
    .trim()
    .regex(/^[A-Z]{3}$/, { message: 'Use a 3-letter currency code (e.g. EUR).' })
    .default('EUR'),
};

/** Why a coordinator withdraws a lab, extends its deadline or decides on a study. */
const GivenReason = multiLine(2000, { trim: true }).min(5, {
  message: 'Give the reason (at least 5 characters).',
});

function datesInOrder(r: {
  enrolmentClosesOn?: string | null;
  dispatchOn?: string | null;
  resultsDueAt?: string | null;
}): boolean {
  if (r.enrolmentClosesOn && r.dispatchOn && r.dispatchOn < r.enrolmentClosesOn) return false;
  if (r.dispatchOn && r.resultsDueAt && r.resultsDueAt.slice(0, 10) < r.dispatchOn) return false;
  return true;
}
const datesMessage = {
  message: 'Dates must run in order: enrolment closes, dispatch, results due.',
  path: ['resultsDueAt'],
};

/** What a round is: a PT round scores labs (ISO 13528); a precision study estimates s_r and s_R (ISO 5725-2). */
export const RoundKind = z.enum(['pt', 'precision']);
export type RoundKind = z.infer<typeof RoundKind>;

export const RoundCreate = z
  .object({
    schemeId: Id,
    code: capitalCode('DLS-2026-1'),
    kind: RoundKind.default('pt'),
    ...roundFields,
    /** Start with the scheme's default measurands (true unless the coordinator says otherwise). */
    useSchemeMeasurands: z.boolean().default(true),
    items: z.array(TestItemInput).max(20).default([]),
  })
  .refine(datesInOrder, datesMessage);
export type RoundCreate = z.input<typeof RoundCreate>;

export const RoundUpdate = z
  .object({
    title: roundFields.title,
    enrolmentClosesOn: roundFields.enrolmentClosesOn.unwrap(),
    dispatchOn: roundFields.dispatchOn.unwrap(),
    resultsDueAt: roundFields.resultsDueAt.unwrap(),
    instructions: roundFields.instructions.unwrap(),
    protocolTemperatureC: roundFields.protocolTemperatureC.unwrap(),
    feeMinor: roundFields.feeMinor.unwrap(),
    currency: roundFields.currency.unwrap(),
  })
  .partial()
  .refine(changesSomething, changeSomething)
  .refine(datesInOrder, datesMessage);
export type RoundUpdate = z.input<typeof RoundUpdate>;

export const RoundSummary = z.object({
  id: Id,
  schemeId: Id,
  schemeCode: z.string(),
  code: z.string(),
  title: z.string(),
  kind: RoundKind,
  state: RoundState,
  enrolmentClosesOn: z.string().nullable(),
  dispatchOn: z.string().nullable(),
  resultsDueAt: Timestamp.nullable(),
  feeMinor: z.number().int(),
  currency: z.string(),
  itemCount: z.number().int(),
  enrolledCount: z.number().int(),
  createdAt: Timestamp,
});
export type RoundSummary = z.infer<typeof RoundSummary>;

export const ROUND_KIND_LABELS: Record<RoundKind, string> = {
  pt: 'PT round',
  precision: 'Precision study',
};

export const RoundTransitionRecord = z.object({
  fromState: RoundState,
  toState: RoundState,
  actorName: z.string().nullable(),
  reason: z.string().nullable(),
  forced: z.boolean(),
  at: Timestamp,
});
export type RoundTransitionRecord = z.infer<typeof RoundTransitionRecord>;

export const RoundDetail = RoundSummary.extend({
  instructions: z.string(),
  protocolTemperatureC: z.number(),
  items: z.array(TestItem),
  measurands: z.array(Measurand),
  transitions: z.array(RoundTransitionRecord),
  /** True while a failing homogeneity/stability check has no recorded decision (blocks publication). */
  hasOpenHomogeneityFailure: z.boolean(),
});
export type RoundDetail = z.infer<typeof RoundDetail>;

export const TransitionRequest = z
  .object({
    to: RoundState,
    reason: multiLine(2000, { trim: true }).optional(),
    /** Overrides a date rule (e.g. closing before results are due); needs a reason. */
    force: z.boolean().default(false),
  })
  .refine((t) => !t.force || (t.reason?.length ?? 0) >= 5, {
    message: 'Give a reason (at least 5 characters) when forcing a transition.',
    path: ['reason'],
  });
export type TransitionRequest = z.input<typeof TransitionRequest>;

// ---- invitations and enrolments ----

export const InvitationCreate = z
  .object({
    /** An existing lab, or null to invite a new lab by its contact address. */
    organisationId: Id.nullable().default(null),
    email: Email,
    /** For a new lab: its name. */
    labName: singleLine(200, { min: 2, required: 'Enter the lab name.' }).nullable().default(null),
  })
  .refine((i) => i.organisationId !== null || i.labName !== null, {
    message: 'Name the new lab (or choose an existing one).',
    path: ['labName'],
  });
export type InvitationCreate = z.input<typeof InvitationCreate>;

export const InvitationsCreate = z.object({
  invitations: z.array(InvitationCreate).min(1, { message: 'Invite at least one lab.' }).max(200),
});
export type InvitationsCreate = z.input<typeof InvitationsCreate>;

export const Invitation = z.object({
  id: Id,
  roundId: Id,
  organisationId: Id.nullable(),
  organisationName: z.string().nullable(),
  email: z.string(),
  labName: z.string().nullable(),
  expiresAt: Timestamp,
  acceptedAt: Timestamp.nullable(),
  createdAt: Timestamp,
});
export type Invitation = z.infer<typeof Invitation>;

export const TokenParams = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, { message: 'Not a valid link.' }),
});

/** What the invitee sees before accepting (no other lab's identity). */
export const InvitationInfo = z.object({
  roundCode: z.string(),
  roundTitle: z.string(),
  email: z.string(),
  labName: z.string().nullable(),
  /** True when the invitation creates a new lab on acceptance. */
  isNewLab: z.boolean(),
  expiresAt: Timestamp,
});
export type InvitationInfo = z.infer<typeof InvitationInfo>;

export const InvitationAcceptResult = z.object({
  roundId: Id,
  participantCode: z.string(),
  /** For a new lab: a first-password link went to the contact address. */
  accountCreated: z.boolean(),
});
export type InvitationAcceptResult = z.infer<typeof InvitationAcceptResult>;

export const ReceiptCondition = z.enum(['intact', 'damaged', 'leaked', 'arrived-warm']);
export type ReceiptCondition = z.infer<typeof ReceiptCondition>;

export const Shipment = z.object({
  courier: z.string().nullable(),
  trackingNumber: z.string().nullable(),
  dispatchedOn: z.string().nullable(),
  receivedOn: z.string().nullable(),
  condition: ReceiptCondition.nullable(),
  receiptNotes: z.string().nullable(),
});
export type Shipment = z.infer<typeof Shipment>;

/** Receipt status as the coordinator's table shows it. */
export const ReceiptStatus = z.enum([
  'not-dispatched',
  'dispatched',
  'received',
  'received-with-problem',
]);
export type ReceiptStatus = z.infer<typeof ReceiptStatus>;

export const EnrolmentState = z.enum(['enrolled', 'withdrawn']);

export const Enrolment = z.object({
  id: Id,
  roundId: Id,
  organisationId: Id,
  organisationName: z.string(),
  participantCode: z.string(),
  state: EnrolmentState,
  withdrawnReason: z.string().nullable(),
  extensionUntil: Timestamp.nullable(),
  enrolledAt: Timestamp,
  shipment: Shipment.nullable(),
  receiptStatus: ReceiptStatus,
  submitted: z.boolean(),
});
export type Enrolment = z.infer<typeof Enrolment>;

export const EnrolmentParams = z.object({ id: Id, enrolmentId: Id });

export const Withdrawal = z.object({
  reason: GivenReason,
});
export type Withdrawal = z.input<typeof Withdrawal>;

export const ExtensionGrant = z.object({
  until: boundedTimestamp('Extension'),
  reason: GivenReason,
});
export type ExtensionGrant = z.input<typeof ExtensionGrant>;

export const DispatchInput = z.object({
  courier: singleLine(100, { min: 1, required: 'Enter the courier.' }),
  trackingNumber: singleLine(100, { min: 1, required: 'Enter the tracking number.' }),
  dispatchedOn: dateOnly('Dispatch date'),
});
export type DispatchInput = z.input<typeof DispatchInput>;

// ---- homogeneity and stability ----

/** g items, each with m ≥ 2 replicate results in the measurand's unit. */
export const HomogeneityData = z.object({
  items: z
    .array(
      z
        .array(boundedNumber('measuredValue', { label: 'Result' }))
        .min(2, { message: 'Each item needs at least 2 replicates.' })
        .max(20),
    )
    .min(2, { message: 'At least 2 items are needed.' })
    .max(100)
    .refine((items) => items.every((r) => r.length === items[0]?.length), {
      message: 'Every item needs the same number of replicates.',
    }),
});

export const StabilityData = z.object({
  first: z
    .array(boundedNumber('measuredValue', { label: 'Result' }))
    .min(2, { message: 'At least 2 results before.' })
    .max(200),
  second: z
    .array(boundedNumber('measuredValue', { label: 'Result' }))
    .min(2, { message: 'At least 2 results after.' })
    .max(200),
});

export const StudyInput = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('homogeneity'),
    testItemId: Id,
    measurandId: Id,
    /** σ_pt for the check; when omitted, taken from the measurand's fixed or percent rule. */
    sigmaPt: boundedNumber('sigmaPt').nullable().default(null),
    data: HomogeneityData,
  }),
  z.object({
    kind: z.literal('stability'),
    testItemId: Id,
    measurandId: Id,
    sigmaPt: boundedNumber('sigmaPt').nullable().default(null),
    data: StabilityData,
  }),
]);
export type StudyInput = z.input<typeof StudyInput>;

export const HomogeneityDecisionKind = z.enum(['accept', 'widen-sigma-pt', 'exclude-item']);
export type HomogeneityDecisionKind = z.infer<typeof HomogeneityDecisionKind>;
/** What a person reads for a decision on a failing study (docs/GLOSSARY.md: every code gets a label). */
export const HOMOGENEITY_DECISION_LABELS: Record<HomogeneityDecisionKind, string> = {
  accept: 'Accept the items as they are',
  'widen-sigma-pt': 'Widen σ_pt to include s_s',
  'exclude-item': 'Exclude the item from scoring',
};
export type StudyKind = 'homogeneity' | 'stability';
export const STUDY_KIND_LABELS: Record<StudyKind, string> = {
  homogeneity: 'Homogeneity study',
  stability: 'Stability study',
};

export const Study = z.object({
  id: Id,
  roundId: Id,
  testItemId: Id,
  testItemCode: z.string(),
  measurandId: Id,
  measurandName: z.string(),
  unit: z.string(),
  kind: z.enum(['homogeneity', 'stability']),
  sigmaPt: z.number(),
  data: z.record(z.string(), z.unknown()),
  /** The stats engine's result (HomogeneityResult or StabilityResult), numbers in the measurand's unit. */
  result: z.record(z.string(), z.unknown()),
  passes: z.boolean(),
  decision: HomogeneityDecisionKind.nullable(),
  decisionReason: z.string().nullable(),
  decidedAt: Timestamp.nullable(),
  createdAt: Timestamp,
});
export type Study = z.infer<typeof Study>;

export const StudyParams = z.object({ id: Id, studyId: Id });

export const StudyDecision = z.object({
  decision: HomogeneityDecisionKind,
  reason: GivenReason,
});
export type StudyDecision = z.input<typeof StudyDecision>;
