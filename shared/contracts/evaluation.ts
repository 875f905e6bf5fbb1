import * as z from 'zod';
import { Id } from './common';
import {
  DATE_MAX,
  DATE_MIN,
  dateOnly,
  daysBetween,
  GRANT_MAX_YEARS,
  KeyText,
  multiLine,
  ParticipantCodeText,
  singleLine,
} from './ranges';
import { AssignedValueRuleInput, SigmaPtRuleInput } from './rules';
import { StoredUncertainty } from './submission';

/**
 * Evaluation, Consensus board, lab scores, Track record, investigations and assessor grants.
 * Units: every value, uncertainty and σ_pt is in the unit of its measurand (`unit`); scores are
 * dimensionless; D% is percent.
 */

/** σ_pt and assigned-value rules: defined once in ./rules (shared with the Round desk contracts). */
export { AssignedValueRuleInput, SigmaPtRuleInput } from './rules';

/** Why a result is kept out of the assigned value (the coordinator names one and explains). */
export const EXCLUSION_RULES = [
  'confirmed-blunder',
  'item-damaged',
  'late-result',
  'method-deviation',
  'other',
] as const;
export const ExclusionRule = z.enum(EXCLUSION_RULES);
export const EXCLUSION_RULE_LABELS: Record<(typeof EXCLUSION_RULES)[number], string> = {
  'confirmed-blunder': 'Confirmed blunder (lab agreed)',
  'item-damaged': 'Test item damaged or leaked',
  'late-result': 'Result arrived after the deadline',
  'method-deviation': 'Method outside the protocol',
  other: 'Other (see reason)',
};

const Reason = multiLine(1000, { trim: true }).min(3, {
  message: 'Give a reason (at least 3 characters).',
});

export const SigmaPtOverride = z.object({
  measurandKey: KeyText,
  /** null: every item of the round. */
  itemCode: KeyText.nullable().default(null),
  rule: SigmaPtRuleInput,
  reason: Reason,
});
export type SigmaPtOverride = z.infer<typeof SigmaPtOverride>;

export const Exclusion = z.object({
  participantCode: ParticipantCodeText,
  itemCode: KeyText,
  measurandKey: KeyText,
  rule: ExclusionRule,
  reason: Reason,
});
export type Exclusion = z.infer<typeof Exclusion>;

/** The coordinator's choices for one evaluation (stored with it). */
export const EvaluationSettings = z.object({
  sigmaPtOverrides: z.array(SigmaPtOverride).max(100).default([]),
  exclusions: z.array(Exclusion).max(2000).default([]),
});
export type EvaluationSettings = z.infer<typeof EvaluationSettings>;

export const Signal = z.enum(['acceptable', 'warning', 'action']);
export type Signal = z.infer<typeof Signal>;
export const ScoreKind = z.enum(['z', 'zPrime']);

export const Hint = z.object({ code: z.string(), message: z.string() });

/** One participant's scores for one item × measurand. */
export const ParticipantScore = z.object({
  code: z.string(),
  /** Mean of the replicates. */
  result: z.number(),
  replicates: z.number().int(),
  replicateSd: z.number().nullable(),
  /** Standard uncertainty u(x) the lab reported (U/k for an expanded one), if any. */
  u: z.number().nullable(),
  z: z.number().nullable(),
  zPrime: z.number().nullable(),
  zeta: z.number().nullable(),
  en: z.number().nullable(),
  d: z.number().nullable(),
  dPct: z.number().nullable(),
  /** The score the signal follows: z when u(x_pt) is negligible, else z′. */
  scoreKind: ScoreKind,
  signal: Signal.nullable(),
  hints: z.array(Hint),
  excluded: z.object({ rule: ExclusionRule, reason: z.string() }).nullable(),
  /**
   * Set when stored data could not be scored (e.g. an uncertainty too large to compute En): the
   * scores it names stay null and the reason says why. Absent on records made before it existed.
   */
  notScored: z.object({ code: z.string(), message: z.string() }).nullable().optional(),
});
export type ParticipantScore = z.infer<typeof ParticipantScore>;

export const ReplicateInputSchema = z.object({
  code: z.string(),
  values: z.array(z.number()),
  uncertainty: StoredUncertainty.nullable(),
});

