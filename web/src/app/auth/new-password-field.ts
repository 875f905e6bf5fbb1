import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { NewPassword } from '@ringlet/shared/contracts/common';
import { errorMessage, zodValidator } from '../core/zod-form-errors';

/** Validators of a new password: required and the shared rule (`NewPassword`). */
export const NEW_PASSWORD_VALIDATORS = [Validators.required, zodValidator(NewPassword)];

/**
 * The "New password" field of the change-password and set-password forms: one label, hint,
 * autocomplete and error text. The parent owns the control (so its form validates and submits it).
 */
@Component({
  selector: 'app-new-password-field',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  host: { style: 'display: contents' },
  template: `
    <mat-form-field>
      <mat-label>New password</mat-label>
      <input
        matInput
        [formControl]="control()"
        type="password"
        autocomplete="new-password"
        required
      />
      <mat-hint>At least 12 characters.</mat-hint>
      <mat-error>{{ errorMessage(control()) }}</mat-error>
    </mat-form-field>
  `,
})
export class NewPasswordField {
  readonly control = input.required<FormControl<string>>();
  protected readonly errorMessage = errorMessage;
}
