import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, Validators } from '@angular/forms';
import {
  PRECISION_DECISION_LABELS,
  PrecisionWithdrawBody,
  type PrecisionAnalysis,
  type PrecisionExclusion,
} from '@ringlet/shared/contracts/precision';
import { errorMessage } from '../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../shared/dialog-submit';
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
  imports: [FORM_DIALOG_IMPORTS],
  templateUrl: './withdraw-dialog.html',
})
export class WithdrawDialog {
  protected readonly data = dialogData<WithdrawDialogData>();
  private readonly service = inject(PrecisionService);
  protected readonly errorMessage = errorMessage;
  protected readonly decisionLabel = PRECISION_DECISION_LABELS[this.data.decision.decision];
  protected readonly form = inject(NonNullableFormBuilder).group({
    reason: ['', Validators.required],
  });
  protected readonly submit = new DialogSubmit<PrecisionAnalysis>(this.form);

  protected save(): void {
    const { roundId, decision } = this.data;
    this.submit.submitAndClose(PrecisionWithdrawBody, this.form.getRawValue(), (body) =>
      this.service.withdraw(roundId, decision.id, body),
    );
  }
}
