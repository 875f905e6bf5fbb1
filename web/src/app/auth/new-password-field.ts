import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type FormControl, Validators } from '@angular/forms';
import { NewPassword } from '@ringlet/shared/contracts/common';
import { zodValidator } from '../core/zod-form-errors';
import { PasswordField } from '../shared/password-field';

/** Validators of a new password: required and the shared rule (`NewPassword`). */
export const NEW_PASSWORD_VALIDATORS = [Validators.required, zodValidator(NewPassword)];

/**
 * The "New password" field of the change-password and set-password forms: one label, hint,
 * autocomplete and error text. The parent owns the control (so its form validates and submits it).
 */
@Component({
  selector: 'app-new-password-field',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [PasswordField],
  host: { style: 'display: contents' },
  template: `
    <app-password-field
      label="New password"
      autocomplete="new-password"
      hint="At least 12 characters."
      [control]="control()"
    />
  `,
})
export class NewPasswordField {
  readonly control = input.required<FormControl<string>>();
}
