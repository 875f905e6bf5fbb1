import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { ChangePasswordRequest } from '@ringlet/shared/contracts/auth';
import { AuthService } from '../core/auth-service';
import { FormSubmit } from '../shared/form-submit';
import { PasswordField } from '../shared/password-field';
import { NEW_PASSWORD_VALIDATORS, NewPasswordField } from './new-password-field';

/** A signed-in user changes their password; every other session of the account ends. */
@Component({
  selector: 'app-change-password',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, NewPasswordField, PasswordField],
  template: `
    <section class="card">
      <h1 data-testid="page-heading">Change password</h1>
      @if (done()) {
        <p role="status" data-testid="password-changed">
          Your password is changed. Other browsers signed in to your account are signed out.
        </p>
      } @else {
        <p>Changing the password signs your account out everywhere else.</p>
        <form [formGroup]="form" (ngSubmit)="submit()" novalidate class="form-stack">
          <app-password-field
            label="Current password"
            autocomplete="current-password"
            [control]="form.controls.currentPassword"
          />
          <app-new-password-field [control]="form.controls.password" />
          @if (submission.failure(); as message) {
            <p class="form-error" role="alert">{{ message }}</p>
          }
          <div class="actions">
            <button mat-flat-button type="submit" [disabled]="submission.busy()">
              Change password
            </button>
          </div>
        </form>
      }
    </section>
  `,
  styleUrl: './auth-card.scss',
})
export class ChangePassword {
  private readonly auth = inject(AuthService);
  protected readonly done = signal(false);
  protected readonly form = inject(NonNullableFormBuilder).group({
    currentPassword: ['', [Validators.required]],
    password: ['', NEW_PASSWORD_VALIDATORS],
  });

  protected readonly submission = new FormSubmit(this.form);

  protected submit(): void {
    this.form.markAllAsTouched();
    if (this.form.invalid) return;
    this.submission.submit(
      ChangePasswordRequest,
      this.form.getRawValue(),
      (request) => this.auth.changePassword(request),
      () => this.done.set(true),
    );
  }
}
