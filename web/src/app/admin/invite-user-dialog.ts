import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { type GlobalRole } from '@ringlet/shared/contracts/auth';
import { type Organisation, type User, UserInvite } from '@ringlet/shared/contracts/admin';
import { Email } from '@ringlet/shared/contracts/common';
import { fieldIssuesOf, problemMessage } from '../core/problem';
import {
  applyServerIssues,
  applyZodIssues,
  errorMessage,
  zodValidator,
} from '../core/zod-form-errors';
import { AdminService } from './admin-service';
import { GLOBAL_ROLE_LABELS, GLOBAL_ROLES } from './role-labels';

export interface InviteUserData {
  readonly labs: readonly Organisation[];
}

@Component({
  selector: 'app-invite-user-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatCheckboxModule,
    MatButtonModule,
  ],
  template: `
    <h2 mat-dialog-title>Invite user</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="form-stack">
        <p>The person gets an e-mail with a link to choose a password.</p>
        <mat-form-field>
          <mat-label>E-mail</mat-label>
          <input matInput formControlName="email" type="email" required cdkFocusInitial />
          <mat-error>{{ errorMessage(form.controls.email) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Name</mat-label>
          <input matInput formControlName="name" required />
          <mat-error>{{ errorMessage(form.controls.name) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Roles</mat-label>
          <mat-select formControlName="roles" multiple>
            @for (role of roles; track role) {
              <mat-option [value]="role">{{ roleLabels[role] }}</mat-option>
            }
          </mat-select>
          <mat-hint>Leave empty for a lab member only.</mat-hint>
          <mat-error>{{ errorMessage(form.controls.roles) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Lab (optional)</mat-label>
          <mat-select formControlName="organisationId">
            <mat-option value="">No lab</mat-option>
            @for (lab of data.labs; track lab.id) {
              <mat-option [value]="lab.id">{{ lab.name }}</mat-option>
            }
          </mat-select>
          <mat-error>{{ errorMessage(form.controls.organisationId) }}</mat-error>
        </mat-form-field>
        <mat-checkbox formControlName="isManager"
          >Lab manager (can invite and remove colleagues)</mat-checkbox
        >
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()">Send invitation</button>
      </mat-dialog-actions>
    </form>
  `,
})
export class InviteUserDialog {
  protected readonly data = inject<InviteUserData>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<InviteUserDialog, User>>(MatDialogRef);
  private readonly admin = inject(AdminService);
  protected readonly roles = GLOBAL_ROLES;
  protected readonly roleLabels = GLOBAL_ROLE_LABELS;
  protected readonly errorMessage = errorMessage;
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, zodValidator(Email)]],
    name: ['', [Validators.required]],
    roles: [[] as GlobalRole[]],
    organisationId: [''],
    isManager: [{ value: false, disabled: true }],
  });

  constructor() {
    this.form.controls.organisationId.valueChanges.subscribe((labId) => {
      const manager = this.form.controls.isManager;
      if (labId) manager.enable();
      else {
        manager.setValue(false);
        manager.disable();
      }
    });
  }

  protected submit(): void {
    this.failure.set(null);
    const raw = this.form.getRawValue();
    const candidate = { ...raw, organisationId: raw.organisationId || undefined };
    const parsed = UserInvite.safeParse(candidate);
    if (!parsed.success) {
      this.form.markAllAsTouched();
      const unplaced = applyZodIssues(this.form, parsed.error.issues);
      if (unplaced.length) this.failure.set(unplaced.join(' '));
      return;
    }
    this.busy.set(true);
    this.admin.inviteUser(parsed.data).subscribe({
      next: (user) => this.dialogRef.close(user),
      error: (error: unknown) => {
        this.busy.set(false);
        if (error instanceof HttpErrorResponse && error.status === 400) {
          const unplaced = applyServerIssues(this.form, fieldIssuesOf(error));
          this.failure.set(unplaced.length ? unplaced.join(' ') : null);
        } else {
          this.failure.set(problemMessage(error));
        }
      },
    });
  }
}
