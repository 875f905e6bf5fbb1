/**
 * Participation fees: an invoice per enrolment (gapless numbers per provider and year, amounts
 * in integer minor units), card payment through the hosted-payment SDK (stripe) with a signed,
 * idempotent webhook, bank transfers recorded by the coordinator, reminders, credit notes, the
 * round's ledger and the rule that may hold back test items from a lab that has not paid.
 */
import Stripe from 'stripe';
import { In, type EntityManager } from 'typeorm';
import {
  BillingDetails as DetailsRow,
  CreditNote as CreditNoteRow,
  Enrolment,
  Invoice as InvoiceRow,
  Organisation,
  PaymentEvent,
  Round,
  RoundBilling,
  Shipment,
} from '../../../db/entities';
import type { BillTo } from '../../../db/entities/invoice';
import {
  documentNumber,
  invoiceAmounts,
  moneyText,
  PAYMENT_TERM_DAYS,
  type BankTransferInput,
  type BillingDetails,
  type BillingDetailsInput,
  type CheckoutAnswer,
  type CreditNote,
  type Invoice,
  type Ledger,
  type LedgerRow,
  type RoundBillingSettings,
} from '../../../shared/contracts/billing';
import type { PaymentSettings } from '../config';
import { hasAnyRole, labIds, managesLab, type SessionUser } from '../auth/session-user';
import { conflict, forbidden, ServiceError, notFound, ruleBroken } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';
import { sendSafely } from './enrolment';
import { labRecipients } from './lab-recipients';

// ------------------------------------------------------------------ the SDK

const clients = new WeakMap<PaymentSettings, Stripe>();

/** The SDK client for the configured service (the real one, or the local fake via host/port/protocol). */
export function paymentClient(settings: PaymentSettings): Stripe {
  let c = clients.get(settings);
  if (!c) {
    c = new Stripe(settings.secretKey, {
      ...(settings.api ?? {}),
      telemetry: false,
      maxNetworkRetries: 1,
      timeout: 20_000,
    });
    clients.set(settings, c);
  }
  return c;
}

function payments(ctx: AppContext): PaymentSettings {
  if (!ctx.config.payments)
    throw new ServiceError(
      503,
      'payments_unavailable',
      'Card payment is not set up on this server; pay by bank transfer quoting the invoice number.',
    );
  return ctx.config.payments;
}

// ------------------------------------------------------------------ numbers and DTOs

/**
 * The next number of a gapless series: the counter row of (provider, series, year) is created or
 * incremented and stays locked until the caller's transaction ends, so concurrent issues wait in
 * turn and a rolled-back issue gives its number back.
 */
export async function nextNumber(
  em: EntityManager,
  series: 'invoice' | 'credit-note',
  year: number,
): Promise<number> {
  const rows: { last_number: number }[] = await em.query(
    `INSERT INTO billing_counter (provider_id, series, year, last_number) VALUES (1, $1, $2, 1)
     ON CONFLICT (provider_id, series, year)
     DO UPDATE SET last_number = billing_counter.last_number + 1
     RETURNING last_number`,
    [series, year],
  );
  return rows[0]!.last_number;
}

const isoDate = (d: Date) => d.toISOString().slice(0, 10);

function creditDto(c: CreditNoteRow): CreditNote {
  return {
    id: c.id,
    number: c.number,
    invoiceId: c.invoiceId,
    netMinor: c.netMinor,
    taxMinor: c.taxMinor,
    totalMinor: c.totalMinor,
    currency: c.currency,
    reason: c.reason,
    issuedAt: c.issuedAt.toISOString(),
  };
}

