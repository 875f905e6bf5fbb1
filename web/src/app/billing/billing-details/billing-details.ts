import { ChangeDetectionStrategy, Component, inject, output, type OnInit } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { BillingDetailsInput } from '@ringlet/shared/contracts/billing';
import { errorMessage } from '../../core/zod-form-errors';
import { FormSubmit } from '../../shared/form-submit';
import { BillingService } from '../billing-service';

/** The lab manager's billing details, printed on the lab's invoices. */
@Component({
  selector: 'app-billing-details',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  templateUrl: './billing-details.html',
  styleUrl: './billing-details.scss',
})
export class BillingDetails implements OnInit {
  private readonly api = inject(BillingService);
  private readonly snack = inject(MatSnackBar);
  /** The details were saved (unpaid invoices now print them). */
  readonly saved = output<void>();
  protected readonly errorMessage = errorMessage;
  protected readonly form = inject(NonNullableFormBuilder).group({
    billingName: [''],
    address: [''],
    taxId: [''],
    poNumber: [''],
  });
  protected readonly submission = new FormSubmit(this.form);

  ngOnInit(): void {
    this.api.details().subscribe({
      next: (d) =>
        this.form.setValue({
          billingName: d.billingName,
          address: d.address,
          taxId: d.taxId,
          poNumber: d.poNumber,
        }),
      error: () => undefined,
    });
  }

  protected saveDetails(): void {
    this.submission.submit(
      BillingDetailsInput,
      this.form.getRawValue(),
      (details) => this.api.saveDetails(details),
      () => {
        this.snack.open('Billing details saved.', 'Close', { duration: 4000 });
        this.saved.emit();
      },
    );
  }
}
