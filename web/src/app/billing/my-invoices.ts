import { CurrencyPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  signal,
  type OnInit,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { ActivatedRoute } from '@angular/router';
import {
  BillingDetailsInput,
  INVOICE_STATUS_LABELS,
  type Invoice,
  type InvoiceStatus,
} from '@ringlet/shared/contracts/billing';
import { AuthService } from '../core/auth-service';
import { problemMessage } from '../core/problem';
import { applyZodIssues, errorMessage } from '../core/zod-form-errors';
import { BillingService } from './billing-service';

const STATUS_ICON: Record<InvoiceStatus, string> = {
  issued: 'schedule',
  paid: 'check_circle',
  credited: 'undo',
};

/** The lab's invoices (under My lab): status, PDF, pay by card; and its billing details. */
@Component({
  selector: 'app-my-invoices',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    CurrencyPipe,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
  ],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Invoices</h1>
      @if (paidId()) {
        <p class="notice paid" role="status" data-testid="payment-confirmation">
          <mat-icon>check_circle</mat-icon>
          @if (paidInvoice()?.status === 'paid') {
            Payment received for invoice {{ paidInvoice()?.number }}. Thank you; the PDF is now your
            receipt.
          } @else {
            Thank you. The invoice shows Paid as soon as the payment service confirms it.
          }
        </p>
      }
      @if (cancelledId()) {
        <p class="notice" role="status">Payment cancelled; nothing was charged.</p>
      }
      @if (!loading() && invoices().length === 0) {
        <p>No invoices yet. A round with a participation fee invoices your lab when it enrols.</p>
      }
      <ul class="invoices" aria-label="Invoices">
        @for (inv of invoices(); track inv.id) {
          <li class="invoice" [attr.data-testid]="'invoice-' + inv.number">
            <div class="head">
              <strong>{{ inv.number }}</strong>
              <span>Round {{ inv.roundCode }} · {{ inv.roundTitle }}</span>
            </div>
            <div class="amount">
              {{ inv.totalMinor / 100 | currency: inv.currency }}
              <small
                >incl. tax {{ inv.taxMinor / 100 | currency: inv.currency }} · due
                {{ inv.dueOn }}</small
              >
            </div>
            <span [class]="'status ' + inv.status" data-testid="invoice-status">
              <mat-icon aria-hidden="true">{{ icon[inv.status] }}</mat-icon>
              {{ labels[inv.status] }}
              @if (inv.status === 'paid') {
                <small>{{ inv.paidOn }}</small>
              }
              @if (inv.creditNote) {
                <small>credit note {{ inv.creditNote.number }}</small>
              }
            </span>
            <span class="actions">
              <a mat-stroked-button [href]="pdfUrl(inv.id)" download>
                <mat-icon>download</mat-icon>
                {{ inv.status === 'paid' ? 'Receipt (PDF)' : 'Invoice (PDF)' }}
              </a>
              @if (inv.status === 'issued') {
                <button
                  mat-flat-button
                  type="button"
                  [disabled]="busy()"
                  (click)="pay(inv)"
                  [attr.aria-label]="'Pay invoice ' + inv.number + ' by card'"
                >
                  <mat-icon>credit_card</mat-icon> Pay by card
                </button>
              }
            </span>
          </li>
        }
      </ul>

      @if (isManager()) {
        <h2>Billing details</h2>
        <p class="hint">Printed on your invoices; unpaid invoices take the new details.</p>
        <form [formGroup]="form" (ngSubmit)="saveDetails()" class="details" novalidate>
          <mat-form-field>
            <mat-label>Name to bill</mat-label>
            <input matInput formControlName="billingName" required maxlength="200" />
            <mat-error>{{ errorMessage(form.controls.billingName) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Address</mat-label>
            <textarea matInput formControlName="address" rows="3" maxlength="600"></textarea>
            <mat-error>{{ errorMessage(form.controls.address) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>VAT / tax id</mat-label>
            <input matInput formControlName="taxId" maxlength="40" />
            <mat-error>{{ errorMessage(form.controls.taxId) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Purchase-order number (optional)</mat-label>
            <input matInput formControlName="poNumber" maxlength="60" />
            <mat-error>{{ errorMessage(form.controls.poNumber) }}</mat-error>
          </mat-form-field>
          <button mat-flat-button type="submit" [disabled]="busy()">Save billing details</button>
        </form>
      }
    </section>
  `,
  styles: `
    .invoices {
      list-style: none;
      padding: 0;
      display: grid;
      gap: 12px;
      max-width: 960px;
    }
    .invoice {
      display: grid;
      grid-template-columns: 2fr 1.3fr 1fr auto;
      gap: 12px;
      align-items: center;
      padding: 12px 16px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 8px;
    }
    .head,
    .amount {
      display: flex;
      flex-direction: column;
    }
    .status {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      font-weight: 600;
    }
    .status small {
      font-weight: 400;
    }
    .status.issued {
      color: #8a5a00;
    }
    .status.paid {
      color: #1b6f6a;
    }
    .status.credited {
      color: #5b6470;
    }
    .actions {
      display: inline-flex;
      gap: 8px;
    }
    .notice {
      display: flex;
      gap: 8px;
      align-items: center;
      padding: 8px 12px;
      border-radius: 6px;
      background: #eef3f8;
    }
    .notice.paid {
      background: #e3f3f1;
      color: #1b6f6a;
    }
    .details {
      display: grid;
      max-width: 520px;
    }
  `,
})
export class MyInvoices implements OnInit {
  private readonly api = inject(BillingService);
  private readonly auth = inject(AuthService);
  private readonly snack = inject(MatSnackBar);
  private readonly route = inject(ActivatedRoute);
  protected readonly labels = INVOICE_STATUS_LABELS;
  protected readonly icon = STATUS_ICON;
  protected readonly errorMessage = errorMessage;
  protected readonly invoices = signal<Invoice[]>([]);
  protected readonly loading = signal(true);
  protected readonly busy = signal(false);
  protected readonly paidId = signal<string | null>(null);
  protected readonly cancelledId = signal<string | null>(null);
  protected readonly paidInvoice = computed(() =>
    this.invoices().find((i) => i.id === this.paidId()),
  );
  protected readonly isManager = computed(() => {
    const me = this.auth.me();
    if (!me) return false;
    const acting = me.actingLabId ?? me.memberships[0]?.organisationId;
    return me.memberships.some((m) => m.organisationId === acting && m.isManager);
  });
  protected readonly form = inject(NonNullableFormBuilder).group({
    billingName: [''],
    address: [''],
    taxId: [''],
    poNumber: [''],
  });

  ngOnInit(): void {
    const q = this.route.snapshot.queryParamMap;
    this.paidId.set(q.get('paid'));
    this.cancelledId.set(q.get('cancelled'));
    this.load();
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

  private load(): void {
    this.api.myInvoices().subscribe({
      next: (list) => {
        this.invoices.set(list);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }

  protected pdfUrl(id: string): string {
    return this.api.pdfUrl(id);
  }

  protected pay(inv: Invoice): void {
    this.busy.set(true);
    this.api.checkout(inv.id).subscribe({
      next: (c) => window.location.assign(c.url),
      error: (err: unknown) => {
        this.busy.set(false);
        this.snack.open(problemMessage(err), 'Close', { duration: 8000 });
      },
    });
  }

  protected saveDetails(): void {
    const parsed = BillingDetailsInput.safeParse(this.form.getRawValue());
    if (!parsed.success) {
      applyZodIssues(this.form, parsed.error.issues);
      return;
    }
    this.busy.set(true);
    this.api.saveDetails(parsed.data).subscribe({
      next: () => {
        this.busy.set(false);
        this.snack.open('Billing details saved.', 'Close', { duration: 4000 });
        this.load();
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.snack.open(problemMessage(err), 'Close', { duration: 8000 });
      },
    });
  }
}
