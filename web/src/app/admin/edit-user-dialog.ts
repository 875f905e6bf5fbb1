import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef, MAT_DIALOG_DATA } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { GlobalRole } from '@ringlet/shared/contracts/auth';
import { type User, UserUpdate } from '@ringlet/shared/contracts/admin';
import { fieldIssuesOf, problemMessage } from '../core/problem';
import { applyServerIssues, applyZodIssues, errorMessage } from '../core/zod-form-errors';
import { AdminService } from './admin-service';
import { GLOBAL_ROLE_LABELS, GLOBAL_ROLES } from './role-labels';

@Component({
  selector: 'app-edit-user-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatSlideToggleModule,
    MatButtonModule,
  ],
  template: `
    <h2 mat-dialog-title>Edit {{ user.name }}</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="form-stack">
        <p>{{ user.email }}</p>
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
          <mat-error>{{ errorMessage(form.controls.roles) }}</mat-error>
        </mat-form-field>
        <mat-slide-toggle formControlName="isActive">Active (can sign in)</mat-slide-toggle>
        @if (!user.hasPassword) {
          <p>
            No password set yet.
            <button mat-button type="button" (click)="resendInvitation()" [disabled]="busy()">
              Resend invitation
            </button>
          </p>
        }
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()">Save</button>
      </mat-dialog-actions>
    </form>
  `,
})
export class EditUserDialog {
  protected readonly user = inject<User>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<EditUserDialog, User>>(MatDialogRef);
  private readonly admin = inject(AdminService);
  private readonly snackBar = inject(MatSnackBar);
  protected readonly roles = GLOBAL_ROLES;
  protected readonly roleLabels = GLOBAL_ROLE_LABELS;
  protected readonly errorMessage = errorMessage;
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [this.user.name, [Validators.required]],
    roles: [[...this.user.roles] as GlobalRole[]],
    isActive: [this.user.isActive],
  });

  protected resendInvitation(): void {
    this.busy.set(true);
    this.admin.resendInvitation(this.user.id).subscribe({
      next: () => {
        this.busy.set(false);
        this.snackBar.open(`A new link is on its way to ${this.user.email}.`, 'Close', {
          duration: 5000,
        });
      },
      error: () => this.busy.set(false),
    });
  }

  protected submit(): void {
    this.failure.set(null);
    const parsed = UserUpdate.safeParse(this.form.getRawValue());
    if (!parsed.success) {
      this.form.markAllAsTouched();
      const unplaced = applyZodIssues(this.form, parsed.error.issues);
      if (unplaced.length) this.failure.set(unplaced.join(' '));
      return;
    }
    this.busy.set(true);
    this.admin.updateUser(this.user.id, parsed.data).subscribe({
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