async function invoiceDtos(em: EntityManager, rows: InvoiceRow[]): Promise<Invoice[]> {
  if (!rows.length) return [];
  const rounds = await em.findBy(Round, { id: In([...new Set(rows.map((r) => r.roundId))]) });
  const orgs = await em.findBy(Organisation, {
    id: In([...new Set(rows.map((r) => r.organisationId))]),
  });
  const enrolments = await em.findBy(Enrolment, { id: In(rows.map((r) => r.enrolmentId)) });
  const credits = await em
    .createQueryBuilder(CreditNoteRow, 'c')
    .where('c.invoice_id IN (:...ids)', { ids: rows.map((r) => r.id) })
    .getMany();
  const round = new Map(rounds.map((r) => [r.id, r]));
  const org = new Map(orgs.map((o) => [o.id, o]));
  const enr = new Map(enrolments.map((e) => [e.id, e]));
  const credit = new Map(credits.map((c) => [c.invoiceId, c]));
  return rows.map((r) => {
    const c = credit.get(r.id);
    return {
      id: r.id,
      number: r.number,
      roundId: r.roundId,
      roundCode: round.get(r.roundId)?.code ?? '',
      roundTitle: round.get(r.roundId)?.title ?? '',
      enrolmentId: r.enrolmentId,
      organisationId: r.organisationId,
      organisationName: org.get(r.organisationId)?.name ?? '',
      participantCode: enr.get(r.enrolmentId)?.participantCode ?? '',
      billTo: r.billTo,
      netMinor: r.netMinor,
      taxRateBp: r.taxRateBp,
      taxMinor: r.taxMinor,
      totalMinor: r.totalMinor,
      currency: r.currency,
      status: r.status,
      issuedAt: r.issuedAt.toISOString(),
      dueOn: r.dueOn,
      paidAt: r.paidAt?.toISOString() ?? null,
      paidOn: r.paidOn,
      paidMethod: r.paidMethod,
      paidReference: r.paidReference,
      remindersSent: r.remindersSent,
      lastRemindedAt: r.lastRemindedAt?.toISOString() ?? null,
      creditNote: c ? creditDto(c) : null,
    };
  });
}

async function invoiceDto(em: EntityManager, row: InvoiceRow): Promise<Invoice> {
  return (await invoiceDtos(em, [row]))[0]!;
}

async function lockInvoice(em: EntityManager, id: string): Promise<InvoiceRow> {
  const row = await em.findOne(InvoiceRow, { where: { id }, lock: { mode: 'pessimistic_write' } });
  if (!row) throw notFound('The invoice');
  return row;
}

const isCoordinator = (u: SessionUser) => hasAnyRole(u, ['coordinator', 'admin']);

/** A lab member sees the lab's invoices; coordinators (and admins) see all; others get 404. */
function canSee(u: SessionUser, inv: InvoiceRow): boolean {
  return isCoordinator(u) || u.memberships.some((m) => m.organisationId === inv.organisationId);
}

// ------------------------------------------------------------------ billing details

async function billTo(em: EntityManager, organisationId: string): Promise<BillTo> {
  const d = await em.findOne(DetailsRow, { where: { organisationId } });
  if (d)
    return { billingName: d.billingName, address: d.address, taxId: d.taxId, poNumber: d.poNumber };
  const org = await em.findOne(Organisation, { where: { id: organisationId } });
  return { billingName: org?.name ?? '', address: '', taxId: '', poNumber: '' };
}

function actingLabOf(user: SessionUser): string {
  const ids = labIds(user);
  if (ids.length !== 1)
    throw ruleBroken('lab_not_chosen', 'Choose the lab you act for first (the lab chooser).');
  return ids[0]!;
}

export async function myBillingDetails(
  ctx: AppContext,
  user: SessionUser,
): Promise<BillingDetails> {
  const organisationId = actingLabOf(user);
  const d = await ctx.ds.manager.findOne(DetailsRow, { where: { organisationId } });
  const b = await billTo(ctx.ds.manager, organisationId);
  return { organisationId, ...b, updatedAt: d?.updatedAt.toISOString() ?? null };
}

/** The lab manager sets what invoices are addressed to; unpaid invoices take the new details. */
export async function updateMyBillingDetails(
  ctx: AppContext,
  user: SessionUser,
  input: BillingDetailsInput,
): Promise<BillingDetails> {
  const organisationId = actingLabOf(user);
  if (!managesLab(user, organisationId))
    throw forbidden('Only the lab’s manager changes its billing details.');
  await ctx.ds.transaction(async (em) => {
    await em.upsert(
      DetailsRow,
      { organisationId, ...input, updatedAt: new Date(), updatedBy: user.id },
      ['organisationId'],
    );
    await audit(em, user.id, 'billing-details.updated', 'organisation', organisationId, {
      ...input,
    });
    const open = await em.find(InvoiceRow, { where: { organisationId, status: 'issued' } });
    for (const inv of open) {
      await em.update(InvoiceRow, { id: inv.id }, { billTo: { ...input } });
      await audit(em, user.id, 'invoice.bill-to-updated', 'invoice', inv.id, {
        number: inv.number,
        from: inv.billTo,
        to: input,
      });
    }
  });
  return myBillingDetails(ctx, user);
}

