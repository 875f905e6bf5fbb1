import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import type { AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';

/** Asks the lab manager to confirm ending an assessor's access now. Closes with true to revoke. */
@Component({
  selector: 'app-revoke-grant-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatDialogModule, MatButtonModule],
  template: `
    <h2 mat-dialog-title>Revoke access for {{ grant.assessorName }}?</h2>
    <mat-dialog-content>
      <p>
        {{ grant.assessorName }} ({{ grant.assessorEmail }}) will no longer see this lab's rounds,
        reports, investigations and instrument checks. This takes effect at once and cannot be
        undone; to give access again, grant it anew.
      </p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">Keep access</button>
      <button mat-flat-button type="button" [mat-dialog-close]="true" data-testid="confirm-revoke">
        Revoke access
      </button>
    </mat-dialog-actions>
  `,
})
export class RevokeGrantDialog {
  protected readonly grant = inject<AssessorGrantDto>(MAT_DIALOG_DATA);
}
