import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { FormSubmit } from './form-submit';

/**
 * The foot of a form dialog: the form's message (what no field shows), Cancel, which closes
 * without a result, and the submit button (inside the dialog's form), off while the form is busy.
 */
@Component({
  selector: 'app-dialog-actions',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatDialogModule, MatButtonModule],
  template: `
    @if (submission().failure(); as message) {
      <p class="form-error" role="alert" [attr.data-testid]="errorTestId() || null">
        {{ message }}
      </p>
    }
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Cancel</button>
      <button
        mat-flat-button
        type="submit"
        [disabled]="submission().busy()"
        [attr.data-testid]="testId() || null"
      >
        {{ label() }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    :host {
      display: block;
    }
    .form-error {
      padding: 0 24px;
    }
  `,
})
export class DialogActions {
  /** The submit button's text. */
  readonly label = input.required<string>();
  /** The form's submit state (busy, and the message above the buttons). */
  readonly submission = input.required<FormSubmit>();
  /** The submit button's test id. */
  readonly testId = input('');
  /** The message's test id. */
  readonly errorTestId = input('');
}

/**
 * What a form dialog's component imports: reactive forms, the dialog, buttons, text fields and its
 * foot (`app-dialog-actions`). `imports: [FORM_DIALOG_IMPORTS, …]` (add what else it uses).
 */
export const FORM_DIALOG_IMPORTS = [
  ReactiveFormsModule,
  MatDialogModule,
  MatButtonModule,
  MatFormFieldModule,
  MatInputModule,
  DialogActions,
] as const;
