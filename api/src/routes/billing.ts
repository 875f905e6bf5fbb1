import express, { type RequestHandler } from 'express';
import * as z from 'zod';
import {
  BankTransferInput,
  BillingDetails,
  BillingDetailsInput,
  CheckoutAnswer,
  CreditNoteInput,
  Invoice,
  InvoiceList,
  Ledger,
  RoundBillingSettings,
} from '../../../shared/contracts/billing';
import { IdParams } from '../../../shared/contracts/common';
import { buildLedgerWorkbook } from '../../../reports/excel/ledger-workbook';
import { buildInvoicePdf } from '../../../reports/pdf/invoice';
import { fileSafe } from '../../../reports/text';
import { sendDownload } from '../http/downloads';
import type { ApiRouter } from '../http/route';
import {
  creditInvoice,
  handleWebhook,
  invoiceFor,
  markBankTransfer,
  myBillingDetails,
  myInvoices,
  roundBillingSettings,
  roundLedger,
  sendReminder,
  setRoundBillingSettings,
  startCheckout,
  updateMyBillingDetails,
} from '../services/billing';
import type { AppContext } from '../services/context';
import { reportProvider } from '../services/provider';

/** Where the payment service posts its events (below /api/v1). */
export const WEBHOOK_PATH = '/api/v1/payments/webhook';
/** The largest event body the webhook reads. */
const WEBHOOK_MAX_BYTES = 128 * 1024;

/**
 * The raw-body parser of the webhook route only (registered before express.json): the signature
 * is computed over the exact bytes. The bytes are kept in res.locals, the body left empty.
 */
export function webhookRawBody(): RequestHandler[] {
  return [
    express.raw({ type: () => true, limit: WEBHOOK_MAX_BYTES }),
    (req, res, next) => {
      res.locals['rawBody'] = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
      req.body = undefined;
      next();
    },
  ];
}

const coordinators = ['coordinator'] as const;

