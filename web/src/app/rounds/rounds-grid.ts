import {
  CellStyleModule,
  ClientSideRowModelModule,
  ModuleRegistry,
  NumberFilterModule,
  RowAutoHeightModule,
  TextFilterModule,
} from 'ag-grid-community';

/** The grid modules the Round desk uses, registered when this lazy feature loads. */
ModuleRegistry.registerModules([
  ClientSideRowModelModule,
  TextFilterModule,
  NumberFilterModule,
  CellStyleModule,
  RowAutoHeightModule,
]);

export { ringletGridTheme } from '../grid/grid-theme';

/** ISO 8601 → the user's locale (dates only when the time carries no information). */
export function formatDate(iso: string | null | undefined, withTime = false): string {
  if (!iso) return '—';
  const d = new Date(iso.length === 10 ? `${iso}T00:00:00` : iso);
  if (Number.isNaN(d.getTime())) return iso;
  return withTime
    ? d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })
    : d.toLocaleDateString(undefined, { dateStyle: 'medium' });
}

/** Money in minor units → "450.00 EUR". */
export function formatMoney(minor: number, currency: string): string {
  return `${(minor / 100).toFixed(2)} ${currency}`;
}

/** Rows keep their identity across reloads by their id. */
export const rowId = (p: { data: { id: string } }): string => p.data.id;
