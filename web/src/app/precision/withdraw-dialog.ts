import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import {
  PRECISION_DECISION_LABELS,
  PrecisionWithdrawBody,
  type PrecisionAnalysis,
  type PrecisionExclusion,
} from '@ringlet/shared/contracts/precision';
import { errorMessage } from '../core/zod-form-errors';
import { FormSubmit } from '../shared/form-submit';
import { PrecisionService } from './precision-service';

export interface WithdrawDialogData {
  readonly roundId: string;
  readonly decision: PrecisionExclusion;
}

/**
 * Withdraws a decision in force, with a reason; the flag it answered is open again. Stores it
 * and closes with the server's analysis; a refusal stays in the dialog.
 */
@Component({
  selector: 'app-precision-withdraw-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
  ],
  templateUrl: './withdraw-dialog.html',
})
export class WithdrawDialog {
  protected readonly data = inject<WithdrawDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<WithdrawDialog, PrecisionAnalysis>>(MatDialogRef);
  private readonly service = inject(PrecisionService);
  protected readonly errorMessage = errorMessage;
  protected readonly decisionLabel = PRECISION_DECISION_LABELS[this.data.decision.decision];
  protected readonly form = inject(NonNullableFormBuilder).group({
    reason: ['', Validators.required],
  });
  protected readonly submit = new FormSubmit(this.form);

  protected save(): void {
    const body = this.submit.parse(PrecisionWithdrawBody, this.form.getRawValue());
    if (body)
      this.submit.run(this.service.withdraw(this.data.roundId, this.data.decision.id, body), (a) =>
        this.ref.close(a),
      );
  }
}
