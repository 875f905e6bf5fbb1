import * as z from 'zod';
import { Id, Timestamp } from './common';
import { boundedNumber, KeyText, multiLine, ParticipantCodeText, singleLine } from './ranges';
import { RoundState } from './round-states';

/**
 * Precision studies (ISO 5725-2 round robins) run as rounds of kind 'precision': the contract of
 *
 * - `GET  /api/v1/rounds/{id}/precision`                      → {@link PrecisionAnalysis}
 * - `GET  /api/v1/rounds/{id}/precision/exclusions`           → {@link PrecisionExclusionList}
 * - `POST /api/v1/rounds/{id}/precision/exclusions`           ← {@link PrecisionDecisionsBody} → {@link PrecisionAnalysis}
 * - `POST /api/v1/rounds/{id}/precision/exclusions/{exclusionId}/withdraw` ← {@link PrecisionWithdrawBody} → {@link PrecisionAnalysis}
 * - `PUT  /api/v1/rounds/{id}/precision/references`           ← {@link PrecisionReferencesBody} → {@link PrecisionAnalysis}
 * - `POST /api/v1/rounds/{id}/precision/finish`               → {@link PrecisionAnalysis} (closed → evaluated)
 * - `GET  /api/v1/rounds/{id}/reports/precision.pdf` and `precision.xlsx`
 * - `GET  /api/v1/schemes/{id}/precision-sources`              → {@link PrecisionSigmaSources}
 *
 * The analysis is computed by the one pure function `analysePrecisionStudy` in
 * shared/evaluation/precision-study.ts from a {@link PrecisionStudyInput}; the browser runs the same
 * function to recompute live while the coordinator decides.
 *
 * Units: every value, mean, s_r, s_L, s_R, r, R, bias and its uncertainty is in the unit of the
 * measurand (`unit`); h, k, C, G are dimensionless; `relativeBiasPercent` is percent.
 * Replicate numbers (`replicate`) count from 1.
 */

/** What an ISO 5725-2 test (or Mandel's indicator) made of a cell. */
export const PrecisionClassification = z.enum(['accepted', 'straggler', 'outlier']);
export type PrecisionClassification = z.infer<typeof PrecisionClassification>;

/** The tests that flag a cell. Cochran and Grubbs are tests; Mandel h and k are indicators. */
export const PRECISION_TESTS = [
  'cochran',
  'grubbs-single',
  'grubbs-double',
  'mandel-h',
  'mandel-k',
] as const;
export const PrecisionTest = z.enum(PRECISION_TESTS);
export type PrecisionTest = z.infer<typeof PrecisionTest>;
export const PRECISION_TEST_LABELS: Record<PrecisionTest, string> = {
  cochran: "Cochran's C",
  'grubbs-single': 'Grubbs (single)',
  'grubbs-double': 'Grubbs (double)',
  'mandel-h': "Mandel's h",
  'mandel-k': "Mandel's k",
};

/** Why a cell or replicate is set aside. */
export const PRECISION_EXCLUSION_KINDS = ['straggler', 'outlier', 'other'] as const;
export const PrecisionExclusionKind = z.enum(PRECISION_EXCLUSION_KINDS);
export type PrecisionExclusionKind = z.infer<typeof PrecisionExclusionKind>;
export const PRECISION_EXCLUSION_KIND_LABELS: Record<PrecisionExclusionKind, string> = {
  straggler: 'Straggler',
  outlier: 'Outlier',
  other: 'Other (see reason)',
};

/** confirmed: the data are set aside; rejected: the flag was reviewed and the data are kept. */
export const PRECISION_DECISIONS = ['confirmed', 'rejected'] as const;
export const PrecisionDecision = z.enum(PRECISION_DECISIONS);
export type PrecisionDecision = z.infer<typeof PrecisionDecision>;
export const PRECISION_DECISION_LABELS: Record<PrecisionDecision, string> = {
  confirmed: 'Set aside',
  rejected: 'Kept',
};

const Reason = multiLine(1000, { trim: true }).min(3, {
  message: 'Give a reason (at least 3 characters).',
});

/** The cell or single replicate a decision is about. */
export const PrecisionTarget = z.object({
  itemCode: KeyText,
  measurandKey: KeyText,
  participantCode: ParticipantCodeText,
  /** null: the whole cell (every replicate of the lab at this level); else one replicate (1-based). */
  replicate: z.number().int().min(1).max(20).nullable().default(null),
});
export type PrecisionTarget = z.input<typeof PrecisionTarget>;

/** One decision the coordinator records. */
export const PrecisionDecisionInput = PrecisionTarget.extend({
  kind: PrecisionExclusionKind,
  decision: PrecisionDecision,
  reason: Reason,
});
export type PrecisionDecisionInput = z.input<typeof PrecisionDecisionInput>;

