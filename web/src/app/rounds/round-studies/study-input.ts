import type { ColDef } from 'ag-grid-community';
import {
  HOMOGENEITY_DECISION_LABELS,
  type HomogeneityDecisionKind,
  type Study,
  STUDY_KIND_LABELS,
} from '@ringlet/shared/contracts/rounds';
import { parseReplicateText, studyNumbers } from '../study-numbers';

/** The study form's values as typed. */
export interface StudyFormValue {
  kind: 'homogeneity' | 'stability';
  testItemId: string;
  measurandId: string;
  sigmaPt: number | null;
  text: string;
}

/** Which study, on which item and measurand, with which σ_pt (an empty box is none). */
export function studyTarget(v: StudyFormValue) {
  return {
    kind: v.kind,
    testItemId: v.testItemId,
    measurandId: v.measurandId,
    sigmaPt: v.sigmaPt === null || (v.sigmaPt as unknown) === '' ? null : Number(v.sigmaPt),
  };
}

/** The typed study as the contract's StudyInput (validated by the caller). */
export function studyInput(v: StudyFormValue) {
  const lines = parseReplicateText(v.text);
  const data =
    v.kind === 'homogeneity' ? { items: lines } : { first: lines[0] ?? [], second: lines[1] ?? [] };
  return { ...studyTarget(v), data };
}

/** The multipart form of an uploaded study file with its target. */
export function studyUpload(v: StudyFormValue, file: File): FormData {
  const t = studyTarget(v);
  const form = new FormData();
  form.append('kind', t.kind);
  form.append('testItemId', t.testItemId);
  form.append('measurandId', t.measurandId);
  if (t.sigmaPt !== null) form.append('sigmaPt', String(t.sigmaPt));
  form.append('file', file);
  return form;
}

/** The decision column: none needed on a pass, the recorded decision, or that one is needed. */
export function studyDecisionText(s: Pick<Study, 'passes' | 'decision' | 'decisionReason'>) {
  if (s.passes) return '—';
  if (!s.decision) return 'Needed before publication';
  const label = HOMOGENEITY_DECISION_LABELS[s.decision as HomogeneityDecisionKind] ?? s.decision;
  return `${label}: ${s.decisionReason}`;
}

/** The studies grid's columns (without the actions column). */
export const STUDY_COLUMNS: ColDef<Study>[] = [
  {
    field: 'kind',
    headerName: 'Study',
    width: 160,
    valueFormatter: ({ value }) => STUDY_KIND_LABELS[value as Study['kind']],
  },
  { field: 'testItemCode', headerName: 'Item', width: 80 },
  { field: 'measurandName', headerName: 'Measurand', width: 170 },
  {
    field: 'sigmaPt',
    headerName: 'σ_pt',
    width: 100,
    type: 'rightAligned',
    valueFormatter: ({ value }) => (value as number).toPrecision(4),
  },
  {
    colId: 'numbers',
    headerName: 'Numbers (unit of the measurand)',
    flex: 1,
    minWidth: 320,
    autoHeight: true,
    wrapText: true,
    valueGetter: ({ data }) => (data ? studyNumbers(data) : ''),
  },
  {
    field: 'passes',
    headerName: 'Result',
    width: 110,
    valueFormatter: ({ value }) => (value ? 'Pass' : 'Fail'),
    cellClass: ({ value }) => (value ? 'pass' : 'fail'),
  },
  {
    colId: 'decision',
    headerName: 'Decision',
    width: 220,
    valueGetter: ({ data }) => (data ? studyDecisionText(data) : ''),
  },
];
