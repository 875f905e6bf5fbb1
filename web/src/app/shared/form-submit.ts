import { HttpErrorResponse } from '@angular/common/http';
import { signal } from '@angular/core';
import type { AbstractControl } from '@angular/forms';
import type { Observable } from 'rxjs';
import * as z from 'zod';
import { FieldIssue } from '@ringlet/shared/contracts/common';
import { fieldIssuesOf, problemMessage, problemOf } from '../core/problem';
import { applyServerIssues, applyZodIssues } from '../core/zod-form-errors';

/** Maps a contract path to the form's control path where they differ ("references.0" → "rows.2"). */
export type PathMap = (path: string) => string;
const samePath: PathMap = (p) => p;
const FieldIssues = z.array(FieldIssue);

/** A PathMap that strips a batch prefix ("items.0.") and renames a few fields (feeMinor → fee). */
export function pathMap(prefix = '', renames: Record<string, string> = {}): PathMap {
  return (path) => {
    const p = prefix && path.startsWith(prefix) ? path.slice(prefix.length) : path;
    return renames[p] ?? p;
  };
}

/** The message above the buttons when every issue found its field. */
export const CHECK_FIELDS = 'Check the highlighted fields.';

/** How a form shows a refusal. */
export interface SubmitOptions {
  /** Contract path → control path (default: the same). */
  readonly map?: PathMap;
  /** The message for a refusal that names no field (default: the server's words). */
  readonly refusal?: (error: unknown) => string;
}

/** A rule break (409/422) that names fields: its details as field issues, or "field: words". */
function ruleIssues(error: HttpErrorResponse): FieldIssue[] {
  const problem = problemOf(error);
  const details = FieldIssues.safeParse(problem?.details);
  if (details.success && details.data.length) return details.data;
  const named = /^([A-Za-z][\w.]*): (.+)$/s.exec(problem?.message ?? '');
  if (!named) return [];
  return [{ path: named[1]!, message: named[2]!.charAt(0).toUpperCase() + named[2]!.slice(1) }];
}

/**
 * Shows a failed call on its form: a 400's field issues and a 409/422 rule break that names a
 * field go under those controls; what names no control becomes the message returned
 * (CHECK_FIELDS when everything found its field). Anything else is the server's words.
 */
export function placeProblem(
  form: AbstractControl | null,
  error: unknown,
  options: SubmitOptions = {},
): string | null {
  const map = options.map ?? samePath;
  const fallback = options.refusal ?? problemMessage;
  if (!form || !(error instanceof HttpErrorResponse)) return fallback(error);
  const onFields =
    error.status === 400
      ? fieldIssuesOf(error)
      : error.status === 409 || error.status === 422
        ? ruleIssues(error).filter((i) => form.get(map(i.path)) !== null)
        : [];
  if (!onFields.length) return fallback(error);
  const unplaced = applyServerIssues(
    form,
    onFields.map((i) => ({ ...i, path: map(i.path) })),
  );
  return unplaced.length ? unplaced.join(' ') : CHECK_FIELDS;
}

/**
 * The one submit flow for every form and dialog: check the value against the shared contract,
 * run the call while `busy`, put a refusal on the form (`placeProblem`) and hand the result on (a
 * dialog closes with it). The template binds `busy()` to the submit button and `failure()` to the
 * alert (a dialog's foot, `app-dialog-actions`, does both).
 */
export class FormSubmit {
  readonly busy = signal(false);
  readonly failure = signal<string | null>(null);

  constructor(
    private readonly form: AbstractControl | null,
    private readonly options: SubmitOptions = {},
  ) {}

  /** The contract's value, or null with the issues under their controls and the rest above. */
  parse<S extends z.ZodType>(schema: S, value: unknown): z.output<S> | null {
    this.failure.set(null);
    const parsed = schema.safeParse(value);
    if (parsed.success) return parsed.data;
    const map = this.options.map ?? samePath;
    const issues = parsed.error.issues.map((i) => ({
      ...i,
      path: map(i.path.map(String).join('.')).split('.').filter(Boolean),
    }));
    const unplaced = this.form ? applyZodIssues(this.form, issues) : issues.map((i) => i.message);
    this.form?.markAllAsTouched();
    this.failure.set(unplaced.length ? unplaced.join(' ') : CHECK_FIELDS);
    return null;
  }

  /** Runs the call; `done` gets the result, a refusal stays on the form. */
  run<T>(call: Observable<T>, done: (result: T) => void): void {
    this.failure.set(null);
    this.busy.set(true);
    call.subscribe({
      next: (result) => {
        this.busy.set(false);
        done(result);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.failure.set(placeProblem(this.form, error, this.options));
      },
    });
  }

  /** Parses `value` and, when it fits the schema, runs `call(parsed)`; see parse and run. */
  submit<S extends z.ZodType, R>(
    schema: S,
    value: unknown,
    call: (parsed: z.output<S>) => Observable<R>,
    done: (result: R) => void,
  ): void {
    const parsed = this.parse(schema, value);
    if (parsed !== null) this.run(call(parsed), done);
  }
}