// ------------------------------------------------------------------ issuing

/**
 * Issues the participation-fee invoice of a new enrolment, inside the enrolment's transaction
 * (nothing for a round without a fee, or when one exists). Returns the invoice's id.
 */
export async function issueInvoiceForEnrolment(
  em: EntityManager,
  actorId: string | null,
  enrolment: { id: string; roundId: string; organisationId: string },
  issuedAt: Date = new Date(),
): Promise<string | null> {
  const round = await em.findOne(Round, { where: { id: enrolment.roundId } });
  if (!round || round.feeMinor <= 0) return null;
  if (await em.findOne(InvoiceRow, { where: { enrolmentId: enrolment.id } })) return null;
  const rate: { tax_rate_bp: number }[] = await em.query(
    'SELECT tax_rate_bp FROM provider_profile WHERE id = 1',
  );
  const taxRateBp = rate[0]?.tax_rate_bp ?? 0;
  const amounts = invoiceAmounts(round.feeMinor, taxRateBp);
  const year = issuedAt.getUTCFullYear();
  const seq = await nextNumber(em, 'invoice', year);
  const number = documentNumber('INV', year, seq);
  const row = await em.save(
    InvoiceRow,
    em.create(InvoiceRow, {
      year,
      seq,
      number,
      roundId: round.id,
      enrolmentId: enrolment.id,
      organisationId: enrolment.organisationId,
      billTo: await billTo(em, enrolment.organisationId),
      taxRateBp,
      ...amounts,
      currency: round.currency,
      status: 'issued',
      issuedAt,
      dueOn: isoDate(new Date(issuedAt.getTime() + PAYMENT_TERM_DAYS * 86_400_000)),
    }),
  );
  await audit(em, actorId, 'invoice.issued', 'invoice', row.id, {
    number,
    roundId: round.id,
    enrolmentId: enrolment.id,
    ...amounts,
    taxRateBp,
    currency: round.currency,
  });
  return row.id;
}

/** E-mails the lab that its invoice was issued (after the enrolment's transaction). */
export async function mailInvoiceIssued(ctx: AppContext, enrolmentId: string): Promise<void> {
  const inv = await ctx.ds.manager.findOne(InvoiceRow, { where: { enrolmentId } });
  if (!inv) return;
  const d = await invoiceDto(ctx.ds.manager, inv);
  await mailLab(ctx, inv.organisationId, {
    subject: `Invoice ${d.number} for round ${d.roundCode}`,
    text:
      `Hello,\n\nThe participation fee for proficiency-testing round ${d.roundCode} (${d.roundTitle}) ` +
      `is invoiced: ${d.number}, ${moneyText(d.totalMinor, d.currency)} (tax included), due ${d.dueOn}.\n\n` +
      `Find the invoice, download it or pay by card under My lab → Invoices: ${ctx.config.publicUrl}/billing\n\n` +
      `To pay by bank transfer, quote the invoice number.\n\nRinglet`,
  });
}

async function mailLab(
  ctx: AppContext,
  organisationId: string,
  mail: { subject: string; text: string },
): Promise<void> {
  const to = await labRecipients(ctx.ds.manager, organisationId);
  if (to.length) await sendSafely(ctx, { to, ...mail });
}

// ------------------------------------------------------------------ reading

export async function myInvoices(ctx: AppContext, user: SessionUser): Promise<Invoice[]> {
  const ids = labIds(user);
  if (!ids.length) return [];
  const rows = await ctx.ds
    .getRepository(InvoiceRow)
    .createQueryBuilder('i')
    .where('i.organisation_id IN (:...ids)', { ids })
    .orderBy('i.issued_at', 'DESC')
    .addOrderBy('i.number', 'DESC')
    .getMany();
  return invoiceDtos(ctx.ds.manager, rows);
}

