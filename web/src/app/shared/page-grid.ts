import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { AgGridAngular } from 'ag-grid-angular';
import type { ColDef, GetRowIdFunc } from 'ag-grid-community';
import { ringletGridTheme } from '../grid/grid-theme';
import { rowId } from './section-grid';

/**
 * The main grid of a list page (users, organisations, rounds, invoices …): a fixed-height box
 * (`.grid-box` in styles.scss) with Ringlet's theme, rows keyed by their id, the loading overlay and
 * an optional quick filter. A page states only its columns, rows and accessible name; the feature
 * registers the grid modules its columns need.
 */
@Component({
  selector: 'app-page-grid',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AgGridAngular],
  template: `
    <ag-grid-angular
      class="grid-box"
      [theme]="theme"
      [loadThemeGoogleFonts]="false"
      [rowData]="rows()"
      [columnDefs]="columns()"
      [quickFilterText]="quickFilter()"
      [getRowId]="rowIdOf()"
      [loading]="loading()"
      [overlayNoRowsTemplate]="noRowsText()"
      [attr.aria-label]="label()"
      [attr.data-testid]="testId()"
    />
  `,
  styles: `
    :host {
      display: block;
      width: 100%;
    }
  `,
})
export class PageGrid<T> {
  readonly rows = input.required<T[]>();
  readonly columns = input.required<ColDef<T>[]>();
  /** The grid's accessible name (browser tests find grids by it). */
  readonly label = input.required<string>();
  readonly loading = input(false);
  /** Text matched against every cell; rows without it are hidden. */
  readonly quickFilter = input<string | undefined>(undefined);
  /** What the empty grid says; AG Grid's own words when unset. */
  readonly noRowsText = input<string | undefined>(undefined);
  /** How a row keeps its identity across reloads; by its `id` unless given. */
  readonly rowIdOf = input<GetRowIdFunc<T>>(rowId as unknown as GetRowIdFunc<T>);
  readonly testId = input<string | null>(null);
  protected readonly theme = ringletGridTheme;
}
