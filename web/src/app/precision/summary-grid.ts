import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ColDef } from 'ag-grid-community';
import type {
  PrecisionLevelResult,
  PrecisionMeasurandResult,
} from '@ringlet/shared/contracts/precision';
import { PrecisionTable } from './precision-table';
import { fix } from './precision-view';

/** One row per level of a measurand: p, Σn, m̂, s_r, s_L, s_R, r = 2.8·s_r, R = 2.8·s_R. */
@Component({
  selector: 'app-precision-summary-grid',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [PrecisionTable],
  templateUrl: './summary-grid.html',
})
export class SummaryGrid {
  readonly measurand = input.required<PrecisionMeasurandResult>();
  protected readonly rowId = (p: { data: PrecisionLevelResult }) => p.data.itemCode;
  protected readonly columns = computed<ColDef<PrecisionLevelResult>[]>(() => {
    const m = this.measurand();
    const u = m.unit ? ` (${m.unit})` : '';
    const d = m.decimals;
    const num = (
      colId: string,
      headerName: string,
      get: (l: PrecisionLevelResult) => number | null,
      decimals: number,
      width = 95,
    ): ColDef<PrecisionLevelResult> => ({
      colId,
      headerName,
      width,
      type: 'rightAligned',
      valueGetter: ({ data }) => (data ? get(data) : null),
      valueFormatter: ({ value }) => fix(value as number | null, decimals),
    });
    return [
      {
        field: 'itemLabel',
        headerName: 'Level',
        minWidth: 220,
        flex: 1,
      },
      {
        colId: 'p',
        headerName: 'p (of reported)',
        width: 110,
        type: 'rightAligned',
        valueGetter: ({ data }) => (data ? `${data.p} / ${data.pReported}` : ''),
      },
      num('n', 'Σn', (l) => l.n, 0, 70),
      num('mean', `m̂${u}`, (l) => l.mean, d + 1, 100),
      num('sr', `s_r${u}`, (l) => l.sr, d + 2),
      num('sL', `s_L${u}`, (l) => l.sL, d + 2),
      num('sR', `s_R${u}`, (l) => l.sR, d + 2),
      num('r', `r${u}`, (l) => l.r, d + 2),
      num('R', `R${u}`, (l) => l.R, d + 2),
    ];
  });
}