/** One item × measurand of an evaluation: the record and how it was made. */
export const ItemMeasurandEvaluation = z.object({
  testItemId: Id,
  itemCode: z.string(),
  measurandId: Id,
  measurandKey: z.string(),
  measurandName: z.string(),
  unit: z.string(),
  decimals: z.number().int(),
  /** Participants with a result used for x_pt (excluded ones not counted). */
  n: z.number().int(),
  method: z.enum(['algorithm-a', 'median', 'reference', 'none']),
  iterations: z.number().int(),
  assignedValue: z.number().nullable(),
  robustSd: z.number().nullable(),
  uAssigned: z.number().nullable(),
  sigmaPt: z.number().nullable(),
  uNegligible: z.boolean().nullable(),
  sigmaPtRule: SigmaPtRuleInput,
  assignedValueRule: AssignedValueRuleInput,
  constants: z.record(z.string(), z.unknown()),
  warnings: z.array(z.string()),
  participants: z.array(ParticipantScore),
});
export type ItemMeasurandEvaluation = z.infer<typeof ItemMeasurandEvaluation>;

export const EvaluationState = z.enum(['draft', 'committed', 'published']);
export type EvaluationState = z.infer<typeof EvaluationState>;
/** What a person reads for an investigation's state. */
export const INVESTIGATION_STATE_LABELS: Record<'open' | 'closed', string> = {
  open: 'Open',
  closed: 'Closed',
};
/** What a person reads for an evaluation state (docs/GLOSSARY.md: never "committed"). */
export const EVALUATION_STATE_LABELS: Record<EvaluationState, string> = {
  draft: 'Draft',
  committed: 'Approved for publication',
  published: 'Published',
};

/** GET/POST /rounds/{id}/evaluation: the coordinator's view (codes only, no lab names). */
export const EvaluationView = z.object({
  id: Id,
  roundId: Id,
  roundCode: z.string(),
  roundState: z.string(),
  version: z.number().int(),
  state: EvaluationState,
  settings: EvaluationSettings,
  softwareVersion: z.string(),
  reissueReason: z.string().nullable(),
  createdAt: z.string(),
  committedAt: z.string().nullable(),
  publishedAt: z.string().nullable(),
  results: z.array(ItemMeasurandEvaluation),
  /** The round's items and measurands with their own rules (the browser preview starts from these). */
  items: z.array(z.object({ id: Id, code: z.string() })),
  measurands: z.array(
    z.object({
      id: Id,
      key: z.string(),
      name: z.string(),
      unit: z.string(),
      decimals: z.number().int(),
      sigmaPtRule: SigmaPtRuleInput,
      assignedValueRule: AssignedValueRuleInput,
      minParticipants: z.number().int(),
    }),
  ),
  /** The replicates the record was computed from, per item × measurand (for the live preview). */
  inputs: z.array(
    z.object({ testItemId: Id, measurandId: Id, rows: z.array(ReplicateInputSchema) }),
  ),
});
export type EvaluationView = z.infer<typeof EvaluationView>;

export const EvaluationRequest = EvaluationSettings.partial().default({});
export const ReissueRequest = z.object({
  reason: Reason,
  settings: EvaluationSettings.partial().optional(),
});
export type ReissueRequest = z.infer<typeof ReissueRequest>;
export const PublishResponse = z.object({
  evaluationId: Id,
  version: z.number().int(),
  labsNotified: z.number().int(),
  investigationsOpened: z.number().int(),
});

/* ---------------------------------------------------------------- Consensus board */

export const BoardGroup = z.object({
  itemCode: z.string(),
  measurandKey: z.string(),
  measurandName: z.string(),
  unit: z.string(),
  decimals: z.number().int(),
  n: z.number().int(),
  assignedValue: z.number().nullable(),
  uAssigned: z.number().nullable(),
  sigmaPt: z.number().nullable(),
  scoreKind: ScoreKind,
});
export type BoardGroup = z.infer<typeof BoardGroup>;

