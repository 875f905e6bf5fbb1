import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
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
import { errorMessage } from '../core/zod-form-errors';
import { FormSubmit } from '../shared/form-submit';
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
  templateUrl: './edit-user-dialog.html',
})
export class EditUserDialog {
  protected readonly user = inject<User>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<EditUserDialog, User>>(MatDialogRef);
  private readonly admin = inject(AdminService);
  private readonly snackBar = inject(MatSnackBar);
  protected readonly roles = GLOBAL_ROLES;
  protected readonly roleLabels = GLOBAL_ROLE_LABELS;
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [this.user.name, [Validators.required]],
    roles: [[...this.user.roles] as GlobalRole[]],
    isActive: [this.user.isActive],
  });
  protected readonly submit = new FormSubmit(this.form);

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
    const update = this.submit.parse(UserUpdate, this.form.getRawValue());
    if (update)
      this.submit.run(this.admin.updateUser(this.user.id, update), (user) =>
        this.dialogRef.close(user),
      );
  }
}
