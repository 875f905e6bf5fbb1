import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { type AbstractControl, NonNullableFormBuilder, Validators } from '@angular/forms';
import { MatSelectModule } from '@angular/material/select';
import { type Organisation, OrganisationCreate } from '@ringlet/shared/contracts/admin';
import { Email } from '@ringlet/shared/contracts/common';
import { type Observable } from 'rxjs';
import { errorMessage, zodValidator } from '../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../shared/dialog-submit';
import { AdminService } from './admin-service';

/** Create a lab (data null) or edit one. */
@Component({
  selector: 'app-lab-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS, MatSelectModule],
  templateUrl: './lab-dialog.html',
})
export class LabDialog {
  protected readonly lab = dialogData<Organisation | null>();
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
  protected readonly submit = new DialogSubmit<Organisation>(this.form);

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
    this.submit.runAndClose(call);
  }
}
