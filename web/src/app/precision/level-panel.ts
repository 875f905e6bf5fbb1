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
  /** The bias sentence (ISO 5725-4): reference value, δ̂ = m̂ − µ and its 95 % interval. */
  protected readonly biasText = computed(() => {
    const b = this.level().bias;
    if (!b) return '';
    const u = this.unit();
    const d = this.d();
    const refU = b.referenceU === null ? '' : ` (u = ${fix(b.referenceU, d)}${u})`;
    const rel = b.relativeBiasPercent === null ? '' : ` (${fix(b.relativeBiasPercent, 2)} %)`;
    return (
      `Reference value µ = ${fix(b.referenceValue, d)}${u}${refU} from ${b.referenceSource}. ` +
      `Bias δ̂ = m̂ − µ = ${fix(b.bias, d)}${u}${rel}, 95 % interval ${fix(b.lower95, d)} to ` +
      `${fix(b.upper95, d)}${u}.`
    );
  });
}
