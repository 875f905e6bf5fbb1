import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
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
import { errorMessage, zodValidator } from '../core/zod-form-errors';
import { FormSubmit } from '../shared/form-submit';
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
  templateUrl: './invite-user-dialog.html',
})
export class InviteUserDialog {
  protected readonly data = inject<InviteUserData>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<InviteUserDialog, User>>(MatDialogRef);
  private readonly admin = inject(AdminService);
  protected readonly roles = GLOBAL_ROLES;
  protected readonly roleLabels = GLOBAL_ROLE_LABELS;
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, zodValidator(Email)]],
    name: ['', [Validators.required]],
    roles: [[] as GlobalRole[]],
    organisationId: [''],
    isManager: [{ value: false, disabled: true }],
  });
  protected readonly submit = new FormSubmit(this.form);

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

  protected save(): void {
    const raw = this.form.getRawValue();
    const invite = this.submit.parse(UserInvite, {
      ...raw,
      organisationId: raw.organisationId || undefined,
    });
    if (invite)
      this.submit.run(this.admin.inviteUser(invite), (user) => this.dialogRef.close(user));
  }
}
