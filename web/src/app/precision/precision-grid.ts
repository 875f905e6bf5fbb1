import {
  CellStyleModule,
  ClientSideRowModelModule,
  ModuleRegistry,
  RowAutoHeightModule,
  RowStyleModule,
} from 'ag-grid-community';

/** The grid modules the precision study uses, registered when this lazy feature loads. */
ModuleRegistry.registerModules([
  ClientSideRowModelModule,
  CellStyleModule,
  RowStyleModule,
  RowAutoHeightModule,
]);

export { ringletGridTheme } from '../grid/grid-theme';
