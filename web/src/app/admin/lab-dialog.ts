import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
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
import { errorMessage, zodValidator } from '../core/zod-form-errors';
import { FormSubmit } from '../shared/form-submit';
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
  templateUrl: './lab-dialog.html',
})
export class LabDialog {
  protected readonly lab = inject<Organisation | null>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<LabDialog, Organisation>>(MatDialogRef);
  private readonly admin = inject(AdminService);
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [this.lab?.name ?? '', [Validators.required]],
    kind: [this.lab?.kind ?? ('lab' as Organisation['kind'])],
    country: [this.lab?.country ?? ''],
    contactEmail: [
      this.lab?.contactEmail ?? '',
      [(c: AbstractControl) => (c.value ? zodValidator(Email)(c) : null)],
    ],
  });
  protected readonly submit = new FormSubmit(this.form);

  protected save(): void {
    const raw = this.form.getRawValue();
    const lab = this.submit.parse(OrganisationCreate, {
      ...raw,
      country: raw.country.trim() || null,
      contactEmail: raw.contactEmail.trim() || null,
    });
    if (!lab) return;
    const call: Observable<Organisation> = this.lab
      ? this.admin.updateOrganisation(this.lab.id, lab)
      : this.admin.createOrganisation(lab);
    this.submit.run(call, (saved) => this.dialogRef.close(saved));
  }
}
