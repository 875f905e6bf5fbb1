import { ChangeDetectionStrategy, Component, inject, input, output } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { LabMemberInvite, type LabMemberInviteResult } from '@ringlet/shared/contracts/admin';
import { Email } from '@ringlet/shared/contracts/common';
import { errorMessage, zodValidator } from '../../../core/zod-form-errors';
import { FormSubmit } from '../../../shared/form-submit';
import { LabMembersService } from '../lab-members-service';

/** The words a manager reads once a colleague is invited: an account opened, or an invitation sent. */
export function invitedMessage(result: LabMemberInviteResult, email: string): string {
  return result.membership
    ? `Account opened for ${result.membership.userEmail}; a link to choose a password is on its way.`
    : `Invitation sent to ${email}. They join once they accept it.`;
}

/** Invites a colleague into the lab (a new account, or an invitation to an existing one). */
@Component({
  selector: 'app-invite-colleague',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatCheckboxModule,
  ],
  templateUrl: './invite-colleague.html',
  styles: `
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
    .hint {
      color: #4a5663;
      max-width: 760px;
    }
  `,
})
export class InviteColleague {
  readonly labId = input.required<string>();
  /** The new membership or invitation, for the lists above. */
  readonly invited = output<LabMemberInviteResult>();
  private readonly service = inject(LabMembersService);
  private readonly snackBar = inject(MatSnackBar);
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, zodValidator(Email)]],
    name: ['', [Validators.required]],
    isManager: [false],
  });
  protected readonly submit = new FormSubmit(this.form);

  protected save(): void {
    const invite = this.submit.parse(LabMemberInvite, this.form.getRawValue());
    if (!invite) return;
    this.submit.run(this.service.invite(this.labId(), invite), (result) => {
      this.invited.emit(result);
      this.form.reset({ email: '', name: '', isManager: false });
      this.snackBar.open(invitedMessage(result, invite.email), 'Close', { duration: 5000 });
    });
  }
}
