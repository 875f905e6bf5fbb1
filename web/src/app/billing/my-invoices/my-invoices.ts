import { CurrencyPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  signal,
  type OnInit,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { ActivatedRoute } from '@angular/router';
import { INVOICE_STATUS_LABELS, type Invoice } from '@ringlet/shared/contracts/billing';
import { AuthService } from '../../core/auth-service';
import { problemMessage } from '../../core/problem';
import { BillingService } from '../billing-service';
import { BillingDetails } from '../billing-details/billing-details';
import { STATUS_ICON, managesActingLab, pdfLabel } from './invoice-view';

/** The lab's invoices (under My lab): status, PDF, pay by card; and its billing details. */
@Component({
  selector: 'app-my-invoices',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CurrencyPipe, MatButtonModule, MatIconModule, BillingDetails],
  templateUrl: './my-invoices.html',
  styleUrl: './my-invoices.scss',
})
export class MyInvoices implements OnInit {
  private readonly api = inject(BillingService);
  private readonly auth = inject(AuthService);
  private readonly snack = inject(MatSnackBar);
  private readonly route = inject(ActivatedRoute);
  protected readonly labels = INVOICE_STATUS_LABELS;
  protected readonly icon = STATUS_ICON;
  protected readonly pdfLabel = pdfLabel;
  protected readonly invoices = signal<Invoice[]>([]);
  protected readonly loading = signal(true);
  protected readonly busy = signal(false);
  protected readonly paidId = signal<string | null>(null);
  protected readonly cancelledId = signal<string | null>(null);
  protected readonly paidInvoice = computed(() =>
    this.invoices().find((i) => i.id === this.paidId()),
  );
  protected readonly isManager = computed(() => managesActingLab(this.auth.me()));

  ngOnInit(): void {
    const q = this.route.snapshot.queryParamMap;
    this.paidId.set(q.get('paid'));
    this.cancelledId.set(q.get('cancelled'));
    this.load();
  }

  protected load(): void {
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
}
