import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule } from '@angular/material/dialog';

/**
 * A form dialog's buttons: Cancel closes without a result, the submit button (inside the
 * dialog's form) is off while the form is busy.
 */
@Component({
  selector: 'app-dialog-actions',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatDialogModule, MatButtonModule],
  template: `
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Cancel</button>
      <button
        mat-flat-button
        type="submit"
        [disabled]="busy()"
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
  `,
})
export class DialogActions {
  /** The submit button's text. */
  readonly label = input.required<string>();
  readonly busy = input(false);
  readonly testId = input('');
}
