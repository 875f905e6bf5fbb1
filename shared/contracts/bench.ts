import * as z from 'zod';
import { Id, Timestamp } from './common';
import { boundedNumber, boundedTimestamp, dateOnly, multiLine, singleLine } from './ranges';
import { RoundState } from './round-states';
import { Measurand, RoundKind, TestItem } from './rounds';
import { StoredSubmissionData, SubmissionData } from './submission';

/** The lab a multi-lab user acts for: `?labId=` or the `x-lab-id` header (checked against memberships). */
export const LabQuery = z.object({ labId: Id.optional() });
export type LabQuery = z.infer<typeof LabQuery>;

export const RoundIdParams = z.object({ id: Id });
export const AttachmentParams = z.object({ id: Id, attachmentId: Id });

// ---------------------------------------------------------------- dashboard

/** Where a round stands for this lab (dashboard column). */
export const MyRoundStatus = z.enum([
  'invited',
  'enrolled',
  'due-soon',
  'submitted',
  'locked',
  'published',
  'withdrawn',
]);
export type MyRoundStatus = z.infer<typeof MyRoundStatus>;

export const MyRound = z.object({
  roundId: Id,
  code: z.string(),
  title: z.string(),
  /** 'precision': an ISO 5725-2 precision study (no scores for labs; the web says "Precision study"). */
  kind: RoundKind,
  state: RoundState,
  status: MyRoundStatus,
  participantCode: z.string().nullable(),
  resultsDueAt: Timestamp.nullable(),
  extensionUntil: Timestamp.nullable(),
  /** The later of the due date and the extension: when results lock. */
  locksAt: Timestamp.nullable(),
  submittedVersion: z.number().int(),
  submittedAt: Timestamp.nullable(),
});
export type MyRound = z.infer<typeof MyRound>;

// ---------------------------------------------------------------- round detail

/** A test item as the lab sees it: the Round desk's item without its round and position. */
export const BenchItem = TestItem.omit({ roundId: true, position: true });
export type BenchItem = z.infer<typeof BenchItem>;

/** A measurand as the lab sees it: what to report and how (no σ_pt or assigned-value rule). */
export const BenchMeasurand = Measurand.pick({
  id: true,
  key: true,
  name: true,
  unit: true,
  decimals: true,
  replicatesRequired: true,
});
export type BenchMeasurand = z.infer<typeof BenchMeasurand>;

export const ShipmentCondition = z.enum(['intact', 'damaged', 'leaked', 'arrived-warm']);
export type ShipmentCondition = z.infer<typeof ShipmentCondition>;
/** What a person reads for a parcel's condition on arrival. */
export const SHIPMENT_CONDITION_LABELS: Record<ShipmentCondition, string> = {
  intact: 'Intact',
  damaged: 'Damaged',
  leaked: 'Leaked',
  'arrived-warm': 'Arrived warm',
};
/** Conditions that call for the damaged-parcel cautions (shared/contracts/safety.ts). */
export const DAMAGED_CONDITIONS: readonly ShipmentCondition[] = ['damaged', 'leaked'];

export const Receipt = z.object({
  dispatchedOn: z.iso.date().nullable(),
  receivedOn: z.iso.date().nullable(),
  condition: ShipmentCondition.nullable(),
  notes: z.string().nullable(),
  hasPhoto: z.boolean(),
});
export type Receipt = z.infer<typeof Receipt>;

/** PUT /rounds/{id}/receipt (JSON or multipart with an optional `photo` file). */
export const ReceiptInput = z.object({
  receivedOn: dateOnly('Date of arrival'),
  condition: ShipmentCondition,
  notes: multiLine(2000, { trim: true }).default(''),
});
export type ReceiptInput = z.infer<typeof ReceiptInput>;

export { SAFETY_CAUTIONS } from './safety';

/** Where a lab's results for a round stand: nothing saved, a draft, or submitted. */
export const SubmissionStage = z.enum(['none', 'draft', 'submitted']);

