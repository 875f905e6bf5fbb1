import {
  CellStyleModule,
  ClientSideRowModelModule,
  ModuleRegistry,
  QuickFilterModule,
  RowAutoHeightModule,
  TextFilterModule,
} from 'ag-grid-community';

/**
 * The AG Grid modules the admin grids use, registered when the admin feature loads (never in
 * main.ts, so the sign-in page carries no grid code).
 */
ModuleRegistry.registerModules([
  ClientSideRowModelModule,
  QuickFilterModule,
  TextFilterModule,
  CellStyleModule,
  RowAutoHeightModule,
]);

export { ringletGridTheme } from '../grid/grid-theme';

/** Dates on the wire are ISO 8601 UTC; show them in the user's locale. */
export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  const date = new Date(iso);
  return Number.isNaN(date.getTime())
    ? iso
    : date.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}