/** Body of `POST /rounds/{id}/precision/exclusions`: one or more decisions, stored together. */
export const PrecisionDecisionsBody = z.object({
  decisions: z.array(PrecisionDecisionInput).min(1).max(200),
});
export type PrecisionDecisionsBody = z.input<typeof PrecisionDecisionsBody>;

/** Body of `POST /rounds/{id}/precision/exclusions/{exclusionId}/withdraw`. */
export const PrecisionWithdrawBody = z.object({ reason: Reason });
export type PrecisionWithdrawBody = z.input<typeof PrecisionWithdrawBody>;

export const PrecisionExclusionParams = z.object({ id: Id, exclusionId: Id });

/**
 * A recorded decision. The latest decision on a target that is not withdrawn is "in force"; a
 * newer decision on the same target replaces the older one (which stays in the list).
 */
export const PrecisionExclusion = z.object({
  id: Id,
  itemCode: z.string(),
  measurandKey: z.string(),
  participantCode: z.string(),
  replicate: z.number().int().nullable(),
  kind: PrecisionExclusionKind,
  decision: PrecisionDecision,
  reason: z.string(),
  actorName: z.string().nullable(),
  at: Timestamp,
  withdrawnAt: Timestamp.nullable(),
  withdrawnByName: z.string().nullable(),
  withdrawnReason: z.string().nullable(),
});
export type PrecisionExclusion = z.infer<typeof PrecisionExclusion>;

/** `GET /rounds/{id}/precision/exclusions`: every decision, newest first, withdrawn ones too. */
export const PrecisionExclusionList = z.object({ exclusions: z.array(PrecisionExclusion) });
export type PrecisionExclusionList = z.infer<typeof PrecisionExclusionList>;

/** An accepted reference value of a level (item × measurand), for the bias (ISO 5725-4). */
export const PrecisionReferenceInput = z.object({
  itemCode: KeyText,
  measurandKey: KeyText,
  value: boundedNumber('measuredValue', { label: 'Reference value' }),
  /** Standard uncertainty of the reference value; null when negligible or unknown. */
  u: boundedNumber('uncertainty', { label: 'Reference uncertainty' }).nullable().default(null),
  source: singleLine(500, { min: 1, required: 'Name where the reference value comes from.' }),
});
export type PrecisionReferenceInput = z.input<typeof PrecisionReferenceInput>;

/** Body of `PUT /rounds/{id}/precision/references`: the full list (replaces the stored one). */
export const PrecisionReferencesBody = z.object({
  references: z.array(PrecisionReferenceInput).max(400),
});
export type PrecisionReferencesBody = z.input<typeof PrecisionReferencesBody>;

export const PrecisionReference = z.object({
  itemCode: z.string(),
  measurandKey: z.string(),
  value: z.number(),
  u: z.number().nullable(),
  source: z.string(),
});
export type PrecisionReference = z.infer<typeof PrecisionReference>;

// ---------------------------------------------------------------- the input of the pure function

/** Everything `analysePrecisionStudy` needs (the server builds it from stored submitted versions). */
export const PrecisionStudyInput = z.object({
  round: z.object({
    id: Id,
    code: z.string(),
    title: z.string(),
    state: RoundState,
    schemeCode: z.string(),
  }),
  /** True when the round's state allows decisions (closed); the page hides the buttons otherwise. */
  decisionsOpen: z.boolean(),
  /** Levels = the round's test items, in the round's order. */
  levels: z.array(z.object({ itemCode: z.string(), label: z.string() })),
  measurands: z.array(
    z.object({
      key: z.string(),
      label: z.string(),
      unit: z.string(),
      decimals: z.number().int(),
      replicatesRequired: z.number().int(),
    }),
  ),
  /** One entry per lab × level × measurand with at least one result. */
  cells: z.array(
    z.object({
      itemCode: z.string(),
      measurandKey: z.string(),
      participantCode: z.string(),
      values: z.array(z.number()),
    }),
  ),
  references: z.array(PrecisionReference),
  /** Every recorded decision (withdrawn ones are ignored; the newest per target is in force). */
  exclusions: z.array(PrecisionExclusion),
});
export type PrecisionStudyInput = z.infer<typeof PrecisionStudyInput>;

// ---------------------------------------------------------------- the analysis answer

export const PrecisionCellFlag = z.object({
  test: PrecisionTest,
  classification: PrecisionClassification.exclude(['accepted']),
});
export type PrecisionCellFlag = z.infer<typeof PrecisionCellFlag>;

/** One replicate of a cell as the lab submitted it. */
export const PrecisionReplicate = z.object({
  replicate: z.number().int(),
  value: z.number(),
  /** Set aside by a confirmed decision (on this replicate or the whole cell). */
  excluded: z.boolean(),
});

