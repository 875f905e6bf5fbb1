import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import {
  type AbstractControl,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { type Organisation, OrganisationCreate } from '@ringlet/shared/contracts/admin';
import { Email } from '@ringlet/shared/contracts/common';
import { type Observable } from 'rxjs';
import { fieldIssuesOf, problemMessage } from '../core/problem';
import {
  applyServerIssues,
  applyZodIssues,
  errorMessage,
  zodValidator,
} from '../core/zod-form-errors';
import { AdminService } from './admin-service';

/** Create a lab (data null) or edit one. */
@Component({
  selector: 'app-lab-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatButtonModule,
  ],
  template: `
    <h2 mat-dialog-title>{{ lab ? 'Edit ' + lab.name : 'New organisation' }}</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="form-stack">
        <mat-form-field>
          <mat-label>Name</mat-label>
          <input matInput formControlName="name" required />
          <mat-error>{{ errorMessage(form.controls.name) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Kind</mat-label>
          <mat-select formControlName="kind">
            <mat-option value="lab">Lab</mat-option>
            <mat-option value="provider">PT provider</mat-option>
          </mat-select>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Country</mat-label>
          <input matInput formControlName="country" />
          <mat-error>{{ errorMessage(form.controls.country) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Contact e-mail</mat-label>
          <input matInput formControlName="contactEmail" type="email" />
          <mat-error>{{ errorMessage(form.controls.contactEmail) }}</mat-error>
        </mat-form-field>
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()">
          {{ lab ? 'Save' : 'Create lab' }}
        </button>
      </mat-dialog-actions>
    </form>
  `,
})
export class LabDialog {
  protected readonly lab = inject<Organisation | null>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<LabDialog, Organisation>>(MatDialogRef);
  private readonly admin = inject(AdminService);
  protected readonly errorMessage = errorMessage;
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [this.lab?.name ?? '', [Validators.required]],
    kind: [this.lab?.kind ?? ('lab' as Organisation['kind'])],
    country: [this.lab?.country ?? ''],
    contactEmail: [
      this.lab?.contactEmail ?? '',
      [(c: AbstractControl) => (c.value ? zodValidator(Email)(c) : null)],
    ],
  });

  protected submit(): void {
    this.failure.set(null);
    const raw = this.form.getRawValue();
    const parsed = OrganisationCreate.safeParse({
      ...raw,
      country: raw.country.trim() || null,
      contactEmail: raw.contactEmail.trim() || null,
    });
    if (!parsed.success) {
      this.form.markAllAsTouched();
      const unplaced = applyZodIssues(this.form, parsed.error.issues);
      if (unplaced.length) this.failure.set(unplaced.join(' '));
      return;
    }
    this.busy.set(true);
    const call: Observable<Organisation> = this.lab
      ? this.admin.updateOrganisation(this.lab.id, parsed.data)
      : this.admin.createOrganisation(parsed.data);
    call.subscribe({
      next: (lab) => this.dialogRef.close(lab),
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
