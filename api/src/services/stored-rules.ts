/**
 * Parsers for JSON the database stores (jsonb columns): read through the shared zod schema,
 * leniently where rows written before a bound existed may break it today. A stored value is never
 * cast to its type; one that cannot be read at all answers 422 naming the record, never 500.
 */
import * as z from 'zod';
import {
  AssignedValueRuleInput as AssignedValueRuleSchema,
  SigmaPtRuleInput as SigmaPtRuleSchema,
} from '../../../shared/contracts/rules';
import {
  BoardGroup,
  BoardRow,
  ItemMeasurandEvaluation,
  ParticipantScore as ParticipantScoreSchema,
  ReplicateInputSchema,
  type ParticipantScore,
} from '../../../shared/contracts/evaluation';
import {
  InstrumentCheckRun as InstrumentCheckRunSchema,
  InstrumentCheckVerdict as InstrumentCheckVerdictSchema,
  Reanalysis as ReanalysisSchema,
  type InstrumentCheckRun,
  type InstrumentCheckVerdict,
  type Reanalysis,
} from '../../../shared/contracts/bench';
import { MeasurandInput, Study } from '../../../shared/contracts/rounds';

type SigmaPtRuleInput = z.infer<typeof SigmaPtRuleSchema>;
type AssignedValueRuleInput = z.infer<typeof AssignedValueRuleSchema>;
import { ruleBroken } from './errors';

const finite = z.number().refine(Number.isFinite);

/** The shapes of the σ_pt rule without today's bounds (rows stored before a bound tightened). */
const StoredSigmaPtRule: z.ZodType<SigmaPtRuleInput> = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('fixed'), value: finite }),
  z.object({ kind: z.literal('percent'), percent: finite }),
  z.object({ kind: z.literal('robust-sd') }),
  z.object({
    kind: z.literal('precision'),
    sigmaR: finite,
    sigmaRepeatability: finite.optional(),
    replicates: z.number().int().optional(),
    source: z.string().optional(),
    study: z.object({ roundId: z.string(), roundCode: z.string() }).optional(),
  }),
]);

/** The shapes of the assigned-value rule without today's bounds. */
const StoredAssignedValueRule: z.ZodType<AssignedValueRuleInput> = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('consensus') }),
  z.object({ kind: z.literal('median') }),
  z.object({ kind: z.literal('reference'), value: finite, u: finite, source: z.string() }),
]);

function lenient<T>(strict: z.ZodType<T>, loose: z.ZodType<T>, raw: unknown): T | null {
  const s = strict.safeParse(raw);
  if (s.success) return s.data;
  const l = loose.safeParse(raw);
  return l.success ? l.data : null;
}

/** A measurand's stored σ_pt rule; `what` names it in the 422 when it cannot be read. */
export function storedSigmaPtRule(raw: unknown, what: string): SigmaPtRuleInput {
  const rule = lenient(SigmaPtRuleSchema, StoredSigmaPtRule, raw);
  if (rule) return rule;
  throw ruleBroken(
    'stored_rule_unreadable',
    `${what}: the stored σ_pt rule cannot be read; set it again on the Round desk.`,
  );
}

/** A measurand's stored assigned-value rule; `what` names it in the 422 when it cannot be read. */
export function storedAssignedValueRule(raw: unknown, what: string): AssignedValueRuleInput {
  const rule = lenient(AssignedValueRuleSchema, StoredAssignedValueRule, raw);
  if (rule) return rule;
  throw ruleBroken(
    'stored_rule_unreadable',
    `${what}: the stored assigned-value rule cannot be read; set it again on the Round desk.`,
  );
}

/** Both stored rules of a measurand row. */
export function measurandRules(m: {
  key: string;
  sigmaPtRule: unknown;
  assignedValueRule: unknown;
}): { sigmaPtRule: SigmaPtRuleInput; assignedValueRule: AssignedValueRuleInput } {
  return {
    sigmaPtRule: storedSigmaPtRule(m.sigmaPtRule, `Measurand ${m.key}`),
    assignedValueRule: storedAssignedValueRule(m.assignedValueRule, `Measurand ${m.key}`),
  };
}

/** One lab's entry of an evaluation result's stored `participants`; `what` names it in the 422. */
export function storedParticipantScore(raw: unknown, what: string): ParticipantScore {
  const r = ParticipantScoreSchema.safeParse(raw);
  if (r.success) return r.data;
  throw resultUnreadable(`${what}: the stored score`);
}

