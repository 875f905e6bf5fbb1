import { HttpErrorResponse } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  signal,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import {
  type LabInvitation,
  LabMemberInvite,
  type Membership,
} from '@ringlet/shared/contracts/admin';
import { AuthService } from '../../core/auth-service';
import * as z from 'zod';
import { Email, FieldIssue } from '@ringlet/shared/contracts/common';
import { fieldIssuesOf, problemMessage, problemOf } from '../../core/problem';
import {
  applyServerIssues,
  applyZodIssues,
  errorMessage,
  zodValidator,
} from '../../core/zod-form-errors';
import { AssessorGrants } from './assessor-grants';
import { LabMembersService } from './lab-members-service';

/** For lab managers: who belongs to the lab, invite a colleague, remove one; assessor access. */
@Component({
  selector: 'app-lab-members',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatTableModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatCheckboxModule,
    AssessorGrants,
  ],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">My lab</h1>
      <p><a href="/billing">Invoices and billing details</a></p>
      @if (labs().length > 1) {
        <mat-form-field>
          <mat-label>Lab</mat-label>
          <mat-select [value]="labId()" (valueChange)="labId.set($event)">
            @for (lab of labs(); track lab.organisationId) {
              <mat-option [value]="lab.organisationId">{{ lab.organisationName }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
      } @else if (labName()) {
        <p>{{ labName() }}</p>
      } @else {
        <p>You manage no lab.</p>
      }

      <table mat-table [dataSource]="members()" aria-label="Lab members" class="members">
        <ng-container matColumnDef="name">
          <th mat-header-cell *matHeaderCellDef>Name</th>
          <td mat-cell *matCellDef="let m">{{ m.userName }}</td>
        </ng-container>
        <ng-container matColumnDef="email">
          <th mat-header-cell *matHeaderCellDef>E-mail</th>
          <td mat-cell *matCellDef="let m">{{ m.userEmail }}</td>
        </ng-container>
        <ng-container matColumnDef="role">
          <th mat-header-cell *matHeaderCellDef>Role in the lab</th>
          <td mat-cell *matCellDef="let m">{{ m.isManager ? 'Manager' : 'Member' }}</td>
        </ng-container>
        <ng-container matColumnDef="actions">
          <th mat-header-cell *matHeaderCellDef><span class="visually-hidden">Actions</span></th>
          <td mat-cell *matCellDef="let m">
            @if (m.userId !== myId()) {
              <button
                mat-button
                type="button"
                (click)="remove(m)"
                [attr.aria-label]="'Remove ' + m.userName"
              >
                Remove
              </button>
            }
          </td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
      </table>

      @if (invitations().length) {
        <h2>Invited, not answered yet</h2>
        <ul class="pending" data-testid="pending-invitations">
          @for (i of invitations(); track i.id) {
            <li>
              {{ i.name }} ({{ i.email }}){{ i.isManager ? ', as manager' : '' }}: open until
              {{ i.expiresAt.slice(0, 10) }}
              <button
                mat-button
                type="button"
                (click)="withdraw(i)"
                [attr.aria-label]="'Withdraw the invitation to ' + i.name"
              >
                Withdraw
              </button>
            </li>
          }
        </ul>
      }

      @if (labId()) {
        <h2>Invite a colleague</h2>
        <p class="hint">
          Someone new gets an account and a link to choose a password. Someone who already has an
          account gets an invitation and joins only after accepting it. PT provider staff cannot be
          lab members.
        </p>
        <form [formGroup]="form" (ngSubmit)="invite()" class="invite" novalidate>
          <mat-form-field>
            <mat-label>E-mail</mat-label>
            <input matInput formControlName="email" type="email" required />
            <mat-error>{{ errorMessage(form.controls.email) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Name</mat-label>
            <input matInput formControlName="name" required />
            <mat-error>{{ errorMessage(form.controls.name) }}</mat-error>
          </mat-form-field>
          <mat-checkbox formControlName="isManager">Manager</mat-checkbox>
          <button mat-flat-button type="submit" [disabled]="busy()">Send invitation</button>
        </form>
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }

        <app-assessor-grants [labId]="labId()!" />
      }
    </section>
  `,
  styles: `
    .members {
      max-width: 900px;
      margin-bottom: 8px;
    }
    .invite {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
      align-items: flex-start;
    }
    .invite mat-checkbox,
    .invite button {
      margin-top: 8px;
    }
    .pending {
      padding-left: 18px;
    }
    .hint {
      color: #4a5663;
      max-width: 760px;
    }
  `,
})
export class LabMembers {
  private readonly auth = inject(AuthService);
  private readonly service = inject(LabMembersService);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly columns = ['name', 'email', 'role', 'actions'];
  protected readonly labs = this.auth.managedLabs;
  protected readonly myId = computed(() => this.auth.me()?.id);
  protected readonly labId = signal<string | null>(
    this.auth.managedLabs()[0]?.organisationId ?? null,
  );
  protected readonly labName = computed(
    () => this.labs().find((lab) => lab.organisationId === this.labId())?.organisationName ?? null,
  );
  protected readonly members = signal<Membership[]>([]);
  protected readonly invitations = signal<LabInvitation[]>([]);
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, zodValidator(Email)]],
    name: ['', [Validators.required]],
    isManager: [false],
  });

  constructor() {
    effect(() => {
      const labId = this.labId();
      this.members.set([]);
      this.invitations.set([]);
      if (labId) {
        this.service.members(labId).subscribe((members) => this.members.set(members));
        this.service
          .invitations(labId)
          .subscribe((invitations) => this.invitations.set(invitations));
      }
    });
  }

  protected invite(): void {
    const labId = this.labId();
    if (!labId) return;
    this.failure.set(null);
    const parsed = LabMemberInvite.safeParse(this.form.getRawValue());
    if (!parsed.success) {
      this.form.markAllAsTouched();
      const unplaced = applyZodIssues(this.form, parsed.error.issues);
      if (unplaced.length) this.failure.set(unplaced.join(' '));
      return;
    }
    this.busy.set(true);
    this.service.invite(labId, parsed.data).subscribe({
      next: (result) => {
        this.busy.set(false);
        const { membership, invitation } = result;
        if (membership) this.members.update((members) => [...members, membership]);
        if (invitation)
          this.invitations.update((list) => [
            invitation,
            ...list.filter((i) => i.id !== invitation.id),
          ]);
        this.form.reset({ email: '', name: '', isManager: false });
        const message = membership
          ? `Account opened for ${membership.userEmail}; a link to choose a password is on its way.`
          : `Invitation sent to ${parsed.data.email}. They join once they accept it.`;
        this.snackBar.open(message, 'Close', { duration: 5000 });
      },
      error: (error: unknown) => {
        this.busy.set(false);
        // 400 field errors, and 422 rule breaks that name a field (a staff account), go under the field
        const ruleIssues =
          error instanceof HttpErrorResponse && error.status === 422
            ? z.array(FieldIssue).safeParse(problemOf(error)?.details)
            : null;
        if (error instanceof HttpErrorResponse && (error.status === 400 || ruleIssues?.success)) {
          const unplaced = applyServerIssues(
            this.form,
            ruleIssues?.success ? ruleIssues.data : fieldIssuesOf(error),
          );
          this.failure.set(unplaced.length ? unplaced.join(' ') : null);
        } else {
          this.failure.set(problemMessage(error));
        }
      },
    });
  }

  protected withdraw(invitation: LabInvitation): void {
    const labId = this.labId();
    if (!labId) return;
    this.service
      .withdrawInvitation(labId, invitation.id)
      .subscribe(() =>
        this.invitations.update((list) => list.filter((i) => i.id !== invitation.id)),
      );
  }

  protected remove(membership: Membership): void {
    const labId = this.labId();
    if (!labId) return;
    this.service
      .remove(labId, membership.id)
      .subscribe(() =>
        this.members.update((members) => members.filter((m) => m.id !== membership.id)),
      );
  }
}
