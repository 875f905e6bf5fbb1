import { HttpErrorResponse } from '@angular/common/http';
import * as z from 'zod';
import { FieldIssue, ProblemBody } from '@ringlet/shared/contracts/common';

const FieldIssues = z.array(FieldIssue);

/** Readable fallback messages when the server gave no problem body. */
function fallbackMessage(status: number): string {
  if (status === 0) return 'The server cannot be reached. Check the connection and try again.';
  if (status === 401) return 'Please sign in.';
  if (status === 403) return 'You do not have access to this.';
  if (status === 404) return 'Not found.';
  if (status === 409) return 'This changed meanwhile. Reload and try again.';
  if (status === 429) return 'Too many attempts. Wait a moment and try again.';
  if (status >= 500) return 'Something went wrong on the server. Try again in a moment.';
  return 'The request failed.';
}

/** Field names whose label is not just the words of the name (docs/GLOSSARY.md). */
const FIELD_LABELS: Record<string, string> = {
  participantCode: 'Participant code',
  measurandKey: 'Measurand',
  measurandId: 'Measurand',
  testItemId: 'Test item',
  itemCode: 'Item',
  sigmaPt: 'σ_pt',
  feeMinor: 'Fee',
  resultsDueAt: 'Results due',
  dispatchOn: 'Dispatch date',
  enrolmentClosesOn: 'Enrolment closes',
  organisationId: 'Organisation',
  schemeId: 'Scheme',
  zAverageNm: 'Z-average (nm)',
  pdi: 'PDI',
  pdiLimit: 'PDI limit',
  referenceValueNm: 'Reference (nm)',
  toleranceNm: 'Tolerance (nm)',
  setPointC: 'Set point (°C)',
  temperatureC: 'Temperature (°C)',
  equilibrationMin: 'Equilibration (min)',
  laserWavelengthNm: 'Laser wavelength (nm)',
  scatteringAngleDeg: 'Scattering angle (°)',
  replicates: 'Replicate',
  runs: 'Replicate',
  items: 'Item',
  results: 'Measurand',
  k: 'Coverage factor k',
};

/**
 * A field path as a person reads it: "runs.1.pdi" → "Replicate 2, PDI",
 * "participantCode" → "Participant code" (no raw paths on screens).
 */
export function fieldLabel(path: string): string {
  const parts: string[] = [];
  for (const seg of path.split('.').filter(Boolean)) {
    if (/^\d+$/.test(seg)) {
      if (parts.length) parts[parts.length - 1] += ` ${Number(seg) + 1}`;
      continue;
    }
    const words = FIELD_LABELS[seg] ?? seg.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
    parts.push(parts.length ? words : words.charAt(0).toUpperCase() + words.slice(1));
  }
  return parts.join(', ') || 'The request';
}

/** The problem body `{ error: { code, message, details } }` of an error response, if it has one. */
export function problemOf(error: unknown): ProblemBody['error'] | null {
  if (!(error instanceof HttpErrorResponse)) return null;
  const parsed = ProblemBody.safeParse(error.error);
  return parsed.success ? parsed.data.error : null;
}

/** The server's message for an error response, or a readable fallback by status. */
export function problemMessage(error: unknown): string {
  const problem = problemOf(error);
  if (problem?.message) return readable(problem.message);
  if (error instanceof HttpErrorResponse) return fallbackMessage(error.status);
  return 'Something went wrong.';
}

/** A server message that opens with a field path ("participantCode: …") opens with its label instead. */
export function readable(message: string): string {
  const named = /^([A-Za-z][\w.]*): (.+)$/s.exec(message);
  if (!named) return message;
  return `${fieldLabel(named[1]!)}: ${named[2]}`;
}

/** The server's 400 field issues (`details: [{ path, message }]`), or an empty list. */
export function fieldIssuesOf(error: unknown): FieldIssue[] {
  const problem = problemOf(error);
  if (!problem || !(error instanceof HttpErrorResponse) || error.status !== 400) return [];
  const parsed = FieldIssues.safeParse(problem.details);
  return parsed.success ? parsed.data : [];
}