const resultUnreadable = (what: string) =>
  ruleBroken(
    'stored_result_unreadable',
    `${what} cannot be read; ask the coordinator to evaluate the round again.`,
  );

/** The jsonb and free-text columns of a stored evaluation result, as the shared contract reads them. */
const StoredResult = z.object({
  method: ItemMeasurandEvaluation.shape.method,
  constants: ItemMeasurandEvaluation.shape.constants,
  participants: ItemMeasurandEvaluation.shape.participants,
  inputs: z.array(ReplicateInputSchema),
});

/** One evaluation result's method, constants, scores and inputs; `what` names it in the 422. */
export function storedResult(
  row: { method: unknown; constants: unknown; participants: unknown; inputs: unknown },
  what: string,
): z.infer<typeof StoredResult> {
  const r = StoredResult.safeParse(row);
  if (r.success) return r.data;
  throw resultUnreadable(`${what}: the stored result`);
}

/** The display constants an evaluation result stores (`constants` jsonb); missing ones stay absent. */
const StoredConstants = z.object({
  measurandName: z.string().optional().catch(undefined),
  unit: z.string().optional().catch(undefined),
  decimals: z.number().int().optional().catch(undefined),
});

export function storedConstants(raw: unknown): z.infer<typeof StoredConstants> {
  const r = StoredConstants.safeParse(raw);
  return r.success ? r.data : {};
}

/** One stored run of an instrument check without today's bounds (rows stored before a bound). */
const StoredCheckRun = z.object({
  zAverageNm: finite,
  pdi: finite,
  temperatureC: finite,
  equilibrationMin: finite,
});

/** An instrument check's stored `runs` and `verdict`; `what` names the check in the 422. */
export function storedInstrumentCheck(
  row: { runs: unknown; verdict: unknown },
  what: string,
): { runs: InstrumentCheckRun[]; verdict: InstrumentCheckVerdict } {
  const runs = lenient(z.array(InstrumentCheckRunSchema), z.array(StoredCheckRun), row.runs);
  const verdict = InstrumentCheckVerdictSchema.safeParse(row.verdict);
  if (runs && verdict.success) return { runs, verdict: verdict.data };
  throw unreadable(what);
}

/** An attachment's stored re-analysis (null when none was made); `what` names it in the 422. */
export function storedReanalysis(raw: unknown, what: string): Reanalysis | null {
  if (raw === null || raw === undefined) return null;
  const r = ReanalysisSchema.safeParse(raw);
  if (r.success) return r.data;
  throw unreadable(what);
}

const unreadable = (what: string) =>
  ruleBroken('stored_record_unreadable', `${what}: the stored record cannot be read.`);

/** The codes-only board an evaluation stores (`board` jsonb; `{}` before it was computed). */
const StoredBoard = z.object({
  groups: z.array(BoardGroup).default([]),
  rows: z.array(BoardRow).default([]),
});

/** An evaluation's stored board (empty when none is stored); `what` names it in the 422. */
export function storedBoard(raw: unknown, what: string): z.infer<typeof StoredBoard> {
  const r = StoredBoard.safeParse(raw ?? {});
  if (r.success) return r.data;
  throw ruleBroken(
    'stored_result_unreadable',
    `${what}: the stored board cannot be read; ask the coordinator to evaluate the round again.`,
  );
}

/** A homogeneity or stability study's stored `result` (the stats engine's object); `what` names it. */
export function storedStudyResult(raw: unknown, what: string): Record<string, unknown> {
  const r = Study.shape.result.safeParse(raw);
  if (r.success) return r.data;
  throw unreadable(what);
}

/** A scheme's default measurand without today's bounds (templates stored before a bound). */
const StoredDefaultMeasurand: z.ZodType<z.output<typeof MeasurandInput>> = z.object({
  key: z.string(),
  name: z.string(),
  unit: z.string(),
  decimals: z.number().int(),
  replicatesRequired: z.number().int(),
  sigmaPtRule: StoredSigmaPtRule.default({ kind: 'robust-sd' }),
  assignedValueRule: StoredAssignedValueRule.default({ kind: 'consensus' }),
  minParticipants: z.number().int().default(12),
});

/** A scheme's stored `defaultMeasurands` (the templates new rounds start from); `what` names it. */
export function storedDefaultMeasurands(
  raw: unknown,
  what: string,
): z.output<typeof MeasurandInput>[] {
  const list = lenient(z.array(MeasurandInput), z.array(StoredDefaultMeasurand), raw);
  if (list) return list;
  throw unreadable(what);
}
