import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, Validators } from '@angular/forms';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatSelectModule } from '@angular/material/select';
import { type GlobalRole } from '@ringlet/shared/contracts/auth';
import { type Organisation, type User, UserInvite } from '@ringlet/shared/contracts/admin';
import { Email } from '@ringlet/shared/contracts/common';
import { errorMessage, zodValidator } from '../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../shared/dialog-submit';
import { UserFields } from '../shared/user-fields';
import { AdminService } from './admin-service';

export interface InviteUserData {
  readonly labs: readonly Organisation[];
}

@Component({
  selector: 'app-invite-user-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS, MatSelectModule, MatCheckboxModule, UserFields],
  templateUrl: './invite-user-dialog.html',
})
export class InviteUserDialog {
  protected readonly data = dialogData<InviteUserData>();
  private readonly admin = inject(AdminService);
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, zodValidator(Email)]],
    name: ['', [Validators.required]],
    roles: [[] as GlobalRole[]],
    organisationId: [''],
    isManager: [{ value: false, disabled: true }],
  });
  protected readonly submit = new DialogSubmit<User>(this.form);

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
    const candidate = { ...raw, organisationId: raw.organisationId || undefined };
    this.submit.submitAndClose(UserInvite, candidate, (invite) => this.admin.inviteUser(invite));
  }
}