/** A lab's results at one level (ISO 5725-2 "cell"); statistics over the replicates kept. */
export const PrecisionCellResult = z.object({
  participantCode: z.string(),
  replicates: z.array(PrecisionReplicate),
  /** The whole cell is set aside (then n, mean, sd, h, k describe the cell as submitted, for display). */
  excluded: z.boolean(),
  /** n_i: replicates kept. */
  n: z.number().int(),
  mean: z.number().nullable(),
  sd: z.number().nullable(),
  /** Mandel's h and k; null when the cell is set aside or not computable. */
  h: z.number().nullable(),
  k: z.number().nullable(),
  /** What the tests and indicators made of this cell (on the data kept). */
  flags: z.array(PrecisionCellFlag),
  /** Worst of the flags of Cochran and Grubbs (the tests); Mandel's indicators do not count. */
  classification: PrecisionClassification,
  /**
   * When Cochran flags the cell: the replicate farthest from the cell mean, a candidate for setting
   * aside one replicate instead of the cell.
   */
  suspectReplicate: z.number().int().nullable(),
});
export type PrecisionCellResult = z.infer<typeof PrecisionCellResult>;

export const PrecisionCochran = z.object({
  C: z.number(),
  critical5: z.number(),
  critical1: z.number(),
  classification: PrecisionClassification,
  participantCode: z.string(),
  /** Cells (with n ≥ 2) and replicates used for the critical values. */
  p: z.number().int(),
  n: z.number().int(),
});
export type PrecisionCochran = z.infer<typeof PrecisionCochran>;

export const PrecisionGrubbs = z.object({
  G: z.number(),
  critical5: z.number(),
  critical1: z.number(),
  classification: PrecisionClassification,
  participantCodes: z.array(z.string()),
});
export type PrecisionGrubbs = z.infer<typeof PrecisionGrubbs>;

export const PrecisionIndicators = z.object({ indicator1: z.number(), indicator5: z.number() });

/** Bias of the measurement method at a level with an accepted reference value (ISO 5725-4 §5.5 style). */
export const PrecisionBias = z.object({
  referenceValue: z.number(),
  referenceU: z.number().nullable(),
  referenceSource: z.string(),
  /** δ̂ = m̂ − µ. */
  bias: z.number(),
  relativeBiasPercent: z.number().nullable(),
  /** Standard uncertainty of δ̂: √((s_R² − (1 − 1/n)·s_r²)/p + u(µ)²). */
  u: z.number(),
  /** Half-width of the 95 % interval: 1.96·u (ISO 5725-4 A·s_R, with u(µ) added). */
  halfWidth95: z.number(),
  lower95: z.number(),
  upper95: z.number(),
  /** True when the 95 % interval excludes 0. */
  significant: z.boolean(),
  /** Replicates per lab used (Σn_i/p). */
  n: z.number(),
});
export type PrecisionBias = z.infer<typeof PrecisionBias>;

/** One level (test item) × measurand. */
export const PrecisionLevelResult = z.object({
  itemCode: z.string(),
  itemLabel: z.string(),
  /** Labs kept (cells not set aside, with at least one replicate kept). */
  p: z.number().int(),
  /** Total results kept Σn_i. */
  n: z.number().int(),
  /** Labs that reported, before any decision. */
  pReported: z.number().int(),
  cells: z.array(PrecisionCellResult),
  /** General mean m̂ (null when nothing is kept). */
  mean: z.number().nullable(),
  sr: z.number().nullable(),
  sL: z.number().nullable(),
  sR: z.number().nullable(),
  /** r = 2.8·s_r, R = 2.8·s_R. */
  r: z.number().nullable(),
  R: z.number().nullable(),
  /** s_r/m̂ and s_R/m̂ in percent. */
  srPercent: z.number().nullable(),
  sRPercent: z.number().nullable(),
  betweenMeanSquare: z.number().nullable(),
  nBar: z.number().nullable(),
  /** Set when s_L² came out negative and was set to 0. */
  sLNegativeNote: z.string().nullable(),
  cochran: PrecisionCochran.nullable(),
  grubbs: z.object({
    singleHigh: PrecisionGrubbs.nullable(),
    singleLow: PrecisionGrubbs.nullable(),
    doubleHigh: PrecisionGrubbs.nullable(),
    doubleLow: PrecisionGrubbs.nullable(),
  }),
  mandel: z.object({
    h: PrecisionIndicators.nullable(),
    k: PrecisionIndicators.extend({ p: z.number().int(), n: z.number().int() }).nullable(),
  }),
  bias: PrecisionBias.nullable(),
  /** Plain-language notes (tests not applicable, unequal n, …). */
  warnings: z.array(z.string()),
});
export type PrecisionLevelResult = z.infer<typeof PrecisionLevelResult>;