export const SubmissionState = z.object({
  state: SubmissionStage,
  currentVersion: z.number().int(),
  submittedAt: Timestamp.nullable(),
  draftRevision: z.number().int(),
});

export const MyRoundDetail = MyRound.extend({
  instructions: z.string(),
  safetyCautions: z.array(z.string()),
  protocolTemperatureC: z.number(),
  acceptsResults: z.boolean(),
  isLocked: z.boolean(),
  items: z.array(BenchItem),
  measurands: z.array(BenchMeasurand),
  receipt: Receipt.nullable(),
  submission: SubmissionState,
});
export type MyRoundDetail = z.infer<typeof MyRoundDetail>;

// ---------------------------------------------------------------- instrument check

export const InstrumentCheckRun = z.object({
  zAverageNm: boundedNumber('diameterNm', { label: 'Z-average' }),
  pdi: boundedNumber('pdi'),
  temperatureC: boundedNumber('temperatureC'),
  equilibrationMin: boundedNumber('equilibrationMin'),
});
export type InstrumentCheckRun = z.infer<typeof InstrumentCheckRun>;

export const InstrumentCheckInput = z.object({
  instrument: singleLine(200, { min: 1, required: 'Name the instrument.' }),
  material: singleLine(200, { min: 1, required: 'Name the reference material.' }),
  referenceValueNm: boundedNumber('diameterNm', { label: 'Reference value' }),
  toleranceNm: boundedNumber('toleranceNm'),
  pdiLimit: boundedNumber('pdiLimit'),
  setPointC: boundedNumber('temperatureC', { label: 'Set-point temperature' }),
  temperatureToleranceC: boundedNumber('temperatureToleranceC'),
  minEquilibrationMin: boundedNumber('equilibrationMin', { label: 'Minimum equilibration time' }),
  runs: z.array(InstrumentCheckRun).min(3, { message: 'Record at least three runs.' }).max(20),
  checkedAt: boundedTimestamp('Time of the check').optional(),
  notes: multiLine(2000, { trim: true }).default(''),
});
export type InstrumentCheckInput = z.infer<typeof InstrumentCheckInput>;

export const InstrumentCheckReason = z.object({ code: z.string(), message: z.string() });
export const InstrumentCheckVerdict = z.object({
  passed: z.boolean(),
  meanZAverageNm: z.number(),
  meanPdi: z.number(),
  maxPdi: z.number(),
  /** Every failed criterion (empty when passed). */
  reasons: z.array(InstrumentCheckReason),
});
export type InstrumentCheckVerdict = z.infer<typeof InstrumentCheckVerdict>;

export const InstrumentCheck = InstrumentCheckInput.omit({ checkedAt: true }).extend({
  id: Id,
  checkedAt: Timestamp,
  recordedBy: z.string().nullable(),
  verdict: InstrumentCheckVerdict,
});
export type InstrumentCheck = z.infer<typeof InstrumentCheck>;

export const InstrumentCheckQuery = LabQuery.extend({ instrument: singleLine(200).optional() });

// ---------------------------------------------------------------- submission

export const DraftSave = z.object({
  data: SubmissionData,
  /** The revision this draft was based on (0 for the first save): a mismatch answers 409. */
  baseRevision: z.number().int().min(0).max(1_000_000_000),
});
export type DraftSave = z.infer<typeof DraftSave>;

export const DraftSaved = z.object({ draftRevision: z.number().int(), savedAt: Timestamp });
export type DraftSaved = z.infer<typeof DraftSaved>;

export const SubmissionVersionDto = z.object({
  version: z.number().int(),
  data: StoredSubmissionData,
  submittedAt: Timestamp,
  submittedBy: z.string().nullable(),
  note: z.string().nullable(),
  isLate: z.boolean(),
});
export type SubmissionVersionDto = z.infer<typeof SubmissionVersionDto>;

export const SubmissionView = z.object({
  state: SubmissionStage,
  draft: StoredSubmissionData,
  draftRevision: z.number().int(),
  savedAt: Timestamp.nullable(),
  currentVersion: z.number().int(),
  isLocked: z.boolean(),
  locksAt: Timestamp.nullable(),
  versions: z.array(SubmissionVersionDto),
});
export type SubmissionView = z.infer<typeof SubmissionView>;

