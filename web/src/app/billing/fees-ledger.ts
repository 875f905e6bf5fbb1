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
import { AgGridAngular } from 'ag-grid-angular';
import {
  CellStyleModule,
  ClientSideRowModelModule,
  ModuleRegistry,
  TextFilterModule,
  type ColDef,
} from 'ag-grid-community';
import {
  INVOICE_STATUS_LABELS,
  PAYMENT_METHOD_LABELS,
  type Invoice,
  type Ledger,
  type LedgerRow,
} from '@ringlet/shared/contracts/billing';
import type { Observable } from 'rxjs';
import { problemMessage } from '../core/problem';
import { ActionCell, type RowAction } from '../grid/action-cell';
import { ringletGridTheme } from '../grid/grid-theme';
import { BillingService } from './billing-service';
import { CreditDialog, MarkPaidDialog } from './ledger-dialogs';

ModuleRegistry.registerModules([ClientSideRowModelModule, TextFilterModule, CellStyleModule]);

const STATUS_COLOURS: Record<LedgerRow['status'], string> = {
  issued: '#8a5a00',
  paid: '#1b6f6a',
  credited: '#5b6470',
};

/** The coordinator's fees ledger of a round: who paid, bank transfers, reminders, credits. */
@Component({
  selector: 'app-fees-ledger',
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [CurrencyPipe],
  imports: [
    AgGridAngular,
    CurrencyPipe,
    MatButtonModule,
    MatIconModule,
    MatSlideToggleModule,
    RouterLink,
  ],
  template: `
    <section class="page">
      <p><a [routerLink]="['/desk/rounds', id()]">← Round</a></p>
      <h1 data-testid="page-heading">
        Fees ledger{{ ledger() ? ' · ' + ledger()!.roundCode : '' }}
      </h1>
      @if (ledger(); as l) {
        <dl class="totals" data-testid="ledger-totals">
          <div>
            <dt>Issued</dt>
            <dd>{{ l.totals.issuedMinor / 100 | currency: l.currency }}</dd>
          </div>
          <div>
            <dt>Paid</dt>
            <dd>{{ l.totals.paidMinor / 100 | currency: l.currency }}</dd>
          </div>
          <div class="outstanding">
            <dt>Outstanding</dt>
            <dd>{{ l.totals.outstandingMinor / 100 | currency: l.currency }}</dd>
          </div>
          <div>
            <dt>Credited</dt>
            <dd>{{ l.totals.creditedMinor / 100 | currency: l.currency }}</dd>
          </div>
        </dl>
        <div class="page-actions">
          <a mat-stroked-button [href]="workbookUrl()" download>
            <mat-icon>table_view</mat-icon> Export workbook
          </a>
          <mat-slide-toggle [checked]="l.shipUnpaid" (change)="setShipUnpaid($event.checked)">
            Ship test items to labs with unpaid fees
          </mat-slide-toggle>
        </div>
      }
      <ag-grid-angular
        class="grid-box"
        [theme]="theme"
        [loadThemeGoogleFonts]="false"
        [rowData]="ledger()?.rows ?? []"
        [columnDefs]="columns"
        [getRowId]="rowId"
        [loading]="loading()"
        aria-label="Invoices of the round"
      />
    </section>
  `,
  styles: `
    .totals {
      display: flex;
      gap: 32px;
      margin: 8px 0 16px;
    }
    .totals dt {
      font-size: 0.85rem;
      color: #5b6470;
    }
    .totals dd {
      margin: 0;
      font-size: 1.3rem;
      font-weight: 600;
    }
    .totals .outstanding dd {
      color: #8a5a00;
    }
    .page-actions {
      display: flex;
      gap: 24px;
      align-items: center;
      margin-bottom: 12px;
    }
  `,
})
export class FeesLedger implements OnInit {
  /** The round id (route parameter, bound by withComponentInputBinding). */
  readonly id = input.required<string>();
  private readonly api = inject(BillingService);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly currency = inject(CurrencyPipe);
  protected readonly theme = ringletGridTheme;
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

  protected readonly columns: ColDef<LedgerRow>[] = [
    { field: 'organisationName', headerName: 'Lab', flex: 1, minWidth: 160, filter: true },
    { field: 'participantCode', headerName: 'Code', width: 90 },
    { field: 'number', headerName: 'Invoice', width: 130 },
    {
      field: 'status',
      headerName: 'Status',
      width: 160,
      valueFormatter: ({ data }) =>
        data
          ? data.feeOutstanding
            ? '● Fee outstanding'
            : `${data.status === 'paid' ? '✓' : '↺'} ${INVOICE_STATUS_LABELS[data.status]}`
          : '',
      cellStyle: (p) => ({ color: p.data ? STATUS_COLOURS[p.data.status] : '', fontWeight: 600 }),
    },
    {
      field: 'totalMinor',
      headerName: 'Total',
      width: 120,
      type: 'rightAligned',
      valueFormatter: ({ value }) => this.money(value as number),
    },
    {
      colId: 'payment',
      headerName: 'Payment',
      width: 200,
      valueGetter: ({ data }) =>
        data?.paidMethod
          ? `${PAYMENT_METHOD_LABELS[data.paidMethod]} ${data.paidOn ?? ''} ${data.paidReference ?? ''}`
          : data?.creditNoteNumber
            ? `Credit note ${data.creditNoteNumber}`
            : '',
    },
    { field: 'remindersSent', headerName: 'Reminders', width: 100, type: 'rightAligned' },
    {
      field: 'enrolmentState',
      headerName: 'Enrolment',
      width: 110,
      valueFormatter: ({ data }) =>
        data
          ? data.enrolmentState === 'withdrawn'
            ? 'Withdrawn'
            : data.dispatched
              ? 'Dispatched'
              : 'Enrolled'
          : '',
    },
    {
      colId: 'actions',
      headerName: '',
      width: 270,
      sortable: false,
      cellRenderer: ActionCell,
      cellRendererParams: { actions: this.actions },
    },
  ];

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
