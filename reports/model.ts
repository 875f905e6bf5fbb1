/**
 * What the report builders read: plain data gathered by the API's report service from the
 * stored round and its stored evaluation (never recomputed here). Units: every value, u and
 * σ_pt in the unit of its measurand; scores dimensionless. Lab names appear only where a
 * lab's own file needs its own name (individual report, certificate); the round files carry
 * participant codes only.
 */
import { createHash } from 'node:crypto';
import type { ItemMeasurandEvaluation, TrackSeries } from '../shared/contracts/evaluation';

export interface ReportRound {
  id: string;
  code: string;
  title: string;
  kind: 'pt' | 'precision';
  state: string;
  schemeCode: string;
  schemeName: string;
  schemeDescription: string;
  instructions: string;
  protocolTemperatureC: number;
  resultsDueAt: string | null;
  /** When the test items were dispatched (the round's move to in transit), else the planned date. */
  dispatchedAt: string | null;
  dispatchPlanned: boolean;
}

/** The PT provider as printed on the cover and in the footer (ISO/IEC 17043 §7.4, from memory). */
export interface ReportProviderInfo {
  name: string;
  address: string;
  contactEmail: string;
  contactPhone: string;
  website: string;
  accreditationBody: string;
  accreditationNumber: string;
  authoriserName: string;
  authoriserRole: string;
  subcontracting: string;
  logo: { type: 'image/png' | 'image/jpeg'; data: Buffer } | null;
}

/** A participant that enrolled but has no result in the evaluation. */
export interface ReportNonReporter {
  code: string;
  withdrawn: boolean;
}

export interface ReportItem {
  id: string;
  code: string;
  material: string;
  nominalSizeNm: number | null;
  storageNotes: string;
  handlingNotes: string;
}

export interface ReportMeasurand {
  id: string;
  key: string;
  name: string;
  unit: string;
  decimals: number;
  replicatesRequired: number;
}

/** A homogeneity (ISO 13528 B.2) or stability (B.5) study as stored by the Round desk. */
export interface ReportStudy {
  itemCode: string;
  measurandKey: string;
  kind: 'homogeneity' | 'stability';
  sigmaPt: number;
  passes: boolean;
  decision: string | null;
  decisionReason: string | null;
  /** shared/stats HomogeneityResult or StabilityResult as stored. */
  result: Record<string, unknown>;
}

export interface ReportEvaluation {
  id: string;
  version: number;
  state: 'draft' | 'committed' | 'published';
  publishedAt: string | null;
  computedAt: string;
  reissueReason: string | null;
  softwareVersion: string;
  /** The coordinator's comments on the round ('' for none). */
  comments: string;
}

/** One stored item × measurand result with the replicates it was computed from, by code. */
export interface ReportGroup extends ItemMeasurandEvaluation {
  replicates: Record<string, number[]>;
}

export interface RoundReportInput {
  round: ReportRound;
  items: ReportItem[];
  measurands: ReportMeasurand[];
  studies: ReportStudy[];
  evaluation: ReportEvaluation;
  groups: ReportGroup[];
  provider: ReportProviderInfo;
  /** Enrolled participant codes without a result in this evaluation. */
  nonReporters: ReportNonReporter[];
  /** When the file was made (ISO 8601 UTC). */
  generatedAt: string;
}

export const NO_PROVIDER: ReportProviderInfo = {
  name: '',
  address: '',
  contactEmail: '',
  contactPhone: '',
  website: '',
  accreditationBody: '',
  accreditationNumber: '',
  authoriserName: '',
  authoriserRole: '',
  subcontracting: '',
  logo: null,
};

/** The report's status as ISO/IEC 17043 asks it to be stated: final, corrected (replacing a version) or a preview. */
export function reportStatusWords(e: ReportEvaluation): string {
  if (e.state !== 'published')
    return `Preview (evaluation ${e.state === 'committed' ? 'approved for publication' : 'draft'}, not issued)`;
  if (e.version > 1 || e.reissueReason)
    return `Corrected report: version ${e.version}, replaces version ${e.version - 1}`;
  return `Final report, version ${e.version}`;
}

export interface ParticipantReportInput extends RoundReportInput {
  participantCode: string;
  /** The lab's own name (its own file only). */
  labName: string;
  /** The lab's Track record up to this report's issue (rounds published no later than this evaluation). */
  track: TrackSeries[];
}

/**
 * SHA-256 of the evaluation record a report is made from (evaluation id, version and the
 * numbers of every group, in order). Printed in every PDF footer so a reader can match a
 * report to the stored record; the file's own SHA-256 is kept beside the file (a file cannot
 * hold its own checksum).
 */
export function recordChecksum(input: RoundReportInput): string {
  const h = createHash('sha256');
  h.update(`${input.evaluation.id}/${input.evaluation.version}\n`);
  for (const g of input.groups) {
    h.update(
      `${g.itemCode}/${g.measurandKey}/${g.n}/${g.assignedValue}/${g.uAssigned}/${g.sigmaPt}/${g.method}\n`,
    );
    for (const p of g.participants)
      h.update(`${p.code}:${p.result}:${p.z}:${p.zPrime}:${p.zeta}:${p.en}:${p.signal ?? ''}\n`);
  }
  return h.digest('hex');
}

export function sha256(buf: Buffer | Uint8Array): string {
  return createHash('sha256').update(buf).digest('hex');
}

/** The score a participant's signal follows (z or z′), or null. */
export function mainScore(p: ItemMeasurandEvaluation['participants'][number]): number | null {
  return p.scoreKind === 'zPrime' ? p.zPrime : p.z;
}

export const METHOD_WORDS: Record<string, string> = {
  'algorithm-a': 'robust mean by Algorithm A (ISO 13528:2015 Annex C.3)',
  median: 'median of the participants’ results',
  reference: 'reference value from a characterisation outside the round',
  none: 'not set (too few results)',
};
