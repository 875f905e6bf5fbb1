import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import { CreditNoteInput } from '@ringlet/shared/contracts/billing';
import { errorMessage } from '../../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../../shared/dialog-submit';
import type { LedgerDialogData } from '../mark-paid-dialog/mark-paid-dialog';

/** Credits the invoice of a withdrawn lab with a reason (issues a credit note). */
@Component({
  selector: 'app-credit-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [...FORM_DIALOG_IMPORTS],
  templateUrl: './credit-dialog.html',
})
export class CreditDialog {
  protected readonly data = dialogData<LedgerDialogData>();
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({ reason: [''] });
  protected readonly submission = new DialogSubmit<string>(this.form);

  protected save(): void {
    const value = this.submission.parse(CreditNoteInput, this.form.getRawValue());
    if (value) this.submission.close(value.reason);
  }
}
