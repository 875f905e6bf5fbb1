import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { AgGridAngular } from 'ag-grid-angular';
import type { ColDef } from 'ag-grid-community';
import { ringletGridTheme } from '../grid/grid-theme';

/** Rows keep their identity across reloads by their id. */
export const rowId = (p: { data: { id: string } }): string => p.data.id;

/**
 * A grid as tall as its rows, for one section of a page (a round's items, measurands, …). The
 * feature registers the grid modules its columns need.
 */
@Component({
  selector: 'app-section-grid',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AgGridAngular],
  template: `
    <ag-grid-angular
      [theme]="theme"
      [loadThemeGoogleFonts]="false"
      domLayout="autoHeight"
      [rowData]="rows()"
      [columnDefs]="columns()"
      [getRowId]="rowId"
      [attr.aria-label]="label()"
    />
  `,
  styles: `
    :host {
      display: block;
      width: 100%;
      margin-bottom: 12px;
    }
    ag-grid-angular {
      display: block;
      width: 100%;
    }
  `,
})
export class SectionGrid<T extends { id: string }> {
  readonly rows = input.required<T[]>();
  readonly columns = input.required<ColDef<T>[]>();
  /** The grid's accessible name. */
  readonly label = input.required<string>();
  protected readonly theme = ringletGridTheme;
  protected readonly rowId = rowId;
}
