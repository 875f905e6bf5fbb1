import type { ColDef } from 'ag-grid-community';
import {
  INVOICE_STATUS_LABELS,
  PAYMENT_METHOD_LABELS,
  type LedgerRow,
} from '@ringlet/shared/contracts/billing';
import { ActionCell, type RowAction } from '../../grid/action-cell';

/** The colour of each invoice status in the ledger (the shape and word stand beside it). */
export const STATUS_COLOURS: Record<LedgerRow['status'], string> = {
  issued: '#8a5a00',
  paid: '#1b6f6a',
  credited: '#5b6470',
};

type StatusFacts = Pick<LedgerRow, 'status' | 'feeOutstanding'>;
type PaymentFacts = Pick<LedgerRow, 'paidMethod' | 'paidOn' | 'paidReference' | 'creditNoteNumber'>;
type EnrolmentFacts = Pick<LedgerRow, 'enrolmentState' | 'dispatched'>;

/** The status cell: an outstanding fee first, else a shape and the status word. */
export function statusText(row: StatusFacts): string {
  if (row.feeOutstanding) return '● Fee outstanding';
  return `${row.status === 'paid' ? '✓' : '↺'} ${INVOICE_STATUS_LABELS[row.status]}`;
}

/** The payment cell: how and when it was paid, or the credit note that cancelled it. */
export function paymentText(row: PaymentFacts): string {
  if (row.paidMethod)
    return `${PAYMENT_METHOD_LABELS[row.paidMethod]} ${row.paidOn ?? ''} ${row.paidReference ?? ''}`;
  return row.creditNoteNumber ? `Credit note ${row.creditNoteNumber}` : '';
}

/** The enrolment cell: withdrawn, or whether the test items have been sent. */
export function enrolmentText(row: EnrolmentFacts): string {
  if (row.enrolmentState === 'withdrawn') return 'Withdrawn';
  return row.dispatched ? 'Dispatched' : 'Enrolled';
}

/** The ledger grid's columns; `money` formats minor units in the ledger's currency. */
export function ledgerColumns(
  money: (minor: number) => string,
  actions: RowAction<LedgerRow>[],
): ColDef<LedgerRow>[] {
  return [
    { field: 'organisationName', headerName: 'Lab', flex: 1, minWidth: 160, filter: true },
    { field: 'participantCode', headerName: 'Code', width: 90 },
    { field: 'number', headerName: 'Invoice', width: 130 },
    {
      field: 'status',
      headerName: 'Status',
      width: 160,
      valueFormatter: ({ data }) => (data ? statusText(data) : ''),
      cellStyle: (p) => ({ color: p.data ? STATUS_COLOURS[p.data.status] : '', fontWeight: 600 }),
    },
    {
      field: 'totalMinor',
      headerName: 'Total',
      width: 120,
      type: 'rightAligned',
      valueFormatter: ({ value }) => money(value as number),
    },
    {
      colId: 'payment',
      headerName: 'Payment',
      width: 200,
      valueGetter: ({ data }) => (data ? paymentText(data) : ''),
    },
    { field: 'remindersSent', headerName: 'Reminders', width: 100, type: 'rightAligned' },
    {
      field: 'enrolmentState',
      headerName: 'Enrolment',
      width: 110,
      valueFormatter: ({ data }) => (data ? enrolmentText(data) : ''),
    },
    {
      colId: 'actions',
      headerName: '',
      width: 270,
      sortable: false,
      cellRenderer: ActionCell,
      cellRendererParams: { actions },
    },
  ];
}
