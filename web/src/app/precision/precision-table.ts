import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { AgGridAngular } from 'ag-grid-angular';
import type { ColDef, GetRowIdFunc, RowClassParams, RowStyle } from 'ag-grid-community';
import { precisionGridTheme } from './precision-grid';

/**
 * A precision-study table: as tall as its rows, in a box the page scrolls sideways (the grid
 * itself never does; on a phone its own scrollbar would cover the last row). The cells and the
 * per-level summary state only their rows, columns and name.
 */
@Component({
  selector: 'app-precision-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AgGridAngular],
  template: `
    <div class="grid-wrap">
      <ag-grid-angular
        class="precision-grid"
        [style.min-width.px]="minWidth()"
        [theme]="theme"
        [loadThemeGoogleFonts]="false"
        domLayout="autoHeight"
        [rowData]="rows()"
        [columnDefs]="columns()"
        [getRowId]="rowIdOf()"
        [getRowStyle]="rowStyle()"
        [attr.aria-label]="label()"
        [attr.data-testid]="testId()"
      />
    </div>
  `,
  styles: `
    .grid-wrap {
      overflow-x: auto;
      margin-bottom: 8px;
    }
    .precision-grid {
      width: 100%;
    }
  `,
})
export class PrecisionTable<T> {
  readonly rows = input.required<T[]>();
  readonly columns = input.required<ColDef<T>[]>();
  readonly rowIdOf = input.required<GetRowIdFunc<T>>();
  /** The grid's accessible name. */
  readonly label = input.required<string>();
  /** Below this width the page scrolls the table sideways. */
  readonly minWidth = input.required<number>();
  readonly rowStyle = input<((params: RowClassParams<T>) => RowStyle | undefined) | undefined>(
    undefined,
  );
  readonly testId = input<string | null>(null);
  protected readonly theme = precisionGridTheme;
}
