import { CurrencyPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { Ledger } from '@ringlet/shared/contracts/billing';

/** The sums of a round's fees ledger, in the order the coordinator reads them. */
const TOTALS: { label: string; key: keyof Ledger['totals'] }[] = [
  { label: 'Issued', key: 'issuedMinor' },
  { label: 'Paid', key: 'paidMinor' },
  { label: 'Outstanding', key: 'outstandingMinor' },
  { label: 'Credited', key: 'creditedMinor' },
];

/** The totals above a round's fees ledger: issued, paid, outstanding, credited. */
@Component({
  selector: 'app-ledger-totals',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CurrencyPipe],
  templateUrl: './ledger-totals.html',
  styleUrl: './ledger-totals.scss',
})
export class LedgerTotals {
  readonly ledger = input.required<Pick<Ledger, 'totals' | 'currency'>>();
  protected readonly totals = TOTALS;
}