export async function invoiceFor(ctx: AppContext, user: SessionUser, id: string): Promise<Invoice> {
  const row = await ctx.ds.manager.findOne(InvoiceRow, { where: { id } });
  if (!row || !canSee(user, row)) throw notFound('The invoice');
  return invoiceDto(ctx.ds.manager, row);
}

// ------------------------------------------------------------------ card payment

/** Opens a hosted checkout for an unpaid invoice; the browser goes to the answered url. */
export async function startCheckout(
  ctx: AppContext,
  user: SessionUser,
  id: string,
): Promise<CheckoutAnswer> {
  const settings = payments(ctx);
  const inv = await invoiceFor(ctx, user, id);
  if (!user.memberships.some((m) => m.organisationId === inv.organisationId))
    throw forbidden('Only a member of the invoiced lab pays its invoice.');
  if (inv.status !== 'issued')
    throw conflict(
      'invoice_not_open',
      inv.status === 'paid' ? 'This invoice is already paid.' : 'This invoice was credited.',
    );
  let session: Stripe.Checkout.Session;
  try {
    session = await paymentClient(settings).checkout.sessions.create({
      mode: 'payment',
      client_reference_id: inv.id,
      metadata: { invoiceId: inv.id, invoiceNumber: inv.number },
      line_items: [
        {
          quantity: 1,
          price_data: {
            currency: inv.currency.toLowerCase(),
            unit_amount: inv.totalMinor,
            product_data: {
              name: `Participation fee, round ${inv.roundCode} (invoice ${inv.number})`,
            },
          },
        },
      ],
      success_url: `${ctx.config.publicUrl}/billing?paid=${inv.id}`,
      cancel_url: `${ctx.config.publicUrl}/billing?cancelled=${inv.id}`,
    });
  } catch (err) {
    ctx.log('checkout session could not be created', err);
    throw new ServiceError(
      502,
      'payment_service_error',
      'The payment service did not answer; try again in a minute.',
    );
  }
  if (!session.url) throw new ServiceError(502, 'payment_service_error', 'No checkout page.');
  await ctx.ds.transaction(async (em) => {
    await em.update(InvoiceRow, { id: inv.id }, { checkoutSessionId: session.id });
    await audit(em, user.id, 'invoice.checkout-started', 'invoice', inv.id, {
      number: inv.number,
      sessionId: session.id,
    });
  });
  return { url: session.url, sessionId: session.id };
}

export interface WebhookAnswer {
  received: true;
  outcome: string;
}

/**
 * The payment service's webhook: the signature is checked on the raw body by the SDK (400 when
 * it fails); each event id is stored once, so a replay changes nothing; a completed checkout
 * marks its invoice paid when amount and currency match; other events are acknowledged.
 */
