import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { ChangePasswordRequest } from '@ringlet/shared/contracts/auth';
import { AuthService } from '../core/auth-service';
import { fieldIssuesOf, problemMessage, problemOf } from '../core/problem';
import { applyServerIssues, errorMessage } from '../core/zod-form-errors';
import { NEW_PASSWORD_VALIDATORS, NewPasswordField } from './new-password-field';

/** A signed-in user changes their password; every other session of the account ends. */
@Component({
  selector: 'app-change-password',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    NewPasswordField,
  ],
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
          <mat-form-field>
            <mat-label>Current password</mat-label>
            <input
              matInput
              formControlName="currentPassword"
              type="password"
              autocomplete="current-password"
              required
            />
            <mat-error>{{ errorMessage(form.controls.currentPassword) }}</mat-error>
          </mat-form-field>
          <app-new-password-field [control]="form.controls.password" />
          @if (failure(); as message) {
            <p class="form-error" role="alert">{{ message }}</p>
          }
          <div class="actions">
            <button mat-flat-button type="submit" [disabled]="busy()">Change password</button>
          </div>
        </form>
      }
    </section>
  `,
  styleUrl: './auth-card.scss',
})
export class ChangePassword {
  private readonly auth = inject(AuthService);
  protected readonly busy = signal(false);
  protected readonly done = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    currentPassword: ['', [Validators.required]],
    password: ['', NEW_PASSWORD_VALIDATORS],
  });

  protected submit(): void {
    this.failure.set(null);
    this.form.markAllAsTouched();
    if (this.form.invalid) return;
    const request = ChangePasswordRequest.safeParse(this.form.getRawValue());
    if (!request.success) {
      this.failure.set(request.error.issues[0]?.message ?? 'Check the passwords.');
      return;
    }
    this.busy.set(true);
    this.auth.changePassword(request.data).subscribe({
      next: () => {
        this.busy.set(false);
        this.done.set(true);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        const details =
          error instanceof HttpErrorResponse && error.status === 422
            ? problemOf(error)?.details
            : null;
        const issues =
          error instanceof HttpErrorResponse && error.status === 400
            ? fieldIssuesOf(error)
            : Array.isArray(details)
              ? details
              : [];
        const unplaced = applyServerIssues(this.form, issues);
        if (!issues.length) this.failure.set(problemMessage(error));
        else if (unplaced.length) this.failure.set(unplaced.join(' '));
      },
    });
  }
}
