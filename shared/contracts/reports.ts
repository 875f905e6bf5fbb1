import * as z from 'zod';
import { Id } from './common';
import { InvestigationDto } from './evaluation';

/**
 * Reports: round workbook and PDF, individual report, certificate, evidence pack, their build
 * status, and what an assessor reads of the labs that granted access.
 */
export const REPORT_KINDS = [
  'round.xlsx',
  'round.pdf',
  'participant.pdf',
  'certificate.pdf',
  'evidence.zip',
] as const;
export const ReportKind = z.enum(REPORT_KINDS);
export type ReportKind = z.infer<typeof ReportKind>;

/** A report file's build: answered with 202 while a large round's file is built in the background. */
export const ReportStatus = z.object({
  id: Id,
  kind: ReportKind,
  roundId: Id.nullable(),
  evaluationVersion: z.number().int().nullable(),
  status: z.enum(['queued', 'running', 'done', 'failed']),
  /** 0–100. */
  progress: z.number().int().min(0).max(100),
  sha256: z.string().nullable(),
  sizeBytes: z.number().int().nullable(),
  error: z.string().nullable(),
  /** Where the file is fetched once done (same URL as the request that started it). */
  downloadUrl: z.string(),
});
export type ReportStatus = z.infer<typeof ReportStatus>;

export const ReportIdParams = z.object({ reportId: Id });
/** Lab-specific files: which of the caller's labs (or, for an assessor, which granting lab). */
export const ReportLabQuery = z.object({ labId: Id.optional() });

export const AssessorLab = z.object({
  id: Id,
  name: z.string(),
  startsOn: z.string(),
  endsOn: z.string().nullable(),
});
export type AssessorLab = z.infer<typeof AssessorLab>;

export const AssessorRound = z.object({
  roundId: Id,
  roundCode: z.string(),
  roundTitle: z.string(),
  roundState: z.string(),
  participantCode: z.string(),
  /** The newest published evaluation (null: not published yet, no reports). */
  version: z.number().int().nullable(),
  publishedAt: z.string().nullable(),
  reissueReason: z.string().nullable(),
  warnings: z.number().int(),
  actions: z.number().int(),
});
export type AssessorRound = z.infer<typeof AssessorRound>;

/** A lab's investigation as its assessor reads it (the cause category as stored). */
export const AssessorInvestigation = InvestigationDto.pick({
  id: true,
  roundCode: true,
  participantCode: true,
  itemCode: true,
  measurandName: true,
  scoreKind: true,
  score: true,
  signal: true,
  state: true,
  causeCategory: true,
  rootCause: true,
  correctiveAction: true,
  effectivenessCheck: true,
  closedAt: true,
  createdAt: true,
}).extend({ causeCategory: z.string().nullable() });
export type AssessorInvestigation = z.infer<typeof AssessorInvestigation>;

export const AssessorInstrumentCheck = z.object({
  id: Id,
  instrument: z.string(),
  material: z.string(),
  referenceValueNm: z.number(),
  toleranceNm: z.number(),
  passed: z.boolean(),
  notes: z.string(),
  checkedAt: z.string(),
});
export type AssessorInstrumentCheck = z.infer<typeof AssessorInstrumentCheck>;

export const AssessorLabDetail = z.object({
  lab: AssessorLab,
  rounds: z.array(AssessorRound),
  investigations: z.array(AssessorInvestigation),
  instrumentChecks: z.array(AssessorInstrumentCheck),
});
export type AssessorLabDetail = z.infer<typeof AssessorLabDetail>;

/** The evidence pack's manifest.json. */
export const EvidenceManifest = z.object({
  lab: z.string(),
  generatedAt: z.string(),
  generatedFor: z.string(),
  files: z.array(z.object({ path: z.string(), sha256: z.string(), bytes: z.number().int() })),
});
export type EvidenceManifest = z.infer<typeof EvidenceManifest>;