export async function handleWebhook(
  ctx: AppContext,
  raw: Buffer,
  signature: string | undefined,
): Promise<WebhookAnswer> {
  const settings = payments(ctx);
  let event: Stripe.Event;
  try {
    event = paymentClient(settings).webhooks.constructEvent(
      raw,
      signature ?? '',
      settings.webhookSecret,
    );
  } catch {
    throw new ServiceError(400, 'signature_invalid', 'The webhook signature does not verify.');
  }
  const completed =
    event.type === 'checkout.session.completed' ||
    event.type === 'checkout.session.async_payment_succeeded';
  const session = completed ? (event.data.object as Stripe.Checkout.Session) : null;
  const result = await ctx.ds.transaction(async (em) => {
    const inserted: { id: string }[] = await em.query(
      `INSERT INTO payment_event (provider_event_id, type, outcome) VALUES ($1, $2, 'received')
       ON CONFLICT (provider_event_id) DO NOTHING RETURNING id`,
      [event.id, event.type],
    );
    if (!inserted.length) return { outcome: 'duplicate', paid: null };
    const eventRow = inserted[0]!.id;
    const done = async (outcome: string, invoiceId: string | null = null) => {
      await em.update(PaymentEvent, { id: eventRow }, { outcome, invoiceId });
      return outcome;
    };
    if (!session) return { outcome: await done('ignored'), paid: null };
    const invoiceId = session.client_reference_id ?? session.metadata?.['invoiceId'] ?? '';
    const inv = /^[0-9a-f-]{36}$/i.test(invoiceId)
      ? await em.findOne(InvoiceRow, {
          where: { id: invoiceId },
          lock: { mode: 'pessimistic_write' },
        })
      : null;
    if (!inv) return { outcome: await done('unknown-invoice'), paid: null };
    if (session.payment_status !== 'paid')
      return { outcome: await done('not-paid-yet', inv.id), paid: null };
    if (
      session.amount_total !== inv.totalMinor ||
      (session.currency ?? '').toUpperCase() !== inv.currency
    ) {
      await audit(em, null, 'invoice.payment-mismatch', 'invoice', inv.id, {
        number: inv.number,
        eventId: event.id,
        amount: session.amount_total,
        currency: session.currency,
      });
      return { outcome: await done('amount-mismatch', inv.id), paid: null };
    }
    if (inv.status !== 'issued') {
      await audit(em, null, 'invoice.payment-after-close', 'invoice', inv.id, {
        number: inv.number,
        status: inv.status,
        eventId: event.id,
      });
      return { outcome: await done(`already-${inv.status}`, inv.id), paid: null };
    }
    const now = new Date();
    const reference =
      typeof session.payment_intent === 'string' ? session.payment_intent : session.id;
    await em.update(
      InvoiceRow,
      { id: inv.id },
      {
        status: 'paid',
        paidAt: now,
        paidOn: isoDate(now),
        paidMethod: 'card',
        paidReference: reference,
      },
    );
    await audit(em, null, 'invoice.paid', 'invoice', inv.id, {
      number: inv.number,
      method: 'card',
      reference,
      eventId: event.id,
    });
    return { outcome: await done('paid', inv.id), paid: inv.id };
  });
  if (result.paid) await mailPaymentReceived(ctx, result.paid);
  return { received: true, outcome: result.outcome };
}

async function mailPaymentReceived(ctx: AppContext, invoiceId: string): Promise<void> {
  const row = await ctx.ds.manager.findOne(InvoiceRow, { where: { id: invoiceId } });
  if (!row) return;
  const d = await invoiceDto(ctx.ds.manager, row);
  await mailLab(ctx, d.organisationId, {
    subject: `Payment received for invoice ${d.number}`,
    text:
      `Hello,\n\nThank you: ${moneyText(d.totalMinor, d.currency)} for invoice ${d.number} ` +
      `(round ${d.roundCode}) was received on ${d.paidOn}.\n\n` +
      `The receipt is the paid invoice, under My lab → Invoices: ${ctx.config.publicUrl}/billing\n\nRinglet`,
  });
}

// ------------------------------------------------------------------ coordinator actions

export async function markBankTransfer(
  ctx: AppContext,
  user: SessionUser,
  id: string,
  input: BankTransferInput,
): Promise<Invoice> {
  if (input.paidOn > isoDate(new Date()))
    throw ruleBroken('paid_in_future', 'paidOn: the payment date cannot lie in the future.');
  const dto = await ctx.ds.transaction(async (em) => {
    const inv = await lockInvoice(em, id);
    if (inv.status !== 'issued')
      throw conflict(
        'invoice_not_open',
        inv.status === 'paid' ? 'This invoice is already paid.' : 'This invoice was credited.',
      );
    if (input.paidOn < isoDate(inv.issuedAt))
      throw ruleBroken('paid_before_issue', 'paidOn: the payment date is before the invoice date.');
    await em.update(
      InvoiceRow,
      { id },
      {
        status: 'paid',
        paidAt: new Date(),
        paidOn: input.paidOn,
        paidMethod: 'bank-transfer',
        paidReference: input.reference,
      },
    );
    await audit(em, user.id, 'invoice.paid', 'invoice', id, {
      number: inv.number,
      method: 'bank-transfer',
      reference: input.reference,
      paidOn: input.paidOn,
    });
    return invoiceDto(em, await em.findOneByOrFail(InvoiceRow, { id }));
  });
  await mailPaymentReceived(ctx, id);
  return dto;
}

