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

/** Dates on the wire are ISO 8601 UTC; shown in the user's locale (core/format.ts). */
export { formatDateTime } from '../core/format';
