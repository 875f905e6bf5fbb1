import { inject } from '@angular/core';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import type { Observable } from 'rxjs';
import type * as z from 'zod';
import { FormSubmit } from './form-submit';

/** The data a dialog was opened with (`openDialog(…, data, …)`); call it in a field initialiser. */
export function dialogData<D>(): D {
  return inject<D>(MAT_DIALOG_DATA);
}

/**
 * A form dialog's submit flow: FormSubmit's checks and refusals, and on success the dialog closes
 * with the result `R`. Create it in a field initialiser (it injects the dialog's ref).
 */
export class DialogSubmit<R> extends FormSubmit {
  private readonly ref = inject<MatDialogRef<unknown, R>>(MatDialogRef);

  /** Closes the dialog, with `result` (what the opener gets) or without. */
  close(result?: R): void {
    this.ref.close(result);
  }

  /** Runs the call and closes with its result; a refusal stays on the form. */
  runAndClose(call: Observable<R>): void {
    this.run(call, (result) => this.close(result));
  }

  /** Parses `value` against `schema`; when it fits, runs `call(parsed)` and closes with its result. */
  submitAndClose<S extends z.ZodType>(
    schema: S,
    value: unknown,
    call: (parsed: z.output<S>) => Observable<R>,
  ): void {
    this.submit(schema, value, call, (result) => this.close(result));
  }
}
