import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { BankTransferInput } from '@ringlet/shared/contracts/billing';
import { errorMessage, parseForm } from '../../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../../shared/dialog-actions';

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
  protected readonly data = inject<LedgerDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<MarkPaidDialog, BankTransferInput>);
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    reference: [''],
    paidOn: [new Date().toISOString().slice(0, 10)],
  });

  protected save(): void {
    const { value } = parseForm(this.form, BankTransferInput);
    if (value) this.ref.close(value);
  }
}