export async function sendReminder(
  ctx: AppContext,
  user: SessionUser,
  id: string,
): Promise<Invoice> {
  const dto = await ctx.ds.transaction(async (em) => {
    const inv = await lockInvoice(em, id);
    if (inv.status !== 'issued')
      throw conflict('invoice_not_open', 'Only an unpaid invoice gets a reminder.');
    await em.update(
      InvoiceRow,
      { id },
      { remindersSent: inv.remindersSent + 1, lastRemindedAt: new Date() },
    );
    await audit(em, user.id, 'invoice.reminder-sent', 'invoice', id, {
      number: inv.number,
      reminder: inv.remindersSent + 1,
    });
    return invoiceDto(em, await em.findOneByOrFail(InvoiceRow, { id }));
  });
  await mailLab(ctx, dto.organisationId, {
    subject: `Reminder: invoice ${dto.number} is unpaid`,
    text:
      `Hello,\n\nOur records show invoice ${dto.number} for round ${dto.roundCode} ` +
      `(${moneyText(dto.totalMinor, dto.currency)}, due ${dto.dueOn}) as unpaid.\n\n` +
      `Pay by card under My lab → Invoices (${ctx.config.publicUrl}/billing), or by bank transfer ` +
      `quoting the invoice number. If you have paid in the last few days, thank you and ignore this message.\n\nRinglet`,
  });
  return dto;
}

/** Issues the credit note of an invoice (inside the caller's transaction; invoice locked). */
async function credit(
  em: EntityManager,
  actorId: string | null,
  inv: InvoiceRow,
  reason: string,
): Promise<void> {
  const now = new Date();
  const year = now.getUTCFullYear();
  const seq = await nextNumber(em, 'credit-note', year);
  const number = documentNumber('CN', year, seq);
  const c = await em.save(
    CreditNoteRow,
    em.create(CreditNoteRow, {
      year,
      seq,
      number,
      invoiceId: inv.id,
      netMinor: inv.netMinor,
      taxMinor: inv.taxMinor,
      totalMinor: inv.totalMinor,
      currency: inv.currency,
      reason,
      issuedAt: now,
      issuedBy: actorId,
    }),
  );
  await em.update(InvoiceRow, { id: inv.id }, { status: 'credited' });
  await audit(em, actorId, 'invoice.credited', 'invoice', inv.id, {
    number: inv.number,
    creditNote: number,
    creditNoteId: c.id,
    reason,
    wasPaid: inv.status === 'paid',
  });
}

/** The coordinator credits the invoice of a withdrawn lab. */
export async function creditInvoice(
  ctx: AppContext,
  user: SessionUser,
  id: string,
  reason: string,
): Promise<Invoice> {
  return ctx.ds.transaction(async (em) => {
    const inv = await lockInvoice(em, id);
    if (inv.status === 'credited')
      throw conflict('already_credited', 'This invoice is already credited.');
    const e = await em.findOne(Enrolment, { where: { id: inv.enrolmentId } });
    if (e?.state !== 'withdrawn')
      throw ruleBroken(
        'enrolment_not_withdrawn',
        'Only the invoice of a withdrawn lab is credited; withdraw the enrolment first.',
      );
    await credit(em, user.id, inv, reason);
    return invoiceDto(em, await em.findOneByOrFail(InvoiceRow, { id }));
  });
}

/**
 * Called inside the withdrawal's transaction: a lab withdrawn before its test items were
 * dispatched gets a credit note for its invoice.
 */
export async function creditOnWithdrawal(
  em: EntityManager,
  actorId: string | null,
  enrolmentId: string,
  reason: string,
): Promise<void> {
  const shipment = await em.findOne(Shipment, { where: { enrolmentId } });
  if (shipment?.dispatchedOn) return;
  const inv = await em.findOne(InvoiceRow, {
    where: { enrolmentId },
    lock: { mode: 'pessimistic_write' },
  });
  if (!inv || inv.status === 'credited') return;
  await credit(em, actorId, inv, `Withdrawn before dispatch: ${reason}`.slice(0, 300));
}

// ------------------------------------------------------------------ round setting and dispatch

export async function roundBillingSettings(
  em: EntityManager,
  roundId: string,
): Promise<RoundBillingSettings> {
  if (!(await em.findOne(Round, { where: { id: roundId } }))) throw notFound('The round');
  const s = await em.findOne(RoundBilling, { where: { roundId } });
  return { shipUnpaid: s?.shipUnpaid ?? true };
}