/** One cell: numbers rounded to 6 significant digits (the stored record keeps full precision). */
export const BoardCell = z.object({
  result: z.number(),
  sd: z.number().nullable(),
  u: z.number().nullable(),
  z: z.number().nullable(),
  zPrime: z.number().nullable(),
  zeta: z.number().nullable(),
  en: z.number().nullable(),
  signal: Signal.nullable(),
  /** Blunder-hint codes; absent when there are none (keeps a 1,000-row board small). */
  hints: z.array(z.string()).optional(),
  /** True when kept out of x_pt; absent otherwise. */
  excluded: z.literal(true).optional(),
  /** Why stored data could not be scored (ParticipantScore.notScored message); absent otherwise. */
  notScored: z.string().optional(),
});
export type BoardCell = z.infer<typeof BoardCell>;

export const BoardRow = z.object({ code: z.string(), cells: z.array(BoardCell.nullable()) });
export type BoardRow = z.infer<typeof BoardRow>;

export const BoardData = z.object({
  roundId: Id,
  roundCode: z.string(),
  roundTitle: z.string(),
  evaluationId: Id,
  version: z.number().int(),
  state: EvaluationState,
  publishedAt: z.string().nullable(),
  groups: z.array(BoardGroup),
  rows: z.array(BoardRow),
  /** Codes of the viewer's own lab(s) in this round (a lab's row is marked). */
  ownCodes: z.array(z.string()),
  /** Lab names by code: the coordinator (on request) or the labs that granted an assessor access. */
  labNames: z.record(z.string(), z.string()),
  canRevealNames: z.boolean(),
});
export type BoardData = z.infer<typeof BoardData>;

export const BoardQuery = z.object({ reveal: z.enum(['names']).optional() });

export const BoardListEntry = z.object({
  roundId: Id,
  roundCode: z.string(),
  roundTitle: z.string(),
  roundState: z.string(),
  evaluationState: EvaluationState.nullable(),
  version: z.number().int().nullable(),
  publishedAt: z.string().nullable(),
  /** Signal counts over every score of the newest evaluation shown (zero without one). */
  acceptable: z.number().int().default(0),
  warning: z.number().int().default(0),
  action: z.number().int().default(0),
});
export type BoardListEntry = z.infer<typeof BoardListEntry>;

/* ---------------------------------------------------------------- A lab's scores */

export const LabScore = z.object({
  itemCode: z.string(),
  measurandKey: z.string(),
  measurandName: z.string(),
  unit: z.string(),
  decimals: z.number().int(),
  assignedValue: z.number().nullable(),
  uAssigned: z.number().nullable(),
  sigmaPt: z.number().nullable(),
  score: ParticipantScore,
  /** Plain-language sentences about what the scores mean. */
  explanation: z.array(z.string()),
  investigationId: Id.nullable(),
});
export type LabScore = z.infer<typeof LabScore>;

export const LabScores = z.object({
  roundId: Id,
  roundCode: z.string(),
  roundTitle: z.string(),
  version: z.number().int(),
  publishedAt: z.string().nullable(),
  reissueReason: z.string().nullable(),
  participantCode: z.string(),
  labName: z.string(),
  scores: z.array(LabScore),
});
export type LabScores = z.infer<typeof LabScores>;
export const LabQuery = z.object({ labId: Id.optional() });

/* ---------------------------------------------------------------- Track record */

export const RunRuleFinding = z.object({
  rule: z.enum(['action-signal', 'two-warnings-in-a-row', 'nine-on-one-side', 'rsz']),
  message: z.string(),
  roundCode: z.string(),
});
export type RunRuleFinding = z.infer<typeof RunRuleFinding>;

export const TrackPoint = z.object({
  roundId: Id,
  roundCode: z.string(),
  publishedAt: z.string().nullable(),
  itemCode: z.string(),
  z: z.number(),
  signal: Signal,
});
export type TrackPoint = z.infer<typeof TrackPoint>;

export const TrackSeries = z.object({
  measurandKey: z.string(),
  measurandName: z.string(),
  points: z.array(TrackPoint),
  /** Rescaled sum of z-scores RSZ = Σz/√n over the points. */
  rsz: z.number().nullable(),
  findings: z.array(RunRuleFinding),
});
export type TrackSeries = z.infer<typeof TrackSeries>;

export const TrackRecord = z.object({
  labId: Id,
  labName: z.string(),
  series: z.array(TrackSeries),
});
export type TrackRecord = z.infer<typeof TrackRecord>;

