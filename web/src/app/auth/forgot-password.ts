import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { PasswordResetRequest } from '@ringlet/shared/contracts/auth';
import { fieldIssuesOf, problemMessage } from '../core/problem';
import { AuthService } from '../core/auth-service';
import { applyServerIssues, errorMessage, parseForm, zodValidator } from '../core/zod-form-errors';

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
          @if (failure(); as message) {
            <p class="form-error" role="alert">{{ message }}</p>
          }
          <div class="actions">
            <button mat-flat-button type="submit" [disabled]="busy()">Send link</button>
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
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly errorMessage = errorMessage;

  protected submit(): void {
    this.failure.set(null);
    const { value } = parseForm(this.form, PasswordResetRequest);
    if (!value) return;
    this.busy.set(true);
    this.auth.requestPasswordReset(value.email).subscribe({
      next: () => {
        this.busy.set(false);
        this.sent.set(true);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        if (error instanceof HttpErrorResponse && error.status === 400) {
          const unplaced = applyServerIssues(this.form, fieldIssuesOf(error));
          if (unplaced.length) this.failure.set(unplaced.join(' '));
        } else {
          this.failure.set(problemMessage(error));
        }
      },
    });
  }
}
