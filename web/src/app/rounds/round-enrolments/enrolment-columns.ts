import type { ColDef } from 'ag-grid-community';
import { SHIPMENT_CONDITION_LABELS, type ShipmentCondition } from '@ringlet/shared/contracts/bench';
import type { Enrolment, ReceiptStatus } from '@ringlet/shared/contracts/rounds';
import { formatDate } from '../rounds-grid';

export const RECEIPT_LABELS: Record<ReceiptStatus, string> = {
  'not-dispatched': 'Not dispatched',
  dispatched: 'Dispatched, awaiting receipt',
  received: 'Received intact',
  'received-with-problem': 'Received with a problem',
};

const conditionLabel = (c: string | null | undefined): string =>
  c ? (SHIPMENT_CONDITION_LABELS[c as ShipmentCondition] ?? c) : '';

/** One line on how far the test items have travelled to the enrolled labs. */
export function receiptSummary(enrolments: readonly Pick<Enrolment, 'state' | 'receiptStatus'>[]) {
  const active = enrolments.filter((e) => e.state === 'enrolled');
  const count = (s: ReceiptStatus) => active.filter((e) => e.receiptStatus === s).length;
  return (
    `${active.length} enrolled: ${count('not-dispatched')} not dispatched, ${count('dispatched')} in transit, ` +
    `${count('received')} received intact, ${count('received-with-problem')} received with a problem.`
  );
}

/** The enrolments grid's columns (without the actions column). */
export const ENROLMENT_COLUMNS: ColDef<Enrolment>[] = [
  { field: 'participantCode', headerName: 'Participant code', width: 150 },
  { field: 'organisationName', headerName: 'Lab', flex: 1, minWidth: 160 },
  {
    field: 'state',
    headerName: 'State',
    width: 110,
    valueFormatter: ({ data }) =>
      data?.state === 'withdrawn' ? `Withdrawn: ${data.withdrawnReason}` : 'Enrolled',
  },
  {
    field: 'receiptStatus',
    headerName: 'Receipt',
    width: 210,
    valueFormatter: ({ value }) => RECEIPT_LABELS[value as ReceiptStatus],
  },
  {
    colId: 'courier',
    headerName: 'Courier / tracking',
    width: 180,
    valueGetter: ({ data }) =>
      data?.shipment ? `${data.shipment.courier ?? ''} ${data.shipment.trackingNumber ?? ''}` : '',
  },
  {
    colId: 'dispatched',
    headerName: 'Dispatched',
    width: 120,
    valueGetter: ({ data }) => formatDate(data?.shipment?.dispatchedOn),
  },
  {
    colId: 'received',
    headerName: 'Received',
    width: 120,
    valueGetter: ({ data }) => formatDate(data?.shipment?.receivedOn),
  },
  {
    colId: 'condition',
    headerName: 'Condition',
    width: 160,
    valueGetter: ({ data }) => conditionLabel(data?.shipment?.condition),
  },
  {
    field: 'extensionUntil',
    headerName: 'Extension until',
    width: 170,
    valueFormatter: ({ value }) => (value ? formatDate(value as string, true) : ''),
  },
  {
    field: 'submitted',
    headerName: 'Submitted',
    width: 100,
    valueFormatter: ({ value }) => (value ? 'Yes' : 'No'),
  },
];
