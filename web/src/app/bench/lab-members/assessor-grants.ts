import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import {
  type AbstractControl,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { AssessorGrantCreate, type AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';
import { Email } from '@ringlet/shared/contracts/common';
import { fieldIssuesOf, problemMessage, problemOf } from '../../core/problem';
import {
  applyServerIssues,
  applyZodIssues,
  errorMessage,
  zodValidator,
} from '../../core/zod-form-errors';
import { LabMembersService } from './lab-members-service';
import { RevokeGrantDialog } from './revoke-grant-dialog';

export type GrantState = 'active' | 'upcoming' | 'ended' | 'revoked';

export const GRANT_STATE_WORDS: Readonly<Record<GrantState, string>> = {
  active: 'Active',
  upcoming: 'Starts later',
  ended: 'Ended',
  revoked: 'Revoked',
};

/** The server decides "today" in UTC; the form's default start date follows it. */
export const utcToday = (): string => new Date().toISOString().slice(0, 10);

/** A grant's state on `today` (YYYY-MM-DD): revoked wins, then the server's active flag, then the dates. */
export function grantState(g: AssessorGrantDto, today = utcToday()): GrantState {
  if (g.revokedAt) return 'revoked';
  if (g.isActive) return 'active';
  if (g.endsOn !== null && g.endsOn < today) return 'ended';
  return 'upcoming';
}

/** Rule-break messages name their field first ("endsOn: …"); this places them under it. */
const FIELD_PREFIX = /^(email|name|startsOn|endsOn): (.+)$/s;

/** For lab managers: which assessors may read the lab, give one access, revoke it. */
@Component({
  selector: 'app-assessor-grants',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatTableModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
  ],
  template: `
    <h2 id="h-assessors">Assessor access</h2>
    <p class="explain">
      An assessor you give access to will see this lab's rounds, reports, investigations and
      instrument checks, read-only. Access ends on the end date you set, or at once when you revoke
      it. The assessor gets an e-mail invitation; someone new also gets a link to choose a password.
    </p>
    @if (grants().length === 0) {
      <p data-testid="no-grants">No assessor has access to this lab.</p>
    } @else {
      <table
        mat-table
        [dataSource]="grants()"
        aria-labelledby="h-assessors"
        class="grants"
        data-testid="grants"
      >
        <ng-container matColumnDef="assessor">
          <th mat-header-cell *matHeaderCellDef>Assessor</th>
          <td mat-cell *matCellDef="let g">
            {{ g.assessorName }}<br /><span class="email">{{ g.assessorEmail }}</span>
          </td>
        </ng-container>
        <ng-container matColumnDef="from">
          <th mat-header-cell *matHeaderCellDef>From</th>
          <td mat-cell *matCellDef="let g">{{ g.startsOn }}</td>
        </ng-container>
        <ng-container matColumnDef="until">
          <th mat-header-cell *matHeaderCellDef>Until</th>
          <td mat-cell *matCellDef="let g">{{ g.endsOn ?? 'No end date' }}</td>
        </ng-container>
        <ng-container matColumnDef="state">
          <th mat-header-cell *matHeaderCellDef>State</th>
          <td mat-cell *matCellDef="let g">
            <span class="state" [attr.data-state]="state(g)" data-testid="grant-state">{{
              words[state(g)]
            }}</span>
            @if (g.revokedAt) {
              <span class="when"> on {{ g.revokedAt.slice(0, 10) }}</span>
            }
          </td>
        </ng-container>
        <ng-container matColumnDef="actions">
          <th mat-header-cell *matHeaderCellDef><span class="visually-hidden">Actions</span></th>
          <td mat-cell *matCellDef="let g">
            @if (state(g) === 'active' || state(g) === 'upcoming') {
              <button
                mat-button
                type="button"
                (click)="revoke(g)"
                [attr.aria-label]="'Revoke access for ' + g.assessorName"
                data-testid="revoke-grant"
              >
                Revoke
              </button>
            }
          </td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr
          mat-row
          *matRowDef="let row; columns: columns"
          data-testid="grant-row"
          [attr.data-email]="row.assessorEmail"
        ></tr>
      </table>
    }

    <h3>Grant an assessor access</h3>
    <form
      [formGroup]="form"
      (ngSubmit)="grant()"
      class="grant-form"
      novalidate
      data-testid="grant-form"
    >
      <mat-form-field>
        <mat-label>Assessor's e-mail</mat-label>
        <input matInput formControlName="email" type="email" required />
        <mat-error>{{ errorMessage(form.controls.email) }}</mat-error>
      </mat-form-field>
      <mat-form-field>
        <mat-label>Assessor's name</mat-label>
        <input matInput formControlName="name" />
        <mat-hint>For someone new to Ringlet</mat-hint>
        <mat-error>{{ errorMessage(form.controls.name) }}</mat-error>
      </mat-form-field>
      <mat-form-field>
        <mat-label>From</mat-label>
        <input matInput formControlName="startsOn" type="date" required />
        <mat-error>{{ errorMessage(form.controls.startsOn) }}</mat-error>
      </mat-form-field>
      <mat-form-field>
        <mat-label>Until</mat-label>
        <input matInput formControlName="endsOn" type="date" required />
        <mat-hint>Last day of access</mat-hint>
        <mat-error>{{ errorMessage(form.controls.endsOn) }}</mat-error>
      </mat-form-field>
      <button mat-flat-button type="submit" [disabled]="busy()" data-testid="grant-submit">
        Grant access
      </button>
    </form>
    @if (failure(); as message) {
      <p class="form-error" role="alert">{{ message }}</p>
    }
  `,
  styles: `
    .explain {
      max-width: 72ch;
    }
    .grants {
      max-width: 900px;
      margin-bottom: 8px;
    }
    .email,
    .when {
      color: var(--mat-sys-on-surface-variant);
    }
    .state {
      font-weight: 500;
    }
    .state[data-state='active'] {
      color: var(--rl-signal-acceptable, #1b7f79);
    }
    .state[data-state='revoked'] {
      color: var(--rl-signal-action, #a4262c);
    }
    .grant-form {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
      align-items: flex-start;
    }
    .grant-form button {
      margin-top: 8px;
    }
  `,
})
export class AssessorGrants {
  readonly labId = input.required<string>();
  private readonly service = inject(LabMembersService);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly columns = ['assessor', 'from', 'until', 'state', 'actions'];
  protected readonly words = GRANT_STATE_WORDS;
  protected readonly grants = signal<AssessorGrantDto[]>([]);
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly errorMessage = errorMessage;
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly form = this.fb.group({
    email: ['', [Validators.required, zodValidator(Email)]],
    name: [''],
    startsOn: [utcToday(), [Validators.required]],
    endsOn: ['', [Validators.required]],
  });

  constructor() {
    effect(() => {
      const labId = this.labId();
      this.grants.set([]);
      this.service.grants(labId).subscribe((grants) => this.grants.set(grants));
    });
  }

  protected state(g: AssessorGrantDto): GrantState {
    return grantState(g);
  }

  protected grant(): void {
    this.failure.set(null);
    const v = this.form.getRawValue();
    const parsed = AssessorGrantCreate.safeParse({
      email: v.email,
      name: v.name.trim() || undefined,
      startsOn: v.startsOn || undefined,
      endsOn: v.endsOn || undefined,
    });
    if (!parsed.success || this.form.invalid) {
      this.form.markAllAsTouched();
      const unplaced = parsed.success ? [] : applyZodIssues(this.form, parsed.error.issues);
      if (unplaced.length) this.failure.set(unplaced.join(' '));
      return;
    }
    const input = parsed.data;
    if (input.startsOn && input.endsOn && input.endsOn < input.startsOn) {
      this.place(this.form.controls.endsOn, 'zod', 'The end date cannot be before the start date.');
      return;
    }
    this.busy.set(true);
    this.service.grant(this.labId(), input).subscribe({
      next: (grant) => {
        this.busy.set(false);
        this.grants.update((grants) => [grant, ...grants]);
        this.form.reset({ email: '', name: '', startsOn: utcToday(), endsOn: '' });
        this.snackBar.open(`Access granted; invitation sent to ${grant.assessorEmail}.`, 'Close', {
          duration: 5000,
        });
      },
      error: (error: unknown) => {
        this.busy.set(false);
        if (error instanceof HttpErrorResponse && error.status === 400) {
          const unplaced = applyServerIssues(this.form, fieldIssuesOf(error));
          this.failure.set(unplaced.length ? unplaced.join(' ') : null);
          return;
        }
        const message = problemOf(error)?.message;
        const m = message ? FIELD_PREFIX.exec(message) : null;
        if (error instanceof HttpErrorResponse && error.status === 422 && m) {
          const control = this.form.get(m[1]!);
          if (control) return this.place(control, 'server', m[2]!);
        }
        this.failure.set(problemMessage(error));
      },
    });
  }

  protected revoke(grant: AssessorGrantDto): void {
    this.dialog
      .open(RevokeGrantDialog, { data: grant, width: '480px' })
      .afterClosed()
      .subscribe((confirmed: unknown) => {
        if (confirmed !== true) return;
        this.service.revokeGrant(this.labId(), grant.id).subscribe(() => {
          this.snackBar.open(`Access for ${grant.assessorEmail} revoked.`, 'Close', {
            duration: 5000,
          });
          this.service.grants(this.labId()).subscribe((grants) => this.grants.set(grants));
        });
      });
  }

  private place(control: AbstractControl, key: 'zod' | 'server', message: string): void {
    control.setErrors({ ...(control.errors ?? {}), [key]: message });
    control.markAsTouched();
  }
}
