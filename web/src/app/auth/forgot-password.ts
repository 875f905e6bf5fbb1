import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { PasswordResetRequest } from '@ringlet/shared/contracts/auth';
import { AuthService } from '../core/auth-service';
import { errorMessage, zodValidator } from '../core/zod-form-errors';
import { FormSubmit } from '../shared/form-submit';

@Component({
  selector: 'app-forgot-password',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatFormFieldModule, MatInputModule, MatButtonModule],
  template: `
    <section class="card">
      <h1 data-testid="page-heading">Forgot password</h1>
      @if (sent()) {
        <p class="status" role="status" data-testid="reset-sent">
          If the address is registered, a link is on its way. It works once and expires soon.
        </p>
        <p><a routerLink="/sign-in">Back to sign in</a></p>
      } @else {
        <p>Enter your e-mail address and we send you a link to choose a new password.</p>
        <form [formGroup]="form" (ngSubmit)="submit()" novalidate class="form-stack">
          <mat-form-field>
            <mat-label>E-mail</mat-label>
            <input matInput formControlName="email" type="email" autocomplete="username" required />
            <mat-error>{{ errorMessage(form.controls.email) }}</mat-error>
          </mat-form-field>
          @if (submission.failure(); as message) {
            <p class="form-error" role="alert">{{ message }}</p>
          }
          <div class="actions">
            <button mat-flat-button type="submit" [disabled]="submission.busy()">Send link</button>
            <a routerLink="/sign-in">Back to sign in</a>
          </div>
        </form>
      }
    </section>
  `,
  styleUrl: './auth-card.scss',
})
export class ForgotPassword {
  private readonly auth = inject(AuthService);
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, zodValidator(PasswordResetRequest.shape.email)]],
  });
  protected readonly sent = signal(false);
  protected readonly submission = new FormSubmit(this.form);
  protected readonly errorMessage = errorMessage;

  protected submit(): void {
    this.submission.submit(
      PasswordResetRequest,
      this.form.getRawValue(),
      (request) => this.auth.requestPasswordReset(request.email),
      () => this.sent.set(true),
    );
  }
}
