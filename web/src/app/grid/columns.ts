import type { ColDef } from 'ag-grid-community';
import { ActionCell, type RowAction } from './action-cell';

/** The grid column of row actions (buttons), one definition for every grid in the app. */
export function actionsColumn<T>(
  actions: readonly RowAction<T>[],
  width: number,
  extra: Partial<ColDef<T>> = {},
): ColDef<T> {
  return {
    colId: 'actions',
    headerName: '',
    width,
    sortable: false,
    cellRenderer: ActionCell,
    cellRendererParams: { actions },
    ...extra,
  };
}

/** The actions column only while the rows may be changed (e.g. a round's design is open). */
export function actionsColumnWhile<T>(
  open: boolean,
  actions: readonly RowAction<T>[],
  width: number,
): ColDef<T>[] {
  return open ? [actionsColumn(actions, width)] : [];
}
