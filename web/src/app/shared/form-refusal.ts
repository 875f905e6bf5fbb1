import { HttpErrorResponse } from '@angular/common/http';
import type { AbstractControl } from '@angular/forms';
import { fieldIssuesOf, problemMessage } from '../core/problem';
import { applyServerIssues } from '../core/zod-form-errors';

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
