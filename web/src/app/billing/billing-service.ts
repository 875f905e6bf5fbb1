import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, map } from 'rxjs';
import {
  BillingDetails,
  CheckoutAnswer,
  Invoice,
  InvoiceList,
  Ledger,
  RoundBillingSettings,
  type BankTransferInput,
  type BillingDetailsInput,
} from '@ringlet/shared/contracts/billing';
import { API } from '../core/api';

/** Participation fees: the lab's invoices and card payment; the coordinator's ledger. */
@Injectable({ providedIn: 'root' })
export class BillingService {
  private readonly http = inject(HttpClient);

  myInvoices(): Observable<Invoice[]> {
    return this.http.get<unknown>(`${API}/my/invoices`).pipe(map((b) => InvoiceList.parse(b)));
  }

  details(): Observable<BillingDetails> {
    return this.http
      .get<unknown>(`${API}/my/billing-details`)
      .pipe(map((b) => BillingDetails.parse(b)));
  }

  saveDetails(input: BillingDetailsInput): Observable<BillingDetails> {
    return this.http
      .put<unknown>(`${API}/my/billing-details`, input)
      .pipe(map((b) => BillingDetails.parse(b)));
  }

  checkout(id: string): Observable<CheckoutAnswer> {
    return this.http
      .post<unknown>(`${API}/invoices/${id}/checkout`, {})
      .pipe(map((b) => CheckoutAnswer.parse(b)));
  }

  pdfUrl(id: string): string {
    return `${API}/invoices/${id}.pdf`;
  }

  ledger(roundId: string): Observable<Ledger> {
    return this.http
      .get<unknown>(`${API}/rounds/${roundId}/ledger`)
      .pipe(map((b) => Ledger.parse(b)));
  }

  ledgerWorkbookUrl(roundId: string): string {
    return `${API}/rounds/${roundId}/ledger.xlsx`;
  }

  setShipUnpaid(roundId: string, shipUnpaid: boolean): Observable<RoundBillingSettings> {
    return this.http
      .put<unknown>(`${API}/rounds/${roundId}/billing-settings`, { shipUnpaid })
      .pipe(map((b) => RoundBillingSettings.parse(b)));
  }

  markPaid(id: string, input: BankTransferInput): Observable<Invoice> {
    return this.http
      .post<unknown>(`${API}/invoices/${id}/payment`, input)
      .pipe(map((b) => Invoice.parse(b)));
  }

  remind(id: string): Observable<Invoice> {
    return this.http
      .post<unknown>(`${API}/invoices/${id}/reminder`, {})
      .pipe(map((b) => Invoice.parse(b)));
  }

  credit(id: string, reason: string): Observable<Invoice> {
    return this.http
      .post<unknown>(`${API}/invoices/${id}/credit-note`, { reason })
      .pipe(map((b) => Invoice.parse(b)));
  }
}
