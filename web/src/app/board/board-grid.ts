import {
  CellStyleModule,
  ClientSideRowModelModule,
  CsvExportModule,
  ModuleRegistry,
  NumberFilterModule,
  PinnedRowModule,
  QuickFilterModule,
  RowStyleModule,
  TextFilterModule,
  ColumnApiModule,
} from 'ag-grid-community';

/** The AG Grid modules the Consensus board uses, registered when the board feature loads. */
ModuleRegistry.registerModules([
  ClientSideRowModelModule,
  QuickFilterModule,
  TextFilterModule,
  NumberFilterModule,
  CellStyleModule,
  RowStyleModule,
  CsvExportModule,
  PinnedRowModule,
  ColumnApiModule,
]);

export { ringletGridTheme } from '../grid/grid-theme';

/** A cell that starts with = + - @ (text, not a number) is neutralised in exports. */
export function safeCsvCell(value: unknown): unknown {
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(value)) return `'${value}`;
  return value;
}
