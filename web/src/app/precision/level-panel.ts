import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type {
  PrecisionLevelResult,
  PrecisionMeasurandResult,
} from '@ringlet/shared/contracts/precision';
import { ChartPanel } from '../board/chart-panel';
import { CellsGrid } from './cells-grid';
import { mandelCharts } from './precision-chart-data';
import { fix } from './precision-view';
import { TestsTable } from './tests-table';

/** One level × measurand: the key figures, the cells, the tests, Mandel's h and k, the bias. */
@Component({
  selector: 'app-precision-level',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [CellsGrid, ChartPanel, TestsTable],
  templateUrl: './level-panel.html',
  styleUrl: './precision.scss',
})
export class LevelPanel {
  readonly level = input.required<PrecisionLevelResult>();
  readonly measurand = input.required<PrecisionMeasurandResult>();
  protected readonly fix = fix;
  protected readonly charts = computed(() => mandelCharts(this.level(), this.measurand()));
  protected readonly unit = computed(() =>
    this.measurand().unit ? ` ${this.measurand().unit}` : '',
  );
  /** Test id suffix: level and measurand. */
  protected readonly tid = computed(() => `${this.level().itemCode}-${this.measurand().key}`);
  protected readonly d = computed(() => this.measurand().decimals + 2);
}
