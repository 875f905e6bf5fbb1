import * as z from 'zod';
import { Id, Timestamp } from './common';
import { dateOnly, multiLine, singleLine } from './ranges';
import { EnrolmentState } from './rounds';

/**
 * Participation fees: a lab's billing details, invoices (one per enrolment in a round with a
 * fee), credit notes, card payment and the coordinator's ledger. Money is always an integer
 * number of minor units (cents) with its ISO 4217 currency code; never a float.
 */

/** Largest amount in minor units (the round fee's bound, 1,000,000.00). */
export const MONEY_MAX_MINOR = 100_000_000;
/** Tax rates in basis points (1 % = 100 bp); 0 to 100 %. */
export const TAX_RATE_MAX_BP = 10_000;

export const MinorUnits = z
  .number()
  .int()
  .min(0)
  .max(MONEY_MAX_MINOR * 2);
/** A sum over many invoices. */
const Total = z.number().int().min(0).max(Number.MAX_SAFE_INTEGER);
export const Currency = z.string().regex(/^[A-Z]{3}$/, 'Use a three-letter currency code.');

/**
 * Net, tax and total of an invoice in minor units. The tax is rounded half up to the nearest
 * minor unit, all in integers (common practice: tax per invoice, rounded commercially).
 */
export function invoiceAmounts(
  netMinor: number,
  taxRateBp: number,
): { netMinor: number; taxMinor: number; totalMinor: number } {
  if (!Number.isSafeInteger(netMinor) || netMinor < 0) throw new RangeError('netMinor');
  if (!Number.isSafeInteger(taxRateBp) || taxRateBp < 0 || taxRateBp > TAX_RATE_MAX_BP)
    throw new RangeError('taxRateBp');
  const taxMinor = Math.floor((netMinor * taxRateBp + 5_000) / 10_000);
  return { netMinor, taxMinor, totalMinor: netMinor + taxMinor };
}

/** "INV-2026-0001": series prefix, year, number within the year (at least four digits). */
export function documentNumber(prefix: 'INV' | 'CN', year: number, seq: number): string {
  return `${prefix}-${year}-${String(seq).padStart(4, '0')}`;
}

export const InvoiceStatus = z.enum(['issued', 'paid', 'credited']);
export type InvoiceStatus = z.infer<typeof InvoiceStatus>;
export const INVOICE_STATUS_LABELS: Record<InvoiceStatus, string> = {
  issued: 'Awaiting payment',
  paid: 'Paid',
  credited: 'Credited',
};

export const PaymentMethod = z.enum(['card', 'bank-transfer']);
export type PaymentMethod = z.infer<typeof PaymentMethod>;
export const PAYMENT_METHOD_LABELS: Record<PaymentMethod, string> = {
  card: 'Card',
  'bank-transfer': 'Bank transfer',
};

/** What the lab enters for its invoices (the lab's name is the default billing name). */
export const BillingDetailsInput = z.object({
  billingName: singleLine(200, { min: 1, required: 'Enter the name to bill.' }),
  address: multiLine(600, { trim: true }),
  taxId: singleLine(40),
  /** The lab's purchase-order number, printed on its invoices (optional). */
  poNumber: singleLine(60),
});
export type BillingDetailsInput = z.infer<typeof BillingDetailsInput>;

export const BillingDetails = z.object({
  organisationId: Id,
  billingName: z.string(),
  address: z.string(),
  taxId: z.string(),
  poNumber: z.string(),
  updatedAt: Timestamp.nullable(),
});
export type BillingDetails = z.infer<typeof BillingDetails>;

export const CreditNote = z.object({
  id: Id,
  number: z.string(),
  invoiceId: Id,
  netMinor: MinorUnits,
  taxMinor: MinorUnits,
  totalMinor: MinorUnits,
  currency: Currency,
  reason: z.string(),
  issuedAt: Timestamp,
});
export type CreditNote = z.infer<typeof CreditNote>;

