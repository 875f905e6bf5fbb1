/**
 * A round's fees ledger as a workbook (exceljs): one row per invoice with its status, amounts
 * and payment, and a totals row. Amounts are written in major units (minor units / 100) with
 * two decimals and the round's currency in the header; user text goes through neutraliseFormula.
 */
import ExcelJS from 'exceljs';
import {
  INVOICE_STATUS_LABELS,
  PAYMENT_METHOD_LABELS,
  type Ledger,
} from '../../shared/contracts/billing';
import { neutraliseFormula as t } from '../text';

const MONEY_FORMAT = '#,##0.00';

export async function buildLedgerWorkbook(ledger: Ledger, generatedAt: Date): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Ringlet';
  wb.created = generatedAt;
  const ws = wb.addWorksheet('Fees ledger', { views: [{ state: 'frozen', ySplit: 3 }] });
  ws.addRow([t(`Fees ledger, round ${ledger.roundCode}`)]).font = { bold: true, size: 13 };
  ws.addRow([`Made ${generatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`]);
  const c = ledger.currency;
  const header = ws.addRow([
    'Invoice',
    'Lab',
    'Participant code',
    'Enrolment',
    'Status',
    `Total (${c})`,
    `Paid (${c})`,
    `Outstanding (${c})`,
    `Credited (${c})`,
    'Paid on',
    'Method',
    'Reference',
    'Reminders',
    'Credit note',
  ]);
  header.font = { bold: true, color: { argb: 'FFFFFFFF' } };
  header.fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FF1F3A5F' } };
  const m = (minor: number) => minor / 100;
  for (const r of ledger.rows) {
    ws.addRow([
      t(r.number),
      t(r.organisationName),
      t(r.participantCode),
      r.enrolmentState,
      INVOICE_STATUS_LABELS[r.status],
      m(r.totalMinor),
      m(r.paidMinor),
      m(r.outstandingMinor),
      m(r.creditedMinor),
      r.paidOn ?? '',
      r.paidMethod ? PAYMENT_METHOD_LABELS[r.paidMethod] : '',
      t(r.paidReference ?? ''),
      r.remindersSent,
      t(r.creditNoteNumber ?? ''),
    ]);
  }
  const totals = ws.addRow([
    'Totals',
    '',
    '',
    '',
    '',
    m(ledger.totals.issuedMinor),
    m(ledger.totals.paidMinor),
    m(ledger.totals.outstandingMinor),
    m(ledger.totals.creditedMinor),
  ]);
  totals.font = { bold: true };
  for (const col of [6, 7, 8, 9]) ws.getColumn(col).numFmt = MONEY_FORMAT;
  ws.columns.forEach((col, i) => (col.width = [14, 32, 14, 11, 18][i] ?? 14));
  return Buffer.from(await wb.xlsx.writeBuffer());
}
