import * as z from 'zod';

/**
 * A lab's results for one round. Drafts may be partial (nulls while typing); submitting requires the
 * round's replicate count for every item × measurand (checked by the server with the round's rules).
 */
export const Uncertainty = z
  .object({
    /** 'standard' u(x), or 'expanded' U(x) = k·u(x). */
    kind: z.enum(['standard', 'expanded']),
    value: z.number().positive({ message: 'Uncertainty must be above 0.' }),
    k: z.number().min(1, { message: 'Coverage factor k must be at least 1.' }).max(10).nullable(),
  })
  .refine((u) => u.kind === 'standard' || u.k !== null, { message: 'Give the coverage factor k of an expanded uncertainty.', path: ['k'] });
export type Uncertainty = z.infer<typeof Uncertainty>;

export const MeasurandResult = z.object({
  measurandId: z.uuid(),
  /** One value per run; null while not yet typed. Units are the measurand's (nm for the Z-average). */
  replicates: z.array(z.number().finite().nullable()).max(20),
  uncertainty: Uncertainty.nullable().default(null),
});
export type MeasurandResult = z.infer<typeof MeasurandResult>;

export const MeasurementConditions = z.object({
  instrument: z.string().trim().max(200).default(''),
  laserWavelengthNm: z.number().min(200).max(2000).nullable().default(null),
  scatteringAngleDeg: z.number().gt(0).lt(180).nullable().default(null),
  temperatureC: z.number().min(-5).max(95).nullable().default(null),
  equilibrationMin: z.number().min(0).max(240).nullable().default(null),
  dispersant: z.string().trim().max(200).default('water'),
  viscosityMPas: z.number().gt(0).max(100).nullable().default(null),
  refractiveIndex: z.number().min(1).max(2.5).nullable().default(null),
  dilution: z.string().trim().max(200).default(''),
  filterPoreUm: z.number().gt(0).max(100).nullable().default(null),
  cuvette: z.string().trim().max(200).default(''),
});
export type MeasurementConditions = z.infer<typeof MeasurementConditions>;

export const ItemResults = z.object({
  testItemId: z.uuid(),
  results: z.array(MeasurandResult).max(20),
  conditions: MeasurementConditions.default(MeasurementConditions.parse({})),
  methodNotes: z.string().max(4000).default(''),
});
export type ItemResults = z.infer<typeof ItemResults>;

export const SubmissionData = z.object({
  items: z.array(ItemResults).max(20).default([]),
  /** Warning codes the lab has read and accepted (e.g. a blunder hint). */
  acknowledgedWarnings: z.array(z.string().max(100)).max(200).default([]),
  /** Why the lab submits despite a failed or missing instrument check, or late. */
  explanation: z.string().max(4000).default(''),
});
export type SubmissionData = z.infer<typeof SubmissionData>;
