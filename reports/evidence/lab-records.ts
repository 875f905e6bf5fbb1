/**
 * The Evidence pack's readable records (PDF): a lab's investigations of warning and action
 * signals, and its instrument-check history. The same records stay beside them as JSON.
 */
import { CAUSE_CATEGORY_LABELS, type CauseCategory } from '../../shared/contracts/evaluation';
import type {
  AssessorInstrumentCheck,
  AssessorInvestigation,
} from '../../shared/contracts/reports';
import type { ReportProviderInfo } from '../model';
import { day, dayTime, fixed, PALETTE, SCORE_DECIMALS, SCORE_LABEL, SIGNAL_WORDS } from '../text';
import {
  createDoc,
  finishDoc,
  heading,
  MARGIN,
  wrapTable,
  write,
  type Column,
} from '../pdf/document';

export interface LabRecordsMeta {
  lab: string;
  provider: ReportProviderInfo;
  generatedFor: string;
  generatedAt: string;
}

function head(doc: Parameters<typeof write>[0], title: string, meta: LabRecordsMeta): void {
  write(doc, meta.provider.name || 'PT provider', {
    size: 11,
    bold: true,
    colour: PALETTE.teal,
    gap: 4,
  });
  write(doc, title, { size: 20, bold: true, colour: PALETTE.ink, gap: 6, tag: 'H1' });
  write(doc, `Lab: ${meta.lab}`, { size: 11, gap: 2 });
  write(
    doc,
    `Made ${dayTime(meta.generatedAt)} for ${meta.generatedFor}, as part of an Evidence pack. The same records are in the JSON file beside this one.`,
    { size: 9, colour: PALETTE.grey, gap: 10 },
  );
}

const STATE_WORDS = { open: 'Open', closed: 'Closed' } as const;

/** How one kind of record is laid out: its title, its name, the table's columns and cells. */
interface RecordsLayout<R> {
  title: string;
  /** One record's name, singular and lower case ("investigation"). */
  noun: string;
  subject: string;
  landscape?: boolean;
  /** The columns for a text width. */
  columns: (width: number) => Column[];
  cells: (r: R) => string[];
  size: number;
}

/** A lab's records as one PDF: the head, the count, then the table (or a line saying there is none). */
async function recordsPdf<R>(
  rows: R[],
  meta: LabRecordsMeta,
  l: RecordsLayout<R>,
): Promise<Buffer> {
  const { doc, done } = createDoc({
    title: `${l.title} of ${meta.lab}`,
    subject: l.subject,
    footer: `${meta.provider.name || 'PT provider'} · ${l.title.toLowerCase()} · ${meta.lab}`,
    author: meta.provider.name,
    createdAt: new Date(meta.generatedAt),
    landscape: l.landscape,
  });
  head(doc, l.title, meta);
  heading(doc, `${rows.length} ${l.noun}(s)`, 2);
  if (rows.length === 0) write(doc, `The laboratory has recorded no ${l.noun}.`, { size: 10 });
  else wrapTable(doc, l.columns(doc.page.width - 2 * MARGIN), rows.map(l.cells), l.size);
  finishDoc(doc);
  return done;
}

export function buildInvestigationsPdf(
  rows: AssessorInvestigation[],
  meta: LabRecordsMeta,
): Promise<Buffer> {
  return recordsPdf(rows, meta, {
    title: 'Investigations',
    noun: 'investigation',
    subject:
      'Investigations of warning and action signals, with cause, corrective action and effectiveness check',
    landscape: true,
    columns: (w) => [
      { title: 'Round, code', width: 80 },
      { title: 'Item, measurand', width: 80 },
      { title: 'Score and signal', width: 80 },
      { title: 'State', width: 60 },
      { title: 'Cause', width: 80 },
      { title: 'Root cause', width: (w - 380) / 3 },
      { title: 'Corrective action', width: (w - 380) / 3 },
      { title: 'Effectiveness check', width: (w - 380) / 3 },
    ],
    cells: (r) => [
      `${r.roundCode}, ${r.participantCode}`,
      `${r.itemCode}, ${r.measurandName}`,
      `${SCORE_LABEL[r.scoreKind] ?? 'score'} = ${fixed(r.score, SCORE_DECIMALS)}, ${SIGNAL_WORDS[r.signal]}`,
      `${STATE_WORDS[r.state]}, opened ${day(r.createdAt)}${r.closedAt ? `, closed ${day(r.closedAt)}` : ''}`,
      r.causeCategory ? (CAUSE_CATEGORY_LABELS[r.causeCategory as CauseCategory] ?? 'Other') : '—',
      r.rootCause || '—',
      r.correctiveAction || '—',
      r.effectivenessCheck || '—',
    ],
    size: 7.5,
  });
}

export function buildInstrumentChecksPdf(
  rows: AssessorInstrumentCheck[],
  meta: LabRecordsMeta,
): Promise<Buffer> {
  return recordsPdf(rows, meta, {
    title: 'Instrument checks',
    noun: 'instrument check',
    subject: 'Instrument checks against reference materials',
    columns: (w) => [
      { title: 'Date', width: 60 },
      { title: 'Instrument', width: 90 },
      { title: 'Reference material', width: 110 },
      { title: 'Reference value ± tolerance (nm)', width: 90 },
      { title: 'Outcome', width: 45 },
      { title: 'Notes', width: w - 395 },
    ],
    cells: (r) => [
      day(r.checkedAt),
      r.instrument,
      r.material,
      `${r.referenceValueNm} ± ${r.toleranceNm}`,
      r.passed ? 'Pass' : 'Fail',
      r.notes || '—',
    ],
    size: 8,
  });
}
