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

/** Dates and money: one set of helpers for every screen (core/format.ts). */
export { formatDate, formatMoney } from '../core/format';