export const SubmitRequest = z.object({
  /** A key the client makes once per submit intent (e.g. a UUID); a retry with it returns the same version. */
  idempotencyKey: singleLine(100, { min: 8 }),
  /** The results to submit; omitted means the saved draft. */
  data: SubmissionData.optional(),
  /** For an amendment: what changed and why. */
  note: multiLine(2000, { trim: true }).optional(),
});
export type SubmitRequest = z.infer<typeof SubmitRequest>;

export const SubmitResult = z.object({
  version: SubmissionVersionDto,
  /** True when this request replayed an earlier submit with the same key. */
  replayed: z.boolean(),
});
export type SubmitResult = z.infer<typeof SubmitResult>;

// ---------------------------------------------------------------- attachments

export const Reanalysis = z.object({
  ok: z.boolean(),
  /** Why the file could not be analysed (when ok is false). */
  error: z.string().nullable(),
  zAverageNm: z.number().nullable(),
  pdi: z.number().nullable(),
  labZAverageNm: z.number().nullable(),
  labPdi: z.number().nullable(),
  disagrees: z.boolean(),
  messages: z.array(z.string()),
  /**
   * Which of `parameters` were assumed because neither the upload nor the item's conditions gave
   * them (older stored analyses lack the list).
   */
  assumed: z
    .array(z.enum(['temperatureC', 'viscosityMPas', 'refractiveIndex', 'wavelengthNm', 'angleDeg']))
    .default([]),
  /** The physics the fit used (from the upload's fields, the item's conditions, defaults where missing). */
  parameters: z.object({
    temperatureC: z.number(),
    viscosityMPas: z.number(),
    refractiveIndex: z.number(),
    wavelengthNm: z.number(),
    angleDeg: z.number(),
  }),
});
export type Reanalysis = z.infer<typeof Reanalysis>;

export const AttachmentKind = z.enum(['correlation-csv', 'text', 'pdf', 'xlsx']);
export const AttachmentDto = z.object({
  id: Id,
  fileName: z.string(),
  contentType: z.string(),
  kind: AttachmentKind,
  sizeBytes: z.number().int(),
  sha256: z.string(),
  testItemId: Id.nullable(),
  uploadedBy: z.string().nullable(),
  uploadedAt: Timestamp,
  reanalysis: Reanalysis.nullable(),
});
export type AttachmentDto = z.infer<typeof AttachmentDto>;

/** Multipart fields beside the `file` part. */
export const AttachmentUploadFields = LabQuery.extend({
  testItemId: Id.optional(),
  /** For the re-analysis of a correlation CSV: this file's laser wavelength (else the item's conditions, else 633 nm). */
  laserWavelengthNm: z.coerce.number().min(200).max(2000).optional(),
  /** For the re-analysis of a correlation CSV: this file's scattering angle (else the item's conditions, else 173°). */
  scatteringAngleDeg: z.coerce.number().gt(0).lt(180).optional(),
});
/** What the re-analysis assumes when neither the upload nor the item's conditions say (common practice for DLS instruments). */
export const REANALYSIS_DEFAULTS = { wavelengthNm: 633, angleDeg: 173 } as const;

/** 20 MB per uploaded file. */
export const MAX_ATTACHMENT_BYTES = 20 * 1024 * 1024;

// ---------------------------------------------------------------- bulk entry

export const SheetIssue = z.object({
  sheet: z.string(),
  row: z.number().int(),
  column: z.string(),
  message: z.string(),
});
export type SheetIssue = z.infer<typeof SheetIssue>;

export const WorkbookUploadResult = z.object({
  draftRevision: z.number().int(),
  data: StoredSubmissionData,
  warnings: z.array(z.object({ code: z.string(), path: z.string(), message: z.string() })),
});
export type WorkbookUploadResult = z.infer<typeof WorkbookUploadResult>;
