/**
 * The participation-fee invoice (PDF, one A4 page) under the PT provider's identity. When it is
 * paid the same file is the receipt: a PAID stamp and the payment's date, method and reference.
 * A credited invoice says so and names its credit note. Amounts come as integer minor units.
 */
import {
  INVOICE_STATUS_LABELS,
  moneyText,
  PAYMENT_METHOD_LABELS,
  type Invoice,
} from '../../shared/contracts/billing';
import type { ReportProviderInfo } from '../model';
import { PALETTE } from '../text';
import { FONT } from './fonts';
import { artifact, createDoc, figure, finishDoc, MARGIN, table, write } from './document';

export interface InvoicePdfInput {
  invoice: Invoice;
  provider: ReportProviderInfo;
  generatedAt: string;
}

const percent = (bp: number) => `${(bp / 100).toFixed(bp % 100 === 0 ? 0 : 2)} %`;

export async function buildInvoicePdf(input: InvoicePdfInput): Promise<Buffer> {
  const { invoice: inv, provider: p } = input;
  const paid = inv.status === 'paid';
  const title = paid ? `Receipt for invoice ${inv.number}` : `Invoice ${inv.number}`;
  const { doc, done } = createDoc({
    title,
    subject: `Participation fee, round ${inv.roundCode}`,
    footer: `${p.name || 'PT provider'} · invoice ${inv.number} · ${INVOICE_STATUS_LABELS[inv.status].toLowerCase()} · round ${inv.roundCode} · participant ${inv.participantCode}`,
    author: p.name,
    keywords: 'invoice, participation fee, proficiency testing',
    createdAt: new Date(inv.issuedAt),
    modifiedAt: new Date(input.generatedAt),
  });
  const width = doc.page.width - 2 * MARGIN;
  const half = width / 2 - 10;
  const top = doc.y;

  // Provider (left) and the document's own head (right).
  if (p.logo) {
    figure(doc, `Logo of ${p.name || 'the PT provider'}`, () => {
      try {
        doc.image(p.logo!.data, MARGIN, top, { fit: [140, 44] });
      } catch {
        // An unreadable logo is left out rather than failing the invoice.
      }
    });
    doc.y = top + 52;
  }
  write(doc, p.name || 'PT provider (name not yet set in the provider profile)', {
    x: MARGIN,
    width: half,
    size: 12,
    bold: true,
    colour: PALETTE.ink,
  });
  const providerLines = [p.address, p.contactEmail, p.contactPhone, p.website].filter(Boolean);
  if (providerLines.length)
    write(doc, providerLines.join('\n'), { x: MARGIN, width: half, size: 9, gap: 2 });
  const leftBottom = doc.y;

  doc.outline.addItem(title);
  write(doc, paid ? 'Invoice and receipt' : 'Invoice', {
    x: MARGIN + half + 20,
    y: top,
    width: half,
    align: 'right',
    size: 22,
    bold: true,
    colour: PALETTE.ink,
    tag: 'H1',
  });
  write(
    doc,
    [
      `Number: ${inv.number}`,
      `Date: ${inv.issuedAt.slice(0, 10)}`,
      `Due: ${inv.dueOn}`,
      `Status: ${INVOICE_STATUS_LABELS[inv.status]}`,
    ].join('\n'),
    { x: MARGIN + half + 20, width: half, align: 'right', size: 10 },
  );
  doc.y = Math.max(doc.y, leftBottom) + 16;

  // Bill to.
  write(doc, 'Bill to', { x: MARGIN, size: 9, bold: true, colour: PALETTE.grey });
  const b = inv.billTo;
  const billLines = [
    b.billingName || inv.organisationName,
    ...b.address.split('\n'),
    b.taxId ? `VAT / tax id: ${b.taxId}` : '',
    b.poNumber ? `Purchase order: ${b.poNumber}` : '',
  ].filter((l) => l.trim());
  billLines.forEach((l, i) =>
    write(doc, l, { x: MARGIN, size: 10, gap: i === billLines.length - 1 ? 14 : 0 }),
  );

  // The line and the sums.
  const money = (m: number) => moneyText(m, inv.currency);
  table(
    doc,
    [
      { title: 'Description', width: width - 190 },
      { title: 'Quantity', width: 60, align: 'right' },
      { title: 'Amount', width: 130, align: 'right' },
    ],
    [
      [
        `Participation fee, PT round ${inv.roundCode} (participant ${inv.participantCode})`,
        '1',
        money(inv.netMinor),
      ],
      ['Net', '', money(inv.netMinor)],
      [`Tax ${percent(inv.taxRateBp)}`, '', money(inv.taxMinor)],
      [{ text: 'Total', bold: true }, '', { text: money(inv.totalMinor), bold: true }],
    ],
    10,
  );
  write(doc, `Round: ${inv.roundCode}, ${inv.roundTitle}.`, { x: MARGIN, size: 9, gap: 12 });

  if (paid) {
    write(
      doc,
      `Received with thanks on ${inv.paidOn ?? inv.paidAt?.slice(0, 10) ?? ''} by ${inv.paidMethod ? PAYMENT_METHOD_LABELS[inv.paidMethod].toLowerCase() : 'payment'}` +
        `${inv.paidReference ? `, reference ${inv.paidReference}` : ''}. This document is your receipt.`,
      { x: MARGIN, size: 10.5, bold: true, colour: PALETTE.teal, gap: 10 },
    );
    // The stamp: decoration, its words are in the sentence above.
    const sx = doc.page.width - MARGIN - 190;
    const sy = doc.y + 16;
    artifact(doc, () => {
      doc.save();
      doc.rotate(-12, { origin: [sx + 80, sy + 30] });
      doc.roundedRect(sx, sy, 160, 60, 6).lineWidth(3).strokeColor(PALETTE.teal, 0.85).stroke();
      doc.font(FONT.bold).fontSize(30).fillColor(PALETTE.teal, 0.85);
      doc.text('PAID', sx, sy + 9, { width: 160, align: 'center', lineBreak: false });
      doc.fontSize(9).text(inv.paidOn ?? '', sx, sy + 44, {
        width: 160,
        align: 'center',
        lineBreak: false,
      });
      doc.restore();
    });
  } else if (inv.status === 'credited' && inv.creditNote) {
    write(
      doc,
      `Cancelled by credit note ${inv.creditNote.number} of ${inv.creditNote.issuedAt.slice(0, 10)} (${money(inv.creditNote.totalMinor)}): ${inv.creditNote.reason}. Nothing is owed on this invoice.`,
      { x: MARGIN, size: 10.5, bold: true, colour: PALETTE.carmine, gap: 10 },
    );
  } else {
    write(
      doc,
      `Please pay ${money(inv.totalMinor)} by ${inv.dueOn}: by card in Ringlet (My lab, Invoices), or by bank transfer quoting ${inv.number}.`,
      { x: MARGIN, size: 10.5, gap: 10 },
    );
  }
  if (paid) doc.y += 100;
  if (p.accreditationNumber)
    write(
      doc,
      `PT provider accredited to ISO/IEC 17043${p.accreditationBody ? ` by ${p.accreditationBody}` : ''}, number ${p.accreditationNumber}.`,
      { x: MARGIN, size: 8.5, colour: PALETTE.grey },
    );
  finishDoc(doc);
  return done;
}