export async function setRoundBillingSettings(
  ctx: AppContext,
  user: SessionUser,
  roundId: string,
  input: RoundBillingSettings,
): Promise<RoundBillingSettings> {
  return ctx.ds.transaction(async (em) => {
    if (!(await em.findOne(Round, { where: { id: roundId } }))) throw notFound('The round');
    await em.upsert(RoundBilling, { roundId, shipUnpaid: input.shipUnpaid }, ['roundId']);
    await audit(em, user.id, 'round.billing-settings-changed', 'round', roundId, { ...input });
    return roundBillingSettings(em, roundId);
  });
}

/** Dispatch refuses (422) when the round ships only to labs that paid and this one has not. */
export async function assertFeeAllowsDispatch(
  em: EntityManager,
  roundId: string,
  enrolmentId: string,
): Promise<void> {
  const s = await em.findOne(RoundBilling, { where: { roundId } });
  if (s?.shipUnpaid ?? true) return;
  const inv = await em.findOne(InvoiceRow, { where: { enrolmentId } });
  if (inv?.status === 'issued')
    throw ruleBroken(
      'fee_outstanding',
      `Invoice ${inv.number} is unpaid, and this round ships test items only to labs that have paid ` +
        '(round setting "Ship test items to labs with unpaid fees" is off). Record the payment in the ' +
        'round’s fees ledger, or change the setting.',
      { invoiceId: inv.id, number: inv.number },
    );
}

// ------------------------------------------------------------------ ledger

export async function roundLedger(ctx: AppContext, roundId: string): Promise<Ledger> {
  const em = ctx.ds.manager;
  const round = await em.findOne(Round, { where: { id: roundId } });
  if (!round) throw notFound('The round');
  const rows = await em.find(InvoiceRow, { where: { roundId }, order: { number: 'ASC' } });
  const dtos = await invoiceDtos(em, rows);
  const enrolments = await em.find(Enrolment, { where: { roundId } });
  const state = new Map(enrolments.map((e) => [e.id, e.state]));
  const shipped: { enrolment_id: string }[] = rows.length
    ? await em.query(
        'SELECT enrolment_id FROM shipment WHERE enrolment_id = ANY($1) AND dispatched_on IS NOT NULL',
        [rows.map((r) => r.enrolmentId)],
      )
    : [];
  const dispatched = new Set(shipped.map((s) => s.enrolment_id));
  const ledgerRows: LedgerRow[] = dtos
    .map((d) => ({
      invoiceId: d.id,
      number: d.number,
      organisationName: d.organisationName,
      participantCode: d.participantCode,
      enrolmentState: state.get(d.enrolmentId) ?? 'enrolled',
      dispatched: dispatched.has(d.enrolmentId),
      status: d.status,
      totalMinor: d.totalMinor,
      paidMinor: d.paidAt ? d.totalMinor : 0,
      outstandingMinor: d.status === 'issued' ? d.totalMinor : 0,
      creditedMinor: d.status === 'credited' ? d.totalMinor : 0,
      paidMethod: d.paidMethod,
      paidOn: d.paidOn,
      paidReference: d.paidReference,
      remindersSent: d.remindersSent,
      creditNoteNumber: d.creditNote?.number ?? null,
      feeOutstanding: d.status === 'issued',
    }))
    .sort((a, b) => a.organisationName.localeCompare(b.organisationName));
  const sum = (k: 'totalMinor' | 'paidMinor' | 'outstandingMinor' | 'creditedMinor') =>
    ledgerRows.reduce((s, r) => s + r[k], 0);
  return {
    roundId,
    roundCode: round.code,
    currency: round.currency,
    feeMinor: round.feeMinor,
    shipUnpaid: (await roundBillingSettings(em, roundId)).shipUnpaid,
    rows: ledgerRows,
    totals: {
      issuedMinor: sum('totalMinor'),
      paidMinor: sum('paidMinor'),
      outstandingMinor: sum('outstandingMinor'),
      creditedMinor: sum('creditedMinor'),
    },
  };
}
