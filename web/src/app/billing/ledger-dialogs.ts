import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { BankTransferInput, CreditNoteInput } from '@ringlet/shared/contracts/billing';
import { applyZodIssues, errorMessage } from '../core/zod-form-errors';

export interface LedgerDialogData {
  number: string;
  organisationName: string;
}

/** Records a bank transfer: reference and the date the money arrived. */
@Component({
  selector: 'app-mark-paid-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
  ],
  template: `
    <h2 mat-dialog-title>Record bank transfer · {{ data.number }}</h2>
    <form [formGroup]="form" (ngSubmit)="save()" novalidate>
      <mat-dialog-content>
        <p>{{ data.organisationName }}</p>
        <mat-form-field>
          <mat-label>Bank reference</mat-label>
          <input matInput formControlName="reference" required maxlength="100" cdkFocusInitial />
          <mat-error>{{ errorMessage(form.controls.reference) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Paid on</mat-label>
          <input matInput formControlName="paidOn" type="date" required />
          <mat-error>{{ errorMessage(form.controls.paidOn) }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit">Mark paid</button>
      </mat-dialog-actions>
    </form>
  `,
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
    const parsed = BankTransferInput.safeParse(this.form.getRawValue());
    if (!parsed.success) {
      applyZodIssues(this.form, parsed.error.issues);
      return;
    }
    this.ref.close(parsed.data);
  }
}

/** Credits the invoice of a withdrawn lab with a reason (issues a credit note). */
@Component({
  selector: 'app-credit-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
  ],
  template: `
    <h2 mat-dialog-title>Credit invoice {{ data.number }}</h2>
    <form [formGroup]="form" (ngSubmit)="save()" novalidate>
      <mat-dialog-content>
        <p>{{ data.organisationName }} withdrew. A credit note cancels the invoice in full.</p>
        <mat-form-field>
          <mat-label>Reason</mat-label>
          <input matInput formControlName="reason" required maxlength="300" cdkFocusInitial />
          <mat-error>{{ errorMessage(form.controls.reason) }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit">Issue credit note</button>
      </mat-dialog-actions>
    </form>
  `,
})
export class CreditDialog {
  protected readonly data = inject<LedgerDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<CreditDialog, string>);
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({ reason: [''] });

  protected save(): void {
    const parsed = CreditNoteInput.safeParse(this.form.getRawValue());
    if (!parsed.success) {
      applyZodIssues(this.form, parsed.error.issues);
      return;
    }
    this.ref.close(parsed.data.reason);
  }
}
