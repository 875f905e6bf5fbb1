import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, Validators } from '@angular/forms';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { GlobalRole } from '@ringlet/shared/contracts/auth';
import { type User, UserUpdate } from '@ringlet/shared/contracts/admin';
import { FORM_DIALOG_IMPORTS } from '../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../shared/dialog-submit';
import { UserFields } from '../shared/user-fields';
import { AdminService } from './admin-service';

@Component({
  selector: 'app-edit-user-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS, MatSlideToggleModule, UserFields],
  templateUrl: './edit-user-dialog.html',
})
export class EditUserDialog {
  protected readonly user = dialogData<User>();
  private readonly admin = inject(AdminService);
  private readonly snackBar = inject(MatSnackBar);
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [this.user.name, [Validators.required]],
    roles: [[...this.user.roles] as GlobalRole[]],
    isActive: [this.user.isActive],
  });
  protected readonly submit = new DialogSubmit<User>(this.form);

  protected resendInvitation(): void {
    this.submit.busy.set(true);
    this.admin.resendInvitation(this.user.id).subscribe({
      next: () => {
        this.submit.busy.set(false);
        this.snackBar.open(`A new link is on its way to ${this.user.email}.`, 'Close', {
          duration: 5000,
        });
      },
      error: () => this.submit.busy.set(false),
    });
  }

  protected save(): void {
    this.submit.submitAndClose(UserUpdate, this.form.getRawValue(), (update) =>
      this.admin.updateUser(this.user.id, update),
    );
  }
}
