import { HttpErrorResponse } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  inject,
  input,
  signal,
} from '@angular/core';
import {
  type AbstractControl,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  type ValidationErrors,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { type PasswordTokenInfo, SetPasswordRequest } from '@ringlet/shared/contracts/auth';
import { tap } from 'rxjs';
import { AuthService } from '../core/auth-service';
import { FormSubmit } from '../shared/form-submit';
import { PasswordField } from '../shared/password-field';
import { NEW_PASSWORD_VALIDATORS, NewPasswordField } from './new-password-field';

function passwordsMatch(group: AbstractControl): ValidationErrors | null {
  const password: unknown = group.get('password')?.value;
  const confirm = group.get('confirm');
  if (!confirm) return null;
  const mismatch = !!confirm.value && confirm.value !== password;
  const others = { ...(confirm.errors ?? {}) };
  delete others['mismatch'];
  confirm.setErrors(
    mismatch ? { ...others, mismatch: true } : Object.keys(others).length ? others : null,
  );
  return null;
}

@Component({
  selector: 'app-set-password',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, NewPasswordField, PasswordField],
  template: `
    <section class="card">
      <h1 data-testid="page-heading">
        {{ info()?.purpose === 'reset' ? 'Choose a new password' : 'Set your password' }}
      </h1>
      @switch (state()) {
        @case ('loading') {
          <p role="status">Checking the link…</p>
        }
        @case ('invalid') {
          <p role="alert" class="form-error">This link has been used or has expired.</p>
          <p><a routerLink="/forgot-password">Ask for a new link</a></p>
        }
        @case ('done') {
          <p role="status" data-testid="password-set">Your password is set. Sign in with it now.</p>
          <p><a mat-flat-button routerLink="/sign-in">Sign in</a></p>
        }
        @case ('ready') {
          <p>
            For <strong data-testid="token-email">{{ info()?.email }}</strong>
          </p>
          <form [formGroup]="form" (ngSubmit)="submit()" novalidate class="form-stack">
            <app-new-password-field [control]="form.controls.password" />
            <app-password-field
              label="Confirm password"
              autocomplete="new-password"
              [control]="form.controls.confirm"
            />
            @if (submission.failure(); as message) {
              <p class="form-error" role="alert">{{ message }}</p>
            }
            <div class="actions">
              <button mat-flat-button type="submit" [disabled]="submission.busy()">
                Save password
              </button>
            </div>
          </form>
        }
      }
    </section>
  `,
  styleUrl: './auth-card.scss',
})
export class SetPassword implements OnInit {
  private readonly auth = inject(AuthService);

  /** The e-mailed single-use token (route parameter). */
  readonly token = input.required<string>();

  protected readonly info = signal<PasswordTokenInfo | null>(null);
  protected readonly state = signal<'loading' | 'invalid' | 'ready' | 'done'>('loading');
  protected readonly form = inject(NonNullableFormBuilder).group(
    {
      password: ['', NEW_PASSWORD_VALIDATORS],
      confirm: ['', [Validators.required]],
    },
    { validators: passwordsMatch },
  );
  protected readonly submission = new FormSubmit(this.form);

  ngOnInit(): void {
    this.auth.passwordTokenInfo(this.token()).subscribe({
      next: (info) => {
        this.info.set(info);
        this.state.set('ready');
      },
      error: () => this.state.set('invalid'),
    });
  }

  protected submit(): void {
    this.form.markAllAsTouched();
    if (this.form.invalid) return;
    const candidate = { token: this.token(), password: this.form.controls.password.value };
    const linkGone = (error: unknown) =>
      error instanceof HttpErrorResponse && (error.status === 404 || error.status === 410);
    this.submission.submit(
      SetPasswordRequest,
      candidate,
      (request) =>
        this.auth.setPassword(request).pipe(
          tap({
            error: (error: unknown) => {
              if (linkGone(error)) this.state.set('invalid');
            },
          }),
        ),
      () => this.state.set('done'),
    );
  }
}
