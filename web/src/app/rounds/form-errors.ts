import { HttpErrorResponse } from '@angular/common/http';
import type { WritableSignal } from '@angular/core';
import type { AbstractControl } from '@angular/forms';
import type * as z from 'zod';
import { fieldIssuesOf, problemMessage } from '../core/problem';
import { applyServerIssues, applyZodIssues } from '../core/zod-form-errors';

/** Parses a value with the shared schema; on failure marks the controls and sets the form's message. */
export function parseWith<S extends z.ZodType>(form: AbstractControl, schema: S, value: unknown, failure: WritableSignal<string | null>): z.output<S> | null {
  failure.set(null);
  const parsed = schema.safeParse(value);
  if (parsed.success) return parsed.data;
  form.markAllAsTouched();
  const unplaced = applyZodIssues(form, parsed.error.issues);
  failure.set(unplaced.length ? unplaced.join(' ') : 'Check the highlighted fields.');
  return null;
}

/** Server 400s go under their fields; 409/422 rule messages show above the buttons. */
export function showServerError(form: AbstractControl, error: unknown, failure: WritableSignal<string | null>): void {
  if (error instanceof HttpErrorResponse && error.status === 400) {
    const unplaced = applyServerIssues(form, fieldIssuesOf(error));
    failure.set(unplaced.length ? unplaced.join(' ') : 'Check the highlighted fields.');
  } else {
    failure.set(problemMessage(error));
  }
}