/** Participation fees: invoices, card payment, the webhook, the round's ledger. */
export function billingRoutes(api: ApiRouter, ctx: AppContext): void {
  api.add({
    method: 'get',
    path: '/my/invoices',
    tag: 'billing',
    summary: 'The invoices of the lab you act for (newest first)',
    access: ['lab'],
    response: InvoiceList,
    handler: ({ user }) => myInvoices(ctx, user),
  });
  api.add({
    method: 'get',
    path: '/my/billing-details',
    tag: 'billing',
    summary: 'What the lab’s invoices are addressed to',
    access: ['lab'],
    response: BillingDetails,
    handler: ({ user }) => myBillingDetails(ctx, user),
  });
  api.add({
    method: 'put',
    path: '/my/billing-details',
    tag: 'billing',
    summary: 'Set the lab’s billing name, address, VAT/tax id and purchase-order number',
    description: 'Lab manager only. Unpaid invoices take the new details; paid ones keep theirs.',
    access: ['lab'],
    body: BillingDetailsInput,
    response: BillingDetails,
    handler: ({ user, body }) => updateMyBillingDetails(ctx, user, body),
  });
  api.add({
    method: 'get',
    path: '/invoices/{id}.pdf',
    tag: 'billing',
    summary: 'The invoice as PDF; once paid it is the receipt',
    access: ['lab', 'coordinator', 'admin'],
    params: IdParams,
    produces: 'application/pdf',
    handler: async ({ user, params, res }) => {
      const invoice = await invoiceFor(ctx, user, params.id);
      const pdf = await buildInvoicePdf({
        invoice,
        provider: await reportProvider(ctx.ds.manager),
        generatedAt: new Date().toISOString(),
      });
      sendDownload(res, {
        file: pdf,
        contentType: 'application/pdf',
        fileName: `${fileSafe(invoice.number)}${invoice.status === 'paid' ? '-receipt' : ''}.pdf`,
      });
    },
  });
  api.add({
    method: 'get',
    path: '/invoices/{id}',
    tag: 'billing',
    summary: 'One invoice (a member of the lab, or the coordinator)',
    access: ['lab', 'coordinator', 'admin'],
    params: IdParams,
    response: Invoice,
    handler: ({ user, params }) => invoiceFor(ctx, user, params.id),
  });
  api.add({
    method: 'post',
    path: '/invoices/{id}/checkout',
    tag: 'billing',
    summary: 'Start paying an invoice by card: answers the hosted checkout page to go to',
    access: ['lab'],
    params: IdParams,
    response: CheckoutAnswer,
    handler: ({ user, params }) => startCheckout(ctx, user, params.id),
  });
  api.add({
    method: 'post',
    path: '/payments/webhook',
    tag: 'billing',
    summary: 'Events from the payment service (signed; Stripe-Signature header)',
    description:
      'Verified on the raw body with the webhook secret: 400 when the signature fails. Each event id is processed once; a replay answers 200 and changes nothing.',
    access: 'public',
    csrfExempt: true,
    response: z.object({ received: z.literal(true), outcome: z.string() }),
    handler: ({ req, res }) =>
      handleWebhook(
        ctx,
        res.locals['rawBody'] as Buffer,
        req.get('stripe-signature')?.slice(0, 2000),
      ),
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}/ledger',
    tag: 'billing',
    summary: 'The round’s fees ledger: issued, paid, outstanding and credited, with totals',
    access: coordinators,
    params: IdParams,
    response: Ledger,
    handler: ({ params }) => roundLedger(ctx, params.id),
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}/ledger.xlsx',
    tag: 'billing',
    summary: 'The round’s fees ledger as a workbook',
    access: coordinators,
    params: IdParams,
    produces: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    handler: async ({ params, res }) => {
      const ledger = await roundLedger(ctx, params.id);
      const file = await buildLedgerWorkbook(ledger, new Date());
      sendDownload(res, {
        file,
        contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
        fileName: `fees-${fileSafe(ledger.roundCode)}.xlsx`,
      });
    },
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}/billing-settings',
    tag: 'billing',
    summary: 'Whether the round ships test items to labs with unpaid fees',
    access: coordinators,
    params: IdParams,
    response: RoundBillingSettings,
    handler: ({ params }) => roundBillingSettings(ctx.ds.manager, params.id),
  });
  api.add({
    method: 'put',
    path: '/rounds/{id}/billing-settings',
    tag: 'billing',
    summary: 'Set whether the round ships test items to labs with unpaid fees',
    description:
      'Off: recording a dispatch to a lab with an unpaid invoice answers 422 fee_outstanding.',
    access: coordinators,
    params: IdParams,
    body: RoundBillingSettings,
    response: RoundBillingSettings,
    handler: ({ user, params, body }) => setRoundBillingSettings(ctx, user, params.id, body),
  });
  api.add({
    method: 'post',
    path: '/invoices/{id}/payment',
    tag: 'billing',
    summary: 'Record a bank transfer: the invoice is paid (reference and date)',
    access: coordinators,
    params: IdParams,
    body: BankTransferInput,
    response: Invoice,
    handler: ({ user, params, body }) => markBankTransfer(ctx, user, params.id, body),
  });
  api.add({
    method: 'post',
    path: '/invoices/{id}/reminder',
    tag: 'billing',
    summary: 'E-mail the lab a payment reminder',
    access: coordinators,
    params: IdParams,
    response: Invoice,
    handler: ({ user, params }) => sendReminder(ctx, user, params.id),
  });
  api.add({
    method: 'post',
    path: '/invoices/{id}/credit-note',
    tag: 'billing',
    summary: 'Credit the invoice of a withdrawn lab (issues a credit note)',
    access: coordinators,
    params: IdParams,
    body: CreditNoteInput,
    response: Invoice,
    handler: ({ user, params, body }) => creditInvoice(ctx, user, params.id, body.reason),
  });
}
