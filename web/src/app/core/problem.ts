import { HttpErrorResponse } from '@angular/common/http';
import { z } from 'zod';
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

/** The problem body `{ error: { code, message, details } }` of an error response, if it has one. */
export function problemOf(error: unknown): ProblemBody['error'] | null {
  if (!(error instanceof HttpErrorResponse)) return null;
  const parsed = ProblemBody.safeParse(error.error);
  return parsed.success ? parsed.data.error : null;
}

/** The server's message for an error response, or a readable fallback by status. */
export function problemMessage(error: unknown): string {
  const problem = problemOf(error);
  if (problem?.message) return problem.message;
  if (error instanceof HttpErrorResponse) return fallbackMessage(error.status);
  return 'Something went wrong.';
}

/** The server's 400 field issues (`details: [{ path, message }]`), or an empty list. */
export function fieldIssuesOf(error: unknown): FieldIssue[] {
  const problem = problemOf(error);
  if (!problem || !(error instanceof HttpErrorResponse) || error.status !== 400) return [];
  const parsed = FieldIssues.safeParse(problem.details);
  return parsed.success ? parsed.data : [];
}
