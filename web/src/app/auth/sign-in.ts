import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { homePath, SignInRequest } from '@ringlet/shared/contracts/auth';
import { problemMessage, problemOf } from '../core/problem';
import { AuthService } from '../core/auth-service';
import { errorMessage, zodValidator } from '../core/zod-form-errors';
import { FormSubmit } from '../shared/form-submit';

/** A return address is only followed if it stays inside the app. */
export function safeReturnUrl(url: string | undefined | null): string | null {
  if (!url || !url.startsWith('/') || url.startsWith('//') || url.startsWith('/\\')) return null;
  if (url.startsWith('/sign-in')) return null;
  return url;
}

/** A refused sign-in in plain words: wrong credentials (401) or the server's message. */
function signInRefusal(error: unknown): string {
  if (error instanceof HttpErrorResponse && error.status === 401)
    return problemOf(error)?.message ?? 'E-mail or password is incorrect.';
  return problemMessage(error);
}

@Component({
  selector: 'app-sign-in',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatFormFieldModule, MatInputModule, MatButtonModule],
  template: `
    <section class="card">
      <h1 data-testid="page-heading">Sign in</h1>
      <form
        [formGroup]="form"
        (ngSubmit)="submit()"
        novalidate
        class="form-stack"
        data-testid="sign-in-form"
      >
        <mat-form-field>
          <mat-label>E-mail</mat-label>
          <input
            matInput
            id="sign-in-email"
            data-testid="sign-in-email"
            formControlName="email"
            type="email"
            autocomplete="username"
            required
          />
          <mat-error>{{ errorMessage(form.controls.email) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Password</mat-label>
          <input
            matInput
            id="sign-in-password"
            data-testid="sign-in-password"
            formControlName="password"
            type="password"
            autocomplete="current-password"
            required
          />
          <mat-error>{{ errorMessage(form.controls.password) }}</mat-error>
        </mat-form-field>
        @if (submission.failure(); as message) {
          <p class="form-error" role="alert" data-testid="sign-in-error">{{ message }}</p>
        }
        <div class="actions">
          <button
            mat-flat-button
            type="submit"
            data-testid="sign-in-submit"
            [disabled]="submission.busy()"
          >
            Sign in
          </button>
          <a routerLink="/forgot-password">Forgot password?</a>
        </div>
      </form>
    </section>
  `,
  styleUrl: './auth-card.scss',
})
export class SignIn {
  private readonly auth = inject(AuthService);
  private readonly router = inject(Router);

  /** Where to go after signing in (query parameter, set by the guards). */
  readonly returnUrl = input<string>();

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, zodValidator(SignInRequest.shape.email)]],
    password: ['', [Validators.required]],
  });
  protected readonly submission = new FormSubmit(this.form, { refusal: signInRefusal });
  protected readonly errorMessage = errorMessage;

  protected submit(): void {
    this.submission.submit(
      SignInRequest,
      this.form.getRawValue(),
      (request) => this.auth.signIn(request),
      (me) => void this.router.navigateByUrl(safeReturnUrl(this.returnUrl()) ?? homePath(me.roles)),
    );
  }
}
