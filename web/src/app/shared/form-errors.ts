import { HttpErrorResponse } from '@angular/common/http';
import type { WritableSignal } from '@angular/core';
import type { AbstractControl } from '@angular/forms';
import type * as z from 'zod';
import { fieldIssuesOf, problemMessage, problemOf } from '../core/problem';
import { applyServerIssues, applyZodIssues } from '../core/zod-form-errors';

/** Maps a contract path to the form's control path where they differ (e.g. feeMinor → fee). */
export type PathMap = (path: string) => string;
const same: PathMap = (p) => p;

/** A PathMap that strips a batch prefix ("items.0.") and renames a few fields. */
export function pathMap(prefix = '', renames: Record<string, string> = {}): PathMap {
  return (path) => {
    const p = prefix && path.startsWith(prefix) ? path.slice(prefix.length) : path;
    return renames[p] ?? p;
  };
}

/** Parses a value with the shared schema; on failure marks the controls and sets the form's message. */
export function parseWith<S extends z.ZodType>(
  form: AbstractControl,
  schema: S,
  value: unknown,
  failure: WritableSignal<string | null>,
  map: PathMap = same,
): z.output<S> | null {
  failure.set(null);
  const parsed = schema.safeParse(value);
  if (parsed.success) return parsed.data;
  form.markAllAsTouched();
  const issues = parsed.error.issues.map((i) => ({
    ...i,
    path: map(i.path.map(String).join('.')).split('.').filter(Boolean),
  }));
  const unplaced = applyZodIssues(form, issues);
  failure.set(unplaced.length ? unplaced.join(' ') : 'Check the highlighted fields.');
  return null;
}

/**
 * Server 400s go under their fields; 409/422 rule messages show above the buttons, and when the
 * message names a field ("code: the round already has…") also under that field.
 * `strip` maps a contract path to the form's (e.g. drops "items.0." for a one-item form).
 */
export function showServerError(
  form: AbstractControl,
  error: unknown,
  failure: WritableSignal<string | null>,
  strip: PathMap = same,
): void {
  if (error instanceof HttpErrorResponse && error.status === 400) {
    const issues = fieldIssuesOf(error).map((i) => ({ ...i, path: strip(i.path) }));
    const unplaced = applyServerIssues(form, issues);
    failure.set(unplaced.length ? unplaced.join(' ') : 'Check the highlighted fields.');
    return;
  }
  const message = problemMessage(error);
  // the server's own wording names the field by its path; the path places the message under its control
  const named = /^([A-Za-z][\w.]*): (.+)$/.exec(problemOf(error)?.message ?? message);
  if (
    named &&
    error instanceof HttpErrorResponse &&
    (error.status === 409 || error.status === 422)
  ) {
    const plain = named[2]!.charAt(0).toUpperCase() + named[2]!.slice(1);
    applyServerIssues(form, [{ path: strip(named[1]!), message: plain }]);
    failure.set(plain);
    return;
  }
  failure.set(message);
}
