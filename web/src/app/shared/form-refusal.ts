import { HttpErrorResponse } from '@angular/common/http';
import type { AbstractControl } from '@angular/forms';
import type * as z from 'zod';
import { fieldIssuesOf, problemMessage } from '../core/problem';
import { applyServerIssues, applyZodIssues } from '../core/zod-form-errors';

/**
 * Checks what a form will send (its value after any conversion, e.g. percent to basis points)
 * with the shared schema. On failure marks the form touched, puts the issues under their fields
 * and returns the messages that name no field (null when every one found its field).
 */
export function checkFormValue<S extends z.ZodType>(
  form: AbstractControl,
  schema: S,
  value: unknown,
): { value: z.output<S>; failure: null } | { value: null; failure: string | null } {
  const result = schema.safeParse(value);
  if (result.success) return { value: result.data, failure: null };
  form.markAllAsTouched();
  const unplaced = applyZodIssues(form, result.error.issues);
  return { value: null, failure: unplaced.length ? unplaced.join(' ') : null };
}

/**
 * What a form shows when the server refused it: a 400 puts its field issues under the fields and
 * leaves only the messages that name no field (null when every one found its field); any other
 * error is one readable message.
 */
export function formRefusal(form: AbstractControl, error: unknown): string | null {
  if (error instanceof HttpErrorResponse && error.status === 400) {
    const unplaced = applyServerIssues(form, fieldIssuesOf(error));
    return unplaced.length ? unplaced.join(' ') : null;
  }
  return problemMessage(error);
}
