import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ColDef, RowClassParams, RowStyle } from 'ag-grid-community';
import {
  PRECISION_TEST_LABELS,
  type PrecisionCellResult,
  type PrecisionMeasurandResult,
} from '@ringlet/shared/contracts/precision';
import { ClassCell } from './class-cell';
import { PrecisionTable } from './precision-table';
import { CLASS_WORDS, fix, replicatesText } from './precision-view';

/** The cells of one level: each lab's replicates, n, mean, SD, h, k and what the tests made of it. */
@Component({
  selector: 'app-precision-cells-grid',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [PrecisionTable],
  templateUrl: './cells-grid.html',
})
export class CellsGrid {
  readonly cells = input.required<readonly PrecisionCellResult[]>();
  readonly measurand = input.required<PrecisionMeasurandResult>();
  readonly caption = input.required<string>();
  protected readonly rowId = (p: { data: PrecisionCellResult }) => p.data.participantCode;
  /** A cell set aside reads grey and italic (its "Set aside" column says so in words). */
  protected readonly rowStyle = ({
    data,
  }: RowClassParams<PrecisionCellResult>): RowStyle | undefined =>
    data?.excluded ? { color: '#6b7685', fontStyle: 'italic' } : undefined;
  protected readonly rows = computed(() => [...this.cells()]);
  protected readonly columns = computed<ColDef<PrecisionCellResult>[]>(() => {
    const m = this.measurand();
    const u = m.unit ? ` (${m.unit})` : '';
    const d = m.decimals;
    return [
      { field: 'participantCode', headerName: 'Code', width: 90 },
      {
        colId: 'replicates',
        headerName: `Replicates${u}`,
        minWidth: 170,
        flex: 1,
        valueGetter: ({ data }) => (data ? replicatesText(data, d) : ''),
      },
      { field: 'n', headerName: 'n', width: 60, type: 'rightAligned' },
      {
        field: 'mean',
        headerName: `Cell mean${u}`,
        width: 115,
        type: 'rightAligned',
        valueFormatter: ({ value }) => fix(value as number | null, d + 1),
      },
      {
        field: 'sd',
        headerName: `Cell SD${u}`,
        width: 105,
        type: 'rightAligned',
        valueFormatter: ({ value }) => fix(value as number | null, d + 2),
      },
      {
        field: 'h',
        headerName: 'h',
        width: 70,
        type: 'rightAligned',
        valueFormatter: ({ value }) => fix(value as number | null, 2),
      },
      {
        field: 'k',
        headerName: 'k',
        width: 70,
        type: 'rightAligned',
        valueFormatter: ({ value }) => fix(value as number | null, 2),
      },
      {
        colId: 'classification',
        headerName: 'Tests',
        width: 120,
        // A cell set aside is no longer tested: the renderer says "Set aside" instead of a class.
        valueGetter: ({ data }) => (data?.excluded ? 'set-aside' : data?.classification),
        cellRenderer: ClassCell,
      },
      {
        colId: 'flags',
        headerName: 'Flags',
        minWidth: 150,
        flex: 1,
        valueGetter: ({ data }) =>
          data
            ? data.flags
                .map((f) => `${PRECISION_TEST_LABELS[f.test]}: ${CLASS_WORDS[f.classification]}`)
                .join('; ') || '—'
            : '',
      },
    ];
  });
}
