import {
  CellStyleModule,
  ClientSideRowModelModule,
  ModuleRegistry,
  RowStyleModule,
} from 'ag-grid-community';

/** The grid modules the precision study uses, registered when this lazy feature loads. */
ModuleRegistry.registerModules([ClientSideRowModelModule, CellStyleModule, RowStyleModule]);

import { ringletGridTheme } from '../grid/grid-theme';

/** Ringlet's grid look; a short table (one row per level) does not keep an empty body below it. */
export const precisionGridTheme = ringletGridTheme.withParams({ autoHeightMinBodyHeight: 0 });
