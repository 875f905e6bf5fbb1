import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import { BankTransferInput } from '@ringlet/shared/contracts/billing';
import { errorMessage } from '../../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../../shared/dialog-submit';

/** The ledger row a ledger dialog is about. */
export interface LedgerDialogData {
  number: string;
  organisationName: string;
}

/** Records a bank transfer: reference and the date the money arrived. */
@Component({
  selector: 'app-mark-paid-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [...FORM_DIALOG_IMPORTS],
  templateUrl: './mark-paid-dialog.html',
})
export class MarkPaidDialog {
  protected readonly data = dialogData<LedgerDialogData>();
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    reference: [''],
    paidOn: [new Date().toISOString().slice(0, 10)],
  });
  protected readonly submission = new DialogSubmit<BankTransferInput>(this.form);

  protected save(): void {
    const value = this.submission.parse(BankTransferInput, this.form.getRawValue());
    if (value) this.submission.close(value);
  }
}
