import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { CreditNoteInput } from '@ringlet/shared/contracts/billing';
import { errorMessage, parseForm } from '../../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../../shared/dialog-actions';
import type { LedgerDialogData } from '../mark-paid-dialog/mark-paid-dialog';

/** Credits the invoice of a withdrawn lab with a reason (issues a credit note). */
@Component({
  selector: 'app-credit-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [...FORM_DIALOG_IMPORTS],
  templateUrl: './credit-dialog.html',
})
export class CreditDialog {
  protected readonly data = inject<LedgerDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<CreditDialog, string>);
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({ reason: [''] });

  protected save(): void {
    const { value } = parseForm(this.form, CreditNoteInput);
    if (value) this.ref.close(value.reason);
  }
}