/** ISO 5725-2 §7.5 relations between a precision SD and the level m. */
export const PRECISION_RELATIONS = ['constant', 'proportional', 'linear', 'log-linear'] as const;
export const PrecisionRelation = z.enum(PRECISION_RELATIONS);
export type PrecisionRelation = z.infer<typeof PrecisionRelation>;
export const PRECISION_RELATION_LABELS: Record<PrecisionRelation, string> = {
  constant: 's = c (independent of m)',
  proportional: 's = b·m',
  linear: 's = a + b·m',
  'log-linear': 'lg s = c + d·lg m',
};

export const PrecisionFitCandidate = z.object({
  relation: PrecisionRelation,
  /** constant: {c}; proportional: {b}; linear: {a, b}; log-linear: {c, d} (lg = log10). */
  parameters: z.record(z.string(), z.number()),
  /** Fitted s at each level used, in level order. */
  fitted: z.array(z.number()),
  /** √(Σ((s − ŝ)/ŝ)²/(q − k)): relative residual SD; null when q ≤ k (no degrees of freedom). */
  relativeResidualSd: z.number().nullable(),
  degreesOfFreedom: z.number().int(),
  /** Human-readable equation with the numbers, e.g. "s_R = 0.012·m". */
  equation: z.string(),
});
export type PrecisionFitCandidate = z.infer<typeof PrecisionFitCandidate>;

/** The fitted level dependence of one SD (s_r or s_R) of one measurand. */
export const PrecisionFit = z.object({
  statistic: z.enum(['sr', 'sR']),
  /** Levels used (those with the SD and m̂ > 0), in level order. */
  itemCodes: z.array(z.string()),
  m: z.array(z.number()),
  s: z.array(z.number()),
  candidates: z.array(PrecisionFitCandidate),
  /** The relation chosen: smallest relative residual SD, the fewer parameters on a near tie. */
  chosen: PrecisionRelation.nullable(),
  note: z.string().nullable(),
});
export type PrecisionFit = z.infer<typeof PrecisionFit>;

export const PrecisionMeasurandResult = z.object({
  key: z.string(),
  label: z.string(),
  unit: z.string(),
  decimals: z.number().int(),
  replicatesRequired: z.number().int(),
  levels: z.array(PrecisionLevelResult),
  fit: z.object({ sr: PrecisionFit.nullable(), sR: PrecisionFit.nullable() }),
});
export type PrecisionMeasurandResult = z.infer<typeof PrecisionMeasurandResult>;

/** A flag on which the coordinator has not decided yet (Cochran or Grubbs, straggler or outlier). */
export const PrecisionPending = z.object({
  itemCode: z.string(),
  measurandKey: z.string(),
  participantCode: z.string(),
  test: PrecisionTest,
  classification: PrecisionClassification.exclude(['accepted']),
  suspectReplicate: z.number().int().nullable(),
});
export type PrecisionPending = z.infer<typeof PrecisionPending>;

/** Answer of `GET /rounds/{id}/precision` (and of every change). */
export const PrecisionAnalysis = z.object({
  round: PrecisionStudyInput.shape.round,
  decisionsOpen: z.boolean(),
  design: z.object({
    levels: z.number().int(),
    measurands: z.number().int(),
    /** Labs with at least one result. */
    participants: z.number().int(),
  }),
  measurands: z.array(PrecisionMeasurandResult),
  /** Decisions in force (newest per target, not withdrawn), newest first. */
  exclusions: z.array(PrecisionExclusion),
  /** Flags of Cochran and Grubbs without a decision in force. */
  pending: z.array(PrecisionPending),
  references: z.array(PrecisionReference),
  /** Standards the figures follow, for the page footer and the reports. */
  sources: z.array(z.string()),
});
export type PrecisionAnalysis = z.infer<typeof PrecisionAnalysis>;

// ---------------------------------------------------------------- σ_pt from a study

/** `GET /schemes/{id}/precision-sources`: the scheme's finished studies' s_R per level. */
export const PrecisionSigmaSources = z.object({
  studies: z.array(
    z.object({
      roundId: Id,
      roundCode: z.string(),
      title: z.string(),
      state: RoundState,
      measurands: z.array(
        z.object({
          key: z.string(),
          label: z.string(),
          unit: z.string(),
          levels: z.array(
            z.object({
              itemCode: z.string(),
              itemLabel: z.string(),
              mean: z.number().nullable(),
              sr: z.number().nullable(),
              sR: z.number().nullable(),
              p: z.number().int(),
            }),
          ),
        }),
      ),
    }),
  ),
});
export type PrecisionSigmaSources = z.infer<typeof PrecisionSigmaSources>;
