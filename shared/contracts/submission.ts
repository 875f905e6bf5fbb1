import * as z from 'zod';
import {
  boundedNumber,
  firstDuplicate,
  multiLine,
  RANGES,
  singleLine,
  UNCERTAINTY_MAX_RATIO,
} from './ranges';

/**
 * A lab's results for one round. Drafts may be partial (nulls while typing); submitting requires the
 * round's replicate count for every item × measurand (checked by the server with the round's rules).
 * Every number has the plausible range of shared/contracts/ranges.ts; an item named twice, or a
 * measurand named twice within an item, is refused (it would count as an extra participant).
 */
export const UncertaintyKind = z.enum(['standard', 'expanded']);

/** An uncertainty as stored and evaluated (no ranges: what was accepted once stays readable). */
export const StoredUncertainty = z.object({
  kind: UncertaintyKind,
  value: z.number(),
  k: z.number().nullable(),
});

export const Uncertainty = z
  .object({
    /** 'standard' u(x), or 'expanded' U(x) = k·u(x). */
    kind: UncertaintyKind,
    value: boundedNumber('uncertainty'),
    k: boundedNumber('coverageFactor').nullable(),
  })
  .refine((u) => u.kind === 'standard' || u.k !== null, {
    message: 'Give the coverage factor k of an expanded uncertainty.',
    path: ['k'],
  });
export type Uncertainty = z.infer<typeof Uncertainty>;

export const MeasurandResult = z
  .object({
    measurandId: z.uuid(),
    /** One value per replicate; null while not yet typed. Units are the measurand's (nm for the Z-average). */
    replicates: z.array(boundedNumber('measuredValue', { label: 'Replicate' }).nullable()).max(20),
    uncertainty: Uncertainty.nullable().default(null),
  })
  .superRefine((r, ctx) => {
    // An uncertainty far above the result is a typing error (UNCERTAINTY_MAX_RATIO, common practice).
    const values = r.replicates.filter((v): v is number => typeof v === 'number');
    if (!r.uncertainty || values.length === 0) return;
    const scale = Math.max(...values.map((v) => Math.abs(v)));
    if (scale > 0 && r.uncertainty.value > UNCERTAINTY_MAX_RATIO * scale) {
      ctx.addIssue({
        code: 'custom',
        path: ['uncertainty', 'value'],
        message: `The uncertainty is more than ${UNCERTAINTY_MAX_RATIO} times the result; check its unit.`,
      });
    }
  });
export type MeasurandResult = z.infer<typeof MeasurandResult>;

export const MeasurementConditions = z.object({
  instrument: singleLine(200).default(''),
  laserWavelengthNm: boundedNumber('laserWavelengthNm').nullable().default(null),
  scatteringAngleDeg: boundedNumber('scatteringAngleDeg').nullable().default(null),
  temperatureC: boundedNumber('temperatureC').nullable().default(null),
  equilibrationMin: boundedNumber('equilibrationMin').nullable().default(null),
  dispersant: singleLine(200).default('water'),
  viscosityMPas: boundedNumber('viscosityMPas').nullable().default(null),
  refractiveIndex: boundedNumber('refractiveIndex').nullable().default(null),
  dilution: singleLine(200).default(''),
  filterPoreUm: boundedNumber('filterPoreUm').nullable().default(null),
  cuvette: singleLine(200).default(''),
});
export type MeasurementConditions = z.infer<typeof MeasurementConditions>;

export const ItemResults = z
  .object({
    testItemId: z.uuid(),
    results: z.array(MeasurandResult).max(20),
    conditions: MeasurementConditions.default(MeasurementConditions.parse({})),
    methodNotes: multiLine(4000).default(''),
  })
  .superRefine((it, ctx) => {
    const dup = firstDuplicate(it.results, (r) => r.measurandId);
    if (dup) {
      ctx.addIssue({
        code: 'custom',
        path: ['results', dup.index, 'measurandId'],
        message: 'This measurand is already given for the item; give each measurand once.',
      });
    }
  });
export type ItemResults = z.infer<typeof ItemResults>;

export const SubmissionData = z
  .object({
    items: z.array(ItemResults).max(20).default([]),
    /** Warning codes the lab has read and accepted (e.g. a blunder hint). */
    acknowledgedWarnings: z.array(singleLine(100)).max(200).default([]),
    /** Why the lab submits despite a failed or missing instrument check, or late. */
    explanation: multiLine(4000).default(''),
  })
  .superRefine((d, ctx) => {
    const dup = firstDuplicate(d.items, (i) => i.testItemId);
    if (dup) {
      ctx.addIssue({
        code: 'custom',
        path: ['items', dup.index, 'testItemId'],
        message: 'This test item is already given; give each item once.',
      });
    }
  });
export type SubmissionData = z.infer<typeof SubmissionData>;

/** The range a replicate of a measurand must fall in at submit, by its unit or key (null: the general bound). */
export function replicateRange(m: {
  key: string;
  unit: string;
}): (typeof RANGES)[keyof typeof RANGES] | null {
  if (m.unit === 'nm') return RANGES.diameterNm;
  if (m.key === 'pdi') return RANGES.pdi;
  return null;
}

// ---------------------------------------------------------------- stored data

const StoredMeasurandResult = z.object({
  measurandId: z.string(),
  replicates: z.array(z.number().nullable()).default([]),
  uncertainty: StoredUncertainty.nullable().default(null),
});

/**
 * The results as stored (answers of the API): the same shape without the ranges and duplicate
 * checks, so data saved before a bound existed can still be read, shown and corrected.
 */
export const StoredSubmissionData = z.object({
  items: z
    .array(
      z.object({
        testItemId: z.string(),
        results: z.array(StoredMeasurandResult).default([]),
        conditions: z
          .object({
            instrument: z.string().default(''),
            laserWavelengthNm: z.number().nullable().default(null),
            scatteringAngleDeg: z.number().nullable().default(null),
            temperatureC: z.number().nullable().default(null),
            equilibrationMin: z.number().nullable().default(null),
            dispersant: z.string().default('water'),
            viscosityMPas: z.number().nullable().default(null),
            refractiveIndex: z.number().nullable().default(null),
            dilution: z.string().default(''),
            filterPoreUm: z.number().nullable().default(null),
            cuvette: z.string().default(''),
          })
          .default(MeasurementConditions.parse({})),
        methodNotes: z.string().default(''),
      }),
    )
    .default([]),
  acknowledgedWarnings: z.array(z.string()).default([]),
  explanation: z.string().default(''),
}) satisfies z.ZodType<SubmissionData, unknown>;

/** Reads stored results leniently (see StoredSubmissionData); anything unreadable becomes empty. */
export function readStoredSubmission(raw: unknown): SubmissionData {
  const strict = SubmissionData.safeParse(raw ?? {});
  if (strict.success) return strict.data;
  const loose = StoredSubmissionData.safeParse(raw ?? {});
  return loose.success ? loose.data : StoredSubmissionData.parse({});
}