/* ---------------------------------------------------------------- Investigations */

export const CAUSE_CATEGORIES = [
  'sample-preparation',
  'temperature',
  'dispersant',
  'dilution',
  'instrument',
  'data-entry',
  'other',
] as const;
export const CauseCategory = z.enum(CAUSE_CATEGORIES);
export type CauseCategory = z.infer<typeof CauseCategory>;
export const CAUSE_CATEGORY_LABELS: Record<CauseCategory, string> = {
  'sample-preparation': 'Sample preparation or dust',
  temperature: 'Temperature or equilibration',
  dispersant: 'Dispersant viscosity or refractive index',
  dilution: 'Dilution or concentration',
  instrument: 'Instrument alignment or calibration',
  'data-entry': 'Data entry or units',
  other: 'Other',
};

export const InvestigationDto = z.object({
  id: Id,
  roundId: Id,
  roundCode: z.string(),
  organisationId: Id,
  labName: z.string(),
  participantCode: z.string(),
  itemCode: z.string(),
  measurandKey: z.string(),
  measurandName: z.string(),
  scoreKind: z.string(),
  score: z.number(),
  signal: z.enum(['warning', 'action']),
  state: z.enum(['open', 'closed']),
  causeCategory: CauseCategory.nullable(),
  rootCause: z.string(),
  correctiveAction: z.string(),
  effectivenessCheck: z.string(),
  closedByName: z.string().nullable(),
  closedAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  /** The viewer may edit (a member of the lab, while open). */
  canEdit: z.boolean(),
  /** The viewer may close (the lab's manager, while open). */
  canClose: z.boolean(),
});
export type InvestigationDto = z.infer<typeof InvestigationDto>;

export const InvestigationUpdate = z
  .object({
    causeCategory: CauseCategory.nullable(),
    rootCause: multiLine(4000, { trim: true }),
    correctiveAction: multiLine(4000, { trim: true }),
    effectivenessCheck: multiLine(4000, { trim: true }),
  })
  .partial();
export type InvestigationUpdate = z.infer<typeof InvestigationUpdate>;

/* ---------------------------------------------------------------- Assessor grants */

/**
 * An assessor's access: starts today unless given, ends on or after its start and at most
 * GRANT_MAX_YEARS later (common practice: one accreditation cycle), or stays open (null).
 */
export const AssessorGrantCreate = z
  .object({
    email: z
      .string()
      .trim()
      .toLowerCase()
      .pipe(z.email({ message: 'Enter a valid e-mail address.' })),
    name: singleLine(200, { min: 1 }).optional(),
    startsOn: dateOnly('Start date').optional(),
    endsOn: dateOnly('End date').nullable().optional(),
  })
  .superRefine((g, ctx) => {
    // Dates outside DATE_MIN…DATE_MAX are already named by the field itself.
    if (
      !g.endsOn ||
      g.endsOn > DATE_MAX ||
      g.endsOn < DATE_MIN ||
      (g.startsOn && (g.startsOn > DATE_MAX || g.startsOn < DATE_MIN))
    )
      return;
    const start = g.startsOn ?? new Date().toISOString().slice(0, 10);
    if (g.endsOn < start)
      ctx.addIssue({
        code: 'custom',
        path: ['endsOn'],
        message: 'The access must end on or after its start.',
      });
    else if (daysBetween(start, g.endsOn) > GRANT_MAX_YEARS * 366) {
      ctx.addIssue({
        code: 'custom',
        path: ['endsOn'],
        message: `The access may run for at most ${GRANT_MAX_YEARS} years.`,
      });
    }
  });
export type AssessorGrantCreate = z.infer<typeof AssessorGrantCreate>;

export const AssessorGrantDto = z.object({
  id: Id,
  organisationId: Id,
  assessorId: Id,
  assessorEmail: z.string(),
  assessorName: z.string(),
  startsOn: z.string(),
  endsOn: z.string().nullable(),
  revokedAt: z.string().nullable(),
  isActive: z.boolean(),
  createdAt: z.string(),
});
export type AssessorGrantDto = z.infer<typeof AssessorGrantDto>;
export const GrantParams = z.object({ id: Id, grantId: Id });
