import type * as z from 'zod';
import type {
  EvaluationView,
  Exclusion,
  ItemMeasurandEvaluation,
  SigmaPtOverride,
  SigmaPtRuleInput,
} from '@ringlet/shared/contracts/evaluation';
import { evaluateRecord, type ReplicateInput } from '@ringlet/shared/evaluation/evaluate';
import { fieldLabel } from '../../core/problem';

/** The settings on screen: σ_pt rules and exclusions. */
export interface EvaluationSettings {
  sigmaPtOverrides: SigmaPtOverride[];
  exclusions: Exclusion[];
}

export type SignalCounts = { acceptable: number; warning: number; action: number };

/** How many participants of a group carry each signal. */
export function signalCounts(r: ItemMeasurandEvaluation): SignalCounts {
  const c = { acceptable: 0, warning: 0, action: 0 };
  for (const p of r.participants) if (p.signal) c[p.signal]++;
  return c;
}

/** A number with d decimals (0…8), or a dash when there is none. */
export function fix(v: number | null, d: number): string {
  return v === null ? '—' : v.toFixed(Math.min(8, Math.max(0, d)));
}

/** The stored replicates as the shared engine reads them. */
export function replicatesOf(v: EvaluationView): ReplicateInput[] {
  return v.inputs.flatMap((g) =>
    g.rows.map((r) => ({
      code: r.code,
      testItemId: g.testItemId,
      measurandId: g.measurandId,
      values: r.values,
      uncertainty: r.uncertainty,
    })),
  );
}

/** The live preview: the shared engine on the stored replicates with the settings on screen. */
export function previewOf(v: EvaluationView, settings: EvaluationSettings) {
  return evaluateRecord({
    items: v.items,
    measurands: v.measurands,
    replicates: replicatesOf(v),
    settings,
  });
}

/** Whether the settings on screen differ from the stored ones. */
export function isDirty(v: EvaluationView, settings: EvaluationSettings): boolean {
  return JSON.stringify(v.settings) !== JSON.stringify(settings);
}

/** Signals that change against the stored version ("P01 A/z_average: warning → action"), 50 at most. */
export function signalChanges(v: EvaluationView, preview: ItemMeasurandEvaluation[]): string[] {
  const out: string[] = [];
  preview.forEach((r, gi) => {
    const stored = new Map(v.results[gi]?.participants.map((p) => [p.code, p.signal]) ?? []);
    for (const p of r.participants) {
      const was = stored.get(p.code);
      if (was !== undefined && was !== p.signal)
        out.push(`${p.code} ${r.itemCode}/${r.measurandKey}: ${was ?? '—'} → ${p.signal ?? '—'}`);
    }
  });
  return out.slice(0, 50);
}

/** Whether σ_pt or x_pt of a group differs from the stored version. */
export function groupChanged(
  preview: ItemMeasurandEvaluation | undefined,
  stored: Pick<ItemMeasurandEvaluation, 'sigmaPt' | 'assignedValue'> | undefined,
): boolean {
  return (
    !!preview &&
    !!stored &&
    (preview.sigmaPt !== stored.sigmaPt || preview.assignedValue !== stored.assignedValue)
  );
}

/** A published round, or one left in Reissued without an approved new version, is corrected here. */
export function canReissue(v: Pick<EvaluationView, 'roundState' | 'state'> | null): boolean {
  return (
    !!v &&
    (v.roundState === 'published' || (v.roundState === 'reissued' && v.state !== 'committed'))
  );
}

/** The σ_pt rule the form describes. */
export function overrideRule(
  kind: 'robust-sd' | 'percent' | 'fixed',
  value: number | null,
): SigmaPtRuleInput {
  if (kind === 'robust-sd') return { kind: 'robust-sd' };
  if (kind === 'percent') return { kind: 'percent', percent: Number(value) };
  return { kind: 'fixed', value: Number(value) };
}

/** A new rule replaces the one for the same measurand and item. */
export function withOverride(list: SigmaPtOverride[], o: SigmaPtOverride): SigmaPtOverride[] {
  return [
    ...list.filter((x) => !(x.measurandKey === o.measurandKey && x.itemCode === o.itemCode)),
    o,
  ];
}

/** The first issue of a failed parse as one line naming the field. */
export function firstIssue(error: z.ZodError, what: string, fallback: string): string {
  const i = error.issues[0];
  return `${i?.path.length ? fieldLabel(i.path.map(String).join('.')) : what}: ${i?.message ?? fallback}`;
}
