import { signal, type WritableSignal } from '@angular/core';
import type { AbstractControl } from '@angular/forms';
import type { Observable } from 'rxjs';
import type * as z from 'zod';
import { parseWith, type PathMap, showServerError } from './form-errors';

const same: PathMap = (p) => p;

/** Where a submit shows its state: the form, its busy flag and its message above the buttons. */
export interface SubmitTarget {
  readonly form: AbstractControl;
  readonly busy: WritableSignal<boolean>;
  readonly failure: WritableSignal<string | null>;
  /** Contract path → control path where they differ (e.g. "items.0.code" → "code"). */
  readonly paths?: PathMap;
}

/**
 * Sends `call` while the form is busy. The answer goes to `done` (a dialog closes with it); an
 * error goes onto the form: a 400 problem's field issues under their controls, a 409/422 rule
 * message above the buttons (and under the field it names), anything else as its readable message.
 */
export function submitDialog<R>(
  target: SubmitTarget,
  call: Observable<R>,
  done: (result: R) => void,
): void {
  target.failure.set(null);
  target.busy.set(true);
  call.subscribe({
    next: (result) => {
      target.busy.set(false);
      done(result);
    },
    error: (e: unknown) => {
      target.busy.set(false);
      showServerError(target.form, e, target.failure, target.paths ?? same);
    },
  });
}

/**
 * One form's submit state and flow: `busy` and `failure` for the template, `parse` to check the
 * candidate value with the shared contract (issues under the controls), `send` for the call.
 */
export class DialogSubmit implements SubmitTarget {
  readonly busy = signal(false);
  readonly failure = signal<string | null>(null);

  constructor(
    readonly form: AbstractControl,
    readonly paths: PathMap = same,
  ) {}

  /** The parsed value, or null with the issues under their controls and the rest in `failure`. */
  parse<S extends z.ZodType>(schema: S, value: unknown): z.output<S> | null {
    return parseWith(this.form, schema, value, this.failure, this.paths);
  }

  /** See submitDialog. */
  send<R>(call: Observable<R>, done: (result: R) => void): void {
    submitDialog(this, call, done);
  }

  /** Parses `value` and, when it fits the schema, sends `call(parsed)`; see parse and send. */
  submit<S extends z.ZodType, R>(
    schema: S,
    value: unknown,
    call: (parsed: z.output<S>) => Observable<R>,
    done: (result: R) => void,
  ): void {
    const parsed = this.parse(schema, value);
    if (parsed !== null) this.send(call(parsed), done);
  }
}
