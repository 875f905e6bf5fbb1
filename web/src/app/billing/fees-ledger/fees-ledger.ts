import { CurrencyPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  inject,
  input,
  signal,
  type OnInit,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RouterLink } from '@angular/router';
import {
  CellStyleModule,
  ClientSideRowModelModule,
  ModuleRegistry,
  TextFilterModule,
} from 'ag-grid-community';
import type { Invoice, Ledger, LedgerRow } from '@ringlet/shared/contracts/billing';
import type { Observable } from 'rxjs';
import { problemMessage } from '../../core/problem';
import type { RowAction } from '../../grid/action-cell';
import { PageGrid } from '../../shared/page-grid';
import { BillingService } from '../billing-service';
import { CreditDialog } from '../credit-dialog/credit-dialog';
import { MarkPaidDialog } from '../mark-paid-dialog/mark-paid-dialog';
import { LedgerTotals } from '../ledger-totals/ledger-totals';
import { ledgerColumns } from './ledger-columns';

ModuleRegistry.registerModules([ClientSideRowModelModule, TextFilterModule, CellStyleModule]);

/** The coordinator's fees ledger of a round: who paid, bank transfers, reminders, credits. */
@Component({
  selector: 'app-fees-ledger',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [CurrencyPipe],
  imports: [
    LedgerTotals,
    MatButtonModule,
    MatIconModule,
    MatSlideToggleModule,
    PageGrid,
    RouterLink,
  ],
  templateUrl: './fees-ledger.html',
  styleUrl: './fees-ledger.scss',
})
export class FeesLedger implements OnInit {
  /** The round id (route parameter, bound by withComponentInputBinding). */
  readonly id = input.required<string>();
  private readonly api = inject(BillingService);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly currency = inject(CurrencyPipe);
  protected readonly ledger = signal<Ledger | null>(null);
  protected readonly loading = signal(true);
  protected readonly rowId = (p: { data: LedgerRow }) => p.data.invoiceId;

  private money(minor: number): string {
    return this.currency.transform(minor / 100, this.ledger()?.currency ?? 'EUR') ?? '';
  }

  private readonly actions: RowAction<LedgerRow>[] = [
    {
      label: 'Mark paid',
      ariaLabel: (r) => `Record a bank transfer for ${r.organisationName}`,
      run: (r) => this.markPaid(r),
    },
    {
      label: 'Remind',
      ariaLabel: (r) => `Send ${r.organisationName} a payment reminder`,
      run: (r) => this.act(this.api.remind(r.invoiceId), `Reminder sent to ${r.organisationName}.`),
    },
    {
      label: 'Credit',
      ariaLabel: (r) => `Credit the invoice of ${r.organisationName}`,
      run: (r) => this.credit(r),
    },
  ];

  protected readonly columns = ledgerColumns((minor) => this.money(minor), this.actions);

  ngOnInit(): void {
    this.reload();
  }

  protected workbookUrl(): string {
    return this.api.ledgerWorkbookUrl(this.id());
  }

  private reload(): void {
    this.api.ledger(this.id()).subscribe({
      next: (l) => {
        this.ledger.set(l);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }

  private act(call: Observable<unknown>, done: string): void {
    call.subscribe({
      next: () => {
        this.snack.open(done, 'Close', { duration: 4000 });
        this.reload();
      },
      error: (err: unknown) => this.snack.open(problemMessage(err), 'Close', { duration: 8000 }),
    });
  }

  protected setShipUnpaid(value: boolean): void {
    this.act(
      this.api.setShipUnpaid(this.id(), value),
      value
        ? 'Labs with unpaid fees get their test items.'
        : 'Test items go only to labs that have paid.',
    );
  }

  private markPaid(r: LedgerRow): void {
    this.dialog
      .open(MarkPaidDialog, { data: r, width: '440px', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((input: { reference: string; paidOn: string } | undefined) => {
        if (input)
          this.act(this.api.markPaid(r.invoiceId, input), `${r.number} is recorded as paid.`);
      });
  }

  private credit(r: LedgerRow): void {
    this.dialog
      .open(CreditDialog, { data: r, width: '440px', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((reason: string | undefined) => {
        if (reason)
          this.act(
            this.api.credit(r.invoiceId, reason) as Observable<Invoice>,
            `${r.number} is credited.`,
          );
      });
  }
}