export const Invoice = z.object({
  id: Id,
  number: z.string(),
  roundId: Id,
  roundCode: z.string(),
  roundTitle: z.string(),
  enrolmentId: Id,
  organisationId: Id,
  organisationName: z.string(),
  participantCode: z.string(),
  billTo: z.object({
    billingName: z.string(),
    address: z.string(),
    taxId: z.string(),
    poNumber: z.string(),
  }),
  netMinor: MinorUnits,
  taxRateBp: z.number().int().min(0).max(TAX_RATE_MAX_BP),
  taxMinor: MinorUnits,
  totalMinor: MinorUnits,
  currency: Currency,
  status: InvoiceStatus,
  issuedAt: Timestamp,
  dueOn: z.string(),
  paidAt: Timestamp.nullable(),
  paidOn: z.string().nullable(),
  paidMethod: PaymentMethod.nullable(),
  paidReference: z.string().nullable(),
  remindersSent: z.number().int().min(0),
  lastRemindedAt: Timestamp.nullable(),
  creditNote: CreditNote.nullable(),
});
export type Invoice = z.infer<typeof Invoice>;

export const InvoiceList = z.array(Invoice);

/** Where the browser goes to pay: the hosted checkout page. */
export const CheckoutAnswer = z.object({ url: z.url(), sessionId: z.string() });
export type CheckoutAnswer = z.infer<typeof CheckoutAnswer>;

/** The coordinator records a bank transfer. */
export const BankTransferInput = z.object({
  reference: singleLine(100, { min: 1, required: 'Enter the bank reference.' }),
  paidOn: dateOnly('Paid on'),
});
export type BankTransferInput = z.infer<typeof BankTransferInput>;

export const CreditNoteInput = z.object({
  reason: singleLine(300, { min: 3, required: 'Say why the invoice is credited.' }),
});
export type CreditNoteInput = z.infer<typeof CreditNoteInput>;

/** Whether a lab with an unpaid invoice still gets its test items (a round setting). */
export const RoundBillingSettings = z.object({ shipUnpaid: z.boolean() });
export type RoundBillingSettings = z.infer<typeof RoundBillingSettings>;

/** One lab's line in a round's ledger (coordinator only). */
export const LedgerRow = z.object({
  invoiceId: Id,
  number: z.string(),
  organisationName: z.string(),
  participantCode: z.string(),
  enrolmentState: EnrolmentState,
  dispatched: z.boolean(),
  status: InvoiceStatus,
  totalMinor: MinorUnits,
  paidMinor: MinorUnits,
  outstandingMinor: MinorUnits,
  creditedMinor: MinorUnits,
  paidMethod: PaymentMethod.nullable(),
  paidOn: z.string().nullable(),
  paidReference: z.string().nullable(),
  remindersSent: z.number().int(),
  creditNoteNumber: z.string().nullable(),
  /** True when the lab has not paid: only the coordinator sees it. */
  feeOutstanding: z.boolean(),
});
export type LedgerRow = z.infer<typeof LedgerRow>;

export const Ledger = z.object({
  roundId: Id,
  roundCode: z.string(),
  currency: Currency,
  feeMinor: MinorUnits,
  shipUnpaid: z.boolean(),
  rows: z.array(LedgerRow),
  totals: z.object({
    issuedMinor: Total,
    paidMinor: Total,
    outstandingMinor: Total,
    creditedMinor: Total,
  }),
});
export type Ledger = z.infer<typeof Ledger>;

/** Money in words for files and mail: 576.00 EUR (the minor unit is a hundredth). */
export function moneyText(minor: number, currency: string): string {
  const sign = minor < 0 ? '-' : '';
  const abs = Math.abs(minor);
  return `${sign}${Math.floor(abs / 100).toLocaleString('en-GB')}.${String(abs % 100).padStart(2, '0')} ${currency}`;
}

/** Days from issue to the due date printed on an invoice (common practice: 30 days net). */
export const PAYMENT_TERM_DAYS = 30;
