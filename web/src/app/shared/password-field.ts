import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { errorMessage } from '../core/zod-form-errors';

/**
 * A required password box with its label, the browser's autocomplete kind, an optional hint and
 * the control's error under it. The parent owns the control (its form checks and submits it).
 */
@Component({
  selector: 'app-password-field',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  host: { style: 'display: contents' },
  template: `
    <mat-form-field>
      <mat-label>{{ label() }}</mat-label>
      <input
        matInput
        [formControl]="control()"
        type="password"
        [attr.autocomplete]="autocomplete()"
        required
      />
      @if (hint(); as text) {
        <mat-hint>{{ text }}</mat-hint>
      }
      <mat-error>{{ errorMessage(control()) }}</mat-error>
    </mat-form-field>
  `,
})
export class PasswordField {
  readonly control = input.required<FormControl<string>>();
  readonly label = input.required<string>();
  readonly autocomplete = input.required<'current-password' | 'new-password'>();
  readonly hint = input('');
  protected readonly errorMessage = errorMessage;
}
